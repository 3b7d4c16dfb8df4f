package main

import (
	"flag"
	"fmt"

	"stereoline/notation"
	"stereoline/stereo/document"
)

// readingFlags are the command-line options that choose how the marks
// general-purpose readers read differently are read (notation.Reading):
// --lone-pair and --ring-marks. Left out, an option takes its value from
// the configuration (check) or the default (the other commands).
type readingFlags struct {
	lonePair, ringMarks string
}

// add defines the options on fs.
func (f *readingFlags) add(fs *flag.FlagSet) {
	fs.StringVar(&f.lonePair, "lone-pair", "", fmt.Sprintf("where the lone pair of a stereocentre without hydrogen stands: %s (the default; RDKit) or %s (Open Babel)",
		notation.LonePairLast, notation.LonePairHydrogenSlot))
	fs.StringVar(&f.ringMarks, "ring-marks", "", fmt.Sprintf("the same direction mark on both digits of a ring closure: %s (the closing digit's decides, the default; RDKit) or %s (Open Babel)",
		notation.RingMarksClosing, notation.RingMarksDropped))
}

// config returns the reading setting the options give, on top of base:
// an option left out keeps base's value. err names a bad value.
func (f *readingFlags) config(base document.ReadingConfig) (document.ReadingConfig, error) {
	out := base
	if f.lonePair != "" {
		if _, ok := notation.ParseLonePairRule(f.lonePair); !ok {
			return out, fmt.Errorf("--lone-pair: expected %s or %s, found %q", notation.LonePairLast, notation.LonePairHydrogenSlot, f.lonePair)
		}
		out.LonePair = f.lonePair
	}
	if f.ringMarks != "" {
		if _, ok := notation.ParseRingMarkRule(f.ringMarks); !ok {
			return out, fmt.Errorf("--ring-marks: expected %s or %s, found %q", notation.RingMarksClosing, notation.RingMarksDropped, f.ringMarks)
		}
		out.RingMarks = f.ringMarks
	}
	return out, nil
}

// reading returns the reading the options give on top of the default.
func (f *readingFlags) reading() (notation.Reading, error) {
	rc, err := f.config(document.ReadingConfig{})
	if err != nil {
		return notation.Reading{}, err
	}
	cfg := document.Config{Reading: rc}
	return cfg.NotationReading(), nil
}

// set reports whether any option was given.
func (f *readingFlags) set() bool { return f.lonePair != "" || f.ringMarks != "" }
