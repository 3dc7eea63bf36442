package ui

import (
	"errors"
	"math"
	"strconv"

	"fieldfit/models"
	"fieldfit/models/units"
	"fieldfit/ui/project"
)

// pumpModel describes one model of the pumping-test fit step: the one
// generic fit, results list, comparison table and plots serve them all.
type pumpModel struct {
	id    project.Model
	label string // in the model choice
	short string // in the status line and the comparison table
	// jacob: Jacob's correction for an unconfined aquifer applies.
	jacob bool
	// build returns the model of well w; nil for the recovery line,
	// which is a straight line, not a models.Model.
	build func(r *FitRequest, w *WellSeries) models.RateModel
}

// pumpModels are the models offered for a pumping test, in the order of
// the model choice.
var pumpModels = []pumpModel{
	{project.Theis, "Theis (1935)", "Theis", true, func(r *FitRequest, w *WellSeries) models.RateModel {
		return models.Theis{Q: r.Q, R: w.R}
	}},
	{project.CooperJacob, "Cooper–Jacob (1946) straight line", "Cooper–Jacob", true, func(r *FitRequest, w *WellSeries) models.RateModel {
		return models.CooperJacob{Q: r.Q, R: w.R, UMax: r.CJUMax}
	}},
	{project.Hantush, "Hantush–Jacob (1955) leaky aquifer", "Hantush–Jacob", false, func(r *FitRequest, w *WellSeries) models.RateModel {
		return models.Hantush{Q: r.Q, R: w.R}
	}},
	{project.TheisNoFlow, "Theis with a no-flow boundary (image well)", "Theis + no-flow boundary", false, boundaryBuild(models.NoFlowBoundary)},
	{project.TheisConstantHead, "Theis with a constant-head boundary (image well)", "Theis + constant-head boundary", false, boundaryBuild(models.ConstantHeadBoundary)},
	{project.RecoveryLine, "Theis recovery line (residual drawdown against t/t′)", "Theis recovery line", false, nil},
}

func boundaryBuild(kind models.BoundaryKind) func(r *FitRequest, w *WellSeries) models.RateModel {
	return func(r *FitRequest, w *WellSeries) models.RateModel {
		return models.BoundaryLine{Base: models.Theis{Q: r.Q, R: w.R}, Kind: kind, Angle: w.Angle, A: r.Boundary}
	}
}

func pumpModelOf(id project.Model) *pumpModel {
	for i := range pumpModels {
		if pumpModels[i].id == id {
			return &pumpModels[i]
		}
	}
	return nil
}

// modelName is the short name of a model.
func modelName(m project.Model) string {
	if pm := pumpModelOf(m); pm != nil {
		return pm.short
	}
	return string(m)
}

// scheduleUntil returns the steps that start before t (all when t is 0),
// or nil when that leaves one constant rate from time zero.
func scheduleUntil(steps []models.RateStep, t float64) []models.RateStep {
	var out []models.RateStep
	for _, s := range steps {
		if t == 0 || s.Start < t {
			out = append(out, s)
		}
	}
	if len(out) == 1 && out[0].Start == 0 {
		return nil
	}
	return out
}

