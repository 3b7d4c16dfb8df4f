package main

import (
	"bufio"
	"flag"
	"fmt"
	"io"
	"runtime"

	"stereoline/notation"
	"stereoline/stereo/document"
)

const checkUsage = `usage: stereoline check [options] [PATH...]

Checks the stereo marks of the notation found in files and folders (folders
are searched recursively; hidden entries, node_modules and __pycache__
folders, binary files and files larger than --max-size are skipped) and
prints one line per finding. A PATH of "-" reads
standard input; --stdin-name then names it (the name picks the host kind and
is the path printed). With no PATH the current folder is checked.

Exit status: 0 when nothing at or above the --fail-on level was found, 1 when
something was, 2 for usage errors, unreadable paths and bad configuration.

options:
`

// checkOptions are the parsed command-line settings of one check run.
type checkOptions struct {
	format       string // text, json or sarif
	failOn       notation.Severity
	changedSince string
	configFile   string
	stdinName    string
	maxSize      int64 // 0: the maxFileSize setting of each file
	jobs         int
	paths        []string
	reading      readingFlags // on top of each file's configuration
	limits       limitFlags   // likewise
}

// check implements 'stereoline check'.
func check(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	opts, status := parseCheckArgs(args, stderr)
	if status >= 0 {
		return status
	}
	run := newCheckRun(opts, stdin, stderr)
	// A path that cannot be read is reported at once, naming it, and
	// makes the exit status 2; the readable files are still checked, so
	// one bad path in a CI job does not hide every other finding.
	files := run.collect()
	if opts.changedSince != "" {
		if err := run.loadChanges(files); err != nil {
			fmt.Fprintf(stderr, "stereoline: --changed-since %s: %v\n", opts.changedSince, err)
			return 2
		}
	}
	// Reports are written file by file as they come in order, and each
	// is dropped once written: memory does not grow with the findings of
	// a whole tree. SARIF is one document, whose head is written first
	// and results as they come.
	out := bufio.NewWriterSize(stdout, outputBuffer)
	var (
		sum checkSummary
		err error
		sw  *sarifWriter
	)
	if opts.format == "sarif" {
		sw, err = newSARIFWriter(out)
	}
	run.analyzeAll(files, func(rep fileReport) {
		sum.add(rep)
		switch {
		case err != nil:
		case opts.format == "sarif":
			err = sw.add(rep)
		case opts.format == "json":
			err = writeJSONLines(out, []fileReport{rep})
		default:
			err = writeText(out, []fileReport{rep})
		}
		rep.Findings.close()
	})
	if opts.format == "sarif" && err == nil {
		err = sw.finish(!run.failed, run.sortedNotes())
	}
	if err == nil {
		err = out.Flush()
	}
	if err != nil {
		fmt.Fprintf(stderr, "stereoline: writing the report: %v\n", err)
		return 2
	}
	fmt.Fprintln(stderr, sum.line(opts.changedSince != ""))
	if run.failed {
		return 2
	}
	if sum.atOrAbove(opts.failOn) > 0 {
		return 1
	}
	return 0
}

// parseCheckArgs reads the options; status is -1 to go on, otherwise the
// exit status to return at once. Options and paths may be mixed, as most
// command-line tools allow; "--" ends the options.
func parseCheckArgs(args []string, stderr io.Writer) (checkOptions, int) {
	opts := checkOptions{}
	fs := flag.NewFlagSet("check", flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.StringVar(&opts.format, "format", "text", "output format: text, json (JSON Lines) or sarif (SARIF 2.1.0)")
	failOn := fs.String("fail-on", "error", "exit 1 when a finding at or above this level is reported: error, warning or information")
	fs.StringVar(&opts.changedSince, "changed-since", "", "report only findings on lines changed since this git revision")
	fs.StringVar(&opts.configFile, "config", "", "configuration `file` to use instead of the "+configFileName+" found next to the checked files")
	fs.StringVar(&opts.stdinName, "stdin-name", "", "file `name` for standard input (picks the host kind; printed as its path)")
	maxSize := fs.String("max-size", "", "skip files larger than this (bytes, or with a kB, MB or GB suffix); default: the maxFileSize setting, else "+defaultMaxSize)
	fs.IntVar(&opts.jobs, "jobs", runtime.GOMAXPROCS(0), "number of files analysed at the same time")
	opts.reading.add(fs)
	opts.limits.add(fs)
	fs.Usage = func() {
		fmt.Fprint(stderr, checkUsage)
		fs.PrintDefaults()
	}
	rest := args
	var tail []string
	for i, a := range args {
		if a == "--" {
			rest, tail = args[:i], args[i+1:]
			break
		}
	}
	for {
		if err := fs.Parse(rest); err != nil {
			if err == flag.ErrHelp {
				return opts, 0
			}
			return opts, 2
		}
		rest = fs.Args()
		if len(rest) == 0 {
			break
		}
		opts.paths = append(opts.paths, rest[0])
		rest = rest[1:]
	}
	opts.paths = append(opts.paths, tail...)
	usageErr := func(format string, a ...any) (checkOptions, int) {
		fmt.Fprintf(stderr, "stereoline check: "+format+"\n", a...)
		return opts, 2
	}
	switch opts.format {
	case "text", "json", "sarif":
	default:
		return usageErr("--format: expected text, json or sarif, found %q", opts.format)
	}
	switch *failOn {
	case "error", "warning", "information":
		opts.failOn, _ = notation.ParseSeverity(*failOn)
	default:
		return usageErr("--fail-on: expected error, warning or information, found %q", *failOn)
	}
	if *maxSize != "" {
		n, err := parseSize(*maxSize)
		if err != nil {
			return usageErr("--max-size: %v", err)
		}
		opts.maxSize = n
	}
	if opts.jobs < 1 {
		return usageErr("--jobs: expected a positive number, found %d", opts.jobs)
	}
	if _, err := opts.reading.config(document.ReadingConfig{}); err != nil {
		return usageErr("%v", err)
	}
	if _, err := opts.limits.config(document.LimitsConfig{}); err != nil {
		return usageErr("%v", err)
	}
	if len(opts.paths) == 0 {
		opts.paths = []string{"."}
	}
	stdinCount := 0
	for _, p := range opts.paths {
		if p == "-" {
			stdinCount++
		}
	}
	if stdinCount > 1 {
		return usageErr("standard input (-) named more than once")
	}
	if opts.stdinName != "" && stdinCount == 0 {
		return usageErr("--stdin-name given but standard input (-) is not checked")
	}
	return opts, -1
}

// parseSize reads a byte count with an optional decimal suffix (kB, MB,
// GB; K, M and G are accepted too, case-insensitively).
func parseSize(s string) (int64, error) { return document.ParseSize(s) }

// defaultMaxSize is the largest file scanned when neither --max-size nor
// the maxFileSize setting says otherwise.
const defaultMaxSize = document.DefaultMaxFileSize
