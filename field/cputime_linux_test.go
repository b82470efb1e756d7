//go:build linux

package field_test

import (
	"syscall"
	"time"
)

// threadCPU returns the CPU time used by the calling OS thread (Linux
// RUSAGE_THREAD): benchmark figures that do not count time spent waiting
// for a core on a loaded machine.
func threadCPU() time.Duration { return rusage(1) }

// processCPU returns the CPU time used by the whole process, all threads.
func processCPU() time.Duration { return rusage(syscall.RUSAGE_SELF) }

func rusage(who int) time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(who, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
