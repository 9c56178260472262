//go:build !unix

package files

// tryLockFolder does nothing where there is no flock: concurrent runs are
// not kept apart there (docs/errors.md).
func tryLockFolder(dir string) (unlock func(), busy bool) { return func() {}, false }
