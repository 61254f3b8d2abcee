package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"runtime/debug"
	"strings"
	"time"

	"github.com/spf13/cobra"
)

// version is the tool's release; builds from a checkout append the VCS
// revision when the Go toolchain recorded one.
const version = "0.1.0"

// Exit statuses: 0 all good, 1 some inputs failed, 2 usage error.
const (
	exitOK      = 0
	exitPartial = 1
	exitUsage   = 2
)

// env carries the streams a command reads and writes, so tests can run the
// whole command line against buffers.
type env struct {
	stdin  io.Reader
	stdout io.Writer
	stderr io.Writer
	// terminal is whether stderr is a terminal: progress bars are drawn
	// only there.
	terminal bool
	// plainEvery is the least time between two plain progress lines on a
	// stderr that is not a terminal (a log file, a scheduler's output);
	// 0 writes none.
	plainEvery time.Duration
	// quiet (--quiet) silences progress.
	quiet bool
	// getenv reads the environment (the scheduler's array index); nil
	// reads nothing.
	getenv func(string) string
}

// plainProgressEvery is how often a batch writes a progress line to a
// stderr that is not a terminal.
const plainProgressEvery = 5 * time.Second

// lookupEnv returns the environment variable name, "" when unset or when
// e reads no environment.
func (e *env) lookupEnv(name string) string {
	if e.getenv == nil {
		return ""
	}
	return e.getenv(name)
}

// commands holds the constructors of the subcommands; each command file adds
// its own in init.
var commands []func(*env) *cobra.Command

func addCommand(f func(*env) *cobra.Command) { commands = append(commands, f) }

// usageError marks an error caused by how the command was called.
type usageError struct{ err error }

func (u usageError) Error() string { return u.err.Error() }
func (u usageError) Unwrap() error { return u.err }

func usagef(format string, a ...any) error { return usageError{fmt.Errorf(format, a...)} }

// errSomeFailed reports that some inputs of a batch failed after the others
// were processed; the failures were already reported on stderr.
var errSomeFailed = errors.New("some inputs failed")

func newRootCmd(e *env) *cobra.Command {
	root := &cobra.Command{
		Use:   "tracesift",
		Short: "Screen fluctuation traces for deterministic chaos versus noise",
		Long: `tracesift decides whether a measured fluctuation trace (a device current,
a sensor read-out) carries low-dimensional deterministic dynamics (chaotic),
is noise (stochastic) or is periodic/quasi-periodic (regular), using
visibility-graph metrics together with classical nonlinear, ordinal and
scaling measures, and checks the method on reference systems whose
invariants are published.

The verdict is a screening aid, not a device qualification result: defer to
your laboratory's qualification procedures and the applicable reliability
standards.`,
		Version:       versionString(),
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.SetIn(e.stdin)
	root.SetOut(e.stdout)
	root.SetErr(e.stderr)
	root.PersistentFlags().BoolVarP(&e.quiet, "quiet", "q", false, "no progress on stderr (bars on a terminal, a line every few seconds otherwise)")
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		return usageError{fmt.Errorf("%w (see '%s --help')", err, c.CommandPath())}
	})
	for _, f := range commands {
		root.AddCommand(f(e))
	}
	return root
}

func versionString() string {
	v := version
	if info, ok := debug.ReadBuildInfo(); ok {
		for _, s := range info.Settings {
			if s.Key == "vcs.revision" && len(s.Value) >= 12 {
				v += " (" + s.Value[:12] + ")"
			}
		}
	}
	return v
}

// run executes the command line and returns the exit status.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	e := &env{stdin: stdin, stdout: stdout, stderr: stderr, terminal: stderrIsTerminal(stderr), getenv: os.Getenv}
	if _, isFile := stderr.(*os.File); isFile && !e.terminal {
		e.plainEvery = plainProgressEvery
	}
	return runEnv(e, args)
}

// runEnv executes the command line in e and returns the exit status.
func runEnv(e *env, args []string) int {
	stderr := e.stderr
	root := newRootCmd(e)
	root.SetArgs(args)
	err := root.Execute()
	switch {
	case err == nil:
		return exitOK
	case errors.Is(err, errSomeFailed):
		return exitPartial
	}
	fmt.Fprintf(stderr, "tracesift: %s\n", oneLine(err.Error()))
	var u usageError
	if errors.As(err, &u) || isCobraUsage(err) {
		return exitUsage
	}
	return exitPartial
}

// isCobraUsage recognises the argument errors cobra itself produces.
func isCobraUsage(err error) bool {
	msg := err.Error()
	for _, p := range []string{"unknown command", "accepts ", "requires at least", "requires at most", "unknown flag", "unknown shorthand", "invalid argument", "flag needs an argument", "if any flags in the group"} {
		if strings.Contains(msg, p) {
			return true
		}
	}
	return false
}

// oneLine folds an error message onto one line.
func oneLine(s string) string {
	return strings.Join(strings.Fields(strings.ReplaceAll(s, "\n", " ")), " ")
}

// stderrIsTerminal reports whether progress bars should be drawn.
func stderrIsTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}
