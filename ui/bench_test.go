package ui

import (
	"fmt"
	"testing"

	"fieldfit/ui/project"
	"fieldfit/ui/store"
)

func benchProject(n int) *project.Project {
	p := project.New("bench", project.SI, clock0)
	p.Wells = []project.Well{{ID: "o", Name: "OW", Kind: project.Observation, Distance: project.Entry{Text: "25", Unit: "m", SI: 25, OK: true}}}
	t := project.Test{ID: "t", ObservationWell: "o", StaticLevel: entryM(5.12),
		Rate: project.Entry{Text: "7.5", Unit: "L/s", SI: 7.5e-3, OK: true}}
	for i := 0; i < n; i++ {
		t.Readings = append(t.Readings, project.Reading{TimeText: fmt.Sprint(i + 1), DepthText: fmt.Sprintf("%.3f", 5.2+0.001*float64(i))})
	}
	p.Tests = []project.Test{t}
	return p
}

// BenchmarkRenderReadings measures one render of the readings tab, the
// work done on every keystroke in the table.
func BenchmarkRenderReadings(b *testing.B) {
	for _, n := range []int{25, 200} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			a := NewApp(Options{Store: store.NewMemory()})
			a.cur, a.screen, a.tab = benchProject(n), ProjectScreen, TabReadings
			b.ReportAllocs()
			for b.Loop() {
				a.Render()
			}
		})
	}
}

// BenchmarkCheckReadings measures the parse and checks of a table.
func BenchmarkCheckReadings(b *testing.B) {
	t := &benchProject(1000).Tests[0]
	m := mustUnit("m")
	b.ReportAllocs()
	for b.Loop() {
		CheckReadings(t, m)
	}
}
