//go:build !unix

package benchcmd

import "os"

// peakRSS returns −1: this system's process state does not give the peak
// resident set.
func peakRSS(*os.ProcessState) int64 { return -1 }
