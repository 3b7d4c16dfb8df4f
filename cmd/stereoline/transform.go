package main

import (
	"bufio"
	"flag"
	"fmt"
	"io"
	"strconv"
	"strings"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/transform"
)

// transformCommand implements 'stereoline transform': it rewrites the stereo
// marks of every record and prints the records, one per line, with
// everything but the rewritten marks kept byte for byte. Lines that hold
// no record (blank, or starting with '#') are copied. A record the
// transform does not apply to is printed unchanged and reported on
// standard error.
func transformCommand(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("transform", flag.ContinueOnError)
	fs.SetOutput(stderr)
	mirror := fs.Bool("mirror", false, "write the mirror image (the enantiomer)")
	invert := fs.Int("invert", 0, "invert the unit at atom `N` (1-based, as in describe)")
	flip := fs.String("flip", "", "flip the double bond between atoms `I-J`")
	set := fs.String("set", "", "set the unit at atom N to a descriptor: `N=R`, S, E, Z, M or P")
	clean := fs.Bool("clean", false, "remove marks that specify nothing")
	portable := fs.Bool("portable", false, "rewrite marks general-purpose readers read differently so that every reader surveyed reads the record alike, with the meaning it has under the reading chosen")
	var rf readingFlags
	rf.add(fs)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: stereoline transform --mirror | --invert N | --flip I-J | --set N=DESCRIPTOR | --clean | --portable [--lone-pair RULE] [--ring-marks RULE] [FILE...]\n\nRewrites the stereo marks of each record read from the files, or from\nstandard input when none is named, and prints the records.")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		return 2
	}
	ops := 0
	for _, on := range []bool{*mirror, *invert != 0, *flip != "", *set != "", *clean, *portable} {
		if on {
			ops++
		}
	}
	if ops != 1 {
		fmt.Fprintln(stderr, "stereoline transform: give exactly one of --mirror, --invert, --flip, --set, --clean, --portable")
		return 2
	}
	op, err := transformOp(*mirror, *invert, *flip, *set, *clean)
	if *portable {
		op, err = transform.Portable, nil
	}
	if err != nil {
		fmt.Fprintf(stderr, "stereoline transform: %v\n", err)
		return 2
	}
	reading, err := rf.reading()
	if err != nil {
		fmt.Fprintf(stderr, "stereoline transform: %v\n", err)
		return 2
	}
	out := bufio.NewWriter(stdout)
	defer out.Flush()
	failed := false
	status := eachLine(fs.Args(), stdin, stderr, func(name string, line int, text string) {
		if trimmed := strings.TrimSpace(text); trimmed == "" || strings.HasPrefix(trimmed, "#") {
			fmt.Fprintln(out, text)
			return
		}
		newText, notes, err := transformLine(text, op, reading)
		for _, n := range notes {
			fmt.Fprintf(stderr, "%s:%d: %s\n", name, line, n)
		}
		if err != nil {
			fmt.Fprintf(stderr, "%s:%d: %v\n", name, line, err)
			failed = true
		}
		fmt.Fprintln(out, newText)
	})
	if failed && status == 0 {
		status = 1
	}
	return status
}

// transformFunc is one transform applied to a molecule.
type transformFunc func(m *notation.Molecule) (transform.Transform, error)

// transformOp turns the flags into a transform; atom numbers arrive
// 1-based and go to the stereo package 0-based.
func transformOp(mirror bool, invert int, flip, set string, clean bool) (transformFunc, error) {
	switch {
	case mirror:
		return transform.Mirror, nil
	case clean:
		return transform.Clean, nil
	case invert != 0:
		if invert < 1 {
			return nil, fmt.Errorf("--invert wants an atom number from 1")
		}
		return func(m *notation.Molecule) (transform.Transform, error) { return transform.Invert(m, invert-1) }, nil
	case flip != "":
		i, j, ok := strings.Cut(flip, "-")
		a, err1 := strconv.Atoi(i)
		b, err2 := strconv.Atoi(j)
		if !ok || err1 != nil || err2 != nil || a < 1 || b < 1 {
			return nil, fmt.Errorf("--flip wants two atom numbers, as in 3-4, not %q", flip)
		}
		return func(m *notation.Molecule) (transform.Transform, error) { return transform.Flip(m, a-1, b-1) }, nil
	case set != "":
		n, d, ok := strings.Cut(set, "=")
		a, err := strconv.Atoi(n)
		desc, okd := parseDescriptor(d)
		if !ok || err != nil || a < 1 || !okd {
			return nil, fmt.Errorf("--set wants N=DESCRIPTOR with R, S, E, Z, M or P, as in 2=R, not %q", set)
		}
		return func(m *notation.Molecule) (transform.Transform, error) { return transform.SetDescriptor(m, a-1, desc) }, nil
	}
	return nil, fmt.Errorf("no transform given")
}

func parseDescriptor(s string) (stereo.Descriptor, bool) {
	switch s {
	case "R":
		return stereo.DescR, true
	case "S":
		return stereo.DescS, true
	case "E":
		return stereo.DescE, true
	case "Z":
		return stereo.DescZ, true
	case "M":
		return stereo.DescM, true
	case "P":
		return stereo.DescP, true
	}
	return stereo.DescNone, false
}

// transformLine applies op to the record on one line and returns the
// line with only the notation's edited bytes changed.
func transformLine(line string, op transformFunc, reading notation.Reading) (string, []string, error) {
	rec := notation.SplitRecord(line)
	m := notation.ReadWith(rec.Notation, reading)
	t, err := op(m)
	if err != nil {
		return line, nil, err
	}
	shifted := make([]notation.Edit, len(t.Edits))
	for i, e := range t.Edits {
		shifted[i] = notation.Edit{Span: e.Span.Shift(rec.NotationSpan.Start), New: e.New}
	}
	out, err := notation.ApplyEdits(line, shifted)
	if err != nil {
		return line, t.Notes, err
	}
	return out, t.Notes, nil
}
