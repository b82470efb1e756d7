//go:build linux

package surface

import (
	"syscall"
	"time"
)

// processCPU returns the CPU time used by the whole process, all threads
// (user plus system): benchmark figures that a loaded machine does not
// inflate.
func processCPU() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
