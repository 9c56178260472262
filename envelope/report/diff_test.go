package report

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"
	"testing"

	"govern/combos"
	"govern/envelope/analysis"
	"govern/frame"
)

// twoBeams analyses two simply supported beams side by side, not joined:
// a-b of 6 m and c-d of 8 m, each pinned at its left end and on a roller at
// its right, with dead load 10 kN/m on a-b and wD on c-d, live load 5 kN/m
// on both, the combinations 1.4D and 1.2D+1.6L and the service combination
// D+L, and writes its JSON.
func twoBeams(t *testing.T, wD float64) []byte {
	t.Helper()
	udl := func(m int, l, w float64) frame.MemberLoad { return frame.MemberLoad{Member: m, To: l, W: w, WEnd: w} }
	job := &analysis.Job{
		Title: "two beams",
		Units: analysis.Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "B", E: 30e6, A: 0.24, I: 7.2e-3}},
			Nodes: []frame.Node{{Name: "a", Support: frame.Pinned}, {Name: "b", X: 6, Support: frame.Roller},
				{Name: "c", X: 10, Support: frame.Pinned}, {Name: "d", X: 18, Support: frame.Roller}},
			Members: []frame.Member{{Name: "a-b", Start: 0, End: 1}, {Name: "c-d", Start: 2, End: 3}},
			Cases: []frame.Case{
				{Name: "D", MemberLoads: []frame.MemberLoad{udl(0, 6, 10), udl(1, 8, wD)}},
				{Name: "L", MemberLoads: []frame.MemberLoad{udl(0, 6, 5), udl(1, 8, 5)}},
			},
		},
		Cases: []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "L", Kind: combos.Live}},
		Combinations: []combos.Combination{
			{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}},
			{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}},
			{Name: "D+L", Service: true, Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}},
		},
		Settings: analysis.Settings{Stations: 11},
	}
	res, err := analysis.Run(context.Background(), job, analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := New(res).WriteJSON(&b); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// diffTol: the JSON carries 10 significant digits.
const diffTol = 1e-8

func TestDiffOneLoad(t *testing.T) {
	// The dead load on c-d goes from 10 to 12 kN/m; a-b is untouched, so
	// only c-d, its span and its supports may be listed. By statics (simple
	// beam of span L = 8 m, common practice), with w the factored load:
	// 1.2D+1.6L governs the largest effects, w = 1.2 wD + 8; the smallest
	// reaction is 1.2D alone (live load acts only where adverse), 1.2 wD
	// L/2. M max = wL²/8 at midspan (a station), V = ±wL/2 at the ends,
	// and under D+L the deflection 5wL⁴/384EI at midspan, downward.
	const l, ei = 8.0, 30e6 * 7.2e-3
	d, err := Diff("old.json", twoBeams(t, 10), "new.json", twoBeams(t, 12), DefaultDiffOptions)
	if err != nil {
		t.Fatal(err)
	}
	type want struct {
		old, new, x float64
		by          string
	}
	w := func(wD float64) float64 { return 1.2*wD + 1.6*5 }
	defl := func(wD float64) float64 { return -5 * (wD + 5) * math.Pow(l, 4) / (384 * ei) }
	wants := map[string]want{
		"member c-d M max":    {w(10) * l * l / 8, w(12) * l * l / 8, 4, "1.2D+1.6L"},
		"member c-d V max":    {w(10) * l / 2, w(12) * l / 2, 0, "1.2D+1.6L"},
		"member c-d V min":    {-w(10) * l / 2, -w(12) * l / 2, l, "1.2D+1.6L"},
		"reaction c Fy max":   {w(10) * l / 2, w(12) * l / 2, 0, "1.2D+1.6L"},
		"reaction c Fy min":   {1.2 * 10 * l / 2, 1.2 * 12 * l / 2, 0, "1.2D+1.6L"},
		"reaction d Fy max":   {w(10) * l / 2, w(12) * l / 2, 0, "1.2D+1.6L"},
		"reaction d Fy min":   {1.2 * 10 * l / 2, 1.2 * 12 * l / 2, 0, "1.2D+1.6L"},
		"span c-d deflection": {defl(10), defl(12), 4, "D+L"},
	}
	var got []string
	for _, c := range d.Changes {
		key := c.Kind + " " + c.Name + " " + c.Value
		got = append(got, key)
		wt, ok := wants[key]
		if !ok || c.Old == nil || c.New == nil {
			continue
		}
		for _, v := range []struct {
			got  *DesignValue
			want float64
		}{{c.Old, wt.old}, {c.New, wt.new}} {
			if math.Abs(v.got.V-v.want) > diffTol*math.Abs(v.want) || v.got.By != wt.by || (v.got.HasX && math.Abs(v.got.X-wt.x) > diffTol) {
				t.Errorf("%s: %+v, want %g at x = %g by %s", key, *v.got, v.want, wt.x, wt.by)
			}
		}
	}
	sort.Strings(got)
	var keys []string
	for k := range wants {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	if strings.Join(got, "\n") != strings.Join(keys, "\n") {
		t.Errorf("listed:\n%s\nwant:\n%s", strings.Join(got, "\n"), strings.Join(keys, "\n"))
	}
	// Both beams' values were compared: 6 of N, V and M per member, the
	// reactions' largest and smallest Fx and Fy at the pinned a and c and
	// Fy at the rollers b and d, and two spans.
	if want := 2*6 + 2*(4+2) + 2; d.Compared != want {
		t.Errorf("compared %d, want %d", d.Compared, want)
	}
	var out bytes.Buffer
	if err := d.WriteText(&out); err != nil {
		t.Fatal(err)
	}
	for _, s := range []string{"8 listed", "Members", "Spans and cantilevers", "Reactions", "│ M max │  old │       160.00 │ 4.00 │ 1.2D+1.6L │", "179.20", "19.20"} {
		if !strings.Contains(out.String(), s) {
			t.Errorf("the listing lacks %q:\n%s", s, out.String())
		}
	}
	if strings.Contains(out.String(), "a-b") {
		t.Errorf("a-b is listed:\n%s", out.String())
	}
}

func TestDiffTolerance(t *testing.T) {
	old, new := twoBeams(t, 10), twoBeams(t, 10.05)
	t.Run("identical files: nothing listed", func(t *testing.T) {
		d, err := Diff("a.json", old, "b.json", old, DefaultDiffOptions)
		if err != nil || len(d.Changes) != 0 || d.Compared == 0 {
			t.Fatalf("%v, %+v", err, d)
		}
		var out bytes.Buffer
		d.WriteText(&out)
		if !strings.Contains(out.String(), "0 listed") || strings.Contains(out.String(), "Members") {
			t.Errorf("%s", out.String())
		}
	})
	// 0.05 kN/m more dead load on c-d: 1.2 × 0.05 = 0.06 on 20 kN/m under
	// 1.2D+1.6L, 0.3 %; 0.5 % of the smallest reaction (1.2D alone).
	t.Run("below 1 %: nothing listed", func(t *testing.T) {
		d, err := Diff("a.json", old, "b.json", new, DefaultDiffOptions)
		if err != nil || len(d.Changes) != 0 {
			t.Fatalf("%v, %+v", err, d.Changes)
		}
	})
	t.Run("0.1 %: listed", func(t *testing.T) {
		d, err := Diff("a.json", old, "b.json", new, DiffOptions{Relative: 0.001, Floor: 0.001})
		if err != nil || len(d.Changes) != 8 {
			t.Fatalf("%v, %d changes", err, len(d.Changes))
		}
	})
	t.Run("the floor: a value near zero", func(t *testing.T) {
		// A value of 0.01 against a member's largest of 100: changed by
		// 100 % of itself but less than 0.1 % of 100.
		if changed(0.01, 0.05, 100, DefaultDiffOptions) || !changed(0.01, 0.2, 100, DefaultDiffOptions) {
			t.Error("floor")
		}
		if changed(100, 100.9, 100, DefaultDiffOptions) || !changed(100, 101.1, 100, DefaultDiffOptions) {
			t.Error("relative")
		}
	})
}

func TestDiffMembersInOneFile(t *testing.T) {
	old := twoBeams(t, 10)
	renamed := bytes.ReplaceAll(old, []byte(`"c-d"`), []byte(`"C-D"`))
	d, err := Diff("old.json", old, "new.json", renamed, DefaultDiffOptions)
	if err != nil {
		t.Fatal(err)
	}
	var onlyOld, onlyNew int
	for _, c := range d.Changes {
		switch {
		case c.Old == nil && c.Name == "C-D":
			onlyNew++
		case c.New == nil && c.Name == "c-d":
			onlyOld++
		default:
			t.Errorf("listed %+v", c)
		}
	}
	// The member's six values, each way (the span is named by its end
	// nodes, which kept their names).
	if onlyOld != 6 || onlyNew != 6 {
		t.Errorf("only in old %d, only in new %d", onlyOld, onlyNew)
	}
}

func TestDiffBadFiles(t *testing.T) {
	good := twoBeams(t, 10)
	for _, tc := range []struct {
		name string
		data []byte
		want string
	}{
		{"not JSON", []byte("{\n \"format\": \"govern.envelopes/2\",\n oops\n}"), `bad.json:3: not a result file this version of govern reads: not valid JSON`},
		{"empty", nil, `bad.json:1: not a result file this version of govern reads: not valid JSON: unexpected end of JSON input`},
		{"no format", []byte(`{"members": []}`), `bad.json: not a result file this version of govern reads: it has no "format"`},
		{"other version", bytes.Replace(good, []byte(JSONFormat), []byte("govern.envelopes/1"), 1),
			`bad.json: not a result file this version of govern reads: its format is "govern.envelopes/1", and this version reads "` + JSONFormat + `" only`},
		{"wrong type", bytes.Replace(good, []byte(`"x": 0.8,`), []byte(`"x": "0.8",`), 1), `bad.json:`},
		{"a station without M", bytes.Replace(good, []byte(`"M": {"max"`), []byte(`"Mx": {"max"`), 1), `member "a-b", station 1 lacks x, N, V or M`},
		{"no units", bytes.Replace(good, []byte(`"units"`), []byte(`"unit"`), 1), `it has no "units"`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Diff("good.json", good, "bad.json", tc.data, DefaultDiffOptions)
			if err == nil || !strings.Contains(err.Error(), tc.want) || !errors.Is(err, ErrNotResults) {
				t.Errorf("err = %v\nwant it to contain %q", err, tc.want)
			}
		})
	}
	t.Run("wrong type says where", func(t *testing.T) {
		bad := bytes.Replace(good, []byte(`"x": 0.8,`), []byte(`"x": "0.8",`), 1)
		line := 1 + bytes.Count(bad[:bytes.Index(bad, []byte(`"x": "0.8"`))], []byte("\n"))
		_, err := Diff("good.json", good, "bad.json", bad, DefaultDiffOptions)
		if want := fmt.Sprintf("bad.json:%d:", line); err == nil || !strings.HasPrefix(err.Error(), want) || !strings.Contains(err.Error(), "x") {
			t.Errorf("err = %v, want it to start %q", err, want)
		}
	})
	t.Run("different units", func(t *testing.T) {
		other := bytes.Replace(good, []byte(`"force": "kN"`), []byte(`"force": "kip"`), 1)
		_, err := Diff("good.json", good, "kip.json", other, DefaultDiffOptions)
		if err == nil || !strings.Contains(err.Error(), "good.json is in kN, m, kN·m and m (force, length, moment, deflection), kip.json in kip, m, kN·m and m: the values cannot be compared") {
			t.Errorf("err = %v", err)
		}
	})
	t.Run("different output units of deflection", func(t *testing.T) {
		other := bytes.Replace(good, []byte(`"deflection": "m"`), []byte(`"deflection": "mm"`), 1)
		if bytes.Equal(other, good) {
			t.Fatal("no deflection unit in the file")
		}
		_, err := Diff("good.json", good, "mm.json", other, DefaultDiffOptions)
		if err == nil || !strings.Contains(err.Error(), "good.json is in kN, m, kN·m and m (force, length, moment, deflection), mm.json in kN, m, kN·m and mm") {
			t.Errorf("err = %v", err)
		}
	})
	t.Run("a file that gives force and length only", func(t *testing.T) {
		// Written before moments and deflections had units of their own:
		// its moments are in kN·m and its deflections in m, as the new
		// file's.
		old := bytes.Replace(good, []byte(`"units": {"force": "kN", "length": "m", "moment": "kN·m", "deflection": "m"}`), []byte(`"units": {"force": "kN", "length": "m"}`), 1)
		if bytes.Equal(old, good) {
			t.Fatal("units not as expected")
		}
		d, err := Diff("old.json", old, "good.json", good, DefaultDiffOptions)
		if err != nil || len(d.Changes) != 0 || d.Compared == 0 {
			t.Errorf("err = %v, %d changes of %d", err, len(d.Changes), d.Compared)
		}
	})
}
