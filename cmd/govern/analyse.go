package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"runtime/debug"

	"govern/cmd/govern/modelfile"
	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// loadModel reads and validates the model file at path. A file past
// modelfile.MaxFileSize is refused before it is read.
func loadModel(path string) (*modelfile.Job, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("cannot read model: %v", err)
	}
	defer f.Close()
	st, err := f.Stat()
	if err != nil {
		return nil, fmt.Errorf("cannot read model: %v", err)
	}
	if st.IsDir() {
		return nil, fmt.Errorf("cannot read model: %s is a directory", path)
	}
	if st.Size() > modelfile.MaxFileSize {
		return nil, fmt.Errorf("%s: the file is %d bytes; the limit for a model is %d (%d MiB)", path, st.Size(), modelfile.MaxFileSize, modelfile.MaxFileSize>>20)
	}
	// Read into a buffer of the file's size, so that it is not grown and
	// copied on the way (a large file costs its size once, not twice).
	buf := bytes.NewBuffer(make([]byte, 0, st.Size()+bytes.MinRead))
	if _, err := buf.ReadFrom(io.LimitReader(f, modelfile.MaxFileSize+1)); err != nil {
		return nil, fmt.Errorf("cannot read model: %v", err)
	}
	src := buf.Bytes()
	// Decoding takes about 270 bytes an entry of the file at its peak
	// (docs/errors.md); with the collector's default target the heap may
	// grow to twice what is live, so it is held closer while reading.
	defer debug.SetGCPercent(debug.SetGCPercent(readGCPercent))
	return modelfile.ReadAt(filepath.Dir(path), filepath.Base(path), src)
}

// readGCPercent is the garbage collector's target while a model is read:
// the heap may grow to 1.25 times what is live, not twice.
const readGCPercent = 25

// analysis is a solved job with its envelopes.
type analysis struct {
	job   *modelfile.Job
	lay   *patterns.Layout
	sol   *frame.Solution
	env   *envelope.Envelope
	faces [][2]float64 // per member, its column faces at the start and the end (columnFaces)
	runs  []run        // the spans and cantilevers, whose deflections are reported

	runIndex []int    // member → index into runs, -1 for none; made by runOf
	sags     []runSag // the deflection of each run; made by runDeflection
}

// analyse places the patterned loads, solves every load case of the job
// and forms the envelopes.
func analyse(job *modelfile.Job) (*analysis, error) {
	return analyseWith(job, job.Patterns, nil, frame.Options{})
}

// analyseWith is analyse with the pattern placement mode and the solver
// options given, reporting progress to p when it is not nil.
func analyseWith(job *modelfile.Job, mode patterns.Mode, p *progress, opt frame.Options) (*analysis, error) {
	lay, err := patterns.Expand(job.Model, job.Patterned, job.Segments, mode)
	if err != nil {
		return nil, err
	}
	p.phase(fmt.Sprintf("solving %d loads (%d load cases, %d pattern pieces or arrangements)", len(lay.Model.Cases), len(job.Model.Cases), len(lay.Model.Cases)-len(job.Model.Cases)), 0)
	sol, err := frame.SolveWith(lay.Model, opt)
	if err != nil {
		return nil, acceptHint(err)
	}
	set := job.Settings
	faces := columnFaces(job.Model)
	set.Extra = faceStations(faces)
	rs := runs(job.Model)
	set.Lines = runLines(job.Model, rs)
	total := len(job.Model.Members) * set.Stations
	for _, xs := range set.Extra {
		total += len(xs)
	}
	set.Progress = p.counter(fmt.Sprintf("solved %d loads; enveloping stations", len(lay.Model.Cases)), int64(total))
	env, err := envelope.Compute(sol, job.Combinations, set, lay)
	if err != nil {
		return nil, err
	}
	return &analysis{job: job, lay: lay, sol: sol, env: env, faces: faces, runs: rs}, nil
}

// acceptHint adds to a refusal for ill-conditioning the flag that
// overrides it.
func acceptHint(err error) error {
	var ice *frame.IllConditionedError
	if errors.As(err, &ice) && ice.Acceptable {
		return fmt.Errorf("%w (govern run --accept-ill-conditioned solves it anyway, and every output then carries the estimate)", err)
	}
	return err
}

// conditionNote says, when the stiffness matrix is ill-conditioned enough
// to warn about, its estimated condition number and what it costs; every
// output carries it then. It is "" otherwise.
func (a *analysis) conditionNote() string {
	c := a.sol.Cond()
	if !(c > frame.WarnCond) {
		return ""
	}
	accepted := ""
	if c > frame.RefuseCond {
		accepted = fmt.Sprintf(", above the limit %.0e: solved only because --accept-ill-conditioned was given", frame.RefuseCond)
	}
	return fmt.Sprintf("Ill-conditioned stiffness matrix: estimated condition number %.2g%s; results may have lost about %.0f of their 16 significant digits.", c, accepted, math.Log10(c))
}
