package frame

import (
	"runtime"
	"sync"
)

// solveBlock is the number of load columns one processor substitutes at a
// time: 32 rows' worth of a block (the rows one row's update reads) stay
// in the first-level cache for the half-bandwidths of tall frames.
const solveBlock = 32

// bandSolve overwrites the n × nrhs row-major matrix x with U⁻¹ U⁻ᵀ x,
// where u is an upper band Cholesky factor (row-major, kb superdiagonals).
// Columns are split into blocks of solveBlock shared among the processors;
// within a block each row is formed at once from the rows it depends on
// (eight columns at a time held in registers, each row read but not
// written), with the terms added in the order of the row-by-row vector
// updates, so that the result is the same to the last bit, whatever the
// number of processors. Rows above a block's first non-zero stay zero in
// the forward substitution: a load on one member fills only a few rows.
func bandSolve(u []float64, n, kb int, x []float64, nrhs int) {
	if nrhs == 0 {
		return
	}
	newBandSolver(u, n, kb).solveScaled(x, nrhs, nil)
}

// bandSolveScaled is bandSolve of the system scaled by D = diag(d), D K D
// factored in u: it overwrites x with D (U⁻¹ U⁻ᵀ) D x, scaling each
// block's rows as they are packed and unpacked. With powers of two in d
// that is scaleRows, bandSolve and scaleRows again to the last bit.
//
// One column (a step of a second-order iteration) is solved by the plain
// vector substitutions, bandSolveVec, in the same order of operations:
// listing the factor's terms would cost more than using them once.
// finite reports whether every value of x is a finite number afterwards
// (checked as the rows are unpacked, while they are in cache).
func bandSolveScaled(u []float64, n, kb int, x []float64, nrhs int, d []float64) (finite bool) {
	if nrhs == 0 {
		return true
	}
	if nrhs == 1 {
		x = x[:n]
		for i := range d {
			x[i] *= d[i]
		}
		bandSolveVec(u, n, kb, x)
		for i := range d {
			x[i] *= d[i]
		}
		return allFinite(x)
	}
	return newBandSolver(u, n, kb).solveScaled(x, nrhs, d)
}

// bandSolver is bandSolve for one factor used many times (an iteration):
// the factor's terms are listed once.
type bandSolver struct {
	u        []float64
	n, kb    int
	fwd, bwd terms
}

// The two lists are made side by side where there is more than one
// processor (each is the same whichever makes it).
func newBandSolver(u []float64, n, kb int) *bandSolver {
	bs := &bandSolver{u: u, n: n, kb: kb}
	if runtime.GOMAXPROCS(0) == 1 {
		bs.fwd, bs.bwd = newTerms(u, n, kb, true), newTerms(u, n, kb, false)
		return bs
	}
	done := make(chan struct{})
	go func() {
		defer close(done)
		bs.bwd = newTerms(u, n, kb, false)
	}()
	bs.fwd = newTerms(u, n, kb, true)
	<-done
	return bs
}

// solve is bandSolve with the solver's factor.
func (bs *bandSolver) solve(x []float64, nrhs int) { bs.solveScaled(x, nrhs, nil) }

// solveScaled is bandSolveScaled with the solver's factor; d nil is no
// scaling: solveBlocks, each block packed from x.
func (bs *bandSolver) solveScaled(x []float64, nrhs int, d []float64) (finite bool) {
	n := bs.n
	return bs.solveBlocks(x, nrhs, d, func(buf []float64, lo, hi, bw int) {
		cols := hi - lo
		for i := range n {
			row := buf[i*bw : (i+1)*bw]
			copyScaled(row, x[i*nrhs+lo:i*nrhs+hi], d, i)
			clear(row[cols:])
		}
	})
}

