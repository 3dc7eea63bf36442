package models

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// RateStep is one step of a pumping schedule: from the time Start (s, on
// the clock of the readings) the well is pumped at Rate (m³/s; 0 for a
// stop) until the next step starts.
type RateStep struct {
	Start, Rate float64
}

// PumpAndStop returns the schedule of a test pumped at the constant rate q
// from t = 0 and stopped at the time tp: {0, q}, {tp, 0}. With it,
// VariableRate fits drawdown and recovery together (see JoinRecovery).
func PumpAndStop(q, tp float64) []RateStep {
	return []RateStep{{Start: 0, Rate: q}, {Start: tp, Rate: 0}}
}

// VariableRate superposes in time a model that is linear in the pumping
// rate over a schedule of rates (steps, a stop, a restart …):
//
//	s(t) = Σ_k (Q_k − Q_{k−1})/Q_b · s_b(t − t_k),  over the steps with t_k < t,
//
// with Q_{−1} = 0, t_k and Q_k the start and rate of step k, and s_b the
// drawdown of Base, whose own rate Q_b only sets the scale (any non-zero
// value; usually the first rate). Each change of rate starts a new well
// at the same place pumping the difference, and the drawdowns add, which
// holds for every linear model (Theis, Hantush, an image well …). A
// schedule that ends with a stop (rate 0) gives recovery; the times of
// the readings are then counted from the start of pumping, not from the
// stop (JoinRecovery puts recovery readings on that clock).
//
// The parameters are those of Base; the Jacobian is the same
// superposition of Base's Jacobian.
//
// Reference: the principle of superposition for the linear flow equation,
// applied to a change of rate as by Theis (1935) for recovery and by
// Cooper & Jacob (1946) for a varying discharge (Transactions, American
// Geophysical Union 16(2), 519–524 and 27(4), 526–534; the second use
// from memory).
type VariableRate struct {
	Base  RateModel
	Steps []RateStep
}

func (m VariableRate) Name() string {
	if m.Base == nil {
		return "superposition in time"
	}
	return m.Base.Name() + ", superposed in time"
}

func (m VariableRate) Params() []ParamInfo {
	if m.Base == nil {
		return nil
	}
	return m.Base.Params()
}

// Check checks Base and the schedule: at least one step, start times
// finite and strictly increasing, rates finite, the first rate non-zero.
func (m VariableRate) Check() error {
	name := m.Name()
	if m.Base == nil {
		return errf(name, "", 0, ErrBadConstant, "no model to superpose")
	}
	if err := m.Base.Check(); err != nil {
		return err
	}
	if q := m.Base.Rate(); bad(q) || q == 0 {
		return errf(name, "Q", q, ErrBadConstant, "the rate of the superposed model sets the scale and must be a finite number other than zero")
	}
	return checkSchedule(name, m.Steps)
}

// checkSchedule validates a pumping schedule.
func checkSchedule(name string, steps []RateStep) error {
	if len(steps) == 0 {
		return errf(name, "", 0, ErrBadConstant, "the pumping schedule has no steps")
	}
	for k, st := range steps {
		if bad(st.Start) {
			return errf(name, fmt.Sprintf("step %d start", k+1), st.Start, ErrBadConstant, "the start time must be a finite number of seconds")
		}
		if bad(st.Rate) {
			return errf(name, fmt.Sprintf("step %d rate", k+1), st.Rate, ErrBadConstant, "the rate must be a finite number (0 for a stop)")
		}
		if k > 0 && !(st.Start > steps[k-1].Start) {
			return errf(name, fmt.Sprintf("step %d start", k+1), st.Start, ErrBadConstant,
				"the steps are out of order: step %d must start after step %d (at %g s)", k+1, k, steps[k-1].Start)
		}
	}
	if steps[0].Rate == 0 {
		return errf(name, "step 1 rate", 0, ErrBadConstant, "the first step starts the pumping; its rate must not be zero")
	}
	return nil
}

