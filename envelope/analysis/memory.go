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
// solved from the sizes of the job alone, n equations of half-bandwidth
// kb, and fitted to the runs measured (docs/errors.md):
//
//   - the envelopes of the members' stations (envelope.StationBytes each,
//     at the job's stations and the column faces), and of the nodes'
//     displacements and the storeys' drifts (three extremes each, as a
//     station's): held with the solution, times the heap's growth;
//   - a first-order run holds its solution and envelopes at its end, and
//     makes less garbage once its envelopes are formed than they and the
//     solution take: the heap grows past them by firstGrowth;
//   - where combinations are analysed apart (second order, a reduced
//     stiffness): the solution of every load column of the one being
//     enveloped beside the first-order solution, and its envelopes (of
//     forces: a strength combination's) beside the merged ones, the heap
//     grown to twice them (frame's default: every combination's solves
//     make as much garbage again); and for each second-order
//     combination, the last solve of its iteration, kept from the
//     iterations (made side by side, beside the envelopes of the
//     combinations before it) until its envelopes solve their cases on
//     its factor: unitBands band matrices of n × (kb + 1), its factor and
//     elements with the heap's growth (fitted).
//
// The critical load factors' Lanczos vectors and the storeys' solves are
// not counted apart: they are formed on the solution's factor beside the
// first members' envelopes (first order) or the iterations (second
// order), and let go well before the envelopes are whole (the measured
// peaks of the 30 × 60, 60 × 60 and 20 × 200 frames grew by 0 to 2 %
// when they moved there from before the envelopes).
const (
	firstGrowth = 1.2
	unitBands   = 2.5
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
	for _, s := range storeysOf(job) {
		columns += len(s.Columns)
	}
	apart, second := false, 0
	for k := range job.Combinations {
		m := job.methodOf(k)
		apart = apart || m.SecondOrder || m.Stiffness != Nominal
		if m.SecondOrder {
			second++
		}
	}
	members := float64(len(mo.Members))
	envelopes := float64(stations) * sb
	values := float64(len(mo.Nodes)+columns) * sb
	if !apart {
		return frame.Options{
			PerMember: envelopes / max(members, 1),
			Growth:    firstGrowth,
			Held:      func(frame.Info) float64 { return firstGrowth * values },
		}
	}
	envelopes += float64(stations) * envelope.StationBytes(pieces, false, opt.allPieces)
	return frame.Options{
		PerMember: envelopes / max(members, 1),
		Solutions: 2,
		Held: func(info frame.Info) float64 {
			n, kb := float64(info.Equations), float64(min(info.Bandwidth, max(info.Equations-1, 0)))
			return 2*values + unitBands*float64(second)*8*n*(kb+1)
		},
	}
}
