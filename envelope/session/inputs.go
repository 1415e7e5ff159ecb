package session

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"strings"

	"likewind/envelope"
)

// ErrMismatch is wrapped by Check when a session belongs to
// other input files.
var ErrMismatch = errors.New("session belongs to different input files")

// DataHash is a content hash of loaded vehicle and facility data. It is
// the default session hash when the caller does not hash the files.
func DataHash(v *envelope.Vehicle, facs []envelope.Facility) string {
	h := sha256.New()
	enc := json.NewEncoder(h)
	// Encoding plain structs of numbers and strings cannot fail.
	_ = enc.Encode(v)
	_ = enc.Encode(facs)
	return "sha256:" + hex.EncodeToString(h.Sum(nil))
}

// HashFiles hashes the contents of the input files, in order.
func HashFiles(paths ...string) (string, error) {
	h := sha256.New()
	for _, p := range paths {
		data, err := os.ReadFile(p)
		if err != nil {
			return "", fmt.Errorf("hash input file: %w", err)
		}
		fmt.Fprintf(h, "%d\n", len(data))
		h.Write(data)
	}
	return "sha256:" + hex.EncodeToString(h.Sum(nil)), nil
}

// Check reports whether s was saved for the same input data.
func Check(s Session, inputs []string, hash string) error {
	if s.Version != Version {
		return fmt.Errorf("session version %d not supported (expected %d)", s.Version, Version)
	}
	if s.Hash != hash {
		return fmt.Errorf("%w: saved for %s, now %s", ErrMismatch,
			InputNames(s.Inputs), InputNames(inputs))
	}
	return nil
}

// InputNames names input files for a message or a dump header: their
// names, cleaned for a terminal, or "built-in demo data" for none.
func InputNames(names []string) string {
	if len(names) == 0 {
		return "built-in demo data"
	}
	return envelope.CleanText(strings.Join(names, ", "))
}

// CheckInputs accepts a session saved for the same data as the
// input files (their content hash, HashFiles) or as the loaded vehicle
// and facilities (DataHash: the built-in demo, or a session hashed that
// way). It returns Check's reason otherwise.
func CheckInputs(s Session, files []string, v *envelope.Vehicle, facs []envelope.Facility) error {
	var hashes []string
	if len(files) > 0 {
		if h, err := HashFiles(files...); err == nil {
			hashes = append(hashes, h)
		}
	}
	hashes = append(hashes, DataHash(v, facs))
	var err error
	for _, h := range hashes {
		if err = Check(s, files, h); err == nil {
			return nil
		}
	}
	return err
}
