//go:build unix

package files

import (
	"errors"
	"os"
	"syscall"
)

// tryLockFolder takes an exclusive advisory lock (flock) on the folder dir
// without waiting. It reports busy when another run holds it; when the
// folder cannot be opened or the file system has no locks, it returns an
// unlock that does nothing, and the run goes on unlocked.
func tryLockFolder(dir string) (unlock func(), busy bool) {
	f, err := os.Open(dir)
	if err != nil {
		return func() {}, false
	}
	err = syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB)
	switch {
	case err == nil:
		return func() {
			syscall.Flock(int(f.Fd()), syscall.LOCK_UN)
			f.Close()
		}, false
	case errors.Is(err, syscall.EWOULDBLOCK):
		f.Close()
		return nil, true
	}
	f.Close()
	return func() {}, false
}
