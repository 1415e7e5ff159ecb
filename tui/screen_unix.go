//go:build unix

package tui

import (
	"os"
	"os/signal"
	"syscall"
)

// notifyResize makes c receive a signal when the terminal changes size.
func notifyResize(c chan<- os.Signal) { signal.Notify(c, syscall.SIGWINCH) }
