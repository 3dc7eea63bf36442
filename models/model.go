package models

import (
	"fmt"
	"math"

	"fieldfit/fitcore"
	"fieldfit/models/units"

	"gonum.org/v1/gonum/mat"
)

// ParamInfo describes one fitted parameter of a Model.
type ParamInfo struct {
	// Name is the parameter's symbol, e.g. "T".
	Name string
	// Long is its name in words, e.g. "transmissivity".
	Long string
	// Unit is the SI unit symbol, e.g. "m²/s"; "1" when dimensionless.
	Unit string
	// Quantity is the kind of quantity, for the UI's choice of units.
	Quantity units.Quantity
	// Positive marks a parameter that is positive by nature; it is fitted
	// in log space.
	Positive bool
}

// Model is an analytical model y = f(t; p) of a field test, with the
// constants of the test (pumping rate, distance …) held in the value
// itself and the fitted parameters p passed to each call. Every model type
// of this package implements it; its doc comment states the equations, the
// units and the published reference.
//
// Implementations must be safe for concurrent use and must not modify
// their arguments other than dst.
type Model interface {
	// Name is the method's usual name and year, e.g. "Theis (1935)".
	Name() string

	// Params describes the fitted parameters in the order of p.
	Params() []ParamInfo

	// Check reports whether the constants of the test are usable; it
	// returns an *Error naming the constant.
	Check() error

	// CheckPoint reports whether one reading (t, y) lies in the model's
	// domain (for instance t > 0). It returns nil or a newly allocated
	// *Error, whose Index the caller fills in.
	CheckPoint(t, y float64) error

	// Eval writes f(t[i]; p) into dst[i]; len(dst) = len(t).
	Eval(dst, t, p []float64)

	// Jacobian writes ∂f(t[i]; p)/∂p[j] into dst, a len(t)×len(p) matrix.
	Jacobian(dst *mat.Dense, t, p []float64)

	// Start returns a starting guess for p from readings that passed
	// CheckPoint, or an error when the data show no usable trend.
	Start(t, y []float64) ([]float64, error)

	// Validity writes into ok[i] whether the model's approximation or
	// assumptions hold at t[i] for the parameters p (len(ok) = len(t)),
	// and returns plain sentences for the user about where they do not.
	Validity(ok []bool, t, p []float64) []string
}

// Data holds the readings of one observation point: time and observed
// value (drawdown, residual drawdown …) in SI units, with optional weights
// and an exclusion mask. Fit and the straight-line methods never modify
// it.
type Data struct {
	// Time of each reading, s, counted as the model says (since pumping
	// started for drawdown; since pumping stopped for recovery).
	Time []float64
	// Value is the observed value at each time, in the model's unit (m
	// for drawdown).
	Value []float64
	// Weight, if not nil, holds a weight ≥ 0 for each reading; a weight of
	// zero excludes the reading. nil means every weight is one.
	Weight []float64
	// Exclude, if not nil, marks readings left out of the fit (the user's
	// choice); they are not checked.
	Exclude []bool
}

// FitSettings controls Fit. The zero value works, and a nil *FitSettings
// means the zero value.
type FitSettings struct {
	// From and To bound the time window of the fit, s: only readings with
	// From ≤ t ≤ To are used. A zero From or To leaves that side open.
	From, To float64

	// Start, if not nil, is the starting guess in the order of the
	// model's Params; nil means the model's own Start.
	Start []float64

	// Solver is passed to fitcore.Fit; nil means the solver's defaults.
	Solver *fitcore.Settings
}

// Estimate is one fitted parameter with its uncertainty.
type Estimate struct {
	ParamInfo
	// Value is the fitted value in SI units.
	Value float64
	// StdErr is its standard error.
	StdErr float64
	// Lower and Upper bound its confidence interval (at the solver's
	// confidence level, 95 % by default).
	Lower, Upper float64
}

// Result is the outcome of Fit.
type Result struct {
	// Model is the fitted model.
	Model Model
	// Params are the fitted parameters in the order of Model.Params.
	Params []float64
	// Estimates are the same parameters with names, units, standard
	// errors and confidence intervals.
	Estimates []Estimate
	// Start is the starting guess the fit began from.
	Start []float64
	// Used holds the indices into the Data of the readings fitted, in
	// Data order; Excluded counts readings left out by the mask or a zero
	// weight, Outside those outside the time window.
	Used              []int
	Excluded, Outside int
	// Residuals are model − observed at the Used readings.
	Residuals []float64
	// Valid reports for each Used reading whether the model's validity
	// rule holds there.
	Valid []bool
	// Caveats are plain sentences for the user: where the model's
	// assumptions fail, whether the fit converged, and the solver's
	// warnings.
	Caveats []string
	// Fit is the solver's result: status, covariance, correlation, RMSE …
	Fit *fitcore.Result
}

