// Package review says what each edited record of a document now means
// compared with an earlier version of the same document: a re-writing of
// the same compound, its mirror image, an epimer, a flipped double bond,
// marks given or lost, another compound, or a record that no longer
// reads. It pairs the records of the two versions by the identity the
// host gives them (the title of a list line, an ID column of a table,
// the key of a JSON object, the name a literal is bound to), else by
// content and position (pair.go), reads only the records whose text
// changed, and classifies each pair on the identity keys of
// stereo/identity and the CIP labels of stereo (classify.go), with the
// findings the change introduces or removes (findings.go).
//
// Reading the earlier version of a file from git is here too (git.go),
// shared by the diff command and the language server's change lens.
// Like the engine below it, the package returns values in host byte
// offsets; printing and protocols are its callers' business.
package review
