// Command isofield checks, grids and maps electric-potential surveys made
// with probes: half-cell potential mapping, surface and step potentials of
// grounding tests, self-potential and cathodic-protection surveys.
//
// Without arguments it opens the terminal UI on the built-in demo survey.
// See "isofield help" for the subcommands.
package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"runtime/pprof"
)

// version is set at build time with -ldflags "-X main.version=...".
var version = "0.1.0-dev"

// Exit codes.
const (
	exitOK      = 0
	exitInput   = 1 // bad input file or failed run
	exitUsage   = 2 // bad command line
	exitStrict  = 3 // check --strict found suspects
	exitAborted = 130
)

// command is one subcommand.
type command struct {
	name    string
	summary string
	run     func(env *env, args []string) error
}

// env carries the program's streams so tests can run commands in-process.
type env struct {
	stdin          io.Reader
	stdout, stderr io.Writer
}

func commands() []command {
	return []command{
		{"view", "open the terminal UI on survey files (default: the demo)", runView},
		{"grid", "interpolate readings and write the grid CSV", runGrid},
		{"check", "print the quality report of the readings", runCheck},
		{"clean", "write every reading with its corrected value and status", runClean},
		{"zones", "list the zones that break the criterion", runZones},
		{"suggest", "suggest where to take more readings", runSuggest},
		{"export", "write cleaned readings, grids, contours, zones, maps and report", runExport},
		{"report", "write the survey report as one HTML file", runReport},
		{"demo", "write the built-in demo survey as CSV", runDemo},
		{"version", "print the version", runVersion},
		{"help", "show help for a command", nil},
	}
}

func main() {
	stop := startProfile(os.Getenv("ISOFIELD_CPUPROFILE"))
	code := run(&env{stdin: os.Stdin, stdout: os.Stdout, stderr: os.Stderr}, os.Args[1:])
	stop()
	os.Exit(code)
}

// startProfile writes a CPU profile of the whole run to path (for
// contributors: ISOFIELD_CPUPROFILE=cpu.prof isofield grid ...; see
// DEVELOPERS.md) and returns the function that finishes it. An empty
// path, or one that cannot be created, profiles nothing.
func startProfile(path string) func() {
	if path == "" {
		return func() {}
	}
	f, err := os.Create(path)
	if err != nil {
		fmt.Fprintf(os.Stderr, "isofield: cpu profile: %v\n", err)
		return func() {}
	}
	if err := pprof.StartCPUProfile(f); err != nil {
		fmt.Fprintf(os.Stderr, "isofield: cpu profile: %v\n", err)
		f.Close()
		return func() {}
	}
	return func() {
		pprof.StopCPUProfile()
		f.Close()
	}
}

// run executes one command line and returns the exit code. A panic (a
// bug, never expected from input) ends the command with one line on
// stderr instead of a stack trace over the user's terminal; set
// ISOFIELD_DEBUG=1 to get the trace.
func run(e *env, args []string) int { return dispatch(e, args, commands()) }

// dispatch runs args against the command table cmds.
func dispatch(e *env, args []string, cmds []command) (code int) {
	if os.Getenv("ISOFIELD_DEBUG") == "" {
		defer func() {
			if p := recover(); p != nil {
				fmt.Fprintf(e.stderr, "isofield: internal error: %v (please report it with the input; ISOFIELD_DEBUG=1 shows where)\n", p)
				code = exitInput
			}
		}()
	}
	if len(args) == 0 {
		args = []string{"view"}
	}
	name, rest := args[0], args[1:]
	switch name {
	case "help", "-h", "--help":
		if len(rest) > 0 {
			return run(e, []string{rest[0], "--help"})
		}
		usage(e.stdout)
		return exitOK
	case "-v", "--version":
		name = "version"
	}
	for _, c := range cmds {
		if c.name == name && c.run != nil {
			return report(e, c.run(e, rest))
		}
	}
	fmt.Fprintf(e.stderr, "isofield: unknown command %q (see isofield help)\n", name)
	return exitUsage
}

func usage(w io.Writer) {
	fmt.Fprintf(w, "isofield %s: check, grid and map electric-potential surveys\n\n", version)
	fmt.Fprintln(w, "usage: isofield [COMMAND] [FLAGS] [FILES...]")
	fmt.Fprintln(w, "\nWithout a command, isofield opens the terminal UI on the built-in demo survey.")
	fmt.Fprintln(w, "\ncommands:")
	for _, c := range commands() {
		fmt.Fprintf(w, "  %-8s %s\n", c.name, c.summary)
	}
	fmt.Fprintln(w, "\nRun \"isofield COMMAND --help\" for a command's flags.")
}

// usageError marks an error in the command line (exit 2).
type usageError struct{ err error }

func (u usageError) Error() string { return u.err.Error() }
func (u usageError) Unwrap() error { return u.err }

// exitError carries a specific exit code without a message of its own.
type exitError struct{ code int }

func (x exitError) Error() string { return fmt.Sprintf("exit %d", x.code) }

// errHelp is returned after a command printed its help.
var errHelp = errors.New("help shown")

// report prints err on stderr in one line and maps it to an exit code.
func report(e *env, err error) int {
	var ue usageError
	var xe exitError
	switch {
	case err == nil, errors.Is(err, errHelp):
		return exitOK
	case errors.As(err, &xe):
		return xe.code
	case errors.As(err, &ue):
		fmt.Fprintf(e.stderr, "isofield: %v\n", err)
		return exitUsage
	}
	fmt.Fprintf(e.stderr, "isofield: %v\n", err)
	return exitInput
}

func runVersion(e *env, args []string) error {
	fmt.Fprintf(e.stdout, "isofield %s\n", version)
	return nil
}
