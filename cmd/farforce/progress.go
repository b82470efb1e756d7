package main

import (
	"fmt"
	"io"
	"os"
	"time"
)

// isTerminal reports whether w is a character device (a terminal).
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	fi, err := f.Stat()
	return err == nil && fi.Mode()&os.ModeCharDevice != 0
}

// progress prints what a long step is doing, and how long it took, on
// stderr when stderr is a terminal; otherwise it stays quiet (DESIGN §5).
type progress struct {
	w     io.Writer // nil: quiet
	start time.Time
}

// newProgress returns a progress reporter for e.
func newProgress(e *env) *progress {
	if !e.tty {
		return &progress{}
	}
	return &progress{w: e.stderr}
}

// step announces a step and starts its clock.
func (p *progress) step(format string, a ...any) {
	if p.w == nil {
		return
	}
	p.start = time.Now()
	fmt.Fprintf(p.w, "farforce: "+format+" ...", a...)
}

// done ends the current step with its duration.
func (p *progress) done() {
	if p.w == nil {
		return
	}
	fmt.Fprintf(p.w, " %.2f s\n", time.Since(p.start).Seconds())
}
