package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/depict"
	"stereoline/stereo/reaction"
)

// draw implements 'stereoline draw'.
func draw(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("draw", flag.ContinueOnError)
	fs.SetOutput(stderr)
	asSVG := fs.Bool("svg", false, "write SVG (the default)")
	asPNG := fs.Bool("png", false, "write PNG (needs --out, or exactly one record)")
	asJSON := fs.Bool("json", false, "write one JSON object per record, one per line")
	asMol := fs.Bool("molfile", false, "write MDL V2000 molfiles (several records make an SD file)")
	fischer := fs.Bool("fischer", false, "draw the Fischer projection instead of the structure diagram")
	numbers := fs.Bool("numbers", false, "print atom numbers (as describe numbers them)")
	outDir := fs.String("out", "", "write one file per record into this folder instead of standard output")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: stereoline draw [--svg|--png|--json|--molfile] [--fischer] [--numbers] [--out DIR] [FILE...]\n\nDraws each record (one notation per line, a title may follow after whitespace)\nof the files, or of standard input when none is named; in a table, source code,\nMarkdown, JSON, YAML or a notebook, the notation check finds there.")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		return 2
	}
	formats := 0
	for _, b := range []bool{*asSVG, *asPNG, *asJSON, *asMol} {
		if b {
			formats++
		}
	}
	if formats > 1 {
		fmt.Fprintln(stderr, "stereoline draw: choose one of --svg, --png, --json, --molfile")
		return 2
	}
	ext := ".svg"
	switch {
	case *asPNG:
		ext = ".png"
	case *asJSON:
		ext = ".json"
	case *asMol:
		ext = ".mol"
	}
	type item struct {
		name string
		data []byte
	}
	var items []item
	failed := false
	status := eachRecord(fs.Args(), stdin, stderr, func(name string, n int, rec notation.Record) {
		if trimmed := strings.TrimSpace(rec.Line); trimmed == "" || strings.HasPrefix(trimmed, "#") {
			return
		}
		data, err := drawRecord(rec, ext, *fischer, *numbers)
		if err != nil {
			fmt.Fprintf(stderr, "%s:%d: %v\n", name, n, err)
			failed = true
			if data == nil {
				return
			}
		}
		items = append(items, item{name: recordFileName(rec, len(items)+1), data: data})
	})
	if *outDir != "" {
		if err := os.MkdirAll(*outDir, 0o755); err != nil {
			fmt.Fprintf(stderr, "stereoline draw: %v\n", err)
			return 2
		}
		for _, it := range items {
			if err := os.WriteFile(filepath.Join(*outDir, it.name+ext), it.data, 0o644); err != nil {
				fmt.Fprintf(stderr, "stereoline draw: %v\n", err)
				return 2
			}
		}
	} else {
		if *asPNG && len(items) > 1 {
			fmt.Fprintln(stderr, "stereoline draw: --png writes one image; use --out DIR for several records")
			return 2
		}
		out := bufio.NewWriter(stdout)
		for _, it := range items {
			out.Write(it.data)
			if *asMol {
				out.WriteString("$$$$\n")
			}
		}
		out.Flush()
	}
	if failed && status == 0 {
		status = 1
	}
	return status
}

// drawRecord renders one record in the format of ext.
func drawRecord(rec notation.Record, ext string, fischer, numbers bool) ([]byte, error) {
	m := notation.Read(rec.Notation)
	opt := depict.Options{Title: rec.Title, Numbers: numbers}
	var an *stereo.Analysis
	if len(m.Atoms) <= depict.MaxAtoms {
		an = stereo.AnalyzeWith(m, stereo.Options{Budget: stereo.DefaultBudget})
		opt.Analysis = an
		if m.Reaction {
			opt.Diagnostics = reaction.AnalyzeWith(m, an).Diagnostics
		}
	}
	var d *depict.Drawing
	var buf bytes.Buffer
	if fischer {
		f, reason := depict.FischerOf(m, an)
		if ext == ".json" {
			var obj any = map[string]any{"fischer": nil, "reason": reason}
			if f != nil {
				obj = map[string]any{"fischer": f.JSON()}
			}
			b, err := json.Marshal(obj)
			return append(b, '\n'), err
		}
		switch {
		case f == nil:
			d = depict.Draw(m, opt)
			d.Notes = append([]depict.Note{{Text: reason, Mark: depict.MarkWarning}}, d.Notes...)
		case ext == ".mol":
			d = f.MolfileDrawing(opt)
		default:
			d = f.Drawing(opt)
		}
	} else {
		d = depict.Draw(m, opt)
	}
	var err error
	switch ext {
	case ".png":
		err = depict.WritePNG(&buf, d)
	case ".json":
		var b []byte
		b, err = json.Marshal(d)
		buf.Write(b)
		buf.WriteByte('\n')
	case ".mol":
		err = depict.WriteMolfile(&buf, d)
	default:
		err = depict.WriteSVG(&buf, d)
	}
	if err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// recordFileName names a record's file after its title, or its position.
func recordFileName(rec notation.Record, n int) string {
	var b strings.Builder
	for _, r := range rec.Title {
		switch {
		case r >= 'a' && r <= 'z', r >= 'A' && r <= 'Z', r >= '0' && r <= '9', r == '-', r == '_', r == '.':
			b.WriteRune(r)
		case b.Len() > 0 && !strings.HasSuffix(b.String(), "_"):
			b.WriteByte('_')
		}
	}
	name := strings.Trim(b.String(), "_.")
	if len(name) > 60 {
		name = name[:60]
	}
	if name == "" {
		return fmt.Sprintf("record-%d", n)
	}
	return fmt.Sprintf("%d-%s", n, name)
}
