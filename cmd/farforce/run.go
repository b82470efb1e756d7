package main

import (
	"errors"
	"fmt"
	"io"
	"runtime/debug"
	"strings"
)

// Exit codes of every command (DESIGN §5).
const (
	exitOK       = 0 // all good
	exitGate     = 1 // a pass/fail gate failed
	exitBadInput = 2 // bad usage or bad input
	exitInternal = 3 // internal error
)

// version is the release of this build.
const version = "0.1.0-dev"

// env carries the streams a command may use. Commands never touch os.Std*.
type env struct {
	stdin          io.Reader
	stdout, stderr io.Writer
	tty            bool // stderr is a terminal: show progress
}

// run executes the command line args (without the program name) and returns
// the process exit code. It is the whole program except os.Exit, so tests
// call it directly. A panic inside a command (a programmer error) is
// reported as an internal error with exit code 3.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) (code int) {
	e := &env{stdin: stdin, stdout: stdout, stderr: stderr, tty: isTerminal(stderr)}
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(stderr, "farforce: internal error: %v\n%s", r, debug.Stack())
			code = exitInternal
		}
	}()
	err := dispatch(e, args)
	if err == nil {
		return exitOK
	}
	fmt.Fprintf(stderr, "farforce: %s\n", strings.TrimSuffix(err.Error(), "\n"))
	var ce *codeError
	if errors.As(err, &ce) {
		if ce.usage != "" {
			fmt.Fprintf(stderr, "Run '%s --help' for usage.\n", ce.usage)
		}
		return ce.code
	}
	return exitInternal
}

// dispatch picks the command named by args[0], parses its flags and runs it.
func dispatch(e *env, args []string) error {
	if len(args) == 0 {
		writeMainHelp(e.stderr)
		return &codeError{code: exitBadInput, err: errors.New("no command given")}
	}
	name, rest := args[0], args[1:]
	switch name {
	case "-h", "--help":
		writeMainHelp(e.stdout)
		return nil
	case "-V", "--version":
		return runVersion(e)
	}
	c := findCommand(name)
	if c == nil {
		if strings.HasPrefix(name, "-") {
			return usageErr("farforce", "unknown flag %q before the command", name)
		}
		return usageErr("farforce", "unknown command %q", name)
	}
	inv := newInvocation(c)
	if err := inv.fs.Parse(rest); err != nil {
		return usageErr("farforce "+c.name, "%s: %v", c.name, err)
	}
	if help, _ := inv.fs.GetBool("help"); help {
		writeCommandHelp(e.stdout, inv)
		return nil
	}
	return inv.impl.run(e, inv.fs.Args())
}

// codeError is an error with the exit code it deserves. usage, when set,
// names the command whose --help the user is pointed to.
type codeError struct {
	code  int
	usage string
	err   error
}

func (e *codeError) Error() string { return e.err.Error() }
func (e *codeError) Unwrap() error { return e.err }

// usageErr reports a bad command line of command cmd (exit code 2).
func usageErr(cmd, format string, a ...any) error {
	return &codeError{code: exitBadInput, usage: cmd, err: fmt.Errorf(format, a...)}
}

// inputErr marks err as caused by bad input data (exit code 2).
func inputErr(err error) error {
	if err == nil {
		return nil
	}
	return &codeError{code: exitBadInput, err: err}
}
