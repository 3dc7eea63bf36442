package fielddata

import (
	"bytes"
	"context"
	"math"
	"os"
	"path/filepath"
	"testing"
	"time"
)

// The native tests read zone names from the system's zone database; the
// browser app does not (see LoadZone).
func init() { LoadZone = time.LoadLocation }

// fixture reads a file of testdata/fielddata (written by make_fixtures.py).
func fixture(t testing.TB, name string) []byte {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "..", "testdata", "fielddata", name))
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// sniffed sniffs a fixture and fails the test on an error.
func sniffed(t testing.TB, name string) (*Detected, []byte) {
	t.Helper()
	b := fixture(t, name)
	d, err := Sniff(b)
	if err != nil {
		t.Fatalf("Sniff(%s): %v", name, err)
	}
	return d, b
}

func importBytes(b []byte, opt Options, m Mapping, s *ImportSettings) (*Record, error) {
	return Import(context.Background(), bytes.NewReader(b), opt, m, s)
}

// closeTo reports whether a and b agree to the relative tolerance tol (or
// absolutely, near zero).
func closeTo(a, b, tol float64) bool {
	if a == b {
		return true
	}
	d := math.Abs(a - b)
	return d <= tol*math.Max(math.Abs(a), math.Abs(b)) || d <= tol
}

func unix(y, mo, d, h, mi, s int) float64 {
	return float64(daysFromCivil(y, mo, d)*86400 + int64(h*3600+mi*60+s))
}

func ptr(v float64) *float64 { return &v }
