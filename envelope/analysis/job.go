package analysis

import (
	"errors"
	"fmt"

	"govern/combos"
	"govern/frame"
	"govern/frame/units"
	"govern/patterns"
)

// Units are the units of a job's numbers: its force and length units,
// from which every other follows (E in force/length², moments in
// force·length), and the units its results are shown in. The analysis
// itself never converts a number: every value of the model is in Force
// and Length, and so is every value of the Result; only the outputs
// (package report) show forces, moments and deflections in the units of
// Output.
type Units struct {
	Force, Length string
	// Output gives, per quantity of the results, the unit it is shown in;
	// "" for the model's own. Each must be a unit package units reads, of
	// its quantity's dimension, and then so must Force and Length:
	// [Run] refuses a job whose output units cannot be converted to.
	Output OutputUnits
}

// OutputUnits are the units results are shown in, per quantity.
type OutputUnits struct {
	Force      string // N, V, the reactions Fx and Fy, the statics sums
	Moment     string // M, reaction moments, end moments
	Deflection string // deflections of members and spans
}

// Moment returns the label of a moment in the model's units, such as "kN·m".
func (u Units) Moment() string { return u.Force + "·" + u.Length }

// Shown is a quantity of the results as an output shows it: its unit's
// label and the factor a value in the model's units is multiplied by.
type Shown struct {
	Label  string
	Factor float64
}

// Of returns v in the shown unit.
func (s Shown) Of(v float64) float64 { return v * s.Factor }

// Shown returns how forces, moments and deflections are shown: in the
// units of Output where given, else in the model's own (with factor 1).
// The error names an output unit that cannot be converted to.
func (u Units) Shown() (force, moment, deflection Shown, err error) {
	force, moment, deflection = Shown{u.Force, 1}, Shown{u.Moment(), 1}, Shown{u.Length, 1}
	if u.Output == (OutputUnits{}) {
		return force, moment, deflection, nil
	}
	sys, err := units.NewSystem(u.Force, u.Length, "")
	if err != nil {
		return force, moment, deflection, fmt.Errorf("%w: the model's units (force %q, length %q) are not units that can be converted: %v", ErrUnits, u.Force, u.Length, err)
	}
	for _, o := range []struct {
		label string
		q     units.Quantity
		dst   *Shown
	}{{u.Output.Force, units.Force, &force}, {u.Output.Moment, units.Moment, &moment}, {u.Output.Deflection, units.Length, &deflection}} {
		if o.label == "" {
			continue
		}
		to, err := units.Parse(o.label)
		if err == nil && to.Dim != o.q.Dim {
			err = fmt.Errorf("%s is %s, not %s", to.Symbol, units.Describe(to.Dim), o.q.Name)
		}
		if err != nil {
			return force, moment, deflection, fmt.Errorf("%w: output unit %q: %v", ErrUnits, o.label, err)
		}
		*o.dst = Shown{to.Symbol, sys.SI(o.q.Dim) / to.SI}
	}
	return force, moment, deflection, nil
}

// ErrUnits marks a job whose output units cannot be converted to.
var ErrUnits = errors.New("units")

// Settings are the options of the envelopes that belong to the job.
type Settings struct {
	// Stations is the number of equally spaced stations per member, both
	// ends included; at least 2.
	Stations int
	// AsWritten makes every case of a combination act with its factor
	// everywhere, instead of variable cases acting only where adverse
	// (envelope.Settings.AsWritten).
	AsWritten bool
}

// GridLine is a column line with the name the model gives it, such as
// "A" for the line its "line A" selector picks.
type GridLine struct {
	Name string
	X    float64
}

// Level is a height the model names, such as "level 1"; the lowest is
// level 0, the base.
type Level struct {
	Name string
	Y    float64
}

// MemberFactor scales the effects of one load case in one member: its
// axial force N, shear V and moment M, in every combination and every
// pattern piece of the case. It is how live load reduction (ASCE/SEI 7-16
// 4.7 and 4.8, EN 1991-1-1 6.3.1.2; package envelope/reduction) enters
// the analysis. Reactions are formed from the scaled member end forces
// (envelope.Factors); deflections and the statics check are not scaled.
type MemberFactor struct {
	Member, Case int // indices into the model's members and cases
	N, V, M      float64
	// Accompanying, when HasAccompanying, are the factors on N, V and M
	// in the combinations where the case does not lead (envelope.Leads):
	// EN 1991-1-1 6.3.1.2(11) applies αn only where the imposed load
	// leads.
	Accompanying    [3]float64
	HasAccompanying bool
	// Basis says how the factors were found, for the outputs; the zero
	// value when not told.
	Basis FactorBasis
}

