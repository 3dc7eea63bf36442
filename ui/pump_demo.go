package ui

import (
	"context"
	"errors"
	"math"
	"math/rand/v2"
	"strconv"

	"fieldfit/models"
	"fieldfit/models/units"
	"fieldfit/ui/project"
)

// leakyScenario is an invented leaky-aquifer pumping test with recovery
// read in two observation wells: the readings are Hantush–Jacob drawdown
// superposed over the pumping and the stop, plus seeded noise, rounded to
// the millimetre as read off a tape. Every name and number is our own.
type leakyScenario struct {
	T, S, B  float64 // m²/s, –, m
	Q        float64 // m³/s
	Stop     float64 // min
	Static   [2]float64
	R        [2]float64 // m
	Noise    float64    // m
	Seed     uint64
	Minutes  []float64 // reading times while pumping, min
	Recovery []float64 // reading times after the stop, min since the stop
}

// demoLeaky is the example project's second test.
var demoLeaky = leakyScenario{
	T: 1.1e-3, S: 2.4e-4, B: 420, Q: 6e-3, Stop: 480,
	Static: [2]float64{4.37, 4.91}, R: [2]float64{18, 55}, Noise: 0.003, Seed: 20260402,
	Minutes:  []float64{1, 2, 3, 4, 5, 7, 10, 14, 20, 30, 45, 60, 90, 120, 180, 240, 300, 360, 420, 480},
	Recovery: []float64{1, 2, 3, 5, 7, 10, 15, 20, 30, 45, 60, 90, 120, 180, 240, 360, 480},
}

// readings returns the reading texts of well k (elapsed minutes since
// the pump started, depth to water in metres).
func (sc leakyScenario) readings(k int) []project.Reading {
	var mins []float64
	mins = append(mins, sc.Minutes...)
	for _, m := range sc.Recovery {
		mins = append(mins, sc.Stop+m)
	}
	ts := make([]float64, len(mins))
	for i, m := range mins {
		ts[i] = m * units.Minute
	}
	m := models.VariableRate{Base: models.Hantush{Q: sc.Q, R: sc.R[k]}, Steps: models.PumpAndStop(sc.Q, sc.Stop*units.Minute)}
	s := make([]float64, len(ts))
	m.Eval(s, ts, []float64{sc.T, sc.S, sc.B})
	rng := rand.New(rand.NewPCG(sc.Seed, uint64(k)))
	rs := make([]project.Reading, len(ts))
	for i := range ts {
		depth := math.Round((sc.Static[k]+s[i]+sc.Noise*rng.NormFloat64())*1000) / 1000
		rs[i] = project.Reading{TimeText: strconv.FormatFloat(mins[i], 'f', -1, 64), DepthText: strconv.FormatFloat(depth, 'f', 3, 64)}
	}
	return rs
}

// addLeakyDemo adds the leaky test with recovery at two wells to the
// example project p, fitted with every model (Hantush–Jacob chosen).
func addLeakyDemo(ctx context.Context, p *project.Project, pumpID string, fit func(context.Context, FitRequest) (*FitOutcome, error)) error {
	sc := demoLeaky
	m := mustUnit("m")
	e := func(v float64) project.Entry {
		return project.Entry{Text: strconv.FormatFloat(v, 'f', -1, 64), Unit: m.Symbol, SI: v, OK: true}
	}
	ow := []project.Well{
		{ID: project.NewID(), Name: "OW-2 (north)", Kind: project.Observation, Radius: e(0.025), Distance: e(sc.R[0])},
		{ID: project.NewID(), Name: "OW-3 (orchard)", Kind: project.Observation, Radius: e(0.025), Distance: e(sc.R[1])},
	}
	p.Wells = append(p.Wells, ow...)
	ls := mustUnit("L/s")
	t := project.Test{
		ID: project.NewID(), Name: "Leaky test with recovery, 2 wells", Start: p.Tests[0].Start.AddDate(0, 0, 2), StartText: "2026-03-19T08:00",
		Rate:        project.Entry{Text: "6", Unit: ls.Symbol, SI: ls.ToSI(6), OK: true},
		StaticLevel: e(sc.Static[0]), PumpingWell: pumpID, ObservationWell: ow[0].ID,
		TimeMode: project.ElapsedMinutes, DepthUnit: m.Symbol, Readings: sc.readings(0),
		Fit: project.FitSettings{Model: project.Hantush},
		Pump: &project.PumpData{Stop: sc.Stop * units.Minute, StopText: strconv.FormatFloat(sc.Stop, 'f', -1, 64),
			Wells: []project.WellReadings{{WellID: ow[1].ID, StaticLevel: e(sc.Static[1]), Readings: sc.readings(1)}}},
	}
	p.Tests = append(p.Tests, t)
	tt := &p.Tests[len(p.Tests)-1]
	now := p.Changed
	for _, pm := range pumpModels {
		tt.Fit.Model = pm.id
		req, missing := fitRequest(p, tt, nil)
		if len(missing) > 0 {
			continue // not applicable to this test (none is, today)
		}
		out, err := fit(ctx, req)
		if err != nil {
			continue // shown as missing from the comparison table
		}
		storeFit(tt, out.Fit, now)
		if pm.id == project.Hantush {
			r := out.Result
			r.At = now
			tt.Result = &r
		}
	}
	tt.Fit.Model = project.Hantush
	if tt.Result == nil {
		return errFitDemo
	}
	return nil
}

var errFitDemo = errors.New("the leaky test of the example could not be fitted")
