package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"govern/envelope/report"
	"govern/envelope/report/files"
)

// pipeWait bounds how long a test waits for a reader or a writer at the
// other end of a named pipe before it reports that none came.
const pipeWait = 30 * time.Second

// mode returns the type bits of path itself (not following a link).
func mode(t *testing.T, path string) os.FileMode {
	t.Helper()
	st, err := os.Lstat(path)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return st.Mode().Type()
}

// TestOutputPathsThatAreNotRegularFiles: a device, a named pipe or a
// symbolic link named as an output is never replaced by a regular file. A
// device or a pipe is written through; a link to a regular file has its
// target replaced, whole, and stays a link; a path naming standard output
// is standard output.
func TestOutputPathsThatAreNotRegularFiles(t *testing.T) {
	model := writeDemo(t)
	dir := filepath.Dir(model)

	t.Run("a device is written through and stays a device", func(t *testing.T) {
		null := makeDevice(t, dir, "null", 3)
		code, stdout, stderr := exec("run", "--json", null, "--csv", filepath.Join(dir, "env.csv"), model)
		if code != 0 || stderr != "" || !strings.Contains(stdout, "Governing design values") {
			t.Fatalf("exit %d, stderr %q", code, stderr)
		}
		if m := mode(t, null); m != os.ModeDevice|os.ModeCharDevice {
			t.Errorf("%s is no longer a character device: mode %v", null, m)
		}
		assertNoTemporaries(t, dir)
	})
	t.Run("a device that fails is an error and nothing is replaced", func(t *testing.T) {
		full := makeDevice(t, dir, "full", 7)
		csvPath := filepath.Join(dir, "kept.csv")
		os.WriteFile(csvPath, []byte("previous\n"), 0o644)
		code, stdout, stderr := exec("run", "--csv", csvPath, "--json", full, model)
		want := fmt.Sprintf("govern run: cannot write %s: write %s: no space left on device\n", full, full)
		if code != 1 || stderr != want || stdout != "" {
			t.Errorf("exit %d, stdout %d bytes, stderr %q; want 1 and %q", code, len(stdout), stderr, want)
		}
		if m := mode(t, full); m != os.ModeDevice|os.ModeCharDevice {
			t.Errorf("%s is no longer a character device: mode %v", full, m)
		}
		if got, _ := os.ReadFile(csvPath); string(got) != "previous\n" {
			t.Error("the CSV was replaced though the run failed")
		}
		assertNoTemporaries(t, dir)
	})
	t.Run("a named pipe is written through and stays a pipe", func(t *testing.T) {
		fifo := makePipe(t, dir, "pipe")
		got := make(chan []byte, 1)
		go func() {
			f, err := os.Open(fifo) // waits for the writer
			if err != nil {
				got <- nil
				return
			}
			b, _ := io.ReadAll(f)
			f.Close()
			got <- b
		}()
		code, _, stderr := exec("run", "--quiet", "--json", fifo, model)
		if code != 0 || stderr != "" {
			t.Fatalf("exit %d, stderr %q", code, stderr)
		}
		if m := mode(t, fifo); m != os.ModeNamedPipe {
			// The reader stays waiting on the pipe that was replaced.
			t.Fatalf("%s is no longer a named pipe: mode %v", fifo, m)
		}
		select {
		case b := <-got:
			var doc struct{ Format string }
			if err := json.Unmarshal(b, &doc); err != nil || doc.Format != report.JSONFormat {
				t.Errorf("the pipe's reader got %d bytes that are not the JSON (%v)", len(b), err)
			}
		case <-time.After(pipeWait):
			t.Errorf("the pipe's reader got nothing in %v", pipeWait)
		}
	})
	t.Run("a link to a regular file: the file is replaced, the link kept", func(t *testing.T) {
		real := filepath.Join(dir, "real.json")
		os.WriteFile(real, []byte("old"), 0o640)
		link := filepath.Join(dir, "link.json")
		if err := os.Symlink("real.json", link); err != nil {
			t.Fatal(err)
		}
		if code, _, stderr := exec("run", "--quiet", "--json", link, model); code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		if m := mode(t, link); m != os.ModeSymlink {
			t.Fatalf("%s is no longer a link: mode %v", link, m)
		}
		if to, _ := os.Readlink(link); to != "real.json" {
			t.Errorf("the link points to %q, want real.json", to)
		}
		b, _ := os.ReadFile(real)
		if !bytes.HasPrefix(b, []byte("{")) {
			t.Errorf("the target holds %q, not the JSON", b[:min(len(b), 20)])
		}
		if st, _ := os.Stat(real); st.Mode().Perm() != 0o640 {
			t.Errorf("the target's mode is %v, want 0640 as before", st.Mode().Perm())
		}
		assertNoTemporaries(t, dir)
	})
	t.Run("a link to a file not yet made: the file is made, the link kept", func(t *testing.T) {
		link := filepath.Join(dir, "ahead.csv")
		if err := os.Symlink("made.csv", link); err != nil {
			t.Fatal(err)
		}
		if code, _, stderr := exec("run", "--quiet", "--csv", link, model); code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		if m := mode(t, link); m != os.ModeSymlink {
			t.Fatalf("%s is no longer a link: mode %v", link, m)
		}
		if b, _ := os.ReadFile(filepath.Join(dir, "made.csv")); !bytes.HasPrefix(b, []byte("member,")) {
			t.Errorf("made.csv holds %q, not the CSV", b[:min(len(b), 20)])
		}
	})
	t.Run("a link to a device is written through", func(t *testing.T) {
		null := makeDevice(t, dir, "null2", 3)
		link := filepath.Join(dir, "to-null")
		os.Symlink(null, link)
		if code, _, stderr := exec("run", "--quiet", "--json", link, model); code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		if m := mode(t, link); m != os.ModeSymlink {
			t.Errorf("%s is no longer a link: mode %v", link, m)
		}
		if m := mode(t, null); m != os.ModeDevice|os.ModeCharDevice {
			t.Errorf("%s is no longer a character device: mode %v", null, m)
		}
	})
	t.Run("a path naming standard output is standard output", func(t *testing.T) {
		// Standard output redirected to a file; the path names it through
		// /proc/self/fd, as /dev/stdout does for the process's own.
		out, err := os.Create(filepath.Join(dir, "redirected"))
		if err != nil {
			t.Fatal(err)
		}
		defer out.Close()
		path := fmt.Sprintf("/proc/self/fd/%d", out.Fd())
		if _, err := os.Stat(path); err != nil {
			t.Skipf("no %s here", path)
		}
		var errb bytes.Buffer
		code := govern([]string{"run", "--json", path, model}, out, &errb)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, errb.String())
		}
		b, _ := os.ReadFile(out.Name())
		var doc struct{ Format string }
		if err := json.Unmarshal(b, &doc); err != nil || doc.Format != report.JSONFormat {
			t.Errorf("standard output holds %d bytes that are not the JSON alone (%v)", len(b), err)
		}
		if m := mode(t, out.Name()); !m.IsRegular() {
			t.Errorf("mode %v", m)
		}
		errb.Reset()
		code = govern([]string{"run", "--json", path, "--csv", "-", model}, out, &errb)
		want := "govern run: only one of --json, --csv, --cases-csv, --design-csv and --report can go to standard output\n"
		if code != 2 || !strings.HasPrefix(errb.String(), want) {
			t.Errorf("two outputs to standard output: exit %d, %q; want 2 and %q", code, errb.String(), want)
		}
	})
}

