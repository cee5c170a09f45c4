package engine

import (
	"context"
	"errors"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestRender(t *testing.T) {
	svg, err := Render(context.Background(), `digraph g { a -> b [label="1 W"] }`, SVG)
	require.NoError(t, err)
	assert.Contains(t, string(svg), "<svg")
	assert.Contains(t, string(svg), "1 W")
	xdot, err := Render(context.Background(), `digraph g { a -> b }`, XDOT)
	require.NoError(t, err)
	assert.Contains(t, string(xdot), "_draw_")
	assert.Contains(t, string(xdot), "bb=")
}

func TestRenderErrors(t *testing.T) {
	_, err := Render(context.Background(), `digraph g { a -> `, SVG)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "reading the diagram")
	_, err = Render(context.Background(), `digraph g { a -> b }`, "no-such-format")
	require.Error(t, err)

	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	_, err = Render(ctx, `digraph g { a -> b }`, SVG)
	assert.True(t, errors.Is(err, ErrLayoutTimeout), "%v", err)
	// The engine still works after a stopped layout.
	_, err = Render(context.Background(), `digraph g { a -> b }`, SVG)
	assert.NoError(t, err)
}

// A layout stopped in the middle by its context ends with ErrLayoutTimeout.
func TestRenderStopsMidway(t *testing.T) {
	var b strings.Builder
	b.WriteString("digraph g {\n")
	for i := range 400 {
		b.WriteString("n" + itoa(i) + " -> n" + itoa((i*7+3)%400) + ";\n")
		b.WriteString("n" + itoa(i) + " -> n" + itoa((i*13+5)%400) + ";\n")
	}
	b.WriteString("}\n")
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan error)
	go func() {
		_, err := Render(ctx, b.String(), SVG)
		done <- err
	}()
	cancel()
	err := <-done
	assert.True(t, errors.Is(err, ErrLayoutTimeout), "%v", err)
}

func itoa(i int) string {
	const digits = "0123456789"
	if i < 10 {
		return digits[i : i+1]
	}
	return itoa(i/10) + digits[i%10:i%10+1]
}

func TestCacheFolderChecks(t *testing.T) {
	if runtime.GOOS == "windows" {
		t.Skip("folder modes and owners are checked on unix systems")
	}
	dir := t.TempDir()
	private := filepath.Join(dir, "private")
	require.NoError(t, os.Mkdir(private, 0o700))
	assert.NoError(t, safeDir(private))

	open := filepath.Join(dir, "open")
	require.NoError(t, os.Mkdir(open, 0o700))
	require.NoError(t, os.Chmod(open, 0o777))
	assert.ErrorIs(t, safeDir(open), errUnsafe)

	link := filepath.Join(dir, "link")
	require.NoError(t, os.Symlink(private, link))
	assert.ErrorIs(t, safeDir(link), errUnsafe)

	if os.Geteuid() == 0 {
		foreign := filepath.Join(dir, "foreign")
		require.NoError(t, os.Mkdir(foreign, 0o700))
		require.NoError(t, os.Chown(foreign, 65534, 65534))
		assert.ErrorIs(t, safeDir(foreign), errUnsafe, "a folder of another user")
	}
}

// The cache goes under the user's cache folder, and a cache folder that is
// not private is not used.
func TestCacheLocation(t *testing.T) {
	if runtime.GOOS != "linux" {
		t.Skip("XDG_CACHE_HOME is the cache folder on Linux")
	}
	base := t.TempDir()
	t.Setenv("XDG_CACHE_HOME", base)
	dir, cache := Cache()
	require.NotNil(t, cache)
	assert.Equal(t, filepath.Join(base, "heatgraph", "layout"), dir)

	require.NoError(t, os.Chmod(filepath.Join(base, "heatgraph"), 0o777))
	dir, cache = Cache()
	assert.Empty(t, dir)
	assert.Nil(t, cache)
}
