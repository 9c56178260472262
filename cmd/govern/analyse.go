package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"

	"govern/cmd/govern/modelfile"
	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// loadModel reads and validates the model file at path.
func loadModel(path string) (*modelfile.Job, error) {
	src, err := os.ReadFile(path)
	if err != nil {
		var pe *os.PathError
		if errors.As(err, &pe) {
			return nil, fmt.Errorf("cannot read model: %v", err)
		}
		return nil, err
	}
	return modelfile.ReadAt(filepath.Dir(path), filepath.Base(path), src)
}

// analysis is a solved job with its envelopes.
type analysis struct {
	job *modelfile.Job
	lay *patterns.Layout
	sol *frame.Solution
	env *envelope.Envelope
}

// analyse places the patterned loads, solves every load case of the job
// and forms the envelopes.
func analyse(job *modelfile.Job) (*analysis, error) {
	return analyseWith(job, job.Patterns, nil)
}

// analyseWith is analyse with the pattern placement mode given, reporting
// progress to p when it is not nil.
func analyseWith(job *modelfile.Job, mode patterns.Mode, p *progress) (*analysis, error) {
	lay, err := patterns.Expand(job.Model, job.Patterned, job.Segments, mode)
	if err != nil {
		return nil, err
	}
	p.phase(fmt.Sprintf("solving %d loads (%d load cases, %d pattern pieces or arrangements)", len(lay.Model.Cases), len(job.Model.Cases), len(lay.Model.Cases)-len(job.Model.Cases)), 0)
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		return nil, err
	}
	set := job.Settings
	set.Progress = p.counter(fmt.Sprintf("solved %d loads; enveloping stations", len(lay.Model.Cases)), int64(len(job.Model.Members)*set.Stations))
	env, err := envelope.Compute(sol, job.Combinations, set, lay)
	if err != nil {
		return nil, err
	}
	return &analysis{job: job, lay: lay, sol: sol, env: env}, nil
}
