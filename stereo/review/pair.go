package review

import (
	"stereoline/notation/find"
)

// This file implements the pairing of the records of two versions of a
// document, in the order of trust:
//
//  1. by the identity the host gives (hostKeys), unique on both sides;
//  2. by identical text, the k-th writing of a text with the k-th, so a
//     record moved to another line is no change;
//  3. by constitution (what the record is a writing of), first within
//     the same gap between records already paired, then anywhere, in
//     order;
//  4. by position within the same gap, in order;
//
// and what is left is added or removed.

// pairing is the outcome: for each old record its new partner, and the
// reverse, -1 for none.
type pairing struct {
	oldTo, newTo []int
}

func newPairing(nOld, nNew int) *pairing {
	p := &pairing{oldTo: make([]int, nOld), newTo: make([]int, nNew)}
	for i := range p.oldTo {
		p.oldTo[i] = -1
	}
	for i := range p.newTo {
		p.newTo[i] = -1
	}
	return p
}

func (p *pairing) join(o, n int) {
	p.oldTo[o], p.newTo[n] = n, o
}

// byKey pairs the records whose keys (unique on each side) agree.
func (p *pairing) byKey(oldKeys, newKeys []string) {
	where := make(map[string]int, len(newKeys))
	for i, k := range newKeys {
		if k != "" {
			where[k] = i
		}
	}
	for o, k := range oldKeys {
		if k == "" {
			continue
		}
		if n, ok := where[k]; ok {
			p.join(o, n)
		}
	}
}

// byText pairs unpaired records of identical text, in order.
func (p *pairing) byText(oldOccs, newOccs []find.Occurrence) {
	waiting := map[string][]int{}
	for n := range newOccs {
		if p.newTo[n] < 0 {
			waiting[newOccs[n].Text] = append(waiting[newOccs[n].Text], n)
		}
	}
	for o := range oldOccs {
		if p.oldTo[o] >= 0 {
			continue
		}
		q := waiting[oldOccs[o].Text]
		if len(q) == 0 {
			continue
		}
		p.join(o, q[0])
		waiting[oldOccs[o].Text] = q[1:]
	}
}

// gaps returns, for each unpaired record of either side, the gap it
// lies in: the pair before it (named by its new record, -1 for the start
// of the file). An old and a new record lie in the same gap when the
// nearest paired record before each is the same pair.
func (p *pairing) gaps() (oldGap, newGap []int) {
	oldGap = make([]int, len(p.oldTo))
	last := -1
	for o, n := range p.oldTo {
		if n >= 0 {
			last = n
		}
		oldGap[o] = last
	}
	newGap = make([]int, len(p.newTo))
	last = -1
	for n, o := range p.newTo {
		if o >= 0 {
			last = n
		}
		newGap[n] = last
	}
	return oldGap, newGap
}

// byContent pairs unpaired records that share a content key (their
// constitution; 0 for none), in order: first within one gap, then
// anywhere.
func (p *pairing) byContent(oldKey, newKey []uint64) {
	for _, sameGap := range []bool{true, false} {
		oldGap, newGap := p.gaps()
		type slot struct {
			key uint64
			gap int
		}
		waiting := map[slot][]int{}
		for n, k := range newKey {
			if p.newTo[n] >= 0 || k == 0 {
				continue
			}
			s := slot{key: k, gap: -2}
			if sameGap {
				s.gap = newGap[n]
			}
			waiting[s] = append(waiting[s], n)
		}
		for o, k := range oldKey {
			if p.oldTo[o] >= 0 || k == 0 {
				continue
			}
			s := slot{key: k, gap: -2}
			if sameGap {
				s.gap = oldGap[o]
			}
			if q := waiting[s]; len(q) > 0 {
				p.join(o, q[0])
				waiting[s] = q[1:]
			}
		}
	}
}

// byPosition pairs what is left within each gap, in order. Two records
// that both carry a host key, different ones, are different records
// (their keys were not paired) and are never paired by position.
func (p *pairing) byPosition(oldKeys, newKeys []string) {
	oldGap, newGap := p.gaps()
	type queues struct{ keyed, plain []int }
	waiting := map[int]*queues{}
	for n := range p.newTo {
		if p.newTo[n] >= 0 {
			continue
		}
		q := waiting[newGap[n]]
		if q == nil {
			q = &queues{}
			waiting[newGap[n]] = q
		}
		if newKeys[n] != "" {
			q.keyed = append(q.keyed, n)
		} else {
			q.plain = append(q.plain, n)
		}
	}
	for o := range p.oldTo {
		if p.oldTo[o] >= 0 {
			continue
		}
		q := waiting[oldGap[o]]
		if q == nil {
			continue
		}
		takeKeyed := oldKeys[o] == "" && len(q.keyed) > 0 && (len(q.plain) == 0 || q.keyed[0] < q.plain[0])
		switch {
		case takeKeyed:
			p.join(o, q.keyed[0])
			q.keyed = q.keyed[1:]
		case len(q.plain) > 0:
			p.join(o, q.plain[0])
			q.plain = q.plain[1:]
		}
	}
}
