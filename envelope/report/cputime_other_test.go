//go:build !unix

package report

import "time"

// processCPU is 0: the processor time is not read on this system.
func processCPU() time.Duration { return 0 }