// TestConcurrentRunsCommitWholeSets: two runs writing the same files end
// with the files of one run or of the other, never the JSON of one and the
// CSV of the other. The second run is started while the first has renamed
// its JSON into place and not yet its CSV, the worst moment; it finds the
// folder locked and is refused (with no wait, as set here), and writes
// nothing. Run again afterwards, it replaces both.
func TestConcurrentRunsCommitWholeSets(t *testing.T) {
	first := writeDemo(t)
	dir := filepath.Dir(first)
	second := filepath.Join(dir, "second.toml")
	if err := os.WriteFile(second, bytes.Replace(demoModel, []byte("stations = 11"), []byte("stations = 5"), 1), 0o644); err != nil {
		t.Fatal(err)
	}
	js, cs := filepath.Join(dir, "env.json"), filepath.Join(dir, "env.csv")
	// stations reports the stations of the run that wrote each file.
	stations := func() (fromJSON, fromCSV int) {
		var doc struct {
			Settings struct{ Stations int } `json:"settings"`
		}
		b, _ := os.ReadFile(js)
		json.Unmarshal(b, &doc)
		c, _ := os.ReadFile(cs)
		rows := bytes.Count(c, []byte("\n")) - 1 // 35 members, 3 rows a station
		return doc.Settings.Stations, rows / (35 * 3)
	}

	defer func(f func(string), w time.Duration) { files.AfterRename, files.LockWait = f, w }(files.AfterRename, files.LockWait)
	files.LockWait = 0
	started := false
	var code2 int
	var stderr2 string
	files.AfterRename = func(path string) {
		if started {
			return
		}
		started = true
		code2, _, stderr2 = exec("run", "--quiet", "--json", js, "--csv", cs, second)
	}
	if code, _, stderr := exec("run", "--quiet", "--json", js, "--csv", cs, first); code != 0 {
		t.Fatalf("first run: exit %d: %s", code, stderr)
	}
	if !started {
		t.Fatal("the second run was never started")
	}
	want := fmt.Sprintf("govern run: cannot write %s: another run is writing into %s now; try again when it has finished\n", js, dir)
	if code2 != 1 || stderr2 != want {
		t.Errorf("second run: exit %d, stderr %q; want 1 and %q", code2, stderr2, want)
	}
	if j, c := stations(); j != 11 || c != 11 {
		t.Errorf("the JSON is from a run of %d stations and the CSV from one of %d; want both from the first run (11)", j, c)
	}
	assertNoTemporaries(t, dir)

	files.AfterRename = func(string) {}
	if code, _, stderr := exec("run", "--quiet", "--json", js, "--csv", cs, second); code != 0 {
		t.Fatalf("second run again: exit %d: %s", code, stderr)
	}
	if j, c := stations(); j != 5 || c != 5 {
		t.Errorf("after the second run alone: the JSON is from %d stations and the CSV from %d; want both 5", j, c)
	}
}