// FactorBasis is how a MemberFactor was found.
type FactorBasis struct {
	Rule   string  // the clause, such as "ASCE/SEI 7-16 4.7.2"
	Area   float64 // the tributary area A_T, in the model's length²
	KLL    float64 // the live load element factor K_LL; 0 where the rule has none
	Floors int     // floors (storeys) supported with load of the case
	Limit  string  // what governed N's factor; "" the equation
	// Ends, for a column, says how V and M were found: the one-floor rule
	// (the larger one-floor factor of the floors at its ends).
	Ends string
}

// Stiffness names the member stiffness a combination is analysed with.
type Stiffness uint8

const (
	// Nominal is the sections as given.
	Nominal Stiffness = iota
	// Strength is the reduced stiffness of a strength analysis (AISC
	// 360-16 C2.3, ACI 318-19 6.6.3.1.1): the factors of
	// [Sway.StrengthEI], [Sway.StrengthEA],
	// [Sway.SectionI] and τb.
	Strength
	// Service is the stiffness for lateral service deflections (ACI
	// 318-19 6.6.3.2.2): each section's I times min(1.4 × its strength
	// factor, 1) where [Sway.SectionI] gives one.
	Service
)

var stiffnessNames = [...]string{"nominal", "strength", "service"}

func (s Stiffness) String() string {
	if int(s) < len(stiffnessNames) {
		return stiffnessNames[s]
	}
	return fmt.Sprintf("Stiffness(%d)", s)
}

// Method is how one combination is analysed. The zero value is the
// first-order elastic analysis with the sections as given.
type Method struct {
	Stiffness Stiffness
	// SecondOrder asks for the geometric stiffness of the combination's
	// own axial forces (P-Δ and P-δ), iterated (see docs/analysis.md).
	SecondOrder bool
	// Allowable marks an allowable stress (ASD) combination: a
	// second-order analysis is made at 1.6 times its loads and the
	// results divided by 1.6 (AISC 360-16 C2.1(d)); its critical load
	// factor must exceed 1.6, and a first-order one takes α = 1.6 in its
	// notional loads (C2.2b).
	Allowable bool
}

// NotionalRule says how notional loads are formed.
type NotionalRule uint8

const (
	NoNotional NotionalRule = iota
	// NotionalAISC360 is AISC 360-16 C2.2b: Ni = 0.002 α Yi.
	NotionalAISC360
	// NotionalEN1993 is EN 1993-1-1 5.3.2: φ = φ0 αh αm.
	NotionalEN1993
	// NotionalRatio is Sway.NotionalRatio times the gravity load.
	NotionalRatio
)

var notionalNames = [...]string{"none", "aisc360", "en1993", "ratio"}

func (n NotionalRule) String() string {
	if int(n) < len(notionalNames) {
		return notionalNames[n]
	}
	return fmt.Sprintf("NotionalRule(%d)", n)
}

// TauB says how AISC 360-16 C2.3(b) is met.
type TauB uint8

const (
	// TauBNone applies no τb (τb = 1).
	TauBNone TauB = iota
	// TauBFy takes τb per member from its section's Fy (Sway.Fy):
	// τb = 4(αPr/Pns)(1 − αPr/Pns) where αPr/Pns > 0.5, Pns = Fy A.
	TauBFy
	// TauBNotional keeps τb = 1 and adds 0.001 α Yi to the notional
	// loads of every combination (C2.3(c)).
	TauBNotional
)

// Sway holds the job's settings for second-order analysis, notional
// loads and stiffness reduction; the zero value asks for none.
type Sway struct {
	Notional NotionalRule
	// NotionalRatio is the ratio of NotionalRatio.
	NotionalRatio float64
	// StrengthEI and StrengthEA are factors on EI and EA of every member
	// with Strength stiffness (AISC 360-16 C2.3(a): 0.8); 0 is taken as 1.
	StrengthEI, StrengthEA float64
	// SectionI, nil or one per section of the model, gives a factor on the
	// section's I with Strength stiffness (ACI 318-19 6.6.3.1.1: 0.35 beams,
	// 0.70 columns; 0: none), and with Service stiffness min(1.4 × it, 1).
	SectionI []float64
	// TauB and Fy (nil or one per section, force/length², 0: none).
	TauB TauB
	Fy   []float64
	// Tolerance is the relative change of the axial forces, of the largest
	// of them, below which the iteration stops; 0 is DefaultTolerance.
	Tolerance float64
}

