package main

import (
	"flag"
	"fmt"

	"stereoline/stereo"
	"stereoline/stereo/document"
)

// limitFlags are the command-line options that bound the work spent on
// one record: --record-time, --digraph-nodes and --record-atoms. Left out, an option
// takes its value from the configuration.
type limitFlags struct {
	recordTime   string
	digraphNodes int
	recordAtoms  int
}

// add defines the options on fs.
func (f *limitFlags) add(fs *flag.FlagSet) {
	fs.StringVar(&f.recordTime, "record-time", "", fmt.Sprintf("time one record may take (`duration` such as 1s or 500ms, or off); default %v", stereo.DefaultBudget))
	fs.IntVar(&f.recordAtoms, "record-atoms", 0, fmt.Sprintf("most atoms a record may have and still be read (`atoms`, 1 to %d); default %d", document.MaxRecordAtoms, document.DefaultRecordAtoms))
	fs.IntVar(&f.digraphNodes, "digraph-nodes", 0, fmt.Sprintf("largest CIP digraph grown for one stereocentre (`nodes`, 1 to %d); default %d", document.MaxDigraphNodes, stereo.DefaultNodeCap))
}

// config returns the limits the options give, on top of base: an option
// left out keeps base's value. err names a bad value.
func (f *limitFlags) config(base document.LimitsConfig) (document.LimitsConfig, error) {
	out := base
	if f.recordTime != "" {
		if _, ok := document.ParseRecordTime(f.recordTime); !ok {
			return out, fmt.Errorf("--record-time: expected a positive duration such as 1s or 500ms, or off, found %q", f.recordTime)
		}
		out.RecordTime = f.recordTime
	}
	if f.digraphNodes != 0 {
		if f.digraphNodes < 0 || f.digraphNodes > document.MaxDigraphNodes {
			return out, fmt.Errorf("--digraph-nodes: expected a number from 1 to %d, found %d", document.MaxDigraphNodes, f.digraphNodes)
		}
		out.DigraphNodes = f.digraphNodes
	}
	if f.recordAtoms != 0 {
		if f.recordAtoms < 0 || f.recordAtoms > document.MaxRecordAtoms {
			return out, fmt.Errorf("--record-atoms: expected a number from 1 to %d, found %d", document.MaxRecordAtoms, f.recordAtoms)
		}
		out.RecordAtoms = f.recordAtoms
	}
	return out, nil
}
