package lsp

import (
	"math/rand/v2"
	"strings"
	"testing"
)

// TestBlockMapperAgrees checks that a BlockMapper gives a Mapper's
// position for every offset of texts with every kind of line break,
// characters outside ASCII and empty lines, in every encoding, with
// blocks of one line and more, in order and at random.
func TestBlockMapperAgrees(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	pieces := []string{"C", "[C@H]", "é", "😀", "\n", "\r\n", "\r", "\n\n", "\r\r\n", " ", "\t"}
	for trial := range 60 {
		var sb strings.Builder
		for range rng.IntN(200) {
			sb.WriteString(pieces[rng.IntN(len(pieces))])
		}
		text := []byte(sb.String())
		for _, enc := range []PositionEncoding{EncodingUTF8, EncodingUTF16, EncodingUTF32} {
			whole := NewMapper(text, enc)
			for _, n := range []int{1, 2, 7, 1000} {
				bm := NewBlockMapper(text, EncodingUTF16, n).WithEncoding(enc)
				offs := make([]int, 0, 2*len(text)+2)
				for off := 0; off <= len(text); off++ {
					offs = append(offs, off)
				}
				for range len(text) + 1 {
					offs = append(offs, rng.IntN(len(text)+1))
				}
				for _, off := range offs {
					want, _ := whole.OffsetToPosition(off)
					got, err := bm.OffsetToPosition(off)
					if err != nil || got != want {
						t.Fatalf("trial %d, %s, blocks of %d: offset %d of %q: got %+v (%v), want %+v",
							trial, enc, n, off, text, got, err, want)
					}
				}
				if _, err := bm.OffsetToPosition(len(text) + 1); err == nil {
					t.Error("no error past the end")
				}
			}
		}
	}
}