// DefaultTolerance is the tolerance of the iteration on the axial forces
// when Sway.Tolerance is 0.
const DefaultTolerance = 1e-6

// MaxIterations bounds the iterations on the axial forces.
const MaxIterations = 100

// AllowableScale is the factor an allowable stress combination is
// analysed at in second order (AISC 360-16 C2.1(d)).
const AllowableScale = 1.6

// Job is everything an analysis needs: the frame, its load cases with
// their kinds and actions, the combinations, how patterned cases are
// placed, the settings, and the names of the model's levels and lines.
// The model file reader produces one; a program may build one in code.
//
// Run never modifies a Job, nor anything it points to.
type Job struct {
	Title string
	Units Units
	Model *frame.Model
	// Cases gives, per case of Model, its name and kind; CaseInfo (nil,
	// or one per case) what the combination rules read besides: reversible,
	// EN 1990 category and ψ, action keys.
	Cases    []combos.Case
	CaseInfo []combos.CaseInfo
	// Actions groups the cases into actions and their alternatives, two of
	// which never act together; nil when not grouped. The sets of cases
	// joined explicitly in an alternative (combos.Alternative.Joined) act
	// as a whole where variable loads act only where adverse
	// (envelope.Settings.Groups).
	Actions      *combos.Actions
	Combinations []combos.Combination
	// Set is the rule set the leading combinations were generated from,
	// with the options Params; nil when the combinations were written out.
	// For the record: Run reads only Combinations.
	Set    *combos.Set
	Params combos.Params
	// AllowUnused lets Run analyse a job with load cases that no
	// combination uses (they are left out of every envelope); otherwise
	// such a job is refused (see [Job.Unused]).
	AllowUnused bool

	// Patterned lists the cases whose beam loads are placed piece by
	// piece, Segments the pieces per beam and Patterns how they are
	// placed (package patterns).
	Patterned []int
	Segments  int
	Patterns  patterns.Mode

	Settings Settings

	// Lines are the model's column lines and Levels its levels, each as
	// the model's selectors name them, from the left and from the base.
	// Columns are tabulated line by line; a column on no line is
	// tabulated on its own.
	Lines  []GridLine
	Levels []Level

	// EffectiveDepths, nil or one per section of Model, is each section's
	// effective depth d (length), 0 where not given: the design values
	// give the shear at d from the face of a support. Run does not use it.
	EffectiveDepths []float64

	// MemberFactors are factors on the effects of a case in a member
	// (live load reduction), at most one per member and case.
	MemberFactors []MemberFactor
	// Methods, nil or one per combination, says how each combination is
	// analysed.
	Methods []Method
	// Sway gives the notional loads and the stiffness factors.
	Sway Sway
}

// ErrNotApplied marks a field of a Job that asks for something Run does
// not do yet. No field is refused at present; it stays for the next
// option (DEVELOPERS.md, "How to add an analysis option").
var ErrNotApplied = errors.New("not applied yet")

// ErrUnused marks a load case that no combination uses.
var ErrUnused = errors.New("no load combination uses the case")

// Unused returns the cases that no combination gives a factor other than
// 0, in model order: they would be analysed and left out of every
// envelope.
func (j *Job) Unused() []int {
	used := make([]bool, len(j.Model.Cases))
	for _, cb := range j.Combinations {
		for _, t := range cb.Terms {
			if t.Factor != 0 && t.Case >= 0 && t.Case < len(used) {
				used[t.Case] = true
			}
		}
	}
	var out []int
	for i, u := range used {
		if !u {
			out = append(out, i)
		}
	}
	return out
}

// MaxStationValues is the most station values (members × stations) the
// envelopes of a job may hold, so that a slip such as a thousand stations
// on a large frame is refused with a clear message rather than filling
// memory.
const MaxStationValues = 1_000_000

// CheckSize returns an error when the envelopes of the job would hold more
// than MaxStationValues station values.
func (j *Job) CheckSize() error {
	members := len(j.Model.Members)
	stations := j.Settings.Stations
	if points := members * stations; points > MaxStationValues {
		return fmt.Errorf("the envelopes would hold %s station values (%s members × %s stations); the limit is %s: use fewer stations",
			thousands(points), thousands(members), thousands(stations), thousands(MaxStationValues))
	}
	return nil
}

