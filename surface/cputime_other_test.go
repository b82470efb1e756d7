//go:build !linux

package surface

import "time"

// processCPU is not measured outside Linux; CPU figures read 0.
func processCPU() time.Duration { return 0 }
