package main

import (
	"bytes"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"

	"govern/envelope/report"
)

type diffFlags struct {
	tolerance, floor float64 // per cent
}

var cmdDiff = &command{
	name:  "diff",
	usage: "[--tolerance PERCENT] [--floor PERCENT] OLD.json NEW.json",
	short: "list the design values that changed between two JSON result files",
	long: `
Diff compares two result files written by 'govern run --json' (of this
version's format) and lists, member by member, the design values that
changed by more than a tolerance, with both values, where along the member
each is and the combinations that govern them: for the check that an edit
of a model changed only what it was meant to.

The design values compared are, for every member, the largest and smallest
N, V and M over its stations and M and V at each column face; the
deflection of every span and cantilever; and the largest and smallest of
every reaction component. A value is listed when it changed by more than
--tolerance per cent of the larger of its two values and by more than
--floor per cent of the largest value of that quantity in its member (node,
span) in either file, so that a value near zero does not count round-off
as a change. A member, span or support found in one file only is listed
too.

The exit status is 0 when nothing changed, 1 when something did or a file
cannot be read (not valid JSON, not a result file, another format version,
different units), and 2 for a mistake in the command line.`,
	setup: func(fs *flag.FlagSet) func(*environ, []string) error {
		f := &diffFlags{}
		fs.Float64Var(&f.tolerance, "tolerance", 100*report.DefaultDiffOptions.Relative, "list a value that changed by more than this `percent` of the larger of its two values")
		fs.Float64Var(&f.floor, "floor", 100*report.DefaultDiffOptions.Floor, "and by more than this `percent` of the largest value of that quantity in its member")
		return func(env *environ, args []string) error { return diff(env, f, args) }
	},
}

// diff is govern diff.
func diff(env *environ, f *diffFlags, args []string) error {
	if len(args) != 2 {
		return usagef("need two result files, OLD.json and NEW.json, got %d arguments", len(args))
	}
	for _, p := range []struct {
		name string
		v    float64
	}{{"--tolerance", f.tolerance}, {"--floor", f.floor}} {
		if !(p.v >= 0 && p.v <= 100) || math.IsNaN(p.v) {
			return usagef("%s must be a percentage from 0 to 100, not %g", p.name, p.v)
		}
	}
	var data [2][]byte
	for i, path := range args {
		b, err := readResults(path)
		if err != nil {
			return err
		}
		data[i] = b
	}
	d, err := report.Diff(filepath.Base(args[0]), data[0], filepath.Base(args[1]), data[1],
		report.DiffOptions{Relative: f.tolerance / 100, Floor: f.floor / 100})
	if err != nil {
		return err
	}
	if err := d.WriteText(env.stdout); err != nil {
		return err
	}
	if n := len(d.Changes); n > 0 {
		return fmt.Errorf("%d design values changed", n)
	}
	return nil
}

// readResults reads a result file, refusing one larger than any govern
// writes.
func readResults(path string) ([]byte, error) {
	fh, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("cannot read results: %v", err)
	}
	defer fh.Close()
	st, err := fh.Stat()
	if err != nil {
		return nil, fmt.Errorf("cannot read results: %v", err)
	}
	if st.IsDir() {
		return nil, fmt.Errorf("cannot read results: %s is a directory", path)
	}
	var buf bytes.Buffer
	if _, err := buf.ReadFrom(io.LimitReader(fh, report.MaxOutput+1)); err != nil {
		return nil, fmt.Errorf("cannot read results: %v", err)
	}
	if buf.Len() > report.MaxOutput {
		return nil, fmt.Errorf("%s: larger than %d MiB, more than govern writes: not a result file", path, report.MaxOutput>>20)
	}
	return buf.Bytes(), nil
}
