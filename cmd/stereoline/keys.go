package main

import (
	"bufio"
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"runtime"
	"runtime/debug"
	"strconv"
	"strings"

	"stereoline/lsp"
	"stereoline/notation"
	"stereoline/stereo/document"
	"stereoline/stereo/identity"
)

const keysUsage = `usage: stereoline keys [options] [PATH...]

Prints the identity keys of every record found in the files and folders
(found as check finds them: folders recursively, binary files and files
larger than --max-size skipped), one line per record: its place, title,
constitution key, stereo key, the stereo key of its mirror image and what
its stereo groups make it. Records that share a stereo key are the same
structure (or the same set of stereoisomers); records that share a
constitution key are stereoisomers of one another. Any engine's group-by
on these columns finds the duplicates and stereoisomers across any number
of files (see the README, "Relations beyond one machine"). A PATH of "-"
reads standard input, as a .smi list unless --stdin-name names another
kind; with no PATH, standard input is read.

options:
`

// keysOptions are the parsed settings of one keys run.
type keysOptions struct {
	format    string // json or tsv
	stdinName string
	maxSize   int64
	paths     []string
	reading   readingFlags
	config    string
}

// keysRecordJSON is the object keys prints for one record (JSON Lines).
// Later fields are added at the end; consumers must ignore fields they do
// not know. Keys are empty for a record without keys (one that does not
// read without error, a reaction, an empty record).
type keysRecordJSON struct {
	Path         string `json:"path"`
	Line         int    `json:"line"`   // 1-based
	Column       int    `json:"column"` // 1-based, in Unicode code points
	Title        string `json:"title"`
	Constitution string `json:"constitution"`
	Stereo       string `json:"stereo"`
	Mirror       string `json:"mirror"`
	Group        string `json:"group"`
	// Field tells apart the fields of a table or dataset (a column, a
	// JSON or YAML key; 0 for a list), whose records check relates only
	// within their field: a group-by that keys on it as well finds what
	// check finds
	Field uint32 `json:"field"`
}

// keysColumns are the TSV header, in the order of keysRecordJSON.
var keysColumns = []string{"path", "line", "column", "title", "constitution", "stereo", "mirror", "group", "field"}

