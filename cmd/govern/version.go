package main

import (
	"flag"
	"fmt"
	"os"
	"strconv"
	"time"

	"govern/cmd/govern/modelfile"
	"govern/envelope/report"
)

var cmdVersion = &command{
	name:  "version",
	usage: "",
	short: "print govern's version and source revision",
	long: `
Version prints the version of govern and, when the build records it, the
source revision (commit) it was built from and whether that source had
changes not committed. 'govern --version' does the same. Every output
file of a run carries the same line.`,
	setup: func(fs *flag.FlagSet) func(*environ, []string) error {
		return func(env *environ, args []string) error {
			if len(args) != 0 {
				return usagef("version takes no arguments")
			}
			_, err := fmt.Fprintln(env.stdout, report.Escape(report.ReadBuild().String()))
			return err
		}
	},
}

// runDate returns the date the outputs carry: --date, else
// SOURCE_DATE_EPOCH, else now.
func (f *runFlags) runDate() (time.Time, error) {
	if f.date != "" {
		for _, layout := range []string{"2006-01-02", time.RFC3339} {
			if t, err := time.Parse(layout, f.date); err == nil {
				return t.UTC(), nil
			}
		}
		return time.Time{}, usagef("--date %q: give a date as YYYY-MM-DD, such as 2026-03-04, or a time as YYYY-MM-DDThh:mm:ssZ, such as 2026-03-04T09:30:00Z", f.date)
	}
	if s, ok := os.LookupEnv("SOURCE_DATE_EPOCH"); ok && s != "" {
		n, err := strconv.ParseInt(s, 10, 64)
		if err != nil {
			return time.Time{}, fmt.Errorf("SOURCE_DATE_EPOCH=%q: want a whole number of seconds since 1970-01-01 UTC", s)
		}
		return time.Unix(n, 0).UTC(), nil
	}
	return time.Now().UTC().Truncate(time.Second), nil
}

// source is what the outputs say the results are of.
func source(job *modelfile.Job, file string, date time.Time) *report.Source {
	s := &report.Source{Build: report.ReadBuild(), File: file, SHA256: job.SHA256, Date: date, Project: report.Project(job.Project)}
	if job.Grid != nil {
		s.Spacing = job.Grid.Spacing
	}
	s.Loads = make([][]report.EnteredLoad, len(job.Entered))
	for c, ls := range job.Entered {
		for _, l := range ls {
			s.Loads[c] = append(s.Loads[c], report.EnteredLoad(l))
		}
	}
	return s
}
