package report

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
)

// The comparison of two JSON result files (`govern diff`): the design
// values each gives, member by member, and those that changed by more than
// a tolerance. It reads the files as WriteJSON writes them, through
// encoding/json, and nothing else of the analysis.

// DiffOptions is the tolerance of a comparison. A design value is listed
// when it changed by more than the larger of Relative × the larger of its
// two values and Floor × the largest size of that quantity in its member
// (node, span) in either file.
type DiffOptions struct {
	Relative, Floor float64
}

// DefaultDiffOptions is 1 % of the larger value, or 0.1 % of the member's
// largest value of that quantity, whichever is larger.
var DefaultDiffOptions = DiffOptions{Relative: 0.01, Floor: 0.001}

// DesignValue is one design value of a file: the value, where it is (x
// along the member, or along the span from its left end; HasX false for a
// reaction) and the combination that governs it.
type DesignValue struct {
	V, X float64
	HasX bool
	By   string
}

// Change is a design value that changed by more than the tolerance, or
// that one file has and the other has not (Old or New nil).
type Change struct {
	Kind  string // "member", "span" or "reaction"
	Name  string // the member's name, the span's ("A1-C1") or the node's
	Value string // "M max", "V min face 1", "Fy max", "deflection"
	Old   *DesignValue
	New   *DesignValue
}

// DiffResult is the comparison of two files.
type DiffResult struct {
	Old, New string // the files' names
	Units    DiffUnits
	Options  DiffOptions
	Compared int      // design values found in both files
	Changes  []Change // in the order of the new file (then those only in the old)
}

// DiffUnits are the units of a file's numbers, as its "units" gives them:
// forces, lengths (x, span lengths), moments and deflections. A file
// written before moments and deflections had output units of their own
// gives force and length only; its moments are then in force·length and
// its deflections in the length unit (readDesignValues fills them in).
type DiffUnits struct {
	Force      string `json:"force"`
	Length     string `json:"length"`
	Moment     string `json:"moment"`
	Deflection string `json:"deflection"`
}

// String names the units for a message: "kN, m, kN·m and mm".
func (u DiffUnits) String() string {
	return u.Force + ", " + u.Length + ", " + u.Moment + " and " + u.Deflection
}

// diffFile is the part of the JSON a comparison reads.
type diffFile struct {
	Format  *string    `json:"format"`
	Units   *DiffUnits `json:"units"`
	Members []struct {
		Name     *string `json:"name"`
		Stations []struct {
			X    *float64     `json:"x"`
			Face bool         `json:"face"`
			N    *diffExtreme `json:"N"`
			V    *diffExtreme `json:"V"`
			M    *diffExtreme `json:"M"`
		} `json:"stations"`
	} `json:"members"`
	Spans []struct {
		Kind       string   `json:"kind"`
		Left       string   `json:"left"`
		Right      string   `json:"right"`
		Deflection *float64 `json:"deflection"`
		X          float64  `json:"x"`
		By         string   `json:"by"`
	} `json:"spans"`
	Reactions []struct {
		Node *string      `json:"node"`
		Fx   *diffExtreme `json:"Fx"`
		Fy   *diffExtreme `json:"Fy"`
		M    *diffExtreme `json:"M"`
	} `json:"reactions"`
}

// diffExtreme is an envelope E of the JSON: its largest and smallest value
// and the combinations that give them.
type diffExtreme struct {
	Max   *float64 `json:"max"`
	MaxBy string   `json:"max_by"`
	Min   *float64 `json:"min"`
	MinBy string   `json:"min_by"`
}

// ErrNotResults is wrapped by the error Diff returns for a file that is not
// a result file of the format this version writes.
var ErrNotResults = errors.New("not a result file this version of govern reads")

