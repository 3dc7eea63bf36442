package plot

import (
	"flag"
	"os"
	"path/filepath"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden SVG files under testdata/plot")

const goldenDir = "../../testdata/plot"

// TestGolden renders fixed charts and compares the SVG with the files
// under testdata/plot, written by this package (go test -run TestGolden
// -update) and checked by eye when they change.
func TestGolden(t *testing.T) {
	for _, g := range []struct {
		file  string
		chart *Chart
	}{
		{"loglog.svg", logLogChart()},
		{"semilog.svg", semilogChart()},
	} {
		t.Run(g.file, func(t *testing.T) {
			root, _, err := g.chart.Render()
			if err != nil {
				t.Fatal(err)
			}
			got := root.SVG()
			again, _, _ := g.chart.Render()
			if again.SVG() != got {
				t.Fatal("two renderings of the same chart differ")
			}
			path := filepath.Join(goldenDir, g.file)
			if *update {
				if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("%v (run go test -run TestGolden -update to create it)", err)
			}
			if got != string(want) {
				t.Errorf("%s differs from the rendering (%d bytes, file %d bytes); check the change and rerun with -update",
					path, len(got), len(want))
			}
		})
	}
}