// fitPump fits a models.Model of the table to one or several wells.
func fitPump(req *FitRequest, pm *pumpModel) (*FitOutcome, error) {
	series := req.wells()
	steps := req.Steps
	if req.Model == project.CooperJacob {
		// The straight line describes drawdown while pumping; recovery
		// is read with the recovery line.
		steps = scheduleUntil(steps, req.Stop)
	}
	jacob := req.Jacob && pm.jacob
	var notes []string
	ws := make([]models.Well, len(series))
	for k := range series {
		w := &series[k]
		var m models.Model = pm.build(req, w)
		if steps != nil {
			m = models.VariableRate{Base: m.(models.RateModel), Steps: steps}
		}
		d := models.Data{Time: w.Time, Value: w.Drawdown}
		if req.Model == project.CooperJacob && req.Stop > 0 {
			d.Exclude = make([]bool, len(w.Time))
			for i, t := range w.Time {
				d.Exclude[i] = t > req.Stop
			}
		}
		if jacob {
			var n []string
			var err error
			if d, n, err = models.JacobCorrection(d, req.Thickness); err != nil {
				return nil, err
			}
			notes = append(notes, n...)
		}
		ws[k] = models.Well{Name: w.Name, Model: m, Data: d, Weight: w.Weight}
	}
	set := &models.FitSettings{From: req.From, To: req.To}
	var res []*models.Result
	var fitErr error
	if len(ws) == 1 {
		r, err := models.Fit(ws[0].Model, ws[0].Data, set)
		if r == nil || r.Fit == nil {
			return nil, orNoResult(err)
		}
		res, fitErr = []*models.Result{r}, err
	} else {
		wr, err := models.FitWells(ws, set)
		if wr == nil || wr.Fit == nil {
			return nil, orNoResult(err)
		}
		for k := range ws {
			res = append(res, wr.Well(k))
		}
		res[0].Caveats = wr.Caveats
		fitErr = err
	}
	main := res[0]
	b := req.Thickness
	uncorrect := func(v []float64) {
		if jacob {
			for i := range v {
				v[i] = models.JacobUncorrected(v[i], b)
			}
		}
	}
	out := &FitOutcome{curve: func(k int, t []float64) (c, lo, hi []float64) {
		c, lo, hi = res[k].Band(t)
		uncorrect(c)
		uncorrect(lo)
		uncorrect(hi)
		return c, lo, hi
	}}
	for k, w := range series {
		out.addWell(k, w.Name, w.R, w.Time, w.Drawdown, res[k].Used)
	}

	f := &out.Fit
	for _, e := range main.Estimates {
		f.Params = append(f.Params, namedEstimate(e.Name, e.Unit, e.Value, e.Lower, e.Upper))
	}
	if req.Model == project.Hantush {
		if c, err := models.LeakageResistance(main); err == nil {
			f.Params = append(f.Params, namedEstimate("c", "s", c.Value, c.Lower, c.Upper))
		}
	}
	fr := main.Fit
	f.RMSE, f.Iterations, f.Status = fr.RMSE, fr.Iterations, fr.Status.String()
	f.N = fr.N
	f.AICc = finite(aicc(fr.N, len(main.Params)+1, fr.SSR))
	f.Warnings = append(notes, main.Caveats...)
	if jacob {
		f.Warnings = append(f.Warnings, "Jacob's correction s′ = s − s²/(2b) is an approximation for an unconfined aquifer (no delayed yield): T is K·b and S the specific yield.")
	}
	if len(steps) > 0 {
		f.Warnings = append(f.Warnings, "Fitted over the rate schedule by superposition in time ("+strconv.Itoa(len(steps))+" steps, the stop included).")
	}
	if fitErr != nil {
		f.Warnings = append(f.Warnings, "The fit stopped early: "+fitErr.Error())
	}
	finishFit(req, out, usedKey(out))
	if T, ok := f.Param("T"); ok {
		if S, ok := f.Param("S"); ok && T.Value > 0 {
			out.Result.EarliestValid = req.R * req.R * S.Value / (4 * T.Value * req.CJUMax)
			if req.Model == project.CooperJacob && req.From > 0 && req.From < out.Result.EarliestValid {
				out.Fit.Warnings = append(out.Fit.Warnings, "Start the window at "+formatSig(out.Result.EarliestValid/60, 3)+
					" min or later for the straight line to hold (u < "+strconv.FormatFloat(req.CJUMax, 'g', -1, 64)+").")
			}
		}
	}
	out.Fit.Warnings = dedupe(out.Fit.Warnings)
	out.Result.Warnings = out.Fit.Warnings
	return out, nil
}

func orNoResult(err error) error {
	if err == nil {
		err = errors.New("the fit gave no result")
	}
	return err
}

// namedEstimate is a project estimate with NaN limits stored as the value
// (the file holds no NaN).
func namedEstimate(name, unit string, v, lo, hi float64) project.NamedEstimate {
	if unit == "1" {
		unit = ""
	}
	if math.IsNaN(lo) || math.IsNaN(hi) {
		lo, hi = v, v
	}
	return project.NamedEstimate{Name: name, Unit: unit, Value: finite(v), Lower: finite(lo), Upper: finite(hi)}
}

// aicc is the small-sample Akaike criterion of regime.Compare for n
// readings, k counted parameters (the fitted ones and the residual
// variance) and the residual sum of squares ssr (Hurvich & Tsai 1989,
// from memory); NaN where it is not defined.
func aicc(n, k int, ssr float64) float64 {
	if !(ssr > 0) || n-k-1 <= 0 {
		return math.NaN()
	}
	N, K := float64(n), float64(k)
	return N*math.Log(ssr/N) + 2*K + 2*K*(K+1)/(N-K-1)
}

// usedKey fingerprints which readings of which well a fit used, so that
// the comparison table compares AICc only between fits of the same
// readings.
func usedKey(o *FitOutcome) string {
	var b []byte
	for _, w := range o.Wells {
		for i, u := range w.Used {
			if u {
				b = strconv.AppendInt(b, int64(i), 36)
				b = append(b, ',')
			}
		}
		b = append(b, '|')
	}
	h := uint64(14695981039346656037)
	for _, c := range b {
		h = (h ^ uint64(c)) * 1099511628211
	}
	return strconv.FormatUint(h, 16)
}

