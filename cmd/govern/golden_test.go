package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strconv"
	"testing"
)

// goldenTol bounds the difference of a number from its golden value:
// relative, with an absolute floor for values that are zero up to
// round-off. The files are compared byte for byte first; numbers are only
// compared within this where the bytes differ, as fused multiply-adds on
// some processors change the last digits.
const goldenTol = 1e-9

// TestGoldenJSONAndCSV compares the JSON and CSV of the small model in
// testdata/output with the files kept there; -update (errors_test.go's
// flag, which rewrites every golden file of this package) rewrites them:
// go test ./cmd/govern -run TestGolden -update. The golden files were checked
// when they were written: the statics check in them balances, and the face
// moments and deflections are checked against closed forms elsewhere
// (faces_test.go, frame and envelope tests); this test guards the layout and
// the values against unintended change.
func TestGoldenJSONAndCSV(t *testing.T) {
	dir := t.TempDir()
	js, cs, cc := filepath.Join(dir, "small.json"), filepath.Join(dir, "small.csv"), filepath.Join(dir, "small.cases.csv")
	if code, _, stderr := exec("run", "--quiet", "--json", js, "--csv", cs, "--cases-csv", cc, smallModel); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	for _, f := range []struct {
		got, golden string
		same        func(got, want []byte) error
	}{
		{js, "../../testdata/output/small.json", sameJSON},
		{cs, "../../testdata/output/small.csv", sameCSV},
		{cc, "../../testdata/output/small.cases.csv", sameCSV},
	} {
		t.Run(filepath.Base(f.golden), func(t *testing.T) {
			got, err := os.ReadFile(f.got)
			if err != nil {
				t.Fatal(err)
			}
			if *update {
				if err := os.WriteFile(f.golden, got, 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(f.golden)
			if err != nil {
				t.Fatalf("%v (run with -update to write it)", err)
			}
			if bytes.Equal(got, want) {
				return
			}
			if err := f.same(got, want); err != nil {
				t.Errorf("%s differs from the golden file: %v\n(run go test ./cmd/govern -run TestGolden -update after checking the change)", f.golden, err)
			}
		})
	}
}

func closeEnough(a, b float64) bool {
	return math.Abs(a-b) <= goldenTol*math.Max(math.Abs(a), math.Abs(b))+goldenTol
}

// sameJSON compares two JSON documents: structure and strings exactly,
// numbers within goldenTol.
func sameJSON(got, want []byte) error {
	var g, w any
	for _, x := range []struct {
		src []byte
		dst *any
	}{{got, &g}, {want, &w}} {
		d := json.NewDecoder(bytes.NewReader(x.src))
		d.UseNumber()
		if err := d.Decode(x.dst); err != nil {
			return err
		}
	}
	return sameValue("$", g, w)
}

func sameValue(path string, g, w any) error {
	switch w := w.(type) {
	case map[string]any:
		gm, ok := g.(map[string]any)
		if !ok || len(gm) != len(w) {
			return fmt.Errorf("%s: %v, want %v", path, g, w)
		}
		for k, v := range w {
			if err := sameValue(path+"."+k, gm[k], v); err != nil {
				return err
			}
		}
		return nil
	case []any:
		ga, ok := g.([]any)
		if !ok || len(ga) != len(w) {
			return fmt.Errorf("%s: %d elements, want %d", path, len(ga), len(w))
		}
		for i := range w {
			if err := sameValue(fmt.Sprintf("%s[%d]", path, i), ga[i], w[i]); err != nil {
				return err
			}
		}
		return nil
	case json.Number:
		gn, ok := g.(json.Number)
		if !ok {
			return fmt.Errorf("%s: %v, want the number %v", path, g, w)
		}
		a, _ := gn.Float64()
		b, _ := w.Float64()
		if !closeEnough(a, b) {
			return fmt.Errorf("%s: %v, want %v", path, a, b)
		}
		return nil
	}
	if !reflect.DeepEqual(g, w) {
		return fmt.Errorf("%s: %v, want %v", path, g, w)
	}
	return nil
}

// sameCSV compares two CSV files cell by cell, numbers within goldenTol.
func sameCSV(got, want []byte) error {
	g, err := csv.NewReader(bytes.NewReader(got)).ReadAll()
	if err != nil {
		return err
	}
	w, err := csv.NewReader(bytes.NewReader(want)).ReadAll()
	if err != nil {
		return err
	}
	if len(g) != len(w) {
		return fmt.Errorf("%d rows, want %d", len(g), len(w))
	}
	for i := range w {
		if len(g[i]) != len(w[i]) {
			return fmt.Errorf("row %d: %d cells, want %d", i+1, len(g[i]), len(w[i]))
		}
		for j := range w[i] {
			a, errA := strconv.ParseFloat(g[i][j], 64)
			b, errB := strconv.ParseFloat(w[i][j], 64)
			if errA == nil && errB == nil {
				if !closeEnough(a, b) {
					return fmt.Errorf("row %d, column %d: %s, want %s", i+1, j+1, g[i][j], w[i][j])
				}
			} else if g[i][j] != w[i][j] {
				return fmt.Errorf("row %d, column %d: %q, want %q", i+1, j+1, g[i][j], w[i][j])
			}
		}
	}
	return nil
}
