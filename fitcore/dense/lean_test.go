package dense

import (
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// heavy matches the uses of gonum/mat that link LAPACK's blocked drivers,
// Level-3 BLAS and condition estimates into app.wasm: mat's
// factorisations, its vector type (whose solves and products go through
// them) and the general solves and products. mat.Dense and mat.SymDense as
// plain storage (At, Set, RawMatrix, Slice) link little and are fine.
var heavy = regexp.MustCompile(`mat\.(Cholesky|QR|LU|SVD|EigenSym|Eigen|LQ|GSVD|HOGSVD|(New)?VecDense|DenseCopyOf)\b|\.(SymOuterK|MulVec|Solve|SolveTo|Inverse|Apply)\(`)

// TestLean: fitcore and models (outside tests) do their linear algebra
// with this package. Calling gonum/mat's factorisations instead put about
// 330 kB of code into app.wasm (measured 2026-12-02: gonum's share of the
// unstripped app.wasm fell from 402 kB to 72 kB when this package replaced
// them), against a bundle budget of 1.8 MB gzipped.
func TestLean(t *testing.T) {
	for _, root := range []string{"..", "../../models"} {
		err := filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
			if err != nil {
				return err
			}
			if d.IsDir() && d.Name() == "testdata" {
				return filepath.SkipDir
			}
			if d.IsDir() || !strings.HasSuffix(path, ".go") || strings.HasSuffix(path, "_test.go") {
				return nil
			}
			src, err := os.ReadFile(path)
			if err != nil {
				return err
			}
			for i, line := range strings.Split(string(src), "\n") {
				if m := heavy.FindString(line); m != "" {
					t.Errorf("%s:%d: %q: use fieldfit/fitcore/dense instead of gonum/mat's linear algebra (it keeps LAPACK's blocked code out of app.wasm)", path, i+1, m)
				}
			}
			return nil
		})
		if err != nil {
			t.Fatal(err)
		}
	}
}