// CheckPoint requires a reading after the start of pumping (the first
// step) with a finite value.
func (m VariableRate) CheckPoint(t, y float64) error {
	t0 := 0.0
	if len(m.Steps) > 0 {
		t0 = m.Steps[0].Start
	}
	if !(t > t0) || bad(t) {
		return &Error{Index: -1, Field: "time", Value: t, Err: ErrBadReading,
			Reason: fmt.Sprintf("time must be after the start of pumping (t > %g s)", t0)}
	}
	if bad(y) {
		return &Error{Index: -1, Field: "drawdown", Value: y, Err: ErrBadReading, Reason: "not a finite number"}
	}
	return nil
}

// terms calls f for every step whose rate differs from the previous one,
// with the scale ΔQ/Q_b, the indices of the times after the step's start
// and the elapsed times since it.
func (m VariableRate) terms(t []float64, f func(k int, scale float64, idx []int, dt []float64)) {
	qb := m.Base.Rate()
	idx := make([]int, 0, len(t))
	dt := make([]float64, 0, len(t))
	prev := 0.0
	for k, st := range m.Steps {
		dq := st.Rate - prev
		prev = st.Rate
		if dq == 0 {
			continue
		}
		idx, dt = idx[:0], dt[:0]
		for i, ti := range t {
			if ti > st.Start {
				idx = append(idx, i)
				dt = append(dt, ti-st.Start)
			}
		}
		if len(idx) > 0 {
			f(k, dq/qb, idx, dt)
		}
	}
}

func (m VariableRate) Eval(dst, t, p []float64) {
	for i, ti := range t {
		dst[i] = 0
		if math.IsNaN(ti) {
			dst[i] = math.NaN()
		}
	}
	v := make([]float64, len(t))
	m.terms(t, func(_ int, scale float64, idx []int, dt []float64) {
		vv := v[:len(dt)]
		m.Base.Eval(vv, dt, p)
		for j, i := range idx {
			dst[i] += scale * vv[j]
		}
	})
}

func (m VariableRate) Jacobian(dst *mat.Dense, t, p []float64) {
	np := len(p)
	dst.Zero()
	if len(t) == 0 {
		return
	}
	scratch := mat.NewDense(len(t), np, nil)
	raw := dst.RawMatrix()
	m.terms(t, func(_ int, scale float64, idx []int, dt []float64) {
		js := scratch.Slice(0, len(dt), 0, np).(*mat.Dense)
		m.Base.Jacobian(js, dt, p)
		for j, i := range idx {
			row := raw.Data[i*raw.Stride : i*raw.Stride+np]
			for c := range row {
				row[c] += scale * js.At(j, c)
			}
		}
	})
}

// Start takes the Base model's own starting guess from the readings of
// the first step (times since it started, drawdowns scaled to Base's
// rate) when it has at least as many readings as there are parameters
// plus two. Otherwise — recovery readings alone, say — and when the
// first two parameters of Base are T and S of a Radial model, it fits the
// Cooper–Jacob form of the superposition,
//
//	s ≈ (1/(4πT))·Σ_k ΔQ_k·ln(t − t_k) + Q(t)/(4πT)·ln(2.25T/(r²S)),
//
// by linear least squares in the two coefficients (the second only where
// the rate Q(t) at the reading is not zero; otherwise S comes from a
// one-dimensional search with the superposed Theis model), and asks Base
// for its guess on the Theis drawdown of the first step with those T and
// S, over the same span of elapsed times.
func (m VariableRate) Start(t, y []float64) ([]float64, error) {
	name := m.Name()
	if err := m.Check(); err != nil {
		return nil, err
	}
	np := len(m.Base.Params())
	t0, q0, qb := m.Steps[0].Start, m.Steps[0].Rate, m.Base.Rate()
	t1 := math.Inf(1)
	if len(m.Steps) > 1 {
		t1 = m.Steps[1].Start
	}
	var tt, yy []float64
	for i, ti := range t {
		if ti > t0 && ti <= t1 {
			tt = append(tt, ti-t0)
			yy = append(yy, y[i]*qb/q0)
		}
	}
	var firstErr error
	if len(tt) >= np+2 {
		p, err := m.Base.Start(tt, yy)
		if err == nil && validStart(m.Base.Params(), p) {
			return p, nil
		}
		firstErr = err
	}
	p, err := m.superpositionStart(t, y)
	if err == nil {
		return p, nil
	}
	if firstErr != nil {
		return nil, firstErr
	}
	return nil, errf(name, "", 0, ErrNoTrend, "%s; give a starting guess in the settings", err.Error())
}

