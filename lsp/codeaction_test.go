package lsp

import (
	"sort"
	"strings"
	"testing"

	"go.lsp.dev/protocol"
)

// applyEdits applies text edits to a text as a client does, positions
// read by the test's own converter.
func applyEdits(t *testing.T, text string, edits []protocol.TextEdit, enc PositionEncoding) string {
	t.Helper()
	type span struct {
		start, end int
		newText    string
	}
	var spans []span
	for _, e := range edits {
		spans = append(spans, span{positionOffset(t, text, e.Range.Start, enc), positionOffset(t, text, e.Range.End, enc), e.NewText})
	}
	sort.Slice(spans, func(i, j int) bool { return spans[i].start > spans[j].start })
	for _, s := range spans {
		text = text[:s.start] + s.newText + text[s.end:]
	}
	return text
}

type action struct {
	Title       string                  `json:"title"`
	Kind        string                  `json:"kind"`
	Diagnostics []protocol.Diagnostic   `json:"diagnostics"`
	IsPreferred bool                    `json:"isPreferred"`
	Edit        *protocol.WorkspaceEdit `json:"edit"`
	Data        map[string]any          `json:"data"`
}

// The quick fix for a host escape makes the literal a raw string, which
// Python reads as written (The Python Language Reference, "String and
// Bytes literals": raw strings treat backslashes as literal characters).
func TestCodeActionsResolve(t *testing.T) {
	c := start(t, clientSetup{caps: map[string]any{"textDocument": map[string]any{"codeAction": map[string]any{
		"codeActionLiteralSupport": map[string]any{"codeActionKind": map[string]any{"valueSet": []string{"quickfix", "refactor"}}},
		"resolveSupport":           map[string]any{"properties": []string{"edit"}},
	}}}})
	const u = "file:///work/rings.py"
	c.open(u, "python", 1, pyEscape)
	diags := c.diagnostics(u, 1)
	var escape protocol.Diagnostic
	for _, d := range diags {
		if d.Code == "host-escape" {
			escape = d
		}
	}
	var acts []action
	c.mustCall("textDocument/codeAction", map[string]any{
		"textDocument": textDoc(u), "range": escape.Range,
		"context": map[string]any{"diagnostics": []any{escape}},
	}, &acts)
	var fix *action
	for i := range acts {
		if acts[i].Kind == "quickfix" && strings.Contains(acts[i].Title, "raw") {
			fix = &acts[i]
		}
	}
	if fix == nil {
		t.Fatalf("no raw-string quick fix among %+v", acts)
	}
	if fix.Edit != nil || fix.Data == nil {
		t.Errorf("a resolving client got the edit eagerly: %+v", fix)
	}
	if len(fix.Diagnostics) != 1 || fix.Diagnostics[0].Code != "host-escape" || !fix.IsPreferred {
		t.Errorf("quick fix diagnostics %+v preferred %v", fix.Diagnostics, fix.IsPreferred)
	}
	var resolved action
	c.mustCall(methodCodeActionResolve, fix, &resolved)
	if resolved.Edit == nil || len(resolved.Edit.Changes[protocol.DocumentURI(u)]) == 0 {
		t.Fatalf("resolved action has no edit: %+v", resolved)
	}
	fixed := applyEdits(t, pyEscape, resolved.Edit.Changes[protocol.DocumentURI(u)], EncodingUTF16)
	if !strings.Contains(fixed, `ring_smiles = r"C1CC\1"`) {
		t.Errorf("fixed text:\n%s", fixed)
	}
	c.change(u, 2, map[string]any{"text": fixed})
	for _, d := range c.diagnostics(u, 2) {
		if d.Code == "host-escape" {
			t.Errorf("host-escape still reported after the fix: %+v", d)
		}
	}
	// The action was offered for version 1: resolving it now answers
	// ContentModified (LSP 3.17).
	if err := c.call(methodCodeActionResolve, fix, &resolved); rpcCode(err) != codeContentModified {
		t.Errorf("resolve for an old version: %v, want code %d", err, codeContentModified)
	}
}

