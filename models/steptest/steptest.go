package steptest

import (
	"fmt"
	"math"
	"sort"

	"fieldfit/models"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"
)

// Caution is the notice that goes with every result of this package on
// screen and in reports.
const Caution = "Preliminary field interpretation: a submission to a regulator must be prepared or reviewed by a licensed hydrogeologist (or the equivalent licensed professional) and follow the local rules and codes."

// Step is one step of a step-drawdown test.
type Step struct {
	// Start is the time the step began, s, on the clock of the readings
	// (usually 0 for the first step). The step lasts until the next step
	// starts; the last step lasts until its last reading.
	Start float64
	// Rate is the pumping rate during the step, m³/s; it must be positive.
	Rate float64
}

// Trend selects the time axis on which each step's late trend is fitted
// and extended into the next step.
type Trend int

const (
	// TrendSuperposition fits the trend on the superposition time of the
	// rate history, X(t) = Σ_{i≤k} (Q_i − Q_{i−1})/Q_k · ln(t − t_i), in
	// which the Cooper–Jacob drawdown of all steps so far is a straight
	// line. It is the default.
	TrendSuperposition Trend = iota
	// TrendLogTime fits the trend on ln of the time since the first step
	// began, as on the usual semilog plot of the whole test.
	TrendLogTime
)

func (t Trend) String() string {
	switch t {
	case TrendSuperposition:
		return "superposition time"
	case TrendLogTime:
		return "log of time since the test began"
	}
	return fmt.Sprintf("Trend(%d)", int(t))
}

// Settings control Analyse. The zero value works, and a nil *Settings
// means the zero value.
type Settings struct {
	// Duration is the equal duration Δt after each step's start at which
	// its drawdown is taken, s. If Duration is 0 it is defaulted to the
	// shortest time from a step's start to its last reading (the
	// shortest step when every step is read to its end). Every step must
	// have readings at or before and at or after Δt.
	Duration float64

	// Trend is the time axis of the trend lines; the zero value is
	// TrendSuperposition.
	Trend Trend

	// Late is the fraction of each step's span in log time, counted back
	// from its last reading, whose readings are fitted by the trend line.
	// If Late is 0 it is defaulted to 0.5, the later half of the step
	// in log time (common practice). When fewer than 3 readings lie
	// there, the step's last 3 readings are used.
	Late float64

	// Confidence is the level of the standard errors' intervals reported
	// with the trend lines. If Confidence is 0 it is defaulted to 0.95.
	Confidence float64
}

// TrendLine is the straight line s = Intercept + Slope·X fitted to the late
// readings of one step, X being the time axis of Settings.Trend (natural
// logarithm of seconds).
type TrendLine struct {
	// Axis is the time axis of X.
	Axis Trend
	// From and To are the times of the first and last reading on the
	// line, s; Readings holds their indices in the Data.
	From, To float64
	Readings []int
	// Intercept (m) and Slope (m per unit of X) with their standard
	// errors and covariance (NaN with fewer than 3 readings).
	Intercept, Slope       float64
	InterceptErr, SlopeErr float64
	Cov                    float64
	// PerCycle = Slope·ln 10 is the drawdown per log₁₀ cycle of the axis, m.
	PerCycle float64
	// RMSE is the root-mean-square (weighted) residual of the line, m.
	RMSE float64
	// TValue is the Student's t quantile for the confidence level on
	// len(Readings) − 2 degrees of freedom (NaN with 2 readings).
	TValue float64

	// history of the rates up to this step, for the superposition axis.
	starts, rates []float64
	origin        float64
	// the fit's sums, for the line's sensitivity to its readings: the
	// axis value and weight of each reading, Σw, the weighted mean of X
	// and Σw(X − X̄)².
	x, w        []float64
	sw, xm, sxx float64
}

// term is the sensitivity of a derived value to one raw reading: the
// derivative c with respect to the drawdown of reading i.
type term struct {
	i int
	c float64
}

// terms returns the sensitivity of the line's value at the axis value x
// to its readings: Intercept + Slope·x = Σ_m h_m·w_m·(1/Σw + (x_m − X̄)(x − X̄)/Sxx).
func (l *TrendLine) terms(x float64) []term {
	ts := make([]term, len(l.Readings))
	for m, i := range l.Readings {
		ts[m] = term{i, l.w[m] * (1/l.sw + (l.x[m]-l.xm)*(x-l.xm)/l.sxx)}
	}
	return ts
}