// Estimate returns the estimate of the parameter with the given name.
func (r *Result) Estimate(name string) (Estimate, bool) {
	for _, e := range r.Estimates {
		if e.Name == name {
			return e, true
		}
	}
	return Estimate{}, false
}

// Band returns the fitted curve f(t) at the given times and the lower and
// upper limits of its pointwise confidence band, at the solver's
// confidence level (95 % by default), by the delta method:
//
//	var f(t) ≈ gᵀ C g,  g = ∂f(t; p)/∂p at the fitted p,
//	limits f(t) ± t_q · √(var f(t)),
//
// with C the covariance of the parameters and t_q the Student's t quantile
// of the fit. The band is that of the expected curve, not of single new
// readings. When the fit has no covariance the limits are NaN.
func (r *Result) Band(t []float64) (curve, lower, upper []float64) {
	n, np := len(t), len(r.Params)
	curve = make([]float64, n)
	lower = make([]float64, n)
	upper = make([]float64, n)
	if n == 0 {
		return curve, lower, upper
	}
	r.Model.Eval(curve, t, r.Params)
	if r.Fit == nil || r.Fit.Covariance == nil || np == 0 {
		for i := range t {
			lower[i], upper[i] = math.NaN(), math.NaN()
		}
		return curve, lower, upper
	}
	jac := mat.NewDense(n, np, nil)
	r.Model.Jacobian(jac, t, r.Params)
	cov := r.Fit.Covariance
	for i := range t {
		g := jac.RawRowView(i)
		v := 0.0
		for a := 0; a < np; a++ {
			for b := 0; b < np; b++ {
				v += g[a] * cov.At(a, b) * g[b]
			}
		}
		h := r.Fit.TValue * math.Sqrt(math.Max(v, 0))
		lower[i], upper[i] = curve[i]-h, curve[i]+h
	}
	return curve, lower, upper
}

// selection is the outcome of choosing the readings to fit.
type selection struct {
	idx               []int
	t, y, w           []float64 // w is nil when every weight is one
	excluded, outside int
}

// pointChecker checks one reading's domain.
type pointChecker func(t, y float64) error

// selectPoints validates d and picks the readings in the window [from, to]
// (zero = open) that are neither masked nor of zero weight. Readings that
// are used are checked with check; any problem is an *Error naming the
// reading.
func selectPoints(method string, d Data, from, to float64, check pointChecker) (*selection, error) {
	n := len(d.Time)
	if len(d.Value) != n {
		return nil, &Error{Method: method, Index: -1, Err: ErrLength,
			Reason: fmt.Sprintf("%d values for %d times", len(d.Value), n)}
	}
	if d.Weight != nil && len(d.Weight) != n {
		return nil, &Error{Method: method, Index: -1, Err: ErrLength,
			Reason: fmt.Sprintf("%d weights for %d times", len(d.Weight), n)}
	}
	if d.Exclude != nil && len(d.Exclude) != n {
		return nil, &Error{Method: method, Index: -1, Err: ErrLength,
			Reason: fmt.Sprintf("%d exclusion marks for %d times", len(d.Exclude), n)}
	}
	if bad(from) || bad(to) || from < 0 || to < 0 || (to != 0 && to < from) {
		return nil, &Error{Method: method, Index: -1, Err: ErrBadReading,
			Reason: fmt.Sprintf("time window from %g s to %g s is not a valid interval", from, to)}
	}
	sel := &selection{
		idx: make([]int, 0, n),
		t:   make([]float64, 0, n),
		y:   make([]float64, 0, n),
		w:   make([]float64, 0, n),
	}
	allOne := true
	for i := 0; i < n; i++ {
		if d.Exclude != nil && d.Exclude[i] {
			sel.excluded++
			continue
		}
		ti, yi := d.Time[i], d.Value[i]
		if bad(ti) {
			return nil, &Error{Method: method, Index: i, Field: "time", Value: ti, Err: ErrBadReading, Reason: "not a finite number"}
		}
		if (from != 0 && ti < from) || (to != 0 && ti > to) {
			sel.outside++
			continue
		}
		wi := 1.0
		if d.Weight != nil {
			wi = d.Weight[i]
			if bad(wi) || wi < 0 {
				return nil, &Error{Method: method, Index: i, Field: "weight", Value: wi, Err: ErrBadReading, Reason: "weights must be finite and not negative"}
			}
			if wi == 0 {
				sel.excluded++
				continue
			}
		}
		if err := check(ti, yi); err != nil {
			if e, ok := err.(*Error); ok {
				e.Index = i
				if e.Method == "" {
					e.Method = method
				}
			}
			return nil, err
		}
		if wi != 1 {
			allOne = false
		}
		sel.idx = append(sel.idx, i)
		sel.t = append(sel.t, ti)
		sel.y = append(sel.y, yi)
		sel.w = append(sel.w, wi)
	}
	if allOne {
		sel.w = nil
	}
	return sel, nil
}

