package slug

import (
	"fmt"
	"math"

	"fieldfit/models"
	"fieldfit/models/units"

	"gonum.org/v1/gonum/mat"
)

// logLine is the straight line of ln(H/H0) against time shared by the
// Hvorslev and Bouwer–Rice methods,
//
//	ln(H/H0) = a − m·t,
//
// with a the intercept (ln of the line's H/H0 at t = 0; 0 for a line
// through the initial displacement) and m > 0 the decay rate, 1/s
// (m = 1/T0 for Hvorslev's basic time lag T0). It is a models.Model on
// the readings ln(H/H0); the fit is linear, so the solver's covariance is
// that of ordinary least squares.
type logLine struct{ method string }

func (m logLine) Name() string { return m.method }

func (m logLine) Params() []models.ParamInfo {
	return []models.ParamInfo{
		{Name: "a", Long: "intercept of ln(H/H0) at t = 0", Unit: "1", Quantity: units.Dimensionless},
		{Name: "m", Long: "decay rate of ln(H/H0)", Unit: "1/s", Positive: true},
	}
}

func (m logLine) Check() error { return nil }

func (m logLine) CheckPoint(t, y float64) error { return checkNormalised(t, y, false) }

func (m logLine) Eval(dst, t, p []float64) {
	for i, ti := range t {
		dst[i] = p[0] - p[1]*ti
	}
}

func (m logLine) Jacobian(dst *mat.Dense, t, p []float64) {
	for i, ti := range t {
		dst.Set(i, 0, 1)
		dst.Set(i, 1, -ti)
	}
}

// Start is the ordinary least-squares line; it fails when ln(H/H0) does
// not fall with time.
func (m logLine) Start(t, y []float64) ([]float64, error) {
	var sx, sy float64
	for i := range t {
		sx += t[i]
		sy += y[i]
	}
	n := float64(len(t))
	xm, ym := sx/n, sy/n
	var sxx, sxy float64
	for i := range t {
		sxx += (t[i] - xm) * (t[i] - xm)
		sxy += (t[i] - xm) * (y[i] - ym)
	}
	if !(sxx > 0) {
		return nil, &models.Error{Method: m.method, Index: -1, Err: models.ErrNoTrend, Reason: "all readings in the window are at the same time"}
	}
	b := sxy / sxx
	if !(b < 0) || bad(b) {
		return nil, &models.Error{Method: m.method, Index: -1, Field: "slope of ln(H/H0)", Value: b, Err: models.ErrNoTrend,
			Reason: "the head does not return towards the static level in the window (ln(H/H0) does not fall with time)"}
	}
	return []float64{ym - b*xm, -b}, nil
}

func (m logLine) Validity(ok []bool, t, p []float64) []string {
	for i := range ok {
		ok[i] = true
	}
	return nil
}

// Settings controls the slug-test methods. The zero value works, and a
// nil *Settings means the zero value.
type Settings struct {
	// From and To bound the fit window, s: only readings with From ≤ t ≤
	// To are fitted. A zero From or To leaves that side open. For the
	// "double straight line" of a draining gravel pack, start the window
	// where the second, flatter straight segment of ln(H/H0) begins.
	From, To float64

	// H0Tolerance is the relative difference between H0 and the
	// displacement expected from the slug volume above which the result
	// notes it. If H0Tolerance is 0 it is defaulted to 0.1 (our choice).
	H0Tolerance float64

	// Fit is passed to models.Fit (its From, To are replaced by the
	// fields above); nil means the defaults.
	Fit *models.FitSettings
}

func (s *Settings) fitSettings() *models.FitSettings {
	var f models.FitSettings
	if s.Fit != nil {
		f = *s.Fit
	}
	f.From, f.To = s.From, s.To
	return &f
}

// fitLogLine normalises the test and fits the straight line of ln(H/H0)
// on the window.
func fitLogLine(method string, t Test, s *Settings) (*Normalised, *models.Result, error) {
	if s == nil {
		s = &Settings{}
	}
	nd, err := Normalise(t, s.H0Tolerance)
	if err != nil {
		setMethod(err, method)
		return nil, nil, err
	}
	d := nd.Data
	logd := models.Data{Time: d.Time, Value: make([]float64, len(d.Time)), Weight: d.Weight, Exclude: d.Exclude}
	for i, v := range d.Value {
		if d.Exclude != nil && d.Exclude[i] {
			logd.Value[i] = math.NaN()
			continue
		}
		ti := d.Time[i]
		inWindow := (s.From == 0 || ti >= s.From) && (s.To == 0 || ti <= s.To)
		zeroWeight := d.Weight != nil && d.Weight[i] == 0
		if inWindow && !zeroWeight {
			if err := checkNormalised(ti, v, true); err != nil {
				e := err.(*models.Error)
				e.Method, e.Index = method, i
				return nd, nil, e
			}
		}
		logd.Value[i] = math.Log(v)
	}
	r, err := models.Fit(logLine{method}, logd, s.fitSettings())
	return nd, r, err
}

func setMethod(err error, method string) {
	if e, ok := err.(*models.Error); ok {
		e.Method = method
	}
}

// lineResult builds the Result of a log-line method from the fitted line
// and the factor c of K = c·m.
func lineResult(method string, nd *Normalised, fr *models.Result, c float64) *Result {
	a, _ := fr.Estimate("a")
	m, _ := fr.Estimate("m")
	r := &Result{
		Method:     method,
		Normalised: nd,
		Fit:        fr,
		DecayRate:  m,
		Intercept:  math.Exp(a.Value),
		Caution:    Caution,
	}
	r.K = scale(m, c, kInfo)
	r.KIn = convert(r.K, kUnits)
	r.T0 = models.Estimate{
		ParamInfo: models.ParamInfo{Name: "T0", Long: "basic time lag 1/m", Unit: "s", Quantity: units.Time, Positive: true},
		Value:     1 / m.Value,
		StdErr:    m.StdErr / (m.Value * m.Value),
		Lower:     1 / m.Upper,
		Upper:     1 / m.Lower,
	}
	r.Caveats = append(r.Caveats, fr.Caveats...)
	if math.Abs(a.Value) > 0.1 {
		r.Caveats = append(r.Caveats, fmt.Sprintf(
			"The fitted line meets t = 0 at H/H0 = %.3g, not 1. This is expected when the window leaves out an early, steeper segment (the \"double straight line\" of a draining gravel pack, Bouwer 1989, from memory); otherwise check H0 and the start time.",
			r.Intercept))
	}
	return r
}
