package verification

import (
	"fmt"
	"math"

	"govern/frame"
	"govern/frame/distribution"
)

// Source is a published reference for one or more cases.
type Source struct {
	Key      string // short name used in tables
	Citation string // the full reference
	// Recalled is true when the values were recalled from memory rather than
	// read from the source for this work.
	Recalled bool
	// Check says how the recalled values were confirmed independently, if
	// they were.
	Check string
}

// Method selects the solver a quantity is computed with.
type Method uint8

const (
	Stiffness    Method = iota // frame.Solve, the direct stiffness method
	Distribution               // distribution.Solve, moment distribution
)

func (m Method) String() string {
	if m == Distribution {
		return "moment distribution"
	}
	return "direct stiffness"
}

// Solved gives a quantity's function access to the solutions of a case.
type Solved struct {
	Model *frame.Model
	Sol   *frame.Solution
	Dist  *distribution.Result // nil unless a quantity of the case needs it
}

// Quantity is one published value of a case.
type Quantity struct {
	Name      string  // what it is, with its formula
	Published float64 // the published value for the case's numbers
	Tol       float64 // relative tolerance of the comparison
	Method    Method
	Get       func(s *Solved) float64
}

// Case is a published result: a model and the quantities to compare.
type Case struct {
	Name       string
	Source     *Source
	Model      func() *frame.Model // a model with one load case
	Quantities []Quantity
}

// Result is the outcome of one quantity of one case.
type Result struct {
	Case      string
	Quantity  string
	Method    Method
	Source    *Source
	Published float64
	Computed  float64
	Tol       float64
	// Statics is the statics check of the case's solution as a fraction of
	// its load (frame.Balance.Relative); the same for every quantity of a case.
	Statics float64
	Err     error // the case could not be solved
}

// RelDiff returns |computed − published| / |published|.
func (r Result) RelDiff() float64 {
	return math.Abs(r.Computed-r.Published) / math.Abs(r.Published)
}

// StaticsTol is the largest out-of-balance, as a fraction of the load, that a
// verification case accepts: round-off for these small models (the portal
// frames' axially stiff members raise it to about 1e-9).
const StaticsTol = 1e-8

// Pass reports whether the quantity matches within its tolerance and the
// case's statics check holds.
func (r Result) Pass() bool {
	return r.Err == nil && r.RelDiff() <= r.Tol && r.Statics <= StaticsTol
}

// Run solves every case of cases and compares each quantity.
func Run(cases []Case) []Result {
	var out []Result
	for _, c := range cases {
		s, statics, err := solveCase(c)
		for _, q := range c.Quantities {
			r := Result{Case: c.Name, Quantity: q.Name, Method: q.Method, Source: c.Source, Published: q.Published, Tol: q.Tol, Statics: statics, Err: err}
			if err == nil {
				r.Computed = q.Get(s)
			} else {
				r.Computed = math.NaN()
			}
			out = append(out, r)
		}
	}
	return out
}

func solveCase(c Case) (*Solved, float64, error) {
	mo := c.Model()
	sol, err := frame.Solve(mo)
	if err != nil {
		return nil, math.NaN(), fmt.Errorf("%s: %w", c.Name, err)
	}
	s := &Solved{Model: mo, Sol: sol}
	for _, q := range c.Quantities {
		if q.Method == Distribution {
			if s.Dist, err = distribution.Solve(mo, nil); err != nil {
				return nil, math.NaN(), fmt.Errorf("%s: %w", c.Name, err)
			}
			break
		}
	}
	statics := 0.0
	for i := range mo.Cases {
		statics = math.Max(statics, sol.Balance(i).Relative())
	}
	return s, statics, nil
}
