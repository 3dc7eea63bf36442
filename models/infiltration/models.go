package infiltration

import (
	"fmt"
	"math"

	"fieldfit/fitcore/dense"
	"fieldfit/models"
	"fieldfit/models/units"

	"gonum.org/v1/gonum/mat"
)

// Method is one of the published infiltration models. Each gives the
// cumulative infiltration F(t) (m) and the rate f(t) = dF/dt (m/s) at the
// time t (s) since the start of the test.
type Method int

const (
	// Horton (1940): f = fc + (f0 − fc)e^(−kt),
	// F = fc·t + (f0 − fc)(1 − e^(−kt))/k; parameters fc, f0 (m/s), k (1/s),
	// all positive. Horton, R.E. (1940), An approach toward a physical
	// interpretation of infiltration-capacity, Soil Science Society of
	// America Proceedings 5, 399–417.
	Horton Method = iota
	// Philip (1957) two-term: F = S√t + A·t, f = S/(2√t) + A; parameters
	// the sorptivity S (m/s^½, positive) and A (m/s). Philip, J.R. (1957),
	// The theory of infiltration: 4. Sorptivity and algebraic infiltration
	// equations, Soil Science 84(3), 257–264.
	Philip
	// GreenAmpt (1911): F − ψΔθ ln(1 + F/(ψΔθ)) = K t, f = K(ψΔθ/F + 1);
	// parameters K (m/s) and P = ψΔθ (m), both positive; F(t) is solved by
	// GreenAmptDepth. Green, W.H. and Ampt, G.A. (1911), Studies on soil
	// physics, 1. The flow of air and water through soils, Journal of
	// Agricultural Science 4(1), 1–24.
	GreenAmpt
	// Kostiakov (1932): F = a·t^b, f = a·b·t^(b−1); parameters a (m/s^b)
	// and b, both positive. Kostiakov, A.N. (1932), On the dynamics of the
	// coefficient of water percolation in soils, Transactions of the 6th
	// Commission, International Society of Soil Science, Part A, 17–21.
	Kostiakov
	// ModifiedKostiakov: F = a·t^b + fc·t, f = a·b·t^(b−1) + fc;
	// parameters a, b and fc (m/s), all positive (the Kostiakov (1932)
	// form with a steady term, as commonly written).
	ModifiedKostiakov
	numMethods
)

// Methods lists every method.
func Methods() []Method {
	m := make([]Method, numMethods)
	for i := range m {
		m[i] = Method(i)
	}
	return m
}

// String is the method's usual name.
func (m Method) String() string {
	if m < 0 || m >= numMethods {
		return fmt.Sprintf("Method(%d)", int(m))
	}
	return laws[m].name
}

// Curve says which curve a model gives.
type Curve int

const (
	// CumulativeCurve: the model's value is the cumulative infiltration
	// F(t), m.
	CumulativeCurve Curve = iota
	// RateCurve: the model's value is the infiltration rate f(t), m/s.
	RateCurve
)

// law is one model: F and f with their gradients in p.
type law struct {
	name   string
	params []models.ParamInfo
	// steady is the index of the parameter that is the steady
	// infiltration rate (−1 when the model has none).
	steady int
	// depth and rate return F or f at t and write the gradient into g
	// when g is not nil.
	depth, rate func(t float64, p, g []float64) float64
	// start returns the starting guess on the readings (t, y) of a model
	// whose values eval gives.
	start func(eval evalFunc, t, y []float64) ([]float64, error)
	// validity returns notes on the fitted parameters.
	validity func(p []float64) []string
}

type evalFunc func(dst, t, p []float64)

