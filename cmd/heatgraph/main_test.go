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
