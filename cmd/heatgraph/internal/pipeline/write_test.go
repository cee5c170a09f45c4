//go:build unix

package pipeline

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func code(err error) int {
	var ee *exit.Error
	if errors.As(err, &ee) {
		return ee.Code
	}
	return -1
}

// noTemporaries fails when a ".*.tmp" file is left in dir.
func noTemporaries(t *testing.T, dir string) {
	t.Helper()
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	for _, e := range entries {
		assert.False(t, strings.HasSuffix(e.Name(), ".tmp"), "temporary file left behind: %s", e.Name())
	}
}

func TestWriteFileRefusesInputs(t *testing.T) {
	dir := t.TempDir()
	model := filepath.Join(dir, "m.yaml")
	const text = "ambient: {temperature: 20 degC}\n"
	require.NoError(t, os.WriteFile(model, []byte(text), 0o644))
	require.NoError(t, os.Link(model, filepath.Join(dir, "hard.yaml")))
	require.NoError(t, os.Symlink("m.yaml", filepath.Join(dir, "soft.yaml")))
	require.NoError(t, os.Mkdir(filepath.Join(dir, "sub"), 0o755))
	for _, out := range []string{
		model,
		filepath.Join(dir, ".", "sub", "..", "m.yaml"),
		filepath.Join(dir, "hard.yaml"),
		filepath.Join(dir, "soft.yaml"),
	} {
		err := WriteFile(out, []byte("report"), model)
		require.Error(t, err, out)
		assert.Equal(t, exit.BadInput, code(err), out)
		assert.Contains(t, err.Error(), "refusing to write over the input file")
		data, _ := os.ReadFile(model)
		assert.Equal(t, text, string(data), "the model must survive -o %s", out)
	}
	// The same spelling the other way round: the input given through a link.
	err := WriteFile(model, []byte("report"), filepath.Join(dir, "soft.yaml"))
	assert.Equal(t, exit.BadInput, code(err))
	noTemporaries(t, dir)
	// Another file is fine.
	require.NoError(t, WriteFile(filepath.Join(dir, "r.txt"), []byte("report"), model))
}

func TestWriteFileDevice(t *testing.T) {
	fi, err := os.Stat(os.DevNull)
	if err != nil || fi.Mode()&os.ModeCharDevice == 0 {
		t.Skip("no character device at", os.DevNull)
	}
	// Writing to /dev/null needs no folder access, so that a failed
	// temporary file could not be the reason the test passes; the device
	// must remain a device.
	require.NoError(t, WriteFile(os.DevNull, []byte("report")))
	fi, err = os.Stat(os.DevNull)
	require.NoError(t, err)
	assert.NotZero(t, fi.Mode()&os.ModeCharDevice, "%s is no longer a device", os.DevNull)

	// A named pipe is written directly too.
	dir := t.TempDir()
	fifo := filepath.Join(dir, "pipe")
	require.NoError(t, syscall.Mkfifo(fifo, 0o600))
	got := make(chan string)
	go func() {
		data, _ := os.ReadFile(fifo)
		got <- string(data)
	}()
	require.NoError(t, WriteFile(fifo, []byte("through the pipe")))
	assert.Equal(t, "through the pipe", <-got)
	fi, err = os.Lstat(fifo)
	require.NoError(t, err)
	assert.NotZero(t, fi.Mode()&os.ModeNamedPipe)
	noTemporaries(t, dir)
}

func TestWriteFileThroughSymlink(t *testing.T) {
	linkDir, targetDir := t.TempDir(), t.TempDir()
	target := filepath.Join(targetDir, "real.svg")
	require.NoError(t, os.WriteFile(target, []byte("old"), 0o644))
	link := filepath.Join(linkDir, "latest.svg")
	require.NoError(t, os.Symlink(target, link))
	require.NoError(t, WriteFile(link, []byte("new")))
	fi, err := os.Lstat(link)
	require.NoError(t, err)
	assert.NotZero(t, fi.Mode()&os.ModeSymlink, "the link must stay a link")
	data, err := os.ReadFile(target)
	require.NoError(t, err)
	assert.Equal(t, "new", string(data))

	// A dangling link: its target is created.
	fresh := filepath.Join(targetDir, "fresh.svg")
	dangling := filepath.Join(linkDir, "dangling.svg")
	require.NoError(t, os.Symlink("../"+filepath.Base(targetDir)+"/fresh.svg", dangling))
	require.NoError(t, WriteFile(dangling, []byte("created")))
	data, err = os.ReadFile(fresh)
	require.NoError(t, err)
	assert.Equal(t, "created", string(data))
	fi, err = os.Lstat(dangling)
	require.NoError(t, err)
	assert.NotZero(t, fi.Mode()&os.ModeSymlink)
	noTemporaries(t, linkDir)
	noTemporaries(t, targetDir)
}