var (
	rateInfo = func(name, long string) models.ParamInfo {
		return models.ParamInfo{Name: name, Long: long, Unit: "m/s", Quantity: units.Conductivity, Positive: true}
	}
	laws = [numMethods]law{
		Horton: {
			name:   "Horton (1940)",
			params: []models.ParamInfo{rateInfo("fc", "steady infiltration rate"), rateInfo("f0", "initial infiltration rate"), {Name: "k", Long: "decay constant", Unit: "1/s", Positive: true}},
			steady: 0,
			depth: func(t float64, p, g []float64) float64 {
				fc, f0, k := p[0], p[1], p[2]
				e := math.Exp(-k * t)
				q := -math.Expm1(-k*t) / k // (1 − e^(−kt))/k
				if g != nil {
					g[0], g[1], g[2] = t-q, q, (f0-fc)*(t*e/k-q/k)
				}
				return fc*t + (f0-fc)*q
			},
			rate: func(t float64, p, g []float64) float64 {
				fc, f0, k := p[0], p[1], p[2]
				e := math.Exp(-k * t)
				if g != nil {
					g[0], g[1], g[2] = 1-e, e, -(f0-fc)*t*e
				}
				return fc + (f0-fc)*e
			},
			start: func(eval evalFunc, t, y []float64) ([]float64, error) {
				tmin, tmax := span(t)
				// k from 0.1/tmax to 10/tmin, at most 12 decades.
				lo, hi := math.Log10(0.1/tmax), math.Log10(10/tmin)
				if bad(lo) || bad(hi) {
					return nil, &models.Error{Method: "Horton (1940)", Index: -1, Field: "time", Value: tmax, Err: models.ErrNoTrend,
						Reason: "the times are too small or too large to search the decay constant"}
				}
				hi = math.Min(hi, lo+12)
				var cands [][]float64
				for i := 0; lo+float64(i)/8 <= hi+1e-9; i++ {
					cands = append(cands, []float64{0, 0, math.Pow(10, lo+float64(i)/8)})
				}
				return bestLinear("Horton (1940)", eval, t, y, cands, []int{0, 1}, []bool{true, true})
			},
			validity: func(p []float64) []string {
				if p[1] < p[0] {
					return []string{fmt.Sprintf("The fitted initial rate f0 = %.3g mm/h is below the steady rate fc = %.3g mm/h: the readings rise rather than fall off, which Horton's curve does not describe.", p[1]*3.6e6, p[0]*3.6e6)}
				}
				return nil
			},
		},
		Philip: {
			name:   "Philip (1957) two-term",
			params: []models.ParamInfo{{Name: "S", Long: "sorptivity", Unit: "m/s^½", Positive: true}, {Name: "A", Long: "steady term", Unit: "m/s", Quantity: units.Conductivity}},
			steady: 1,
			depth: func(t float64, p, g []float64) float64 {
				r := math.Sqrt(t)
				if g != nil {
					g[0], g[1] = r, t
				}
				return p[0]*r + p[1]*t
			},
			rate: func(t float64, p, g []float64) float64 {
				r := 0.5 / math.Sqrt(t)
				if g != nil {
					g[0], g[1] = r, 1
				}
				return p[0]*r + p[1]
			},
			start: func(eval evalFunc, t, y []float64) ([]float64, error) {
				return bestLinear("Philip (1957) two-term", eval, t, y, [][]float64{{0, 0}}, []int{0, 1}, []bool{true, false})
			},
			validity: func(p []float64) []string {
				n := []string{"The steady term A of the two-term form is not K itself: Philip's theory puts A between about K/3 and 2K/3 (reference §7, from memory), so K may lie between 1.5A and 3A."}
				if p[1] < 0 {
					n = append(n, fmt.Sprintf("The fitted A = %.3g mm/h is negative: the readings are too short or too curved for the two-term form to give a steady rate.", p[1]*3.6e6))
				}
				return n
			},
		},
		GreenAmpt: {
			name:   "Green–Ampt (1911)",
			params: []models.ParamInfo{rateInfo("K", "hydraulic conductivity (of the wetted zone)"), {Name: "ψΔθ", Long: "wetting-front suction head × moisture deficit", Unit: "m", Quantity: units.Length, Positive: true}},
			steady: 0,
			depth: func(t float64, p, g []float64) float64 {
				K, P := p[0], p[1]
				x, ok := greenAmptX(t, K, P)
				if !ok {
					return math.NaN()
				}
				if g != nil {
					if x == 0 {
						g[0], g[1] = 0, 0
					} else {
						// Implicit differentiation of F − P ln(1+F/P) = Kt.
						g[0] = t * (1 + x) / x
						g[1] = ((1+x)*math.Log1p(x) - x) / x
					}
				}
				return P * x
			},
			rate: func(t float64, p, g []float64) float64 {
				K, P := p[0], p[1]
				x, ok := greenAmptX(t, K, P)
				if !ok {
					return math.NaN()
				}
				if g != nil {
					dK := t * (1 + x) / x
					dP := ((1+x)*math.Log1p(x) - x) / x
					F := P * x
					g[0] = (1/x + 1) - K*P/(F*F)*dK
					g[1] = K/F - K*P/(F*F)*dP
				}
				return K * (1/x + 1)
			},
			start: func(eval evalFunc, t, y []float64) ([]float64, error) {
				var cands [][]float64
				for lk := -9.0; lk <= -2+1e-9; lk += 0.25 {
					for lp := -4.0; lp <= 0+1e-9; lp += 0.25 {
						cands = append(cands, []float64{math.Pow(10, lk), math.Pow(10, lp)})
					}
				}
				return bestLinear("Green–Ampt (1911)", eval, t, y, cands, nil, nil)
			},
			validity: func(p []float64) []string { return nil },
		},
		Kostiakov: {
			name:   "Kostiakov (1932)",
			params: []models.ParamInfo{{Name: "a", Long: "coefficient", Unit: "m/s^b", Positive: true}, {Name: "b", Long: "exponent", Unit: "1", Positive: true}},
			steady: -1,
			depth: func(t float64, p, g []float64) float64 {
				a, b := p[0], p[1]
				if t == 0 {
					if g != nil {
						g[0], g[1] = 0, 0
					}
					return 0
				}
				tb := math.Pow(t, b)
				if g != nil {
					g[0], g[1] = tb, a*tb*math.Log(t)
				}
				return a * tb
			},
			rate: func(t float64, p, g []float64) float64 {
				a, b := p[0], p[1]
				tb := math.Pow(t, b-1)
				if g != nil {
					g[0], g[1] = b*tb, a*tb*(1+b*math.Log(t))
				}
				return a * b * tb
			},
			start: func(eval evalFunc, t, y []float64) ([]float64, error) {
				var cands [][]float64
				for b := 0.05; b <= 1.5+1e-9; b += 0.025 {
					cands = append(cands, []float64{0, b})
				}
				return bestLinear("Kostiakov (1932)", eval, t, y, cands, []int{0}, []bool{true})
			},
			validity: func(p []float64) []string {
				n := []string{"Kostiakov's form has no steady rate: its rate falls towards zero at long times, so it is no basis for a long-term design rate."}
				if p[1] >= 1 {
					n = append(n, fmt.Sprintf("The fitted exponent b = %.3g is not below 1: the rate does not fall with time.", p[1]))
				}
				return n
			},
		},
		ModifiedKostiakov: {
			name:   "modified Kostiakov",
			params: []models.ParamInfo{{Name: "a", Long: "coefficient", Unit: "m/s^b", Positive: true}, {Name: "b", Long: "exponent", Unit: "1", Positive: true}, rateInfo("fc", "steady infiltration rate")},
			steady: 2,
			depth: func(t float64, p, g []float64) float64 {
				a, b, fc := p[0], p[1], p[2]
				if t == 0 {
					if g != nil {
						g[0], g[1], g[2] = 0, 0, 0
					}
					return 0
				}
				tb := math.Pow(t, b)
				if g != nil {
					g[0], g[1], g[2] = tb, a*tb*math.Log(t), t
				}
				return a*tb + fc*t
			},
			rate: func(t float64, p, g []float64) float64 {
				a, b, fc := p[0], p[1], p[2]
				tb := math.Pow(t, b-1)
				if g != nil {
					g[0], g[1], g[2] = b*tb, a*tb*(1+b*math.Log(t)), 1
				}
				return a*b*tb + fc
			},
			start: func(eval evalFunc, t, y []float64) ([]float64, error) {
				var cands [][]float64
				for b := 0.05; b <= 0.975+1e-9; b += 0.025 {
					cands = append(cands, []float64{0, b, 0})
				}
				return bestLinear("modified Kostiakov", eval, t, y, cands, []int{0, 2}, []bool{true, true})
			},
			validity: func(p []float64) []string {
				if p[1] >= 1 {
					return []string{fmt.Sprintf("The fitted exponent b = %.3g is not below 1: the a·t^b term does not describe a falling rate.", p[1])}
				}
				return nil
			},
		},
	}
)

