// This file implements the streaming analysis of a whole document for
// the command line: the findings of Analyze without keeping the analyses.

package document

import (
	"math"
	"runtime"
	"runtime/debug"
	"stereoline/notation"
	"stereoline/notation/find"
	"stereoline/stereo/identity"
)

// streamChunk is how many records Stream analyses before it hands their
// findings on and drops their analyses (a variable for the tests). The
// analyses of a chunk are the live heap, which sets how far the heap
// grows between collections: 256 records keep both cores busy while
// the heap stays small (check on 6,000 records at one core: peak RSS 60
// to 30 MB, CPU time 0.50 to 0.37 s, outputs unchanged, against 2048).
var streamChunk = 256

// oneCoreChunk is the chunk Stream reads at one core (GOMAXPROCS 1),
// where there is no other core to keep busy: the storage each position
// of the two chunks in hand keeps for the next (chunkStorage) was most
// of the live heap, and a smaller heap is fewer pages to fault in. check
// on 6,000 records at one core: peak RSS 35-39 to 24 MB, page faults
// 6,800-8,000 to 4,000-4,200, time 0.31-0.33 to 0.27 s (three runs
// each, alternating). At two cores chunks this small leave a core idle:
// 2.3 to 2.6-3.6 s on 100,000 records.
const oneCoreChunk = 32

// chunkSize is the chunk Stream reads: streamChunk, or oneCoreChunk at
// one core.
func chunkSize() int {
	if runtime.GOMAXPROCS(0) == 1 {
		return min(streamChunk, oneCoreChunk)
	}
	return streamChunk
}

// earlierLimit bounds the earlier records Stream keeps re-read for the
// messages of relations; most relations name the first record of a
// constitution, which stays warm.
const earlierLimit = 512

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
	reading := cfg.Reading.notation()
	var store chunkStorage
	n := 0
	find.FindChunks(kind, content, cfg.findConfig(name), chunkSize(), func(occs []find.Occurrence) {
		occs = res.splitChunkQueries(occs)
		store = store.grow(len(occs))
		recs := make([]Record, len(occs))
		parallel(len(occs), func(k int) {
			an := analyseInto(&store[k], occs[k].Text, reading, cfg.Limits.limits(), false)
			recs[k] = Record{Occ: &occs[k], an: an}
			if identify {
				recs[k].Identity = an.identify()
			}
		})
		for k := range recs {
			each(n+k, &recs[k])
		}
		store.release(recs)
		n += len(occs)
	})
	return n
}

