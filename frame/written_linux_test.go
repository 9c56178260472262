//go:build !race

package frame

import (
	"os"
	"os/exec"
	"runtime"
	"syscall"
	"testing"
)

// A vector added to before it is stored to faults each page twice when it
// is only allocated (the read maps the system's zero page, the write then
// copies it: Linux, mm/memory.c, do_anonymous_page and do_wp_page), and
// once when its zeros are written first: this thread's page faults
// (getrusage, RUSAGE_THREAD) from the allocation through an axpy into
// it, over memory fresh from the system, counted for both. It runs in a
// process of its own (this test binary again, only this test): in this
// one, memory the other tests freed may come back already mapped, or
// cleared by the allocator. Not built under the race detector, whose
// shadow memory faults pages of its own.
func TestWrittenFaultsOnce(t *testing.T) {
	if os.Getenv("GOVERN_WRITTEN_CHILD") == "" {
		cmd := exec.Command(os.Args[0], "-test.run=^TestWrittenFaultsOnce$", "-test.v")
		// Without the heap's transparent huge pages, where the system
		// gives them unasked (enabled=always): a 2 MiB page faults once
		// for 512 of the pages counted.
		debug := "disablethp=1"
		if d := os.Getenv("GODEBUG"); d != "" {
			debug = d + "," + debug // the last setting of a name wins
		}
		cmd.Env = append(os.Environ(), "GOVERN_WRITTEN_CHILD=1", "GODEBUG="+debug)
		out, err := cmd.CombinedOutput()
		t.Logf("in its own process:\n%s", out)
		if err != nil {
			t.Fatal(err)
		}
		return
	}
	const (
		bytes        = 32 << 20 // fresh from the system: no heap this test has freed is as large
		rusageThread = 1        // RUSAGE_THREAD, Linux
	)
	n, pages := bytes/8, int64(bytes/os.Getpagesize())
	ones := make([]float64, n)
	for i := range ones {
		ones[i] = 1
	}
	runtime.LockOSThread()
	defer runtime.UnlockOSThread()
	faults := func(alloc func(int) []float64) int64 {
		var before, after syscall.Rusage
		if err := syscall.Getrusage(rusageThread, &before); err != nil {
			t.Fatal(err)
		}
		y := alloc(n)
		axpy(y, 2, ones)
		if err := syscall.Getrusage(rusageThread, &after); err != nil {
			t.Fatal(err)
		}
		if y[n-1] != 2 {
			t.Fatalf("y[%d] = %g, want 2", n-1, y[n-1])
		}
		return after.Minflt - before.Minflt
	}
	made := faults(func(n int) []float64 { return make([]float64, n) })
	first := faults(written[float64])
	t.Logf("%d pages: %d faults allocated only, %d written first", pages, made, first)
	if made < pages*3/2 {
		t.Fatalf("%d faults for %d pages only allocated, want about two a page: the memory was not fresh from the system", made, pages)
	}
	if first < pages*9/10 || first > pages*5/4 {
		t.Errorf("%d faults for %d pages written first, want about one a page", first, pages)
	}
}
