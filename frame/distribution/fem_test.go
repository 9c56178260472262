package distribution

import (
	"testing"

	"govern/frame"
)

func TestFixedEndMoments(t *testing.T) {
	// Fixed-end moment table (for example Hibbeler, Structural Analysis,
	// inside back cover; recalled from memory): the end moments of a beam
	// clamped at both ends, magnitudes at A (left) and B (right).
	const l, w, p = 6.0, 10.0, 40.0
	for _, tc := range []struct {
		name   string
		load   frame.MemberLoad
		ma, mb float64
	}{
		{"uniform: wL^2/12 both ends", udl(0, w, l), w * l * l / 12, w * l * l / 12},
		{"point at a = 2: Pab^2/L^2, Pa^2b/L^2", frame.MemberLoad{Point: true, At: 2, P: p}, p * 2 * 16 / 36, p * 4 * 4 / 36},
		{"triangular rising to B: wL^2/30, wL^2/20", frame.MemberLoad{To: l, WEnd: w}, w * l * l / 30, w * l * l / 20},
		{"uniform over the left half: 11wL^2/192, 5wL^2/192", frame.MemberLoad{To: l / 2, W: w, WEnd: w}, 11 * w * l * l / 192, 5 * w * l * l / 192},
		{"uniform over a = 2 from A: wa^2(6L^2-8La+3a^2)/12L^2, wa^3(4L-3a)/12L^2",
			frame.MemberLoad{To: 2, W: w, WEnd: w}, w * 4 * (6*l*l - 16*l + 12) / (12 * l * l), w * 8 * (4*l - 6) / (12 * l * l)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			mo := beam(l)
			mo.Nodes[0].Support, mo.Nodes[1].Support = frame.Fixed, frame.Fixed
			mo.Cases[0].MemberLoads = []frame.MemberLoad{tc.load}
			r := solve(t, mo)
			s, e := r.EndMoments(0, 0)
			// Gravity load on a beam drawn left to right: counter-clockwise
			// on the member at A, clockwise at B.
			if !near(s, tc.ma, closeTol) || !near(e, -tc.mb, closeTol) {
				t.Errorf("end moments %g, %g; want %g, %g", s, e, tc.ma, -tc.mb)
			}
		})
	}
}
