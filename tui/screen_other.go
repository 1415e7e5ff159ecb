//go:build !unix

package tui

import "os"

// notifyResize does nothing where terminals send no size signal; the size
// read at start stays.
func notifyResize(chan<- os.Signal) {}
