package lsp

import (
	"bytes"
	"encoding/base64"
	"encoding/json"
	"encoding/xml"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

var dataURI = regexp.MustCompile(`!\[([^\]]*)\]\(data:image/svg\+xml;base64,([A-Za-z0-9+/=]+)\)`)

// TestHoverDrawing: a client that declares a markdown renderer (LSP
// 3.16 general.markdown) gets the record's drawing as an SVG data URI
// under the hover text, a sugar its Fischer projection too; a client
// that declares none gets the text alone.
func TestHoverDrawing(t *testing.T) {
	const u = "file:///work/sugars.smi"
	text := "O=C[C@H](O)[C@@H](O)[C@H](O)[C@H](O)CO D-glucose\nN[C@@H](C)C(=O)O L-alanine\n"
	for _, c := range []struct {
		name   string
		caps   map[string]any
		images int
	}{
		{"markdown renderer", map[string]any{"general": map[string]any{"markdown": map[string]any{"parser": "marked", "version": "1.1.0"}}}, 2},
		{"plain client", nil, 0},
	} {
		t.Run(c.name, func(t *testing.T) {
			cl := start(t, clientSetup{caps: c.caps})
			cl.open(u, "smi", 1, text)
			h := hoverAt(t, cl, u, position(t, text, "@@", 0, EncodingUTF16))
			if h == nil {
				t.Fatal("no hover")
			}
			ms := dataURI.FindAllStringSubmatch(h.Contents.Value, -1)
			if len(ms) != c.images {
				t.Fatalf("%d images, want %d:\n%s", len(ms), c.images, h.Contents.Value)
			}
			for _, m := range ms {
				svg, err := base64.StdEncoding.DecodeString(m[2])
				if err != nil {
					t.Fatal(err)
				}
				dec := xml.NewDecoder(bytes.NewReader(svg))
				var chars strings.Builder
				root := ""
				for {
					tok, err := dec.Token()
					if err == io.EOF {
						break
					}
					if err != nil {
						t.Fatalf("%s: SVG does not parse: %v", m[1], err)
					}
					switch x := tok.(type) {
					case xml.StartElement:
						if root == "" {
							root = x.Name.Local
						}
					case xml.CharData:
						chars.Write(x)
					}
				}
				if root != "svg" || !strings.Contains(chars.String(), "analytical confirmation") {
					t.Errorf("%s: root %q, text %q", m[1], root, chars.String())
				}
			}
		})
	}
}

// TestDrawingCommand: every record of a list gets a code lens whose
// command writes its drawing (and a sugar's Fischer projection) as SVG
// files; without window/showDocument support the paths come back as the
// result. The folder is gone once the server has exited.
func TestDrawingCommand(t *testing.T) {
	const u = "file:///work/sugars.smi"
	text := "O=C[C@H](O)[C@@H](O)[C@H](O)[C@H](O)CO D-glucose\nC/C=C/C (E)-but-2-ene\n"
	c := start(t, clientSetup{})
	c.open(u, "smi", 1, text)
	var lenses []struct {
		Command struct {
			Command   string            `json:"command"`
			Arguments []json.RawMessage `json:"arguments"`
		} `json:"command"`
	}
	c.mustCall("textDocument/codeLens", map[string]any{"textDocument": textDoc(u)}, &lenses)
	if len(lenses) != 2 || lenses[0].Command.Command != commandShowDrawing {
		t.Fatalf("lenses = %+v", lenses)
	}
	var paths []string
	c.mustCall("workspace/executeCommand", map[string]any{"command": commandShowDrawing, "arguments": lenses[0].Command.Arguments}, &paths)
	if len(paths) != 2 {
		t.Fatalf("paths = %v, want the structure and the Fischer projection", paths)
	}
	for _, p := range paths {
		data, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		if !strings.Contains(string(data), "D-glucose") {
			t.Errorf("%s lacks the title", p)
		}
		if err := xml.Unmarshal(data, new(struct{})); err != nil {
			t.Errorf("%s: %v", p, err)
		}
	}
	c.mustCall("workspace/executeCommand", map[string]any{"command": commandShowDrawing, "arguments": lenses[1].Command.Arguments}, &paths)
	if len(paths) != 1 {
		t.Errorf("butene: %v, want one drawing, no Fischer projection", paths)
	}
	c.stop()
	if _, err := os.Stat(filepath.Dir(paths[0])); !os.IsNotExist(err) {
		t.Errorf("drawing folder still there after exit: %v", err)
	}
}

// TestDrawingLensSetting: strings in source code get no drawing lens by
// default (a lens over every literal is noise); the drawingLens setting
// gives them one.
func TestDrawingLensSetting(t *testing.T) {
	const u = "file:///work/build_pool.py"
	text := "alanine_smiles = \"N[C@@H](C)C(=O)O\"\nbutene_smiles = \"C/C=C/C\"\n"
	for _, c := range []struct {
		initOpts any
		want     int
	}{
		{nil, 0},
		{map[string]any{"drawingLens": "everywhere"}, 2},
		{map[string]any{"stereoline": map[string]any{"drawingLens": "off"}}, 0},
	} {
		cl := start(t, clientSetup{initOpts: c.initOpts})
		cl.open(u, "python", 1, text)
		var lenses []json.RawMessage
		cl.mustCall("textDocument/codeLens", map[string]any{"textDocument": textDoc(u)}, &lenses)
		if len(lenses) != c.want {
			t.Errorf("settings %v: %d lenses, want %d", c.initOpts, len(lenses), c.want)
		}
		cl.stop()
	}
}
