//go:build unix

package main

import (
	"bufio"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The test binary doubles as the program: started with
// HEATGRAPH_TEST_AS_MAIN=1 it runs main with its own arguments, so that
// tests can run heatgraph as a separate process (signals, exit codes,
// start-up) without building it first.
func TestMain(m *testing.M) {
	if os.Getenv("HEATGRAPH_TEST_AS_MAIN") == "1" {
		if os.Getenv("HEATGRAPH_TEST_BLOCK_WRITE") == "1" {
			// Stop in the middle of writing the output, announce it, and
			// wait to be killed.
			pipeline.TestHookWriting = func(tmp string) {
				fmt.Fprintln(os.Stderr, "writing", tmp)
				time.Sleep(time.Hour)
			}
		}
		main()
		return
	}
	os.Exit(m.Run())
}

// program returns a command that runs heatgraph with args as a process.
func program(t *testing.T, env []string, args ...string) *exec.Cmd {
	t.Helper()
	cmd := exec.Command(os.Args[0], args...)
	cmd.Env = append(append(os.Environ(), "HEATGRAPH_TEST_AS_MAIN=1"), env...)
	return cmd
}

func exitCode(err error) int {
	var ee *exec.ExitError
	if errors.As(err, &ee) {
		return ee.ExitCode()
	}
	if err != nil {
		return -1
	}
	return 0
}

// A run interrupted while it writes its output removes the temporary file
// and exits with the conventional code of the signal.
func TestSignalRemovesTemporary(t *testing.T) {
	for _, sig := range []syscall.Signal{syscall.SIGTERM, syscall.SIGINT} {
		dir := t.TempDir()
		cmd := program(t, []string{"HEATGRAPH_TEST_BLOCK_WRITE=1"},
			"solve", "../../examples/bench-logger.yaml", "-o", filepath.Join(dir, "report.txt"))
		stderr, err := cmd.StderrPipe()
		require.NoError(t, err)
		require.NoError(t, cmd.Start())
		line, err := bufio.NewReader(stderr).ReadString('\n')
		require.NoError(t, err)
		require.True(t, strings.HasPrefix(line, "writing "), line)
		tmp := strings.TrimSpace(strings.TrimPrefix(line, "writing "))
		require.FileExists(t, tmp)
		require.NoError(t, cmd.Process.Signal(sig))
		err = cmd.Wait()
		assert.Equal(t, 128+int(sig), exitCode(err), "%v: %v", sig, err)
		entries, _ := os.ReadDir(dir)
		assert.Empty(t, entries, "%v: nothing may be left behind", sig)
	}
}

// entries lists what a folder holds, recursively.
func entries(t *testing.T, dir string) []string {
	t.Helper()
	var names []string
	require.NoError(t, filepath.WalkDir(dir, func(path string, d os.DirEntry, err error) error {
		if err == nil && path != dir {
			names = append(names, path)
		}
		return err
	}))
	return names
}

// check and solve must not start the diagram engine: it compiles code and
// keeps a cache, which costs time and memory and fails in folders of other
// users. Nothing may appear in the temporary or cache folders.
func TestNonDrawingCommandsLeaveCachesAlone(t *testing.T) {
	tmp, home, cache := t.TempDir(), t.TempDir(), t.TempDir()
	for _, d := range []string{tmp, home, cache} {
		require.NoError(t, os.Chmod(d, 0o500))
		defer os.Chmod(d, 0o700)
	}
	env := []string{"TMPDIR=" + tmp, "HOME=" + home, "XDG_CACHE_HOME=" + cache}
	for _, args := range [][]string{
		{"check", "../../examples/bench-logger.yaml"},
		{"solve", "../../examples/bench-logger.yaml"},
		{"solve", "../../examples/bench-logger.yaml", "-f", "json"},
	} {
		out, err := program(t, env, args...).CombinedOutput()
		assert.Equal(t, 0, exitCode(err), "%v: %s", args, out)
		assert.NotContains(t, string(out), "panic")
	}
	assert.Empty(t, entries(t, tmp), "the temporary folder was used")
	assert.Empty(t, entries(t, home), "the home folder was used")
	assert.Empty(t, entries(t, cache), "the cache folder was used")
}

// The diagram engine caches compiled code only in a private folder of the
// user's cache; without one it compiles in memory. It never uses the
// shared temporary folder.
func TestGraphCacheFolder(t *testing.T) {
	tmp, cache := t.TempDir(), t.TempDir()
	out := filepath.Join(t.TempDir(), "g.svg")
	env := []string{"TMPDIR=" + tmp, "XDG_CACHE_HOME=" + cache}
	msg, err := program(t, env, "graph", "../../examples/bench-logger.yaml", "-o", out).CombinedOutput()
	require.Equal(t, 0, exitCode(err), "%s", msg)
	assert.FileExists(t, out)
	fi, err := os.Stat(filepath.Join(cache, "heatgraph", "layout"))
	require.NoError(t, err)
	assert.Equal(t, os.FileMode(0o700), fi.Mode().Perm())
	assert.Empty(t, entries(t, tmp))

	// No usable cache folder at all: HOME and XDG_CACHE_HOME name files.
	file := filepath.Join(t.TempDir(), "not-a-folder")
	require.NoError(t, os.WriteFile(file, nil, 0o600))
	env = []string{"TMPDIR=" + tmp, "HOME=" + file, "XDG_CACHE_HOME=" + file}
	msg, err = program(t, env, "graph", "../../examples/bench-logger.yaml", "-o", out).CombinedOutput()
	require.Equal(t, 0, exitCode(err), "%s", msg)
	assert.Empty(t, entries(t, tmp))
}
