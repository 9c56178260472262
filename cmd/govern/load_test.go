package main

import "testing"

// The collector's target is held at readGCPercent while a file of 1 MiB or
// more is read, where the decoder's peak (about 270 bytes an entry,
// docs/errors.md) reaches hundreds of megabytes, and left at its default
// for a smaller file: the 7 KB file of a 30 × 60 frame read with it held
// collected nine times in 25 ms.
func TestHoldsReading(t *testing.T) {
	for _, c := range []struct {
		size int64
		want bool
	}{
		{0, false},
		{7117, false}, // docs/perf/model.sh 30 60
		{1<<20 - 1, false},
		{1 << 20, true},
		{128 << 20, true}, // modelfile.MaxFileSize
	} {
		if got := holdsReading(c.size); got != c.want {
			t.Errorf("holdsReading(%d) = %v, want %v", c.size, got, c.want)
		}
	}
}
