package main

import (
	"fmt"
	"io"
	"runtime/debug"
	"strings"
	"text/tabwriter"

	"github.com/spf13/pflag"
)

// command describes one subcommand: its help text and how to build its
// flags and runner.
type command struct {
	name     string
	summary  string // one line, for the command list
	usage    string // argument synopsis after the command name
	about    string // paragraphs shown by --help
	examples []example
	newImpl  func() commandImpl
}

// example is one command line with a line saying what it does.
type example struct{ line, what string }

// commandImpl holds the flag values of one invocation of a command.
type commandImpl interface {
	// define registers the command's flags on fs, bound to the receiver.
	define(fs *pflag.FlagSet)
	// run executes the command with the positional arguments.
	run(e *env, args []string) error
}

// commands lists the subcommands in the order help shows them. It is set
// in init because the help command looks commands up in it (an
// initialisation cycle otherwise).
var commands []*command

func init() {
	commands = []*command{inspectCommand, forcesCommand, sweepCommand, wallCommand, wakeCommand, checkCommand, convertCommand, demoCommand, versionCommand, helpCommand}
}

// findCommand returns the command called name, or nil.
func findCommand(name string) *command {
	for _, c := range commands {
		if c.name == name {
			return c
		}
	}
	return nil
}

// invocation is a parsed command: its flag set and runner.
type invocation struct {
	cmd  *command
	fs   *pflag.FlagSet
	impl commandImpl
}

// newInvocation builds the flag set of c with its --help flag.
func newInvocation(c *command) *invocation {
	fs := pflag.NewFlagSet("farforce "+c.name, pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.SortFlags = false
	fs.BoolP("help", "h", false, "show this help and exit")
	impl := c.newImpl()
	impl.define(fs)
	return &invocation{cmd: c, fs: fs, impl: impl}
}

// writeMainHelp prints the program overview and the command list.
func writeMainHelp(w io.Writer) {
	fmt.Fprintf(w, `farforce %s - forces on a body from a CFD solution, by the momentum balance
over closed control surfaces cut through the mesh.

Usage:
  farforce COMMAND [FLAGS] [ARGS]

Commands:
`, version)
	tw := tabwriter.NewWriter(w, 0, 0, 3, ' ', 0)
	for _, c := range commands {
		fmt.Fprintf(tw, "  %s\t%s\n", c.name, c.summary)
	}
	tw.Flush()
	fmt.Fprint(w, `
Flags:
  -h, --help      show this help
  -V, --version   print the version

Examples:
  farforce demo
  farforce inspect solution.vtk
  farforce forces solution.vtk --surface 'circle center=0,0 radius=2' --speed 2 --ref-length 0.1

Run 'farforce COMMAND --help' for the flags and examples of one command.
Exit codes: 0 ok, 1 a gate failed, 2 bad usage or bad input, 3 internal error.
`)
}

// writeCommandHelp prints the help of one command.
func writeCommandHelp(w io.Writer, inv *invocation) {
	c := inv.cmd
	fmt.Fprintf(w, "farforce %s - %s\n\nUsage:\n  farforce %s %s\n\n", c.name, c.summary, c.name, c.usage)
	if c.about != "" {
		fmt.Fprintf(w, "%s\n\n", strings.TrimSpace(c.about))
	}
	fmt.Fprintf(w, "Flags:\n%s\n", flagUsages(inv.fs))
	if len(c.examples) > 0 {
		fmt.Fprintln(w, "Examples:")
		for _, ex := range c.examples {
			fmt.Fprintf(w, "  # %s\n  %s\n\n", ex.what, ex.line)
		}
	}
}

var versionCommand = &command{
	name:    "version",
	summary: "print the version of farforce",
	usage:   "",
	about:   "Prints the farforce version and the Go release it was built with. Same as 'farforce --version'.",
	examples: []example{
		{"farforce version", "print the version"},
		{"farforce --version", "the same, as a flag"},
	},
	newImpl: func() commandImpl { return &versionImpl{} },
}

type versionImpl struct{}

func (*versionImpl) define(*pflag.FlagSet) {}

func (*versionImpl) run(e *env, args []string) error {
	if len(args) > 0 {
		return usageErr("farforce version", "version takes no arguments, got %q", args[0])
	}
	return runVersion(e)
}

func runVersion(e *env) error {
	goVersion := "unknown Go"
	if bi, ok := debug.ReadBuildInfo(); ok {
		goVersion = bi.GoVersion
	}
	fmt.Fprintf(e.stdout, "farforce %s (%s)\n", version, goVersion)
	return nil
}

var helpCommand = &command{
	name:    "help",
	summary: "show help for farforce or one command",
	usage:   "[COMMAND]",
	about:   "Without an argument, lists the commands. With one, shows that command's flags and examples.",
	examples: []example{
		{"farforce help", "list the commands"},
		{"farforce help forces", "flags and examples of the forces command"},
	},
	newImpl: func() commandImpl { return &helpImpl{} },
}

type helpImpl struct{}

func (*helpImpl) define(*pflag.FlagSet) {}

func (*helpImpl) run(e *env, args []string) error {
	switch len(args) {
	case 0:
		writeMainHelp(e.stdout)
		return nil
	case 1:
		c := findCommand(args[0])
		if c == nil {
			return usageErr("farforce", "unknown command %q", args[0])
		}
		writeCommandHelp(e.stdout, newInvocation(c))
		return nil
	}
	return usageErr("farforce help", "help takes at most one command name")
}

// flagUsages lists the flags of fs in definition order, one per line: the
// flag with its value name (the back-quoted word of its usage), the usage,
// and the default when it is not the zero value.
func flagUsages(fs *pflag.FlagSet) string {
	var b strings.Builder
	tw := tabwriter.NewWriter(&b, 0, 0, 3, ' ', 0)
	fs.VisitAll(func(f *pflag.Flag) {
		name, usage := pflag.UnquoteUsage(f)
		left := "      --" + f.Name
		if f.Shorthand != "" {
			left = "  -" + f.Shorthand + ", --" + f.Name
		}
		if f.Value.Type() != "bool" {
			left += " " + name
		}
		switch f.DefValue {
		case "", "0", "false", "[]":
		default:
			usage += " (default " + f.DefValue + ")"
		}
		fmt.Fprintf(tw, "%s\t%s\n", left, usage)
	})
	tw.Flush()
	return b.String()
}
