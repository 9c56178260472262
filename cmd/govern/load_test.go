package main

import (
	"os"
	"path/filepath"
	"runtime/debug"
	"strings"
	"testing"
)

// The collector's target is held at readGCPercent while a file of 1 MiB
// or more, or of 40,000 entries or more, is read (the decoder's peak is
// about 270 bytes an entry, docs/errors.md), and left at its default for
// a smaller file: the 7 KB file of a 30 × 60 frame read with it held
// collected nine times in 25 ms.
func TestHoldsReading(t *testing.T) {
	inline := func(n int) []byte { // n one-key inline tables: 4 entries each, 1 for x
		return []byte("x = [" + strings.Repeat("{a = 1},", n) + "]\n")
	}
	for _, c := range []struct {
		name string
		size int64
		src  []byte
		want bool
	}{
		{"empty", 0, nil, false},
		{"a 30 × 60 frame's file", 7117, []byte("[grid]\nbays = [7.5, 6]\n"), false},
		{"just under 1 MiB, few entries", 1<<20 - 1, []byte("# comments\n"), false},
		{"1 MiB", 1 << 20, nil, true},
		{"the largest file read", 128 << 20, nil, true},                                                   // modelfile.MaxFileSize
		{"9,999 inline tables", 0, inline(9999), false},                                                   // 39,997 entries
		{"10,000 inline tables", 0, inline(10000), true},                                                  // 40,001
		{"9,999 inline tables and three keys", 0, append(inline(9999), "a = 1\nb = 2\nc = 3\n"...), true}, // 40,000
		{"9,999 inline tables and two keys", 0, append(inline(9999), "a = 1\nb = 2\n"...), false},         // 39,999
	} {
		c.size = max(c.size, int64(len(c.src)))
		if got := holdsReading(c.size, c.src); got != c.want {
			t.Errorf("%s: holdsReading = %v, want %v", c.name, got, c.want)
		}
	}
}

// loadModel puts the collector's target back as it was, whether it held
// it while reading or not.
func TestLoadModelRestoresTarget(t *testing.T) {
	dir := t.TempDir()
	small := filepath.Join(dir, "small.toml")
	if err := os.WriteFile(small, demoModel, 0o644); err != nil {
		t.Fatal(err)
	}
	padded := filepath.Join(dir, "padded.toml") // held: 1 MiB with comments
	pad := strings.Repeat("# padding to a large file\n", (1<<20)/26+1)
	if err := os.WriteFile(padded, append(append([]byte{}, demoModel...), pad...), 0o644); err != nil {
		t.Fatal(err)
	}
	const before = 137
	defer debug.SetGCPercent(debug.SetGCPercent(before))
	for _, path := range []string{small, padded} {
		if _, err := loadModel(path); err != nil {
			t.Fatal(err)
		}
		if got := debug.SetGCPercent(before); got != before {
			t.Errorf("%s: target %d%% after reading, want %d%% as before", filepath.Base(path), got, before)
		}
	}
}