// Without resolve support the edit comes with the action; "only" filters
// by kind, a prefix selecting the kinds below it.
func TestCodeActionsEagerAndOnly(t *testing.T) {
	c := start(t, clientSetup{caps: map[string]any{"workspace": map[string]any{"workspaceEdit": map[string]any{"documentChanges": true}}}})
	const u = "file:///work/rings.py"
	c.open(u, "python", 3, pyEscape)
	c.diagnostics(u, 3)
	all := wholeRange(pyEscape)
	var acts []action
	c.mustCall("textDocument/codeAction", map[string]any{"textDocument": textDoc(u), "range": all, "context": map[string]any{"diagnostics": []any{}}}, &acts)
	if len(acts) == 0 {
		t.Fatalf("no actions over the whole file")
	}
	for _, a := range acts {
		if a.Edit == nil || len(a.Edit.DocumentChanges) != 1 {
			t.Fatalf("eager action without a versioned edit: %+v", a)
		}
		dc := a.Edit.DocumentChanges[0]
		if dc.TextDocument.Version == nil || *dc.TextDocument.Version != 3 || string(dc.TextDocument.URI) != u {
			t.Errorf("edit names %+v, want %s version 3", dc.TextDocument, u)
		}
	}
	c.mustCall("textDocument/codeAction", map[string]any{"textDocument": textDoc(u), "range": all, "context": map[string]any{"diagnostics": []any{}, "only": []string{"refactor.rewrite"}}}, &acts)
	for _, a := range acts {
		if !strings.HasPrefix(a.Kind, "refactor.rewrite.") {
			t.Errorf("only refactor.rewrite, got %s", a.Kind)
		}
	}
	c.mustCall("textDocument/codeAction", map[string]any{"textDocument": textDoc(u), "range": all, "context": map[string]any{"diagnostics": []any{}, "only": []string{"quickfix"}}}, &acts)
	if len(acts) == 0 {
		t.Errorf("only quickfix: no actions, want the host-escape fixes")
	}
	for _, a := range acts {
		if a.Kind != "quickfix" {
			t.Errorf("only quickfix, got %s", a.Kind)
		}
	}
}

// The rewrites come from the transforms: mirroring a record swaps every
// tetrahedral mark, so L-alanine N[C@@H](C)C(=O)O becomes N[C@H](C)C(=O)O,
// which is D-alanine, (R) (common practice).
func TestCodeActionMirror(t *testing.T) {
	c := start(t, clientSetup{})
	const u = "file:///work/amino.smi"
	text := "N[C@@H](C)C(=O)O L-alanine\n"
	c.open(u, "", 1, text)
	c.diagnostics(u, 1)
	var acts []action
	c.mustCall("textDocument/codeAction", map[string]any{"textDocument": textDoc(u), "range": map[string]any{
		"start": position(t, text, "@", 0, EncodingUTF16), "end": position(t, text, "@", 0, EncodingUTF16),
	}, "context": map[string]any{"diagnostics": []any{}, "only": []string{"refactor.rewrite.stereo.mirror"}}}, &acts)
	if len(acts) == 0 {
		t.Skip("the engine offers no mirror rewrite yet")
	}
	mirrored := applyEdits(t, text, acts[0].Edit.Changes[protocol.DocumentURI(u)], EncodingUTF16)
	if mirrored != "N[C@H](C)C(=O)O L-alanine\n" {
		t.Errorf("mirrored text %q", mirrored)
	}
}

// Every quick fix offered must resolve its finding: applied to the text,
// the finding is gone (the issue: a raw string or doubled backslashes for
// a host escape, removing ineffective marks, adding a missing partner
// mark).
func TestQuickFixesResolveTheirFinding(t *testing.T) {
	docs := []struct{ uri, lang, text string }{
		{"file:///work/rings.py", "python", pyEscape},
		{"file:///work/fixes.smi", "", "C[C@H](C)C isobutane, marked\nF/C=CF one end\nN[C@@H](C)C(=O)O L-alanine\n"},
		// marks the surveyed readers read differently (testdata/survey):
		// the portable rewrite, written through the string's escapes
		// (the ring mark becomes '\\1' in a Python string)
		{"file:///work/portable.py", "python", "sulfoxide = \"[S@](=O)(C)c1ccccc1\"\nring_smiles = \"C/1=C/CCCCCCCC/1\"\n"},
	}
	c := start(t, clientSetup{})
	fixed := map[string]int{}
	fixedCode := map[any]int{}
	for _, doc := range docs {
		u, text := doc.uri, doc.text
		c.open(u, doc.lang, 1, text)
		version := int32(1)
		for _, d := range c.diagnostics(u, 1) {
			if version > 1 { // back to the original text, where d is
				version++
				c.change(u, version, map[string]any{"text": text})
				c.diagnostics(u, version)
			}
			var acts []action
			c.mustCall("textDocument/codeAction", map[string]any{"textDocument": textDoc(u), "range": d.Range,
				"context": map[string]any{"diagnostics": []any{d}, "only": []string{"quickfix"}}}, &acts)
			for _, a := range acts {
				if len(a.Diagnostics) != 1 {
					t.Fatalf("quick fix %q names %d diagnostics, want 1", a.Title, len(a.Diagnostics))
				}
				if a.Diagnostics[0].Code != d.Code {
					continue // the fix of another finding at the same place
				}
				if a.Edit == nil {
					t.Fatalf("eager client, action without edit: %+v", a)
				}
				after := applyEdits(t, text, a.Edit.Changes[protocol.DocumentURI(u)], EncodingUTF16)
				version++
				c.change(u, version, map[string]any{"text": after})
				for _, d2 := range c.diagnostics(u, version) {
					if d2.Code == d.Code && d2.Range.Start.Line == d.Range.Start.Line {
						t.Errorf("%q did not resolve %s on line %d: %q", a.Title, d.Code, d.Range.Start.Line+1, after)
					}
				}
				fixed[doc.lang]++
				fixedCode[d.Code]++
			}
		}
	}
	// Python reads r"C1CC\1" and "C1CC\\1" as the notation written
	// (The Python Language Reference, "String and Bytes literals").
	if fixed["python"] < 2 {
		t.Errorf("%d fixes for the host escape, want the raw string and the doubled backslash", fixed["python"])
	}
	if fixedCode["stereo-reader-dependent"] < 2 {
		t.Errorf("%d portable rewrites resolved their finding, want the sulfoxide and the ring closure", fixedCode["stereo-reader-dependent"])
	}
	if fixed[""] == 0 {
		t.Log("the engine offers no quick fix for stereo findings yet")
	}
}

