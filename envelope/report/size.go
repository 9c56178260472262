package report

import (
	"encoding/json"
	"fmt"

	"govern/envelope/analysis"
)

// MaxOutput is the largest output (JSON, CSV, report or terminal tables)
// the command writes, in bytes: refused before the analysis when
// CheckSize's estimate already passes it, else stopped while being
// written, the previous file kept (docs/errors.md).
const MaxOutput = 1 << 30

// Formats says which outputs are asked for, for CheckSize.
type Formats struct {
	JSON, CSV, HTML bool
	Cases           bool // the CSV of the load case results
}

// CheckSize refuses a job whose envelopes (analysis.Job.CheckSize) or
// requested outputs would be past the limits. The output sizes are quick
// estimates of the part of each station's record that is always there
// (numbers at their longest, names at their longest, but no lists of
// loaded spans), so an output they pass certainly passes MaxOutput.
func CheckSize(job *analysis.Job, f Formats) error {
	if err := job.CheckSize(); err != nil {
		return err
	}
	members := len(job.Model.Members)
	points := members * job.Settings.Stations
	combo := 0 // longest combination name, as JSON
	for _, cb := range job.Combinations {
		combo = max(combo, jsonLen(cb.Name))
	}
	member := 0
	for _, m := range job.Model.Members {
		member = max(member, jsonLen(m.Name))
	}
	// The load case results: per case, six end forces a member and three
	// displacements a node (the reactions left out of the estimate).
	caseValues := len(job.Model.Cases) * (6*members + 3*len(job.Model.Nodes))
	u := job.Units
	unit := max(len(u.Force), len(u.Moment()), len(u.Output.Force), len(u.Output.Moment), len(u.Output.Deflection))
	for _, o := range []struct {
		asked bool
		what  string
		size  int
	}{
		// Per station: x and, for N, V and M, two numbers of up to 24
		// characters, two combination names and the layout around them.
		{f.JSON, "JSON", points*(450+6*combo) + members*(120+3*member) + caseValues*10},
		// Per station three rows: member, x, effect, two numbers, two names, unit.
		{f.CSV, "CSV", points * 3 * (80 + member + 2*combo + unit)},
		// Per station a table row of six values with the six combinations'
		// names as titles; per member its heading and four drawings.
		{f.HTML, "report", points*(300+6*combo) + members*(400+3*member) + caseValues*20},
		// One row a value: case, what, name, end, quantity, value, unit.
		{f.Cases, "load case CSV", caseValues * (30 + member + unit)},
	} {
		if o.asked && o.size > MaxOutput {
			return fmt.Errorf("the %s output would be about %s; the limit is %s: use fewer stations", o.what, mib(o.size), mib(MaxOutput))
		}
	}
	return nil
}

// jsonLen returns the length of s as a JSON string.
func jsonLen(s string) int {
	b, _ := json.Marshal(s)
	return len(b)
}