// solveBlocks solves the n × nrhs system whose columns fill packs, block
// by block: fill(buf, lo, hi, bw) sets buf to the n rows of bw values of
// columns lo up to hi (scaled by d where there is a d), the rest of each
// row zero. The block is substituted and its solution written to x,
// times d again, and finite reports whether every value written is a
// finite number (checked as the rows are unpacked, while they are in
// cache). x is only written. The blocks are blockSpans'. A last block
// narrower than its width is padded with zero columns to a whole one
// where combine32 (or combine64) is used: each
// column is formed on its own, in the same order of operations at any
// width, and zero columns move no block's first non-zero row, so its
// columns come out the same to the last bit, and a whole block by
// combine32 takes a fraction of the time of the few columns by combine.
func (bs *bandSolver) solveBlocks(x []float64, nrhs int, d []float64, fill func(buf []float64, lo, hi, bw int)) (finite bool) {
	if nrhs == 0 {
		return true
	}
	u, n, kb := bs.u, bs.n, bs.kb
	fwd, bwd := bs.fwd, bs.bwd
	spans, width := blockSpans(nrhs)
	nb := len(spans)
	workers := min(runtime.GOMAXPROCS(0), nb)
	var wg sync.WaitGroup
	bad := make([]bool, workers)
	next := make(chan int, nb)
	for b := range nb {
		next <- b
	}
	close(next)
	for k := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			offs := make([]int, 0, kb)
			buf := make([]float64, n*width)
			ok := true
			for b := range next {
				// The block's columns packed, rows of bw ≥ hi−lo: the rows
				// one row reads are then a few kilobytes apart, not nrhs
				// words.
				lo, hi, bw := spans[b][0], spans[b][1], spans[b][2]
				cols := hi - lo
				fill(buf[:n*bw], lo, hi, bw)
				if useAVX && cols == bw && (bw == solveBlock || bw == wideBlock) {
					// Each row written to x as the backward substitution
					// finishes it, from the first-level cache.
					out := unpackTo{x: x, stride: nrhs, lo: lo, d: d}
					ok = substitute(&fwd, &bwd, u, n, kb, buf[:n*bw], bw, offs, &out) && ok
					continue
				}
				substitute(&fwd, &bwd, u, n, kb, buf[:n*bw], bw, offs, nil)
				for i := range n {
					ok = unpackRow(x[i*nrhs+lo:i*nrhs+hi], buf[i*bw:i*bw+cols], d, i) && ok
				}
			}
			bad[k] = !ok
		}()
	}
	wg.Wait()
	for _, b := range bad {
		if b {
			return false
		}
	}
	return true
}

// wideBlock is the width of a block substituted with AVX-512 (combine64):
// each of the factor's terms, listed once, serves twice the columns of a
// block of solveBlock, and its row index and factor are read half as
// often.
const wideBlock = 64

// blockSpans returns the blocks the nrhs columns are substituted in, each
// as its first column, the column past its last and its width bw (the
// columns it holds, or more, padded with zero columns, where a kernel
// takes a whole block: with AVX), and the widest bw. Blocks are of
// solveBlock columns; of wideBlock with AVX-512 but for a last part of
// solveBlock columns or fewer, which is a block of solveBlock: each
// column is formed alike in either (combine32 and combine64 add the same
// products in the same order), so the width changes no number.
func blockSpans(nrhs int) (spans [][3]int, width int) {
	width = solveBlock
	if useAVX && useAVX512 && nrhs > solveBlock {
		width = wideBlock
	}
	for lo := 0; lo < nrhs; {
		w := width
		if nrhs-lo <= solveBlock {
			w = solveBlock
		}
		hi := min(lo+w, nrhs)
		bw := hi - lo
		if useAVX {
			bw = w
		}
		spans = append(spans, [3]int{lo, hi, bw})
		lo = hi
	}
	return spans, width
}

// unpackRow copies the packed row src (scratch: it is scaled in place)
// to dst times d[i], or as it is when d is nil, and reports whether every
// value is a finite number (allFinite): scaled and checked where src is
// in cache, then copied whole, so that dst, far in memory, is only
// written, by the wide moves of copy (writing it value by value, or
// reading it again to check it, took longer than the substitution's
// packing had).
func unpackRow(dst, src, d []float64, i int) bool {
	s := 1.0
	if d != nil {
		s = d[i]
	}
	var f0, f1, f2, f3 float64
	k := 0
	for ; k+4 <= len(src); k += 4 {
		v := src[k : k+4 : k+4]
		a, b, c, e := v[0]*s, v[1]*s, v[2]*s, v[3]*s
		v[0], v[1], v[2], v[3] = a, b, c, e
		f0 += a - a
		f1 += b - b
		f2 += c - c
		f3 += e - e
	}
	for ; k < len(src); k++ {
		a := src[k] * s
		src[k] = a
		f0 += a - a
	}
	copy(dst, src)
	return f0+f1+f2+f3 == 0
}

