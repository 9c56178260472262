package report

import (
	"runtime/debug"
	"time"
)

// Build is the version of govern that made a result, from the Go build
// information of the running program.
type Build struct {
	// Version is the module version, such as "v1.2.0", or "(devel)" for a
	// build from a checkout without a version tag.
	Version string
	// Revision is the source revision (the commit) it was built from,
	// Modified whether the source had changes not committed; "" and false
	// when the build does not record them (go test, go run).
	Revision string
	Modified bool
}

// ReadBuild returns the build information of the running program; a
// program built without it (no module) gives Version "unknown".
func ReadBuild() Build {
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return Build{Version: "unknown"}
	}
	b := Build{Version: bi.Main.Version}
	if b.Version == "" {
		b.Version = "(devel)"
	}
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			b.Revision = s.Value
		case "vcs.modified":
			b.Modified = s.Value == "true"
		}
	}
	return b
}

// String is "govern VERSION", with the revision and whether it was
// modified when known: "govern v1.2.0 (revision 0123abcd…, modified)".
func (b Build) String() string {
	s := "govern " + b.Version
	switch {
	case b.Revision != "" && b.Modified:
		s += " (revision " + b.Revision + ", with changes not committed)"
	case b.Revision != "":
		s += " (revision " + b.Revision + ")"
	}
	return s
}

// Source says what a result is of and who made it: the program's version,
// the model file (its name and the SHA-256 of its bytes), the date of the
// run, the model's [project] fields, and the loads as the file gives
// them. Every output carries it when the report has one ([Report.From]).
type Source struct {
	Build  Build
	File   string    // the model file's name
	SHA256 string    // of the model file's bytes, lowercase hex
	Date   time.Time // of the run; shown in UTC to the second

	Project Project
	// Loads lists, per load case of the model, its loads as entered, for
	// the input echo of the page; nil when not known.
	Loads [][]EnteredLoad
	// Spacing is the distance between parallel frames that area loads are
	// multiplied by; 0 when the model gives none.
	Spacing float64
}

// Project is what the calculation is for and who made and checked it;
// "" where not given.
type Project struct {
	Name, Number, Engineer, Checker string
}

// EnteredLoad is one load of a case as the model file gives it: the line,
// its keys and values as written, and which of the case's member loads,
// node loads and support displacements it became.
type EnteredLoad struct {
	Line int
	Text string

	FirstMember, Members             int
	FirstNode, Nodes                 int
	FirstDisplacement, Displacements int
}

// From sets the source of the results, which every output then carries,
// and returns p. It must be called before any writer runs.
func (p *Report) From(s *Source) *Report {
	p.src = s
	return p
}

// date formats the run date: ISO 8601 in UTC, to the second.
func (s *Source) date() string { return s.Date.UTC().Format(time.RFC3339) }

// fields lists the source as (name, value) pairs, in the order the
// outputs give them; the project's only where given.
func (s *Source) fields() [][2]string {
	out := [][2]string{
		{"program", s.Build.String()},
		{"model file", s.File},
		{"SHA-256", s.SHA256},
		{"run date", s.date()},
	}
	for _, f := range [][2]string{{"project", s.Project.Name}, {"job number", s.Project.Number}, {"engineer", s.Project.Engineer}, {"checker", s.Project.Checker}} {
		if f[1] != "" {
			out = append(out, f)
		}
	}
	return out
}
