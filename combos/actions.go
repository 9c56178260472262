package combos

import (
	"fmt"
	"sort"
	"strconv"
	"strings"
)

// Action is what a standard combines: what leads, accompanies and takes a
// ψ factor (EN 1990's word; ASCE/SEI 7 calls them loads: D, L, Lr, S, R,
// W, E). The cases of an action are grouped into alternatives: the cases
// of one alternative act together, two alternatives of one action never do
// (wind from the left or from the right; balanced or unbalanced snow).
type Action struct {
	Name string
	Kind Kind // every case of the action is of this kind
	// Alternatives in the order of their first case.
	Alternatives []Alternative
	// Default is set when no case of the action gave action, alternative
	// or with: its cases were grouped by the rule of their kind.
	Default bool
}

// Alternative is one way an action can act: cases that act together.
type Alternative struct {
	// Name is the name given, else the case's for a wind or seismic case
	// alone, else the action's.
	Name  string
	Cases []int // indices into the model's cases, in model order
	// Reversible is set when any of its cases is: the whole alternative
	// changes sign, its cases together.
	Reversible bool
	// Joined lists the sets of its cases that were joined explicitly, each
	// in model order: the cases that share an explicit alternative name
	// (the whole alternative), or else a case and those that name it with
	// with, through chains. Only sets of two or more cases are listed; nil
	// when there are none. Where variable loads act only where adverse,
	// each set acts as a whole, all its cases or none (package envelope,
	// Settings.Groups): they are parts of one load, such as a wall
	// pressure and the roof suction of one wind direction. The other cases
	// of the alternative were put together by the default rule of their
	// kind (the live cases of several floors) and each still acts on its
	// own where adverse, since loading only part of the structure may be
	// worse (partial loading).
	Joined [][]int
}

// Place is where a case is: the index of its action in [Actions.List]
// and of its alternative in the action's Alternatives.
type Place struct{ Action, Alternative int }

// Actions is a model's load cases grouped into actions and alternatives.
// It is built by [GroupActions]; its slices are not to be changed.
type Actions struct {
	List []Action // in the order of their first case
	Of   []Place  // per case
	// Note says how cases were grouped by default where that may surprise:
	// more than one wind, seismic or snow case and none of them carrying
	// action, alternative or with. "" otherwise.
	Note string
}

// grouped says how the cases of each kind are grouped when they carry no
// action, alternative or with: all cases of the kind one action (else each
// case its own), and within it each case its own alternative (else all
// cases together).
func grouped(k Kind) (oneAction, eachAlternative bool) {
	switch k {
	case Dead, Live, RoofLive, Snow, Settlement:
		return true, false
	case Wind, Seismic, Temperature:
		return true, true
	}
	return false, false
}