// X returns the line's time axis at the time t (s on the readings' clock):
// the superposition time or ln(t − t₁). It is NaN before the step began.
func (l *TrendLine) X(t float64) float64 {
	if l.Axis == TrendLogTime {
		if !(t > l.origin) {
			return math.NaN()
		}
		return math.Log(t - l.origin)
	}
	k := len(l.rates) - 1
	if k < 0 || !(t > l.starts[k]) {
		return math.NaN()
	}
	x, prev := 0.0, 0.0
	for i, q := range l.rates {
		x += (q - prev) / l.rates[k] * math.Log(t-l.starts[i])
		prev = q
	}
	return x
}

// At returns the drawdown on the extended line at the time t, m, and its
// standard error from the line's coefficients (NaN with 2 readings).
func (l *TrendLine) At(t float64) (s, stdErr float64) {
	x := l.X(t)
	s = l.Intercept + l.Slope*x
	v := l.InterceptErr*l.InterceptErr + 2*x*l.Cov + x*x*l.SlopeErr*l.SlopeErr
	return s, math.Sqrt(math.Max(v, 0))
}

// StepResult is the analysis of one step.
type StepResult struct {
	// Index is the 0-based index of the step in the schedule.
	Index int
	// Rate is the step's pumping rate, m³/s.
	Rate float64
	// Start and End bound the step, s: End is the next step's start, or
	// the last reading for the last step.
	Start, End float64
	// Readings holds the indices into the Data of the step's readings
	// (those with Start < t ≤ End that are not excluded).
	Readings []int
	// At = Start + Δt is the time at which the step's drawdown is taken, s.
	At float64
	// Observed is the drawdown at At, interpolated linearly in
	// ln(t − Start) between the two readings around it, m.
	Observed float64
	// Previous is the previous step's trend extended to At, m, and
	// PreviousErr its standard error; both are 0 for the first step.
	Previous, PreviousErr float64
	// Increment is Δs_k = Observed − Previous, m.
	Increment float64
	// Drawdown is s_w,k, the sum of the increments of this and the
	// earlier steps: the drawdown of the well pumped at Rate for Δt, m.
	Drawdown float64
	// Specific is the specific drawdown Drawdown/Rate, s/m².
	Specific float64
	// Line is the trend fitted to this step's late readings and extended
	// into the next step; nil for the last step.
	Line *TrendLine
}

// Analysis is the outcome of Analyse.
type Analysis struct {
	// Duration is the equal duration Δt used, s.
	Duration float64
	// Trend is the time axis of the trend lines.
	Trend Trend
	// Steps holds one result per step of the schedule, in order.
	Steps []StepResult
	// Excluded counts the readings left out by the exclusion mask or a
	// zero weight.
	Excluded int
	// DrawdownCov is the covariance of the steps' Drawdowns (m²) when the
	// readings have independent errors of variance 1/weight m² (1 m²
	// without weights): Σᵢ (∂s_w,k/∂hᵢ)(∂s_w,l/∂hᵢ)/wᵢ over the readings
	// hᵢ, each derivative taken through the interpolation at the equal
	// duration and the trend lines. The summed increments share readings
	// and trend lines, so the drawdowns are correlated and of unequal
	// variance; FitSettings.Cov takes this matrix (up to a common factor,
	// which the fits estimate) for generalised least squares.
	DrawdownCov *mat.SymDense
	// Caveats are plain sentences for the user about the analysis.
	Caveats []string
}

// Point is one equal-duration drawdown of a step test: the input of Jacob
// and Rorabaugh.
type Point struct {
	// Rate is the pumping rate, m³/s.
	Rate float64
	// Drawdown is the drawdown in the pumped well after the equal
	// duration, m.
	Drawdown float64
}

// Points returns the steps' rates and equal-duration drawdowns.
func (a *Analysis) Points() []Point {
	p := make([]Point, len(a.Steps))
	for k, s := range a.Steps {
		p[k] = Point{Rate: s.Rate, Drawdown: s.Drawdown}
	}
	return p
}

func bad(v float64) bool { return math.IsNaN(v) || math.IsInf(v, 0) }

