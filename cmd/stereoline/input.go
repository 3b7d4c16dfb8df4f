package main

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"os"

	"stereoline/notation"
	"stereoline/notation/find"
)

// eachLine calls fn for every line of the named files, or of standard
// input ("<stdin>") when none is named or a name is "-", with the 1-based
// line number. A
// file that cannot be opened or read is reported on stderr and makes the
// status 2; otherwise the status is 0. Lines may be up to 64 MiB long.
func eachLine(names []string, stdin io.Reader, stderr io.Writer, fn func(name string, line int, text string)) int {
	scan := func(name string, r io.Reader) error {
		sc := bufio.NewScanner(r)
		sc.Buffer(make([]byte, 1<<16), 64<<20)
		for n := 1; sc.Scan(); n++ {
			fn(name, n, sc.Text())
		}
		return sc.Err()
	}
	if len(names) == 0 {
		if err := scan("<stdin>", stdin); err != nil {
			fmt.Fprintf(stderr, "stereoline: standard input: %v\n", err)
			return 2
		}
		return 0
	}
	status := 0
	for _, name := range names {
		if name == "-" {
			if err := scan("<stdin>", stdin); err != nil {
				fmt.Fprintf(stderr, "stereoline: standard input: %v\n", err)
				status = 2
			}
			continue
		}
		f, err := os.Open(name)
		if err != nil {
			fmt.Fprintf(stderr, "stereoline: %v\n", err)
			status = 2
			continue
		}
		err = scan(name, f)
		f.Close()
		if err != nil {
			fmt.Fprintf(stderr, "stereoline: %s: %v\n", name, err)
			status = 2
		}
	}
	return status
}

// outputBuffer is the buffer of the commands that print a line or more
// per record: large writes mean few system calls on a long list.
const outputBuffer = 256 << 10

// eachRecord calls fn for every record of the named files, or of standard
// input when none is named or a name is "-", with the 1-based line it
// starts on. Standard input, record lists and files whose kind the name
// does not tell are read a line at a time (eachLine; blank and comment
// lines are the caller's to skip). A file of another kind the finder
// knows — a table, source code, Markdown, JSON, YAML, a notebook — is
// searched as check searches it, and each notation record found is
// handed over with its title; query patterns are not records here. The
// status is eachLine's.
func eachRecord(names []string, stdin io.Reader, stderr io.Writer, fn func(name string, line int, rec notation.Record)) int {
	lines := func(names []string) int {
		return eachLine(names, stdin, stderr, func(name string, n int, line string) {
			fn(name, n, notation.SplitRecord(line))
		})
	}
	if len(names) == 0 {
		return lines(nil)
	}
	status := 0
	for _, name := range names {
		kind := find.KindForName(name)
		if name == "-" || kind == find.KindUnknown || kind == find.KindList {
			status = max(status, lines([]string{name}))
			continue
		}
		content, err := os.ReadFile(name)
		if err != nil {
			fmt.Fprintf(stderr, "stereoline: %v\n", err)
			status = 2
			continue
		}
		line, at := 1, 0
		for _, o := range find.FindKind(kind, content, find.Config{}) {
			if o.Dialect == find.DialectSMARTS {
				continue
			}
			line += bytes.Count(content[at:o.Span.Start], []byte("\n"))
			at = o.Span.Start
			rec := notation.SplitRecord(o.Text)
			if o.Title != "" {
				rec.Title = o.Title
			}
			fn(name, line, rec)
		}
	}
	return status
}
