package main

import (
	"flag"
	"fmt"
	"io"
	"sort"
	"strings"

	"govern/envelope/report"
)

// byName returns the commands in the order of their names.
func byName() []*command {
	cs := append([]*command(nil), commands...)
	sort.Slice(cs, func(i, j int) bool { return cs[i].name < cs[j].name })
	return cs
}

func printUsage(w io.Writer) {
	fmt.Fprintf(w, "govern finds the envelopes of moment, shear and axial force of plane building\nframes over the load combinations of a design standard.\n\nUsage:\n\n\tgovern <command> [arguments]\n\nThe commands are:\n\n")
	for _, c := range byName() {
		fmt.Fprintf(w, "\t%-8s %s\n", c.name, c.short)
	}
	fmt.Fprintf(w, "\nRun 'govern help <command>' for more about a command.\n\n%s\n", report.Caution)
}

func printHelp(w io.Writer, c *command) {
	fmt.Fprintf(w, "usage: %s\n\n%s\n", strings.TrimSpace("govern "+c.name+" "+c.usage), strings.TrimSpace(c.long))
	if flags := flagDefaults(c); flags != "" {
		fmt.Fprintf(w, "\nFlags:\n%s", flags)
	}
	fmt.Fprintf(w, "\n%s\n", report.Caution)
}

// flagDefaults returns the flags of c as the flag package lists them; ""
// for none.
func flagDefaults(c *command) string {
	fs := flag.NewFlagSet(c.name, flag.ContinueOnError)
	c.setup(fs)
	var b strings.Builder
	fs.SetOutput(&b)
	fs.PrintDefaults()
	return b.String()
}