// GroupActions groups the cases into actions and alternatives from the
// Action, Alternative and With of their [CaseInfo] (info may be nil).
// Cases that give none of them are grouped by kind: dead, live, roof-live
// and snow cases form one action of their kind whose cases act together;
// wind and seismic cases one action of their kind, each case an
// alternative of its own; every rain and other case is an action of its
// own. A case with With takes the action and alternative of the case it
// names (of the same kind; chains are followed). Alternative without
// Action keeps the kind's action (for rain and other, one action named
// after the kind). The cases joined explicitly, by With or by sharing an
// Alternative, are listed as sets in their alternative's Joined.
//
// Dead cases take none of the three keys: permanent actions always act.
// Problems are returned as [CaseErrors], each at the case and key at fault.
func GroupActions(cases []Case, info []CaseInfo) (*Actions, error) {
	if info == nil {
		info = make([]CaseInfo, len(cases))
	}
	if len(info) != len(cases) {
		panic("combos: GroupActions: info and cases differ in length")
	}
	var errs CaseErrors
	fail := func(c int, key, format string, args ...any) {
		for _, e := range errs {
			if e.Case == c && e.Key == key {
				return
			}
		}
		errs = append(errs, &CaseError{Case: c, Key: key, Msg: fmt.Sprintf(format, args...)})
	}
	byName := make(map[string]int, len(cases))
	for i, c := range cases {
		if _, dup := byName[c.Name]; !dup {
			byName[c.Name] = i
		}
	}
	parent := make([]int, len(cases))
	for i, c := range cases {
		parent[i] = -1
		ci := &info[i]
		if c.Kind.AlwaysActs() {
			for _, k := range []struct{ key, v string }{{"action", ci.Action}, {"alternative", ci.Alternative}, {"with", ci.With}} {
				if k.v != "" {
					fail(i, k.key, "%s: dead load is permanent and always acts in full, as one action with every dead case; only variable cases are grouped", k.key)
					break
				}
			}
			continue
		}
		if ci.With == "" {
			continue
		}
		j, ok := byName[ci.With]
		switch {
		case ci.Action != "" || ci.Alternative != "":
			fail(i, "with", "with = %q: give with, or action and alternative, not both (with takes the action and alternative of case %q)", ci.With, ci.With)
		case !ok:
			fail(i, "with", "with = %q: no such case", ci.With)
		case j == i:
			fail(i, "with", "with = %q names the case itself; name the case whose action and alternative this one shares", ci.With)
		case cases[j].Kind != c.Kind:
			fail(i, "with", "with = %q: case %q is %s load and case %q is %s load; with joins cases of one kind", ci.With, cases[j].Name, cases[j].Kind, c.Name, c.Kind)
		default:
			parent[i] = j
		}
	}
	// Rings of with: each case has at most one, so a chain either ends at
	// a case without with or runs into a ring.
	state := make([]uint8, len(cases)) // 0 new, 1 on the current path, 2 done
	for i := range cases {
		var path []int
		j := i
		for j >= 0 && state[j] == 0 {
			state[j] = 1
			path = append(path, j)
			j = parent[j]
		}
		if j >= 0 && state[j] == 1 {
			// j starts a ring: the cases of path from j on.
			k := 0
			for path[k] != j {
				k++
			}
			ring := append([]int(nil), path[k:]...)
			sort.Ints(ring)
			names := make([]string, len(ring))
			for n, c := range ring {
				names[n] = strconv.Quote(cases[c].Name)
				parent[c] = -1
			}
			fail(ring[0], "with", "with: cases %s name each other in a ring; one of them must give no with", strings.Join(names, " and "))
		}
		for _, c := range path {
			state[c] = 2
		}
	}
	if len(errs) > 0 {
		sortCaseErrors(errs)
		return nil, errs
	}
	root := func(i int) int {
		for parent[i] >= 0 {
			i = parent[i]
		}
		return i
	}

	a := &Actions{Of: make([]Place, len(cases))}
	// joinKey says, per case, which set of explicitly joined cases of its
	// alternative it is in: "a" for every case of an explicitly named
	// alternative, else "r" and the root of its with chain.
	joinKey := make([]string, len(cases))
	actionOf := map[string]int{} // action key → index into a.List
	altOf := map[string]int{}    // action index + alternative key → index
	firstCase := map[int]int{}   // action index → the case that made it
	keyed := map[Kind]bool{}     // a case of the kind gave a key
	for i, c := range cases {
		ci := &info[i]
		if ci.Action != "" || ci.Alternative != "" || ci.With != "" {
			keyed[c.Kind] = true
		}
		r := root(i)
		rc := &info[r]
		oneAction, eachAlt := grouped(c.Kind)
		var key, name string
		switch {
		case rc.Action != "":
			key, name = "n"+rc.Action, rc.Action
		case oneAction || rc.Alternative != "":
			key, name = "n"+c.Kind.String(), c.Kind.String()
		default:
			key, name = "c"+strconv.Itoa(r), cases[r].Name
		}
		ai, ok := actionOf[key]
		if !ok {
			ai = len(a.List)
			actionOf[key] = ai
			firstCase[ai] = i
			a.List = append(a.List, Action{Name: name, Kind: c.Kind, Default: true})
		}
		act := &a.List[ai]
		if act.Kind != c.Kind {
			// with joins cases of one kind, so the action was named on
			// the root of one of the two cases, or both.
			at, other := r, root(firstCase[ai])
			if rc.Action == "" {
				at, other = other, at
			}
			how := ""
			if info[other].Action == "" {
				how = fmt.Sprintf(" (the %s cases without action are in action %q)", cases[other].Kind, name)
			}
			fail(at, "action", "action = %q: case %q is in this action too and is %s load, case %q is %s load; the cases of one action are of one kind%s",
				name, cases[other].Name, cases[other].Kind, cases[at].Name, cases[at].Kind, how)
			continue
		}
		var akey, aname string
		switch {
		case rc.Alternative != "":
			akey, aname = "n"+rc.Alternative, rc.Alternative
		case eachAlt:
			akey, aname = "c"+strconv.Itoa(r), cases[r].Name
		default:
			akey, aname = "d", name
		}
		k := strconv.Itoa(ai) + "/" + akey
		li, ok := altOf[k]
		if !ok {
			li = len(act.Alternatives)
			altOf[k] = li
			act.Alternatives = append(act.Alternatives, Alternative{Name: aname})
		}
		alt := &act.Alternatives[li]
		alt.Cases = append(alt.Cases, i)
		joinKey[i] = "r" + strconv.Itoa(r)
		if rc.Alternative != "" {
			joinKey[i] = "a"
		}
		alt.Reversible = alt.Reversible || ci.Reversible
		a.Of[i] = Place{Action: ai, Alternative: li}
		if ci.Action != "" || ci.Alternative != "" || ci.With != "" {
			act.Default = false
		}
	}
	if len(errs) > 0 {
		sortCaseErrors(errs)
		return nil, errs
	}
	for ai := range a.List {
		for li := range a.List[ai].Alternatives {
			alt := &a.List[ai].Alternatives[li]
			alt.Joined = joinedSets(alt.Cases, joinKey)
		}
	}
	a.Note = defaultNote(cases, keyed)
	return a, nil
}

