package field

import "syscall"

// threadCPU returns the CPU time in ns used by the calling OS thread
// (Linux RUSAGE_THREAD), leaving out time spent waiting for a core. It is
// fieldtest.ThreadCPU for the package's internal benchmarks, which cannot
// import fieldtest (it imports field).
func threadCPU() int64 {
	var ru syscall.Rusage
	if err := syscall.Getrusage(1, &ru); err != nil {
		return 0
	}
	return ru.Utime.Nano() + ru.Stime.Nano()
}
