package whatif

import (
	"testing"

	"likewind/envelope"
)

// demoData loads the built-in demo (invented vehicle and facilities).
func demoData(tb testing.TB) (*envelope.Vehicle, []envelope.Facility) {
	tb.Helper()
	v, facs, err := envelope.Demo()
	if err != nil {
		tb.Fatalf("envelope.Demo() error: %v", err)
	}
	return v, facs
}
