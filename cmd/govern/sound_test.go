package main

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Sound structures the solver once refused, end to end: a node where every
// member end is released, a frame far from the origin, and an
// ill-conditioned one run with --accept-ill-conditioned.

// envelopesDoc is the part of the JSON output these tests read.
type envelopesDoc struct {
	Condition *struct {
		Estimate   float64 `json:"estimate"`
		DigitsLost float64 `json:"digits_lost"`
		Accepted   bool    `json:"accepted"`
	} `json:"condition"`
	Members []struct {
		Name     string
		Stations []struct {
			X float64
			M struct {
				Max float64 `json:"max"`
				Min float64 `json:"min"`
			}
		}
	} `json:"members"`
	Reactions []struct {
		Node      string `json:"node"`
		Fx, Fy, M struct {
			Max float64 `json:"max"`
			Min float64 `json:"min"`
		}
	} `json:"reactions"`
	Statics []struct {
		Case     string `json:"case"`
		Loads    struct{ Fx, Fy, M float64 }
		Relative float64 `json:"relative"`
		OK       bool    `json:"ok"`
	} `json:"statics"`
}

func runJSON(t *testing.T, args ...string) (doc envelopesDoc, stderr string) {
	t.Helper()
	code, out, stderr := exec(append([]string{"run", "--json", "-"}, args...)...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("output is not JSON: %v", err)
	}
	return doc, stderr
}

// soundTol is the agreement asked of results with closed forms: the JSON
// carries 10 significant digits.
const soundTol = 1e-9

func closeTo(got, want float64) bool {
	return math.Abs(got-want) <= soundTol*math.Max(1, math.Abs(want))
}

func TestReleasedNodeRunsAsTwoSimpleSpans(t *testing.T) {
	// testdata/released-node.toml: spans A-B and B-C of L = 5 under
	// w = 5, every member end at B released. Simply supported beam under a
	// UDL: wL²/8 = 15.625 at midspan, 0 at the supports, wL/2 = 12.5 at each
	// end (AISC Steel Construction Manual, Table 3-23, case 1; recalled from
	// memory); B takes wL/2 from each span, 25. Statics: ΣFy = 2wL = 50.
	const l, w = 5.0, 5.0
	doc, stderr := runJSON(t, filepath.Join("..", "..", "testdata", "released-node.toml"))
	if stderr != "" {
		t.Errorf("stderr: %s", stderr)
	}
	for _, m := range doc.Members {
		for _, st := range m.Stations {
			want := w * st.X * (l - st.X) / 2 // wx(L - x)/2, wL²/8 at L/2
			if !closeTo(st.M.Max, want) || !closeTo(st.M.Min, want) {
				t.Errorf("member %s M(%g) = %g … %g, want w x (L - x)/2 = %g", m.Name, st.X, st.M.Min, st.M.Max, want)
			}
		}
		if mid := m.Stations[len(m.Stations)/2]; mid.X != l/2 || !closeTo(mid.M.Max, w*l*l/8) {
			t.Errorf("member %s midspan M(%g) = %g, want wL²/8 = %g", m.Name, mid.X, mid.M.Max, w*l*l/8)
		}
	}
	want := map[string]float64{"A": w * l / 2, "B": w * l, "C": w * l / 2}
	if len(doc.Reactions) != 3 {
		t.Fatalf("%d reactions, want 3", len(doc.Reactions))
	}
	for _, r := range doc.Reactions {
		if !closeTo(r.Fy.Max, want[r.Node]) || !closeTo(r.Fy.Min, want[r.Node]) {
			t.Errorf("reaction Fy at %s = %g … %g, want %g", r.Node, r.Fy.Min, r.Fy.Max, want[r.Node])
		}
	}
	if len(doc.Statics) != 1 || !doc.Statics[0].OK || !closeTo(doc.Statics[0].Loads.Fy, -2*w*l) {
		t.Errorf("statics %+v, want ΣFy = -2wL and ok", doc.Statics)
	}
}

func TestFrameFarFromTheOriginPassesStatics(t *testing.T) {
	// testdata/far-from-origin.toml: a pinned-base portal 8 wide and 4
	// high with its lower left corner at (1e12, 0), w = 12 on the beam, H =
	// 30 at the left corner. By statics about the corner: loads ΣM =
	// -wL·L/2 - H·h = -504; the right base takes (wL·L/2 + H·h)/L = 63 up,
	// the left wL - 63 = 33.
	model := filepath.Join("..", "..", "testdata", "far-from-origin.toml")
	doc, _ := runJSON(t, model)
	if len(doc.Statics) != 1 {
		t.Fatalf("%d statics entries", len(doc.Statics))
	}
	s := doc.Statics[0]
	if !s.OK || !(s.Relative < 1e-12) || !closeTo(s.Loads.M, -504) {
		t.Errorf("statics: ok %v, out of balance %g, loads ΣM %g; want ok, round-off, -504 about the corner", s.OK, s.Relative, s.Loads.M)
	}
	fy := map[string]float64{}
	for _, r := range doc.Reactions {
		fy[r.Node] = r.Fy.Max
	}
	if !closeTo(fy["A0"], 33) || !closeTo(fy["B0"], 63) {
		t.Errorf("reactions Fy A0 %g, B0 %g; want 33 and 63", fy["A0"], fy["B0"])
	}
	code, out, stderr := exec("run", model)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if want := "sums about (1e+12, 0), the lower left corner of the frame"; !strings.Contains(out, want) {
		t.Errorf("the statics table does not say %q:\n%s", want, out)
	}
}

