package models

import (
	"fmt"
	"math"

	"fieldfit/fitcore"

	"gonum.org/v1/gonum/mat"
)

// Well is one observation well (or piezometer) of a test observed at
// several points, for FitWells.
type Well struct {
	// Name labels the well in results and messages, e.g. "PZ-2"; empty
	// means "well 1", "well 2" … by position.
	Name string
	// Model is the model of this well with its own constants, e.g.
	// Hantush{Q: q, R: 30}. Every well's model must have the same
	// parameters (names and order): they are fitted jointly.
	Model Model
	// Data are the well's readings, as for Fit.
	Data Data
	// Weight scales the weights of all the well's readings, for instance
	// to balance a well with many logger readings against one read by
	// hand. If Weight is 0 it is defaulted to 1; it must not be negative.
	// To leave a well out, leave it out of the list.
	Weight float64
}

// WellResult is the part of a joint fit that belongs to one well.
type WellResult struct {
	// Name is the well's name (or "well k").
	Name string
	// Model is the well's model.
	Model Model
	// Used, Excluded, Outside, Residuals and Valid are as in Result, for
	// this well's Data.
	Used              []int
	Excluded, Outside int
	Residuals         []float64
	Valid             []bool
	// RMSE is the root-mean-square residual of the well's used readings
	// (unweighted), m.
	RMSE float64
	// Caveats are the model's validity notes for this well.
	Caveats []string
}

// WellsResult is the outcome of FitWells.
type WellsResult struct {
	// Params, Estimates and Start are as in Result; the parameters are
	// shared by all wells.
	Params    []float64
	Estimates []Estimate
	Start     []float64
	// Wells holds the per-well part, in the order of the wells given.
	Wells []WellResult
	// Caveats collects the wells' caveats (each prefixed with the well's
	// name), the convergence note and the solver's warnings.
	Caveats []string
	// Fit is the solver's result for the joint problem (RMSE over all
	// wells, covariance …).
	Fit *fitcore.Result
}

// Estimate returns the estimate of the parameter with the given name.
func (r *WellsResult) Estimate(name string) (Estimate, bool) {
	for _, e := range r.Estimates {
		if e.Name == name {
			return e, true
		}
	}
	return Estimate{}, false
}

// Well returns the joint fit seen from well i as a Result: the shared
// parameters, estimates and covariance with the well's model, readings and
// residuals, so that Result.Band gives the well's fitted curve and band
// and LeakageResistance works on it. It returns nil if i is out of range.
func (r *WellsResult) Well(i int) *Result {
	if i < 0 || i >= len(r.Wells) {
		return nil
	}
	w := r.Wells[i]
	return &Result{
		Model: w.Model, Params: r.Params, Estimates: r.Estimates, Start: r.Start,
		Used: w.Used, Excluded: w.Excluded, Outside: w.Outside,
		Residuals: w.Residuals, Valid: w.Valid, Caveats: w.Caveats, Fit: r.Fit,
	}
}

