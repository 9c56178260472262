package analysis

import (
	"slices"

	"govern/combos"
	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// The terms of a run's peak memory that the analysis adds to the
// solver's (frame.MaxMemory, frame.Options), counted before anything is
// solved from the sizes of the job alone:
//
//   - the envelopes of the members' stations (envelope.StationBytes each,
//     at the job's stations and the column faces), of the nodes'
//     displacements and of the storeys' drifts (three extremes each, as a
//     station's);
//   - the Lanczos vectors of the critical load factors: two of
//     n + 6 × members values (the members' own degrees of freedom of the
//     geometric stiffness, SubElements − 1 inner nodes of two each) a
//     step, lanczosFirst steps for the first combination and
//     lanczosOthers for each other solved beside it;
//   - one solve of the storeys' stability: n × (storeys + 2) values;
//   - where combinations are analysed apart (second order, a reduced
//     stiffness), the solution of every load case of the one being
//     enveloped beside the first-order solution, and its envelopes (of
//     forces: a strength combination's) beside the merged ones.
const (
	lanczosFirst  = 12
	lanczosOthers = 6
)

// memoryOptions returns the solver options that count what job's run
// holds beside the first-order solution: lay is the job's patterned
// loads placed, sv its cases as solved, opt the run's options.
func memoryOptions(job *Job, sv solved, lay *patterns.Layout, opt Options) frame.Options {
	mo := job.Model
	pieces := len(lay.Model.Cases) - len(sv.model.Cases)
	service := slices.ContainsFunc(sv.combinations, func(c combos.Combination) bool { return c.Service })
	sb := envelope.StationBytes(pieces, service, opt.allPieces)
	stations := len(mo.Members) * job.Settings.Stations
	for _, xs := range faceStations(ColumnFaces(mo)) {
		stations += len(xs)
	}
	columns := 0
	storeys := storeysOf(job)
	for _, s := range storeys {
		columns += len(s.Columns)
	}
	apart, first := false, 0
	for k := range job.Combinations {
		m := job.methodOf(k)
		apart = apart || m.SecondOrder || m.Stiffness != Nominal
		if !m.SecondOrder {
			first++
		}
	}
	envelopes := float64(stations) * sb
	solutions := 1
	if apart {
		// Those of a strength combination, without deflections.
		envelopes += float64(stations) * envelope.StationBytes(pieces, false, opt.allPieces)
		solutions = 2
	}
	members := float64(len(mo.Members))
	values := float64(len(mo.Nodes)+columns) * sb
	return frame.Options{
		PerMember: envelopes / max(members, 1),
		Solutions: solutions,
		Held: func(info frame.Info) float64 {
			n := float64(info.Equations)
			steps := float64(lanczosFirst + lanczosOthers*max(first-1, 0))
			lanczos := 16 * (n + 6*members) * steps
			var storey float64
			if len(storeys) > 0 {
				storey = 8 * n * float64(len(storeys)+2)
			}
			return values + lanczos + storey
		},
	}
}
