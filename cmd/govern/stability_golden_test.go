package main

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// TestStabilityGoldens keeps the outputs of frame stability as golden
// files, rewritten with -update after checking the change: the JSON of the
// second-order storey of closed forms (testdata/tables/sway-storey.toml,
// whose meaning envelope/report's stability tests state) and the notional
// loads that govern combos lists for the portal with notional loads (their
// meaning: TestNotionalListingMeaning).
func TestStabilityGoldens(t *testing.T) {
	tables := filepath.Join("..", "..", "testdata", "tables")
	dir := t.TempDir()
	js := filepath.Join(dir, "sway-storey.json")
	if code, _, stderr := exec("run", "--quiet", "--json", js, "--date", "2026-01-01", filepath.Join(tables, "sway-storey.toml")); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	got, err := os.ReadFile(js)
	if err != nil {
		t.Fatal(err)
	}
	check := func(t *testing.T, got []byte, golden string, same func(got, want []byte) error) {
		if *update {
			if err := os.WriteFile(golden, got, 0o644); err != nil {
				t.Fatal(err)
			}
			return
		}
		want, err := os.ReadFile(golden)
		if err != nil {
			t.Fatalf("%v (run with -update to write it)", err)
		}
		if bytes.Equal(got, want) {
			return
		}
		if same == nil {
			t.Errorf("%s differs from the golden file (run go test ./cmd/govern -run TestStabilityGoldens -update after checking the change):\n%s", golden, got)
			return
		}
		if err := same(got, want); err != nil {
			t.Errorf("%s differs from the golden file: %v", golden, err)
		}
	}
	t.Run("sway-storey.json", func(t *testing.T) {
		check(t, got, filepath.Join("..", "..", "testdata", "output", "sway-storey.json"), sameJSON)
	})
	t.Run("notional-portal.combos.golden", func(t *testing.T) {
		code, out, stderr := exec("combos", filepath.Join(tables, "notional-portal.toml"))
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		check(t, []byte(out), filepath.Join(tables, "notional-portal.combos.golden"), nil)
	})
}
