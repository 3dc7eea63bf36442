package infiltration

import (
	"fmt"
	"math"

	"fieldfit/models"
	"fieldfit/models/units"
)

// Caution is the notice every infiltration result carries.
const Caution = "Preliminary field interpretation. A submission to a regulator must be prepared or reviewed by a licensed hydrogeologist (or the equivalent licensed professional) and follow the local rules and codes."

// designCaution is the usual design caution.
const designCaution = "Field infiltration rates are often reduced by a safety factor before they are used for design; the factor is set by the local rules, not by this tool."

// Settings controls Fit. The zero value works, and a nil *Settings means
// the zero value.
type Settings struct {
	// Rate, if true, fits the mean infiltration rate of each interval
	// between readings (the model's mean rate over the same interval);
	// by default the cumulative infiltration F is fitted.
	Rate bool

	// From and To bound the fit window, s since the start: only readings
	// (for Rate: intervals ending) at From ≤ t ≤ To are fitted. A zero
	// From or To leaves that side open.
	From, To float64

	// SafetyFactor is the design safety factor the local rules ask for;
	// the design rate is the steady rate divided by it. There is no
	// default: 0 means not entered, and no design rate is given. It must
	// otherwise be a finite positive number.
	SafetyFactor float64

	// Fit is passed to models.Fit (its From and To are replaced by the
	// fields above); nil means the defaults.
	Fit *models.FitSettings
}

// InUnit is an estimate converted to a display unit.
type InUnit struct {
	Unit                        units.Unit
	Value, StdErr, Lower, Upper float64
}

// Result is an infiltration test fitted by one method.
type Result struct {
	// Method is the model fitted; Fitted says which curve was fitted
	// ("cumulative infiltration" or "infiltration rate").
	Method Method
	Fitted string
	// Estimates are the fitted parameters in SI units with standard
	// errors and confidence intervals (the solver's level, 95 % by
	// default).
	Estimates []models.Estimate
	// Steady is the steady infiltration rate (fc for Horton and modified
	// Kostiakov, K for Green–Ampt, A for Philip), m/s; HasSteady is false
	// for Kostiakov, which has none (Steady is then NaN). SteadyIn gives
	// it in mm/h, in/h and m/s.
	Steady    models.Estimate
	HasSteady bool
	SteadyIn  []InUnit
	// SafetyFactor is the factor entered (0 = not entered); Design is the
	// steady rate divided by it, with its interval, and DesignIn the same
	// in mm/h, in/h and m/s (both empty when no factor was entered).
	SafetyFactor float64
	Design       models.Estimate
	DesignIn     []InUnit
	// Textures are the rows of the texture table nearest to the steady
	// rate first, and Plausibility the sentence comparing them (see
	// Plausibility).
	Textures     []Texture
	Plausibility string
	// Fit is the underlying fit: residuals, covariance, solver status.
	// Its Used indices count from the second reading (index i is reading
	// i+1, or the interval that ends at it), the first being t = 0.
	Fit *models.Result
	// Notes carry the notes of the readings; Caveats the warnings about
	// the fit, the design caution included; Caution the notice to show.
	Notes, Caveats []string
	Caution        string
}

var rateUnits = []string{"mm/h", "in/h", "m/s"}

func convert(e models.Estimate) []InUnit {
	out := make([]InUnit, 0, len(rateUnits))
	for _, s := range rateUnits {
		u, ok := units.Lookup(s)
		if !ok {
			panic("infiltration: unknown unit " + s) // a programming error: the symbols are ours
		}
		out = append(out, InUnit{Unit: u, Value: u.FromSI(e.Value), StdErr: u.FromSI(e.StdErr), Lower: u.FromSI(e.Lower), Upper: u.FromSI(e.Upper)})
	}
	return out
}

