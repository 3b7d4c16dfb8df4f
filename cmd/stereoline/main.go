// Command stereoline checks and explains the stereo marks of SMILES and
// reaction SMILES found in files: describe reads records and explains
// them, check reports problems for CI, transform rewrites marks, compare
// relates two structures, diff reviews a change record by record, draw
// draws them and serve runs the language server.
package main

import (
	"fmt"
	"io"
	"os"
	"runtime/debug"
)

const usage = `usage: stereoline <command> [arguments]

commands:
  describe [--json] [FILE...]   explain each record: atoms, bonds, formula, stereo, diagnostics
  check [options] [PATH...]     report problems in files and folders (text, JSON Lines, SARIF) for CI
  keys [--format json|tsv] [PATH...]
                                identity keys of every record, one line each, for joins beyond one machine
  transform OPERATION [FILE...] rewrite stereo marks: --mirror, --invert N, --flip I-J, --set N=R|S|E|Z|M|P, --clean
  compare A B [--json]          relate two structures: identical, enantiomers, diastereomers, ...
  diff [options] [PATH...]       what each edited record now means against a git revision (text, JSON Lines, HTML)
  draw [--svg|--png|--json|--molfile] [--fischer] [--numbers] [FILE...]
                                draw each record: structure diagram or Fischer projection
  serve [--stdio] [--log FILE]  run the language server on standard input and output
  help                          show this text

Run 'stereoline <command> -h' for the options of a command.
`

func main() {
	if len(os.Args) > 1 && (os.Args[1] == "check" || os.Args[1] == "keys") && os.Getenv("GOMEMLIMIT") == "" {
		// The commands that scan many files keep only findings and keys;
		// a soft limit keeps the heap well below 500 MB whatever the
		// input (GOMEMLIMIT overrides it). A larger GOGC was measured no
		// faster here and doubled the peak.
		debug.SetMemoryLimit(scanMemoryLimit)
	}
	if len(os.Args) > 1 && os.Args[1] == "serve" && os.Getenv("GOMEMLIMIT") == "" {
		// The server keeps compact results per record (some 150 MB for
		// a list of 100,000 records with its relations); without a
		// limit the garbage of reading such a list lets the heap grow to
		// twice that and more. It rises above the live heap of a larger
		// document (memlimit.go). GOMEMLIMIT overrides it.
		followLiveHeap(serveMemoryLimit)
	}
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}

// scanMemoryLimit is the soft memory limit of check and keys: under 500
// MB with the runtime's own overhead, and far enough above the live heap
// of a long list (some 100 MB of keys and findings at most: past 64 MB a
// list is related in parts) that the collector does not run back to
// back, as it did when the heap of a list held all its keys and came
// near the limit (a limit of 320 MB made a 500,000-record list three
// times slower then).
const scanMemoryLimit = 440 << 20

// serveMemoryLimit is the soft memory limit of the language server.
const serveMemoryLimit = 450 << 20

// run is main without the process: it returns the exit status, so tests
// can drive every command in-process.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) (status int) {
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(stderr, "stereoline: internal error: %v\n", r)
			status = 3
		}
	}()
	if len(args) == 0 {
		fmt.Fprint(stderr, usage)
		return 2
	}
	switch args[0] {
	case "describe":
		return describe(args[1:], stdin, stdout, stderr)
	case "check":
		return check(args[1:], stdin, stdout, stderr)
	case "keys":
		return keys(args[1:], stdin, stdout, stderr)
	case "transform":
		return transformCommand(args[1:], stdin, stdout, stderr)
	case "compare":
		return compare(args[1:], stdin, stdout, stderr)
	case "diff":
		return diff(args[1:], stdin, stdout, stderr)
	case "draw":
		return draw(args[1:], stdin, stdout, stderr)
	case "serve":
		return serve(args[1:], stdin, stdout, stderr)
	case "help", "-h", "--help":
		fmt.Fprint(stdout, usage)
		return 0
	}
	fmt.Fprintf(stderr, "stereoline: unknown command %q\n\n%s", args[0], usage)
	return 2
}
