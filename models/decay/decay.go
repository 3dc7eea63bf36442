package decay

import (
	"fmt"
	"math"

	"fieldfit/fitcore/dense"
	"fieldfit/models"

	"gonum.org/v1/gonum/mat"
)

// Form is the shape of the decay curve.
type Form int

const (
	// OneTerm is first-order decay to a baseline,
	// y = y∞ + (y0 − y∞)·e^(−k t).
	OneTerm Form = iota
	// TwoTerm is the sum of two first-order terms over a baseline,
	// y = y∞ + a1·e^(−k1 t) + a2·e^(−k2 t), so that y0 = y∞ + a1 + a2.
	TwoTerm
)

// Exponential is the decay curve as a models.Model of y(t):
//
//	OneTerm: y = y∞ + (y0 − y∞)·e^(−k t), parameters y0, y∞, k;
//	TwoTerm: y = y∞ + a1·e^(−k1 t) + a2·e^(−k2 t), parameters y∞, a1, k1, a2, k2;
//
// with the rate constants k, k1, k2 positive (fitted in log space) and
// y0, y∞ held at given values instead of fitted when FixY0 (OneTerm only)
// or FixBaseline is set; the fitted parameters are then the others, in the
// same order. The time t and the value y are in any units (Result carries
// them as strings); k is in 1/(time unit). The Jacobian is analytic.
//
// First-order kinetics to a baseline is the common model of tracer
// dilution, of a head or concentration relaxing after a disturbance, and
// of biochemical oxygen demand (the form of the NIST StRD problems Misra1a
// and BoxBOD, y = b1(1 − e^(−b2 x)): y0 = 0, y∞ = b1, k = b2).
type Exponential struct {
	Form               Form
	FixY0, FixBaseline bool
	Y0, Baseline       float64
}

// names lists the parameters of the form in order, the fixed ones
// included.
func (m Exponential) names() []string {
	if m.Form == TwoTerm {
		return []string{"y∞", "a1", "k1", "a2", "k2"}
	}
	return []string{"y0", "y∞", "k"}
}

// free reports whether the parameter named n is fitted.
func (m Exponential) free(n string) bool {
	switch n {
	case "y0":
		return !m.FixY0
	case "y∞":
		return !m.FixBaseline
	}
	return true
}

// full expands the fitted parameters p to the full list of the form.
func (m Exponential) full(p []float64) []float64 {
	names := m.names()
	out := make([]float64, len(names))
	k := 0
	for i, n := range names {
		switch {
		case !m.free(n) && n == "y0":
			out[i] = m.Y0
		case !m.free(n):
			out[i] = m.Baseline
		default:
			out[i] = p[k]
			k++
		}
	}
	return out
}

func (m Exponential) Name() string {
	if m.Form == TwoTerm {
		return "two-term exponential decay"
	}
	return "first-order decay"
}

func (m Exponential) Params() []models.ParamInfo {
	var out []models.ParamInfo
	for _, n := range m.names() {
		if !m.free(n) {
			continue
		}
		info := models.ParamInfo{Name: n, Unit: "value unit"}
		switch n {
		case "y0":
			info.Long = "initial value"
		case "y∞":
			info.Long = "baseline (final value)"
		case "a1", "a2":
			info.Long = "amplitude of term " + n[1:]
		default:
			info.Long, info.Unit, info.Positive = "rate constant", "1/time unit", true
		}
		out = append(out, info)
	}
	return out
}

func (m Exponential) Check() error {
	if m.Form != OneTerm && m.Form != TwoTerm {
		return &models.Error{Method: "decay", Index: -1, Field: "form", Value: float64(m.Form), Err: models.ErrBadConstant, Reason: "unknown form of decay curve"}
	}
	if m.FixY0 && m.Form == TwoTerm {
		return &models.Error{Method: m.Name(), Index: -1, Field: "y0", Value: m.Y0, Err: models.ErrBadConstant, Reason: "y0 can be held fixed only in the one-term form"}
	}
	if m.FixY0 && bad(m.Y0) {
		return &models.Error{Method: m.Name(), Index: -1, Field: "y0", Value: m.Y0, Err: models.ErrBadConstant, Reason: "the fixed initial value must be a finite number"}
	}
	if m.FixBaseline && bad(m.Baseline) {
		return &models.Error{Method: m.Name(), Index: -1, Field: "y∞", Value: m.Baseline, Err: models.ErrBadConstant, Reason: "the fixed baseline must be a finite number"}
	}
	return nil
}

