package main

import (
	"bytes"
	"strings"
	"sync"
	"sync/atomic"
	"testing"
	"time"

	"govern/envelope/analysis"
)

// lockedBuffer is a bytes.Buffer safe for the progress goroutine.
type lockedBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (l *lockedBuffer) Write(p []byte) (int, error) {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.b.Write(p)
}

func (l *lockedBuffer) String() string {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.b.String()
}

func TestProgressLine(t *testing.T) {
	t.Run("off when standard error is not a terminal or quiet", func(t *testing.T) {
		if p := newProgress(&bytes.Buffer{}, "govern run", false); p != nil {
			t.Error("progress on a buffer")
		}
		if p := newProgress(nil, "govern run", true); p != nil {
			t.Error("progress with --quiet")
		}
		var p *progress // a nil progress does nothing
		p.phase("x", 1)
		p.track(analysis.Progress{Phase: "x", Total: 1, Done: new(atomic.Int64)})
		p.end()
	})
	t.Run("a long run shows its phase and count, then clears the line", func(t *testing.T) {
		var buf lockedBuffer
		p := startProgress(&buf, "govern run", time.Now().Add(-time.Hour))
		c := new(atomic.Int64)
		p.track(analysis.Progress{Phase: "enveloping stations", Total: 10, Done: c})
		c.Add(4)
		deadline := time.Now().Add(5 * time.Second)
		for !strings.Contains(buf.String(), "govern run: enveloping stations 4/10") && time.Now().Before(deadline) {
			time.Sleep(10 * time.Millisecond)
		}
		p.end()
		out := buf.String()
		if !strings.Contains(out, "\rgovern run: enveloping stations 4/10") || !strings.HasSuffix(out, "\r\033[K") {
			t.Errorf("progress output %q", out)
		}
	})
}
