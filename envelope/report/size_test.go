package report

import (
	"fmt"
	"strings"
	"testing"

	"govern/combos"
	"govern/envelope/analysis"
	"govern/frame"
)

func TestCheckSize(t *testing.T) {
	longName := strings.Repeat("1.2D+1.6L+", 11) // 110 characters
	// 984 members (a grid of 20 bays × 24 storeys has 21 × 24 columns and
	// 20 × 24 beams); at 1001 stations, 984,984 station values, under
	// analysis.MaxStationValues.
	mo := &frame.Model{}
	for i := range 984 {
		mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("M%06d", i)}) // 9 characters as a JSON string
	}
	job := &analysis.Job{Model: mo, Units: analysis.Units{Force: "kN", Length: "m"}, Settings: analysis.Settings{Stations: 1001},
		Combinations: []combos.Combination{{Name: longName}}}
	if err := CheckSize(job, Formats{CSV: true}); err != nil {
		t.Errorf("CSV refused: %v", err)
	}
	// JSON: 984,984 × (450 + 6 × 112) bytes, the name being 112 characters
	// as a JSON string, plus 984 × (120 + 3 × 9) for the members.
	want := fmt.Sprintf("the JSON output would be about %d MiB; the limit is 1024 MiB: use fewer stations", (984984*(450+6*112)+984*(120+3*9)+1<<20-1)>>20)
	if err := CheckSize(job, Formats{JSON: true}); err == nil || err.Error() != want {
		t.Errorf("err = %v, want %s", err, want)
	}
	if err := CheckSize(job, Formats{}); err != nil {
		t.Errorf("no output asked for: %v", err)
	}
	job.Settings.Stations = 1017 // 1,000,728 station values
	want = "the envelopes would hold 1,000,728 station values (984 members × 1,017 stations); the limit is 1,000,000: use fewer stations"
	if err := CheckSize(job, Formats{}); err == nil || err.Error() != want {
		t.Errorf("err = %v, want %s", err, want)
	}
}
