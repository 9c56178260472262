package main

import (
	"fmt"
	"io"
	"os"
	"sync"
	"sync/atomic"
	"time"

	"govern/envelope/analysis"
	"govern/envelope/report"
	"govern/envelope/report/files"
)

// progress keeps a one-line account of a long run on standard error:
// nothing for the first progressDelay, then the current phase and, where it
// counts, how far it has got, rewritten in place. It is used only when
// standard error is a terminal; a nil *progress does nothing.
type progress struct {
	w     io.Writer
	name  string
	start time.Time

	mu    sync.Mutex
	label string
	count *atomic.Int64
	total int64
	shown bool
	stop  chan struct{}
	done  chan struct{}
}

const (
	progressDelay = 1500 * time.Millisecond
	progressTick  = 250 * time.Millisecond
)

// newProgress returns a progress line on w, or nil when w is not a terminal
// or quiet is set.
func newProgress(w io.Writer, name string, quiet bool) *progress {
	if quiet || !isTerminal(w) {
		return nil
	}
	return startProgress(w, name, time.Now())
}

// startProgress starts the line on w as if the run began at start.
func startProgress(w io.Writer, name string, start time.Time) *progress {
	p := &progress{w: w, name: name, start: start, stop: make(chan struct{}), done: make(chan struct{})}
	go p.loop()
	return p
}

// isTerminal reports whether w is a character device, such as a terminal.
func isTerminal(w io.Writer) bool {
	f := files.Of(w)
	if f == nil {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}

// phase names what the run is doing now.
func (p *progress) phase(label string, total int64) {
	if p == nil {
		return
	}
	p.mu.Lock()
	p.label, p.count, p.total = label, nil, total
	p.mu.Unlock()
}

// track follows a phase of the analysis (analysis.Options.Progress).
func (p *progress) track(pr analysis.Progress) {
	if p == nil {
		return
	}
	p.mu.Lock()
	p.label, p.count, p.total = pr.Phase, pr.Done, pr.Total
	p.mu.Unlock()
}

func (p *progress) loop() {
	defer close(p.done)
	t := time.NewTicker(progressTick)
	defer t.Stop()
	for {
		select {
		case <-p.stop:
			return
		case now := <-t.C:
			if now.Sub(p.start) < progressDelay {
				continue
			}
			p.mu.Lock()
			line := fmt.Sprintf("%s: %s", p.name, p.label)
			if p.count != nil && p.total > 0 {
				line += fmt.Sprintf(" %d/%d", p.count.Load(), p.total)
			}
			p.shown = true
			p.mu.Unlock()
			fmt.Fprintf(p.w, "\r%s\033[K", report.Escape(line))
		}
	}
}

// end clears the line.
func (p *progress) end() {
	if p == nil {
		return
	}
	close(p.stop)
	<-p.done
	if p.shown {
		fmt.Fprint(p.w, "\r\033[K")
	}
}
