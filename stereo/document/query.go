package document

import (
	"fmt"
	"sort"
	"strings"

	"stereoline/notation"
	"stereoline/notation/find"
	"stereoline/notation/smarts"
)

// Query is one query pattern (SMARTS or reaction SMARTS) of a document,
// read by the SMARTS reader. Its findings are grammar errors only: a
// pattern describes a set of molecules, so the checks of notation do
// not apply to it.
type Query struct {
	Occ     *find.Occurrence
	Pattern *smarts.Pattern
	// Template says what a reaction template does to the configuration
	// of its mapped centres; nil for other patterns.
	Template []smarts.MappedCentre
}

// splitQueries moves the query patterns of occs into r.Queries and
// returns the rest.
func (r *Result) splitQueries(occs []find.Occurrence) []find.Occurrence {
	n := 0
	for i := range occs {
		if occs[i].Dialect == find.DialectSMARTS {
			n++
		}
	}
	if n == 0 {
		return occs
	}
	rest := make([]find.Occurrence, 0, len(occs)-n)
	qs := make([]find.Occurrence, 0, n)
	for _, o := range occs {
		if o.Dialect == find.DialectSMARTS {
			qs = append(qs, o)
		} else {
			rest = append(rest, o)
		}
	}
	r.Queries = make([]Query, len(qs))
	for i := range qs {
		p := smarts.Read(qs[i].Text)
		r.Queries[i] = Query{Occ: &qs[i], Pattern: p, Template: smarts.TemplateStereo(p)}
	}
	return rest
}

// queryDiagnostics maps the host problems and grammar errors of the query
// patterns to host offsets.
func (r *Result) queryDiagnostics() {
	for i := range r.Queries {
		q := &r.Queries[i]
		for _, e := range q.Occ.Diagnostics {
			r.add(Diagnostic{Span: e.Span, Code: e.Code, Severity: e.Severity, Message: e.Msg, Record: -1})
		}
		for _, e := range q.Pattern.Errors {
			r.add(Diagnostic{Span: q.Occ.HostSpan(e.Span), Code: e.Code, Severity: e.Severity, Message: e.Msg, Record: -1})
		}
	}
}

// queryAt returns the query pattern whose host span holds off, or nil.
func (r *Result) queryAt(off int) *Query {
	i := sort.Search(len(r.Queries), func(i int) bool { return r.Queries[i].Occ.Span.End >= off })
	for ; i < len(r.Queries); i++ {
		q := &r.Queries[i]
		if q.Occ.Span.Start > off {
			break
		}
		if off >= q.Occ.Span.Start && off <= q.Occ.Span.End {
			return q
		}
	}
	return nil
}

// queryHover explains a query pattern: that it is one, its atom at the
// cursor, and for a reaction template what it does to the configuration
// of its mapped centres.
func (q *Query) hover(off int) (string, notation.Span) {
	var b strings.Builder
	span := q.Occ.Span
	p := q.Pattern
	kind := "Query pattern (SMARTS)"
	if p.Reaction {
		kind = "Reaction query pattern (reaction SMARTS)"
	}
	fmt.Fprintf(&b, "**%s**", kind)
	if q.Occ.Title != "" {
		fmt.Fprintf(&b, " · %s", q.Occ.Title)
	}
	b.WriteString("\n\nA pattern describes a set of molecules; it is checked for its grammar only, not for stereo or valence.\n")
	if n, ok := q.Occ.NotationOffset(off); ok {
		for i := range p.Atoms {
			a := &p.Atoms[i]
			if n >= a.Span.Start && n < a.Span.End {
				span = q.Occ.HostSpan(a.Span)
				fmt.Fprintf(&b, "\nAtom %d `%s`", i+1, p.Text[a.Span.Start:a.Span.End])
				if a.Map != 0 {
					fmt.Fprintf(&b, ", map %d", a.Map)
				}
				if a.Role != notation.RoleNone {
					fmt.Fprintf(&b, ", %s", a.Role)
				}
				b.WriteString("\n")
			}
		}
	}
	if p.Reaction && len(p.Arrows) == 2 {
		if len(q.Template) == 0 {
			b.WriteString("\nThe template marks no mapped stereocentre: configurations are carried over as the matched molecule has them.\n")
		}
		for _, c := range q.Template {
			fmt.Fprintf(&b, "\n- map %d: the template **%s** its configuration", c.Map, c.Change)
			if c.Note != "" {
				fmt.Fprintf(&b, " (%s)", c.Note)
			}
		}
		if len(q.Template) > 0 {
			b.WriteString("\n")
		}
	}
	return b.String(), span
}