// joinedSets returns the cases of an alternative that share a join key
// (see GroupActions), set by set in the order of their first case, each
// in model order; only sets of two or more.
func joinedSets(cs []int, key []string) [][]int {
	var out [][]int
	at := map[string]int{}
	for _, c := range cs {
		i, ok := at[key[c]]
		if !ok {
			i = len(out)
			at[key[c]] = i
			out = append(out, nil)
		}
		out[i] = append(out[i], c)
	}
	sets := out[:0]
	for _, s := range out {
		if len(s) > 1 {
			sets = append(sets, s)
		}
	}
	if len(sets) == 0 {
		return nil
	}
	return sets
}

// Groups returns, per case, the index of the set of explicitly joined
// cases it is in (an entry of some [Alternative.Joined], numbered in the
// order of the actions, their alternatives and their sets), or -1 for a
// case joined explicitly with no other; nil when no case is. It is what
// envelope.Settings.Groups takes.
func (a *Actions) Groups() []int {
	var g []int
	n := 0
	for _, act := range a.List {
		for _, alt := range act.Alternatives {
			for _, set := range alt.Joined {
				if g == nil {
					g = make([]int, len(a.Of))
					for c := range g {
						g[c] = -1
					}
				}
				for _, c := range set {
					g[c] = n
				}
				n++
			}
		}
	}
	return g
}

// defaultNote describes the wind, seismic, snow, temperature and
// settlement cases grouped by default when there is more than one of a
// kind.
func defaultNote(cases []Case, keyed map[Kind]bool) string {
	var parts []string
	for _, k := range []Kind{Wind, Seismic, Snow, Temperature, Settlement} {
		if keyed[k] {
			continue
		}
		var names []string
		for _, c := range cases {
			if c.Kind == k {
				names = append(names, c.Name)
			}
		}
		if len(names) < 2 {
			continue
		}
		how := "as one action, all acting together"
		if _, each := grouped(k); each {
			how = "as alternatives of one action, one at a time"
		}
		parts = append(parts, fmt.Sprintf("%s cases %s %s", k, strings.Join(names, ", "), how))
	}
	if len(parts) == 0 {
		return ""
	}
	return "cases read by the default rule: " + strings.Join(parts, "; ") +
		". To group them otherwise give action, alternative or with (docs/combinations.md)."
}

func sortCaseErrors(es CaseErrors) {
	sort.SliceStable(es, func(i, j int) bool { return es[i].Case < es[j].Case })
}

// Clash returns two cases of the combination, with factors other than 0,
// that are alternatives of one action and so can never act together; ok is
// false when there are none. c1 comes before c2 in the combination.
func (a *Actions) Clash(cb *Combination) (c1, c2 int, ok bool) {
	for i, t := range cb.Terms {
		if t.Factor == 0 {
			continue
		}
		p := a.Of[t.Case]
		for _, u := range cb.Terms[i+1:] {
			if u.Factor == 0 {
				continue
			}
			q := a.Of[u.Case]
			if p.Action == q.Action && p.Alternative != q.Alternative {
				return t.Case, u.Case, true
			}
		}
	}
	return 0, 0, false
}
