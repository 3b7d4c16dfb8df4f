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
// bytes a line, where this holds 8 bytes a block.
type BlockMapper struct {
	content  []byte
	encoding PositionEncoding
	n        int
	starts   []int // the starts of lines 0, n, 2n, ...
	block    int   // the block cur maps
	cur      *Mapper
}

// NewBlockMapper scans content for the starts of its blocks of n lines
// (n >= 1), line breaks being those of a Mapper: "\n", "\r\n" and "\r".
func NewBlockMapper(content []byte, enc PositionEncoding, n int) *BlockMapper {
	n = max(n, 1)
	starts := []int{0}
	line := 0
	next := func(from int) int { return bytes.IndexByte(content[from:], '\n') }
	if bytes.IndexByte(content, '\r') >= 0 {
		next = func(from int) int { return bytes.IndexAny(content[from:], "\r\n") }
	}
	for i := 0; i < len(content); {
		k := next(i)
		if k < 0 {
			break
		}
		i += k
		if content[i] == '\r' && i+1 < len(content) && content[i+1] == '\n' {
			i++
		}
		i++
		if line++; line%n == 0 {
			starts = append(starts, i)
		}
	}
	return &BlockMapper{content: content, encoding: enc, n: n, starts: starts, block: -1}
}

// WithEncoding returns a mapper of the same text that counts characters
// in enc, sharing the table of blocks.
func (b *BlockMapper) WithEncoding(enc PositionEncoding) *BlockMapper {
	return &BlockMapper{content: b.content, encoding: enc, n: b.n, starts: b.starts, block: -1}
}

// OffsetToPosition is Mapper.OffsetToPosition.
func (b *BlockMapper) OffsetToPosition(off int) (protocol.Position, error) {
	if off < 0 || off > len(b.content) {
		return protocol.Position{}, fmt.Errorf("offset %d outside the text (length %d)", off, len(b.content))
	}
	k := sort.Search(len(b.starts), func(i int) bool { return b.starts[i] > off }) - 1
	if k != b.block {
		end := len(b.content)
		if k+1 < len(b.starts) {
			end = b.starts[k+1]
		}
		// a block ends just after a line break, so its lines are the
		// whole text's, however it ends
		b.cur, b.block = NewMapper(b.content[b.starts[k]:end], b.encoding), k
	}
	p, err := b.cur.OffsetToPosition(off - b.starts[k])
	p.Line += uint32(k * b.n)
	return p, err
}
