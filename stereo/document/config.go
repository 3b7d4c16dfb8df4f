// Package document is the one engine behind the checker and the language
// server: it finds notation in a host file, reads and labels every
// record, relates the records of a list, and answers the questions an
// editor asks (diagnostics, hover, labels, rewrites) in host byte
// offsets. It knows nothing of LSP; converting offsets to editor
// positions is the caller's job.
package document

import (
	"encoding/json"
	"fmt"
	"maps"
	"math"
	"path"
	"slices"
	"strconv"
	"strings"
	"time"

	"stereoline/notation"
	"stereoline/notation/find"
	"stereoline/stereo"
)

// Config is the configuration shared by the checker's configuration file
// and the language server's settings. The zero value is not the default;
// use DefaultConfig.
type Config struct {
	// Severity overrides the severity of a diagnostic code: "error",
	// "warning", "information", "hint" or "off".
	Severity map[string]string `json:"severity,omitempty"`
	// InlayHints turns the inline descriptors on or off.
	InlayHints bool `json:"inlayHints"`
	// DrawingLens says which records get the editor's drawing code lens
	// (lens.go): "lists" (records of lists and tables, the default),
	// "everywhere" or "off".
	DrawingLens string `json:"drawingLens,omitempty"`
	// Detection is how eagerly string literals are taken as notation:
	// "normal" (names, places and unmistakable literals) or "names"
	// (only where a name or place says so).
	Detection string `json:"detection,omitempty"`
	// Columns names extra CSV/TSV columns that hold notation.
	Columns []string `json:"columns,omitempty"`
	// Names lists extra words that mark a variable, key or argument as
	// holding notation.
	Names []string `json:"names,omitempty"`
	// Files maps extra file patterns (path.Match syntax on the base name)
	// to a host kind: "smi", "csv", "tsv", "python", "markdown", ...
	Files map[string]string `json:"files,omitempty"`
	// Layouts maps file patterns (path.Match syntax on the base name) to
	// the layout of those record lists, in the syntax of
	// find.ParseLayout ("field=2 sep=tab header"); a "stereoline:
	// layout" pragma in a file wins over it.
	Layouts map[string]string `json:"layouts,omitempty"`
	// ReviewBase is the git revision the language server compares each
	// record with, to say what an edited record now means ("epimer at
	// C3 vs HEAD"); empty means HEAD, "off" turns the comparison off.
	ReviewBase string `json:"reviewBase,omitempty"`
	// Reading chooses how the marks general-purpose readers read
	// differently are read (notation.Reading); empty fields are the
	// defaults.
	Reading ReadingConfig `json:"reading,omitzero"`
	// Limits bound the work spent on one record; empty fields are the
	// defaults.
	Limits LimitsConfig `json:"limits,omitzero"`
	// MaxFileSize is the largest file the command line scans (check,
	// keys): a byte count with an optional kB, MB or GB suffix
	// (ParseSize); empty means DefaultMaxFileSize. Larger files are
	// skipped with a note, so a stray dump cannot take the memory of a
	// CI job.
	MaxFileSize string `json:"maxFileSize,omitempty"`
	// MaxDocumentSize is the largest document the language server
	// analyses, written as MaxFileSize is (ParseSize); empty means
	// DefaultMaxDocumentSize. A larger document gets no findings and a
	// message that says why. The checker ignores it.
	MaxDocumentSize string `json:"maxDocumentSize,omitempty"`
}

// LimitsConfig is the limits setting.
type LimitsConfig struct {
	// RecordTime is the time one record's reading and analysis may take
	// (a Go duration: "1s", "250ms"), "off" for no limit; empty means
	// stereo.DefaultBudget. A record that needs more is reported under
	// stereo-over-budget, its remaining units left undetermined.
	RecordTime string `json:"recordTime,omitempty"`
	// DigraphNodes bounds the hierarchical digraph the CIP ranking grows
	// for one unit; 0 means stereo.DefaultNodeCap. A unit that needs more
	// is reported under stereo-undetermined.
	DigraphNodes int `json:"digraphNodes,omitempty"`
	// RecordAtoms is the most atoms a record may have and still be read
	// and analysed; 0 means DefaultRecordAtoms. A larger record is not
	// read at all (its atoms are only counted, notation.CountAtoms) and
	// is reported under stereo-over-budget: reading and ranking a
	// million-atom record cannot fit the time budget, and its model alone
	// would take hundreds of megabytes.
	RecordAtoms int `json:"recordAtoms,omitempty"`
}

// DefaultRecordAtoms is the recordAtoms limit by default: ten times the
// largest molecules written in line notation in practice (proteins of a
// few thousand residues), and small enough that reading and analysing a
// record that size fits in the default time budget.
const DefaultRecordAtoms = 200_000

// MaxRecordAtoms is the largest recordAtoms limit the engine takes.
const MaxRecordAtoms = 100_000_000

