package analysis

import (
	"testing"

	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// The analysis's terms of the memory estimate (memory.go) on the portal
// of portalJob, counted by hand from the formula documented there: 3
// members at 5 stations, no column faces, no pattern pieces and no
// service combination (a station of StationBytes(0, false, false)); 4
// nodes and the 2 columns of its one storey; 6 equations; one
// combination.
func TestMemoryTermsByHand(t *testing.T) {
	sb := envelope.StationBytes(0, false, false)
	// Lanczos: 2 vectors of 6 + 6 × 3 values a step, 12 steps for the one
	// combination: 16 × 24 × 12 bytes. The storey's solve: 6 × (1 + 2)
	// values. The envelopes of the nodes and drifts: 6 stations' worth.
	held := 16*24*12 + 8*6*3 + 6*sb
	for _, tc := range []struct {
		name      string
		method    Method
		perMember float64
		solutions int
	}{
		{"first order", Method{}, 5 * sb, 1},
		// Its own solution and envelopes beside the first-order ones.
		{"second order", Method{SecondOrder: true}, 10 * sb, 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			job := portalJob(tc.method, NoNotional)
			sv := favourableSplit(job)
			lay, err := patterns.Expand(sv.model, sv.patterned, job.Segments, job.Patterns)
			if err != nil {
				t.Fatal(err)
			}
			opt := memoryOptions(job, sv, lay, Options{})
			if opt.PerMember != tc.perMember || opt.Solutions != tc.solutions {
				t.Errorf("%.0f bytes a member, %d solutions; want %.0f and %d", opt.PerMember, opt.Solutions, tc.perMember, tc.solutions)
			}
			if got := opt.Held(frame.Info{Equations: 6, Bandwidth: 5, Columns: 1}); got != held {
				t.Errorf("held %.0f bytes, want %.0f", got, held)
			}
		})
	}
}
