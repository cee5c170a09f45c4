package engine

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"

	"github.com/tetratelabs/wazero"
)

// Cache returns the folder for compiled code and a compilation cache in
// it, or "" and nil when no safe folder can be had: compiled code is then
// kept in memory for the life of the process.
//
// The folder is <user cache dir>/heatgraph/layout (os.UserCacheDir:
// $XDG_CACHE_HOME or ~/.cache on Linux). The process's temporary folder is
// never used: it is shared between users, and code compiled by someone
// else must not be run. The folder must be a real directory (not a link),
// owned by the user and not writable by others (safeDir).
func Cache() (string, wazero.CompilationCache) {
	dir, err := cacheDir()
	if err != nil {
		return "", nil
	}
	cache, err := wazero.NewCompilationCacheWithDir(dir)
	if err != nil {
		return "", nil
	}
	return dir, cache
}

func cacheDir() (string, error) {
	base, err := os.UserCacheDir()
	if err != nil {
		return "", err
	}
	if !filepath.IsAbs(base) {
		return "", fmt.Errorf("cache folder %q is not absolute", base)
	}
	dir := filepath.Join(base, "heatgraph", "layout")
	if err := os.MkdirAll(dir, 0o700); err != nil {
		return "", err
	}
	for _, d := range []string{filepath.Dir(dir), dir} {
		if err := safeDir(d); err != nil {
			return "", err
		}
	}
	// Check that the folder can be written, so that the cache does not
	// fail halfway through compiling.
	f, err := os.CreateTemp(dir, ".probe-*")
	if err != nil {
		return "", err
	}
	name := f.Name()
	f.Close()
	if err := os.Remove(name); err != nil {
		return "", err
	}
	return dir, nil
}

// errUnsafe says that a cache folder is not the user's own.
var errUnsafe = errors.New("cache folder is not private to the user")

// checkMode refuses links, non-folders and folders others may write to.
func checkMode(fi fs.FileInfo) error {
	if fi.Mode()&fs.ModeSymlink != 0 || !fi.IsDir() {
		return fmt.Errorf("%w: not a folder", errUnsafe)
	}
	if fi.Mode().Perm()&0o022 != 0 {
		return fmt.Errorf("%w: writable by others", errUnsafe)
	}
	return nil
}