// keys implements 'stereoline keys'.
func keys(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	var o keysOptions
	fs := flag.NewFlagSet("keys", flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.StringVar(&o.format, "format", "json", "output format: json (JSON Lines) or tsv (tab-separated, a header line first)")
	fs.StringVar(&o.stdinName, "stdin-name", "stdin.smi", "file `name` for standard input (picks the host kind; printed as its path)")
	fs.StringVar(&o.config, "config", "", "configuration `file` to use instead of the "+configFileName+" found next to the files")
	maxSize := fs.String("max-size", "", "skip files larger than this (bytes, or with a kB, MB or GB suffix); default: the maxFileSize setting, else "+defaultMaxSize)
	o.reading.add(fs)
	fs.Usage = func() {
		fmt.Fprint(stderr, keysUsage)
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == flag.ErrHelp {
			return 0
		}
		return 2
	}
	o.paths = fs.Args()
	usageErr := func(format string, a ...any) int {
		fmt.Fprintf(stderr, "stereoline keys: "+format+"\n", a...)
		return 2
	}
	if o.format != "json" && o.format != "tsv" {
		return usageErr("--format: expected json or tsv, found %q", o.format)
	}
	if *maxSize != "" {
		n, err := parseSize(*maxSize)
		if err != nil {
			return usageErr("--max-size: %v", err)
		}
		o.maxSize = n
	}
	if _, err := o.reading.config(document.ReadingConfig{}); err != nil {
		return usageErr("%v", err)
	}
	if len(o.paths) == 0 {
		o.paths = []string{"-"}
	}
	// The files are found, read and limited as check does it.
	run := newCheckRun(checkOptions{stdinName: o.stdinName, maxSize: o.maxSize, paths: o.paths,
		reading: o.reading, configFile: o.config, jobs: runtime.GOMAXPROCS(0)}, stdin, stderr)
	out := bufio.NewWriterSize(stdout, outputBuffer)
	w := keysWriter{out: out, tsv: o.format == "tsv"}
	if w.tsv {
		out.WriteString(strings.Join(keysColumns, "\t") + "\n")
	}
	for _, f := range run.collect() {
		run.keysFile(f, &w)
	}
	if err := out.Flush(); err != nil {
		fmt.Fprintf(stderr, "stereoline: writing the keys: %v\n", err)
		return 2
	}
	if run.failed {
		return 2
	}
	return 0
}

// keysFile prints the keys of one file's records, streaming: a chunk of
// records is read and keyed at a time and nothing of it is kept.
func (r *checkRun) keysFile(f checkFile, w *keysWriter) {
	var data fileData
	defer func() {
		if p := recover(); p != nil {
			r.pathError(f.path, readFailure(p, data.mapped))
		}
		data.release()
	}()
	defer debug.SetPanicOnFault(debug.SetPanicOnFault(true)) // a mapped file cut short
	data, lc, _, ok := r.readForAnalysis(f)
	if !ok {
		return
	}
	m := lsp.NewBlockMapper(data.bytes, lsp.EncodingUTF32, mapperBlock) // records come in order
	lc.analyzer.StreamRecords(f.path, "", data.bytes, true, func(_ int, rec *document.Record) {
		k := keysRecordJSON{Path: f.path, Title: rec.Occ.Title, Group: groupKind(rec), Field: rec.Occ.Field}
		if p, err := m.OffsetToPosition(rec.Occ.Span.Start); err == nil {
			k.Line, k.Column = int(p.Line)+1, int(p.Character)+1
		}
		if id := rec.Identity; id != nil {
			k.Constitution, k.Stereo, k.Mirror = id.ConstitutionKey, id.Key, id.MirrorKey
		}
		w.write(&k)
	})
}

// groupKind says what a record's marks and stereo groups make it: "none"
// without a specified stereo unit, "absolute" for one stereoisomer (no
// or and and groups), "relative" when its groups are or groups (one of
// the stereoisomers, unknown which), "racemic" when they are and groups
// (a mixture), "mixed" for both; "" for a record without keys.
func groupKind(rec *document.Record) string {
	if rec.Identity == nil || rec.Stereo() == nil {
		return ""
	}
	specified := false
	for _, u := range rec.Stereo().Units {
		if u.Specified {
			specified = true
			break
		}
	}
	if !specified {
		return "none"
	}
	var or, and bool
	for _, g := range rec.Stereo().Groups {
		switch g.Kind {
		case notation.GroupOr:
			or = true
		case notation.GroupAnd:
			and = true
		}
	}
	switch {
	case rec.Identity.Set == identity.OneStereoisomer || !or && !and:
		return "absolute"
	case or && and:
		return "mixed"
	case or:
		return "relative"
	}
	return "racemic"
}

// keysWriter writes records as JSON Lines or TSV.
type keysWriter struct {
	out *bufio.Writer
	tsv bool
	buf []byte
}

func (w *keysWriter) write(k *keysRecordJSON) {
	if !w.tsv {
		b, _ := json.Marshal(k) // strings and ints only: cannot fail
		w.out.Write(b)
		w.out.WriteByte('\n')
		return
	}
	b := w.buf[:0]
	b = appendTSV(b, k.Path)
	b = append(b, '\t')
	b = strconv.AppendInt(b, int64(k.Line), 10)
	b = append(b, '\t')
	b = strconv.AppendInt(b, int64(k.Column), 10)
	for _, s := range []string{k.Title, k.Constitution, k.Stereo, k.Mirror, k.Group} {
		b = append(b, '\t')
		b = appendTSV(b, s)
	}
	b = append(b, '\t')
	b = strconv.AppendUint(b, uint64(k.Field), 10)
	b = append(b, '\n')
	w.out.Write(b)
	w.buf = b
}

// appendTSV appends a field with the backslash escapes of the common
// text form of TSV (common practice): \t, \n, \r and \\.
func appendTSV(b []byte, s string) []byte {
	for i := 0; i < len(s); i++ {
		switch c := s[i]; c {
		case '\t':
			b = append(b, '\\', 't')
		case '\n':
			b = append(b, '\\', 'n')
		case '\r':
			b = append(b, '\\', 'r')
		case '\\':
			b = append(b, '\\', '\\')
		default:
			b = append(b, c)
		}
	}
	return b
}