// tooFew reports that the selection has fewer than need points.
func (s *selection) tooFew(method string, need int) error {
	return &Error{Method: method, Index: -1, Err: ErrTooFewPoints,
		Reason: fmt.Sprintf("%d usable points needed, %d given (%d excluded, %d outside the time window)",
			need, len(s.idx), s.excluded, s.outside)}
}

func bad(v float64) bool { return math.IsNaN(v) || math.IsInf(v, 0) }

// checkDrawdown is the domain check shared by the drawdown models: time
// after the start of pumping, finite drawdown.
func checkDrawdown(t, y float64) error {
	if !(t > 0) {
		return &Error{Index: -1, Field: "time", Value: t, Err: ErrBadReading,
			Reason: "time must be after the start of pumping (t > 0)"}
	}
	if bad(y) {
		return &Error{Index: -1, Field: "drawdown", Value: y, Err: ErrBadReading, Reason: "not a finite number"}
	}
	return nil
}

// Fit fits the model m to the readings d by damped Newton
// (Levenberg–Marquardt) least squares (fitcore.Fit) and returns the
// parameters with their uncertainty. The residuals are model − observed,
// weighted by d.Weight; positive parameters are fitted in log space. Only
// the readings inside the settings' time window that are not excluded are
// used, and at least one more of them than there are parameters is needed.
//
// A bad reading or constant is reported as an *Error naming the point and
// value. When the solver stops on an error after it has started, the
// partial Result is returned together with the error.
func Fit(m Model, d Data, s *FitSettings) (*Result, error) {
	if s == nil {
		s = &FitSettings{}
	}
	name := m.Name()
	if err := m.Check(); err != nil {
		return nil, err
	}
	sel, err := selectPoints(name, d, s.From, s.To, m.CheckPoint)
	if err != nil {
		return nil, err
	}
	info := m.Params()
	np := len(info)
	if len(sel.idx) < np+1 {
		return nil, sel.tooFew(name, np+1)
	}

	var start []float64
	if s.Start != nil {
		if len(s.Start) != np {
			return nil, &Error{Method: name, Index: -1, Err: ErrBadStart,
				Reason: fmt.Sprintf("%d starting values for %d parameters", len(s.Start), np)}
		}
		start = append([]float64(nil), s.Start...)
	} else {
		start, err = m.Start(sel.t, sel.y)
		if err != nil {
			return nil, err
		}
	}
	for j, v := range start {
		switch {
		case bad(v):
			return nil, &Error{Method: name, Index: -1, Field: info[j].Name, Value: v, Err: ErrBadStart,
				Reason: "starting value must be a finite number"}
		case info[j].Positive && !(v > 0):
			return nil, &Error{Method: name, Index: -1, Field: info[j].Name, Value: v, Err: ErrBadStart,
				Reason: "starting value must be positive"}
		}
	}

	t, y := sel.t, sel.y
	prob := &fitcore.Problem{
		N:      len(t),
		Params: make([]fitcore.Param, np),
		Residuals: func(dst, p []float64) {
			m.Eval(dst, t, p)
			for i := range dst {
				dst[i] -= y[i]
			}
		},
		Jacobian: func(dst *mat.Dense, p []float64) { m.Jacobian(dst, t, p) },
		Weights:  sel.w,
		Observed: y,
	}
	for j, pi := range info {
		prob.Params[j] = fitcore.Param{Name: pi.Name, Positive: pi.Positive}
	}
	fr, ferr := fitcore.Fit(prob, start, s.Solver)
	if fr == nil {
		return nil, &Error{Method: name, Index: -1, Err: fmt.Errorf("%w: %w", ErrFit, ferr)}
	}
	r := &Result{
		Model:     m,
		Params:    append([]float64(nil), fr.Params...),
		Start:     start,
		Used:      sel.idx,
		Excluded:  sel.excluded,
		Outside:   sel.outside,
		Residuals: make([]float64, len(t)),
		Valid:     make([]bool, len(t)),
		Fit:       fr,
	}
	prob.Residuals(r.Residuals, r.Params)
	r.Estimates = make([]Estimate, np)
	for j, pi := range info {
		e := Estimate{ParamInfo: pi, Value: r.Params[j], StdErr: math.NaN(), Lower: math.NaN(), Upper: math.NaN()}
		if j < len(fr.StdErr) {
			e.StdErr = fr.StdErr[j]
		}
		if j < len(fr.Lower) && j < len(fr.Upper) {
			e.Lower, e.Upper = fr.Lower[j], fr.Upper[j]
		}
		r.Estimates[j] = e
	}
	r.Caveats = m.Validity(r.Valid, t, r.Params)
	if !fr.Status.Converged() {
		r.Caveats = append(r.Caveats, "The fit did not converge ("+fr.Status.String()+"); treat the parameters as provisional.")
	}
	r.Caveats = append(r.Caveats, fr.Warnings...)
	if ferr != nil {
		return r, &Error{Method: name, Index: -1, Err: fmt.Errorf("%w: %w", ErrFit, ferr)}
	}
	return r, nil
}
