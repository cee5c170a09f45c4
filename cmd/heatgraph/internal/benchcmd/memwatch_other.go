//go:build !linux

package benchcmd

import "time"

// residentBytes returns −1: only Linux is watched.
func residentBytes(int) int64 { return -1 }

// watchMemory does nothing: only Linux is watched.
func watchMemory(int, int64, time.Duration, <-chan struct{}, func()) {}

const CanWatchMemory = false
