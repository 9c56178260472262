//go:build linux && (amd64 || arm64)

package files

import (
	"os"
	"path/filepath"
	"syscall"
	"testing"
	"unsafe"
)

// Release drops a file's clean pages from the page cache: the resident
// pages of a file written, synced and read back (mincore(2) of a mapping
// of it), before and after. The file's bytes are unchanged. A file system
// whose files are their cached pages (tmpfs), or that keeps no cached copy
// of a file read (some network file systems), has nothing to drop.
func TestRelease(t *testing.T) {
	const (
		size       = 8 << 20
		tmpfsMagic = 0x01021994 // TMPFS_MAGIC, linux/magic.h
	)
	dir := t.TempDir()
	var fs syscall.Statfs_t
	if err := syscall.Statfs(dir, &fs); err != nil {
		t.Fatal(err)
	}
	if fs.Type == tmpfsMagic {
		t.Skipf("%s is on tmpfs: its files are their cached pages, which no advice drops", dir)
	}
	path := filepath.Join(dir, "old.json")
	data := make([]byte, size)
	for i := range data {
		data[i] = byte('a' + i%26)
	}
	if err := os.WriteFile(path, data, 0o644); err != nil {
		t.Fatal(err)
	}
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if err := f.Sync(); err != nil { // clean pages: written to disk
		t.Fatal(err)
	}
	if _, err := os.ReadFile(path); err != nil { // and cached
		t.Fatal(err)
	}
	resident := func() int {
		m, err := syscall.Mmap(int(f.Fd()), 0, size, syscall.PROT_READ, syscall.MAP_SHARED)
		if err != nil {
			t.Fatal(err)
		}
		defer syscall.Munmap(m)
		vec := make([]byte, size/os.Getpagesize())
		if _, _, e := syscall.Syscall(syscall.SYS_MINCORE, uintptr(unsafe.Pointer(&m[0])), size, uintptr(unsafe.Pointer(&vec[0]))); e != 0 {
			t.Fatal(e)
		}
		n := 0
		for _, v := range vec {
			n += int(v & 1)
		}
		return n
	}
	pages := size / os.Getpagesize()
	before := resident()
	Release(filepath.Join(dir, "missing.json"), "-", "", dir, path)
	after := resident()
	t.Logf("%d pages: %d resident before, %d after", pages, before, after)
	if before < pages*9/10 {
		t.Skipf("%d of %d pages resident after reading the file: this file system keeps no cached copy to drop", before, pages)
	}
	if after > pages/10 {
		t.Errorf("%d of %d pages resident after Release, want nearly none", after, pages)
	}
	got, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if string(got) != string(data) {
		t.Error("the file's bytes changed")
	}
}