func TestWriteFileKeepsMode(t *testing.T) {
	old := syscall.Umask(0o022)
	defer syscall.Umask(old)
	dir := t.TempDir()
	private := filepath.Join(dir, "private.txt")
	require.NoError(t, os.WriteFile(private, []byte("old"), 0o600))
	require.NoError(t, os.Chmod(private, 0o600))
	require.NoError(t, WriteFile(private, []byte("new")))
	fi, err := os.Stat(private)
	require.NoError(t, err)
	assert.Equal(t, os.FileMode(0o600), fi.Mode().Perm())

	// A mode the umask would cut down is kept exactly as well.
	shared := filepath.Join(dir, "shared.txt")
	require.NoError(t, os.WriteFile(shared, []byte("old"), 0o600))
	require.NoError(t, os.Chmod(shared, 0o664))
	require.NoError(t, WriteFile(shared, []byte("new")))
	fi, err = os.Stat(shared)
	require.NoError(t, err)
	assert.Equal(t, os.FileMode(0o664), fi.Mode().Perm())

	fresh := filepath.Join(dir, "fresh.txt")
	require.NoError(t, WriteFile(fresh, []byte("new")))
	fi, err = os.Stat(fresh)
	require.NoError(t, err)
	assert.Equal(t, os.FileMode(0o644), fi.Mode().Perm())
	syscall.Umask(0o077)
	fresh2 := filepath.Join(dir, "fresh2.txt")
	require.NoError(t, WriteFile(fresh2, []byte("new")))
	fi, err = os.Stat(fresh2)
	require.NoError(t, err)
	assert.Equal(t, os.FileMode(0o600), fi.Mode().Perm(), "new files follow the umask")
	noTemporaries(t, dir)
}

func TestWriteFileFailures(t *testing.T) {
	dir := t.TempDir()
	err := WriteFile(filepath.Join(dir, "missing", "r.txt"), []byte("x"))
	assert.Equal(t, exit.OutputFailed, code(err))
	err = WriteFile(dir, []byte("x"))
	assert.Equal(t, exit.OutputFailed, code(err))
	assert.Contains(t, err.Error(), "folder")
	noTemporaries(t, dir)
}

// The temporary file is registered while it exists and unregistered
// afterwards.
func TestWriteFileTracksTemporary(t *testing.T) {
	dir := t.TempDir()
	var seen string
	var existed bool
	TestHookWriting = func(tmp string) {
		seen = tmp
		_, err := os.Stat(tmp)
		existed = err == nil
	}
	defer func() { TestHookWriting = nil }()
	require.NoError(t, WriteFile(filepath.Join(dir, "r.txt"), []byte("x")))
	assert.True(t, existed)
	assert.Regexp(t, `/\.r\.txt\.[0-9a-f]+\.tmp$`, seen)
	noTemporaries(t, dir)
}

// A stream that fails halfway leaves the old file as it was and no
// temporary file; one that succeeds replaces it.
func TestWriteStream(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "cells.csv")
	require.NoError(t, os.WriteFile(out, []byte("good\n"), 0o644))
	err := WriteStream(out, func(w io.Writer) error {
		if _, err := io.WriteString(w, "half a ro"); err != nil {
			return err
		}
		return errors.New("the writer stopped")
	})
	assert.Equal(t, exit.OutputFailed, code(err))
	assert.ErrorContains(t, err, "the writer stopped")
	data, rerr := os.ReadFile(out)
	require.NoError(t, rerr)
	assert.Equal(t, "good\n", string(data))
	noTemporaries(t, dir)

	require.NoError(t, WriteStream(out, func(w io.Writer) error {
		for i := range 3 {
			if _, err := fmt.Fprintf(w, "row %d\n", i); err != nil {
				return err
			}
		}
		return nil
	}))
	data, rerr = os.ReadFile(out)
	require.NoError(t, rerr)
	assert.Equal(t, "row 0\nrow 1\nrow 2\n", string(data))
	noTemporaries(t, dir)
}
