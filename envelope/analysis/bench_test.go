package analysis

import (
	"context"
	"fmt"
	"testing"

	"govern/envelope/internal/cputime"
)

// BenchmarkRun measures Run alone on regular frames built in code
// (regularJob): place the patterned live load ("exact"), solve, envelope
// at 11 stations, check the statics; with "-starter" also stations at the
// column faces and deflections under a service combination. The whole
// command, reading and writing included, is cmd/govern's BenchmarkRun.
// On the 30 × 60 frame with the starter's extras it also measures the
// run with the critical load factors and storeys' stability found before
// the envelopes ("-before", stabilityBeside off) rather than beside them.
// cpu-ns/op is the process's processor time (user and system, every
// thread) per operation: on a machine shared with other work it is the
// steadier figure.
func BenchmarkRun(b *testing.B) {
	for _, size := range []struct {
		bays, storeys int
		starter       bool
		before        bool
	}{{3, 3, false, false}, {10, 10, false, false}, {30, 20, false, false}, {30, 60, false, false}, {30, 60, true, false}, {30, 60, true, true}} {
		name := fmt.Sprintf("%dx%d", size.bays, size.storeys)
		if size.starter {
			name += "-starter"
		}
		if size.before {
			name += "-before"
		}
		job := regularJob(size.bays, size.storeys, size.starter)
		b.Run(name, func(b *testing.B) {
			stabilityBeside = !size.before
			defer func() { stabilityBeside = true }()
			b.ReportAllocs()
			start := cpuTime()
			for b.Loop() {
				if _, err := Run(context.Background(), job, Options{}); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
		})
	}
}

// BenchmarkCases measures Result.Cases alone, on the results of Run for
// regular frames (regularJob): the reactions, member end forces and node
// displacements of every load case, the patterned live load summed over
// its pieces.
func BenchmarkCases(b *testing.B) {
	for _, size := range []struct{ bays, storeys int }{{3, 3}, {10, 10}, {30, 20}, {30, 60}} {
		res, err := Run(context.Background(), regularJob(size.bays, size.storeys, false), Options{})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("%dx%d", size.bays, size.storeys), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				res.Cases()
			}
		})
	}
}

// cpuTime returns the processor time the process has used, user and
// system, in nanoseconds (0 where it is not read).
func cpuTime() int64 { return int64(cputime.Now()) }

// BenchmarkDrifts measures the envelopes of the columns' drifts of regular
// frames (regularJob) over every combination, the columns taken up each
// line, each column's bottom displacements those the one below it left
// ("up lines"), and with both ends read for every column ("both ends").
func BenchmarkDrifts(b *testing.B) {
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 60}} {
		res, err := Run(context.Background(), regularJob(size.bays, size.storeys, false), Options{})
		if err != nil {
			b.Fatal(err)
		}
		_, drifts := res.displacementRequests()
		for _, v := range []struct {
			name string
			vr   *valuesRequest
		}{{"up lines", drifts}, {"both ends", bothEnds(res, drifts)}} {
			b.Run(fmt.Sprintf("%dx%d/%s", size.bays, size.storeys, v.name), func(b *testing.B) {
				b.ReportAllocs()
				start := cputime.Now()
				for b.Loop() {
					v.vr.out = nil
					if err := v.vr.add(res.sol, res.lay, res.solved, allOf(res.solved), res.Envelope.Settings); err != nil {
						b.Fatal(err)
					}
				}
				b.ReportMetric(float64(cputime.Now()-start)/float64(b.N), "cpu-ns/op")
			})
		}
	}
}

// BenchmarkSpans measures finding the spans and cantilevers of regular
// frames (regularJob): the runs of beams, where other members hold them,
// and their places.
func BenchmarkSpans(b *testing.B) {
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 60}} {
		job := regularJob(size.bays, size.storeys, false)
		b.Run(fmt.Sprintf("%dx%d", size.bays, size.storeys), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				spans(job.Model)
			}
		})
	}
}