func (m VariableRate) superpositionStart(t, y []float64) ([]float64, error) {
	rad, ok := m.Base.(Radial)
	info := m.Base.Params()
	if !ok || len(info) < 2 || info[0].Name != "T" || info[1].Name != "S" {
		return nil, fmt.Errorf("the first step has too few readings for a starting guess")
	}
	r := rad.Distance()
	// Regression s = α·X + γ·Qn without intercept.
	var sxx, sxq, sqq, sxy, sqy float64
	for i, ti := range t {
		x, qn, prev := 0.0, 0.0, 0.0
		for _, st := range m.Steps {
			if ti <= st.Start {
				break
			}
			x += (st.Rate - prev) * math.Log(ti-st.Start)
			qn, prev = st.Rate, st.Rate
		}
		sxx += x * x
		sxq += x * qn
		sqq += qn * qn
		sxy += x * y[i]
		sqy += qn * y[i]
	}
	var alpha, gamma float64
	haveS := false
	if det := sxx*sqq - sxq*sxq; sqq > 0 && det > 1e-12*sxx*sqq {
		alpha = (sxy*sqq - sqy*sxq) / det
		gamma = (sxx*sqy - sxq*sxy) / det
		haveS = true
	} else if sxx > 0 {
		alpha = sxy / sxx
	}
	T := 1 / (4 * math.Pi * alpha)
	if !(T > 0) || bad(T) {
		return nil, fmt.Errorf("the readings do not follow the superposed rates (no positive T from the superposition line)")
	}
	S := math.NaN()
	if haveS {
		S = 2.25 * T / (r * r * math.Exp(gamma/alpha))
	}
	if !(S > 0) || bad(S) || S > 1 {
		// One-dimensional search with the superposed Theis model.
		th := VariableRate{Base: Theis{Q: m.Base.Rate(), R: r}, Steps: m.Steps}
		ts, ys := subsample(t, y, 64)
		f := make([]float64, len(ts))
		best := math.Inf(1)
		for ls := -8.0; ls <= 0; ls += 0.1 {
			s := math.Pow(10, ls)
			th.Eval(f, ts, []float64{T, s})
			sum := 0.0
			for i := range f {
				d := f[i] - ys[i]
				sum += d * d
			}
			if sum < best {
				best, S = sum, s
			}
		}
	}
	// The Theis drawdown of the first step over the span of elapsed times.
	t0 := m.Steps[0].Start
	lo, hi := math.Inf(1), 0.0
	for _, ti := range t {
		lo, hi = math.Min(lo, ti-t0), math.Max(hi, ti-t0)
	}
	if !(hi > lo) {
		hi = 10 * lo
	}
	ts := logSpaced(32, lo, hi)
	ys := make([]float64, len(ts))
	Theis{Q: m.Base.Rate(), R: r}.Eval(ys, ts, []float64{T, S})
	p, err := m.Base.Start(ts, ys)
	if err != nil || !validStart(info, p) {
		p = nil
	}
	if p == nil && len(info) == 2 {
		p = []float64{T, S}
	}
	if p == nil {
		return nil, fmt.Errorf("no starting guess from the superposition line")
	}
	return p, nil
}

// logSpaced returns n times log-spaced from a to b (a, b > 0).
func logSpaced(n int, a, b float64) []float64 {
	ts := make([]float64, n)
	for i := range ts {
		ts[i] = a * math.Pow(b/a, float64(i)/float64(n-1))
	}
	return ts
}

// Validity applies Base's validity rule to the time elapsed since each
// change of rate: a reading is valid when it is valid for every term that
// contributes to it. Base's notes are passed on, those about a later
// change of rate prefixed with the time of the change.
func (m VariableRate) Validity(ok []bool, t, p []float64) []string {
	if m.Check() != nil {
		for i := range ok {
			ok[i] = false
		}
		return []string{"The pumping schedule or the superposed model is not usable."}
	}
	for i, ti := range t {
		ok[i] = ti > m.Steps[0].Start
	}
	var notes []string
	seen := map[string]bool{}
	okb := make([]bool, len(t))
	m.terms(t, func(k int, _ float64, idx []int, dt []float64) {
		o := okb[:len(dt)]
		for _, n := range m.Base.Validity(o, dt, p) {
			if k > 0 {
				n = fmt.Sprintf("After the change of rate at t = %.4g s: %s", m.Steps[k].Start, n)
			}
			if !seen[n] {
				seen[n] = true
				notes = append(notes, n)
			}
		}
		for j, i := range idx {
			ok[i] = ok[i] && o[j]
		}
	})
	return notes
}

