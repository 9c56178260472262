package main

import (
	"flag"
	"fmt"

	"govern/envelope/report"
	"govern/frame/verification"
)

type verifyFlags struct {
	markdown bool
}

var cmdVerify = &command{
	name:  "verify",
	usage: "[--markdown]",
	short: "run the built-in verification suite against published results",
	long: `
Verify solves a built-in suite of published cases with the same solver that
'govern run' uses and compares each result with its published value: beam
table cases of a steel design manual, continuous beams of two to four equal
spans under full and patterned load, rigid frame formulas for single-bay
portals, the fixed-end moment table, deflections, the inflection point of a
fixed-fixed beam, and a textbook example of moment distribution (solved both
by the direct stiffness method and by moment distribution).

Each row gives the case, the quantity, the published value, the computed
value, their relative difference, pass or FAIL against the row's tolerance,
and the source. Sources whose values were recalled from memory are marked so,
and the list under the table says how each was confirmed. Every case also
checks statics: the reactions must balance the loads and every joint must be
in equilibrium. The exit status is 1 if anything fails.

With --markdown the report is written as Markdown, as kept in
docs/verification.md.`,
	setup: func(fs *flag.FlagSet) func(*environ, []string) error {
		f := &verifyFlags{}
		fs.BoolVar(&f.markdown, "markdown", false, "write the report as Markdown")
		return func(env *environ, args []string) error { return verify(env, f, args) }
	},
}

// verify is govern verify.
func verify(env *environ, f *verifyFlags, args []string) error {
	if len(args) != 0 {
		return usagef("verify takes no arguments")
	}
	results := verification.Run(verification.Cases())
	if err := report.WriteVerification(env.stdout, results, f.markdown); err != nil {
		return err
	}
	failed := 0
	for _, r := range results {
		if !r.Pass() {
			failed++
		}
	}
	if failed > 0 {
		return fmt.Errorf("%d of %d checks failed", failed, len(results))
	}
	return nil
}
