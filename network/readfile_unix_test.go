//go:build unix

package network

import (
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

// A pipe has no size to check: it is read up to the limit and no further,
// however much its writer has to give.
func TestReadLimitedStopsAtTheLimit(t *testing.T) {
	path := filepath.Join(t.TempDir(), "pipe.yaml")
	if err := syscall.Mkfifo(path, 0o600); err != nil {
		t.Skipf("no FIFO: %v", err)
	}
	go func() {
		w, err := os.OpenFile(path, os.O_WRONLY, 0)
		if err != nil {
			return
		}
		defer w.Close()
		chunk := make([]byte, 4096)
		for i := range chunk {
			chunk[i] = '#'
		}
		for {
			if _, err := w.Write(chunk); err != nil {
				return // the reader stopped and closed its end
			}
		}
	}()
	data, msg := readLimited(path, 10<<20)
	if data != nil || !strings.Contains(msg, "larger than the 10 MiB limit") {
		t.Errorf("got %d bytes and %q", len(data), msg)
	}
}
