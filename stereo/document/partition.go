// This file implements the relating of a very long list in parts kept on
// disk, so that Stream's memory does not grow with the records.

package document

import (
	"bufio"
	"bytes"
	"encoding/binary"
	"fmt"
	"io"
	"os"
	"runtime/debug"

	"stereoline/notation/find"
)

// Records are related only to records with the same relate key (their
// constitution's pre-key and field): a record alone on its key is never
// put into an index (streamRelater). So the records of a list split by
// key into parts are related part by part exactly as in one pass, each
// part in the order of the records. Above partitionAbove bytes of
// content, Stream notes each record's key and reference in the file of
// its part while it reads the list, and relates the parts one after the
// other once the list is read: what it holds is one part's index, not
// the whole list's. The records of a part that share a key are read
// again for it, a second reading of the related records only.
var (
	partitionAbove = 64 << 20 // content bytes (about a million records of a list)
	partitionBytes = 16 << 20 // content bytes for each part
)

// partitionLines is the estimated number of lines above which a list is
// related in parts however short it is: the index of a million records
// of distinct constitutions holds about 150 MB, so a list of short
// records must not wait for 64 MB.
const partitionLines = 1_000_000

// partEntry is what a part's file holds for a record.
type partEntry struct {
	record int    // in the document
	key    uint64 // relateKey
	ref    find.Ref
}

const partEntrySize = 16 + find.RefSize

// partitions are the files of the parts of a long list while it is read.
type partitions struct {
	files []*os.File
	names []string // of files that could not be removed while open
	out   []*bufio.Writer
	odd   map[int]*find.Occurrence // records without a Ref (find.RefOf)
	buf   []byte
}

// newPartitions creates the files of the parts of content, or returns
// nil when content is short enough to relate in memory or a temporary
// file cannot be made.
func newPartitions(content []byte) *partitions {
	if len(content) <= partitionAbove && estimatedLines(content) <= partitionLines {
		return nil
	}
	n := 1 + len(content)/partitionBytes
	p := &partitions{odd: map[int]*find.Occurrence{}}
	for range n {
		f, err := os.CreateTemp("", "stereoline-relate-*")
		if err != nil {
			p.close()
			return nil
		}
		if os.Remove(f.Name()) != nil {
			p.names = append(p.names, f.Name())
		}
		p.files = append(p.files, f)
		p.out = append(p.out, bufio.NewWriterSize(f, 64<<10))
	}
	return p
}

// estimatedLines estimates the lines of content from those of its first
// 4 MB.
func estimatedLines(content []byte) int {
	sample := content[:min(len(content), 4<<20)]
	if len(sample) == 0 {
		return 0
	}
	return int(int64(bytes.Count(sample, []byte{'\n'})) * int64(len(content)) / int64(len(sample)))
}

// close removes the files.
func (p *partitions) close() {
	for _, f := range p.files {
		f.Close()
	}
	for _, name := range p.names {
		os.Remove(name)
	}
}

// note writes the relate keys and references of a chunk's records that
// can be related (record k is record start+k of the document).
func (p *partitions) note(c *Result, start int) {
	for k := range c.Records {
		an := c.Records[k].an
		if an == nil || !an.identifiable {
			continue
		}
		occ := c.Records[k].Occ
		key := relateKey(an.preKey, occ)
		ref, ok := find.RefOf(c.Content, occ)
		if !ok {
			o := *occ
			p.odd[start+k] = &o
		}
		b := binary.LittleEndian.AppendUint64(p.buf[:0], uint64(start+k))
		b = binary.LittleEndian.AppendUint64(b, key)
		b, _ = ref.AppendBinary(b)
		p.buf = b
		if _, err := p.out[key%uint64(len(p.out))].Write(b); err != nil {
			panic(fmt.Errorf("relating the records through a temporary file: %w", err))
		}
	}
}

// relate relates the records of each part in turn, handing emit the
// relations of each chunk of a part's related records, in the order of
// the records within the part.
func (p *partitions) relate(whole *Result, emit func([]Diagnostic)) {
	for k, w := range p.out {
		if err := w.Flush(); err != nil {
			panic(fmt.Errorf("relating the records through a temporary file: %w", err))
		}
		entries, err := readPart(p.files[k])
		if err != nil {
			panic(fmt.Errorf("relating the records through a temporary file: %w", err))
		}
		p.relatePart(whole, entries, emit)
	}
}

// readPart reads the entries of a part's file.
func readPart(f *os.File) ([]partEntry, error) {
	size, err := f.Seek(0, io.SeekCurrent)
	if err != nil {
		return nil, err
	}
	r := bufio.NewReaderSize(io.NewSectionReader(f, 0, size), 64<<10)
	entries := make([]partEntry, 0, size/partEntrySize)
	var b [partEntrySize]byte
	for range size / partEntrySize {
		if _, err := io.ReadFull(r, b[:]); err != nil {
			return nil, err
		}
		e := partEntry{record: int(binary.LittleEndian.Uint64(b[:])), key: binary.LittleEndian.Uint64(b[8:])}
		if err := e.ref.UnmarshalBinary(b[16:]); err != nil {
			return nil, err
		}
		entries = append(entries, e)
	}
	return entries, nil
}

// relatePart relates the records of one part: those alone on their key
// are left out, the others read again and fed, a chunk at a time, to a
// streamRelater as a list of their own; the record numbers of its
// relations are then the document's.
func (p *partitions) relatePart(whole *Result, entries []partEntry, emit func([]Diagnostic)) {
	count := make(map[uint64]int32, len(entries))
	for _, e := range entries {
		count[e.key]++
	}
	related := entries[:0]
	for _, e := range entries {
		if count[e.key] > 1 {
			related = append(related, e)
		}
	}
	count = nil
	rel := newStreamRelater(whole, true)
	// Two stages, as in Stream: while a chunk is related, the next one is
	// read again and labelled.
	type readChunk struct {
		chunk  *Result
		start  int
		parity int
	}
	var stores stageStores
	chunks := make(chan readChunk)
	stop := make(chan struct{})
	var failed any
	go func() {
		defer close(chunks)
		defer func() { failed = recover() }()
		// the texts are copied out of the content here: a fault in a
		// mapped file cut short is a panic raised again by the caller
		debug.SetPanicOnFault(true)
		chunk := chunkSize()
		for start := 0; start < len(related); start += chunk {
			part := related[start:min(start+chunk, len(related))]
			occs := make([]find.Occurrence, len(part))
			for k := range part {
				if o, ok := p.odd[part[k].record]; ok {
					occs[k] = *o
				} else {
					occs[k] = part[k].ref.Occurrence(whole.Content)
				}
			}
			chunk := &Result{Name: whole.Name, Content: whole.Content, Kind: whole.Kind, cfg: whole.cfg}
			parity := stores.label(chunk, occs)
			select {
			case chunks <- readChunk{chunk, start, parity}:
			case <-stop:
				return
			}
		}
	}()
	defer func() {
		// the caller's stage ended, returned or panicked: let the reader end
		close(stop)
		for range chunks {
		}
	}()
	for c := range chunks {
		chunk := c.chunk
		rel.chunk(chunk, c.start)
		for i := range chunk.diags {
			chunk.diags[i].Record = related[chunk.diags[i].Record].record
		}
		if len(chunk.diags) > 0 {
			emit(chunk.diags)
		}
		stores.release(c.parity, chunk.Records)
	}
	if failed != nil {
		panic(failed)
	}
}
