package main

import (
	"encoding/json"
	"math"
	"strings"
	"testing"

	"govern/envelope/analysis"
)

func TestRunPrintsAndWritesTheStaticsCheck(t *testing.T) {
	model := writeDemo(t)
	code, out, stderr := exec("run", model)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "Statics check of each load case") {
		t.Fatalf("summary lacks the statics check:\n%s", out)
	}
	code, out, stderr = exec("run", model, "--json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var doc struct {
		Statics []struct {
			Case          string             `json:"case"`
			Loads         map[string]float64 `json:"loads"`
			Reactions     map[string]float64 `json:"reactions"`
			JointResidual map[string]float64 `json:"joint_residual"`
			Relative      float64            `json:"relative"`
			Limit         float64            `json:"limit"`
			OK            bool               `json:"ok"`
		} `json:"statics"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Statics) != 4 {
		t.Fatalf("%d statics entries, want one per case (4)", len(doc.Statics))
	}
	for _, s := range doc.Statics {
		// Reactions balance the loads (statics, closed form: ΣF = 0, ΣM = 0).
		for _, k := range []string{"Fx", "Fy", "M"} {
			l, r := s.Loads[k], s.Reactions[k]
			if math.Abs(l+r) > 1e-9*math.Max(1, math.Abs(l)) {
				t.Errorf("case %s: %s loads %g, reactions %g", s.Case, k, l, r)
			}
		}
		if !s.OK || s.Relative > s.Limit || s.Limit != analysis.StaticsLimit {
			t.Errorf("case %s: relative %g, limit %g, ok %v", s.Case, s.Relative, s.Limit, s.OK)
		}
	}
	// The demo's dead load case is gravity only: ΣFx = 0 and ΣFy < 0.
	if d := doc.Statics[0]; d.Case != "D" || d.Loads["Fx"] != 0 || !(d.Loads["Fy"] < 0) {
		t.Errorf("dead load statics = %+v", d)
	}
}
