package analysis

import (
	"strings"
	"testing"

	"govern/frame"
)

func TestStaticsErrorAboveTheLimit(t *testing.T) {
	ok := Balance{Case: "D", Balance: frame.Balance{Applied: frame.Resultant{Fy: -100}, Reactions: frame.Resultant{Fy: 100}, Load: 100, Length: 10}}
	// Out by 2e-6 of the load: above the 1e-6 limit.
	bad := Balance{Case: "W", Balance: frame.Balance{Applied: frame.Resultant{Fx: 50}, Reactions: frame.Resultant{Fx: -50}, JointForce: 1e-4, Load: 50, Length: 10}}
	// Out by 1e-7 of the load: within the limit.
	edge := Balance{Case: "L", Balance: frame.Balance{JointMoment: 1e-5, Load: 10, Length: 10}}
	if err := CheckStatics([]Balance{ok, edge}); err != nil {
		t.Errorf("balanced cases gave %v", err)
	}
	err := CheckStatics([]Balance{ok, bad, edge})
	if err == nil {
		t.Fatal("a case out of balance by 2e-6 of its load passed")
	}
	msg := err.Error()
	if !strings.Contains(msg, `case "W" is out of balance by 2e-06 of its load`) || strings.Contains(msg, `case "D"`) || strings.Contains(msg, `case "L"`) {
		t.Errorf("error names the wrong cases: %v", err)
	}
	// Round-off of an ill-conditioned matrix raises the limit.
	bad.RoundOff = 1e-5
	if err := CheckStatics([]Balance{bad}); err != nil {
		t.Errorf("within the round-off limit 1e-5: %v", err)
	}
}
