package files

import (
	"bytes"
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"
	"time"

	"govern/envelope/report"
)

// assertNoTemporaries fails when a temporary output file is left in dir.
func assertNoTemporaries(t *testing.T, dir string) {
	t.Helper()
	left, _ := filepath.Glob(filepath.Join(dir, ".*.tmp*"))
	if len(left) > 0 {
		t.Errorf("temporary files left: %v", left)
	}
}

// TestLockWaitsForTheOtherRun: a run that finds the folder locked waits for
// the lock and then commits.
func TestLockWaitsForTheOtherRun(t *testing.T) {
	dir := t.TempDir()
	unlock, err := lockFolders([]string{dir})
	if err != nil {
		t.Fatal(err)
	}
	done := make(chan error, 1)
	go func() {
		done <- Commit(io.Discard, "", []Output{{Path: filepath.Join(dir, "a.csv"), Write: func(w io.Writer) error {
			_, err := io.WriteString(w, "a\n")
			return err
		}}})
	}()
	// The commit cannot finish while the lock is held: it writes its
	// temporary file and waits.
	for deadline := time.Now().Add(30 * time.Second); ; time.Sleep(LockPoll) {
		select {
		case err := <-done:
			t.Fatalf("the commit ended (%v) while another held the lock", err)
		default:
		}
		if left, _ := filepath.Glob(filepath.Join(dir, ".a.csv.tmp*")); len(left) > 0 {
			break
		}
		if time.Now().After(deadline) {
			t.Fatal("no temporary file appeared")
		}
	}
	// Time enough for a commit that ignored the lock to get past it.
	time.Sleep(10 * LockPoll)
	if Exists(filepath.Join(dir, "a.csv")) {
		t.Fatal("a.csv was renamed into place while another held the lock")
	}
	unlock()
	if err := <-done; err != nil {
		t.Fatalf("after the lock was released: %v", err)
	}
	if b, _ := os.ReadFile(filepath.Join(dir, "a.csv")); string(b) != "a\n" {
		t.Errorf("a.csv = %q", b)
	}
}

// TestWriteNewNeverOverwrites: new and demo --write refuse a path that is
// there, even a link to nothing, and leave no temporary file.
func TestWriteNewNeverOverwrites(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "m.toml")
	if err := WriteNew(p, []byte("a")); err != nil {
		t.Fatal(err)
	}
	for _, path := range []string{p, filepath.Join(dir, "dangling")} {
		if path != p {
			os.Symlink("nowhere", path)
		}
		err := WriteNew(path, []byte("b"))
		if want := path + " exists; not overwriting it"; err == nil || err.Error() != want {
			t.Errorf("err = %v, want %s", err, want)
		}
	}
	if b, _ := os.ReadFile(p); string(b) != "a" {
		t.Errorf("m.toml = %q", b)
	}
	if Exists(filepath.Join(dir, "nowhere")) {
		t.Error("the link's target was made")
	}
	assertNoTemporaries(t, dir)
}

func TestCappedWriterStopsAtTheLimit(t *testing.T) {
	var b bytes.Buffer
	c := &capped{w: &b, n: report.MaxOutput - 3, what: "JSON"}
	if _, err := c.Write([]byte("abc")); err != nil {
		t.Fatalf("write up to the limit: %v", err)
	}
	_, err := c.Write([]byte("d"))
	if !errors.Is(err, ErrTooLarge) || err.Error() != "output too large: the JSON output passed 1024 MiB" {
		t.Errorf("err = %v", err)
	}
	if b.String() != "abc" {
		t.Errorf("wrote %q", b.String())
	}
}