// Analyse takes the drawdown of each step of a step-drawdown test at the
// equal duration Δt after the step's start, by the superposition method of
// Hantush and Bierschenk (see the package documentation): the increment of
// step k is the drawdown observed at t_k + Δt less the extension of step
// k−1's late Cooper–Jacob trend line to that time, and s_w,k is the sum of
// the increments of steps 1…k.
//
// steps is the schedule in order of time; d holds the pumped well's
// readings (d.Time on the clock of steps, s, in increasing order; d.Value
// the drawdown, m; d.Weight, if set, weights the trend lines and a zero
// weight excludes a reading, as does d.Exclude). A reading at a step's
// start time belongs to the step before (it is that step's last reading).
// Every reading must come after the first step began. Every step needs one
// reading, and every step but the last three readings, for its trend.
// Inputs are not modified.
//
// Errors are *Error values that name the step or reading at fault.
func Analyse(steps []Step, d models.Data, set *Settings) (*Analysis, error) {
	if set == nil {
		set = &Settings{}
	}
	late, conf, err := set.resolve()
	if err != nil {
		return nil, err
	}
	ns := len(steps)
	if ns < 2 {
		return nil, &Error{Step: -1, Reading: -1, Err: ErrSchedule,
			Reason: fmt.Sprintf("a step-drawdown test needs at least two steps, %d given", ns)}
	}
	for k, st := range steps {
		if bad(st.Start) {
			return nil, &Error{Step: k, Steps: ns, Reading: -1, Field: "start", Value: st.Start, Err: ErrSchedule,
				Reason: "the start time must be a finite number (s)"}
		}
		if k > 0 && !(st.Start > steps[k-1].Start) {
			return nil, &Error{Step: k, Steps: ns, Reading: -1, Field: "start", Value: st.Start, Err: ErrSchedule,
				Reason: fmt.Sprintf("the step starts at %g s, not after step %d (%g s): steps must be in order of time", st.Start, k, steps[k-1].Start)}
		}
		if bad(st.Rate) || !(st.Rate > 0) {
			return nil, &Error{Step: k, Steps: ns, Reading: -1, Field: "rate", Value: st.Rate, Err: ErrSchedule,
				Reason: "the pumping rate must be a finite positive number (m³/s)"}
		}
	}

	groups, excluded, err := groupReadings(steps, d)
	if err != nil {
		return nil, err
	}
	a := &Analysis{Trend: set.Trend, Steps: make([]StepResult, ns), Excluded: excluded}
	for k := range steps {
		g := groups[k]
		end := d.Time[g[len(g)-1]]
		if k+1 < ns {
			end = steps[k+1].Start
		}
		a.Steps[k] = StepResult{Index: k, Rate: steps[k].Rate, Start: steps[k].Start, End: end, Readings: g}
	}

	// The equal duration.
	dt := set.Duration
	if dt == 0 {
		dt = math.Inf(1)
		for k, g := range groups {
			dt = math.Min(dt, d.Time[g[len(g)-1]]-steps[k].Start)
		}
	}
	for k, g := range groups {
		first, last := d.Time[g[0]]-steps[k].Start, d.Time[g[len(g)-1]]-steps[k].Start
		if dt < first {
			return nil, &Error{Step: k, Steps: ns, Reading: g[0], Field: "Duration", Value: dt, Err: ErrDuration,
				Reason: fmt.Sprintf("the step's first reading is %g s after its start, later than Δt; choose Δt ≥ %g s", first, first)}
		}
		if dt > last {
			return nil, &Error{Step: k, Steps: ns, Reading: g[len(g)-1], Field: "Duration", Value: dt, Err: ErrDuration,
				Reason: fmt.Sprintf("the step's last reading is %g s after its start, earlier than Δt; choose Δt ≤ %g s", last, last)}
		}
	}
	a.Duration = dt

	incr := make([][]term, ns) // the sensitivity of each Increment
	for k := range a.Steps {
		st := &a.Steps[k]
		st.At = st.Start + dt
		st.Observed = interpolate(d, st.Readings, st.Start, dt)
		incr[k] = interpolateTerms(d, st.Readings, st.Start, dt)
		if k > 0 {
			prev := a.Steps[k-1].Line
			st.Previous, st.PreviousErr = prev.At(st.At)
			for _, tm := range prev.terms(prev.X(st.At)) {
				incr[k] = append(incr[k], term{tm.i, -tm.c})
			}
		}
		st.Increment = st.Observed - st.Previous
		st.Drawdown = st.Increment
		if k > 0 {
			st.Drawdown += a.Steps[k-1].Drawdown
		}
		st.Specific = st.Drawdown / st.Rate
		if k+1 == ns {
			break
		}
		l, err := trendLine(steps[:k+1], set.Trend, d, st.Readings, late, conf)
		if err != nil {
			err.Step, err.Steps = k, ns
			return nil, err
		}
		st.Line = l
	}

	a.DrawdownCov = drawdownCov(incr, d)

	if set.Trend == TrendLogTime {
		a.Caveats = append(a.Caveats, "The trend of each step is extended as a straight line in the log of the time since the test began; after the first step this line bends, so the increments are approximate. The superposition-time axis avoids this.")
	}
	for _, st := range a.Steps {
		if !(st.Drawdown > 0) {
			a.Caveats = append(a.Caveats, fmt.Sprintf("Step %d: the equal-duration drawdown is %.4g m, not positive; check the readings and the schedule.", st.Index+1, st.Drawdown))
		}
		if st.Line != nil && st.Line.Slope < 0 {
			a.Caveats = append(a.Caveats, fmt.Sprintf("Step %d: the drawdown falls in the late part of the step (%.3g m per log cycle); its extension into the next step is questionable.", st.Index+1, st.Line.PerCycle))
		}
	}
	return a, nil
}

