//go:build !linux

package fieldtest

import "time"

// ProcessCPU is not measured outside Linux; CPU figures read 0.
func ProcessCPU() time.Duration { return 0 }

// ThreadCPU is not measured outside Linux; CPU figures read 0.
func ThreadCPU() time.Duration { return 0 }
