package files

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sort"
	"sync"
	"time"

	"govern/envelope/report"
)

// The files of a run are committed as a set: see Commit, and the
// "Output files" part of docs/errors.md.

// Output is something the run was asked to write: a file, or standard
// output for Path "-", and how to write it.
type Output struct {
	Path  string
	Write func(io.Writer) error
}

// How an output reaches its path.
type delivery uint8

const (
	// toStdout: "-", or a path that names the file standard output is.
	toStdout delivery = iota
	// replace: a regular file, or nothing yet: written to a temporary file
	// beside it and renamed over it.
	replace
	// through: a device, a named pipe or a socket: opened and written, as
	// renaming over it would put a regular file in its place.
	through
)

// target is an output with where and how it is written.
type target struct {
	Output
	how  delivery
	dest string // replace: the file renamed over, its symbolic links followed
	temp string // replace: the temporary file, once written
}

// Commit writes the outputs of a run as one set. A regular file (or
// a path where there is none yet) is written to a temporary file beside it,
// synced to disk; once every one has been written whole they are renamed
// into place together, under a lock on their folders that other runs
// respect, so a failed, interrupted or concurrent run never leaves a
// partial file, nor the files of two runs mixed. A path that exists and is
// not a regular file (a device such as /dev/null, a named pipe) is written
// through, after the temporary files and before the renames; a symbolic
// link to a regular file has its target replaced and stays a link.
// Standard output ("-", or a path naming the file it is) is written last.
// Paths that name the model, a directory, or the same file twice are
// refused before anything is written. Every output is capped at
// report.MaxOutput bytes. No temporary file stays behind, even after a panic or a signal
// (RemoveTemporaries).
func Commit(stdout io.Writer, model string, outs []Output) error {
	targets, err := locate(stdout, model, outs)
	if err != nil {
		return err
	}
	files := 0
	for _, t := range targets {
		if t.how != toStdout {
			files++
		}
	}
	if files == 0 {
		// Nothing to keep whole: stream straight out.
		for _, t := range targets {
			if err := t.Write(&capped{w: stdout, what: "standard output"}); err != nil {
				return err
			}
		}
		return nil
	}
	// Standard output is rendered into memory alongside the files (the two
	// only read the results), and written once the files are in place. A
	// panic there becomes an error: it cannot be recovered in another
	// goroutine.
	var screens []func(io.Writer) error
	for _, t := range targets {
		if t.how == toStdout {
			screens = append(screens, t.Write)
		}
	}
	var screen bytes.Buffer
	var screenErr error
	done := make(chan struct{})
	go func() {
		defer close(done)
		defer func() {
			if p := recover(); p != nil {
				screenErr = fmt.Errorf("internal error: %v", p)
			}
		}()
		for _, write := range screens {
			if screenErr == nil {
				screenErr = write(&capped{w: &screen, what: "summary"})
			}
		}
	}()
	defer func() { <-done }() // even on a panic below, do not leave it running
	defer func() {
		for _, t := range targets {
			if t.temp != "" {
				discardTemp(t.temp) // left only on failure; renamed ones are gone
			}
		}
	}()
	for i := range targets {
		if t := &targets[i]; t.how == replace {
			if t.temp, err = writeTemp(t.dest, t.Path, t.Write); err != nil {
				break
			}
		}
	}
	for i := 0; i < len(targets) && err == nil; i++ {
		if t := targets[i]; t.how == through {
			err = writeThrough(t.Path, t.Write)
		}
	}
	<-done
	if err != nil {
		return err
	}
	if screenErr != nil {
		return screenErr
	}
	if err := renameAll(targets); err != nil {
		return err
	}
	_, err = stdout.Write(screen.Bytes())
	return err
}

