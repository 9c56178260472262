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
// nodes and the 2 columns of its one storey; 6 equations, half-bandwidth
// 5; one combination.
func TestMemoryTermsByHand(t *testing.T) {
	sb := envelope.StationBytes(0, false, false)
	for _, tc := range []struct {
		name      string
		method    Method
		perMember float64
		solutions int
		growth    float64
		held      float64
	}{
		// The nodes' and drifts' envelopes, 6 stations' worth, grown by
		// 1.2 as the members'.
		{"first order", Method{}, 5 * sb, 0, 1.2, 1.2 * 6 * sb},
		// Its own solution and envelopes beside the first-order ones, the
		// heap grown to twice (frame's default); its iteration's last
		// solve, 2.5 band matrices of 6 × 6 values.
		{"second order", Method{SecondOrder: true}, 10 * sb, 2, 0, 2*6*sb + 2.5*8*6*6},
	} {
		t.Run(tc.name, func(t *testing.T) {
			job := portalJob(tc.method, NoNotional)
			sv := favourableSplit(job)
			lay, err := patterns.Expand(sv.model, sv.patterned, job.Segments, job.Patterns)
			if err != nil {
				t.Fatal(err)
			}
			opt := memoryOptions(job, sv, lay, Options{})
			if opt.PerMember != tc.perMember || opt.Solutions != tc.solutions || opt.Growth != tc.growth {
				t.Errorf("%.0f bytes a member, %d solutions, growth %g; want %.0f, %d and %g", opt.PerMember, opt.Solutions, opt.Growth, tc.perMember, tc.solutions, tc.growth)
			}
			if got := opt.Held(frame.Info{Equations: 6, Bandwidth: 5, Columns: 1}); got != tc.held {
				t.Errorf("held %.0f bytes, want %.0f", got, tc.held)
			}
		})
	}
}
