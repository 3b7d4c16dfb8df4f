package main

import (
	"context"
	"flag"
	"fmt"
	"io"
	"os"
	"runtime"
	"runtime/pprof"

	"go.uber.org/zap"
	"go.uber.org/zap/zapcore"

	"stereoline/lsp"
	"stereoline/notation/find"
)

// serve implements 'stereoline serve': the language server on standard
// input and output. Logs go to standard error or to --log FILE, never to
// standard output, which carries the protocol.
func serve(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("serve", flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.Bool("stdio", true, "speak the protocol on standard input and output (the only transport)")
	logFile := fs.String("log", "", "append the log to `FILE` instead of standard error")
	verbose := fs.Bool("v", false, "log every analysis, not only problems")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: stereoline serve [--stdio] [--log FILE] [-v]\n\nRuns the language server on standard input and output.")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		return 2
	}
	if fs.NArg() > 0 {
		fmt.Fprintf(stderr, "stereoline serve: unexpected argument %q\n", fs.Arg(0))
		return 2
	}
	var sink zapcore.WriteSyncer = zapcore.AddSync(stderr)
	if *logFile != "" {
		f, err := os.OpenFile(*logFile, os.O_CREATE|os.O_APPEND|os.O_WRONLY, 0o644)
		if err != nil {
			fmt.Fprintf(stderr, "stereoline serve: %v\n", err)
			return 2
		}
		defer f.Close()
		sink = zapcore.AddSync(f)
	}
	level := zapcore.InfoLevel
	if *verbose {
		level = zapcore.DebugLevel
	}
	enc := zap.NewProductionEncoderConfig()
	enc.EncodeTime = zapcore.ISO8601TimeEncoder
	log := zap.New(zapcore.NewCore(zapcore.NewJSONEncoder(enc), zapcore.Lock(sink), level))
	defer log.Sync()
	if prof := os.Getenv("STEREOLINE_CPUPROFILE"); prof != "" {
		// a profile of the whole session, for developers (DEVELOPERS.md)
		if f, err := os.Create(prof); err == nil && pprof.StartCPUProfile(f) == nil {
			defer func() { pprof.StopCPUProfile(); f.Close() }()
		}
	}
	if prof := os.Getenv("STEREOLINE_HEAPPROFILE"); prof != "" {
		// what the heap holds at the end of the session, for developers
		defer func() {
			if f, err := os.Create(prof); err == nil {
				runtime.GC()
				pprof.WriteHeapProfile(f)
				f.Close()
			}
		}()
	}
	widenPipe(stdout)
	// An edit of source code finds the whole file again; the texts it
	// already judged are remembered, and a module of 190,000 records and
	// their titles needs room for some 380,000 (with the default 131,072
	// a generation, each edit judged most again: 3.8 s instead of 0.9 in
	// process). The server's peak RSS on that module did not rise with
	// it (646-668 MB against 641-685 MB).
	find.RememberVerdicts(serveVerdicts, serveVerdictBytes)
	return lsp.Serve(context.Background(), stdio{stdin, stdout}, log, lsp.Options{})
}

// stdio joins standard input and output into the stream the server reads
// and writes. Closing it closes neither: the process ends right after.
type stdio struct {
	io.Reader
	io.Writer
}

func (stdio) Close() error { return nil }

// serveVerdicts and serveVerdictBytes bound one generation of the
// finder's remembered verdicts in the language server (two are kept).
const (
	serveVerdicts     = 1 << 19
	serveVerdictBytes = 48 << 20
)