// Fit fits the method m to the cumulative infiltration c by damped Newton
// least squares (models.Fit, fitcore) and returns its parameters, the
// steady rate with its confidence interval, the design rate when a safety
// factor was entered, and the comparison with the texture table. The
// reading at t = 0 (F = 0, which every model meets) is not fitted.
func Fit(c *Cumulative, m Method, s *Settings) (*Result, error) {
	if s == nil {
		s = &Settings{}
	}
	if m < 0 || m >= numMethods {
		return nil, &models.Error{Index: -1, Field: "method", Value: float64(m), Err: models.ErrBadConstant, Reason: "unknown infiltration model"}
	}
	name := m.String()
	if bad(s.SafetyFactor) || s.SafetyFactor < 0 {
		return nil, &models.Error{Method: name, Index: -1, Field: "safety factor", Value: s.SafetyFactor, Err: models.ErrBadConstant,
			Reason: "the safety factor must be a finite positive number, or 0 when none is entered"}
	}
	if c == nil || len(c.Time) < 2 || len(c.Depth) != len(c.Time) || len(c.Rate) != len(c.Time)-1 {
		return nil, &models.Error{Method: name, Index: -1, Err: models.ErrLength, Reason: "the cumulative infiltration is missing or its columns differ in length (build it with Rebuild)"}
	}
	var fs models.FitSettings
	if s.Fit != nil {
		fs = *s.Fit
	}
	fs.From, fs.To = s.From, s.To
	var (
		model models.Model
		d     models.Data
	)
	if s.Rate {
		prev := make(map[float64]float64, len(c.Rate))
		for i := range c.Rate {
			prev[c.Time[i+1]] = c.Time[i]
		}
		model = intervalModel{m: m, prev: prev}
		d = models.Data{Time: c.Time[1:], Value: c.Rate}
	} else {
		model = m.Model(CumulativeCurve)
		d = models.Data{Time: c.Time[1:], Value: c.Depth[1:]}
	}
	fr, err := models.Fit(model, d, &fs)
	if fr == nil {
		return nil, shiftIndex(err)
	}
	r := &Result{
		Method:       m,
		Fitted:       map[bool]string{false: "cumulative infiltration", true: "infiltration rate"}[s.Rate],
		Estimates:    fr.Estimates,
		SafetyFactor: s.SafetyFactor,
		Fit:          fr,
		Notes:        append([]string(nil), c.Notes...),
		Caution:      Caution,
	}
	r.Caveats = append(r.Caveats, fr.Caveats...)
	if j := laws[m].steady; j >= 0 {
		r.HasSteady = true
		r.Steady = fr.Estimates[j]
		r.SteadyIn = convert(r.Steady)
		r.Textures, r.Plausibility = Plausibility(r.Steady.Value)
		if s.SafetyFactor > 0 {
			f := s.SafetyFactor
			st := r.Steady
			r.Design = models.Estimate{ParamInfo: models.ParamInfo{Name: "design rate", Long: "steady rate / safety factor", Unit: "m/s", Quantity: units.Conductivity},
				Value: st.Value / f, StdErr: st.StdErr / f, Lower: st.Lower / f, Upper: st.Upper / f}
			r.DesignIn = convert(r.Design)
			if f < 1 {
				r.Caveats = append(r.Caveats, fmt.Sprintf("The safety factor %g is below 1, so the design rate is above the measured rate.", f))
			}
		}
	} else {
		nan := math.NaN()
		r.Steady = models.Estimate{ParamInfo: models.ParamInfo{Name: "steady rate", Unit: "m/s", Quantity: units.Conductivity}, Value: nan, StdErr: nan, Lower: nan, Upper: nan}
		r.Plausibility = "No steady rate to compare with the texture table: " + name + " has none."
	}
	r.Caveats = append(r.Caveats, designCaution)
	return r, err
}

// shiftIndex maps the reading index of an error from the fitted data
// (which starts at the second reading) back to the readings.
func shiftIndex(err error) error {
	if e, ok := err.(*models.Error); ok && e.Index >= 0 {
		e.Index++
	}
	return err
}

// Curves returns the fitted cumulative infiltration F (m) and rate f
// (m/s) at the times t (s), whichever curve was fitted, each with the
// limits of its pointwise confidence band (see models.Result.Band). The
// rate is the model's instantaneous rate (+Inf at t = 0 for the models
// whose rate starts infinite).
func (r *Result) Curves(t []float64) (F, Flo, Fhi, f, flo, fhi []float64) {
	c := *r.Fit
	c.Model = r.Method.Model(CumulativeCurve)
	F, Flo, Fhi = c.Band(t)
	c.Model = r.Method.Model(RateCurve)
	f, flo, fhi = c.Band(t)
	return F, Flo, Fhi, f, flo, fhi
}