// resolve checks the settings and returns the defaulted late fraction and
// confidence level.
func (s *Settings) resolve() (late, conf float64, err error) {
	if bad(s.Duration) || s.Duration < 0 {
		return 0, 0, &Error{Step: -1, Reading: -1, Field: "Duration", Value: s.Duration, Err: ErrSetting,
			Reason: "the equal duration must be a finite number ≥ 0 (0 = the shortest step)"}
	}
	if s.Trend != TrendSuperposition && s.Trend != TrendLogTime {
		return 0, 0, &Error{Step: -1, Reading: -1, Field: "Trend", Value: float64(s.Trend), Err: ErrSetting,
			Reason: "unknown trend axis"}
	}
	late = s.Late
	if late == 0 {
		late = 0.5
	}
	if !(late > 0 && late <= 1) {
		return 0, 0, &Error{Step: -1, Reading: -1, Field: "Late", Value: s.Late, Err: ErrSetting,
			Reason: "the late fraction of a step must lie in (0, 1]"}
	}
	conf = s.Confidence
	if conf == 0 {
		conf = 0.95
	}
	if !(conf > 0 && conf < 1) {
		return 0, 0, &Error{Step: -1, Reading: -1, Field: "Confidence", Value: s.Confidence, Err: ErrSetting,
			Reason: "the confidence level must lie in (0, 1)"}
	}
	return late, conf, nil
}

