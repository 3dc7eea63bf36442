package models

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// TestBoundaryLineGeometry checks rᵢ from the law of cosines on the three
// placements whose distance is plain geometry (θ = 0, π/2, π), and that
// the model equals ImageWell at that rᵢ.
func TestBoundaryLineGeometry(t *testing.T) {
	const r, a = 40.0, 150.0
	for _, tc := range []struct {
		theta, want float64
	}{
		{0, 2*a - r},                          // between the well and the boundary
		{math.Pi / 2, math.Sqrt(r*r + 4*a*a)}, // alongside
		{math.Pi, 2*a + r},                    // behind the well
	} {
		m := BoundaryLine{Base: Theis{Q: scQ, R: r}, Kind: NoFlowBoundary, Angle: tc.theta, A: a}
		if got := m.ImageDistance(a); math.Abs(got-tc.want) > 1e-9*tc.want {
			t.Errorf("θ = %g: rᵢ = %v, want %v", tc.theta, got, tc.want)
		}
		ts := logTimes(12, 60, 1e6)
		got, want := make([]float64, len(ts)), make([]float64, len(ts))
		m.Eval(got, ts, []float64{scT, scS})
		ImageWell{Base: Theis{Q: scQ, R: r}, Kind: NoFlowBoundary, Image: tc.want}.Eval(want, ts, []float64{scT, scS})
		for i := range ts {
			if relDiff(got[i], want[i]) > 1e-12 {
				t.Errorf("θ = %g, t = %g: %v, ImageWell %v", tc.theta, ts[i], got[i], want[i])
			}
		}
	}
	ts := logTimes(40, 1, 1e7)
	for _, m := range []BoundaryLine{
		{Base: Theis{Q: scQ, R: 30}, Kind: NoFlowBoundary, Angle: 0.7},
		{Base: Theis{Q: scQ, R: 30}, Kind: ConstantHeadBoundary, Angle: 2.5},
		{Base: Hantush{Q: lkQ, R: lkR}, Kind: NoFlowBoundary, Angle: 1.2},
	} {
		p := []float64{scT, scS, 200}
		if _, ok := m.Base.(Hantush); ok {
			p = []float64{lkT, lkS, lkB, 300}
		}
		checkJacobian(t, scaled{m, p}, ts, ones(len(p)), 2e-6)
	}
}

// TestFitWellsBoundaryGeometry is a joint fit of three invented wells at
// different distances and bearings from a no-flow boundary 180 m from the
// pumped well: with BoundaryLine each well has its own image distance and
// the truth comes back within the intervals; one shared fitted rᵢ
// (ImageWell) cannot match all three wells and leaves residuals far above
// the noise.
func TestFitWellsBoundaryGeometry(t *testing.T) {
	const a = 180.0
	rng := rand.New(rand.NewPCG(77, 5))
	type pos struct{ r, theta float64 }
	places := []pos{{20, 0}, {60, math.Pi / 2}, {110, 2.6}}
	var geo, shared []Well
	for k, pl := range places {
		m := BoundaryLine{Base: Theis{Q: scQ, R: pl.r}, Kind: NoFlowBoundary, Angle: pl.theta}
		ts := logTimes(30, 60, 3e5)
		s := make([]float64, len(ts))
		m.Eval(s, ts, []float64{scT, scS, a})
		for i := range s {
			s[i] += 0.002 * rng.NormFloat64()
		}
		name := []string{"north", "east", "south"}[k]
		geo = append(geo, Well{Name: name, Model: m, Data: Data{Time: ts, Value: s}})
		shared = append(shared, Well{Name: name, Model: ImageWell{Base: Theis{Q: scQ, R: pl.r}, Kind: NoFlowBoundary}, Data: Data{Time: ts, Value: s}})
	}
	r, err := FitWells(geo, nil)
	if err != nil {
		t.Fatal(err)
	}
	for j, want := range []float64{scT, scS, a} {
		e := r.Estimates[j]
		if !(e.Lower <= want && want <= e.Upper) {
			t.Errorf("%s = %v (%v – %v), truth %v", e.Name, e.Value, e.Lower, e.Upper, want)
		}
	}
	if r.Fit.RMSE > 0.003 {
		t.Errorf("RMSE %v with noise 0.002", r.Fit.RMSE)
	}
	for k, w := range r.Wells {
		m := geo[k].Model.(BoundaryLine)
		ri := m.ImageDistance(r.Params[2])
		if want := m.ImageDistance(a); math.Abs(ri-want) > 0.1*want {
			t.Errorf("%s: rᵢ = %v, truth %v", w.Name, ri, want)
		}
	}
	rs, err := FitWells(shared, nil)
	if err == nil && rs.Fit.RMSE < 3*r.Fit.RMSE {
		t.Errorf("one shared image distance fits as well (RMSE %v against %v): the wells do not test the geometry", rs.Fit.RMSE, r.Fit.RMSE)
	}
}

// TestBoundaryLineErrors checks the bad inputs: a given boundary distance
// not beyond the observation point, a non-finite angle, no kind.
func TestBoundaryLineErrors(t *testing.T) {
	for _, tc := range []struct {
		m    BoundaryLine
		want string
	}{
		{BoundaryLine{Base: Theis{Q: scQ, R: 50}, Kind: NoFlowBoundary, A: 40}, "a must exceed r·cos θ = 50 m"},
		{BoundaryLine{Base: Theis{Q: scQ, R: 50}, Kind: NoFlowBoundary, A: -3}, "a = -3"},
		{BoundaryLine{Base: Theis{Q: scQ, R: 50}, Kind: NoFlowBoundary, Angle: math.NaN()}, "angle"},
		{BoundaryLine{Base: Theis{Q: scQ, R: 50}}, "no-flow or constant-head"},
	} {
		err := tc.m.Check()
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%+v: %v, want %q", tc.m, err, tc.want)
		}
	}
	// θ = π/2 puts the point alongside: any positive a is beyond it.
	if err := (BoundaryLine{Base: Theis{Q: scQ, R: 50}, Kind: NoFlowBoundary, Angle: math.Pi / 2, A: 10}).Check(); err != nil {
		t.Error(err)
	}
}
