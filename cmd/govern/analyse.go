package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"

	"govern/cmd/govern/modelfile"
	"govern/envelope"
	"govern/frame"
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
	src, err := io.ReadAll(io.LimitReader(f, modelfile.MaxFileSize+1))
	if err != nil {
		return nil, fmt.Errorf("cannot read model: %v", err)
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