// FitWells fits one model jointly to the readings of several observation
// wells that share its parameters — for a pumping test, T and S (and B for
// Hantush …), each well with its own distance r in its Model. The
// residuals of all wells (model − observed, weighted by each reading's
// weight times the well's Weight) form one least-squares problem solved by
// fitcore.Fit, so the estimates and their confidence intervals rest on all
// the readings. The settings' time window applies to every well.
//
// Each well needs at least one usable reading and all wells together one
// more than there are parameters. Without a starting guess in the
// settings, each well's model proposes one (Model.Start on its own
// readings, where it has enough) and the one with the lowest joint cost is
// taken.
//
// Errors name the well and, for a bad reading, its index in the well's
// Data.
func FitWells(wells []Well, s *FitSettings) (*WellsResult, error) {
	const method = "joint fit of several wells"
	if s == nil {
		s = &FitSettings{}
	}
	if len(wells) == 0 {
		return nil, errf(method, "", 0, ErrTooFewPoints, "no wells given")
	}
	names := make([]string, len(wells))  // for results
	labels := make([]string, len(wells)) // for messages
	for k, w := range wells {
		names[k], labels[k] = w.Name, fmt.Sprintf("well %q", w.Name)
		if w.Name == "" {
			names[k] = fmt.Sprintf("well %d", k+1)
			labels[k] = names[k]
		}
	}
	wellErr := func(k int, err error) error {
		if e, ok := err.(*Error); ok {
			e2 := *e
			e2.Method = labels[k]
			if e.Method != "" {
				e2.Method = e.Method + ", " + labels[k]
			}
			return &e2
		}
		return err
	}
	var info []ParamInfo
	for k, w := range wells {
		if w.Model == nil {
			return nil, errf(method+", "+labels[k], "", 0, ErrBadConstant, "the well has no model")
		}
		if bad(w.Weight) || w.Weight < 0 {
			return nil, errf(method+", "+labels[k], "well weight", w.Weight, ErrBadConstant, "the weight of a well must be a finite number ≥ 0 (0 means 1)")
		}
		if err := w.Model.Check(); err != nil {
			return nil, wellErr(k, err)
		}
		p := w.Model.Params()
		if k == 0 {
			info = p
			continue
		}
		if !sameParams(info, p) {
			return nil, errf(method+", "+labels[k], "", 0, ErrBadConstant,
				"the model %s fits %s, but %s fits %s; the wells of a joint fit share their parameters",
				w.Model.Name(), paramNames(p), names[0], paramNames(info))
		}
	}
	np := len(info)

	sels := make([]*selection, len(wells))
	offs := make([]int, len(wells)+1)
	for k, w := range wells {
		sel, err := selectPoints(w.Model.Name(), w.Data, s.From, s.To, w.Model.CheckPoint)
		if err != nil {
			return nil, wellErr(k, err)
		}
		if len(sel.idx) == 0 {
			return nil, wellErr(k, sel.tooFew(w.Model.Name(), 1))
		}
		sels[k] = sel
		offs[k+1] = offs[k] + len(sel.idx)
	}
	n := offs[len(wells)]
	if n < np+1 {
		return nil, errf(method, "", 0, ErrTooFewPoints, "%d usable points needed over all wells, %d given", np+1, n)
	}

	y := make([]float64, n)
	var wts []float64
	allOne := true
	for k, w := range wells {
		ww := w.Weight
		if ww == 0 {
			ww = 1
		}
		if ww != 1 || sels[k].w != nil {
			allOne = false
		}
		copy(y[offs[k]:], sels[k].y)
	}
	if !allOne {
		wts = make([]float64, n)
		for k, w := range wells {
			ww := w.Weight
			if ww == 0 {
				ww = 1
			}
			for i := range sels[k].idx {
				wi := 1.0
				if sels[k].w != nil {
					wi = sels[k].w[i]
				}
				wts[offs[k]+i] = wi * ww
			}
		}
	}

	resid := func(dst, p []float64) {
		for k, w := range wells {
			d := dst[offs[k]:offs[k+1]]
			w.Model.Eval(d, sels[k].t, p)
			for i := range d {
				d[i] -= y[offs[k]+i]
			}
		}
	}
	jac := func(dst *mat.Dense, p []float64) {
		for k, w := range wells {
			w.Model.Jacobian(dst.Slice(offs[k], offs[k+1], 0, np).(*mat.Dense), sels[k].t, p)
		}
	}
	cost := func(p []float64) float64 {
		r := make([]float64, n)
		resid(r, p)
		sum := 0.0
		for i, v := range r {
			if wts != nil {
				v *= math.Sqrt(wts[i])
			}
			sum += v * v
		}
		if bad(sum) {
			return math.Inf(1)
		}
		return sum
	}

	var start []float64
	if s.Start != nil {
		if len(s.Start) != np {
			return nil, &Error{Method: method, Index: -1, Err: ErrBadStart,
				Reason: fmt.Sprintf("%d starting values for %d parameters", len(s.Start), np)}
		}
		start = append([]float64(nil), s.Start...)
	} else {
		best := math.Inf(1)
		var firstErr error
		for k, w := range wells {
			if len(sels[k].idx) < np+1 {
				continue
			}
			p, err := w.Model.Start(sels[k].t, sels[k].y)
			if err != nil {
				if firstErr == nil {
					firstErr = wellErr(k, err)
				}
				continue
			}
			if !validStart(info, p) {
				continue
			}
			if c := cost(p); c < best {
				best, start = c, p
			}
		}
		if start == nil {
			if firstErr != nil {
				return nil, firstErr
			}
			return nil, errf(method, "", 0, ErrNoTrend, "no well has enough readings for a starting guess (%d each); give one in the settings", np+1)
		}
	}
	for j, v := range start {
		switch {
		case bad(v):
			return nil, &Error{Method: method, Index: -1, Field: info[j].Name, Value: v, Err: ErrBadStart,
				Reason: "starting value must be a finite number"}
		case info[j].Positive && !(v > 0):
			return nil, &Error{Method: method, Index: -1, Field: info[j].Name, Value: v, Err: ErrBadStart,
				Reason: "starting value must be positive"}
		}
	}

	prob := &fitcore.Problem{
		N:         n,
		Params:    make([]fitcore.Param, np),
		Residuals: resid,
		Jacobian:  jac,
		Weights:   wts,
		Observed:  y,
	}
	for j, pi := range info {
		prob.Params[j] = fitcore.Param{Name: pi.Name, Positive: pi.Positive}
	}
	fr, ferr := fitcore.Fit(prob, start, s.Solver)
	if fr == nil {
		return nil, &Error{Method: method, Index: -1, Err: fmt.Errorf("%w: %w", ErrFit, ferr)}
	}
	r := &WellsResult{
		Params: append([]float64(nil), fr.Params...),
		Start:  start,
		Wells:  make([]WellResult, len(wells)),
		Fit:    fr,
	}
	r.Estimates = estimates(info, r.Params, fr)
	all := make([]float64, n)
	resid(all, r.Params)
	for k, w := range wells {
		wr := WellResult{
			Name: names[k], Model: w.Model,
			Used: sels[k].idx, Excluded: sels[k].excluded, Outside: sels[k].outside,
			Residuals: append([]float64(nil), all[offs[k]:offs[k+1]]...),
			Valid:     make([]bool, len(sels[k].idx)),
		}
		ss := 0.0
		for _, v := range wr.Residuals {
			ss += v * v
		}
		wr.RMSE = math.Sqrt(ss / float64(len(wr.Residuals)))
		wr.Caveats = w.Model.Validity(wr.Valid, sels[k].t, r.Params)
		for _, c := range wr.Caveats {
			r.Caveats = append(r.Caveats, names[k]+": "+c)
		}
		r.Wells[k] = wr
	}
	if !fr.Status.Converged() {
		r.Caveats = append(r.Caveats, "The fit did not converge ("+fr.Status.String()+"); treat the parameters as provisional.")
	}
	r.Caveats = append(r.Caveats, fr.Warnings...)
	if ferr != nil {
		return r, &Error{Method: method, Index: -1, Err: fmt.Errorf("%w: %w", ErrFit, ferr)}
	}
	return r, nil
}