func (m Exponential) CheckPoint(t, y float64) error {
	if bad(t) {
		return &models.Error{Index: -1, Field: "time", Value: t, Err: models.ErrBadReading, Reason: "not a finite number"}
	}
	if bad(y) {
		return &models.Error{Index: -1, Field: "value", Value: y, Err: models.ErrBadReading, Reason: "not a finite number"}
	}
	return nil
}

func (m Exponential) Eval(dst, t, p []float64) {
	q := m.full(p)
	for i, ti := range t {
		if m.Form == TwoTerm {
			dst[i] = q[0] + q[1]*math.Exp(-q[2]*ti) + q[3]*math.Exp(-q[4]*ti)
		} else {
			dst[i] = q[1] + (q[0]-q[1])*math.Exp(-q[2]*ti)
		}
	}
}

func (m Exponential) Jacobian(dst *mat.Dense, t, p []float64) {
	q := m.full(p)
	names := m.names()
	g := make([]float64, len(names))
	for i, ti := range t {
		if m.Form == TwoTerm {
			e1, e2 := math.Exp(-q[2]*ti), math.Exp(-q[4]*ti)
			g[0], g[1], g[2], g[3], g[4] = 1, e1, -q[1]*ti*e1, e2, -q[3]*ti*e2
		} else {
			e := math.Exp(-q[2] * ti)
			g[0], g[1], g[2] = e, 1-e, -(q[0]-q[1])*ti*e
		}
		k := 0
		for j, n := range names {
			if m.free(n) {
				dst.Set(i, k, g[j])
				k++
			}
		}
	}
}

