package main

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// stationDoc is the part of the JSON output about stations and reactions.
type stationDoc struct {
	Members []struct {
		Name     string
		Stations []struct {
			X    float64
			N, V struct{ Max, Min float64 }
			M    struct {
				Max, Min           float64
				MaxSpans, MinSpans []string
				MaxLoaded          int `json:"max_loaded"`
				MinLoaded          int `json:"min_loaded"`
			}
		}
	}
	Reactions []map[string]json.RawMessage
}

func stationsJSON(t *testing.T, path string) stationDoc {
	t.Helper()
	code, out, stderr := exec("run", path, "--json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var doc stationDoc
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	return doc
}

// At a member's end stations V and N are the values inside the member.
func TestEndStationsAreInsideTheMember(t *testing.T) {
	// A 3 m cantilever carrying 10 kN at its free end T and 4 kN along
	// it (direction x, so N too) at the same end: by statics the member
	// carries V and N of the loads right from its tip. Drawn from the
	// tip, the loads are at x = 0; drawn from the root, at x = L.
	for _, drawn := range []struct{ start, end string }{{"T", "R"}, {"R", "T"}} {
		name := drawn.start + "-" + drawn.end
		at := 0.0
		if drawn.start == "R" {
			at = 3
		}
		src := tsection("S", 2e8, 0.01, 1e-4, 0) + tnode("R", 3, 0, "fixed") + tnode("T", 0, 0, "") +
			tmember(drawn.start, drawn.end, "S") +
			tdead(tpoint(name, 10, at), fmt.Sprintf("  [[case.load]]\n  type = \"point\"\n  direction = \"x\"\n  on = %q\n  P = 4\n  at = %g\n", name, at))
		doc := stationsJSON(t, writeModel(t, src))
		st := doc.Members[0].Stations
		for _, i := range []int{0, len(st) - 1} {
			// By statics the member carries the tip loads all along its
			// length, to the root: |V| = 10, |N| = 4 at every station.
			if math.Abs(math.Abs(st[i].V.Max)-10) > 1e-9 || math.Abs(math.Abs(st[i].N.Max)-4) > 1e-9 {
				t.Errorf("drawn %s, station x = %g: V = %g, N = %g; want |V| = 10, |N| = 4 (statics)", name, st[i].X, st[i].V.Max, st[i].N.Max)
			}
		}
	}
}

// A pattern piece whose effect is only round-off is not listed as loaded.
func TestRoundOffPiecesAreNotListed(t *testing.T) {
	// In the small model the roof beam B2-C2 is hinged at C2: the moment
	// there, and at the top of column C1-C2, is zero by statics, and any
	// piece's effect on it is round-off.
	doc := stationsJSON(t, smallModel)
	for _, m := range doc.Members {
		if m.Name != "C1-C2" && m.Name != "B2-C2" {
			continue
		}
		st := m.Stations[len(m.Stations)-1]
		if len(st.M.MaxSpans)+len(st.M.MinSpans)+st.M.MaxLoaded+st.M.MinLoaded != 0 {
			t.Errorf("%s at the hinge (x = %g, M in [%g, %g]): pieces %v / %v, loaded %d / %d; want none",
				m.Name, st.X, st.M.Min, st.M.Max, st.M.MaxSpans, st.M.MinSpans, st.M.MaxLoaded, st.M.MinLoaded)
		}
	}
}

// A support's free components are not written.
func TestFreeReactionComponentsAreOmitted(t *testing.T) {
	src := tsection("S", 2e8, 0.01, 1e-4, 0) + tnode("A", 0, 0, "pinned") + tnode("B", 6, 0, "roller") +
		tmember("A", "B", "S") + tdead(tudl("A-B", 10))
	doc := stationsJSON(t, writeModel(t, src))
	var got []string
	for _, r := range doc.Reactions {
		var keys []string
		for _, k := range []string{"Fx", "Fy", "M"} {
			if _, ok := r[k]; ok {
				keys = append(keys, k)
			}
		}
		got = append(got, string(r["node"])+":"+strings.Join(keys, ","))
	}
	if s := strings.Join(got, " "); s != `"A":Fx,Fy "B":Fy` {
		t.Errorf("reactions %s, want A with Fx and Fy (pinned), B with Fy (roller)", s)
	}
	for _, r := range doc.Reactions {
		var e struct {
			MaxWith map[string]float64 `json:"max_with"`
		}
		json.Unmarshal(r["Fy"], &e)
		if _, ok := e.MaxWith["M"]; ok {
			t.Errorf("node %s: max_with names the free moment: %v", r["node"], e.MaxWith)
		}
	}
}

// A combination whose values overflow is an error naming it; nothing is
// written.
func TestNonFiniteResultsAreErrors(t *testing.T) {
	src := tsection("S", 2e8, 0.01, 1e-4, 0) + tnode("A", 0, 0, "pinned") + tnode("B", 6, 0, "roller") +
		tmember("A", "B", "S") +
		"[[case]]\nname = \"D\"\nkind = \"dead\"\n" + tudl("A-B", 10) +
		"[[combination]]\nname = \"huge\"\nfactors = { D = 1e308 }\n"
	p := writeModel(t, src)
	out := filepath.Join(filepath.Dir(p), "out.json")
	code, stdout, stderr := exec("run", p, "--json", out)
	want := "govern run: model.toml: combination \"huge\": V of member \"A-B\" at x = 0 is +Inf, not a finite number: a factor or a load is too large\n"
	if code != 1 || stderr != want || stdout != "" {
		t.Errorf("exit %d, stderr %q, stdout %d bytes; want exit 1 and %q", code, stderr, len(stdout), want)
	}
	if _, err := os.Stat(out); !os.IsNotExist(err) {
		t.Errorf("the JSON file was written: %v", err)
	}
}