// estimates pairs fitted parameters with their names and uncertainty.
func estimates(info []ParamInfo, p []float64, fr *fitcore.Result) []Estimate {
	es := make([]Estimate, len(info))
	for j, pi := range info {
		e := Estimate{ParamInfo: pi, Value: p[j], StdErr: math.NaN(), Lower: math.NaN(), Upper: math.NaN()}
		if j < len(fr.StdErr) {
			e.StdErr = fr.StdErr[j]
		}
		if j < len(fr.Lower) && j < len(fr.Upper) {
			e.Lower, e.Upper = fr.Lower[j], fr.Upper[j]
		}
		es[j] = e
	}
	return es
}

// validStart reports whether p has one finite value per parameter,
// positive where the parameter is.
func validStart(info []ParamInfo, p []float64) bool {
	if len(p) != len(info) {
		return false
	}
	for j, v := range p {
		if bad(v) || info[j].Positive && !(v > 0) {
			return false
		}
	}
	return true
}

func sameParams(a, b []ParamInfo) bool {
	if len(a) != len(b) {
		return false
	}
	for j := range a {
		if a[j].Name != b[j].Name || a[j].Positive != b[j].Positive {
			return false
		}
	}
	return true
}

func paramNames(p []ParamInfo) string {
	s := ""
	for j, pi := range p {
		if j > 0 {
			s += ", "
		}
		s += pi.Name
	}
	return s
}