// MaxDigraphNodes is the largest digraph node cap the engine takes.
const MaxDigraphNodes = stereo.MaxNodeCap

// limits are the analysis limits a LimitsConfig names, part of what an
// analysis depends on (the cache keys by them).
type limits struct {
	budget  time.Duration // negative: none
	nodeCap int
	atoms   int
}

// limits returns the limits the setting names; values Validate rejects
// read as the defaults.
func (l LimitsConfig) limits() limits {
	out := limits{budget: stereo.DefaultBudget, nodeCap: stereo.DefaultNodeCap, atoms: DefaultRecordAtoms}
	if l.RecordAtoms > 0 && l.RecordAtoms <= MaxRecordAtoms {
		out.atoms = l.RecordAtoms
	}
	if d, ok := ParseRecordTime(l.RecordTime); ok {
		out.budget = d
	}
	if l.DigraphNodes > 0 && l.DigraphNodes <= MaxDigraphNodes {
		out.nodeCap = l.DigraphNodes
	}
	return out
}

// ParseRecordTime reads the recordTime limit: a positive Go duration, or
// "off" (returned as -1) for none; empty is the default.
func ParseRecordTime(s string) (time.Duration, bool) {
	switch s {
	case "":
		return stereo.DefaultBudget, true
	case "off":
		return -1, true
	}
	d, err := time.ParseDuration(s)
	if err != nil || d <= 0 {
		return 0, false
	}
	return d, true
}

// validate reports a limit that is not one.
func (l LimitsConfig) validate() error {
	if _, ok := ParseRecordTime(l.RecordTime); !ok {
		return fmt.Errorf("limits.recordTime: expected a positive duration such as 1s or 500ms, or off, found %q", l.RecordTime)
	}
	if l.DigraphNodes < 0 || l.DigraphNodes > MaxDigraphNodes {
		return fmt.Errorf("limits.digraphNodes: expected a number from 1 to %d, found %d", MaxDigraphNodes, l.DigraphNodes)
	}
	if l.RecordAtoms < 0 || l.RecordAtoms > MaxRecordAtoms {
		return fmt.Errorf("limits.recordAtoms: expected a number from 1 to %d, found %d", MaxRecordAtoms, l.RecordAtoms)
	}
	return nil
}

// DefaultMaxFileSize is the largest file scanned when MaxFileSize is
// not set.
const DefaultMaxFileSize = "10MB"

// ParseSize reads a byte count with an optional decimal suffix (kB, MB,
// GB; K, M and G are accepted too, case-insensitively).
func ParseSize(s string) (int64, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	mult := int64(1)
	for _, u := range []struct {
		suffix string
		mult   int64
	}{{"gb", 1e9}, {"mb", 1e6}, {"kb", 1e3}, {"g", 1e9}, {"m", 1e6}, {"k", 1e3}, {"b", 1}} {
		if strings.HasSuffix(t, u.suffix) {
			t, mult = strings.TrimSpace(strings.TrimSuffix(t, u.suffix)), u.mult
			break
		}
	}
	n, err := strconv.ParseInt(t, 10, 64)
	if err != nil || n <= 0 || n > (1<<62)/mult {
		return 0, fmt.Errorf("expected a positive size such as 500kB or 10MB, found %q", s)
	}
	return n * mult, nil
}

// DefaultMaxDocumentSize is the largest document the language server
// analyses unless the maxDocumentSize setting says otherwise: about five
// times a 100,000-record list. The server's memory grows with the
// records (peak RSS about 400 MB at 100,000 records, 700 to 800 MB at
// 190,000 to 200,000), so a document near the limit needs more than the 500 MB a
// list of 100,000 is held to.
const DefaultMaxDocumentSize = "32MB"

// DocumentLimit returns the largest document the language server
// analyses under c, in bytes.
func (c Config) DocumentLimit() int {
	size := c.MaxDocumentSize
	if size == "" {
		size = DefaultMaxDocumentSize
	}
	n, err := ParseSize(size)
	if err != nil { // rejected by Validate
		n, _ = ParseSize(DefaultMaxDocumentSize)
	}
	return int(min(n, math.MaxInt))
}

// ReadingConfig is the reading setting: each field the name of a rule of
// notation.Reading, or empty for the default.
type ReadingConfig struct {
	// LonePair is "last" (the default) or "hydrogen-slot".
	LonePair string `json:"lonePair,omitempty"`
	// RingMarks is "closing" (the default) or "dropped".
	RingMarks string `json:"ringMarks,omitempty"`
}

// notation returns the reading the setting names; names Validate
// rejects read as the default.
func (r ReadingConfig) notation() notation.Reading {
	var out notation.Reading
	if v, ok := notation.ParseLonePairRule(r.LonePair); ok {
		out.LonePair = v
	}
	if v, ok := notation.ParseRingMarkRule(r.RingMarks); ok {
		out.RingMarks = v
	}
	return out
}

