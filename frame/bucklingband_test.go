package frame

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// TestBandSolveLanesLast checks the band substitutions of the Lanczos
// iteration stopping at each row's last entry that is not zero
// (lastCols) against the same over the whole band: the same numbers to
// the last bit, with and without AVX, for 1 to 6 columns (the one-column
// path, four at a time, and the rest), on the factors of random frames
// (fixed seed), whose rows end short of the band; some right-hand
// entries exact zeros (a zero term added to a partial sum that is +0).
// And the solution times UᵀU, formed directly from the factor, gives
// back the right-hand side to 1e-9 of its largest entry.
func TestBandSolveLanesLast(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 18))
	for _, size := range [][2]int{{3, 4}, {8, 6}} {
		mo, _ := randomFrame(rng, size[0], size[1])
		b, err := NewBuckling(mo)
		if err != nil {
			t.Fatal(err)
		}
		n, kb := b.n, b.kb
		full := make([]int32, n)
		short := 0
		for i := range n {
			full[i] = int32(min(kb, n-1-i))
			if b.last[i] < full[i] {
				short++
			}
		}
		if short == 0 {
			t.Fatalf("%v frame: no row ends short of the band", size)
		}
		for _, avx := range []bool{true, false} {
			if avx && !useAVX {
				continue
			}
			for k := 1; k <= 6; k++ {
				t.Run(fmt.Sprintf("%dx%d/avx=%v/k=%d", size[0], size[1], avx, k), func(t *testing.T) {
					defer func(was bool) { useAVX = was }(useAVX)
					useAVX = avx
					rhs := make([]float64, n*k)
					for i := range rhs {
						if rng.IntN(5) > 0 {
							rhs[i] = rng.Float64() - 0.5
						}
					}
					got, want := append([]float64(nil), rhs...), append([]float64(nil), rhs...)
					bandSolveLanes(b.u, b.lt, n, kb, got, k, b.first, b.last)
					bandSolveLanes(b.u, b.lt, n, kb, want, k, b.first, full)
					for i := range got {
						if math.Float64bits(got[i]) != math.Float64bits(want[i]) {
							t.Fatalf("entry %d: %.17g, over the whole band %.17g", i, got[i], want[i])
						}
					}
					// Uᵀ U x = rhs, column by column.
					w := kb + 1
					for c := range k {
						ux := make([]float64, n)
						for i := range n {
							for j := 0; j <= min(kb, n-1-i); j++ {
								ux[i] += b.u[i*w+j] * got[(i+j)*k+c]
							}
						}
						scale := 0.0
						for i := range n {
							scale = max(scale, math.Abs(rhs[i*k+c]))
						}
						for j := range n {
							s := 0.0
							for i := max(0, j-kb); i <= j; i++ {
								s += b.u[i*w+j-i] * ux[i]
							}
							if math.Abs(s-rhs[j*k+c]) > 1e-9*scale {
								t.Fatalf("column %d, row %d: UᵀU x is %g, the right-hand side %g", c, j, s, rhs[j*k+c])
							}
						}
					}
				})
			}
		}
	}
}
