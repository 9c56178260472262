package main

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"math"
	"strconv"
	"strings"

	"govern/cmd/govern/modelfile"
	"govern/envelope/report"
	"govern/envelope/report/files"
)

type newFlags struct {
	bays, storeys string
	spacing       optionalFloat
	title         string
	units         string
}

// optionalFloat is a number flag that records whether it was given.
type optionalFloat struct {
	v   float64
	set bool
}

func (o *optionalFloat) String() string {
	if o == nil || !o.set {
		return ""
	}
	return strconv.FormatFloat(o.v, 'g', -1, 64)
}

func (o *optionalFloat) Set(s string) error {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return errors.New("not a number")
	}
	o.v, o.set = v, true
	return nil
}

// maxGridLines is the most bays or storeys a model may have (the model
// reader's limit on [grid]); maxNewMembers the most members new writes, so
// that a slip such as 6x2000 for both cannot ask for millions.
const (
	maxGridLines  = 2000
	maxNewMembers = 100000
)

var cmdNew = &command{
	name:  "new",
	usage: "--bays LIST --storeys LIST [--units kN,m | N,mm | kip,ft] [--spacing S] [--title TEXT] [FILE]",
	short: "write a starting model of a regular frame to edit",
	long: `
New writes a starting model of a regular reinforced concrete frame, in kN
and m (or, with --units, in N and mm or in kip and ft, with sections of
that system's sizes), for you to edit: the grid of bays and storeys, a typical column and
beam section (with their depths, so that beams get stations at the column
faces), a dead load case, a floor live and a roof live case placed span by
span, a wind case from either side, the strength combinations of ASCE/SEI
7-16 section 2.3.1 and a service combination for deflections. Every
number in it is a placeholder, commented, to be checked and replaced.

Lists are comma-separated lengths in the length unit of --units (m by
default); "3.6x3" repeats 3.6 three times:

	govern new --bays 7.2,6,7.2 --storeys 4.5,3.6x3 office.toml
	govern new --units kip,ft --bays 24,20,24 --storeys 14,12x3 office.toml

each write a frame of three bays and four storeys. In kip and ft the
values US practice gives in other units are written with them, such as
E = "3600 ksi", I = "18432 in4" and q = "125 psf", which the reader
converts. Without FILE, or with -,
the model goes to standard output. An existing file is never overwritten.`,
	setup: func(fs *flag.FlagSet) func(*environ, []string) error {
		f := &newFlags{}
		fs.StringVar(&f.bays, "bays", "", "bay widths, left to right: `LIST` of lengths in the length unit of --units, such as 7.2,6,7.2 or 8x4")
		fs.StringVar(&f.storeys, "storeys", "", "storey heights, bottom to top: `LIST` of lengths, such as 4.5,3.6x3")
		fs.Var(&f.spacing, "spacing", "distance between parallel frames, for the area loads (default 6 m, 6000 mm or 20 ft)")
		fs.StringVar(&f.units, "units", "kN,m", "the model's force and length `UNITS`: kN,m, N,mm or kip,ft")
		fs.StringVar(&f.title, "title", "", "the model's title (default: the numbers of bays and storeys)")
		return func(env *environ, args []string) error { return newModel(env, f, args) }
	},
}

// newModel is govern new.
func newModel(env *environ, f *newFlags, args []string) error {
	if len(args) > 1 {
		return usagef("need at most one output file, got %d arguments", len(args))
	}
	if f.bays == "" || f.storeys == "" {
		return usagef("--bays and --storeys are both needed")
	}
	bays, err := parseLengths("--bays", f.bays)
	if err != nil {
		return err
	}
	storeys, err := parseLengths("--storeys", f.storeys)
	if err != nil {
		return err
	}
	if n := (2*len(bays) + 1) * len(storeys); n > maxNewMembers {
		return usagef("%d bays and %d storeys make %d members; at most %d", len(bays), len(storeys), n, maxNewMembers)
	}
	sys, ok := modelfile.ParseStarterUnits(f.units)
	if !ok {
		return usagef("--units %q: must be kN,m, N,mm or kip,ft", f.units)
	}
	spacing := sys.DefaultSpacing()
	if f.spacing.set {
		spacing = f.spacing.v
	}
	if !(spacing > 0) || math.IsInf(spacing, 0) {
		return usagef("--spacing %g: must be a length greater than zero", spacing)
	}
	s := modelfile.Starter{Title: f.title, Units: sys, Bays: bays, Storeys: storeys, Spacing: spacing, Faces: true, Service: true}
	if s.Title == "" {
		s.Title = fmt.Sprintf("New frame: %d bays, %d storeys", len(bays), len(storeys))
	}
	var src bytes.Buffer
	if err := modelfile.WriteStarter(&src, s); err != nil {
		return err
	}
	// What is written must read back: the reader is the judge.
	if _, err := modelfile.Read("new model", src.Bytes()); err != nil {
		panic("govern new: the model written does not read back: " + err.Error())
	}
	path := "-"
	if len(args) == 1 {
		path = args[0]
	}
	return writeModelFile(env, path, src.Bytes(), fmt.Sprintf(": %d bays, %d storeys, in %s; every number in it is a placeholder to check and replace", len(bays), len(storeys), strings.ReplaceAll(sys.String(), ",", " and ")))
}

// writeModelFile writes a model file that new or demo --write made: to
// standard output for "-" or a path that names it (such as /dev/stdout),
// else to a new file at path, never over an existing one, saying so with
// what after the path.
func writeModelFile(env *environ, path string, src []byte, what string) error {
	if files.StdoutPath(env.stdout, path) == "-" {
		_, err := env.stdout.Write(src)
		return err
	}
	if files.Exists(path) {
		return fmt.Errorf("%s exists; not overwriting it", path)
	}
	if err := files.WriteNew(path, src); err != nil {
		return err
	}
	_, err := fmt.Fprintf(env.stdout, "wrote %s%s\n", report.Escape(path), what)
	return err
}

// parseLengths reads a comma-separated list of lengths, where "3.6x3"
// stands for 3.6 three times. Problems are usage errors naming the flag and
// the item at fault.
func parseLengths(flagName, s string) ([]float64, error) {
	var out []float64
	for i, item := range strings.Split(s, ",") {
		item = strings.TrimSpace(item)
		bad := func(format string, args ...any) error {
			return usagef("%s %q: item %d, %q: %s", flagName, s, i+1, item, fmt.Sprintf(format, args...))
		}
		if item == "" {
			return nil, usagef("%s %q: item %d is empty", flagName, s, i+1)
		}
		value, count := item, "1"
		if j := strings.IndexAny(item, "xX"); j >= 0 {
			value, count = strings.TrimSpace(item[:j]), strings.TrimSpace(item[j+1:])
		}
		v, err := strconv.ParseFloat(value, 64)
		if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
			return nil, bad("%q is not a length", value)
		}
		if v <= 0 {
			return nil, bad("a length must be greater than zero")
		}
		n, err := strconv.Atoi(count)
		if err != nil || n < 1 || n > maxGridLines {
			return nil, bad("the count after x must be a whole number from 1 to %d", maxGridLines)
		}
		if len(out)+n > maxGridLines {
			return nil, usagef("%s %q: more than %d in all", flagName, s, maxGridLines)
		}
		for range n {
			out = append(out, v)
		}
	}
	return out, nil
}
