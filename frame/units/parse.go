package units

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Unit is a unit of measure: its symbol as this package writes it, its
// dimension and its value in newtons, metres, kelvins and radians.
type Unit struct {
	Symbol string // such as "kN·m/rad" or "in⁴"
	Dim    Dim
	SI     float64
}

// IsZero reports whether u is the zero Unit, which is no unit.
func (u Unit) IsZero() bool { return u.SI == 0 }

// String returns the unit's symbol.
func (u Unit) String() string { return u.Symbol }

// ErrUnknown marks a symbol that is not in the table; ErrSyntax a unit
// or value that cannot be read.
var (
	ErrUnknown = errors.New("unknown unit")
	ErrSyntax  = errors.New("not a unit")
)

// maxPower bounds the power of one symbol: no quantity of a frame has a
// length to more than the fourth.
const maxPower = 6

// MustParse is Parse for units known to be right; it panics otherwise.
func MustParse(s string) Unit {
	u, err := Parse(s)
	if err != nil {
		panic("units: " + err.Error())
	}
	return u
}

// Parse reads a unit (see the package documentation for how one is
// written). An error wraps ErrUnknown for a symbol not in the table, with
// the symbol meant where one is close, or ErrSyntax.
func Parse(s string) (Unit, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return Unit{}, fail(ErrSyntax, "the unit is empty")
	}
	num, den, two := strings.Cut(s, "/")
	if two && strings.Contains(den, "/") {
		return Unit{}, fail(ErrSyntax, "%q has more than one \"/\"; write the denominator as one product, such as kN/m2 or kip·in/rad", s)
	}
	u := Unit{SI: 1}
	var numSym, denSym []string
	num = strings.TrimSpace(num)
	if num == "1" || (num == "" && two) {
		if !two {
			return Unit{}, fail(ErrSyntax, "%q is a number, not a unit", s)
		}
	} else if err := u.product(num, 1, &numSym); err != nil {
		return Unit{}, err
	}
	if two {
		if err := u.product(strings.TrimSpace(den), -1, &denSym); err != nil {
			return Unit{}, err
		}
	}
	u.Symbol = strings.Join(numSym, "·")
	if len(numSym) == 0 {
		u.Symbol = "1"
	}
	if two {
		u.Symbol += "/" + strings.Join(denSym, "·")
	}
	return u, nil
}

// product multiplies u by the symbols of the product s, each to its power
// times sign, and appends each as written to sym.
func (u *Unit) product(s string, sign int8, sym *[]string) error {
	if s == "" {
		return fail(ErrSyntax, "a \"/\" with nothing after it")
	}
	for i := 0; i < len(s); {
		if len(*sym) > 0 {
			// A separator between two symbols.
			r, n := utf8.DecodeRuneInString(s[i:])
			switch r {
			case '*', '·', '⋅', '.', '-':
				i += n
			default:
				return fail(ErrSyntax, "in %q, %q cannot follow %s; join symbols with * or · (such as kN*m)", s, string(r), (*sym)[len(*sym)-1])
			}
		}
		j := i
		for j < len(s) {
			r, n := utf8.DecodeRuneInString(s[j:])
			if !unicode.IsLetter(r) && r != '°' && r != '℃' && r != '℉' {
				break
			}
			j += n
		}
		name := s[i:j]
		if name == "" {
			r, _ := utf8.DecodeRuneInString(s[i:])
			if i >= len(s) {
				return fail(ErrSyntax, "%q ends with a separator", s)
			}
			return fail(ErrSyntax, "in %q, %q is not a unit symbol", s, string(r))
		}
		e, ok := bySymbol(name)
		if !ok {
			return unknown(name)
		}
		p, k, err := power(s[j:])
		if err != nil {
			return fail(ErrSyntax, "in %q: %v", s, err)
		}
		i = j + k
		u.Dim = u.Dim.mul(e.dim, sign*p)
		u.SI *= math.Pow(e.si, float64(sign*p))
		w := e.name
		if p != 1 {
			w += superscript(int(p))
		}
		*sym = append(*sym, w)
	}
	return nil
}

// power reads the power written at the start of s: digits, "^" and an
// optionally signed number, or superscripts; 1 when there is none. It
// returns the power and the bytes it took.
func power(s string) (int8, int, error) {
	if s == "" {
		return 1, 0, nil
	}
	i, neg := 0, false
	if s[0] == '^' {
		i = 1
		if i < len(s) && (s[i] == '-' || s[i] == '+') {
			neg = s[i] == '-'
			i++
		}
		if i == len(s) || s[i] < '0' || s[i] > '9' {
			return 0, 0, errors.New(`"^" must be followed by a power, such as ^4`)
		}
	}
	if i < len(s) && s[i] >= '0' && s[i] <= '9' {
		j := i
		for j < len(s) && s[j] >= '0' && s[j] <= '9' {
			j++
		}
		n, err := strconv.Atoi(s[i:j])
		if err != nil || n < 1 || n > maxPower {
			return 0, 0, fmt.Errorf("power %s: powers are 1 to %d", s[i:j], maxPower)
		}
		if neg {
			n = -n
		}
		return int8(n), j, nil
	}
	// Superscripts, with an optional superscript minus.
	j := 0
	r, n := utf8.DecodeRuneInString(s)
	if r == '⁻' {
		neg = true
		j = n
	}
	digits := 0
	v := 0
	for j < len(s) {
		r, n := utf8.DecodeRuneInString(s[j:])
		d := strings.IndexRune(superDigits, r)
		if d < 0 {
			break
		}
		v = 10*v + utf8.RuneCountInString(superDigits[:d])
		digits++
		j += n
	}
	if digits == 0 {
		if neg {
			return 0, 0, errors.New(`"⁻" must be followed by a power, such as ⁻¹`)
		}
		return 1, 0, nil
	}
	if v < 1 || v > maxPower {
		return 0, 0, fmt.Errorf("power %d: powers are 1 to %d", v, maxPower)
	}
	if neg {
		v = -v
	}
	return int8(v), j, nil
}

