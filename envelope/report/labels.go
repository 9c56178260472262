package report

import (
	"math"
	"slices"
	"unicode"
)

// The drawings' labels never overlap: each is placed at the first of its
// candidate positions where its box overlaps no label placed before it,
// the labels taken in order of importance; a label with no free position
// is left out (its value is in the tables) and counted.

// textBox is a rectangle of the picture, x0 < x1 and y0 < y1 (y down).
type textBox struct{ x0, y0, x1, y1 float64 }

func (a textBox) overlaps(b textBox) bool {
	return a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1
}

// Sizes of the drawings' font (Arial or a sans-serif like it), as
// fractions of the font size, each on the large side so that a label's
// box holds its text: the advance of a capital (the widest, M and W,
// apart), of M and W, of any other character; the height above and below
// the baseline.
const (
	capitalWidth = 0.76
	widestWidth  = 0.96
	otherWidth   = 0.64
	ascent       = 0.95
	descent      = 0.26
	// labelGap is the clear space kept around a label, as a fraction of
	// the font size.
	labelGap = 0.08
)

// textWidth returns the width of text at font size fs, on the large side.
func textWidth(text string, fs float64) float64 {
	w := 0.0
	for _, r := range text {
		switch {
		case r == 'M' || r == 'W':
			w += widestWidth
		case unicode.IsUpper(r):
			w += capitalWidth
		default:
			w += otherWidth
		}
	}
	return w * fs
}

// pos is a position of a label: the point of its baseline it is
// anchored at, and the anchor, "start", "middle" or "end".
type pos struct {
	x, y   float64
	anchor string
}

// label is a text to place, with its candidate positions in order of
// preference.
type label struct {
	text  string
	at    []pos
	rank  float64 // larger first
	order int     // then in the order given
}

// boxAt returns the box of the label at candidate position i.
func (l *label) boxAt(i int, fs float64) textBox {
	w := textWidth(l.text, fs)
	x, y := l.at[i].x, l.at[i].y
	x0 := x
	switch l.at[i].anchor {
	case "middle":
		x0 = x - w/2
	case "end":
		x0 = x - w
	}
	g := labelGap * fs
	return textBox{x0 - g, y - ascent*fs - g, x0 + w + g, y + descent*fs + g}
}

// labelSet places the labels of one drawing, all of one font size.
type labelSet struct {
	fs     float64
	labels []label
}

// add offers a label.
func (s *labelSet) add(l label) {
	l.order = len(s.labels)
	s.labels = append(s.labels, l)
}

// placed is a label at the position chosen for it.
type placed struct {
	x, y   float64
	anchor string
	text   string
	box    textBox
}

// place places the labels, most important first, each at its first free
// position; it returns them in the order given, and how many were left
// out.
func (s *labelSet) place(taken []textBox) (out []placed, dropped int) {
	idx := make([]int, len(s.labels))
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int {
		la, lb := &s.labels[a], &s.labels[b]
		switch {
		case la.rank > lb.rank:
			return -1
		case la.rank < lb.rank:
			return 1
		}
		return la.order - lb.order
	})
	chosen := make([]int, len(s.labels))
	boxes := make([]textBox, len(s.labels))
	for _, k := range idx {
		l := &s.labels[k]
		chosen[k] = -1
		for i := range l.at {
			b := l.boxAt(i, s.fs)
			if !slices.ContainsFunc(taken, b.overlaps) {
				chosen[k], boxes[k] = i, b
				taken = append(taken, b)
				break
			}
		}
	}
	for k := range s.labels {
		if chosen[k] < 0 {
			dropped++
			continue
		}
		l := &s.labels[k]
		at := l.at[chosen[k]]
		out = append(out, placed{at.x, at.y, at.anchor, l.text, boxes[k]})
	}
	return out, dropped
}

// around returns candidate positions about p: p itself, then moved along
// the unit vector (ax, ay) and along (nx, ny), steps of size step: first
// along, both ways, then out along (nx, ny) with each of those.
func around(p pos, ax, ay, nx, ny, step float64) []pos {
	var out []pos
	for _, n := range []float64{0, 1, 2} {
		for _, a := range []float64{0, 1, -1, 2, -2, 3, -3} {
			out = append(out, pos{p.x + a*step*ax + n*step*nx, p.y + a*step*ay + n*step*ny, p.anchor})
		}
	}
	return out
}

// unit returns (x, y) scaled to length 1, or (1, 0) for a zero vector.
func unit(x, y float64) (float64, float64) {
	l := math.Hypot(x, y)
	if l == 0 {
		return 1, 0
	}
	return x / l, y / l
}
