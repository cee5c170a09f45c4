// Package tempfiles keeps a registry of the temporary files the program is
// writing, so that an interrupted run (SIGINT, SIGTERM) removes them before
// it exits instead of leaving ".name.*.tmp" files behind.
package tempfiles

import (
	"os"
	"os/signal"
	"sync"
	"syscall"
)

var (
	mu   sync.Mutex
	live = map[string]struct{}{}

	// The signal handler: exit is set by HandleSignals; the handler starts
	// listening when the first file is tracked (sigs not nil), so that a
	// run that writes no file never sets one up (it costs a thread).
	exit func(int)
	sigs chan os.Signal
	done chan struct{}
)

// Track records name as a live temporary file. Call it before the file is
// created, so that no moment exists in which the file is on disk but not
// known; call the returned function once the file is gone or renamed.
func Track(name string) (untrack func()) {
	mu.Lock()
	live[name] = struct{}{}
	if exit != nil && sigs == nil {
		listenLocked()
	}
	mu.Unlock()
	return func() {
		mu.Lock()
		delete(live, name)
		mu.Unlock()
	}
}

// Live returns the names currently tracked.
func Live() []string {
	mu.Lock()
	defer mu.Unlock()
	names := make([]string, 0, len(live))
	for n := range live {
		names = append(names, n)
	}
	return names
}

// RemoveAll removes every tracked file and forgets it. It keeps the
// registry locked while it works, so that no new file is tracked halfway.
func RemoveAll() {
	mu.Lock()
	defer mu.Unlock()
	removeLocked()
}

func removeLocked() {
	for n := range live {
		os.Remove(n)
		delete(live, n)
	}
}

// ExitCode is the conventional exit status of a program ended by sig:
// 128 plus the signal number (130 for SIGINT, 143 for SIGTERM).
func ExitCode(sig os.Signal) int {
	if s, ok := sig.(syscall.Signal); ok {
		return 128 + int(s)
	}
	return 1
}

// HandleSignals installs a handler for SIGINT and SIGTERM that removes the
// tracked files and ends the program with ExitCode. exit is os.Exit in the
// program; stop removes the handler. The handler listens only from the
// first tracked file on: until then the signals keep their default action.
func HandleSignals(exitFunc func(int)) (stop func()) {
	mu.Lock()
	exit = exitFunc
	if len(live) > 0 {
		listenLocked()
	}
	mu.Unlock()
	return func() {
		mu.Lock()
		defer mu.Unlock()
		exit = nil
		if sigs != nil {
			signal.Stop(sigs)
			close(done)
			sigs, done = nil, nil
		}
	}
}

// listenLocked starts listening for the signals; mu is held.
func listenLocked() {
	ch, stopped, exitFunc := make(chan os.Signal, 1), make(chan struct{}), exit
	sigs, done = ch, stopped
	signal.Notify(ch, os.Interrupt, syscall.SIGTERM)
	go func() {
		select {
		case sig := <-ch:
			// The lock stays held until the program ends: a write in
			// progress cannot rename its file into place afterwards.
			mu.Lock()
			removeLocked()
			exitFunc(ExitCode(sig))
			mu.Unlock()
		case <-stopped:
		}
	}()
}