// NotationReading returns the reading of the marks the configuration
// chooses.
func (c *Config) NotationReading() notation.Reading { return c.Reading.notation() }

// validate reports a rule name that is not one.
func (r ReadingConfig) validate() error {
	if _, ok := notation.ParseLonePairRule(r.LonePair); !ok && r.LonePair != "" {
		return fmt.Errorf("reading.lonePair: expected %s or %s, found %q", notation.LonePairLast, notation.LonePairHydrogenSlot, r.LonePair)
	}
	if _, ok := notation.ParseRingMarkRule(r.RingMarks); !ok && r.RingMarks != "" {
		return fmt.Errorf("reading.ringMarks: expected %s or %s, found %q", notation.RingMarksClosing, notation.RingMarksDropped, r.RingMarks)
	}
	return nil
}

// DefaultConfig returns the configuration used when nothing is set.
func DefaultConfig() Config {
	return Config{InlayHints: true, Detection: "normal"}
}

// Validate reports settings that cannot be honoured, naming them.
func (c *Config) Validate() error {
	for code, s := range c.Severity {
		if s == "off" {
			continue
		}
		if _, ok := notation.ParseSeverity(s); !ok {
			return fmt.Errorf("severity of %q: expected error, warning, information, hint or off, found %q", code, s)
		}
	}
	switch c.Detection {
	case "", "normal", "names":
	default:
		return fmt.Errorf("detection: expected normal or names, found %q", c.Detection)
	}
	switch c.DrawingLens {
	case "", LensLists, LensEverywhere, LensOff:
	default:
		return fmt.Errorf("drawingLens: expected %s, %s or %s, found %q", LensLists, LensEverywhere, LensOff, c.DrawingLens)
	}
	if err := c.Reading.validate(); err != nil {
		return err
	}
	if err := c.Limits.validate(); err != nil {
		return err
	}
	if c.MaxFileSize != "" {
		if _, err := ParseSize(c.MaxFileSize); err != nil {
			return fmt.Errorf("maxFileSize: %v", err)
		}
	}
	if c.MaxDocumentSize != "" {
		if _, err := ParseSize(c.MaxDocumentSize); err != nil {
			return fmt.Errorf("maxDocumentSize: %v", err)
		}
	}
	if strings.HasPrefix(c.ReviewBase, "-") || strings.ContainsAny(c.ReviewBase, " \t\n") {
		return fmt.Errorf("reviewBase: expected a git revision or off, found %q", c.ReviewBase)
	}
	for pat, spec := range c.Layouts {
		if _, err := path.Match(pat, ""); err != nil {
			return fmt.Errorf("layouts: pattern %q: %v", pat, err)
		}
		if _, err := find.ParseLayout(spec); err != nil {
			return fmt.Errorf("layouts: %v", err)
		}
	}
	return nil
}

// Merge applies the settings present in a JSON object on top of c, so a
// partial settings object from an editor changes only what it names.
func (c *Config) Merge(raw json.RawMessage) error {
	if len(raw) == 0 || string(raw) == "null" {
		return nil
	}
	next := c.clone()
	if err := json.Unmarshal(raw, &next); err != nil {
		return err
	}
	if err := next.Validate(); err != nil {
		return err
	}
	*c = next
	return nil
}

// severityFor applies the overrides to a diagnostic's own severity; ok is
// false when the code is switched off.
func (c *Config) severityFor(code notation.Code, s notation.Severity) (notation.Severity, bool) {
	v, set := c.Severity[string(code)]
	if !set {
		return s, true
	}
	if v == "off" {
		return s, false
	}
	if p, ok := notation.ParseSeverity(v); ok {
		return p, true
	}
	return s, true
}

// findConfig is the finder's configuration for a file of this name: the
// layout of the first layouts pattern (in sorted order) matching its base
// name.
func (c *Config) findConfig(name string) find.Config {
	fc := find.Config{Columns: c.Columns, Names: c.Names, NoGuess: c.Detection == "names"}
	base := path.Base(strings.ReplaceAll(name, "\\", "/"))
	for _, pat := range slices.Sorted(maps.Keys(c.Layouts)) {
		if ok, _ := path.Match(pat, base); ok {
			fc.Layout = c.Layouts[pat]
			break
		}
	}
	return fc
}

// clone returns a copy of c that shares no map or slice with it, so that
// merging settings into the copy leaves c as it was.
func (c *Config) clone() Config {
	n := *c
	n.Severity = maps.Clone(c.Severity)
	n.Files = maps.Clone(c.Files)
	n.Layouts = maps.Clone(c.Layouts)
	n.Columns = slices.Clone(c.Columns)
	n.Names = slices.Clone(c.Names)
	return n
}