func TestAcceptIllConditioned(t *testing.T) {
	// testdata/bad/ill-conditioned.toml is refused (its golden file holds
	// the message); with the flag it runs, and every output carries the
	// estimate. The cantilever is statically determinate: by statics the
	// support takes Fy = 1 and M = P·x = 4 cos 30° = 2√3 (the digits the
	// estimate leaves are enough for that).
	model := filepath.Join("..", "..", "testdata", "bad", "ill-conditioned.toml")
	doc, stderr := runJSON(t, "--accept-ill-conditioned", model)
	c := doc.Condition
	if c == nil || !(c.Estimate > 1e13 && c.Estimate < 1e16) || !c.Accepted || c.DigitsLost != math.Round(math.Log10(c.Estimate)) {
		t.Fatalf("condition %+v, want an accepted estimate between 1e13 and 1e16", c)
	}
	if !strings.Contains(stderr, "govern run: warning: ill-conditioned.toml: the stiffness matrix is ill-conditioned: estimated condition number") ||
		!strings.Contains(stderr, "solved only because that was accepted") {
		t.Errorf("stderr lacks the warning:\n%s", stderr)
	}
	digits := math.Pow(10, -(16 - math.Log10(c.Estimate)))
	if r := doc.Reactions; len(r) != 1 || math.Abs(r[0].Fy.Max-1) > 10*digits || math.Abs(r[0].M.Max-2*math.Sqrt(3)) > 10*digits*2*math.Sqrt(3) {
		t.Errorf("reactions %+v, want Fy = 1, M = 2√3", r)
	}

	dir := t.TempDir()
	code, out, stderr := exec("run", "--accept-ill-conditioned", "--out", dir, model)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	note := "Ill-conditioned stiffness matrix: estimated condition number "
	flat := strings.Join(strings.Fields(out), " ") // notes are wrapped to the terminal's width
	if !strings.Contains(flat, note) || !strings.Contains(flat, "solved only because --accept-ill-conditioned was given") {
		t.Errorf("the terminal summary lacks the estimate:\n%s", out)
	}
	html, err := os.ReadFile(filepath.Join(dir, reportName))
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(html), note) {
		t.Errorf("the report lacks the estimate")
	}
	f, err := os.Open(filepath.Join(dir, csvName))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	last := rows[len(rows)-1]
	if last[2] != "condition_number" || last[3] == "" || last[0] != "" {
		t.Errorf("last CSV row %q, want the condition number", last)
	}

	// Without the flag: refused, and nothing is written.
	code, out, stderr = exec("run", model)
	if code != 1 || out != "" || !strings.Contains(stderr, "(govern run --accept-ill-conditioned solves it anyway, and every output then carries the estimate)") {
		t.Errorf("exit %d, stdout %q, stderr %q", code, out, stderr)
	}
	// A model that needs no acceptance says nothing of it.
	doc, _ = runJSON(t, "--accept-ill-conditioned", filepath.Join("..", "..", "testdata", "released-node.toml"))
	if doc.Condition != nil {
		t.Errorf("condition %+v on a well-conditioned model", doc.Condition)
	}
}

func TestConsistentUnitsRunAlike(t *testing.T) {
	// testdata/portal.toml in kN and m, testdata/portal-n-mm.toml the same
	// frame in N and mm. A change of consistent units scales the stiffness
	// matrix by a diagonal matrix, which the condition estimate (of the
	// matrix scaled to unit diagonal) does not see: govern check prints the
	// same estimate for both, neither warns, and the envelopes agree once
	// converted (moments ×1e6, x ×1e3).
	kn := filepath.Join("..", "..", "testdata", "portal.toml")
	mm := filepath.Join("..", "..", "testdata", "portal-n-mm.toml")
	estimate := func(model string) string {
		code, out, stderr := exec("check", model)
		if code != 0 || stderr != "" {
			t.Fatalf("check %s: exit %d: %s", model, code, stderr)
		}
		for _, line := range strings.Split(out, "\n") {
			if strings.HasPrefix(line, "stability:") {
				return line
			}
		}
		t.Fatalf("check %s prints no stability line:\n%s", model, out)
		return ""
	}
	if a, b := estimate(kn), estimate(mm); a != b {
		t.Errorf("kN and m: %q\nN and mm: %q", a, b)
	}
	a, stderrA := runJSON(t, kn)
	b, stderrB := runJSON(t, mm)
	if stderrA != "" || stderrB != "" || a.Condition != nil || b.Condition != nil {
		t.Errorf("warnings: %q, %q", stderrA, stderrB)
	}
	if len(a.Members) != len(b.Members) {
		t.Fatalf("%d and %d members", len(a.Members), len(b.Members))
	}
	for i, m := range a.Members {
		for k, st := range m.Stations {
			o := b.Members[i].Stations[k]
			if !closeTo(o.X/1e3, st.X) || !closeTo(o.M.Max/1e6, st.M.Max) || !closeTo(o.M.Min/1e6, st.M.Min) {
				t.Errorf("member %s station %d: M %g … %g at %g in kN·m, %g … %g at %g in N·mm", m.Name, k, st.M.Min, st.M.Max, st.X, o.M.Min, o.M.Max, o.X)
			}
		}
	}
}