// groupReadings validates the readings and assigns each one that is used
// to its step.
func groupReadings(steps []Step, d models.Data) (groups [][]int, excluded int, err error) {
	ns, n := len(steps), len(d.Time)
	lengthErr := func(what string, m int) error {
		return &Error{Step: -1, Reading: -1, Err: ErrLength, Reason: fmt.Sprintf("%d %s for %d times", m, what, n)}
	}
	if len(d.Value) != n {
		return nil, 0, lengthErr("drawdowns", len(d.Value))
	}
	if d.Weight != nil && len(d.Weight) != n {
		return nil, 0, lengthErr("weights", len(d.Weight))
	}
	if d.Exclude != nil && len(d.Exclude) != n {
		return nil, 0, lengthErr("exclusion marks", len(d.Exclude))
	}
	groups = make([][]int, ns)
	k, prev := 0, -1
	for i := 0; i < n; i++ {
		if d.Exclude != nil && d.Exclude[i] {
			excluded++
			continue
		}
		ti, si := d.Time[i], d.Value[i]
		if bad(ti) {
			return nil, 0, &Error{Step: -1, Reading: i, Field: "time", Value: ti, Err: ErrReading, Reason: "not a finite number"}
		}
		if d.Weight != nil {
			w := d.Weight[i]
			if bad(w) || w < 0 {
				return nil, 0, &Error{Step: -1, Reading: i, Field: "weight", Value: w, Err: ErrReading, Reason: "weights must be finite and not negative"}
			}
			if w == 0 {
				excluded++
				continue
			}
		}
		if bad(si) {
			return nil, 0, &Error{Step: -1, Reading: i, Field: "drawdown", Value: si, Err: ErrReading, Reason: "not a finite number"}
		}
		if prev >= 0 && !(ti > d.Time[prev]) {
			return nil, 0, &Error{Step: -1, Reading: i, Field: "time", Value: ti, Err: ErrReading,
				Reason: fmt.Sprintf("not after the previous reading (point %d at %g s): readings must be in order of time", prev, d.Time[prev])}
		}
		if !(ti > steps[0].Start) {
			return nil, 0, &Error{Step: -1, Reading: i, Field: "time", Value: ti, Err: ErrReading,
				Reason: fmt.Sprintf("at or before the start of the first step (%g s); leave the static level out or mark it excluded", steps[0].Start)}
		}
		for k+1 < ns && ti > steps[k+1].Start {
			k++
		}
		groups[k] = append(groups[k], i)
		prev = i
	}
	for k, g := range groups {
		end := "its last reading"
		if k+1 < ns {
			end = fmt.Sprintf("%g s", steps[k+1].Start)
		}
		switch {
		case len(g) == 0:
			return nil, 0, &Error{Step: k, Steps: ns, Reading: -1, Err: ErrNoReadings,
				Reason: fmt.Sprintf("the step (from %g s to %s) has no readings", steps[k].Start, end)}
		case k+1 < ns && len(g) < 3:
			return nil, 0, &Error{Step: k, Steps: ns, Reading: g[len(g)-1], Err: ErrNoReadings,
				Reason: fmt.Sprintf("the step (from %g s to %s) has %d readings; at least 3 are needed to extend its trend into the next step", steps[k].Start, end, len(g))}
		}
	}
	return groups, excluded, nil
}

// interpolate returns the drawdown at dt after start, linearly in
// ln(t − start) between the readings g around it; dt lies within their
// span.
func interpolate(d models.Data, g []int, start, dt float64) float64 {
	// The first reading at or after dt.
	j := sort.Search(len(g), func(j int) bool { return d.Time[g[j]]-start >= dt })
	if j == len(g) {
		j = len(g) - 1
	}
	tj := d.Time[g[j]] - start
	if tj == dt || j == 0 {
		return d.Value[g[j]]
	}
	ti := d.Time[g[j-1]] - start
	f := math.Log(dt/ti) / math.Log(tj/ti)
	return d.Value[g[j-1]] + f*(d.Value[g[j]]-d.Value[g[j-1]])
}

// interpolateTerms returns the sensitivity of interpolate's value to the
// readings it uses.
func interpolateTerms(d models.Data, g []int, start, dt float64) []term {
	j := sort.Search(len(g), func(j int) bool { return d.Time[g[j]]-start >= dt })
	if j == len(g) {
		j = len(g) - 1
	}
	tj := d.Time[g[j]] - start
	if tj == dt || j == 0 {
		return []term{{g[j], 1}}
	}
	ti := d.Time[g[j-1]] - start
	f := math.Log(dt/ti) / math.Log(tj/ti)
	return []term{{g[j-1], 1 - f}, {g[j], f}}
}