// Each rewrite kind at a cursor, applied by the client. Facts, common
// practice and the OpenSMILES specification ("Tetrahedral centers",
// "Cis/trans configuration"): swapping @@ and @ inverts a centre, so
// L-alanine N[C@@H](C)C(=O)O becomes D-alanine N[C@H](C)C(=O)O; F/C=C/F
// is trans (E) and F\C=C/F cis (Z).
func TestCodeActionRewrites(t *testing.T) {
	text := "N[C@@H](C)C(=O)O L-alanine é😀\nF/C=C/F trans\n"
	tests := []struct {
		cursor string // the cursor is on the first byte of this text
		kind   string
		want   string // the text after the first action of the kind
	}{
		{"@@", "refactor.rewrite.stereo.invert", "N[C@H](C)C(=O)O L-alanine é😀\nF/C=C/F trans\n"},
		{"@@", "refactor.rewrite.stereo.set", "N[C@H](C)C(=O)O L-alanine é😀\nF/C=C/F trans\n"},
		{"=C/F", "refactor.rewrite.stereo.flip", "N[C@@H](C)C(=O)O L-alanine é😀\nF\\C=C/F trans\n"},
		{"=C/F", "refactor.rewrite.stereo.set", "N[C@@H](C)C(=O)O L-alanine é😀\nF\\C=C/F trans\n"},
	}
	c := start(t, clientSetup{})
	const u = "file:///work/rewrites.smi"
	c.open(u, "", 1, text)
	c.diagnostics(u, 1)
	for _, tt := range tests {
		at := position(t, text, tt.cursor, 0, EncodingUTF16)
		var acts []action
		c.mustCall("textDocument/codeAction", map[string]any{"textDocument": textDoc(u), "range": map[string]any{"start": at, "end": at},
			"context": map[string]any{"diagnostics": []any{}, "only": []string{tt.kind}}}, &acts)
		if len(acts) == 0 {
			t.Errorf("%s at %q: no action", tt.kind, tt.cursor)
			continue
		}
		if got := applyEdits(t, text, acts[0].Edit.Changes[protocol.DocumentURI(u)], EncodingUTF16); got != tt.want {
			t.Errorf("%s at %q (%s): got %q, want %q", tt.kind, tt.cursor, acts[0].Title, got, tt.want)
		}
	}
	// Over a selection of both records the mirror rewrites every record
	// inside; F/C=C/F has no centre, so only alanine changes.
	var acts []action
	c.mustCall("textDocument/codeAction", map[string]any{"textDocument": textDoc(u), "range": wholeRange(text),
		"context": map[string]any{"diagnostics": []any{}, "only": []string{"refactor.rewrite.stereo.mirror"}}}, &acts)
	if len(acts) != 1 {
		t.Fatalf("mirror over the selection: %+v", acts)
	}
	if got := applyEdits(t, text, acts[0].Edit.Changes[protocol.DocumentURI(u)], EncodingUTF16); got != "N[C@H](C)C(=O)O L-alanine é😀\nF/C=C/F trans\n" {
		t.Errorf("mirror over the selection: %q", got)
	}
}
