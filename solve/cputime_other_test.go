//go:build !unix

package solve

import "time"

func cpuTime() time.Duration { return 0 }
func peakMB() float64        { return 0 }