// allFinite reports whether every value of x is a finite number: x − x
// is 0 for a finite x and NaN for an infinite one or NaN.
// Four sums, so that the additions do not wait on each other.
func allFinite(x []float64) bool {
	var s0, s1, s2, s3 float64
	k := 0
	for ; k+4 <= len(x); k += 4 {
		y := x[k : k+4 : k+4]
		s0 += y[0] - y[0]
		s1 += y[1] - y[1]
		s2 += y[2] - y[2]
		s3 += y[3] - y[3]
	}
	for ; k < len(x); k++ {
		s0 += x[k] - x[k]
	}
	return s0+s1+s2+s3 == 0
}

// copyScaled copies src to dst times d[i], or as it is when d is nil:
// copied, then scaled where the row is in cache.
func copyScaled(dst, src, d []float64, i int) {
	copy(dst, src)
	if d == nil {
		return
	}
	s := d[i]
	for k := range dst[:len(src)] {
		dst[k] *= s
	}
}

// terms lists, for each row of one substitution, the non-zero terms of
// the factor it takes: the rows it reads (rows[at[i]:at[i+1]], ascending)
// and minus their factors (negs, alike).
type terms struct {
	at   []int
	rows []int32
	negs []float64
}

// newTerms lists the terms of the forward substitution, Uᵀ y = x (row i
// reads rows k from i − kb up to i − 1 with U[k][i]), or of the backward
// one, U x = y (row i reads rows i + j for j from 1 up with U[i][i+j]),
// in storage of exactly their number: it is allocated while the solution
// is live, and adds to the run's peak memory.
func newTerms(u []float64, n, kb int, forward bool) terms {
	w := kb + 1
	t := terms{at: make([]int, n+1)}
	for i := range n {
		c := 0
		if forward {
			for k := max(0, i-kb); k < i; k++ {
				if u[k*w+i-k] != 0 {
					c++
				}
			}
		} else {
			for j := 1; j < w && i+j < n; j++ {
				if u[i*w+j] != 0 {
					c++
				}
			}
		}
		t.at[i+1] = t.at[i] + c
	}
	t.rows, t.negs = make([]int32, t.at[n]), make([]float64, t.at[n])
	p := 0
	for i := range n {
		if forward {
			for k := max(0, i-kb); k < i; k++ {
				if uki := u[k*w+i-k]; uki != 0 {
					t.rows[p], t.negs[p] = int32(k), -uki
					p++
				}
			}
			continue
		}
		for j := 1; j < w && i+j < n; j++ {
			if uij := u[i*w+j]; uij != 0 {
				t.rows[p], t.negs[p] = int32(i+j), -uij
				p++
			}
		}
	}
	return t
}

// unpackTo is where substitute writes each row of a whole block of
// solveBlock or wideBlock columns as it finishes it: row i's to x[i·stride+lo:], times
// d[i] (as it is where d is nil).
type unpackTo struct {
	x          []float64
	stride, lo int
	d          []float64
}

