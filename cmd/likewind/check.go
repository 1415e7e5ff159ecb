package main

import (
	"fmt"
	"io"

	"likewind/envelope"
)

// runCheck validates vehicle and facility files and prints every problem.
// Exit status 1 when any file has a problem, 2 when no file is given.
func runCheck(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		fmt.Fprintln(stderr, "likewind: check: give one or more vehicle or facility files")
		return 2
	}
	// The report quotes file names and keys; a failed write is reported.
	w := &errWriter{w: envelope.CleanWriter{W: stdout}}
	errs := envelope.Check(args...)
	for _, err := range errs {
		fmt.Fprintln(w, err)
	}
	code := 0
	if len(errs) > 0 {
		fmt.Fprintf(w, "%d problem(s) in %d file(s) checked\n", len(errs), len(args))
		code = 1
	} else {
		fmt.Fprintf(w, "%d file(s) checked, no problems\n", len(args))
	}
	if w.err != nil {
		fmt.Fprintln(stderr, "likewind: check: standard output:", w.err)
		return 1
	}
	return code
}
