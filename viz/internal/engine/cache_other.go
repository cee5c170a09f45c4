//go:build !unix

package engine

import "os"

// safeDir checks that dir is a folder, not a link. Ownership is left to the
// system's access control.
func safeDir(dir string) error {
	fi, err := os.Lstat(dir)
	if err != nil {
		return err
	}
	if !fi.IsDir() {
		return checkMode(fi)
	}
	return nil
}
