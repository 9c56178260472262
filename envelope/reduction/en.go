package reduction

// en1991A0 is A0 of EN 1991-1-1 6.3.1.2(10), in m².
const en1991A0 = 10

// reducible reports whether EN 1991-1-1 6.3.1.2 reduces imposed loads of
// category cat (EN 1991-1-1 Table 6.1; the first letter counts, "C1" is
// C): categories A to D.
func reducible(cat string) bool {
	return cat != "" && cat[0] >= 'A' && cat[0] <= 'D'
}

// AlphaA returns αA of EN 1991-1-1 6.3.1.2(10), Eq. (6.1): 5/7·ψ0 + A0/A
// with A0 = 10 m², not above 1.0, and for categories C and D not below
// 0.6 (the note to (10), recommended values, from memory), for the area a
// (m²) of imposed load of category cat with factor psi0. Categories E to
// H are not reduced.
func AlphaA(cat string, psi0, a float64) (float64, Limit) {
	if !reducible(cat) {
		return 1, ENCategory
	}
	if !(a > 0) {
		return 1, ENOne
	}
	v := 5.0/7.0*psi0 + en1991A0/a
	if v >= 1 {
		return 1, ENOne
	}
	if (cat[0] == 'C' || cat[0] == 'D') && v < 0.6 {
		return 0.6, ENCD
	}
	return v, NoneApplied
}

// AlphaN returns αn of EN 1991-1-1 6.3.1.2(11), Eq. (6.2): (2 + (n − 2)ψ0)/n
// for a column with n storeys of imposed load of category cat above it,
// when n > 2; 1.0 otherwise or for categories E to H.
func AlphaN(cat string, psi0 float64, n int) (float64, Limit) {
	if !reducible(cat) {
		return 1, ENCategory
	}
	if n <= 2 {
		return 1, ENFewStoreys
	}
	return (2 + float64(n-2)*psi0) / float64(n), NoneApplied
}
