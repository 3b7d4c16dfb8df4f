// Package readings holds no code of its own: its tests compare how
// Stereoline reads stereo marks with how general-purpose libraries read
// them, over the survey in testdata/survey (RDKit 2022.09.3 from Debian's
// python3-rdkit, the npm package @rdkit/rdkit and Open Babel, each reading
// thousands of writings of the same structures).
//
// The survey names the constructs on which readers part (a lone-pair
// centre written first, a lone-pair centre carrying ring-closure digits,
// the same direction mark on both digits of a ring closure, '@' on an
// allene, ring digits written after a branch) and, for each, which
// reading every library uses. The reader setting (notation.Reading)
// chooses the reading of the open ones. The tests hold a table over
// (construct, library, setting) saying whether Stereoline's reading equals
// the library's, check every writing of the survey against it, check that
// each setting reads as the libraries it is named for, check the portable
// rewrites against the libraries' reading of them (testdata/survey/
// portable.tsv), and check that labels never change across the writings
// RDKit made of the stereo fixtures under the default setting.
package readings
