package files

import (
	"bytes"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"testing"
)

// A file of several write-back steps, written in pieces of every size
// across their boundaries, is committed byte for byte as given (read back
// from the disk); and the write-back is asked for in steps of at least
// writebackEvery over the bytes written, leaving less than a step to the
// sync (a buffer in the file's place counts them).
func TestWritebackKeepsTheBytes(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 8))
	want := make([]byte, 2*writebackEvery+12345)
	for i := range want {
		want[i] = byte(rng.Uint32())
	}
	write := func(w io.Writer) error {
		for at := 0; at < len(want); {
			n := min(len(want)-at, 1+rng.IntN(300_000))
			if _, err := w.Write(want[at : at+n]); err != nil {
				return err
			}
			at += n
		}
		return nil
	}
	t.Run("committed", func(t *testing.T) {
		path := filepath.Join(t.TempDir(), "big.json")
		if err := Commit(io.Discard, "", []Output{{Path: path, Write: write}}); err != nil {
			t.Fatal(err)
		}
		got, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(got, want) {
			t.Fatalf("%d bytes read back, %d written, or they differ", len(got), len(want))
		}
	})
	t.Run("steps", func(t *testing.T) {
		var buf bytes.Buffer
		f, err := os.CreateTemp(t.TempDir(), "wb")
		if err != nil {
			t.Fatal(err)
		}
		defer f.Close()
		wb := &writingBack{w: &buf, f: f}
		if err := write(wb); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(buf.Bytes(), want) {
			t.Fatal("the bytes passed on differ from those written")
		}
		// Write-back started as each step of writebackEvery or more was
		// passed on, in whole blocks, the rest (less than a step and a
		// block) left to the sync.
		if wb.written != int64(len(want)) || wb.started < writebackEvery || wb.started%writebackBlock != 0 || wb.written-wb.started >= writebackEvery+writebackBlock {
			t.Fatalf("written %d, write-back started up to %d", wb.written, wb.started)
		}
	})
}