// Diff compares the design values of two JSON result files, old and new,
// named oldName and newName in messages.
func Diff(oldName string, old []byte, newName string, new []byte, opt DiffOptions) (*DiffResult, error) {
	a, err := readDesignValues(oldName, old)
	if err != nil {
		return nil, err
	}
	b, err := readDesignValues(newName, new)
	if err != nil {
		return nil, err
	}
	if a.units != b.units {
		return nil, fmt.Errorf("%s is in %s (force, length, moment, deflection), %s in %s: the values cannot be compared; write both with the same units (the model's [units], output units included)",
			oldName, a.units, newName, b.units)
	}
	d := &DiffResult{Old: oldName, New: newName, Units: b.units, Options: opt}
	seen := make(map[string]bool, len(a.values))
	for _, k := range b.order {
		nv := b.values[k]
		ov, ok := a.values[k]
		seen[k] = true
		if !ok {
			d.Changes = append(d.Changes, Change{Kind: nv.kind, Name: nv.name, Value: nv.value, New: &nv.v})
			continue
		}
		d.Compared++
		scale := math.Max(a.largest[ov.group], b.largest[nv.group])
		if changed(ov.v.V, nv.v.V, scale, opt) {
			d.Changes = append(d.Changes, Change{Kind: nv.kind, Name: nv.name, Value: nv.value, Old: &ov.v, New: &nv.v})
		}
	}
	for _, k := range a.order {
		if !seen[k] {
			ov := a.values[k]
			d.Changes = append(d.Changes, Change{Kind: ov.kind, Name: ov.name, Value: ov.value, Old: &ov.v})
		}
	}
	return d, nil
}

// changed reports whether a value went from a to b by more than the
// tolerance, scale being the largest size of its quantity in its member.
func changed(a, b, scale float64, opt DiffOptions) bool {
	limit := math.Max(opt.Relative*math.Max(math.Abs(a), math.Abs(b)), opt.Floor*scale)
	return math.Abs(b-a) > limit
}

// designValues are the design values of one file, by key.
type designValues struct {
	units   DiffUnits
	order   []string
	values  map[string]namedValue
	largest map[string]float64 // per member (node, span) and quantity: the largest size
}

type namedValue struct {
	kind, name, value string
	group             string // the member (node, span) and quantity, for its largest size
	v                 DesignValue
}

func (dv *designValues) add(kind, name, value, quantity string, v DesignValue) {
	key := kind + "\x00" + name + "\x00" + value
	group := kind + "\x00" + name + "\x00" + quantity
	if _, dup := dv.values[key]; !dup {
		dv.order = append(dv.order, key)
	}
	dv.values[key] = namedValue{kind, name, value, group, v}
	dv.largest[group] = math.Max(dv.largest[group], math.Abs(v.V))
}