// JoinRecovery puts drawdown readings taken while pumping (pumping.Time
// counted from the start of pumping) and recovery readings taken after
// the pump stopped (recovery.Time = t′, counted from the stop) on the
// clock of the start of pumping, t = tp + t′, for a fit of both together
// with VariableRate and PumpAndStop. Values, weights and exclusion marks
// are carried over; recovery reading i becomes reading
// len(pumping.Time) + i. The pumping series may be empty, the recovery
// series may not. Neither is modified.
func JoinRecovery(pumping, recovery Data, tp float64) (Data, error) {
	const name = "drawdown and recovery"
	if bad(tp) || !(tp > 0) {
		return Data{}, errf(name, "pumping time", tp, ErrBadConstant, "the duration of pumping must be a finite positive number of seconds")
	}
	if len(recovery.Time) == 0 {
		return Data{}, errf(name, "", 0, ErrTooFewPoints, "the recovery series is empty")
	}
	for _, c := range []struct {
		what string
		d    Data
	}{{"drawdown", pumping}, {"recovery", recovery}} {
		n := len(c.d.Time)
		switch {
		case len(c.d.Value) != n:
			return Data{}, &Error{Method: name, Index: -1, Err: ErrLength, Reason: fmt.Sprintf("%s series: %d values for %d times", c.what, len(c.d.Value), n)}
		case c.d.Weight != nil && len(c.d.Weight) != n:
			return Data{}, &Error{Method: name, Index: -1, Err: ErrLength, Reason: fmt.Sprintf("%s series: %d weights for %d times", c.what, len(c.d.Weight), n)}
		case c.d.Exclude != nil && len(c.d.Exclude) != n:
			return Data{}, &Error{Method: name, Index: -1, Err: ErrLength, Reason: fmt.Sprintf("%s series: %d exclusion marks for %d times", c.what, len(c.d.Exclude), n)}
		}
	}
	for i, ti := range pumping.Time {
		if pumping.Exclude != nil && pumping.Exclude[i] {
			continue
		}
		if bad(ti) || ti > tp {
			return Data{}, &Error{Method: name, Index: i, Field: "time", Value: ti, Err: ErrBadReading,
				Reason: fmt.Sprintf("a drawdown reading must be taken while pumping, by the stop at %g s", tp)}
		}
	}
	for i, ti := range recovery.Time {
		if recovery.Exclude != nil && recovery.Exclude[i] {
			continue
		}
		if bad(ti) || !(ti > 0) {
			return Data{}, &Error{Method: name, Index: i, Field: "recovery time", Value: ti, Err: ErrBadReading,
				Reason: "time since pumping stopped must be positive (t′ > 0)"}
		}
	}
	np, nr := len(pumping.Time), len(recovery.Time)
	d := Data{Time: make([]float64, 0, np+nr), Value: make([]float64, 0, np+nr)}
	d.Time = append(d.Time, pumping.Time...)
	d.Value = append(d.Value, pumping.Value...)
	for _, ti := range recovery.Time {
		d.Time = append(d.Time, tp+ti)
	}
	d.Value = append(d.Value, recovery.Value...)
	if pumping.Weight != nil || recovery.Weight != nil {
		d.Weight = make([]float64, np+nr)
		for i := range d.Weight {
			d.Weight[i] = 1
		}
		copy(d.Weight, pumping.Weight)
		copy(d.Weight[np:], recovery.Weight)
	}
	if pumping.Exclude != nil || recovery.Exclude != nil {
		d.Exclude = make([]bool, np+nr)
		copy(d.Exclude, pumping.Exclude)
		copy(d.Exclude[np:], recovery.Exclude)
	}
	return d, nil
}
