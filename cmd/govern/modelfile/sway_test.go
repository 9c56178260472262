package modelfile

import (
	"errors"
	"strings"
	"testing"

	"govern/envelope/analysis"
)

// TestReadSway reads the keys of second-order analysis, notional loads
// and stiffness reduction into the job (docs/model-format.md).
func TestReadSway(t *testing.T) {
	src := "[analysis]\nsecond_order = true\nnotional = \"aisc360\"\ntau_b = \"fy\"\nstiffness_EI = 0.8\nstiffness_EA = 0.8\ntolerance = 1e-8\n" +
		strings.Replace(base, "I = 1e-4\n", "I = 1e-4\nstrength_I = 0.35\nFy = \"345 MPa\"\n", 1) +
		"[[combination]]\nname = \"G\"\nfactors = { G = 1.0 }\nservice = true\n"
	job, err := Read("m.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	st := job.Sway
	if st.Notional != analysis.NotionalAISC360 || st.TauB != analysis.TauBFy || st.StrengthEI != 0.8 || st.StrengthEA != 0.8 || st.Tolerance != 1e-8 {
		t.Errorf("sway %+v", st)
	}
	// Fy in MPa read into the model's kN and m: 345 MPa = 345,000 kN/m².
	if len(st.SectionI) != 1 || st.SectionI[0] != 0.35 || len(st.Fy) != 1 || st.Fy[0] != 345000 {
		t.Errorf("section factors %v, Fy %v", st.SectionI, st.Fy)
	}
	want := []analysis.Method{{SecondOrder: true, Stiffness: analysis.Strength}, {SecondOrder: true, Stiffness: analysis.Service}}
	if len(job.Methods) != 2 || job.Methods[0] != want[0] || job.Methods[1] != want[1] {
		t.Errorf("methods %+v, want %+v", job.Methods, want)
	}
	t.Run("a number is a ratio", func(t *testing.T) {
		job, err := Read("m.toml", []byte("[analysis]\nnotional = 0.003\n"+base))
		if err != nil {
			t.Fatal(err)
		}
		if job.Sway.Notional != analysis.NotionalRatio || job.Sway.NotionalRatio != 0.003 || job.Methods != nil {
			t.Errorf("sway %+v, methods %v", job.Sway, job.Methods)
		}
	})
}

// TestReadSwayErrors: each bad value is an error naming the key and its
// line.
func TestReadSwayErrors(t *testing.T) {
	for _, tc := range []struct {
		name, analysis, want string
	}{
		{"unknown rule", `notional = "aisc"`, `m.toml:2: [analysis]: notional = "aisc"`},
		{"ratio too large", `notional = 0.5`, `m.toml:2: [analysis]: notional = 0.5: a ratio of notional load to gravity load must be above 0 and below 0.1`},
		{"stiffness factor above 1", `stiffness_EI = 1.2`, `m.toml:2: [analysis]: stiffness_EI = 1.2: a factor on the stiffness must be above 0 and at most 1`},
		{"tolerance", `tolerance = 0.5`, `m.toml:2: [analysis]: tolerance = 0.5`},
		{"tau_b", `tau_b = "yes"`, `m.toml:2: [analysis]: tau_b = "yes"`},
		{"second_order not a boolean", `second_order = "yes"`, `m.toml:2: [analysis]: second_order must be`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Read("m.toml", []byte("[analysis]\n"+tc.analysis+"\n"+base))
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("got %v, want %q", err, tc.want)
			}
			var el ErrorList
			if !errors.As(err, &el) {
				t.Errorf("not an ErrorList: %T", err)
			}
		})
	}
	_, err := Read("m.toml", []byte(strings.Replace(base, "I = 1e-4\n", "I = 1e-4\nstrength_I = 1.5\n", 1)))
	if err == nil || !strings.Contains(err.Error(), `m.toml:6: section "S": strength_I = 1.5: a factor on I must be above 0 and at most 1`) {
		t.Errorf("strength_I = 1.5: %v", err)
	}
}
