package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"

	"govern/cmd/govern/modelfile"
	"govern/envelope"
	"govern/frame"
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
	return modelfile.Read(filepath.Base(path), src)
}

// analysis is a solved job with its envelopes.
type analysis struct {
	job *modelfile.Job
	sol *frame.Solution
	env *envelope.Envelope
}

// analyse solves every load case of the job and forms the envelopes.
func analyse(job *modelfile.Job) (*analysis, error) {
	sol, err := frame.Solve(job.Model)
	if err != nil {
		return nil, err
	}
	env, err := envelope.Compute(sol, job.Combinations, job.Settings)
	if err != nil {
		return nil, err
	}
	return &analysis{job: job, sol: sol, env: env}, nil
}