func span(t []float64) (lo, hi float64) {
	lo, hi = math.Inf(1), 0
	for _, v := range t {
		if v > 0 {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	if math.IsInf(lo, 1) {
		lo, hi = 1, 1
	}
	return lo, hi
}

// bestLinear returns the best of the candidate parameter vectors cands,
// with the parameters listed in lin (linear in the model) replaced by their
// least-squares values on (t, y); pos[j] says that lin[j] must be positive
// (a non-positive value is replaced by a small positive one). It works on
// at most 64 of the readings.
func bestLinear(method string, eval evalFunc, t, y []float64, cands [][]float64, lin []int, pos []bool) ([]float64, error) {
	ts, ys := subsample(t, y, 64)
	n := len(ts)
	f := make([]float64, n)
	cols := make([][]float64, len(lin))
	for j := range cols {
		cols[j] = make([]float64, n)
	}
	yscale := 0.0
	for _, v := range ys {
		yscale = math.Max(yscale, math.Abs(v))
	}
	var best []float64
	bestSSR := math.Inf(1)
	p := make([]float64, 0, 4)
	for _, c := range cands {
		p = append(p[:0], c...)
		for _, j := range lin {
			p[j] = 0
		}
		if len(lin) > 0 {
			a := mat.NewDense(n, len(lin), nil)
			for k, j := range lin {
				p[j] = 1
				eval(cols[k], ts, p)
				p[j] = 0
				for i := range ts {
					a.Set(i, k, cols[k][i])
				}
			}
			x := make([]float64, len(lin))
			if !(dense.LeastSquares(x, a.RawMatrix(), append([]float64(nil), ys...)) <= dense.ConditionTolerance) {
				continue
			}
			for k, j := range lin {
				v := x[k]
				if pos[k] && !(v > 0) {
					cmax := 0.0
					for _, cv := range cols[k] {
						cmax = math.Max(cmax, math.Abs(cv))
					}
					v = 1e-3 * yscale / cmax
				}
				p[j] = v
			}
		}
		eval(f, ts, p)
		ssr := 0.0
		for i := range f {
			d := f[i] - ys[i]
			ssr += d * d
		}
		if ssr < bestSSR {
			bestSSR, best = ssr, append([]float64(nil), p...)
		}
	}
	if best == nil {
		return nil, &models.Error{Method: method, Index: -1, Err: models.ErrNoTrend, Reason: "no starting guess: the readings do not follow the shape of the model"}
	}
	for _, v := range best {
		if bad(v) {
			return nil, &models.Error{Method: method, Index: -1, Err: models.ErrNoTrend, Reason: "no starting guess: the readings do not follow the shape of the model"}
		}
	}
	return best, nil
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

// Model returns the method as a models.Model whose value is the curve c
// (F in m or f in m/s) at the time t (s).
func (m Method) Model(c Curve) models.Model { return curveModel{m, c} }

// curveModel is a method as a models.Model of F or f.
type curveModel struct {
	m Method
	c Curve
}

func (cm curveModel) law() *law { return &laws[cm.m] }

func (cm curveModel) value(t float64, p, g []float64) float64 {
	if cm.c == RateCurve {
		return cm.law().rate(t, p, g)
	}
	return cm.law().depth(t, p, g)
}

func (cm curveModel) Name() string { return cm.law().name }

func (cm curveModel) Params() []models.ParamInfo {
	return append([]models.ParamInfo(nil), cm.law().params...)
}

func (cm curveModel) Check() error {
	if cm.m < 0 || cm.m >= numMethods {
		return &models.Error{Index: -1, Field: "method", Value: float64(cm.m), Err: models.ErrBadConstant, Reason: "unknown infiltration model"}
	}
	return nil
}

func (cm curveModel) CheckPoint(t, y float64) error { return checkPoint(t, y) }

func checkPoint(t, y float64) error {
	if !(t > 0) || bad(t) {
		return &models.Error{Index: -1, Field: "time", Value: t, Err: models.ErrBadReading, Reason: "time since the start must be positive"}
	}
	if bad(y) {
		return &models.Error{Index: -1, Field: "infiltration", Value: y, Err: models.ErrBadReading, Reason: "not a finite number"}
	}
	return nil
}

func (cm curveModel) Eval(dst, t, p []float64) {
	for i, ti := range t {
		dst[i] = cm.value(ti, p, nil)
	}
}

func (cm curveModel) Jacobian(dst *mat.Dense, t, p []float64) {
	g := make([]float64, len(p))
	for i, ti := range t {
		cm.value(ti, p, g)
		dst.SetRow(i, g)
	}
}

func (cm curveModel) Start(t, y []float64) ([]float64, error) {
	return cm.law().start(cm.Eval, t, y)
}

func (cm curveModel) Validity(ok []bool, t, p []float64) []string {
	for i := range ok {
		ok[i] = true
	}
	return cm.law().validity(p)
}

// intervalModel is a method as a models.Model of the mean rate over the
// interval that ends at each time: (F(t) − F(t′))/(t − t′), with t′ the
// start of the interval looked up in prev (the readings' times are
// distinct, so each end time names one interval).
type intervalModel struct {
	m    Method
	prev map[float64]float64
}

func (im intervalModel) base() curveModel { return curveModel{im.m, CumulativeCurve} }

func (im intervalModel) Name() string                  { return im.base().Name() }
func (im intervalModel) Params() []models.ParamInfo    { return im.base().Params() }
func (im intervalModel) Check() error                  { return im.base().Check() }
func (im intervalModel) CheckPoint(t, y float64) error { return checkPoint(t, y) }

func (im intervalModel) Eval(dst, t, p []float64) {
	l := im.base().law()
	for i, ti := range t {
		t0, ok := im.prev[ti]
		if !ok {
			dst[i] = math.NaN()
			continue
		}
		dst[i] = (l.depth(ti, p, nil) - l.depth(t0, p, nil)) / (ti - t0)
	}
}

func (im intervalModel) Jacobian(dst *mat.Dense, t, p []float64) {
	l := im.base().law()
	g1, g0 := make([]float64, len(p)), make([]float64, len(p))
	for i, ti := range t {
		t0, ok := im.prev[ti]
		for j := range p {
			if !ok {
				dst.Set(i, j, 0)
			}
		}
		if !ok {
			continue
		}
		l.depth(ti, p, g1)
		l.depth(t0, p, g0)
		for j := range p {
			dst.Set(i, j, (g1[j]-g0[j])/(ti-t0))
		}
	}
}

func (im intervalModel) Start(t, y []float64) ([]float64, error) {
	return im.base().law().start(im.Eval, t, y)
}

func (im intervalModel) Validity(ok []bool, t, p []float64) []string {
	return im.base().Validity(ok, t, p)
}
