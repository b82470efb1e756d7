//go:build linux

package fieldtest

import (
	"syscall"
	"time"
)

// ProcessCPU returns the CPU time (user plus system) used by the whole
// process, all threads: benchmark figures that a loaded machine does not
// inflate the way it inflates wall time.
func ProcessCPU() time.Duration { return rusage(syscall.RUSAGE_SELF) }

// ThreadCPU returns the CPU time used by the calling OS thread (Linux
// RUSAGE_THREAD); it leaves out time spent waiting for a core.
func ThreadCPU() time.Duration { return rusage(1) }

func rusage(who int) time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(who, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
