package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"

	"govern/cmd/govern/modelfile"
)

// Output limits, so that a slip such as a thousand stations on a large
// frame is refused with a clear message rather than filling memory or the
// disk; see docs/errors.md.
const (
	// maxPoints is the most station values the envelopes may hold:
	// members × stations. Checked before the analysis.
	maxPoints = 1_000_000
	// maxOutput is the largest output (JSON, CSV or summary), in bytes.
	// Refused before the analysis when a quick estimate already passes it,
	// else stopped while being written, the previous file kept.
	maxOutput = 1 << 30
)

// errTooLarge marks an output past maxOutput.
var errTooLarge = errors.New("output too large")

// checkSize refuses a job whose envelopes or requested outputs would be
// past the limits. The output sizes are quick estimates of the part of each
// station's record that is always there (numbers at their longest, names
// at their longest, but no lists of loaded spans), so an output they pass
// certainly passes the limit; capped stops any other while it is written.
func checkSize(job *modelfile.Job, f *runFlags) error {
	members := len(job.Model.Members)
	stations := job.Settings.Stations
	points := members * stations
	if points > maxPoints {
		return fmt.Errorf("the envelopes would hold %s station values (%s members × %s stations); the limit is %s: use fewer stations",
			modelfile.Thousands(points), modelfile.Thousands(members), modelfile.Thousands(stations), modelfile.Thousands(maxPoints))
	}
	combo := 0 // longest combination name, as JSON
	for _, cb := range job.Combinations {
		combo = max(combo, jsonLen(cb.Name))
	}
	member := 0
	for _, m := range job.Model.Members {
		member = max(member, jsonLen(m.Name))
	}
	u := job.Units
	unit := max(len(u.Force), len(u.Moment()))
	jsonPath, csvPath, reportPath := f.json, f.csv, f.report
	if f.out != "" {
		jsonPath, csvPath, reportPath = jsonName, csvName, reportName
	}
	for _, o := range []struct {
		flag, what string
		size       int
	}{
		// Per station: x and, for N, V and M, two numbers of up to 24
		// characters, two combination names and the layout around them.
		{jsonPath, "JSON", points*(450+6*combo) + members*(120+3*member)},
		// Per station three rows: member, x, effect, two numbers, two names, unit.
		{csvPath, "CSV", points * 3 * (80 + member + 2*combo + unit)},
		// Per station a table row of six values with the six combinations'
		// names as titles; per member its heading and four drawings.
		{reportPath, "report", points*(300+6*combo) + members*(400+3*member)},
	} {
		if o.flag != "" && o.size > maxOutput {
			return fmt.Errorf("the %s output would be about %s; the limit is %s: use fewer stations", o.what, mib(o.size), mib(maxOutput))
		}
	}
	return nil
}

// jsonLen returns the length of s as a JSON string.
func jsonLen(s string) int {
	b, _ := json.Marshal(s)
	return len(b)
}

func mib(n int) string { return fmt.Sprintf("%d MiB", (n+1<<20-1)>>20) }

// capped is a writer that refuses to grow past maxOutput: the last line of
// defence behind checkSize's estimates.
type capped struct {
	w    io.Writer
	n    int
	what string
}

func (c *capped) Write(p []byte) (int, error) {
	if c.n+len(p) > maxOutput {
		return 0, fmt.Errorf("%w: the %s output passed %s", errTooLarge, c.what, mib(maxOutput))
	}
	c.n += len(p)
	return c.w.Write(p)
}