// finishFit fills the parts of out common to every model: the
// comparison-table row's identity and the results list.
func finishFit(req *FitRequest, out *FitOutcome, used string) {
	f := &out.Fit
	f.Model = string(req.Model)
	// Inputs: the readings (for staleness), then which were used (for
	// comparability), then the model settings.
	f.Inputs = req.dataPrint() + "/" + used + "/" + req.Fingerprint()
	r := &out.Result
	r.Model = req.Model
	r.RMSE, r.Iterations, r.Status, r.N = f.RMSE, f.Iterations, f.Status, f.N
	est := func(name string) (project.Estimate, bool) {
		e, ok := f.Param(name)
		return project.Estimate{Value: e.Value, Lower: e.Lower, Upper: e.Upper}, ok
	}
	r.T, _ = est("T")
	r.S, _ = est("S")
	if b := req.Thickness; b > 0 && r.T.Value > 0 {
		r.K = project.Estimate{Value: r.T.Value / b, Lower: r.T.Lower / b, Upper: r.T.Upper / b}
		r.HasK = true
		f.Params = append(f.Params, namedEstimate("K = T/b", "m/s", r.K.Value, r.K.Lower, r.K.Upper))
	}
	r.Inputs = req.Fingerprint()
}

// fitRecoveryLine fits the Theis recovery straight line to the main
// well's readings after the stop.
func fitRecoveryLine(req *FitRequest) (*FitOutcome, error) {
	tp := req.Stop
	if !(tp > 0) {
		return nil, errors.New("the recovery line needs the time the pump stopped (Test tab)")
	}
	q := req.Q
	for _, s := range req.Steps {
		if s.Start < tp {
			q = s.Rate
		}
	}
	var d models.Data
	var idx []int
	for i, t := range req.Time {
		if t > tp {
			d.Time = append(d.Time, t-tp)
			d.Value = append(d.Value, req.Drawdown[i])
			idx = append(idx, i)
		}
	}
	if len(idx) == 0 {
		return nil, errors.New("the recovery series is empty: no readings after the pump stopped at " + formatSig(tp/units.Minute, 4) + " min")
	}
	set := &models.LineSettings{}
	if req.From > tp {
		set.From = req.From - tp
	}
	if req.To > tp {
		set.To = req.To - tp
	}
	rl, err := models.RecoveryLine(q, tp, d, set)
	if err != nil {
		return nil, err
	}
	out := &FitOutcome{curve: func(k int, t []float64) (c, lo, hi []float64) {
		c, lo, hi = make([]float64, len(t)), make([]float64, len(t)), make([]float64, len(t))
		for i, ti := range t {
			c[i], lo[i], hi[i] = math.NaN(), math.NaN(), math.NaN()
			if ti > tp {
				a, b, e := rl.Band(tp, []float64{ti - tp})
				c[i], lo[i], hi[i] = a[0], b[0], e[0]
			}
		}
		return c, lo, hi
	}}
	used := make([]int, len(rl.Used))
	for k, j := range rl.Used {
		used[k] = idx[j]
	}
	out.addWell(0, req.Name, req.R, req.Time, req.Drawdown, used)
	wo := out.Wells[0]
	ss := wo.RMSE * wo.RMSE * float64(wo.N)
	f := &out.Fit
	f.Params = []project.NamedEstimate{
		namedEstimate("T", "m²/s", rl.T, rl.TLower, rl.TUpper),
		namedEstimate("S′/S", "", rl.Ratio, rl.Ratio-rl.Line.TValue*rl.RatioErr, rl.Ratio+rl.Line.TValue*rl.RatioErr),
	}
	f.RMSE, f.N, f.Status = wo.RMSE, wo.N, "straight line"
	f.AICc = finite(aicc(wo.N, 3, ss))
	f.Warnings = []string{"Read late recovery (small t/t′), where u′ is small; the line gives T and the ratio S′/S, not S itself."}
	if len(req.Steps) > 2 || len(req.Steps) == 2 && req.Steps[1].Rate != 0 {
		f.Warnings = append(f.Warnings, "The recovery line assumes one constant rate; the rate in force at the stop is used.")
	}
	if len(req.More) > 0 {
		f.Warnings = append(f.Warnings, "The recovery line uses the readings of "+quoteName(req.Name)+" only; choose another well on the Test tab to read its recovery.")
	}
	if rl.Ratio < 0.8 || rl.Ratio > 1.25 {
		f.Warnings = append(f.Warnings, "S′/S = "+formatSig(rl.Ratio, 2)+" is far from 1: a boundary, recharge, or an error in the rate or the static level may be the cause.")
	}
	finishFit(req, out, usedKey(out))
	out.Result.Warnings = f.Warnings
	return out, nil
}

// addWell adds well k's part to o: which of its readings t, s were
// fitted (used, indices) and the residuals of the fitted curve.
func (o *FitOutcome) addWell(k int, name string, r float64, t, s []float64, used []int) {
	wo := WellOutcome{Name: name, R: r, Used: make([]bool, len(t)), N: len(used)}
	for _, i := range used {
		wo.Used[i] = true
	}
	c, _, _ := o.curve(k, t)
	ss := 0.0
	for i := range c {
		c[i] -= s[i]
		if math.IsInf(c[i], 0) {
			c[i] = math.NaN()
		}
		if wo.Used[i] {
			ss += c[i] * c[i]
		}
	}
	wo.Residual = c
	if wo.N > 0 {
		wo.RMSE = math.Sqrt(ss / float64(wo.N))
	}
	o.Wells = append(o.Wells, wo)
	if k == 0 {
		o.Used, o.Residual = wo.Used, wo.Residual
	}
}
