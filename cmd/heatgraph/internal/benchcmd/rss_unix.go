//go:build unix

package benchcmd

import (
	"os"
	"runtime"
	"syscall"
)

// peakRSS returns the peak resident set of an ended process, bytes: its
// rusage's ru_maxrss, which Linux and the BSDs give in kilobytes (1024
// bytes) and macOS in bytes (getrusage(2)). −1 when it is not known.
func peakRSS(ps *os.ProcessState) int64 {
	ru, ok := ps.SysUsage().(*syscall.Rusage)
	if !ok || ru == nil {
		return -1
	}
	if runtime.GOOS == "darwin" || runtime.GOOS == "ios" {
		return int64(ru.Maxrss)
	}
	return int64(ru.Maxrss) * 1024
}