// readDesignValues reads the design values of a result file: for every
// member the largest and smallest N, V and M over its stations, and M and
// V at each column face; the deflection of every span and cantilever; and
// the largest and smallest of each reaction component.
func readDesignValues(name string, data []byte) (*designValues, error) {
	var head struct {
		Format *string `json:"format"`
	}
	if err := json.Unmarshal(data, &head); err != nil {
		return nil, jsonError(name, data, err)
	}
	if head.Format == nil {
		return nil, fmt.Errorf("%s: %w: it has no \"format\"; govern run --json writes one of format %q", name, ErrNotResults, JSONFormat)
	}
	if *head.Format != JSONFormat {
		return nil, fmt.Errorf("%s: %w: its format is %q, and this version reads %q only; write it again with this version's govern run --json",
			name, ErrNotResults, *head.Format, JSONFormat)
	}
	var f diffFile
	if err := json.Unmarshal(data, &f); err != nil {
		return nil, jsonError(name, data, err)
	}
	if f.Units == nil {
		return nil, fmt.Errorf("%s: %w: it has no \"units\"", name, ErrNotResults)
	}
	u := *f.Units
	if u.Moment == "" {
		u.Moment = u.Force + "·" + u.Length
	}
	if u.Deflection == "" {
		u.Deflection = u.Length
	}
	dv := &designValues{units: u, values: map[string]namedValue{}, largest: map[string]float64{}}
	for i, m := range f.Members {
		if m.Name == nil {
			return nil, fmt.Errorf("%s: %w: member %d has no \"name\"", name, ErrNotResults, i+1)
		}
		type peak struct {
			v  DesignValue
			ok bool
		}
		var hi, lo [3]peak
		var faces []string
		faceValues := map[string]DesignValue{}
		for j, st := range m.Stations {
			if st.X == nil || st.N == nil || st.V == nil || st.M == nil {
				return nil, fmt.Errorf("%s: %w: member %q, station %d lacks x, N, V or M", name, ErrNotResults, *m.Name, j+1)
			}
			for q, e := range [3]*diffExtreme{st.N, st.V, st.M} {
				if e.Max == nil || e.Min == nil {
					return nil, fmt.Errorf("%s: %w: member %q, station %d: %s lacks max or min", name, ErrNotResults, *m.Name, j+1, quantities[q])
				}
				if !hi[q].ok || *e.Max > hi[q].v.V {
					hi[q] = peak{DesignValue{*e.Max, *st.X, true, e.MaxBy}, true}
				}
				if !lo[q].ok || *e.Min < lo[q].v.V {
					lo[q] = peak{DesignValue{*e.Min, *st.X, true, e.MinBy}, true}
				}
			}
			if st.Face {
				where := fmt.Sprintf("face %d", len(faces)/4+1)
				for _, q := range []struct {
					label string
					e     *diffExtreme
				}{{"M", st.M}, {"V", st.V}} {
					faces = append(faces, q.label+" max "+where, q.label+" min "+where)
					faceValues[q.label+" max "+where] = DesignValue{*q.e.Max, *st.X, true, q.e.MaxBy}
					faceValues[q.label+" min "+where] = DesignValue{*q.e.Min, *st.X, true, q.e.MinBy}
				}
			}
		}
		for q, label := range quantities {
			if hi[q].ok {
				dv.add("member", *m.Name, label+" max", label, hi[q].v)
				dv.add("member", *m.Name, label+" min", label, lo[q].v)
			}
		}
		for _, k := range faces {
			dv.add("member", *m.Name, k, k[:1], faceValues[k])
		}
	}
	for _, s := range f.Spans {
		if s.Deflection == nil {
			continue // no service combinations
		}
		dv.add(s.Kind, s.Left+"-"+s.Right, "deflection", "deflection", DesignValue{*s.Deflection, s.X, true, s.By})
	}
	for i, r := range f.Reactions {
		if r.Node == nil {
			return nil, fmt.Errorf("%s: %w: reaction %d has no \"node\"", name, ErrNotResults, i+1)
		}
		for q, e := range [3]*diffExtreme{r.Fx, r.Fy, r.M} {
			if e == nil {
				continue // a component the support leaves free
			}
			if e.Max == nil || e.Min == nil {
				return nil, fmt.Errorf("%s: %w: reaction at %q: %s lacks max or min", name, ErrNotResults, *r.Node, reactionKeys[q])
			}
			dv.add("reaction", *r.Node, reactionKeys[q]+" max", reactionKeys[q], DesignValue{V: *e.Max, By: e.MaxBy})
			dv.add("reaction", *r.Node, reactionKeys[q]+" min", reactionKeys[q], DesignValue{V: *e.Min, By: e.MinBy})
		}
	}
	return dv, nil
}

var (
	quantities   = [3]string{"N", "V", "M"}
	reactionKeys = [3]string{"Fx", "Fy", "M"}
)

