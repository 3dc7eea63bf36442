package decay

import (
	"math"

	"fieldfit/models"
)

// Caution is the notice every decay result carries.
const Caution = "Preliminary field interpretation. A submission to a regulator must be prepared or reviewed by a licensed hydrogeologist (or the equivalent licensed professional) and follow the local rules and codes."

// Settings controls Fit. The zero value works (the one-term form with y0,
// y∞ and k fitted), and a nil *Settings means the zero value.
type Settings struct {
	// Form is the curve: OneTerm (the default) or TwoTerm.
	Form Form
	// FixY0 holds the initial value at Y0 instead of fitting it (OneTerm
	// only); FixBaseline holds the baseline y∞ at Baseline.
	FixY0, FixBaseline bool
	Y0, Baseline       float64
	// ValueUnit and TimeUnit are free-form unit strings (e.g. "mg/L",
	// "min"), carried into the result; an empty TimeUnit means "s".
	ValueUnit, TimeUnit string
	// From and To bound the time window; a zero From or To leaves that
	// side open (as models.FitSettings).
	From, To float64
	// Fit is passed to models.Fit (its From and To are replaced by the
	// fields above); nil means the defaults.
	Fit *models.FitSettings
}

// Result is a fitted decay curve.
type Result struct {
	Form Form
	// ValueUnit and TimeUnit are the units of the settings: y0, y∞ and
	// the amplitudes are in ValueUnit, the half-lives in TimeUnit and the
	// rate constants in 1/TimeUnit.
	ValueUnit, TimeUnit string
	// Estimates are the fitted parameters with standard errors and
	// confidence intervals (the solver's level, 95 % by default).
	Estimates []models.Estimate
	// Rates holds k (OneTerm) or k1, k2 (TwoTerm), and HalfLives ln 2/k
	// for each, with standard errors by the delta method,
	// SE(t½) = ln 2 · SE(k)/k², and intervals t½ ± t_q·SE(t½) (clipped at
	// zero).
	Rates, HalfLives []models.Estimate
	// Y0 and Baseline are the initial value and the baseline; for
	// TwoTerm, y0 = y∞ + a1 + a2 with its standard error from the
	// covariance. A value held fixed has a zero standard error.
	Y0, Baseline models.Estimate
	// Fit is the underlying fit.
	Fit *models.Result
	// Caveats are warnings about the fit; Caution the notice to show.
	Caveats []string
	Caution string
}

// Fit fits the decay curve of the settings to the readings d (any time
// and value units) by damped Newton least squares (models.Fit, fitcore)
// and returns the rate constants, half-lives, initial value and baseline
// with their uncertainty. Readings that do not change are an error
// (models.ErrNoTrend).
func Fit(d models.Data, s *Settings) (*Result, error) {
	if s == nil {
		s = &Settings{}
	}
	m := Exponential{Form: s.Form, FixY0: s.FixY0, FixBaseline: s.FixBaseline, Y0: s.Y0, Baseline: s.Baseline}
	var fs models.FitSettings
	if s.Fit != nil {
		fs = *s.Fit
	}
	fs.From, fs.To = s.From, s.To
	fr, err := models.Fit(m, d, &fs)
	if fr == nil {
		return nil, err
	}
	r := &Result{Form: s.Form, ValueUnit: s.ValueUnit, TimeUnit: s.TimeUnit, Estimates: fr.Estimates, Fit: fr, Caution: Caution}
	if r.TimeUnit == "" {
		r.TimeUnit = "s"
	}
	r.Caveats = append(r.Caveats, fr.Caveats...)
	idx := map[string]int{}
	for j, e := range fr.Estimates {
		idx[e.Name] = j
	}
	tq := math.NaN()
	if fr.Fit != nil {
		tq = fr.Fit.TValue
	}
	cov := func(a, b int) float64 {
		if fr.Fit == nil || fr.Fit.Covariance == nil {
			return math.NaN()
		}
		return fr.Fit.Covariance.At(a, b)
	}
	rateNames := []string{"k"}
	if s.Form == TwoTerm {
		rateNames = []string{"k1", "k2"}
	}
	for _, n := range rateNames {
		k := fr.Estimates[idx[n]]
		r.Rates = append(r.Rates, k)
		h := math.Ln2 / k.Value
		se := math.Ln2 * k.StdErr / (k.Value * k.Value)
		r.HalfLives = append(r.HalfLives, models.Estimate{
			ParamInfo: models.ParamInfo{Name: "t½ (" + n + ")", Long: "half-life ln 2/" + n, Unit: r.TimeUnit, Positive: true},
			Value:     h, StdErr: se, Lower: math.Max(0, h-tq*se), Upper: h + tq*se,
		})
	}
	fixed := func(name, long string, v float64) models.Estimate {
		return models.Estimate{ParamInfo: models.ParamInfo{Name: name, Long: long + " (held fixed)", Unit: r.ValueUnit}, Value: v, Lower: v, Upper: v}
	}
	if j, ok := idx["y∞"]; ok {
		r.Baseline = fr.Estimates[j]
	} else {
		r.Baseline = fixed("y∞", "baseline", s.Baseline)
	}
	switch {
	case s.Form == TwoTerm:
		// y0 = y∞ + a1 + a2: gradient 1 on each fitted term.
		terms := []int{idx["a1"], idx["a2"]}
		if j, ok := idx["y∞"]; ok {
			terms = append(terms, j)
		}
		v, vv := 0.0, 0.0
		if s.FixBaseline {
			v = s.Baseline
		}
		for _, a := range terms {
			v += fr.Estimates[a].Value
			for _, b := range terms {
				vv += cov(a, b)
			}
		}
		se := math.Sqrt(math.Max(vv, 0))
		if math.IsNaN(vv) {
			se = math.NaN()
		}
		r.Y0 = models.Estimate{ParamInfo: models.ParamInfo{Name: "y0", Long: "initial value y∞ + a1 + a2", Unit: r.ValueUnit},
			Value: v, StdErr: se, Lower: v - tq*se, Upper: v + tq*se}
	case s.FixY0:
		r.Y0 = fixed("y0", "initial value", s.Y0)
	default:
		r.Y0 = fr.Estimates[idx["y0"]]
	}
	return r, err
}
