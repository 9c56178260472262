package frame

import (
	"errors"
	"fmt"
	"unsafe"
)

// Size limits. A model past them is refused by [Solve] with an error
// wrapping [ErrTooLarge] before the solver allocates its matrices, so that
// a typing slip cannot exhaust the machine's memory.
const (
	// MaxEquations is the largest number of free degrees of freedom.
	MaxEquations = 1_000_000
	// MaxMemory is the most memory, in bytes (2 GiB), a run may be
	// estimated to need at its peak (see [EstimateMemory]): the stiffness
	// band, its factor and the substitution's work, the solutions of every
	// load column with their factors, the critical load factors' search,
	// and what the caller holds ([Options.PerMember], [Options.Held],
	// [Options.Solutions]), with the heap's growth past what is live
	// ([Options.Growth]).
	MaxMemory = 2 << 30
)

// ErrTooLarge is wrapped by the error [Solve] returns for a model past the
// size limits.
var ErrTooLarge = errors.New("the model is too large")

// freeDOFs counts the degrees of freedom of mo that no support restrains.
func freeDOFs(mo *Model) int {
	n := 0
	for _, nd := range mo.Nodes {
		for d := range 3 {
			if !nd.Support.Restrained(d) {
				n++
			}
		}
	}
	return n
}

// checkEquations refuses a model with more than MaxEquations free degrees
// of freedom; it needs only the nodes, so it runs before anything else.
func checkEquations(mo *Model) error {
	if n := freeDOFs(mo); n > MaxEquations {
		return fmt.Errorf("%w: %s free degrees of freedom (%s nodes); the limit is %s",
			ErrTooLarge, thousands(n), thousands(len(mo.Nodes)), thousands(MaxEquations))
	}
	return nil
}

// The estimate of a run's peak memory (resident set), made before anything
// large is allocated from the sizes of the model (docs/errors.md gives the
// terms and the runs they are fitted to), in bytes:
//
//	growth × (solutions × (8 n nc + 48 loads + elements + 8 n (kb + 1))
//	          + perMember × members)
//	+ bandWork × 8 n (kb + 1) + 8 kb² + pencils + held + baseMemory
//
// for n equations of half-bandwidth kb (kb + 1 values a row), nc load
// columns and as many member loads as the model has:
//
//   - each solution held at once (Options.Solutions, 1 at least): its
//     displacements, six fixed-end forces for each member load, each
//     member's element, and its factor (kept to solve more cases on it);
//   - what the caller holds for each member (Options.PerMember);
//   - both times the growth of the heap past what is live at the run's
//     peak (Options.Growth; 2 when not given: the collector's default
//     target, GOGC=100, which a run reaches when it makes as much garbage
//     again once its live set is formed);
//   - bandWork band matrices of the solve itself: the stiffness, its
//     factor, the substitution's lists of the factor's terms (12 bytes an
//     entry each way: three matrices' worth) and, for the critical load
//     factors, made beside them, the elastic stiffness's factor and its
//     copy by columns (the forward substitution's), seven in all, with
//     the heap's growth past them (fitted: 9; 12 while the check of each
//     critical load factor assembled a whole band of its own, before it
//     took the band a window of rows at a time); the kb × kb block of the
//     pivot watch while a mechanism is looked for;
//   - each member's pencil and element of the critical load factors'
//     search (NewBuckling), made beside the solve: pencilBytes, with its
//     numbers outside the struct, 8 (ni² + 12 ni + (6 + ni)²) bytes for
//     ni degrees of freedom of its own (ownDOFs);
//   - what the caller adds (Options.Held), and baseMemory: the runtime's,
//     the program's and the model's own (fitted).
const (
	bandWork      = 9
	defaultGrowth = 2
	baseMemory    = 14 << 20
)

// elementBytes is the memory of one member's element in a solution, and
// pencilBytes that of a pencil's struct in the critical load factors'
// search with the room its store keeps for 48 entries of Kg, and its
// element there; pencilNumbers adds the numbers of a member with ni
// degrees of freedom of its own: its own block of K inverted, its own
// rows and their product (ni² + 12 ni), and K over all its degrees of
// freedom ((6 + ni)²).
const (
	elementBytes = float64(unsafe.Sizeof(element{}))
	pencilBytes  = float64(unsafe.Sizeof(pencil{})+48*unsafe.Sizeof(gEntry{})) + elementBytes
)