// jsonError says what is wrong with a file that is not valid JSON, or whose
// values have the wrong types, with the line.
func jsonError(name string, data []byte, err error) error {
	var se *json.SyntaxError
	var te *json.UnmarshalTypeError
	switch {
	case errors.As(err, &se):
		return fmt.Errorf("%s:%d: %w: not valid JSON: %v", name, lineAt(data, se.Offset), ErrNotResults, se)
	case errors.As(err, &te):
		return fmt.Errorf("%s:%d: %w: %s is a JSON %s where a %s belongs", name, lineAt(data, te.Offset), ErrNotResults, fieldName(te), te.Value, te.Type)
	}
	return fmt.Errorf("%s: %w: %v", name, ErrNotResults, err)
}

func fieldName(te *json.UnmarshalTypeError) string {
	if te.Field == "" {
		return "the file"
	}
	return fmt.Sprintf("%q", te.Field)
}

// lineAt returns the line of byte offset off in data, from 1.
func lineAt(data []byte, off int64) int {
	off = max(0, min(off, int64(len(data))))
	return 1 + bytes.Count(data[:off], []byte("\n"))
}

// WriteText writes the changes, members first, then spans and cantilevers,
// then reactions, each with both values and the combinations that govern
// them.
func (d *DiffResult) WriteText(w io.Writer) error {
	fmt.Fprintf(w, "Design values of %s (old) and %s (new): %d in both files; %d listed, changed by more than %s %% of the\nlarger value and by more than %s %% of the largest value of that quantity in the member (node, span), or in one file only.\n",
		Escape(d.Old), Escape(d.New), d.Compared, len(d.Changes), shortest(100*d.Options.Relative), shortest(100*d.Options.Floor))
	if len(d.Changes) == 0 {
		return nil
	}
	defer fmt.Fprintf(w, "\n%s\n", wrapLines(Caution, TextWidth))
	fmt.Fprintf(w, "Forces in %s, moments in %s, x in %s, deflections in %s; members in their own axes (x from the start node).\n",
		Escape(d.Units.Force), Escape(d.Units.Moment), Escape(d.Units.Length), Escape(d.Units.Deflection))
	for _, kind := range []struct {
		title string
		kinds []string
		first string
		num   func(float64) string
		hasX  bool
	}{
		{"Members", []string{"member"}, "member", fixed, true},
		{"Spans and cantilevers", []string{"span", "cantilever"}, "span", sig4, true},
		{"Reactions", []string{"reaction"}, "node", fixed, false},
	} {
		var rows [][]string
		last := ""
		for _, c := range d.Changes {
			if !contains(kind.kinds, c.Kind) {
				continue
			}
			name := c.Name
			if c.Kind == "cantilever" {
				name += " (cantilever)"
			}
			if name == last {
				name = ""
			} else {
				last = name
			}
			// Two rows: the old file's value, then the new one's with the
			// change.
			change := "only in new"
			switch {
			case c.Old != nil && c.New != nil:
				change = kind.num(c.New.V - c.Old.V)
			case c.Old != nil:
				change = "only in old"
			}
			rows = append(rows, append([]string{name, c.Value, "old"}, append(diffCells(c.Old, kind.num, kind.hasX), "")...),
				append([]string{"", "", "new"}, append(diffCells(c.New, kind.num, kind.hasX), change)...))
		}
		if len(rows) == 0 {
			continue
		}
		fmt.Fprintf(w, "\n%s\n", kind.title)
		header := []string{kind.first, "value", "file", "design value", "at x", "governing", "change"}
		if !kind.hasX {
			header = append(header[:4], header[5:]...)
		}
		if err := renderFitted(w, "", header, rows, TextWidth); err != nil {
			return err
		}
	}
	return nil
}

// diffCells is the value, x (with hasX) and combination of a design
// value, or a dash and blanks.
func diffCells(v *DesignValue, num func(float64) string, hasX bool) []string {
	var out []string
	if v == nil {
		out = []string{"-", "", ""}
	} else {
		out = []string{num(v.V), fixed(v.X), v.By}
	}
	if !hasX {
		out = append(out[:1], out[2:]...)
	}
	return out
}

func contains(list []string, s string) bool {
	for _, t := range list {
		if t == s {
			return true
		}
	}
	return false
}
