//go:build unix

package main

import (
	"path/filepath"
	"syscall"
	"testing"
)

// makeDevice makes a character device node like /dev/null (1, 3) or
// /dev/full (1, 7) in dir, so that a run that wrongly replaced it would
// harm nothing; it skips the test where device nodes cannot be made.
func makeDevice(t *testing.T, dir, name string, minor int) string {
	t.Helper()
	p := filepath.Join(dir, name)
	if err := syscall.Mknod(p, syscall.S_IFCHR|0o666, 1<<8|minor); err != nil {
		t.Skipf("cannot make a device node here (%v)", err)
	}
	return p
}

// makePipe makes a named pipe in dir, or skips the test.
func makePipe(t *testing.T, dir, name string) string {
	t.Helper()
	p := filepath.Join(dir, name)
	if err := syscall.Mkfifo(p, 0o644); err != nil {
		t.Skipf("cannot make a named pipe here (%v)", err)
	}
	return p
}
