package report

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"
)

// appendTen is checked against the standard library's formatting, which
// rounds the exact binary value to the nearest ten-digit decimal, half
// to even (strconv.AppendFloat with 'g' and a precision of ten): every
// value must give the same bytes.
func TestAppendTenMatchesStrconv(t *testing.T) {
	check := func(t *testing.T, v float64) {
		t.Helper()
		want := strconv.AppendFloat(nil, v, 'g', outputDigits, 64)
		if got := appendTen(nil, v); string(got) != string(want) {
			t.Fatalf("%v (bits %#016x): %q, strconv %q", v, math.Float64bits(v), got, want)
		}
	}
	t.Run("edge cases", func(t *testing.T) {
		vals := []float64{0, math.Copysign(0, -1), math.Inf(1), math.Inf(-1), math.NaN(),
			math.MaxFloat64, -math.MaxFloat64, math.SmallestNonzeroFloat64, 0x1p-1022,
			0.5, 1, 9.9999999995, 9999999999.5, 99999999995, 99999999985, 1234567890.5, 1234567891.5,
			0.0001, 0.00001, 1e9, 1e10, 1e11, 123456789012, 0.1, 0.2, 0.3, 1.0 / 3, 2.0 / 3}
		for e := -14; e <= 14; e++ {
			p, _ := strconv.ParseFloat("1e"+strconv.Itoa(e), 64)
			for _, x := range []float64{p, 2 * p, 5 * p, 9.999999999 * p, 9.9999999995 * p} {
				// The value and its neighbours, a few units in the last place each way.
				y := x
				for range 4 {
					y = math.Nextafter(y, 0)
				}
				for range 9 {
					vals = append(vals, y, -y)
					y = math.Nextafter(y, math.Inf(1))
				}
			}
		}
		for _, v := range vals {
			check(t, v)
		}
	})
	rng := rand.New(rand.NewPCG(2026, 12))
	t.Run("random bit patterns", func(t *testing.T) {
		for range 1_000_000 {
			check(t, math.Float64frombits(rng.Uint64()))
		}
	})
	t.Run("random magnitudes from 1e-14 to 1e14", func(t *testing.T) {
		for range 2_000_000 {
			v := (1 + 9*rng.Float64()) * math.Pow(10, float64(rng.IntN(29)-14))
			if rng.IntN(2) == 0 {
				v = -v
			}
			check(t, v)
		}
	})
	t.Run("ties and their neighbours", func(t *testing.T) {
		// An eleven-digit integer ending in 5 is exact in a float64 and
		// lies halfway between two ten-digit ones; so does a ten-digit
		// integer plus one half, and so do both scaled by powers of two.
		for range 200_000 {
			n := 1e10 + float64(rng.Int64N(9e10))
			n = 10*math.Floor(n/10) + 5
			m := 1e9 + float64(rng.Int64N(9e9)) + 0.5
			for _, x := range []float64{n, m} {
				x = math.Ldexp(x, rng.IntN(9)-4)
				for _, y := range []float64{x, math.Nextafter(x, 0), math.Nextafter(x, math.Inf(1))} {
					check(t, y)
					check(t, -y)
				}
			}
		}
	})
}

// BenchmarkAppendTen formats values of the sizes a frame's results have
// (from 1e-3 to 1e5, either sign) with appendTen and with strconv.
func BenchmarkAppendTen(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 2))
	vals := make([]float64, 4096)
	for i := range vals {
		vals[i] = (rng.Float64() - 0.5) * math.Pow(10, float64(rng.IntN(8)-3))
	}
	for _, f := range []struct {
		name string
		fn   func([]byte, float64) []byte
	}{
		{"appendTen", appendTen},
		{"strconv", func(dst []byte, v float64) []byte { return strconv.AppendFloat(dst, v, 'g', 10, 64) }},
	} {
		b.Run(f.name, func(b *testing.B) {
			b.ReportAllocs()
			buf := make([]byte, 0, 32)
			i := 0
			for b.Loop() {
				buf = f.fn(buf[:0], vals[i&4095])
				i++
			}
		})
	}
}
