//go:build !linux

package main

import (
	"errors"
	"os"
)

// canMap reports whether large files are mapped rather than read: only
// on Linux, where the mapping's behaviour was measured.
const canMap = false

func mapFile(*os.File, int64) ([]byte, error) { return nil, errors.ErrUnsupported }
func dropPages([]byte)                        {}
func unmapFile([]byte)                        {}
