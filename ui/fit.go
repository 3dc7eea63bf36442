package ui

import (
	"context"
	"errors"
	"fmt"
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
}

// Fingerprint identifies the inputs of the request, so that a stored
// result can be told to belong to the readings on screen.
func (r FitRequest) Fingerprint() string {
	h := fnv.New64a()
	w := func(v float64) { h.Write([]byte(strconv.FormatFloat(v, 'g', -1, 64) + ";")) }
	h.Write([]byte(string(r.Model) + ";"))
	for _, v := range []float64{r.Q, r.R, r.From, r.To, r.Thickness, r.CJUMax} {
		w(v)
	}
	for i := range r.Time {
		w(r.Time[i])
		w(r.Drawdown[i])
	}
	return strconv.FormatUint(h.Sum64(), 16)
}

// FitOutcome is a fit of a test: the result kept in the project and what
// the plots need.
type FitOutcome struct {
	Result project.FitResult
	// Used marks the readings of the request that were fitted (inside
	// the window); Residual is model − observed at every reading (NaN
	// where the model cannot be evaluated).
	Used     []bool
	Residual []float64
	fitted   *models.Result
}

// Band returns the fitted curve at times t (s) and its 95 % band.
func (o *FitOutcome) Band(t []float64) (curve, lower, upper []float64) {
	return o.fitted.Band(t)
}

// Eval returns the fitted curve at times t (s).
func (o *FitOutcome) Eval(t []float64) []float64 {
	y := make([]float64, len(t))
	o.fitted.Model.Eval(y, t, o.fitted.Params)
	return y
}

// FitTest fits the request's model to its readings with models.Fit and
// derives K = T/b when b is known and the earliest time from which the
// Cooper–Jacob line is valid.
func FitTest(ctx context.Context, req FitRequest) (*FitOutcome, error) {
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	umax := req.CJUMax
	if umax <= 0 {
		umax = project.DefaultCJUMax
	}
	var m models.Model
	switch req.Model {
	case project.CooperJacob:
		m = models.CooperJacob{Q: req.Q, R: req.R, UMax: umax}
	case project.Theis, "":
		m = models.Theis{Q: req.Q, R: req.R}
	default:
		return nil, fmt.Errorf("unknown model %q", req.Model)
	}
	res, err := models.Fit(m, models.Data{Time: req.Time, Value: req.Drawdown},
		&models.FitSettings{From: req.From, To: req.To})
	if res == nil || res.Fit == nil || len(res.Params) != 2 {
		if err == nil {
			err = errors.New("the fit gave no result")
		}
		return nil, err
	}
	out := &FitOutcome{fitted: res}
	r := &out.Result
	r.Model = req.Model
	if r.Model == "" {
		r.Model = project.Theis
	}
	est := func(name string) project.Estimate {
		e, _ := res.Estimate(name)
		return project.Estimate{Value: e.Value, Lower: e.Lower, Upper: e.Upper}
	}
	r.T, r.S = est("T"), est("S")
	if req.Thickness > 0 {
		b := req.Thickness
		r.K = project.Estimate{Value: r.T.Value / b, Lower: r.T.Lower / b, Upper: r.T.Upper / b}
		r.HasK = true
	}
	r.RMSE = res.Fit.RMSE
	r.Iterations = res.Fit.Iterations
	r.Status = res.Fit.Status.String()
	r.N = len(res.Used)
	T, S := r.T.Value, r.S.Value
	r.EarliestValid = req.R * req.R * S / (4 * T * umax)
	r.Warnings = append(r.Warnings, res.Caveats...)
	if err != nil {
		r.Warnings = append(r.Warnings, "The fit stopped early: "+err.Error())
	}
	if req.Model == project.CooperJacob && req.From > 0 && req.From < r.EarliestValid {
		// models' caveat already says which points are early; add the
		// plain advice once.
		r.Warnings = append(r.Warnings, fmt.Sprintf("Start the window at %s min or later for the straight line to hold (u < %g).",
			formatSig(r.EarliestValid/60, 3), umax))
	}
	r.Warnings = dedupe(r.Warnings)
	r.Inputs = req.Fingerprint()
	out.Used = make([]bool, len(req.Time))
	for _, i := range res.Used {
		out.Used[i] = true
	}
	out.Residual = make([]float64, len(req.Time))
	m.Eval(out.Residual, req.Time, res.Params)
	for i := range out.Residual {
		out.Residual[i] -= req.Drawdown[i]
		if math.IsInf(out.Residual[i], 0) {
			out.Residual[i] = math.NaN()
		}
	}
	return out, nil
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
