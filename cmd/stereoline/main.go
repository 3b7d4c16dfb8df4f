// Command stereoline checks and explains the stereo marks in line
// notation found in files.
package main

import (
	"fmt"
	"os"
)

func main() {
	fmt.Fprintln(os.Stderr, "stereoline: not yet implemented")
	os.Exit(2)
}
