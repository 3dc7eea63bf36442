package ui

import (
	"context"
	"math"
	"math/rand/v2"
	"strconv"
	"time"

	"fieldfit/models"
	"fieldfit/models/units"
	"fieldfit/ui/project"
)

// The example project offered on an empty device is an invented site and
// test; every name and number below is our own. Its readings are made
// from the Theis curve with these parameters plus a little noise and are
// rounded to the millimetre, as read off a tape.
const (
	demoT      = 3.2e-3   // transmissivity, m²/s (276 m²/d)
	demoS      = 1.6e-4   // storativity
	demoQ      = 9.5e-3   // pumping rate, m³/s (9.5 L/s)
	demoR      = 32.0     // distance of the observation well, m
	demoStatic = 6.84     // static depth to water in the observation well, m
	demoNoise  = 0.004    // standard deviation of the reading noise, m
	demoB      = 24.0     // aquifer thickness, m
	demoSeed   = 20260317 // seed of the noise, so the example is the same everywhere
)

// demoMinutes are the reading times of the example, in minutes since the
// pump started: a usual field schedule, dense early and sparse late.
var demoMinutes = []float64{1, 1.5, 2, 3, 4, 5, 6, 8, 10, 12, 15, 20, 25, 30, 40, 50, 60, 80, 100, 120, 150, 180, 240, 300, 360}

// DemoReadings returns the example's reading texts (elapsed minutes,
// depth to water in metres).
func DemoReadings() []project.Reading {
	m := models.Theis{Q: demoQ, R: demoR}
	t := make([]float64, len(demoMinutes))
	for i, v := range demoMinutes {
		t[i] = v * units.Minute
	}
	s := make([]float64, len(t))
	m.Eval(s, t, []float64{demoT, demoS})
	rng := rand.New(rand.NewPCG(demoSeed, 1))
	rs := make([]project.Reading, len(t))
	for i := range t {
		depth := demoStatic + s[i] + demoNoise*rng.NormFloat64()
		depth = math.Round(depth*1000) / 1000
		rs[i] = project.Reading{
			TimeText:  strconv.FormatFloat(demoMinutes[i], 'f', -1, 64),
			DepthText: strconv.FormatFloat(depth, 'f', 3, 64),
		}
	}
	return rs
}

// DemoProject returns the example project with its readings entered and
// fitted with fit (Theis).
func DemoProject(ctx context.Context, now time.Time, fit func(context.Context, FitRequest) (*FitOutcome, error)) (*project.Project, error) {
	p := project.New("Example: Larkspur Dairy well field", project.SI, now)
	p.Demo = true
	p.Site = "Larkspur Dairy, east paddock (an invented example site)"
	p.Notes = "An invented example to show the whole path from readings to a fit. Delete it when you no longer need it."
	m := mustUnit("m")
	e := func(v float64) project.Entry {
		return project.Entry{Text: strconv.FormatFloat(v, 'f', -1, 64), Unit: m.Symbol, SI: v, OK: true}
	}
	p.Thickness = e(demoB)
	pw := project.Well{ID: project.NewID(), Name: "PW-1", Kind: project.Pumping,
		Radius: e(0.1), ScreenTop: e(18), ScreenBottom: e(36), MPElevation: e(112.4)}
	ow := project.Well{ID: project.NewID(), Name: "OW-1", Kind: project.Observation,
		Radius: e(0.025), ScreenTop: e(20), ScreenBottom: e(34), MPElevation: e(112.95), Distance: e(demoR)}
	p.Wells = []project.Well{pw, ow}
	start := time.Date(2026, 3, 17, 9, 0, 0, 0, time.UTC)
	ls := mustUnit("L/s")
	t := project.Test{
		ID: project.NewID(), Name: "Constant rate, 6 h", Start: start, StartText: "2026-03-17T09:00",
		Rate:        project.Entry{Text: "9.5", Unit: ls.Symbol, SI: ls.ToSI(9.5), OK: true},
		StaticLevel: e(demoStatic), PumpingWell: pw.ID, ObservationWell: ow.ID,
		TimeMode: project.ElapsedMinutes, DepthUnit: m.Symbol, Readings: DemoReadings(),
		Fit: project.FitSettings{Model: project.Theis},
	}
	p.Tests = []project.Test{t}
	tt := &p.Tests[0]
	req, missing := fitRequest(p, tt, nil)
	if len(missing) > 0 {
		panic("ui: the example project is incomplete: " + missing[0])
	}
	out, err := fit(ctx, req)
	if err != nil {
		return nil, err
	}
	r := out.Result
	r.At = now.UTC()
	tt.Result = &r
	storeFit(tt, out.Fit, now.UTC())
	if err := addLeakyDemo(ctx, p, pw.ID, fit); err != nil {
		return nil, err
	}
	if err := demoKindTests(ctx, p, ow.ID); err != nil {
		return nil, err
	}
	return p, nil
}
