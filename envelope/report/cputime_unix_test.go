//go:build unix

package report

import (
	"syscall"
	"time"
)

// processCPU is the processor time the process has used so far (user and
// system, every thread), or 0 where it cannot be read.
func processCPU() time.Duration {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
