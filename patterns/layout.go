package patterns

import (
	"errors"
	"fmt"

	"govern/frame"
)

// Mode is how a patterned case's pieces may be arranged.
type Mode uint8

const (
	// Exact: at every station and for each extreme, every piece whose
	// factored effect is adverse is on and every other piece off, which is
	// the worst of all arrangements; one solve per piece.
	Exact Mode = iota
	// Code: only the arrangements of [Arrangements], each a whole load.
	Code
	// Full: every piece on, no patterning.
	Full
	// Exhaustive: every on/off subset of the pieces, tried one by one;
	// at most MaxExhaustive pieces. Kept to check Exact against.
	Exhaustive
)

var modeNames = [...]string{"exact", "code", "full", "exhaustive"}

func (m Mode) String() string {
	if int(m) < len(modeNames) {
		return modeNames[m]
	}
	return fmt.Sprintf("Mode(%d)", uint8(m))
}

// ParseMode returns the mode named s.
func ParseMode(s string) (Mode, bool) {
	for i, n := range modeNames {
		if n == s {
			return Mode(i), true
		}
	}
	return 0, false
}

// MaxExhaustive is the most pieces Exhaustive accepts: 2^20 subsets.
const MaxExhaustive = 20

// ErrTooManyPieces is wrapped by Expand's error when Exhaustive would have
// more than MaxExhaustive pieces.
var ErrTooManyPieces = errors.New("too many pieces for exhaustive patterns")

// Unit is one solved load of a patterned case: a piece (Exact, Exhaustive)
// or an arrangement (Code).
type Unit struct {
	Column int   // the case index of its load in the expanded model
	Pieces []int // the pieces it loads, indices into Layout.Pieces
	Name   string
}

// Patterned is a case whose beam loads are placed piece by piece.
type Patterned struct {
	Case  int // index into the original model's cases; its column holds the rest
	Units []Unit
}

// Layout is a model expanded for pattern loading.
type Layout struct {
	Mode     Mode
	Segments int
	// Model has the original cases first, at their own indices, with each
	// patterned case reduced to its rest, then one case per unit.
	Model     *frame.Model
	Patterned []Patterned
	Pieces    []Piece
}

// Expand splits the cases listed in patterned into pieces and builds the
// model that solves them: with Full it returns the model unchanged (no
// patterned cases). segments is the number of pieces per beam.
func Expand(mo *frame.Model, patterned []int, segments int, mode Mode) (*Layout, error) {
	lay := &Layout{Mode: mode, Segments: segments, Model: mo}
	if mode == Full || len(patterned) == 0 {
		return lay, nil
	}
	ex := *mo
	ex.Cases = append([]frame.Case(nil), mo.Cases...)
	for _, c := range patterned {
		rest, pieces := Split(mo, c, segments)
		ex.Cases[c] = rest
		first := len(lay.Pieces)
		lay.Pieces = append(lay.Pieces, pieces...)
		p := Patterned{Case: c}
		switch mode {
		case Exact, Exhaustive:
			for i, pc := range pieces {
				p.Units = append(p.Units, Unit{Column: len(ex.Cases), Pieces: []int{first + i}, Name: pc.Name})
				ex.Cases = append(ex.Cases, frame.Case{Name: mo.Cases[c].Name + " " + pc.Name, MemberLoads: pc.Loads})
			}
		case Code:
			for _, a := range Arrangements(mo, pieces) {
				u := Unit{Column: len(ex.Cases), Name: a.Name}
				cs := frame.Case{Name: mo.Cases[c].Name + " " + a.Name}
				for _, i := range a.Pieces {
					u.Pieces = append(u.Pieces, first+i)
					cs.MemberLoads = append(cs.MemberLoads, pieces[i].Loads...)
				}
				p.Units = append(p.Units, u)
				ex.Cases = append(ex.Cases, cs)
			}
		}
		lay.Patterned = append(lay.Patterned, p)
	}
	if mode == Exhaustive && len(lay.Pieces) > MaxExhaustive {
		return nil, fmt.Errorf("patterns: %w: %d pieces, at most %d (2^%d arrangements); use \"exact\", which gives the same envelope",
			ErrTooManyPieces, len(lay.Pieces), MaxExhaustive, MaxExhaustive)
	}
	if len(patterned) > 1 {
		for i := range lay.Pieces {
			lay.Pieces[i].Name = mo.Cases[lay.Pieces[i].Case].Name + "/" + lay.Pieces[i].Name
		}
		for p := range lay.Patterned {
			for u := range lay.Patterned[p].Units {
				if mode != Code {
					lay.Patterned[p].Units[u].Name = lay.Pieces[lay.Patterned[p].Units[u].Pieces[0]].Name
				}
			}
		}
	}
	lay.Model = &ex
	return lay, nil
}

// Whole returns the columns of the expanded model whose sum is original
// case c in full: the case itself when it is not patterned; otherwise its
// rest and every piece ("exact", "exhaustive") or its rest and the
// all-spans arrangement ("code"), which Arrangements always lists first.
func (lay *Layout) Whole(c int) []int {
	for _, p := range lay.Patterned {
		if p.Case != c {
			continue
		}
		cols := []int{c}
		switch lay.Mode {
		case Code:
			if len(p.Units) > 0 {
				cols = append(cols, p.Units[0].Column)
			}
		default:
			for _, u := range p.Units {
				cols = append(cols, u.Column)
			}
		}
		return cols
	}
	return []int{c}
}