// drawdownCov returns the covariance of the summed increments
// s_w,k = Σ_{j≤k} Δs_j for readings of variance 1/weight, from the
// sensitivities incr of the increments: V_kl = Σ_{j≤k} Σ_{m≤l} C_jm with
// C_jm = Σᵢ c_ij·c_im/wᵢ the covariance of the increments.
func drawdownCov(incr [][]term, d models.Data) *mat.SymDense {
	ns := len(incr)
	// Each increment's terms by reading, a reading once.
	byIdx := make([][]term, ns)
	for j, ts := range incr {
		ts = append([]term(nil), ts...)
		sort.Slice(ts, func(a, b int) bool { return ts[a].i < ts[b].i })
		out := ts[:0]
		for _, tm := range ts {
			if n := len(out); n > 0 && out[n-1].i == tm.i {
				out[n-1].c += tm.c
				continue
			}
			out = append(out, tm)
		}
		byIdx[j] = out
	}
	c := make([]float64, ns*ns)
	for j := 0; j < ns; j++ {
		for m := j; m < ns; m++ {
			// Merge the two sorted lists.
			a, b := byIdx[j], byIdx[m]
			s := 0.0
			for p, q := 0, 0; p < len(a) && q < len(b); {
				switch {
				case a[p].i < b[q].i:
					p++
				case a[p].i > b[q].i:
					q++
				default:
					s += a[p].c * b[q].c / weight(d, a[p].i)
					p++
					q++
				}
			}
			c[j*ns+m], c[m*ns+j] = s, s
		}
	}
	// V = L·C·Lᵀ, L the lower triangle of ones: running sums of the rows,
	// then of the columns.
	for j := 0; j < ns; j++ {
		for m := 1; m < ns; m++ {
			c[j*ns+m] += c[j*ns+m-1]
		}
	}
	for j := 1; j < ns; j++ {
		for m := 0; m < ns; m++ {
			c[j*ns+m] += c[(j-1)*ns+m]
		}
	}
	return mat.NewSymDense(ns, c)
}

// trendLine fits the trend of the last step of hist to its late readings g.
func trendLine(hist []Step, axis Trend, d models.Data, g []int, late, conf float64) (*TrendLine, *Error) {
	k := len(hist) - 1
	start := hist[k].Start
	l := &TrendLine{Axis: axis, origin: hist[0].Start}
	if axis == TrendSuperposition {
		l.starts = make([]float64, k+1)
		l.rates = make([]float64, k+1)
		for i, st := range hist {
			l.starts[i], l.rates[i] = st.Start, st.Rate
		}
	}
	lf, ll := math.Log(d.Time[g[0]]-start), math.Log(d.Time[g[len(g)-1]]-start)
	cut := ll - late*(ll-lf)
	from := len(g)
	for from > 0 && math.Log(d.Time[g[from-1]]-start) >= cut {
		from--
	}
	if len(g)-from < 3 {
		from = len(g) - 3
	}
	use := g[from:]
	l.Readings = use
	l.From, l.To = d.Time[use[0]], d.Time[use[len(use)-1]]

	x := make([]float64, len(use))
	var sw, sx, sy float64
	for m, i := range use {
		x[m] = l.X(d.Time[i])
		w := weight(d, i)
		sw += w
		sx += w * x[m]
		sy += w * d.Value[i]
	}
	xm, ym := sx/sw, sy/sw
	var sxx, sxy float64
	for m, i := range use {
		w := weight(d, i)
		sxx += w * (x[m] - xm) * (x[m] - xm)
		sxy += w * (x[m] - xm) * (d.Value[i] - ym)
	}
	if !(sxx > 0) || bad(sxx) {
		return nil, &Error{Reading: use[0], Field: "time", Value: d.Time[use[0]], Err: ErrNoTrend,
			Reason: "the late readings of the step do not spread in time, so no trend line can be drawn"}
	}
	l.Slope = sxy / sxx
	l.Intercept = ym - l.Slope*xm
	l.x, l.sw, l.xm, l.sxx = x, sw, xm, sxx
	l.w = make([]float64, len(use))
	for m, i := range use {
		l.w[m] = weight(d, i)
	}
	l.PerCycle = l.Slope * math.Ln10
	var ssr float64
	for m, i := range use {
		r := d.Value[i] - l.Intercept - l.Slope*x[m]
		ssr += weight(d, i) * r * r
	}
	n := len(use)
	l.RMSE = math.Sqrt(ssr / float64(n))
	l.InterceptErr, l.SlopeErr, l.Cov, l.TValue = math.NaN(), math.NaN(), math.NaN(), math.NaN()
	if dof := n - 2; dof > 0 {
		s2 := ssr / float64(dof)
		l.SlopeErr = math.Sqrt(s2 / sxx)
		l.InterceptErr = math.Sqrt(s2 * (1/sw + xm*xm/sxx))
		l.Cov = -xm * s2 / sxx
		l.TValue = distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(dof)}.Quantile(0.5 + conf/2)
	}
	return l, nil
}

func weight(d models.Data, i int) float64 {
	if d.Weight == nil {
		return 1
	}
	return d.Weight[i]
}
