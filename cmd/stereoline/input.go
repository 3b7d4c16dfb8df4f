package main

import (
	"bufio"
	"fmt"
	"io"
	"os"
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
