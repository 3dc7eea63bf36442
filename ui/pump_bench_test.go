package ui

import (
	"context"
	"testing"

	"fieldfit/ui/project"
)

// BenchmarkFitTestLeakyTwoWells times the app's fit of the invented
// two-well leaky test with recovery (Hantush–Jacob over the pumping and
// the stop, joint fit of both wells): the work behind one tap on Fit.
func BenchmarkFitTestLeakyTwoWells(b *testing.B) {
	p, err := DemoProject(context.Background(), clock0, FitTest)
	if err != nil {
		b.Fatal(err)
	}
	t := &p.Tests[1]
	if t.Fit.Model != project.Hantush {
		b.Fatalf("the example's second test is fitted with %q", t.Fit.Model)
	}
	req, missing := fitRequest(p, t, nil)
	if len(missing) > 0 {
		b.Fatal(missing)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := FitTest(context.Background(), req); err != nil {
			b.Fatal(err)
		}
	}
}