// locate finds where and how each output is written, and refuses paths
// that name the model, a directory, or one file twice.
func locate(stdout io.Writer, model string, outs []Output) ([]target, error) {
	targets := make([]target, 0, len(outs))
	for _, o := range outs {
		t := target{Output: o, how: toStdout}
		if o.Path != "-" && !namesStdout(stdout, o.Path) {
			if sameFile(o.Path, model) {
				return nil, fmt.Errorf("refusing to write %s: it is the model file", o.Path)
			}
			st, err := os.Stat(o.Path)
			switch {
			case err == nil && st.IsDir():
				return nil, fmt.Errorf("cannot write %s: it is a directory", o.Path)
			case err == nil && !st.Mode().IsRegular():
				t.how = through
			default:
				t.how = replace
				if t.dest, err = resolve(o.Path); err != nil {
					return nil, fmt.Errorf("cannot write %s: %v", o.Path, err)
				}
				for _, u := range targets {
					if u.how == replace && sameFile(t.dest, u.dest) {
						return nil, fmt.Errorf("refusing to write %s twice: two outputs name the same file", o.Path)
					}
				}
			}
		}
		targets = append(targets, t)
	}
	return targets, nil
}

// resolve follows the symbolic links of path to the file they end at,
// which need not exist yet (a link to a file still to be made).
func resolve(path string) (string, error) {
	if p, err := filepath.EvalSymlinks(path); err == nil {
		return p, nil
	}
	for range 40 {
		st, err := os.Lstat(path)
		if err != nil || st.Mode()&os.ModeSymlink == 0 {
			return path, nil // the end of the links, which CreateTemp will judge
		}
		link, err := os.Readlink(path)
		if err != nil {
			return "", err
		}
		if !filepath.IsAbs(link) {
			link = filepath.Join(filepath.Dir(path), link)
		}
		path = link
	}
	return "", errors.New("too many levels of symbolic links")
}

// namesStdout reports whether path names the file standard output is, such
// as /dev/stdout: it is then written as "-" is, to standard output, in its
// turn, rather than by opening the path again (which would start at the
// beginning of a file the shell redirected standard output to) or by
// replacing it.
func namesStdout(stdout io.Writer, path string) bool {
	f := Of(stdout)
	if f == nil || path == "-" {
		return false
	}
	a, err := f.Stat()
	if err != nil {
		return false
	}
	b, err := os.Stat(path)
	return err == nil && os.SameFile(a, b)
}

// StdoutPath returns "-" for a path that names the file standard output
// is, and path otherwise: commands decide on it before they write, as on
// "-" (such as leaving out the summary when a file goes to standard output).
func StdoutPath(stdout io.Writer, path string) string {
	if path != "" && namesStdout(stdout, path) {
		return "-"
	}
	return path
}

// Of returns the file behind w, or nil.
func Of(w io.Writer) *os.File {
	switch v := w.(type) {
	case *os.File:
		return v
	case interface{ File() *os.File }:
		return v.File()
	}
	return nil
}

// pending holds the temporary files and new folders of the run, so that a
// signal can remove them (RemoveTemporaries).
var pending = struct {
	sync.Mutex
	temps   map[string]bool
	folders map[string]bool
}{temps: map[string]bool{}, folders: map[string]bool{}}

// committing is held while a set of outputs is renamed into place, so that
// a signal waits for the set to be whole rather than break it.
var committing sync.Mutex

// RemoveTemporaries removes every temporary output file, and every folder
// the run made that is still empty, and blocks any further output: it is
// for a run that is about to end on a signal. It waits for a set of files
// being renamed into place to be complete.
func RemoveTemporaries() {
	committing.Lock()
	pending.Lock()
	for t := range pending.temps {
		os.Remove(t)
	}
	for d := range pending.folders {
		os.Remove(d) // only if empty: it never removes a file
	}
	// Both stay locked: nothing is written or renamed after this.
}

func discardTemp(tmp string) {
	pending.Lock()
	defer pending.Unlock()
	os.Remove(tmp)
	delete(pending.temps, tmp)
}

