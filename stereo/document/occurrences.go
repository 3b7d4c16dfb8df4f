package document

import (
	"stereoline/notation/find"
)

// This file implements the two halves of AnalyzeRecords for callers that
// read only some records of a document: a review of a change finds the
// records of both versions, pairs them, and reads only those whose text
// changed (a list of 100,000 records with 2,000 edits reads 2,000).

// Occurrences finds the records of a document without reading them: the
// host kind and the notation occurrences in host order, query patterns
// (SMARTS) left out, as AnalyzeRecords would read them.
func (a *Analyzer) Occurrences(name, languageID string, content []byte) (find.Kind, []find.Occurrence) {
	kind := a.kindOf(name, languageID)
	cfg := a.cfg
	occs := find.FindKind(kind, content, cfg.findConfig(name))
	return kind, notationOnly(occs)
}

// AnalyzeOccurrences reads and labels the given occurrences of a document
// (some or all of what Occurrences returned for it) with the findings
// about each record on its own, as AnalyzeRecords does: Records[i] is
// occs[i]. The records are not related to each other. Unlike the
// records of AnalyzeRecords, they hold on to their molecules and stereo
// analyses: a review reads them all.
func (a *Analyzer) AnalyzeOccurrences(name string, kind find.Kind, content []byte, occs []find.Occurrence) *Result {
	cfg := a.cfg
	res := &Result{Name: name, Content: content, Kind: kind, cfg: &cfg}
	res.Records = make([]Record, len(occs))
	res.own = make([][]Diagnostic, len(occs))
	parallel(len(occs), func(i int) {
		an, f := a.cache.get(occs[i].Text, cfg.Reading.notation(), cfg.Limits.limits())
		res.Records[i] = Record{Occ: &occs[i], an: an, full: f}
		res.own[i] = res.recordFindings(i, f)
	})
	for _, own := range res.own {
		res.diags = append(res.diags, own...)
	}
	res.sortDiagnostics()
	return res
}

// notationOnly drops the query patterns of occs, in place.
func notationOnly(occs []find.Occurrence) []find.Occurrence {
	n := 0
	for i := range occs {
		if occs[i].Dialect != find.DialectSMARTS {
			occs[n] = occs[i]
			n++
		}
	}
	return occs[:n]
}
