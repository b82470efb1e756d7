//go:build !linux

package field_test

import "time"

// threadCPU is not measured outside Linux.
func threadCPU() time.Duration { return 0 }

// processCPU is not measured outside Linux.
func processCPU() time.Duration { return 0 }
