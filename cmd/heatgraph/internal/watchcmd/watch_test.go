package watchcmd

import (
	"bufio"
	"context"
	"io"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func model(title string) string {
	return `title: ` + title + `
ambient: {temperature: 25 degC}
nodes:
  - {id: chip, power: 2 W, limit: 90 degC}
links:
  - {id: skin, kind: lumped, from: chip, to: ambient, resistance: 10 K/W}
`
}

func get(t *testing.T, url string) (int, string) {
	t.Helper()
	resp, err := http.Get(url)
	require.NoError(t, err)
	defer resp.Body.Close()
	body, err := io.ReadAll(resp.Body)
	require.NoError(t, err)
	return resp.StatusCode, string(body)
}

// nextMessage reads the event stream up to the next "data:" line.
func nextMessage(t *testing.T, r *bufio.Reader) string {
	t.Helper()
	for {
		line, err := r.ReadString('\n')
		require.NoError(t, err)
		if strings.HasPrefix(line, "data:") {
			return strings.TrimSpace(strings.TrimPrefix(line, "data:"))
		}
	}
}

func TestLiveViewFollowsTheModel(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "box.yaml")
	require.NoError(t, os.WriteFile(path, []byte(model("first draft")), 0o644))
	s := NewServer(path)
	ts := httptest.NewServer(s.Handler())
	defer ts.Close()
	defer s.Close()

	code, page := get(t, ts.URL+"/")
	assert.Equal(t, http.StatusOK, code)
	assert.Contains(t, page, "first draft")
	assert.Contains(t, page, `new EventSource("events")`, "the live page listens for changes")
	code, _ = get(t, ts.URL+"/box.yaml")
	assert.Equal(t, http.StatusNotFound, code, "nothing but the report and its events is served")
	code, _ = get(t, ts.URL+"/../box.yaml")
	assert.Equal(t, http.StatusNotFound, code)

	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	started := make(chan struct{})
	watched := make(chan error, 1)
	go func() { watched <- s.Watch(ctx, started) }()
	<-started

	resp, err := http.Get(ts.URL + "/events")
	require.NoError(t, err)
	defer resp.Body.Close()
	assert.Equal(t, "text/event-stream", resp.Header.Get("Content-Type"))
	events := bufio.NewReader(resp.Body)
	line, err := events.ReadString('\n')
	require.NoError(t, err)
	assert.Equal(t, ": connected\n", line, "a comment first: the page reloads on messages only")

	// Saved in place.
	require.NoError(t, os.WriteFile(path, []byte(model("second draft")), 0o644))
	assert.Equal(t, "changed", nextMessage(t, events))
	_, page = get(t, ts.URL+"/")
	assert.Contains(t, page, "second draft")

	// Saved by renaming a new file into place, with an error at line 4.
	tmp := filepath.Join(dir, ".box.yaml.tmp")
	require.NoError(t, os.WriteFile(tmp, []byte(strings.Replace(model("broken"), "power: 2 W", "power: 2 K", 1)), 0o644))
	require.NoError(t, os.Rename(tmp, path))
	assert.Equal(t, "changed", nextMessage(t, events))
	_, page = get(t, ts.URL+"/")
	assert.Contains(t, page, "The model has problems")
	assert.Contains(t, page, "box.yaml:4:")

	cancel()
	require.NoError(t, <-watched)
}

// Run serves on 127.0.0.1 by default and stops cleanly when its context
// ends (as on Ctrl-C).
func TestRunServesAndStops(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "box.yaml")
	require.NoError(t, os.WriteFile(path, []byte(model("served")), 0o644))
	ios, _, _, errOut := iostreams.Test()
	ctx, cancel := context.WithCancel(context.Background())
	addrs := make(chan string, 1)
	done := make(chan error, 1)
	go func() {
		done <- Run(&Options{IO: ios, Model: path, Listen: "127.0.0.1:0", Ctx: ctx, Ready: func(a string) { addrs <- a }})
	}()
	addr := <-addrs
	assert.True(t, strings.HasPrefix(addr, "127.0.0.1:"))
	_, page := get(t, "http://"+addr+"/")
	assert.Contains(t, page, "served")
	cancel()
	require.NoError(t, <-done)
	assert.Contains(t, errOut.String(), "stopped")

	cmd := NewCmd(ios, func(o *Options) error {
		assert.Equal(t, DefaultListen, o.Listen)
		assert.True(t, strings.HasPrefix(DefaultListen, "127.0.0.1:"))
		return nil
	})
	cmd.SetArgs([]string{path})
	require.NoError(t, cmd.Execute())
}
