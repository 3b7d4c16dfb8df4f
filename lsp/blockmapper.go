package lsp

import (
	"bytes"
	"fmt"
	"sort"

	"go.lsp.dev/protocol"
)

// BlockMapper converts offsets to positions exactly as a Mapper of the
// whole text does, holding the start of every n-th line only and the
// Mapper of one block of n lines, the last one used. For a long text
// whose offsets come mostly in order (the findings of a file being
// checked), the table of every line would be the largest thing held: 8
// bytes a line, where this holds 8 bytes a block. The table is scanned
// only as far as the offsets asked for, so the text is read along with
// its use rather than all at once (a mapped file: its pages are let go
// behind the reading).
type BlockMapper struct {
	table    *blockTable // shared by the encodings of one text
	encoding PositionEncoding
	block    int // the block cur maps
	cur      *Mapper
}

// blockTable holds the starts of the blocks of lines of a text, as far
// as scanned.
type blockTable struct {
	content []byte
	n       int
	starts  []int // the starts of lines 0, n, 2n, ...
	scanned int   // the offset up to which line breaks were counted
	lines   int   // the line breaks before scanned
}

// NewBlockMapper returns the mapper of content with blocks of n lines
// (n >= 1), line breaks being those of a Mapper: "\n", "\r\n" and "\r".
func NewBlockMapper(content []byte, enc PositionEncoding, n int) *BlockMapper {
	t := &blockTable{content: content, n: max(n, 1), starts: []int{0}}
	return &BlockMapper{table: t, encoding: enc, block: -1}
}

// WithEncoding returns a mapper of the same text that counts characters
// in enc, sharing the table of blocks.
func (b *BlockMapper) WithEncoding(enc PositionEncoding) *BlockMapper {
	return &BlockMapper{table: b.table, encoding: enc, block: -1}
}

// cover scans the text until the block holding off is known whole: a
// block starts after it, or the text ends.
func (t *blockTable) cover(off int) {
	content := t.content
	for t.starts[len(t.starts)-1] <= off && t.scanned < len(content) {
		i := t.scanned
		rest := content[i:]
		k := bytes.IndexByte(rest, '\n')
		if k >= 0 {
			rest = rest[:k]
		}
		if r := bytes.IndexByte(rest, '\r'); r >= 0 { // a break before the "\n"
			k = r
		}
		if k < 0 {
			t.scanned = len(content)
			break
		}
		i += k
		if content[i] == '\r' && i+1 < len(content) && content[i+1] == '\n' {
			i++
		}
		t.scanned = i + 1
		if t.lines++; t.lines%t.n == 0 {
			t.starts = append(t.starts, t.scanned)
		}
	}
}

// OffsetToPosition is Mapper.OffsetToPosition.
func (b *BlockMapper) OffsetToPosition(off int) (protocol.Position, error) {
	t := b.table
	if off < 0 || off > len(t.content) {
		return protocol.Position{}, fmt.Errorf("offset %d outside the text (length %d)", off, len(t.content))
	}
	t.cover(off)
	k := sort.Search(len(t.starts), func(i int) bool { return t.starts[i] > off }) - 1
	if k != b.block {
		end := len(t.content)
		if k+1 < len(t.starts) {
			end = t.starts[k+1]
		}
		// a block ends just after a line break, so its lines are the
		// whole text's, however it ends
		b.cur, b.block = NewMapper(t.content[t.starts[k]:end], b.encoding), k
	}
	p, err := b.cur.OffsetToPosition(off - t.starts[k])
	p.Line += uint32(k * t.n)
	return p, err
}
