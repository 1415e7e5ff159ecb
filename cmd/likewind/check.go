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
	stdout = envelope.CleanWriter{W: stdout} // the report quotes file names and keys
	errs := envelope.Check(args...)
	for _, err := range errs {
		fmt.Fprintln(stdout, err)
	}
	if len(errs) > 0 {
		fmt.Fprintf(stdout, "%d problem(s) in %d file(s) checked\n", len(errs), len(args))
		return 1
	}
	fmt.Fprintf(stdout, "%d file(s) checked, no problems\n", len(args))
	return 0
}
