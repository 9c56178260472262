package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"os/signal"
	"strings"
	"sync"
	"syscall"

	"govern/envelope/report"
	"govern/envelope/report/files"
)

// command is one subcommand of govern.
type command struct {
	name  string
	usage string // the arguments, after "govern NAME"
	short string // one line for the command list
	long  string // the help text
	// setup defines the command's flags on fs, into a struct of the
	// command's own, and returns what runs the command with them.
	setup func(fs *flag.FlagSet) func(env *environ, args []string) error
}

// environ is what a command may touch: its streams. Tests substitute them.
type environ struct {
	stdout, stderr io.Writer
	name           string // "govern run", for messages
}

// warn prints each warning about the model file named model to stderr,
// prefixed with the command name.
func (env *environ) warn(model string, ws []string) {
	for _, w := range ws {
		fmt.Fprintf(env.stderr, "%s: warning: %s: %s\n", env.name, report.Escape(model), report.EscapeLines(w))
	}
}

// usageError is a mistake in the command line: exit status 2.
type usageError struct{ msg string }

func (e *usageError) Error() string { return e.msg }

func usagef(format string, args ...any) error {
	return &usageError{msg: fmt.Sprintf(format, args...)}
}

var commands []*command

func init() {
	commands = []*command{cmdRun, cmdCheck, cmdCombos, cmdDemo, cmdDiff, cmdNew, cmdVerify, cmdVersion}
}

func main() {
	stopOnSignals()
	limitMemory = setMemoryLimit
	os.Exit(govern(os.Args[1:], os.Stdout, os.Stderr))
}

// stopOnSignals makes an interrupt (SIGINT), termination (SIGTERM) or
// hang-up (SIGHUP) remove the run's temporary files and any folder it made
// and still empty, then end the process by that signal, so that the shell
// sees the usual status 128 + its number (130, 143, 129). A set of files
// being renamed into place is completed first.
func stopOnSignals() {
	sigs := make(chan os.Signal, 1)
	signal.Notify(sigs, os.Interrupt, syscall.SIGTERM, syscall.SIGHUP)
	go func() {
		sig := <-sigs
		files.RemoveTemporaries()
		signal.Reset(sig)
		if p, err := os.FindProcess(os.Getpid()); err == nil {
			p.Signal(sig) // ends the process, as the signal would have
		}
		code := 1
		if n, ok := sig.(syscall.Signal); ok {
			code = 128 + int(n)
		}
		os.Exit(code) // where a process cannot signal itself
	}()
}

// checkedWriter remembers the first error of writing to w, so that output
// printed with fmt.Fprintf, whose errors go unchecked, still fails the
// command when standard output or error is full or closed.
type checkedWriter struct {
	mu  sync.Mutex
	w   io.Writer
	err error
}

func (c *checkedWriter) Write(p []byte) (int, error) {
	c.mu.Lock()
	defer c.mu.Unlock()
	if c.err != nil {
		return 0, c.err
	}
	n, err := c.w.Write(p)
	if err == nil && n < len(p) {
		err = io.ErrShortWrite
	}
	c.err = err
	return n, err
}

func (c *checkedWriter) failed() error {
	c.mu.Lock()
	defer c.mu.Unlock()
	return c.err
}

// file returns the file written to, or nil: progress asks whether it is a
// terminal, outputs whether a path names it (files.Of).
func (c *checkedWriter) File() *os.File { return files.Of(c.w) }

// govern runs the command line args and returns the exit status: 0 success,
// 1 bad model, analysis failure or output that could not be written, 2
// usage. Every write to stdout and stderr is checked: one that fails makes
// the status 1 with a message (when stderr can still take it).
func govern(args []string, stdout, stderr io.Writer) (status int) {
	out, errs := &checkedWriter{w: stdout}, &checkedWriter{w: stderr}
	status = runChecked(args, out, errs)
	if status == 0 && out.failed() != nil {
		who := "govern"
		if len(args) > 0 && lookup(args[0]) != nil {
			who = "govern " + args[0]
		}
		stdoutFailed(errs, who, out.failed())
		status = 1
	}
	if status == 0 && errs.failed() != nil {
		status = 1 // a warning was lost; nothing more can be said
	}
	return status
}

