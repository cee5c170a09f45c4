//go:build unix

package tempfiles

import (
	"os"
	"path/filepath"
	"syscall"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestRemoveAll(t *testing.T) {
	dir := t.TempDir()
	a, b := filepath.Join(dir, ".a.1.tmp"), filepath.Join(dir, ".b.2.tmp")
	for _, n := range []string{a, b} {
		require.NoError(t, os.WriteFile(n, nil, 0o600))
	}
	Track(a)
	untrack := Track(b)
	untrack()
	assert.Equal(t, []string{a}, Live())
	RemoveAll()
	assert.NoFileExists(t, a)
	assert.FileExists(t, b, "an untracked file is not removed")
	assert.Empty(t, Live())
}

func TestExitCode(t *testing.T) {
	assert.Equal(t, 130, ExitCode(syscall.SIGINT))
	assert.Equal(t, 143, ExitCode(syscall.SIGTERM))
}

// A real signal to this process reaches the handler, which removes the
// tracked files and exits with 128 + the signal number.
func TestHandleSignals(t *testing.T) {
	for _, sig := range []syscall.Signal{syscall.SIGTERM, syscall.SIGINT} {
		dir := t.TempDir()
		name := filepath.Join(dir, ".out.svg.0.tmp")
		require.NoError(t, os.WriteFile(name, nil, 0o600))
		untrack := Track(name)
		codes := make(chan int, 1)
		stop := HandleSignals(func(c int) { codes <- c })
		require.NoError(t, syscall.Kill(os.Getpid(), sig))
		assert.Equal(t, 128+int(sig), <-codes)
		stop()
		untrack()
		assert.NoFileExists(t, name)
	}
}

// A run that writes no file sets up no signal handling: listening costs a
// thread, which matters under tight memory limits.
func TestListensOnlyWhileWriting(t *testing.T) {
	RemoveAll()
	stop := HandleSignals(func(int) {})
	mu.Lock()
	assert.Nil(t, sigs)
	mu.Unlock()
	untrack := Track(filepath.Join(t.TempDir(), ".x.tmp"))
	mu.Lock()
	assert.NotNil(t, sigs)
	mu.Unlock()
	untrack()
	stop()
	mu.Lock()
	assert.Nil(t, sigs)
	mu.Unlock()
}
