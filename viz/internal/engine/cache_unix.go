//go:build unix

package engine

import (
	"fmt"
	"os"
	"syscall"
)

// safeDir checks that dir is a folder (not a link) of the user's own that
// no one else may write to.
func safeDir(dir string) error {
	fi, err := os.Lstat(dir)
	if err != nil {
		return err
	}
	if err := checkMode(fi); err != nil {
		return err
	}
	st, ok := fi.Sys().(*syscall.Stat_t)
	if !ok {
		return fmt.Errorf("%w: owner unknown", errUnsafe)
	}
	if int(st.Uid) != os.Geteuid() {
		return fmt.Errorf("%w: owned by user %d", errUnsafe, st.Uid)
	}
	return nil
}