func stdoutFailed(stderr io.Writer, who string, err error) {
	fmt.Fprintf(stderr, "%s: cannot write to standard output: %s\n", who, report.Escape(err.Error()))
}

// runChecked is govern with checked streams.
func runChecked(args []string, stdout, stderr *checkedWriter) (status int) {
	who := "govern" // the prefix of messages: the command, once known
	defer func() {
		if p := recover(); p != nil {
			fmt.Fprintf(stderr, "%s: internal error: %s\n%s: please report this with the model that caused it\n", who, report.EscapeLines(fmt.Sprint(p)), who)
			status = 1
		}
	}()
	if len(args) == 0 {
		printUsage(stderr)
		return 2
	}
	name := args[0]
	if name == "--version" || name == "-version" {
		name, args = "version", append([]string{"version"}, args[1:]...)
	}
	if name == "help" || name == "-h" || name == "-help" || name == "--help" {
		if len(args) > 1 {
			if c := lookup(args[1]); c != nil {
				printHelp(stdout, c)
				return 0
			}
			fmt.Fprintf(stderr, "govern help: unknown command %q\n", args[1])
			return 2
		}
		printUsage(stdout)
		return 0
	}
	c := lookup(name)
	if c == nil {
		fmt.Fprintf(stderr, "govern: unknown command %q\nRun 'govern help' for the commands.\n", name)
		return 2
	}
	env := &environ{stdout: stdout, stderr: stderr, name: "govern " + c.name}
	who = env.name
	fs := flag.NewFlagSet(env.name, flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	run := c.setup(fs)
	pos, err := parseInterspersed(fs, args[1:])
	if errors.Is(err, flag.ErrHelp) {
		printHelp(stdout, c)
		return 0
	}
	if err == nil {
		err = run(env, pos)
	}
	if err == nil {
		return 0
	}
	var ue *usageError
	if errors.As(err, &ue) || isFlagError(err) {
		fmt.Fprintf(stderr, "%s: %s\nusage: govern %s %s\nRun 'govern help %s' for details.\n", env.name, report.Escape(err.Error()), c.name, c.usage, c.name)
		return 2
	}
	// A failed write to standard output is said once, in its own words.
	werr := stdout.failed()
	if werr == nil || !errors.Is(err, werr) {
		for _, line := range strings.Split(report.EscapeLines(err.Error()), "\n") {
			fmt.Fprintf(stderr, "%s: %s\n", env.name, line)
		}
	}
	if werr != nil {
		stdoutFailed(stderr, env.name, werr)
	}
	return 1
}

// flagError marks errors from flag parsing.
type flagError struct{ error }

func isFlagError(err error) bool {
	var fe flagError
	return errors.As(err, &fe)
}

// parseInterspersed parses flags that may come before or after the
// positional arguments, returning the positional ones in order.
func parseInterspersed(fs *flag.FlagSet, args []string) ([]string, error) {
	var pos []string
	for {
		if err := fs.Parse(args); err != nil {
			if errors.Is(err, flag.ErrHelp) {
				return nil, err
			}
			return nil, flagError{err}
		}
		rest := fs.Args()
		if len(rest) == 0 {
			return pos, nil
		}
		if used := len(args) - len(rest); used > 0 && args[used-1] == "--" {
			return append(pos, rest...), nil // "--" ends the flags
		}
		pos = append(pos, rest[0])
		args = rest[1:]
	}
}

func lookup(name string) *command {
	for _, c := range commands {
		if c.name == name {
			return c
		}
	}
	return nil
}
