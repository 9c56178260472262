package modelfile

import (
	"fmt"
	"strings"
)

// checkPermanentPatterns reports a permanent case with pattern = true that
// a combination takes with one factor: permanent load is placed span by
// span only where the rule that gives the combination has a
// favourable_factor for it (the case takes the factor on the spans where
// it is adverse and the favourable factor on the others, as BS 8110-1
// clause 3.2.1.2.2 asks: 1.4Gk on the loaded spans and 1.0Gk elsewhere).
// The built-in sets have none: EN 1990 takes all permanent actions from
// one source with one factor (Table A1.2(B) Note 3), and ASCE/SEI 7 gives
// D one factor in each combination. One problem per case, at its pattern
// key, naming the first combination at fault.
func (r *reader) checkPermanentPatterns() {
	if len(r.permPat) == 0 || len(r.errs) > 0 {
		return
	}
	job := r.job
	for _, c := range r.permPat {
		name, kind := job.Model.Cases[c].Name, job.Cases[c].Kind
		for _, cb := range job.Combinations {
			bad := false
			for _, tm := range cb.Terms {
				bad = bad || tm.Case == c && tm.Factor != 0 && !tm.HasFavourable
			}
			if !bad {
				continue
			}
			var msg string
			switch set := cb.Rule; {
			case strings.HasPrefix(set, "en1990"):
				msg = fmt.Sprintf("pattern = true: combination %q (%s) takes %s case %q with one factor: EN 1990 takes the permanent actions from one source with one factor, γG,sup where their total effect is unfavourable or γG,inf where favourable, not span by span (Table A1.2(B) Note 3)", cb.Name, set, kind, name)
			case cb.Rule == "model" || cb.Rule == "case":
				msg = fmt.Sprintf("pattern = true: combination %q takes %s case %q with one factor; permanent load is placed span by span only by a rule that gives its term a favourable_factor (in a rule file of [combinations])", cb.Name, kind, name)
			default:
				msg = fmt.Sprintf("pattern = true: combination %q (%s) takes %s case %q with one factor: its rule gives no favourable_factor, and permanent load is placed span by span only where a rule does (as BS 8110-1 clause 3.2.1.2.2 asks: 1.4Gk on the loaded spans and 1.0Gk elsewhere)", cb.Name, set, kind, name)
			}
			r.caseTables[c].fail("pattern", problem(ErrValue, "%s", msg))
			break
		}
	}
}
