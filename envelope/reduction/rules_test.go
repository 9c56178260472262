package reduction

import (
	"math"
	"testing"
)

const ruleTol = 5e-5 // the standards' worked values are given to four places

func near(a, b, tol float64) bool { return math.Abs(a-b) <= tol }

// ASCE/SEI 7-16 4.7.2, Eq. 4.7-1 and Table 4.7-1.
func TestFloor(t *testing.T) {
	for _, c := range []struct {
		name   string
		f      Form
		kll    float64
		at     float64
		floors int
		want   float64
		lim    Limit
	}{
		// Interior column, 9 m × 9 m bays, K_LL = 4: 4 × 81 = 324 m²:
		// 0.25 + 4.57/18 = 0.5039 (Eq. 4.7-1, SI form).
		{"interior column one floor", SI, 4, 81, 1, 0.5039, NoneApplied},
		// Two floors: 648 m²: 0.25 + 4.57/√648 = 0.4295.
		{"interior column two floors", SI, 4, 162, 2, 0.4295, NoneApplied},
		// Three floors: 972 m²: raw 0.3966, the 0.40 limit governs (4.7.2).
		{"interior column three floors", SI, 4, 243, 3, 0.40, TwoFloors},
		// One floor below 0.50: K_LL·A_T = 4 × 400 m² gives 0.364: 0.50 governs.
		{"one floor limit", SI, 4, 400, 1, 0.5, OneFloor},
		// Interior beam 30 ft × 10 ft, K_LL = 2: 600 ft²: 0.25 + 15/√600 = 0.86237.
		{"interior beam 600 ft²", US, 2, 300, 1, 0.86237, NoneApplied},
		// Edge beam with K_LL·A_T = 300 ft² < 400 ft²: not reduced.
		{"edge beam 300 ft²", US, 1, 300, 1, 1, SmallArea},
	} {
		t.Run(c.name, func(t *testing.T) {
			got, lim := Floor(c.f, c.kll, c.at, c.floors, Office, 2.4)
			if !near(got, c.want, ruleTol) || lim != c.lim {
				t.Errorf("Floor = %.5f (%q), want %.5f (%q)", got, lim, c.want, c.lim)
			}
		})
	}
	t.Run("raw three floors", func(t *testing.T) {
		// ASCE/SEI 7-16 Eq. 4.7-1: 0.25 + 4.57/√972 = 0.3966 before the limit.
		if raw := 0.25 + floorCoef[SI]/math.Sqrt(972); !near(raw, 0.3966, ruleTol) {
			t.Errorf("raw = %.5f, want 0.3966", raw)
		}
	})
}

// ASCE/SEI 7-16 4.7.3 to 4.7.5.
func TestFloorUses(t *testing.T) {
	for _, c := range []struct {
		name   string
		u      Use
		lo     float64
		floors int
		want   float64
	}{
		{"assembly not reduced (4.7.5)", Assembly, 2.4, 3, 1},
		{"heavy one floor not reduced (4.7.3)", Office, 6, 1, 1},
		{"heavy two floors at most 20 % (4.7.3)", Office, 6, 2, 0.8},
		{"storage two floors at most 20 % (4.7.3)", Storage, 2.4, 3, 0.8},
		{"garage one floor not reduced (4.7.4)", Garage, 2.4, 1, 1},
		{"garage two floors at most 20 % (4.7.4)", Garage, 2.4, 2, 0.8},
	} {
		t.Run(c.name, func(t *testing.T) {
			if got, _ := Floor(SI, 4, 500, c.floors, c.u, c.lo); got != c.want {
				t.Errorf("Floor = %g, want %g", got, c.want)
			}
		})
	}
}

// ASCE/SEI 7-16 Table 4.7-1.
func TestKLL(t *testing.T) {
	for _, c := range []struct {
		column bool
		p      Position
		want   float64
	}{
		{true, Interior, 4}, {true, Edge, 4}, {true, EdgeCantilever, 3}, {true, CornerCantilever, 2},
		{false, Interior, 2}, {false, Edge, 2}, {false, EdgeCantilever, 1}, {false, Cantilever, 1},
	} {
		if got := KLL(c.column, c.p); got != c.want {
			t.Errorf("KLL(column %v, position %d) = %g, want %g", c.column, c.p, got, c.want)
		}
	}
}

// ASCE/SEI 7-16 4.8.2, Eq. 4.8-1 to 4.8-3.
func TestRoof(t *testing.T) {
	t.Run("400 ft² at 6 on 12", func(t *testing.T) {
		// R1 = 1.2 − 0.001 × 400 = 0.8; R2 = 1.2 − 0.05 × 6 = 0.9;
		// Lr = 20 × 0.8 × 0.9 = 14.4 psf.
		f, _ := Roof(US, 400, 6, 20)
		if lr := 20 * f; !near(lr, 14.4, 1e-9) {
			t.Errorf("Lr = %g psf, want 14.4", lr)
		}
	})
	t.Run("small flat roof not reduced", func(t *testing.T) {
		// A_T ≤ 200 ft² and flat: R1 = R2 = 1.
		if f, _ := Roof(US, 150, 0, 20); f != 1 {
			t.Errorf("factor = %g, want 1", f)
		}
	})
	t.Run("12 psf floor", func(t *testing.T) {
		// A_T ≥ 600 ft², 12 on 12: 20 × 0.6 × 0.6 = 7.2 psf, raised to 12 psf.
		f, lim := Roof(US, 1000, 12, 20)
		if !near(20*f, 12, 1e-9) || lim != RoofMin {
			t.Errorf("Lr = %g psf (%q), want 12", 20*f, lim)
		}
	})
	t.Run("SI form", func(t *testing.T) {
		// 18.58 m² or less, flat: R1 = 1; 55.74 m² or more: 0.6.
		if f, _ := Roof(SI, 60, 0, 1.0); !near(f, 0.6, 1e-12) {
			t.Errorf("factor = %g, want 0.6", f)
		}
	})
}

// EN 1991-1-1 6.3.1.2(10), Eq. (6.1).
func TestAlphaA(t *testing.T) {
	for _, c := range []struct {
		cat  string
		a    float64
		want float64
	}{
		// ψ0 = 0.7: 5/7 × 0.7 = 0.5; + 10/A.
		{"B", 50, 0.70}, {"B", 100, 0.60}, {"B", 200, 0.55},
		{"C", 200, 0.60}, {"D", 200, 0.60}, // categories C and D not below 0.6
		{"E", 200, 1}, // E to H not reduced
		{"A", 5, 1},   // not above 1.0
	} {
		if got, _ := AlphaA(c.cat, 0.7, c.a); !near(got, c.want, 1e-12) {
			t.Errorf("αA(%s, A = %g) = %g, want %g", c.cat, c.a, got, c.want)
		}
	}
}

// EN 1991-1-1 6.3.1.2(11), Eq. (6.2).
func TestAlphaN(t *testing.T) {
	for _, c := range []struct {
		n    int
		want float64
	}{{2, 1}, {3, 0.90}, {5, 0.82}, {10, 0.76}} {
		if got, _ := AlphaN("B", 0.7, c.n); !near(got, c.want, 1e-12) {
			t.Errorf("αn(n = %d) = %g, want %g", c.n, got, c.want)
		}
	}
}