const superDigits = "⁰¹²³⁴⁵⁶⁷⁸⁹"

// superscript writes n in superscript digits, such as ⁴ or ⁻¹.
func superscript(n int) string {
	var b strings.Builder
	if n < 0 {
		b.WriteRune('⁻')
		n = -n
	}
	for _, c := range strconv.Itoa(n) {
		b.WriteRune([]rune(superDigits)[c-'0'])
	}
	return b.String()
}

// unknown is the error for a symbol not in the table, suggesting the one
// meant where one is close.
func unknown(name string) error {
	msg := fmt.Sprintf("%q is not a unit govern knows", name)
	if c := closest(name, Symbols()); c != "" {
		msg += fmt.Sprintf(" (did you mean %q?)", c)
	}
	return fail(ErrUnknown, "%s", msg)
}

// closest returns the symbol name most likely meant: one differing only in
// case, else one edit away (an insertion, deletion, substitution or swap
// of neighbours) from a name of three or more letters; "" when none is.
func closest(name string, candidates []string) string {
	for _, c := range candidates {
		if strings.EqualFold(c, name) {
			return c
		}
	}
	if utf8.RuneCountInString(name) < 3 {
		return ""
	}
	// A swap of neighbours first: the likeliest slip of the fingers.
	for _, swapOnly := range []bool{true, false} {
		for _, c := range candidates {
			if oneEdit([]rune(name), []rune(c), swapOnly) {
				return c
			}
		}
	}
	return ""
}

// oneEdit reports whether a and b differ by one insertion, deletion,
// substitution or swap of neighbours; by a swap only when swapOnly.
func oneEdit(a, b []rune, swapOnly bool) bool {
	if len(a) < len(b) {
		a, b = b, a
	}
	switch len(a) - len(b) {
	case 0:
		var diff []int
		for i := range a {
			if a[i] != b[i] {
				diff = append(diff, i)
			}
		}
		return (len(diff) == 1 && !swapOnly) || (len(diff) == 2 && diff[1] == diff[0]+1 && a[diff[0]] == b[diff[1]] && a[diff[1]] == b[diff[0]])
	case 1:
		if swapOnly {
			return false
		}
		for i := range b {
			if a[i] != b[i] {
				return string(a[i+1:]) == string(b[i:])
			}
		}
		return true
	}
	return false
}

// ParseValue reads a number followed by a unit, such as "2.4 kip/ft",
// "8400 mm" or "6.5e-6 1/°F" (or "6.5e-6/°F"); a space between the two
// is optional. A number alone, without a unit, is an error: it would be a
// number written as a string.
func ParseValue(s string) (float64, Unit, error) {
	t := strings.TrimSpace(s)
	n := numberPrefix(t)
	if n == 0 {
		return 0, Unit{}, fail(ErrSyntax, "%q is not a number followed by a unit, such as \"29000 ksi\" or \"2.4 kip/ft\"", s)
	}
	v, err := strconv.ParseFloat(t[:n], 64)
	if err != nil || math.IsInf(v, 0) {
		return 0, Unit{}, fail(ErrSyntax, "%q: %s is not a finite number", s, t[:n])
	}
	rest := t[n:]
	if strings.HasPrefix(rest, ",") || strings.HasPrefix(rest, "_") {
		return 0, Unit{}, fail(ErrSyntax, "%q: write the number without a decimal comma or digit separators, such as \"1830 in4\" or \"2.5 m\"", s)
	}
	rest = strings.TrimSpace(rest)
	if rest == "" {
		return 0, Unit{}, fail(ErrSyntax, "%q has no unit: write the number without quotes for the model's own units, or give a unit, such as \"%s kN\"", s, t[:n])
	}
	if strings.HasPrefix(rest, "/") {
		rest = "1" + rest
	}
	u, err := Parse(rest)
	if err != nil {
		return 0, Unit{}, err
	}
	return v, u, nil
}

// numberPrefix returns the length of the decimal number at the start of
// s: an optional sign, digits with an optional point, an optional
// exponent; 0 when there is none.
func numberPrefix(s string) int {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && s[i] >= '0' && s[i] <= '9' {
		i++
		digits++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for i < len(s) && s[i] >= '0' && s[i] <= '9' {
			i++
			digits++
		}
	}
	if digits == 0 {
		return 0
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		k := j
		for k < len(s) && s[k] >= '0' && s[k] <= '9' {
			k++
		}
		if k > j {
			i = k
		}
	}
	return i
}

// Error is a problem with a unit or a value: its message, and the kind
// (ErrSyntax, ErrUnknown, ErrDimension) it wraps for errors.Is.
type Error struct {
	Kind error
	Msg  string
}

func (e *Error) Error() string { return e.Msg }
func (e *Error) Unwrap() error { return e.Kind }

func fail(kind error, format string, args ...any) error {
	return &Error{Kind: kind, Msg: fmt.Sprintf(format, args...)}
}