// splitChunkQueries is splitQueries for a chunk of the occurrences of a
// streamed document: the query patterns are appended to r.Queries, the
// records returned.
func (r *Result) splitChunkQueries(occs []find.Occurrence) []find.Occurrence {
	part := &Result{}
	occs = part.splitQueries(occs)
	r.Queries = append(r.Queries, part.Queries...)
	return occs
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
// A very long list is related in parts on disk once it is read
// (partition.go): its relations are then emitted after all the records'
// own findings, part by part, each part's in the order of the records.
//
// Sorted stably by host span and then by IsRelation, the emitted
// findings are Analyze's Diagnostics. The Diagnostics passed to emit
// carry their Fixes too (none from an analyzer WithoutFixes); the slice
// is emit's to keep or reorder, Stream does not touch it again. It
// returns the number of records and query patterns.
func (a *Analyzer) Stream(name, languageID string, content []byte, emit func([]Diagnostic)) int {
	cfg := a.cfg
	kind := a.kindOf(name, languageID)
	// line numbers (of the earlier records relations name) from a table
	// of every 64th line: a few hundred bytes are counted for each
	res := &Result{Name: name, Content: content, Kind: kind, cfg: &cfg, lineStride: 64}
	rel := newStreamRelater(res, relatedKinds[kind])
	var parts *partitions // a very long list is related in parts (partition.go)
	if rel.on {
		if parts = newPartitions(content); parts != nil {
			defer parts.close()
			rel.on = false
		}
	}
	// Two stages: while the records of a chunk are related and their
	// findings emitted, the next chunk is read and labelled. Each stage
	// keeps both cores busy only part of the time (relating is mostly
	// one index, in order).
	var stores stageStores
	type streamed struct {
		chunk  *Result
		parity int // the storage it was read into
	}
	chunks := make(chan streamed)
	done := make(chan any, 1)
	go func() {
		// the content may be a mapped file: a fault on it, if the file
		// is cut short meanwhile, is a panic handed to the caller
		debug.SetPanicOnFault(true)
		var failed any
		defer func() {
			if r := recover(); r != nil {
				failed = r
				for range chunks { // let the first stage finish
				}
			}
			done <- failed
		}()
		start := 0 // the records of earlier chunks
		for c := range chunks {
			chunk := c.chunk
			for k := range chunk.diags {
				chunk.diags[k].Record += start
			}
			rel.chunk(chunk, start)
			if parts != nil {
				parts.note(chunk, start)
			}
			emit(chunk.diags)
			stores.release(c.parity, chunk.Records)
			start += len(chunk.Records)
		}
	}()
	records := 0
	// The occurrences come a chunk at a time too (find.FindChunks), so
	// that those of a long list are not all held. The channel is closed
	// however this stage ends, so that the second one ends too.
	closed := false
	defer func() {
		if !closed {
			close(chunks)
		}
	}()
	find.FindChunks(kind, content, cfg.findConfig(name), chunkSize(), func(occs []find.Occurrence) {
		occs = res.splitChunkQueries(occs)
		if len(occs) == 0 {
			return
		}
		chunk := &Result{Name: name, Content: content, Kind: kind, cfg: &cfg, noFixes: a.noFixes}
		parity := stores.label(chunk, occs)
		for k := range chunk.Records {
			chunk.diags = append(chunk.diags, chunk.recordFindings(k, chunk.Records[k].an.get())...)
		}
		chunks <- streamed{chunk, parity}
		records += len(occs)
	})
	close(chunks)
	closed = true
	if failed := <-done; failed != nil {
		panic(failed)
	}
	if parts != nil {
		parts.relate(res, emit)
	}
	res.queryDiagnostics()
	if len(res.diags) > 0 {
		emit(res.diags)
	}
	return records + len(res.Queries)
}

// chunkStorage is the reading storage of a chunk's records, one
// Rereader for each position in the chunk, which the record at that
// position of the next chunk reads into: a record's molecule is needed
// only while its chunk is handled (findings, relations; what is kept,
// the findings and the keys, does not point into it), and a list read
// this way allocates its atoms, bonds and bond lists about once per
// position instead of once per record.
type chunkStorage []notation.Rereader

// keepAtoms bounds the molecules whose storage a position keeps for
// the next chunk, so a chunk of large records leaves no more than some
// megabytes behind.
const keepAtoms = 512

// grow returns s with room for a chunk of n records.
func (s chunkStorage) grow(n int) chunkStorage {
	if n > len(s) {
		s = append(s, make(chunkStorage, n-len(s))...)
	}
	return s
}

// stageStores are the two storages the chunks of a two-stage reading
// (Stream, partitions.relatePart) alternate between: while the second
// stage handles a chunk read into one, the first reads the next into
// the other, which the chunk before the last released when the second
// stage was done with it (the chunks are handed over unbuffered).
type stageStores struct {
	stores [2]chunkStorage
	next   int // the storage the next chunk is read into
}

// label reads and labels the records of occs, on all cores, into the
// next storage, as chunk's Records, and returns that storage's parity
// for release.
func (s *stageStores) label(chunk *Result, occs []find.Occurrence) int {
	parity := s.next
	s.next ^= 1
	store := s.stores[parity].grow(len(occs))
	s.stores[parity] = store
	reading, lim := chunk.cfg.Reading.notation(), chunk.cfg.Limits.limits()
	chunk.Records = make([]Record, len(occs))
	parallel(len(occs), func(k int) {
		// the records' analyses are dropped once their findings and
		// keys are out: nothing asks them to explain
		an := analyseInto(&store[k], occs[k].Text, reading, lim, true)
		chunk.Records[k] = Record{Occ: &occs[k], an: an}
	})
	return parity
}

// release is called when the second stage is done with the records of a
// chunk read into the storage of parity.
func (s *stageStores) release(parity int, recs []Record) { s.stores[parity].release(recs) }

// release is called when the records of a chunk are done with: it
// drops the storage of positions that read a large molecule.
func (s chunkStorage) release(recs []Record) {
	for k := range recs {
		an := recs[k].an
		if an == nil {
			continue
		}
		if f := an.full.Load(); f != nil && len(f.mol.Atoms) > keepAtoms {
			s[k] = notation.Rereader{}
		}
	}
}

// streamRelater relates the records of a list as they stream past, as
// relateRecords does for a whole result: the same index, fed in the same
// order within each constitution. A record waits, as its pre-key alone,
// until a second record shares the pre-key; then both get identity keys.
//
// Of the occurrences of records gone by it keeps compact references
// (find.Ref), enough to read a record again for the message of a
// relation found later.
type streamRelater struct {
	on    bool
	whole *Result // for line numbers and the content
	// fields are the identity index of each field of the document
	// (find.Occurrence Field): records are related within their field
	fields map[uint32]*fieldIndex
	// seen holds, for each pre-key met, the first record with it while it
	// is alone (>= 0), or -1 once the records with it are in the index
	// (int32: a list of a million records has about as many pre-keys).
	seen map[uint64]int32
	// refs are the records' occurrences by record, those of the records
	// that cannot be rebuilt from the content (find.RefOf) in odd.
	refs    refPages
	odd     map[int]*find.Occurrence
	earlier map[int]*Record // earlier records re-read for messages
}

func newStreamRelater(whole *Result, on bool) *streamRelater {
	return &streamRelater{on: on, whole: whole, fields: map[uint32]*fieldIndex{},
		seen: map[uint64]int32{}, odd: map[int]*find.Occurrence{}, earlier: map[int]*Record{}}
}

// fieldIndex is the identity index of the records of one field.
type fieldIndex struct {
	idx   *identity.Index
	order []int // index position -> record
}

// chunk relates the records of a chunk (record k is record start+k of
// the document) to all before them, adding the findings to the chunk.
func (s *streamRelater) chunk(c *Result, start int) {
	if !s.on {
		return
	}
	for k := range c.Records {
		s.keep(start+k, c.Records[k].Occ)
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
		key := relateKey(an.preKey, c.Records[k].Occ)
		j, ok := s.seen[key]
		switch {
		case !ok && i <= math.MaxInt32:
			s.seen[key] = int32(i)
			continue
		case !ok: // past two thousand million records: alone forever
			continue
		case j >= 0:
			adds = append(adds, int(j))
			s.seen[key] = -1
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

// keep notes the occurrence of record i (the next record).
func (s *streamRelater) keep(i int, o *find.Occurrence) {
	r, ok := find.RefOf(s.whole.Content, o)
	if !ok {
		oc := *o
		s.odd[i] = &oc
	}
	s.refs.add(r)
}

// occurrence returns the occurrence of an earlier record.
func (s *streamRelater) occurrence(j int) *find.Occurrence {
	if o, ok := s.odd[j]; ok {
		return o
	}
	o := s.refs.at(j).Occurrence(s.whole.Content)
	return &o
}

// add puts a record into the index and returns the relation found.
func (s *streamRelater) add(c *Result, start, i int, rec *Record) {
	field := rec.Occ.Field
	f := s.fields[field]
	if f == nil {
		f = &fieldIndex{idx: identity.NewIndex()}
		s.fields[field] = f
	}
	m := f.idx.Add(*rec.Identity)
	f.order = append(f.order, i)
	if m.Earlier < 0 {
		return
	}
	j := f.order[m.Earlier]
	var earlier *Record
	switch {
	case j >= start:
		earlier = &c.Records[j-start]
	case m.Relation == identity.Identical || m.Relation == identity.Enantiomers:
		// their messages name the earlier record by its place alone: it
		// is not read again (a list of many duplicates would read each
		// first record as often)
		earlier = &Record{Occ: s.occurrence(j)}
	default:
		earlier = s.record(c, start, j)
	}
	if d, ok := relationDiagnostic(m, i, rec, earlier, s.whole.describeOcc(earlier.Occ)); ok {
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
	o := s.occurrence(j)
	an := analyse(o.Text, s.whole.cfg.Reading.notation(), s.whole.cfg.Limits.limits())
	r := &Record{Occ: o, an: an, Identity: an.identify()}
	s.earlier[j] = r
	return r
}

// refPages holds a Ref for each record in pages of a fixed size: a list
// of millions of records neither leaves a quarter of a growing slice
// unused nor holds the old slice and the new while it grows.
type refPages [][]find.Ref

const refPage = 8192

func (p *refPages) add(r find.Ref) {
	if n := len(*p); n == 0 || len((*p)[n-1]) == refPage {
		*p = append(*p, make([]find.Ref, 0, refPage))
	}
	last := &(*p)[len(*p)-1]
	*last = append(*last, r)
}

func (p refPages) at(i int) find.Ref { return p[i/refPage][i%refPage] }