// substitute solves the packed block x, n rows of bw columns (see
// bandSolve); offs is scratch for the rows' offsets in x. With out (a
// whole block of solveBlock or wideBlock columns, with AVX), each row of the solution is
// also written there, scaled, as the backward substitution forms it: the
// numbers unpackRow writes, read from the first-level cache rather than
// from the whole block again. finite reports whether every value written
// there is a finite number (true without out).
func substitute(fwd, bwd *terms, u []float64, n, kb int, x []float64, bw int, offs []int, out *unpackTo) (finite bool) {
	w := kb + 1
	start := n
	for i, v := range x {
		if v != 0 {
			start = i / bw
			break
		}
	}
	// Forward: Uᵀ y = x, y[i] = (x[i] − Σ U[k][i] y[k]) / U[i][i] over the
	// rows k from max(start, i − kb) up: rows above start are zero.
	pairs := useAVX && useAVX512 && bw == wideBlock
	for i := start; i < n; i++ {
		a, b := fwd.at[i], fwd.at[i+1]
		for a < b && int(fwd.rows[a]) < start {
			a++
		}
		if pairs && i+1 < n {
			a1, b1 := fwd.at[i+1], fwd.at[i+2]
			for a1 < b1 && int(fwd.rows[a1]) < start {
				a1++
			}
			if combinePair(x, i, fwd, a, b, a1, b1, 1/u[i*w], 1/u[(i+1)*w]) {
				i++
				continue
			}
		}
		combineRow(x, i, bw, fwd.rows[a:b], fwd.negs[a:b], 1/u[i*w], offs)
	}
	// Backward: U x = y, x[i] = (y[i] − Σ U[i][i+j] x[i+j]) / U[i][i]
	// over j from 1 up.
	if out == nil {
		for i := n - 1; i >= 0; i-- {
			a, b := bwd.at[i], bwd.at[i+1]
			combineRow(x, i, bw, bwd.rows[a:b], bwd.negs[a:b], 1/u[i*w], offs)
		}
		return true
	}
	dst := out.x
	nonFinite := 0.0
	for i := n - 1; i >= 0; i-- {
		a, b := bwd.at[i], bwd.at[i+1]
		combineRow(x, i, bw, bwd.rows[a:b], bwd.negs[a:b], 1/u[i*w], offs)
		s := 1.0
		if out.d != nil {
			s = out.d[i]
		}
		at := i*out.stride + out.lo
		_ = dst[at+bw-1]
		_ = x[i*bw+bw-1]
		nonFinite += unpack32(&dst[at], &x[i*bw], s)
		if bw == wideBlock {
			nonFinite += unpack32(&dst[at+solveBlock], &x[i*bw+solveBlock], s)
		}
	}
	return nonFinite == 0
}

// pairMin is the fewest rows two rows of the forward substitution must
// read in common for combinePair to form them together.
const pairMin = 8

// combinePair forms rows i and i + 1 of the forward substitution of the
// packed block x (rows of wideBlock, with AVX-512), their terms fwd's
// [a, b) and [a1, b1) and their factors d0 and d1, where each reads rows
// that follow each other, up to i − 1 and up to i, and the two read at
// least pairMin rows in common; it reports whether it did. Each row's
// sum takes the same terms in the same order as combineRow's: first the
// rows that one of the two reads alone (combine64c, the sum kept as it
// is: times 1), then the rows both read (combine64x2: each value read
// once for both rows, where the rows read, some hundred kilobytes, are
// in the second-level cache), then row i's factor, and row i + 1's term
// of row i and its factor. A sum left in memory between the steps is the
// same float64.
func combinePair(x []float64, i int, fwd *terms, a, b, a1, b1 int, d0, d1 float64) bool {
	const bw = wideBlock
	if b-a < pairMin || b1-a1 < pairMin+1 {
		return false
	}
	f0, f1 := int(fwd.rows[a]), int(fwd.rows[a1])
	if int(fwd.rows[b-1]) != i-1 || i-1-f0 != b-a-1 || int(fwd.rows[b1-1]) != i || i-f1 != b1-a1-1 {
		return false
	}
	s := max(f0, f1) // the first row both read
	if i-s < pairMin {
		return false
	}
	_ = x[(i+1)*bw+bw-1]
	negs0, negs1 := fwd.negs[a:b], fwd.negs[a1:b1]
	if f0 < s {
		combine64c(&x[i*bw], &x[f0*bw], &negs0[0], s-f0, 1)
	}
	if f1 < s {
		combine64c(&x[(i+1)*bw], &x[f1*bw], &negs1[0], s-f1, 1)
	}
	combine64x2(&x[i*bw], &x[(i+1)*bw], &x[s*bw], &negs0[s-f0], &negs1[s-f1], i-s)
	combine64c(&x[i*bw], &x[i*bw], &negs0[0], 0, d0)
	combine64c(&x[(i+1)*bw], &x[i*bw], &negs1[len(negs1)-1], 1, d1)
	return true
}