// pencilNumbers returns the bytes of the numbers of the pencils of mo's
// members, kept outside their structs (pencil.build).
func pencilNumbers(mo *Model) float64 {
	values := 0
	for m := range mo.Members {
		ni := ownDOFs(&mo.Members[m])
		values += ni*ni + 12*ni + (6+ni)*(6+ni)
	}
	return 8 * float64(values)
}

// memory returns the estimated peak memory, in bytes, of solving mo (n
// equations of half-bandwidth band) with what the caller holds (opt).
func memory(mo *Model, n, band int, opt Options) float64 {
	kb := float64(min(band, max(n-1, 0)))
	nc := float64(max(len(mo.Cases), 1))
	fn := float64(n)
	loads := 0
	for c := range mo.Cases {
		loads += len(mo.Cases[c].MemberLoads)
	}
	members := float64(len(mo.Members))
	matrix := 8 * fn * (kb + 1)
	solution := 8*(fn*nc+6*float64(loads)) + elementBytes*members + matrix
	growth := opt.Growth
	if growth == 0 {
		growth = defaultGrowth
	}
	est := growth*(float64(max(opt.Solutions, 1))*solution+opt.PerMember*members) +
		bandWork*matrix + 8*kb*kb + pencilBytes*members + pencilNumbers(mo) + baseMemory
	if opt.Held != nil {
		est += opt.Held(Info{Equations: n, Bandwidth: band, Columns: len(mo.Cases)})
	}
	return est
}

// checkMemory refuses a run estimated to need more than MaxMemory.
func checkMemory(mo *Model, n, band int, opt Options) error {
	if s := memory(mo, n, band, opt); s > MaxMemory {
		cases := fmt.Sprintf("%d load cases", len(mo.Cases))
		if len(mo.Cases) == 1 {
			cases = "1 load case"
		}
		return fmt.Errorf("%w: solving needs about %s of memory (%s equations, half-bandwidth %s, %s); the limit is %s",
			ErrTooLarge, bytesText(s), thousands(n), thousands(band), cases, bytesText(MaxMemory))
	}
	return nil
}

// thousands formats n with commas between groups of three digits, as
// 1,000,000.
func thousands(n int) string {
	s := fmt.Sprint(n)
	neg := s[0] == '-'
	if neg {
		s = s[1:]
	}
	var out []byte
	for i := range len(s) {
		if i > 0 && (len(s)-i)%3 == 0 {
			out = append(out, ',')
		}
		out = append(out, s[i])
	}
	if neg {
		return "-" + string(out)
	}
	return string(out)
}

// bytesText formats a size in bytes with a binary unit, as "2.0 GiB".
func bytesText(b float64) string {
	units := []string{"bytes", "KiB", "MiB", "GiB", "TiB"}
	i := 0
	for b >= 1024 && i < len(units)-1 {
		b /= 1024
		i++
	}
	if i == 0 {
		return fmt.Sprintf("%.0f bytes", b)
	}
	return fmt.Sprintf("%.1f %s", b, units[i])
}

// EstimateMemory returns the estimate of the peak memory, in bytes, of
// solving mo with opt (see [MaxMemory] and [Options.PerMember]), which
// [SolveWith] refuses past MaxMemory, with the size of the system. It
// numbers the equations, as SolveWith does, but assembles nothing.
func EstimateMemory(mo *Model, opt Options) (float64, Info, error) {
	if err := checkEquations(mo); err != nil {
		return 0, Info{}, err
	}
	if err := mo.Validate(); err != nil {
		return 0, Info{}, err
	}
	released := releasedRotations(mo)
	_, n, band := dofMap(mo, nodeOrder(mo), released)
	return memory(mo, n, band, opt), Info{Equations: n, Bandwidth: band, Columns: len(mo.Cases)}, nil
}
