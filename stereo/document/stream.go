// This file implements the streaming analysis of a whole document for
// the command line: the findings of Analyze without keeping the analyses.

package document

import (
	"stereoline/notation"
	"stereoline/notation/find"
	"stereoline/stereo/identity"
)

// streamChunk is how many records Stream analyses before it hands their
// findings on and drops their analyses (a variable for the tests).
var streamChunk = 2048

// earlierLimit bounds the earlier records Stream keeps re-read for the
// messages of relations; most relations name the first record of a
// constitution, which stays warm.
const earlierLimit = 4096

// IsRelation reports whether a code is one of the relations between the
// records of a list (relate.go). Analyze orders findings by host span,
// relations after the other findings at the same span; a caller of
// Stream sorts what it collected stably by span and then by this.
func IsRelation(c notation.Code) bool {
	switch c {
	case CodeListDuplicate, CodeListEnantiomer, CodeListStereoisomer,
		CodeListAbsoluteOfRelative, CodeListAbsoluteOfMixture, CodeListRelativeAndMixture:
		return true
	}
	return false
}

// StreamRecords finds and reads the records of a document a chunk at a
// time, bypassing the cache, and calls each with every record in order
// (query patterns are not records); the record's analysis is valid only
// during the call. With identify, the records' identity keys are computed
// beforehand on all cores (Record.Identity; nil for records without
// keys). It returns the number of records.
func (a *Analyzer) StreamRecords(name, languageID string, content []byte, identify bool, each func(i int, rec *Record)) int {
	cfg := a.cfg
	kind := a.kindOf(name, languageID)
	res := &Result{Name: name, Content: content, Kind: kind, cfg: &cfg}
	occs := res.splitQueries(find.FindKind(kind, content, cfg.findConfig(name)))
	reading := cfg.Reading.notation()
	recs := make([]Record, min(streamChunk, len(occs)))
	for start := 0; start < len(occs); start += streamChunk {
		end := min(start+streamChunk, len(occs))
		parallel(end-start, func(k int) {
			an := analyse(occs[start+k].Text, reading, cfg.Limits.limits())
			recs[k] = Record{Occ: &occs[start+k], an: an}
			if identify {
				recs[k].Identity = an.identify()
			}
		})
		for k := range end - start {
			each(start+k, &recs[k])
		}
		clear(recs)
	}
	return len(occs)
}

// Stream finds the findings Analyze finds, without keeping what it does
// not need: records are read and labelled a chunk at a time, bypassing
// the cache, their findings handed to emit (each record's own findings in
// the order of the records, then the relations of the chunk, then the
// findings of query patterns last), and their analyses dropped. Of each
// record of a list only what relating it to later ones needs is kept:
// its constitution pre-key, and identity keys once another record shares
// the pre-key. Memory grows with the findings and the keys, not with the
// analyses.
//
// Sorted stably by host span and then by IsRelation, the emitted
// findings are Analyze's Diagnostics. The Diagnostics passed to emit
// carry their Fixes too; the slice is emit's to keep or reorder, Stream
// does not touch it again. It returns the number of records and query
// patterns.
func (a *Analyzer) Stream(name, languageID string, content []byte, emit func([]Diagnostic)) int {
	cfg := a.cfg
	kind := a.kindOf(name, languageID)
	res := &Result{Name: name, Content: content, Kind: kind, cfg: &cfg}
	occs := find.FindKind(kind, content, cfg.findConfig(name))
	occs = res.splitQueries(occs)
	rel := newStreamRelater(res, occs, relatedKinds[kind])
	reading := cfg.Reading.notation()
	for start := 0; start < len(occs); start += streamChunk {
		end := min(start+streamChunk, len(occs))
		chunk := &Result{Name: name, Content: content, Kind: kind, cfg: &cfg,
			Records: make([]Record, end-start)}
		parallel(end-start, func(k int) {
			an := analyse(occs[start+k].Text, reading, cfg.Limits.limits())
			chunk.Records[k] = Record{Occ: &occs[start+k], an: an}
		})
		for k := range chunk.Records {
			chunk.Diagnostics = append(chunk.Diagnostics, chunk.recordFindings(k, chunk.Records[k].an.get())...)
		}
		for k := range chunk.Diagnostics {
			chunk.Diagnostics[k].Record += start
		}
		rel.chunk(chunk, start)
		emit(chunk.Diagnostics)
	}
	res.queryDiagnostics()
	if len(res.Diagnostics) > 0 {
		emit(res.Diagnostics)
	}
	return len(occs) + len(res.Queries)
}

// streamRelater relates the records of a list as they stream past, as
// relateRecords does for a whole result: the same index, fed in the same
// order within each constitution. A record waits, as its pre-key alone,
// until a second record shares the pre-key; then both get identity keys.
type streamRelater struct {
	on    bool
	whole *Result // for line numbers
	occs  []find.Occurrence
	idx   *identity.Index
	order []int // index position -> record
	// seen holds, for each pre-key met, the first record with it while it
	// is alone (>= 0), or -1 once the records with it are in the index.
	seen    map[uint64]int
	earlier map[int]*Record // earlier records re-read for messages
}

func newStreamRelater(whole *Result, occs []find.Occurrence, on bool) *streamRelater {
	return &streamRelater{on: on, whole: whole, occs: occs, idx: identity.NewIndex(),
		seen: map[uint64]int{}, earlier: map[int]*Record{}}
}

// chunk relates the records of a chunk (record k is record start+k of
// the document) to all before them, adding the findings to the chunk.
func (s *streamRelater) chunk(c *Result, start int) {
	if !s.on {
		return
	}
	// The records to put into the index, in order: a record whose
	// pre-key was alone brings the earlier record with it, just before.
	var adds []int
	for k := range c.Records {
		an := c.Records[k].an
		if an == nil || !an.identifiable {
			continue
		}
		i := start + k
		j, ok := s.seen[an.preKey]
		switch {
		case !ok:
			s.seen[an.preKey] = i
			continue
		case j >= 0:
			adds = append(adds, j)
			s.seen[an.preKey] = -1
		}
		adds = append(adds, i)
	}
	// Their keys, on all cores.
	recs := make([]*Record, len(adds))
	for n, i := range adds {
		recs[n] = s.record(c, start, i)
	}
	parallel(len(recs), func(n int) { recs[n].Identity = recs[n].an.identify() })
	for n, i := range adds {
		s.add(c, start, i, recs[n])
	}
}

// add puts a record into the index and returns the relation found.
func (s *streamRelater) add(c *Result, start, i int, rec *Record) {
	m := s.idx.Add(*rec.Identity)
	s.order = append(s.order, i)
	if m.Earlier < 0 {
		return
	}
	j := s.order[m.Earlier]
	earlier := s.record(c, start, j)
	if d, ok := relationDiagnostic(m, i, rec, earlier, s.whole.describeOcc(&s.occs[j])); ok {
		c.add(d)
	}
}

// record returns record j with its analysis: from the chunk, or read
// again.
func (s *streamRelater) record(c *Result, start, j int) *Record {
	if j >= start {
		return &c.Records[j-start]
	}
	if r, ok := s.earlier[j]; ok {
		return r
	}
	if len(s.earlier) >= earlierLimit {
		clear(s.earlier)
	}
	an := analyse(s.occs[j].Text, s.whole.cfg.Reading.notation(), s.whole.cfg.Limits.limits())
	r := &Record{Occ: &s.occs[j], an: an, Identity: an.identify()}
	s.earlier[j] = r
	return r
}