// MakeFolder makes the folder dir if it does not exist and reports whether
// it did. A folder it made is removed again on a signal while it is empty;
// ForgetFolder ends that.
func MakeFolder(dir string) (bool, error) {
	st, err := os.Stat(dir)
	switch {
	case err == nil && st.IsDir():
		return false, nil
	case err == nil:
		return false, fmt.Errorf("cannot write into %s: it is a file, not a folder", dir)
	}
	pending.Lock()
	defer pending.Unlock()
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return false, fmt.Errorf("cannot make the folder %s: %v", dir, err)
	}
	pending.folders[dir] = true
	return true, nil
}

func ForgetFolder(dir string) {
	pending.Lock()
	defer pending.Unlock()
	delete(pending.folders, dir)
}

// writeTemp writes a temporary file beside dest (the file it will replace)
// with write, named ".NAME.tmp…", with the permissions of that file (0644
// for a new one), syncs it to disk and returns its name; path is the name
// the user gave, for messages. On any failure, or a panic, it removes the
// temporary file.
func writeTemp(dest, path string, write func(io.Writer) error) (string, error) {
	pending.Lock()
	f, err := os.CreateTemp(filepath.Dir(dest), "."+filepath.Base(dest)+".tmp*")
	if err == nil {
		pending.temps[f.Name()] = true
	}
	pending.Unlock()
	if err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	tmp := f.Name()
	kept := false
	defer func() {
		if !kept {
			f.Close()
			discardTemp(tmp)
		}
	}()
	mode := os.FileMode(0o644)
	if st, err := os.Stat(dest); err == nil && st.Mode().IsRegular() {
		mode = st.Mode().Perm()
	}
	if err := f.Chmod(mode); err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	bw := bufio.NewWriterSize(&writingBack{w: TempWriter(f), f: f}, 1<<16)
	err = write(&capped{w: bw, what: filepath.Base(path)})
	if err == nil {
		err = bw.Flush()
	}
	if err == nil {
		err = f.Sync()
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	kept = true
	return tmp, nil
}

// TempWriter is what a temporary output file is written through. Tests
// replace it to simulate a write that fails or is interrupted part way.
var TempWriter = func(f *os.File) io.Writer { return f }

// writeThrough writes to path as it is: a device or a named pipe, which is
// opened (a pipe waits for its reader) and written, never made or replaced.
func writeThrough(path string, write func(io.Writer) error) error {
	f, err := os.OpenFile(path, os.O_WRONLY, 0)
	if err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	bw := bufio.NewWriterSize(f, 1<<16)
	err = write(&capped{w: bw, what: filepath.Base(path)})
	if err == nil {
		err = bw.Flush()
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	return nil
}

// renameAll renames the temporary files of targets over their files,
// holding the lock of every folder they are in, so that another run's set
// is renamed wholly before or wholly after this one.
func renameAll(targets []target) error {
	var dirs []string
	for _, t := range targets {
		if t.how == replace {
			dirs = append(dirs, filepath.Dir(t.dest))
		}
	}
	unlock, err := lockFolders(dirs)
	if err != nil {
		var busy *busyError
		if errors.As(err, &busy) {
			for _, t := range targets {
				if t.how == replace && filepath.Dir(t.dest) == busy.dir {
					return fmt.Errorf("cannot write %s: %v", t.Path, err)
				}
			}
		}
		return err
	}
	defer unlock()
	committing.Lock()
	defer committing.Unlock()
	for i := range targets {
		t := &targets[i]
		if t.how != replace {
			continue
		}
		if err := os.Rename(t.temp, t.dest); err != nil {
			return fmt.Errorf("cannot write %s: %v", t.Path, err)
		}
		pending.Lock()
		delete(pending.temps, t.temp)
		pending.Unlock()
		t.temp = "" // no longer ours to remove
		AfterRename(t.Path)
	}
	return nil
}

// AfterRename is called after each file of a set is renamed into place.
// Tests set it to start another run at the worst moment.
var AfterRename = func(path string) {}

// LockWait is how long a run waits for another to finish renaming its
// files into the same folder, and LockPoll how often it tries again. A set
// is renamed in milliseconds, so a run that holds the lock longer is
// stopped or stuck.
var (
	LockWait = 10 * time.Second
	LockPoll = 20 * time.Millisecond
)

// busyError is a folder whose lock another run holds.
type busyError struct{ dir string }

func (e *busyError) Error() string {
	return fmt.Sprintf("another run is writing into %s now; try again when it has finished", e.dir)
}

// lockFolders takes the lock of every folder of dirs, in one order (by
// full path), waiting at most LockWait for each, and returns what releases
// them. On file systems without locks it goes on unlocked.
func lockFolders(dirs []string) (func(), error) {
	type folder struct{ dir, key string }
	var fs []folder
	seen := map[string]bool{}
	for _, d := range dirs {
		key := d
		if abs, err := filepath.Abs(d); err == nil {
			key = abs
			if real, err := filepath.EvalSymlinks(abs); err == nil {
				key = real
			}
		}
		if !seen[key] {
			seen[key] = true
			fs = append(fs, folder{d, key})
		}
	}
	sort.Slice(fs, func(i, j int) bool { return fs[i].key < fs[j].key })
	var held []func()
	release := func() {
		for i := len(held) - 1; i >= 0; i-- {
			held[i]()
		}
	}
	deadline := time.Now().Add(LockWait)
	for _, f := range fs {
		for {
			unlock, busy := tryLockFolder(f.dir)
			if !busy {
				held = append(held, unlock)
				break
			}
			if !time.Now().Before(deadline) {
				release()
				return nil, &busyError{dir: f.dir}
			}
			time.Sleep(LockPoll)
		}
	}
	return release, nil
}

// WriteNew writes data to path through a temporary file and a link, so
// that a file there (even one made a moment before) is never overwritten:
// for the model files that new and demo --write make.
func WriteNew(path string, data []byte) error {
	tmp, err := writeTemp(path, path, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
	if err != nil {
		return err
	}
	defer discardTemp(tmp)
	err = os.Link(tmp, path)
	switch {
	case err == nil:
		return nil
	case errors.Is(err, os.ErrExist):
		return fmt.Errorf("%s exists; not overwriting it", path)
	}
	// A file system without hard links: look, then rename.
	if _, lerr := os.Lstat(path); lerr == nil {
		return fmt.Errorf("%s exists; not overwriting it", path)
	}
	if err := os.Rename(tmp, path); err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	return nil
}

// sameFile reports whether a and b name the same file: the same existing
// file, or the same path.
func sameFile(a, b string) bool {
	if b == "" {
		return false
	}
	fa, err1 := os.Stat(a)
	fb, err2 := os.Stat(b)
	if err1 != nil || err2 != nil {
		pa, errA := filepath.Abs(a)
		pb, errB := filepath.Abs(b)
		if errA != nil || errB != nil {
			return filepath.Clean(a) == filepath.Clean(b)
		}
		return pa == pb
	}
	return os.SameFile(fa, fb)
}

func Exists(path string) bool {
	_, err := os.Lstat(path)
	return err == nil
}

// ErrTooLarge marks an output past report.MaxOutput.
var ErrTooLarge = errors.New("output too large")

// capped is a writer that refuses to grow past report.MaxOutput: the last
// line of defence behind report.CheckSize's estimates.
type capped struct {
	w    io.Writer
	n    int
	what string
}

func (c *capped) Write(p []byte) (int, error) {
	if c.n+len(p) > report.MaxOutput {
		return 0, fmt.Errorf("%w: the %s output passed %d MiB", ErrTooLarge, c.what, report.MaxOutput>>20)
	}
	c.n += len(p)
	return c.w.Write(p)
}
