//go:build !linux

package field

// threadCPU returns 0 where the thread CPU time is not available.
func threadCPU() int64 { return 0 }
