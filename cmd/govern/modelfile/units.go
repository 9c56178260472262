package modelfile

import (
	"govern/envelope/analysis"
	"govern/frame/units"
)

// readUnits reads [units]: the model's force, length and temperature
// units, to which every value given with a unit is converted, and the
// units the results are shown in. Without [units] a model is in kN, m and
// °C. A unit that is not known, or not of its dimension, is reported at
// its key, and then no value with a unit is converted (nor reported).
func (r *reader) readUnits(top *table) {
	job := r.job
	job.Units = Units{Force: "kN", Length: "m"}
	force, length, temp := "kN", "m", "°C"
	u := top.sub("units", "[units]")
	if u == nil {
		r.setUnits(force, length, temp)
		return
	}
	ok := true
	read := func(key, def string, q units.Quantity) string {
		s := u.str(key, def)
		if !u.has(key) {
			return def
		}
		if _, isString := u.m[key].(string); !isString {
			ok = false // its type is reported
			return def
		}
		v, err := units.Parse(s)
		if err == nil && v.Dim != q.Dim {
			err = wrongDim(v, q)
		}
		if err != nil {
			u.fail(key, problem(ErrValue, "%s = %q: %v", key, s, err))
			ok = false
			return def
		}
		return v.Symbol
	}
	force = read("force", force, units.Force)
	length = read("length", length, units.Length)
	temp = read("temperature", temp, units.TempDiff)
	job.Units.Force, job.Units.Length = force, length
	job.Units.Output = analysis.OutputUnits{
		Force:      read("output_force", "", units.Force),
		Moment:     read("moment", "", units.Moment),
		Deflection: read("deflection", "", units.Length),
	}
	u.done()
	if !ok {
		r.unitsBad = true
		return
	}
	r.setUnits(force, length, temp)
}

// setUnits makes the system of units values are converted to.
func (r *reader) setUnits(force, length, temp string) {
	sys, err := units.NewSystem(force, length, temp)
	if err != nil {
		panic("modelfile: units already checked: " + err.Error())
	}
	r.units = &sys
	r.job.System = sys
}

// wrongDim is the problem of a unit v where one of quantity q is due.
func wrongDim(v units.Unit, q units.Quantity) error {
	return &units.Error{Kind: units.ErrDimension, Msg: v.Symbol + " is " + units.Describe(v.Dim) + ", not " + q.Name + " (such as " + q.Examples + ")"}
}
