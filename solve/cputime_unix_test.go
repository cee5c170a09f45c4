//go:build unix

package solve

import (
	"syscall"
	"time"
)

// cpuTime returns the processor time used by this process so far, the
// steadier measure on a shared machine.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// peakMB returns the largest resident set of this process so far, in MB
// (getrusage's ru_maxrss, kilobytes on Linux): the peak of one benchmark
// when it runs alone in its process.
func peakMB() float64 {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return float64(ru.Maxrss) / 1024
}
