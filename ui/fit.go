package ui

import (
	"context"
	"errors"
	"hash/fnv"
	"math"
	"strconv"
	"strings"

	"fieldfit/models"
	"fieldfit/ui/project"
)

// FitRequest is everything a fit of one test needs, in SI units.
type FitRequest struct {
	Model project.Model
	// Q is the pumping rate (m³/s) and R the distance from the pumping
	// well to the observation point (m).
	Q, R float64
	// Time (s) and Drawdown (m) are the usable readings, in order.
	Time, Drawdown []float64
	// From and To bound the fit window (s); zero leaves a side open.
	From, To float64
	// Thickness is the aquifer thickness b (m); zero when unknown.
	Thickness float64
	// CJUMax is the u threshold of the Cooper–Jacob validity (zero means
	// project.DefaultCJUMax).
	CJUMax float64

	// Steps is the rate schedule on the readings' clock when the rate
	// changes or the pump stops; nil for the constant rate Q from time
	// zero. Stop is when the pump stopped (s), zero if it has not.
	Steps []models.RateStep
	Stop  float64
	// Name, Weight and Angle are the main well's name, its weight in a
	// joint fit (0 means 1) and its bearing to a boundary (radians).
	Name          string
	Weight, Angle float64
	// More are the other observation wells, fitted jointly with the
	// main one.
	More []WellSeries
	// Boundary is the given distance from the pumping well to a straight
	// boundary (m); zero fits it.
	Boundary float64
	// Jacob applies Jacob's correction to Theis and Cooper–Jacob
	// (needs Thickness).
	Jacob bool
}

// WellSeries is one observation well of a joint fit, in SI units.
type WellSeries struct {
	Name             string
	R, Weight, Angle float64
	Time, Drawdown   []float64
}

// wells returns the main well and the others, main first.
func (r *FitRequest) wells() []WellSeries {
	return append([]WellSeries{{Name: r.Name, R: r.R, Weight: r.Weight, Angle: r.Angle, Time: r.Time, Drawdown: r.Drawdown}}, r.More...)
}

// dataPrint fingerprints the readings and constants of the test, not
// the model or its settings.
func (r *FitRequest) dataPrint() string {
	h := fnv.New64a()
	w := func(v float64) { h.Write(strconv.AppendFloat(nil, v, 'g', -1, 64)); h.Write([]byte{';'}) }
	for _, v := range []float64{r.Q, r.Thickness, r.Stop, r.From, r.To} {
		w(v)
	}
	for _, s := range r.Steps {
		w(s.Start)
		w(s.Rate)
	}
	for _, ws := range r.wells() {
		h.Write([]byte(ws.Name + ";"))
		for _, v := range []float64{ws.R, ws.Weight, ws.Angle} {
			w(v)
		}
		for i := range ws.Time {
			w(ws.Time[i])
			w(ws.Drawdown[i])
		}
	}
	return strconv.FormatUint(h.Sum64(), 16)
}

// Fingerprint identifies the inputs of the request, so that a stored
// result can be told to belong to the readings on screen.
func (r FitRequest) Fingerprint() string {
	h := fnv.New64a()
	h.Write([]byte(string(r.Model) + ";" + r.dataPrint() + ";" + strconv.FormatBool(r.Jacob) + ";"))
	for _, v := range []float64{r.CJUMax, r.Boundary} {
		h.Write(strconv.AppendFloat(nil, v, 'g', -1, 64))
	}
	return strconv.FormatUint(h.Sum64(), 16)
}

// WellOutcome is the part of a fit that belongs to one observation well.
type WellOutcome struct {
	Name string
	R    float64
	// Used and Residual are as in FitOutcome, for this well's readings;
	// RMSE is over its used readings (m).
	Used     []bool
	Residual []float64
	RMSE     float64
	N        int
}

// FitOutcome is a fit of a test: the results kept in the project and
// what the plots need.
type FitOutcome struct {
	// Result is the fit in the form of the results list (T, S, K …);
	// Fit is the same fit as a row of the comparison table.
	Result project.FitResult
	Fit    project.ModelFit
	// Used marks the readings of the main well that were fitted (inside
	// the window); Residual is model − observed at every reading (NaN
	// where the model cannot be evaluated).
	Used     []bool
	Residual []float64
	// Wells are every well's part, main first.
	Wells []WellOutcome
	// curve gives well k's fitted curve and 95 % band at times t (s).
	curve func(k int, t []float64) (c, lo, hi []float64)
}

// Band returns the fitted curve at times t (s) and its 95 % band.
func (o *FitOutcome) Band(t []float64) (curve, lower, upper []float64) {
	return o.curve(0, t)
}

// WellBand is Band for well k (0 is the main well).
func (o *FitOutcome) WellBand(k int, t []float64) (curve, lower, upper []float64) {
	return o.curve(k, t)
}

// Eval returns the fitted curve at times t (s).
func (o *FitOutcome) Eval(t []float64) []float64 {
	c, _, _ := o.curve(0, t)
	return c
}

// FitTest fits the request's model to its readings — one well with
// models.Fit, several jointly with models.FitWells, over the rate
// schedule by superposition when the rate changes or the pump stops — and
// derives K = T/b when b is known and the earliest time from which the
// Cooper–Jacob line is valid.
func FitTest(ctx context.Context, req FitRequest) (*FitOutcome, error) {
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	if req.Model == "" {
		req.Model = project.Theis
	}
	pm := pumpModelOf(req.Model)
	if pm == nil {
		return nil, errors.New("unknown model “" + string(req.Model) + "”")
	}
	if req.CJUMax <= 0 {
		req.CJUMax = project.DefaultCJUMax
	}
	if pm.build == nil {
		return fitRecoveryLine(&req)
	}
	return fitPump(&req, pm)
}

func dedupe(ss []string) []string {
	seen := map[string]bool{}
	var out []string
	for _, s := range ss {
		s = strings.TrimSpace(s)
		if s != "" && !seen[s] {
			seen[s] = true
			out = append(out, s)
		}
	}
	return out
}

// finite returns v, or 0 for NaN and infinities (which the project file
// cannot hold).
func finite(v float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0
	}
	return v
}
