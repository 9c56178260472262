package frame

import (
	"fmt"
	"runtime"
	"slices"
	"testing"
)

// The right-hand sides formed block by block in the packed rows
// (rhsBlock, solveBlocks) are those formed whole and packed, and the
// solution is that of the whole right-hand side substituted as before
// (rhs, then bandSolveScaled), to the last bit: random frames with
// member, node and thermal loads and settlements of supports (imposed
// displacements), first and second order, 1 to 70 cases (a partial block,
// whole ones and a partial one), on one processor or two, with and
// without AVX.
func TestBlockRHSIsTheWholeRHS(t *testing.T) {
	kernels := []bool{false}
	if hasAVX() {
		kernels = append(kernels, true)
	}
	defer func(v bool) { useAVX = v }(useAVX)
	for _, seed := range []uint64{2, 9} {
		mo, axial, first, more := sharedFrame(seed)
		var cases []Case
		for k := 0; len(cases) < 70; k++ {
			cases = append(cases, renamed(first, fmt.Sprint(k))...)
			cases = append(cases, renamed(more, fmt.Sprint(k, "b"))...)
		}
		for _, nc := range []int{2, 5, 33, 70} {
			for _, second := range []bool{false, true} {
				var opt Options
				if second {
					opt.Axial = axial
				}
				m2 := *mo
				m2.Cases = slices.Clone(cases[:nc])
				for _, procs := range []int{1, 2} {
					for _, avx := range kernels {
						t.Run(fmt.Sprintf("seed %d/%d cases/second %v/GOMAXPROCS=%d/avx=%v", seed, nc, second, procs, avx), func(t *testing.T) {
							defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
							useAVX = avx
							sol, err := SolveWith(&m2, opt)
							if err != nil {
								t.Fatal(err)
							}
							n := sol.dofs
							kb := min(sol.band, n-1)
							want := sol.rhs(n)
							// Packed and scaled by the block former, against
							// the whole right-hand side packed and scaled.
							buf := make([]float64, n*solveBlock)
							for lo := 0; lo < nc; lo += solveBlock {
								hi := min(lo+solveBlock, nc)
								sol.rhsBlock(buf, lo, hi, solveBlock, sol.pow2)
								for i := range n {
									for c := range solveBlock {
										w := 0.0
										if lo+c < hi {
											w = want[i*nc+lo+c] * sol.pow2[i]
										}
										if got := buf[i*solveBlock+c]; got != w {
											t.Fatalf("block at %d: row %d column %d: %v, whole %v", lo, i, c, got, w)
										}
									}
								}
							}
							if !bandSolveScaled(sol.factor, n, kb, want, nc, sol.pow2) {
								t.Fatal("not finite")
							}
							for i := range want {
								if sol.x[i] != want[i] {
									t.Fatalf("x[%d, %d] = %v, whole right-hand side %v", i/nc, i%nc, sol.x[i], want[i])
								}
							}
						})
					}
				}
			}
		}
	}
}
