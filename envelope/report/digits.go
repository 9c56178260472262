package report

import (
	"math"
	"strconv"
)

// appendTen appends v as strconv.AppendFloat(dst, v, 'g', 10, 64) does,
// to the byte, in a few nanoseconds for the magnitudes a frame's results
// have. Between 1e-12 and 1e12 the ten significant digits are those of
// the integer nearest s = |v|·10^k, for the k that puts s in [10⁹, 10¹⁰):
// 10^k is exact in a float64 for |k| ≤ 22 (here −3 ≤ k ≤ 22), so s is
// formed with one rounding, within half its unit in the last place
// (2⁻²⁰ < 10⁻⁶ below 10¹⁰) of the exact product. The integer nearest it
// is then the exact one unless s's fraction is that close to one half;
// such a value (an exact tie, or one too near to tell) and every other
// magnitude, zero, infinities and NaN are left to strconv, which rounds
// the exact binary value half to even. The digits are laid out by the
// rules of strconv's 'g' with a precision of ten: trailing zeros dropped,
// the exponent form for a decimal exponent below −4 or from the number of
// digits kept up (at least ten when a fraction is left). s + 1/2 is exact
// or rounds to the integer above only within the guard of one half.
func appendTen(dst []byte, v float64) []byte {
	a := math.Abs(v)
	if !(a >= 1e-12 && a < 1e12) {
		return strconv.AppendFloat(dst, v, 'g', 10, 64)
	}
	// e10 = ⌊e2·log10 2⌋ for a = m·2^e2, 1 ≤ m < 2: a's decimal exponent
	// is e10 or e10 + 1, the second when s ≥ 10¹⁰.
	e2 := int(math.Float64bits(a)>>52&0x7ff) - 1023
	e10 := (e2 * 78913) >> 18
	s := scaleTen(a, 9-e10)
	if s >= 1e10 {
		e10++
		s = scaleTen(a, 9-e10)
	}
	// The nearest integer, unless s is too near a tie to tell.
	if f := s - float64(uint64(s)); f > 0.5-tieGuard && f < 0.5+tieGuard {
		return strconv.AppendFloat(dst, v, 'g', 10, 64)
	}
	d := uint64(s + 0.5)
	if d < 1e9 || d > 1e10 {
		return strconv.AppendFloat(dst, v, 'g', 10, 64)
	}
	if d == 1e10 {
		d, e10 = 1e9, e10+1
	}
	// The ten digits, the first at decimal exponent e10; nd of them once
	// the trailing zeros are dropped.
	var buf [10]byte
	hi := uint32(d / 100000) // the first five digits and the last five, apart
	lo := uint32(d - uint64(hi)*100000)
	fiveDigits(buf[:5], hi)
	fiveDigits(buf[5:], lo)
	nd := 10
	for buf[nd-1] == '0' {
		nd--
	}
	if v < 0 {
		dst = append(dst, '-')
	}
	dp := e10 + 1 // digits before the decimal point
	eprec := 10
	if nd < 10 && nd >= dp {
		eprec = nd
	}
	if e10 < -4 || e10 >= eprec {
		dst = append(dst, buf[0])
		if nd > 1 {
			dst = append(dst, '.')
			dst = append(dst, buf[1:nd]...)
		}
		dst = append(dst, 'e')
		x := e10
		if x < 0 {
			dst = append(dst, '-')
			x = -x
		} else {
			dst = append(dst, '+')
		}
		return append(dst, pairs[2*x], pairs[2*x+1])
	}
	switch {
	case dp >= nd: // an integer
		dst = append(dst, buf[:nd]...)
		for range dp - nd {
			dst = append(dst, '0')
		}
	case dp > 0:
		dst = append(dst, buf[:dp]...)
		dst = append(dst, '.')
		dst = append(dst, buf[dp:nd]...)
	default:
		dst = append(dst, '0', '.')
		for range -dp {
			dst = append(dst, '0')
		}
		dst = append(dst, buf[:nd]...)
	}
	return dst
}

// tieGuard is how near one half a scaled value's fraction may come before
// appendTen leaves it to strconv: ten times the largest error of the
// scaled value (half a unit in the last place below 10¹⁰, 2⁻²⁰).
const tieGuard = 1e-5

// scaleTen returns a·10^k, rounded once, for −22 ≤ k ≤ 22.
func scaleTen(a float64, k int) float64 {
	if k >= 0 {
		return a * exactTen[k]
	}
	return a / exactTen[-k]
}

// exactTen holds the powers of ten a float64 holds exactly.
var exactTen = [23]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10,
	1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// fiveDigits writes x < 100000 as five decimal digits to b.
func fiveDigits(b []byte, x uint32) {
	_ = b[4]
	r := x % 10000
	b[0] = byte('0' + x/10000)
	copy(b[1:3], pairs[2*(r/100):])
	copy(b[3:5], pairs[2*(r%100):])
}

// pairs holds the two digits of 0 to 99, one after the other.
const pairs = "00010203040506070809101112131415161718192021222324252627282930313233343536373839404142434445464748495051525354555657585960616263646566676869707172737475767778798081828384858687888990919293949596979899"
