package distribution

import (
	"math"

	"govern/frame"
)

// memberLoads is the reduction of one case's loads on one member: fixed-end
// moments and the first two moments of the transverse load about the start.
type memberLoads struct {
	fs, fe float64 // fixed-end moments at start and end, counter-clockwise on the member
	q0     float64 // total transverse load (local +y)
	q1     float64 // its moment about the start: ∫ ξ q dξ
	gx, gy float64 // total load along global X and Y
	a0     float64 // total axial load (local +x)
	a1     float64 // its moment about the start: ∫ ξ a dξ
}

// add adds the loads of case cs that lie on member m of length l with
// direction cosines c, s.
func (r *memberLoads) add(cs *frame.Case, m int, l, c, s float64) {
	for i := range cs.MemberLoads {
		ld := &cs.MemberLoads[i]
		if ld.Member != m {
			continue
		}
		// Global components per unit of the load's value.
		var ux, uy float64
		switch ld.Direction {
		case frame.Gravity:
			uy = -1
		case frame.GlobalX:
			ux = 1
		}
		t := -s*ux + c*uy // transverse (local y) component per unit value
		ax := c*ux + s*uy // axial (local x) component per unit value
		if ld.Point {
			a := math.Max(0, math.Min(l, ld.At))
			p := ld.P * t
			r.fs += -p * a * (l - a) * (l - a) / (l * l)
			r.fe += p * a * a * (l - a) / (l * l)
			r.q0 += p
			r.q1 += p * a
			r.gx += ld.P * ux
			r.gy += ld.P * uy
			r.a0 += ld.P * ax
			r.a1 += ld.P * ax * a
			continue
		}
		a, b := math.Max(0, ld.From), math.Min(l, ld.To)
		if !(b > a) {
			continue
		}
		// Intensity w(ξ) = p0 + p1 ξ, from W at From to WEnd at To.
		p1 := 0.0
		if ld.To > ld.From {
			p1 = (ld.WEnd - ld.W) / (ld.To - ld.From)
		}
		p0 := ld.W - p1*ld.From
		r.fs += -t * (fixedStart(p0, p1, l, b) - fixedStart(p0, p1, l, a)) / (l * l)
		r.fe += t * (fixedEnd(p0, p1, l, b) - fixedEnd(p0, p1, l, a)) / (l * l)
		total := p0*(b-a) + p1*(b*b-a*a)/2           // ∫ w dξ
		first := p0*(b*b-a*a)/2 + p1*(b*b*b-a*a*a)/3 // ∫ ξ w dξ
		r.q0 += t * total
		r.q1 += t * first
		r.gx += ux * total
		r.gy += uy * total
		r.a0 += ax * total
		r.a1 += ax * first
	}
}

// fixedStart is an antiderivative of (p0 + p1 ξ) ξ (L − ξ)², whose integral
// over the loaded length, divided by L², is the magnitude of the fixed-end
// moment at the start (the influence function of a clamped-clamped beam).
func fixedStart(p0, p1, l, x float64) float64 {
	x2 := x * x
	return p0*(l*l*x2/2-2*l*x2*x/3+x2*x2/4) + p1*(l*l*x2*x/3-l*x2*x2/2+x2*x2*x/5)
}

// fixedEnd is an antiderivative of (p0 + p1 ξ) ξ² (L − ξ), the same for the
// end moment.
func fixedEnd(p0, p1, l, x float64) float64 {
	x2 := x * x
	return p0*(l*x2*x/3-x2*x2/4) + p1*(l*x2*x2/4-x2*x2*x/5)
}
