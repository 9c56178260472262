package reduction

import "math"

// Form is the form of an equation of ASCE/SEI 7-16 that gives the
// reduction: in SI units (areas in m², the standard's values in
// parentheses) or US customary (ft²). The two differ slightly, the SI
// constants being rounded conversions.
type Form uint8

const (
	SI Form = iota // A in m², loads in kN/m²
	US             // A in ft², loads in psf
)

// Areas of ASCE/SEI 7-16 4.7.2 and 4.8.2 in each form.
var (
	minKLLArea = [2]float64{37.16, 400} // K_LL·A_T below which no reduction (4.7.2)
	floorCoef  = [2]float64{4.57, 15}   // L = Lo(0.25 + coef/√(K_LL·A_T)) (Eq. 4.7-1)
	roofA1     = [2]float64{18.58, 200} // R1 = 1 up to this A_T (Eq. 4.8-2)
	roofA2     = [2]float64{55.74, 600} // R1 = 0.6 from this A_T
	roofSlope  = [2]float64{0.011, 0.001}
	roofMin    = [2]float64{0.58, 12}  // 12 psf ≤ Lr ≤ 20 psf (Eq. 4.8-1)
	heavyLo    = [2]float64{4.79, 100} // 4.7.3: Lo over 100 psf
)

// Use is the occupancy of a reduced case, for ASCE/SEI 7-16 4.7.3 to
// 4.7.5.
type Use uint8

const (
	Office   Use = iota // any use 4.7.3-4.7.5 do not name
	Storage             // 4.7.3: live loads over 100 psf (storage)
	Garage              // 4.7.4: passenger vehicle garages
	Assembly            // 4.7.5: assembly uses
)

// Uses names the uses a case may state, in Use order.
var Uses = []string{"office", "storage", "garage", "assembly"}

// Limit names what governed a factor.
type Limit string

// The limits of a factor.
const (
	NoneApplied  Limit = ""                                       // the equation gave it
	SmallArea    Limit = "K_LL·A_T below 37.16 m² (400 ft²)"      // 4.7.2: not reduced
	OneFloor     Limit = "0.50 for one floor"                     // 4.7.2
	TwoFloors    Limit = "0.40 for two or more floors"            // 4.7.2
	HeavyOrCars  Limit = "0.80 (4.7.3/4.7.4, two or more floors)" // at most 20 %
	NotReducible Limit = "use not reduced (4.7.3-4.7.5)"
	RoofMin      Limit = "Lr not below 0.58 kN/m² (12 psf)"
	ENCategory   Limit = "category not reduced (EN 1991-1-1 6.3.1.2(10))"
	ENCD         Limit = "0.60 for categories C and D"
	ENOne        Limit = "not above 1.0"
	ENFewStoreys Limit = "αn only for more than two storeys"
)

// Floor returns the factor L/Lo of ASCE/SEI 7-16 4.7.2 (Eq. 4.7-1) for a
// member with live load element factor kll (Table 4.7-1) and tributary
// area at (in form f's area unit) supporting floors floors (at least 1),
// under the use u with unreduced load lo (form f's load unit; 4.7.3 when
// over 100 psf), and the limit that governed.
func Floor(f Form, kll, at float64, floors int, u Use, lo float64) (float64, Limit) {
	if u == Assembly {
		return 1, NotReducible // 4.7.5
	}
	heavy := u == Storage || u == Garage || lo > heavyLo[f]
	if heavy && floors < 2 {
		return 1, NotReducible // 4.7.3, 4.7.4
	}
	ka := kll * at
	if !(ka >= minKLLArea[f]) {
		return 1, SmallArea
	}
	r := 0.25 + floorCoef[f]/math.Sqrt(ka)
	lim, which := 0.5, OneFloor
	if floors >= 2 {
		lim, which = 0.4, TwoFloors
	}
	if heavy {
		lim, which = 0.8, HeavyOrCars
	}
	if r < lim {
		return lim, which
	}
	if r > 1 {
		return 1, SmallArea
	}
	return r, NoneApplied
}

// KLL returns the live load element factor of ASCE/SEI 7-16 Table 4.7-1
// for a column (else a beam) in the position described: interior,
// exterior without cantilever slabs 4; edge column with cantilever slabs
// 3; corner column with cantilever slabs 2; interior beams and edge beams
// without cantilever slabs 2; every other member (edge beams with
// cantilever slabs, cantilever beams) 1.
func KLL(column bool, p Position) float64 {
	if column {
		switch p {
		case EdgeCantilever:
			return 3
		case CornerCantilever:
			return 2
		}
		return 4
	}
	switch p {
	case Interior, Edge:
		return 2
	}
	return 1
}

// Position is where a member is in plan, for Table 4.7-1.
type Position uint8

const (
	Interior         Position = iota // interior member
	Edge                             // exterior or edge member, no cantilever slab
	EdgeCantilever                   // edge member with a cantilever slab
	CornerCantilever                 // corner column with cantilever slabs
	Cantilever                       // a cantilever beam
)

// Roof returns the factor Lr/Lo of ASCE/SEI 7-16 4.8.2 (Eq. 4.8-1) for
// a roof member with tributary area at and slope rise on 12, under the
// unreduced roof live load lo (form f's units), with the limit that
// governed: R1 (Eq. 4.8-2), R2 (Eq. 4.8-3) and Lr not below 12 psf. A
// factor is never above 1: a load below 12 psf is not raised. The upper
// limit of 20 psf bounds the ordinary roof load the clause is for; a
// heavier roof load is not capped by it (an occupied roof is reduced as
// a floor, 4.8.3).
func Roof(f Form, at, rise, lo float64) (float64, Limit) {
	r1 := 1.0
	switch {
	case at >= roofA2[f]:
		r1 = 0.6
	case at > roofA1[f]:
		r1 = 1.2 - roofSlope[f]*at
	}
	r2 := 1.0
	switch {
	case rise >= 12:
		r2 = 0.6
	case rise > 4:
		r2 = 1.2 - 0.05*rise
	}
	lr := lo * r1 * r2
	if lr < roofMin[f] {
		if lo <= roofMin[f] {
			return 1, RoofMin
		}
		return roofMin[f] / lo, RoofMin
	}
	return r1 * r2, NoneApplied
}