// combineRow forms row i of the packed block x (rows of bw) from the rows
// it reads and minus their factors (see combine): by combine32 for a
// whole block where the processor has AVX, by combine64 for a wide one
// where it has AVX-512, and by combine32c and combine64c where the rows
// read follow each other (nearly every row of a frame's factor: its
// profile is full), which then take neither the list of rows nor its
// loads' wait. offs is scratch.
func combineRow(x []float64, i, bw int, rows []int32, negs []float64, d float64, offs []int) {
	if useAVX && (bw == solveBlock || bw == wideBlock) && len(rows) > 0 {
		// Every row read lies within x.
		first, last := int(rows[0]), int(rows[len(rows)-1])
		_ = x[i*bw+bw-1]
		_ = x[last*bw+bw-1]
		_ = negs[len(rows)-1]
		// Rows read that follow each other (ascending, so the first and
		// the last tell) are read in turn, not through the list.
		next := last-first == len(rows)-1
		switch {
		case bw == solveBlock && next:
			combine32c(&x[i*bw], &x[first*bw], &negs[0], len(rows), d)
			return
		case bw == solveBlock:
			combine32(&x[i*bw], &x[0], &rows[0], &negs[0], len(rows), d)
			return
		case useAVX512 && next:
			combine64c(&x[i*bw], &x[first*bw], &negs[0], len(rows), d)
			return
		case useAVX512:
			combine64(&x[i*bw], &x[0], &rows[0], &negs[0], len(rows), d)
			return
		}
	}
	offs = offs[:0]
	for _, k := range rows {
		offs = append(offs, int(k)*bw)
	}
	combine(x, i*bw, 0, bw, offs, negs, d)
}

// combine sets x[at+c], for c from lo to hi, to (x[at+c] + Σ negs[t]·x[rows[t]+c]) · d,
// the terms added in order.
func combine(x []float64, at, lo, hi int, rows []int, negs []float64, d float64) {
	negs = negs[:len(rows)]
	c := lo
	for ; c+8 <= hi; c += 8 {
		y := x[at+c : at+c+8 : at+c+8]
		s0, s1, s2, s3, s4, s5, s6, s7 := y[0], y[1], y[2], y[3], y[4], y[5], y[6], y[7]
		for t, r := range rows {
			a := negs[t]
			v := x[r+c : r+c+8 : r+c+8]
			s0 += a * v[0]
			s1 += a * v[1]
			s2 += a * v[2]
			s3 += a * v[3]
			s4 += a * v[4]
			s5 += a * v[5]
			s6 += a * v[6]
			s7 += a * v[7]
		}
		y[0], y[1], y[2], y[3], y[4], y[5], y[6], y[7] = s0*d, s1*d, s2*d, s3*d, s4*d, s5*d, s6*d, s7*d
	}
	if c+4 <= hi { // narrow blocks (an iteration's few columns): four at a time
		y := x[at+c : at+c+4 : at+c+4]
		s0, s1, s2, s3 := y[0], y[1], y[2], y[3]
		for t, r := range rows {
			a := negs[t]
			v := x[r+c : r+c+4 : r+c+4]
			s0 += a * v[0]
			s1 += a * v[1]
			s2 += a * v[2]
			s3 += a * v[3]
		}
		y[0], y[1], y[2], y[3] = s0*d, s1*d, s2*d, s3*d
		c += 4
	}
	if c+2 <= hi {
		y := x[at+c : at+c+2 : at+c+2]
		s0, s1 := y[0], y[1]
		for t, r := range rows {
			a := negs[t]
			v := x[r+c : r+c+2 : r+c+2]
			s0 += a * v[0]
			s1 += a * v[1]
		}
		y[0], y[1] = s0*d, s1*d
		c += 2
	}
	for ; c < hi; c++ {
		s := x[at+c]
		for t, r := range rows {
			s += negs[t] * x[r+c]
		}
		x[at+c] = s * d
	}
}

// axpy adds a·x to y; len(y) == len(x). Unrolled by four, which lets the
// compiler keep independent sums in flight.
func axpy(y []float64, a float64, x []float64) {
	x = x[:len(y)]
	k := 0
	for ; k+4 <= len(y); k += 4 {
		y0, y1, y2, y3 := y[k]+a*x[k], y[k+1]+a*x[k+1], y[k+2]+a*x[k+2], y[k+3]+a*x[k+3]
		y[k], y[k+1], y[k+2], y[k+3] = y0, y1, y2, y3
	}
	for ; k < len(y); k++ {
		y[k] += a * x[k]
	}
}
