package ui

import (
	"context"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"

	"fieldfit/models/infiltration"
	"fieldfit/models/units"
	"fieldfit/ui/project"
)

// The example slug test, infiltration test and decay curve are invented
// like the rest of the example project: our own site names and numbers.
// Their readings are made from the models with the parameters below plus
// seeded noise, rounded as read in the field.

// Slug test in the example's OW-1: a falling-head test (slug in), depth
// to water read by a transducer, K by Hvorslev's long-screen form.
const (
	demoSlugK      = 4.0e-6 // hydraulic conductivity, m/s
	demoSlugRc     = 0.025  // casing radius, m
	demoSlugRw     = 0.05   // screen radius with pack, m
	demoSlugLe     = 1.5    // screen length, m
	demoSlugLw     = 4.2    // screen bottom below the static level, m
	demoSlugStatic = 3.415  // static depth to water, m
	demoSlugH0     = 0.62   // initial rise of the level, m
	demoSlugNoise  = 0.002  // m
)

var demoSlugSeconds = []float64{0, 5, 10, 15, 20, 30, 40, 50, 60, 80, 100, 120, 150, 180, 240, 300, 360, 480, 600}

// Double-ring test, water depth in the inner ring read off a scale (mm),
// refilled twice; Horton parameters.
const (
	demoInfFc    = 12.0 // steady rate, mm/h
	demoInfF0    = 95.0 // initial rate, mm/h
	demoInfK     = 0.08 // decay constant, 1/min
	demoInfStart = 150  // depth of water after filling, mm
	demoInfNoise = 0.4  // mm
)

var demoInfMinutes = []float64{0, 2, 4, 6, 8, 10, 15, 20, 25, 30, 40, 50, 60, 75, 90, 105, 120}

// Tracer dilution in a sampling point: concentration (mg/L) relaxing to
// the background.
const (
	demoDecY0    = 48.0  // mg/L
	demoDecBase  = 3.5   // mg/L
	demoDecK     = 0.045 // 1/min
	demoDecNoise = 0.3   // mg/L
)

var demoDecMinutes = []float64{0, 3, 6, 10, 15, 20, 25, 30, 40, 50, 60, 75, 90, 105, 120, 150}

func demoRound(v, step float64) string {
	return strconv.FormatFloat(math.Round(v/step)*step, 'f', -1, 64)
}

// DemoSlugRows returns the example slug test's readings: seconds and
// depth to water (m).
func DemoSlugRows() []project.KindRow {
	F := 2 * math.Pi * demoSlugLe / math.Log(demoSlugLe/demoSlugRw) // Hvorslev, long screen
	T0 := math.Pi * demoSlugRc * demoSlugRc / (F * demoSlugK)
	rng := rand.New(rand.NewPCG(20260402, 2))
	rows := make([]project.KindRow, len(demoSlugSeconds))
	for i, t := range demoSlugSeconds {
		depth := demoSlugStatic - demoSlugH0*math.Exp(-t/T0) + demoSlugNoise*rng.NormFloat64()
		rows[i] = project.KindRow{Time: demoRound(t, 1), Value: demoRound(depth, 0.001)}
	}
	return rows
}

// DemoInfiltrationRows returns the example ring test's readings: minutes,
// depth of water in the inner ring (mm) and the refills.
func DemoInfiltrationRows() []project.KindRow {
	mmh := mustUnit("mm/h")
	m := infiltration.Horton.Model(infiltration.CumulativeCurve)
	ts := make([]float64, len(demoInfMinutes))
	for i, t := range demoInfMinutes {
		ts[i] = t * units.Minute
	}
	F := make([]float64, len(ts))
	m.Eval(F, ts, []float64{mmh.ToSI(demoInfFc), mmh.ToSI(demoInfF0), demoInfK / units.Minute})
	rng := rand.New(rand.NewPCG(20260402, 3))
	rows := make([]project.KindRow, len(ts))
	level, base := float64(demoInfStart), 0.0 // level after the last refill, F then (mm)
	for i := range ts {
		f := F[i] * 1000
		read := level - (f - base) + demoInfNoise*rng.NormFloat64()
		rows[i] = project.KindRow{Time: demoRound(demoInfMinutes[i], 1), Value: demoRound(read, 0.5)}
		if demoInfMinutes[i] == 30 || demoInfMinutes[i] == 75 {
			level, base = demoInfStart, f
			rows[i].Refill = strconv.Itoa(demoInfStart)
		}
	}
	return rows
}

// DemoDecayRows returns the example tracer's readings: minutes and mg/L.
func DemoDecayRows() []project.KindRow {
	rng := rand.New(rand.NewPCG(20260402, 4))
	rows := make([]project.KindRow, len(demoDecMinutes))
	for i, t := range demoDecMinutes {
		y := demoDecBase + (demoDecY0-demoDecBase)*math.Exp(-demoDecK*t) + demoDecNoise*rng.NormFloat64()
		rows[i] = project.KindRow{Time: demoRound(t, 1), Value: demoRound(y, 0.1)}
	}
	return rows
}

// demoSetup builds a setup from "key=number unit" values and
// "key=choice" options, each list separated by "|".
func demoSetup(values, options string, rows []project.KindRow) *project.KindSetup {
	s := &project.KindSetup{Rows: rows}
	for _, kv := range strings.Split(values, "|") {
		k, num, _ := strings.Cut(kv, "=")
		if k == "" {
			continue
		}
		text, unit, _ := strings.Cut(num, " ")
		u := mustUnit(unit)
		x, _ := parseNumber(text)
		s.SetValue(k, project.Entry{Text: text, Unit: unit, SI: u.ToSI(x), OK: true})
	}
	for _, kv := range strings.Split(options, "|") {
		k, o, _ := strings.Cut(kv, "=")
		s.SetOption(k, o)
	}
	return s
}

// demoKindTests adds the example's slug test (in well wellID),
// infiltration test and decay curve, each fitted with its first model.
func demoKindTests(ctx context.Context, p *project.Project, wellID string) error {
	tests := []project.Test{
		{Kind: project.SlugTest, Name: "Slug test OW-1 (falling head)", ObservationWell: wellID, StartText: "2026-03-18T10:15",
			Setup: demoSetup("casing-radius=2.5 cm|well-radius=5 cm|screen-length=1.5 m|screen-bottom=4.2 m|static=3.415 m|slug-volume=1.2 L",
				"readings=depth|value-unit=m|time-unit=s|shape=0", DemoSlugRows())},
		{Kind: project.InfiltrationTest, Name: "Double ring, soakaway area", StartText: "2026-03-18T13:40",
			Setup: demoSetup("inner-diameter=30 cm|outer-diameter=60 cm", "readings=levels|level-sense=depth|value-unit=mm|time-unit=min", DemoInfiltrationRows())},
		{Kind: project.DecayTest, Name: "Tracer dilution, east drain", StartText: "2026-03-19T08:30",
			Setup: demoSetup("", "value-unit=mg/L|time-unit=min", DemoDecayRows())},
	}
	for i := range tests {
		t := &tests[i]
		t.ID, t.Readings = project.NewID(), []project.Reading{}
		req, missing := kindRequest(p, t, nil)
		if len(missing) > 0 {
			panic("ui: the example " + t.Name + " is incomplete: " + missing[0])
		}
		out, err := KindFit(ctx, req)
		if err != nil {
			return err
		}
		out.Fit.At = p.Changed
		t.Fits = []project.ModelFit{out.Fit}
		p.Tests = append(p.Tests, *t)
	}
	return nil
}
