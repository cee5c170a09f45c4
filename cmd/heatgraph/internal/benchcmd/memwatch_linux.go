package benchcmd

import (
	"os"
	"strconv"
	"strings"
	"time"
)

// residentBytes returns the resident set of a running process, bytes,
// from /proc/PID/statm (its second field, in pages; proc(5)); −1 when it
// cannot be read.
func residentBytes(pid int) int64 {
	data, err := os.ReadFile("/proc/" + strconv.Itoa(pid) + "/statm")
	if err != nil {
		return -1
	}
	f := strings.Fields(string(data))
	if len(f) < 2 {
		return -1
	}
	pages, err := strconv.ParseInt(f[1], 10, 64)
	if err != nil {
		return -1
	}
	return pages * int64(os.Getpagesize())
}

// watchMemory calls over once the process pid holds more than limit bytes
// resident, looking every interval until done is closed.
func watchMemory(pid int, limit int64, interval time.Duration, done <-chan struct{}, over func()) {
	t := time.NewTicker(interval)
	defer t.Stop()
	for {
		select {
		case <-done:
			return
		case <-t.C:
			if residentBytes(pid) > limit {
				over()
				return
			}
		}
	}
}

// CanWatchMemory tells whether this system lets the bench watch a solve's
// memory while it runs.
const CanWatchMemory = true