// Start searches the rate constants on a logarithmic grid (16 per decade
// from 0.01/span to 10/(shortest time step); pairs k1 < k2 for TwoTerm)
// and solves the amplitudes and free values, which are linear, by least
// squares for each, on at most 64 readings; it keeps the best. It fails
// when the readings do not change.
func (m Exponential) Start(t, y []float64) ([]float64, error) {
	ts, ys := subsample(t, y, 64)
	ymin, ymax := math.Inf(1), math.Inf(-1)
	for _, v := range ys {
		ymin, ymax = math.Min(ymin, v), math.Max(ymax, v)
	}
	if !(ymax > ymin) {
		return nil, &models.Error{Method: m.Name(), Index: -1, Field: "value", Value: ymin, Err: models.ErrNoTrend,
			Reason: "the readings do not change: there is no decay to fit"}
	}
	tmin, tmax := math.Inf(1), math.Inf(-1)
	dmin := math.Inf(1)
	for i, v := range ts {
		tmin, tmax = math.Min(tmin, v), math.Max(tmax, v)
		if i > 0 {
			if d := math.Abs(v - ts[i-1]); d > 0 {
				dmin = math.Min(dmin, d)
			}
		}
	}
	spanT := tmax - tmin
	if !(spanT > 0) || math.IsInf(dmin, 1) {
		return nil, &models.Error{Method: m.Name(), Index: -1, Field: "time", Value: tmin, Err: models.ErrNoTrend,
			Reason: "all readings are at the same time"}
	}
	// At most 16 decades of rate constants, centred on the span when the
	// time steps are extremely uneven.
	lo, hi := math.Log10(0.01/spanT), math.Log10(10/dmin)
	if bad(lo) || bad(hi) {
		return nil, &models.Error{Method: m.Name(), Index: -1, Field: "time", Value: spanT, Err: models.ErrNoTrend,
			Reason: "the span of the times is too small or too large to search a rate constant"}
	}
	hi = math.Min(hi, lo+16)
	var ks []float64
	for i := 0; lo+float64(i)/16 <= hi+1e-9; i++ {
		ks = append(ks, math.Pow(10, lo+float64(i)/16))
	}
	names := m.names()
	full := make([]float64, len(names))
	best, bestSSR := []float64(nil), math.Inf(1)
	try := func() {
		// Linear parameters: the free ones among y0, y∞, a1, a2.
		var lin []int
		for j, n := range names {
			if n != "k" && n != "k1" && n != "k2" && m.free(n) {
				lin = append(lin, j)
			}
		}
		n := len(ts)
		base := make([]float64, n)
		a := mat.NewDense(n, max(len(lin), 1), nil)
		for _, j := range lin {
			full[j] = 0
		}
		// The value with every linear parameter at zero (fixed values in).
		for i, ti := range ts {
			base[i] = m.evalFull(full, ti)
		}
		rhs := make([]float64, n)
		for i := range ts {
			rhs[i] = ys[i] - base[i]
		}
		if len(lin) > 0 {
			for k, j := range lin {
				full[j] = 1
				for i, ti := range ts {
					a.Set(i, k, m.evalFull(full, ti)-base[i])
				}
				full[j] = 0
			}
			x := make([]float64, len(lin))
			if !(dense.LeastSquares(x, a.RawMatrix(), rhs) <= dense.ConditionTolerance) {
				return
			}
			for k, j := range lin {
				full[j] = x[k]
			}
		}
		ssr := 0.0
		for i, ti := range ts {
			d := m.evalFull(full, ti) - ys[i]
			ssr += d * d
		}
		if ssr < bestSSR && !bad(ssr) {
			bestSSR = ssr
			best = best[:0]
			for j, nm := range names {
				if m.free(nm) {
					best = append(best, full[j])
				}
			}
		}
	}
	for j, n := range names {
		if !m.free(n) {
			if n == "y0" {
				full[j] = m.Y0
			} else {
				full[j] = m.Baseline
			}
		}
	}
	if m.Form == TwoTerm {
		for a := range ks {
			for b := a + 4; b < len(ks); b += 2 { // k2 at least 1.8 times k1
				full[2], full[4] = ks[a], ks[b]
				try()
			}
		}
	} else {
		for _, k := range ks {
			full[2] = k
			try()
		}
	}
	if best == nil {
		return nil, &models.Error{Method: m.Name(), Index: -1, Err: models.ErrNoTrend, Reason: "no starting guess: the readings do not follow an exponential decay"}
	}
	return best, nil
}

// evalFull evaluates the curve at t with the full parameter list q.
func (m Exponential) evalFull(q []float64, t float64) float64 {
	if m.Form == TwoTerm {
		return q[0] + q[1]*math.Exp(-q[2]*t) + q[3]*math.Exp(-q[4]*t)
	}
	return q[1] + (q[0]-q[1])*math.Exp(-q[2]*t)
}

// Validity accepts every reading and notes a half-life far outside the
// span of the readings.
func (m Exponential) Validity(ok []bool, t, p []float64) []string {
	for i := range ok {
		ok[i] = true
	}
	if len(t) == 0 {
		return nil
	}
	tmin, tmax := math.Inf(1), math.Inf(-1)
	for _, v := range t {
		tmin, tmax = math.Min(tmin, v), math.Max(tmax, v)
	}
	q := m.full(p)
	var notes []string
	ks := []float64{q[2]}
	if m.Form == TwoTerm {
		ks = append(ks, q[4])
	}
	for _, k := range ks {
		h := math.Ln2 / k
		if h > 3*(tmax-tmin) {
			notes = append(notes, fmt.Sprintf("The half-life %.4g is more than three times the span of the readings (%.4g): the baseline is an extrapolation and poorly determined.", h, tmax-tmin))
		}
	}
	return notes
}

func subsample(t, y []float64, maxN int) (ts, ys []float64) {
	if len(t) <= maxN {
		return t, y
	}
	ts, ys = make([]float64, maxN), make([]float64, maxN)
	for k := range ts {
		i := k * (len(t) - 1) / (maxN - 1)
		ts[k], ys[k] = t[i], y[i]
	}
	return ts, ys
}

func bad(v float64) bool { return math.IsNaN(v) || math.IsInf(v, 0) }