// thousands formats n with commas between groups of three digits.
func thousands(n int) string {
	s := fmt.Sprint(n)
	out := make([]byte, 0, len(s)+len(s)/3)
	for i := range len(s) {
		if i > 0 && s[i-1] != '-' && (len(s)-i)%3 == 0 {
			out = append(out, ',')
		}
		out = append(out, s[i])
	}
	return string(out)
}

// check returns an error for a job Run cannot analyse as given: parts that
// do not match the model, and fields not applied yet.
func (j *Job) check() error {
	if j.Model == nil {
		return errors.New("analysis: the job has no model")
	}
	nc := len(j.Model.Cases)
	if len(j.Cases) != nc {
		return fmt.Errorf("analysis: the job names %d load cases; the model has %d", len(j.Cases), nc)
	}
	if j.CaseInfo != nil && len(j.CaseInfo) != nc {
		return fmt.Errorf("analysis: the job gives %d case infos; the model has %d cases", len(j.CaseInfo), nc)
	}
	if j.Actions != nil && len(j.Actions.Of) != nc {
		return fmt.Errorf("analysis: the job's actions place %d cases; the model has %d", len(j.Actions.Of), nc)
	}
	if j.Actions != nil {
		for _, act := range j.Actions.List {
			for _, alt := range act.Alternatives {
				for _, set := range alt.Joined {
					for _, c := range set {
						if c < 0 || c >= nc {
							return fmt.Errorf("analysis: the job's actions join case %d; the model has %d", c, nc)
						}
						if k := j.Cases[c].Kind; k.Permanent() {
							return fmt.Errorf("analysis: the job's actions join case %q, of %s load, to others; permanent cases always act and are joined to none", j.Cases[c].Name, k)
						}
					}
				}
			}
		}
	}
	if len(j.Combinations) == 0 {
		return errors.New("analysis: the job has no load combinations")
	}
	if _, _, _, err := j.Units.Shown(); err != nil {
		return err
	}
	for _, cb := range j.Combinations {
		for _, t := range cb.Terms {
			if t.Case < 0 || t.Case >= nc {
				return fmt.Errorf("analysis: combination %q refers to case %d; the model has %d", cb.Name, t.Case, nc)
			}
		}
	}
	seen := map[int]bool{}
	for _, c := range j.Patterned {
		if c < 0 || c >= nc || seen[c] {
			return fmt.Errorf("analysis: patterned case %d is not a case of the model, or is listed twice", c)
		}
		seen[c] = true
	}
	for _, c := range j.Patterned {
		if !j.Cases[c].Kind.AlwaysActs() {
			continue
		}
		for _, cb := range j.Combinations {
			for _, t := range cb.Terms {
				if t.Case == c && t.Factor != 0 && !t.HasFavourable {
					return fmt.Errorf("analysis: patterned case %q is %s load, which combination %q takes with one factor: a permanent case is patterned only where each term that takes it gives a favourable factor (combos.Term.HasFavourable)",
						j.Model.Cases[c].Name, j.Cases[c].Kind, cb.Name)
				}
			}
		}
	}
	if len(j.Patterned) > 0 && j.Segments < 1 {
		return fmt.Errorf("analysis: %d pattern pieces per beam; need at least 1", j.Segments)
	}
	if j.Settings.Stations < 2 {
		return fmt.Errorf("analysis: %d stations per member; need at least 2", j.Settings.Stations)
	}
	if err := j.checkFactors(); err != nil {
		return err
	}
	if j.Methods != nil && len(j.Methods) != len(j.Combinations) {
		return fmt.Errorf("analysis: Job.Methods gives %d methods for %d combinations", len(j.Methods), len(j.Combinations))
	}
	if err := j.checkStability(); err != nil {
		return err
	}
	if !j.AllowUnused {
		var errs []error
		for _, c := range j.Unused() {
			errs = append(errs, fmt.Errorf("case %q: %w, so it would be left out of every envelope; put it in a combination, or set Job.AllowUnused", j.Model.Cases[c].Name, ErrUnused))
		}
		if err := errors.Join(errs...); err != nil {
			return err
		}
	}
	return j.CheckSize()
}
