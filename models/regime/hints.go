package regime

import (
	"cmp"
	"fmt"
	"math"
	"sort"

	"fieldfit/models/diagnostic"
)

// Caution is the notice that goes with every result of this package on
// screen and in reports.
const Caution = "Preliminary field interpretation: a submission to a regulator must be prepared or reviewed by a licensed hydrogeologist (or the equivalent licensed professional) and follow the local rules and codes."

// Kind is the flow regime or boundary a hint suggests.
type Kind int

const (
	// UnitSlope: drawdown and derivative rise in proportion to time
	// (wellbore storage).
	UnitSlope Kind = iota + 1
	// Flat: the derivative is flat (infinite-acting radial flow).
	Flat
	// Falling: the derivative falls below its flat level to the end
	// (leakage or a recharge boundary).
	Falling
	// Doubling: the derivative rises to about twice its flat level (one
	// no-flow boundary).
	Doubling
	// Rising: the derivative rises above its flat level to the end
	// without reaching about twice it.
	Rising
)

func (k Kind) String() string {
	switch k {
	case UnitSlope:
		return "unit slope"
	case Flat:
		return "flat derivative"
	case Falling:
		return "falling derivative"
	case Doubling:
		return "doubling derivative"
	case Rising:
		return "rising derivative"
	}
	return fmt.Sprintf("Kind(%d)", int(k))
}

// Hint is one suggested flow regime with the readings it rests on.
type Hint struct {
	// Kind is the pattern found.
	Kind Kind
	// First and Last are the indices of the first and last reading the
	// hint covers (inclusive); From and To are their times, s, and Cycles
	// = log₁₀(To/From) the span in log cycles.
	First, Last int
	From, To    float64
	Cycles      float64

	// Slope and DerivSlope are the median log–log slopes of the drawdown
	// and of the derivative over the range (UnitSlope; NaN otherwise).
	Slope, DerivSlope float64
	// Level is the derivative ds/d ln t of a flat stretch, m (the median
	// over the flatter half of its readings, see Diagnose):
	// the hint's own stretch for Flat, the flat stretch before the change
	// for Falling, Doubling and Rising (NaN for UnitSlope, and for Falling
	// with no flat stretch before it, where it is the peak derivative).
	Level float64
	// Low and High are the least and largest derivative over a Flat
	// stretch, m (High·(1 − FlatTol) ≤ Low·(1 + FlatTol)), and Deviation
	// the largest |D/Level − 1| over it.
	Low, High, Deviation float64
	// T = Q/(4π·Level) is the transmissivity a Flat stretch implies,
	// m²/s; NaN when Settings.Rate is 0 or for other kinds.
	T float64
	// Late is the derivative the change leads to, m: the median of a
	// second flat stretch (Doubling) or of the last readings (Falling,
	// Rising); Ratio = Late/Level.
	Late, Ratio float64

	// Text states the suggestion and its reason in a plain sentence.
	Text string
}

// Settings control Diagnose. The zero value works, and a nil *Settings
// means the zero value. Tolerances of zero take their defaults, which are
// common practice (no published source).
type Settings struct {
	// Rate is the constant pumping rate Q, m³/s, used for the T of a flat
	// derivative. If Rate is 0 no T is given.
	Rate float64

	// Window is the smoothing window of the derivative in natural-log
	// units (diagnostic.Settings.Window). If Window is 0 it is defaulted
	// to diagnostic.DefaultWindow (0.2).
	Window float64

	// SlopeTol is the largest departure of both log–log slopes from 1 for
	// a unit slope. If SlopeTol is 0 it is defaulted to 0.15.
	SlopeTol float64

	// FlatTol is the relative band of a flat derivative: every value lies
	// within ±FlatTol of one level. If FlatTol is 0 it is defaulted to
	// 0.10 (±10 %).
	FlatTol float64

	// MinCycles is the least span, in log₁₀ cycles of time, of any
	// pattern (and at least 3 readings). If MinCycles is 0 it is
	// defaulted to 0.5.
	MinCycles float64

	// DoublingTol is the relative tolerance on the factor 2 of a doubling:
	// the later level lies within 2·(1 ± DoublingTol) of the first. If
	// DoublingTol is 0 it is defaulted to 0.15 (1.7 to 2.3 times).
	DoublingTol float64

	// ChangeTol is how far the derivative must move from its flat level,
	// relatively, to count as falling or rising. If ChangeTol is 0 it is
	// defaulted to 0.2 (below 80 % or above 120 %).
	ChangeTol float64
}

type config struct {
	rate, window, slopeTol, flatTol, minCycles, doublingTol, changeTol float64
}

func (s *Settings) resolve() (config, error) {
	var z Settings
	if s != nil {
		z = *s
	}
	c := config{rate: z.Rate, window: z.Window}
	if bad(z.Rate) || z.Rate < 0 {
		return c, settingErr("Rate", z.Rate, "the pumping rate must be a finite number ≥ 0 (0 = no transmissivity)")
	}
	if bad(z.Window) || z.Window < 0 {
		return c, settingErr("Window", z.Window, "the smoothing window must be a finite number ≥ 0")
	}
	pick := func(field string, v, def, max float64) (float64, error) {
		if v == 0 {
			return def, nil
		}
		if bad(v) || !(v > 0 && v < max) {
			return 0, settingErr(field, v, fmt.Sprintf("must lie in (0, %g)", max))
		}
		return v, nil
	}
	var err error
	if c.slopeTol, err = pick("SlopeTol", z.SlopeTol, 0.15, 1); err != nil {
		return c, err
	}
	if c.flatTol, err = pick("FlatTol", z.FlatTol, 0.10, 1); err != nil {
		return c, err
	}
	if c.minCycles, err = pick("MinCycles", z.MinCycles, 0.5, 100); err != nil {
		return c, err
	}
	if c.doublingTol, err = pick("DoublingTol", z.DoublingTol, 0.15, 0.5); err != nil {
		return c, err
	}
	if c.changeTol, err = pick("ChangeTol", z.ChangeTol, 0.2, 1); err != nil {
		return c, err
	}
	return c, nil
}

// Diagnosis is the outcome of Diagnose.
type Diagnosis struct {
	// Derivative is the log-derivative of the drawdown.
	Derivative *diagnostic.Result
	// Slope is the log–log slope of the drawdown at each reading,
	// d ln s/d ln t = D/s (NaN where s ≤ 0).
	Slope []float64
	// DerivSlope is the log–log slope of the derivative, d ln D/d ln t,
	// by the derivative's own stencil (NaN where a value used is ≤ 0).
	// Both slopes are biased at the ends of the record, where the
	// derivative takes one-sided differences.
	DerivSlope []float64
	// Hints are the patterns found, in order of time.
	Hints []Hint
	// Notes are plain sentences about what was not found, or why.
	Notes []string
}

// minPoints is the least number of readings of any pattern.
const minPoints = 3

func bad(v float64) bool { return math.IsNaN(v) || math.IsInf(v, 0) }

// Diagnose looks for flow-regime patterns in the drawdown s at the times t
// (s since pumping began, strictly increasing; s in m) and its
// log-derivative (package diagnostic, Bourdet et al. 1989):
//
//   - UnitSlope: a stretch over which both log–log slopes, of s (D/s) and
//     of D, lie within ±SlopeTol of 1;
//   - Flat: a stretch over which every D lies within ±FlatTol of one level;
//     the longest such stretch is taken first, then the longest of the
//     rest, and so on. The level reported is the median D over the flatter
//     half of the stretch's readings (smallest |d ln D/d ln t|), so that
//     its ends, where the derivative approaches or leaves the level, weigh
//     less;
//   - Doubling: a later flat stretch at 2·(1 ± DoublingTol) times the
//     first (with any stretches between at about the first's level), or
//     readings from some time to the end whose derivative lies above
//     (1 + ChangeTol) times the last flat level and whose last values
//     (the median of the last 5) are about twice the first;
//   - Rising: such a rise to the end that is not about twice;
//   - Falling: readings from some time to the end whose derivative lies
//     below (1 − ChangeTol) times the last flat level (or, with no flat
//     stretch, below that fraction of the peak derivative).
//
// Every pattern must span MinCycles log cycles and 3 readings. The first
// flat stretch in time is taken as the radial-flow level that the later
// patterns are measured against; a hump of the derivative that stays
// within the band long enough (for instance after wellbore storage, or
// the peak of a strongly leaky response) counts as a flat stretch too,
// and the hint says so only through its numbers — look at the plot. The
// inputs are not modified. Errors in the readings are the *diagnostic.InputError
// values of diagnostic.Derivative, naming the index; bad settings are
// *Error values.
func Diagnose(t, s []float64, set *Settings) (*Diagnosis, error) {
	cfg, err := set.resolve()
	if err != nil {
		return nil, err
	}
	der, err := diagnostic.Derivative(t, s, &diagnostic.Settings{Window: cfg.window})
	if err != nil {
		return nil, err
	}
	n := len(t)
	d := der.D
	dg := &Diagnosis{Derivative: der, Slope: make([]float64, n), DerivSlope: make([]float64, n)}
	lt, ld := make([]float64, n), make([]float64, n)
	for i := range t {
		lt[i] = math.Log(t[i])
		ld[i] = math.NaN()
		if d[i] > 0 {
			ld[i] = math.Log(d[i])
		}
	}
	for i := range t {
		dg.Slope[i] = math.NaN()
		if s[i] > 0 {
			dg.Slope[i] = d[i] / s[i]
		}
		dg.DerivSlope[i] = logSlope(lt, ld, der.Left[i], i, der.Right[i])
	}

	dg.Hints = append(dg.Hints, unitSlopes(t, dg, cfg)...)
	runs := flatRuns(t, lt, d, cfg.flatTol, cfg.minCycles, 0, n)
	for i := range runs {
		runs[i].setLevel(d, dg.DerivSlope)
	}
	if len(runs) > 0 {
		// radial stays true while every later stretch lies at about the
		// first one's level (a flat derivative broken by a few readings).
		first, last, radial := runs[0], runs[0], true
		dg.Hints = append(dg.Hints, flatHint(t, first, first, cfg))
		for _, r := range runs[1:] {
			rho := r.level / first.level
			if radial && math.Abs(rho-2) <= 2*cfg.doublingTol {
				dg.Hints = append(dg.Hints, doublingHint(t, first, last.last+1, r.last, r.level, true, cfg))
			} else {
				dg.Hints = append(dg.Hints, flatHint(t, r, first, cfg))
			}
			radial = radial && math.Abs(rho-1) <= 2*cfg.flatTol
			last = r
		}
		if h, ok := tailHint(t, d, last, first, radial, cfg); ok {
			dg.Hints = append(dg.Hints, h)
		}
	} else if h, ok := fallFromPeak(t, d, cfg); ok {
		dg.Hints = append(dg.Hints, h)
	}
	sort.SliceStable(dg.Hints, func(a, b int) bool { return dg.Hints[a].First < dg.Hints[b].First })

	span := math.Log10(t[n-1] / t[0])
	if len(runs) == 0 {
		dg.Notes = append(dg.Notes, fmt.Sprintf(
			"No flat derivative (within ±%.0f %% over %.2g log cycles) was found, so no transmissivity from radial flow can be given yet.",
			100*cfg.flatTol, cfg.minCycles))
	}
	if span < cfg.minCycles {
		dg.Notes = append(dg.Notes, fmt.Sprintf(
			"The readings span only %.2f of a log cycle; every pattern needs %.2g.", span, cfg.minCycles))
	}
	return dg, nil
}

// logSlope is the stencil of diagnostic.Derivative applied to y = ln D
// over x = ln t at i with neighbours j ≤ i ≤ k; NaN where a y is NaN.
func logSlope(x, y []float64, j, i, k int) float64 {
	if j == k || math.IsNaN(y[j]) || math.IsNaN(y[i]) || math.IsNaN(y[k]) {
		return math.NaN()
	}
	switch {
	case j == i:
		return (y[k] - y[i]) / (x[k] - x[i])
	case k == i:
		return (y[i] - y[j]) / (x[i] - x[j])
	}
	d1, d2 := x[i]-x[j], x[k]-x[i]
	m1, m2 := (y[i]-y[j])/d1, (y[k]-y[i])/d2
	return (m1*d2 + m2*d1) / (d1 + d2)
}

func cycles(t []float64, i, j int) float64 { return math.Log10(t[j] / t[i]) }

func median(v []float64) float64 {
	if len(v) == 0 {
		return math.NaN()
	}
	c := append([]float64(nil), v...)
	sort.Float64s(c)
	m := len(c) / 2
	if len(c)%2 == 1 {
		return c[m]
	}
	return (c[m-1] + c[m]) / 2
}

// unitSlopes finds the stretches where both log–log slopes are near 1.
func unitSlopes(t []float64, dg *Diagnosis, cfg config) []Hint {
	var hs []Hint
	n := len(t)
	ok := func(i int) bool {
		return math.Abs(dg.Slope[i]-1) <= cfg.slopeTol && math.Abs(dg.DerivSlope[i]-1) <= cfg.slopeTol
	}
	for i := 0; i < n; {
		if !ok(i) {
			i++
			continue
		}
		j := i
		for j+1 < n && ok(j+1) {
			j++
		}
		if j-i+1 >= minPoints && cycles(t, i, j) >= cfg.minCycles {
			h := span(t, UnitSlope, i, j)
			h.Slope = median(dg.Slope[i : j+1])
			h.DerivSlope = median(dg.DerivSlope[i : j+1])
			h.Text = fmt.Sprintf("Possible wellbore storage: from %s to %s (%.1f log cycles) the drawdown and its derivative both rise in proportion to time (median log–log slopes %.2f and %.2f, within ±%.2f of 1).",
				fmtTime(h.From), fmtTime(h.To), h.Cycles, h.Slope, h.DerivSlope, cfg.slopeTol)
			hs = append(hs, h)
		}
		i = j + 1
	}
	return hs
}

// span returns a hint of the kind covering readings i…j, with the numbers
// not yet known set to NaN.
func span(t []float64, k Kind, i, j int) Hint {
	nan := math.NaN()
	return Hint{Kind: k, First: i, Last: j, From: t[i], To: t[j], Cycles: cycles(t, i, j),
		Slope: nan, DerivSlope: nan, Level: nan, Low: nan, High: nan, Deviation: nan, T: nan, Late: nan, Ratio: nan}
}

// run is a flat stretch of the derivative.
type run struct {
	first, last        int
	level, dev, lo, hi float64
}

// flatRuns finds the stretches of readings in [from, to) whose derivative
// is positive and lies within ±tol of one level (max·(1 − tol) ≤
// min·(1 + tol)) over at least minCycles log cycles and minPoints
// readings, longest first: it takes the longest such stretch (in log
// time; the earliest of equally long ones), then the longest that does
// not overlap it, and so on, and returns them in order of time. Taking the longest first keeps a stretch from
// starting part-way up a rise when a longer level follows.
func flatRuns(t, lt, d []float64, tol, minCycles float64, from, to int) []run {
	// end[i] is the exclusive end of the longest flat stretch from i; it
	// never decreases with i (among positive values), so one pass with
	// monotone queues of the extremes finds them all in O(n).
	end := make([]int, to-from)
	var maxQ, minQ []int
	j := from
	fits := func(v float64) bool {
		hi, lo := v, v
		if len(maxQ) > 0 {
			hi = math.Max(hi, d[maxQ[0]])
			lo = math.Min(lo, d[minQ[0]])
		}
		return hi*(1-tol) <= lo*(1+tol)
	}
	for i := from; i < to; i++ {
		if j < i {
			j = i
			maxQ, minQ = maxQ[:0], minQ[:0]
		}
		for len(maxQ) > 0 && maxQ[0] < i {
			maxQ = maxQ[1:]
		}
		for len(minQ) > 0 && minQ[0] < i {
			minQ = minQ[1:]
		}
		for j < to && d[j] > 0 && !math.IsInf(d[j], 1) && fits(d[j]) {
			for len(maxQ) > 0 && d[maxQ[len(maxQ)-1]] <= d[j] {
				maxQ = maxQ[:len(maxQ)-1]
			}
			maxQ = append(maxQ, j)
			for len(minQ) > 0 && d[minQ[len(minQ)-1]] >= d[j] {
				minQ = minQ[:len(minQ)-1]
			}
			minQ = append(minQ, j)
			j++
		}
		end[i-from] = j
	}

	used := make([]bool, to-from)
	var runs []run
	for {
		bestI, bestE, bestSpan := -1, -1, -1.0
		next := to // the first used index after i
		for i := to - 1; i >= from; i-- {
			if used[i-from] {
				next = i
				continue
			}
			e := min(end[i-from], next)
			if e-i < minPoints {
				continue
			}
			// Spans equal to rounding (common on a log-spaced grid) go
			// to the earlier stretch.
			if c := (lt[e-1] - lt[i]) / math.Ln10; c >= minCycles && c >= bestSpan-1e-9 {
				bestI, bestE, bestSpan = i, e, math.Max(c, bestSpan)
			}
		}
		if bestI < 0 {
			break
		}
		for k := bestI; k < bestE; k++ {
			used[k-from] = true
		}
		runs = append(runs, run{first: bestI, last: bestE - 1})
	}
	sort.Slice(runs, func(a, b int) bool { return runs[a].first < runs[b].first })
	return runs
}

// setLevel sets the level of the stretch to the median derivative over
// the flatter half of its readings — those with the smallest |log–log
// slope| of the derivative — so that the ends of the stretch, where the
// derivative still approaches its level or already leaves it, weigh less;
// and dev to the largest relative departure from that level.
func (r *run) setLevel(d, slope []float64) {
	type pair struct{ key, d float64 }
	ps := make([]pair, 0, r.last-r.first+1)
	for i := r.first; i <= r.last; i++ {
		k := math.Abs(slope[i])
		if math.IsNaN(k) {
			k = math.Inf(1)
		}
		ps = append(ps, pair{k, d[i]})
	}
	// sort.Slice, already linked, rather than a generic sort of pair:
	// the order is total (key, then d), so the result is the same.
	sort.Slice(ps, func(a, b int) bool {
		if c := cmp.Compare(ps[a].key, ps[b].key); c != 0 {
			return c < 0
		}
		return cmp.Compare(ps[a].d, ps[b].d) < 0
	})
	half := make([]float64, (len(ps)+1)/2)
	for k := range half {
		half[k] = ps[k].d
	}
	r.level = median(half)
	r.dev, r.lo, r.hi = 0, math.Inf(1), math.Inf(-1)
	for i := r.first; i <= r.last; i++ {
		r.dev = math.Max(r.dev, math.Abs(d[i]/r.level-1))
		r.lo, r.hi = math.Min(r.lo, d[i]), math.Max(r.hi, d[i])
	}
}

// flatHint describes the flat stretch r; first is the first flat stretch.
func flatHint(t []float64, r, first run, cfg config) Hint {
	h := span(t, Flat, r.first, r.last)
	h.Level, h.Deviation, h.Low, h.High = r.level, r.dev, r.lo, r.hi
	msg := fmt.Sprintf("Possible infinite-acting radial flow: from %s to %s (%.1f log cycles) the derivative stays within a ±%.0f %% band (%.4g to %.4g m), its flatter half at %.4g m",
		fmtTime(h.From), fmtTime(h.To), h.Cycles, 100*cfg.flatTol, h.Low, h.High, h.Level)
	if r != first {
		h.Ratio = r.level / first.level
		msg += fmt.Sprintf(", %.2f times the level of the first flat stretch", h.Ratio)
	}
	if cfg.rate > 0 {
		h.T = cfg.rate / (4 * math.Pi * h.Level)
		msg += fmt.Sprintf("; with Q = %.4g m³/s this implies T = Q/(4π·ds/d ln t) = %.3e m²/s", cfg.rate, h.T)
	}
	h.Text = msg + "."
	return h
}

// doublingHint describes a rise from the flat stretch ref over readings
// i…j to the level late; flat says whether late is a flat stretch.
func doublingHint(t []float64, ref run, i, j int, late float64, flat bool, cfg config) Hint {
	h := span(t, Doubling, i, j)
	h.Level, h.Late, h.Ratio = ref.level, late, late/ref.level
	how := "reaches"
	if flat {
		how = "settles at"
	}
	h.Text = fmt.Sprintf("Possible no-flow boundary: after the flat stretch at %.4g m, from %s to %s the derivative rises and %s %.4g m, %.2f times that level; one straight no-flow boundary doubles it.",
		h.Level, fmtTime(h.From), fmtTime(h.To), how, h.Late, h.Ratio)
	return h
}

// tailHint looks at the readings after the flat stretch last for a rise
// or a fall that lasts to the end; first is the first flat stretch, and
// radial says whether every stretch so far lies at about its level.
func tailHint(t, d []float64, last, first run, radial bool, cfg config) (Hint, bool) {
	n := len(t)
	ref := last.level
	suffix := func(in func(v float64) bool) int {
		k := n
		for k > last.last+1 && in(d[k-1]) {
			k--
		}
		return k
	}
	long := func(k int) bool { return n-k >= minPoints && cycles(t, k, n-1) >= cfg.minCycles }
	lateOf := func(k int) float64 { return median(d[max(k, n-5):n]) }

	if k := suffix(func(v float64) bool { return v < (1-cfg.changeTol)*ref }); k < n && long(k) {
		h := span(t, Falling, k, n-1)
		h.Level, h.Late = ref, lateOf(k)
		h.Ratio = h.Late / ref
		h.Text = fmt.Sprintf("Possible leakage or a recharge boundary: from %s to the last reading at %s (%.1f log cycles) the derivative stays below %.0f %% of its flat level %.4g m, ending near %.4g m (%.2f of it).",
			fmtTime(h.From), fmtTime(h.To), h.Cycles, 100*(1-cfg.changeTol), ref, h.Late, h.Ratio)
		return h, true
	}
	if k := suffix(func(v float64) bool { return v > (1+cfg.changeTol)*ref }); k < n && long(k) {
		late := lateOf(k)
		if radial && math.Abs(late/first.level-2) <= 2*cfg.doublingTol {
			return doublingHint(t, first, k, n-1, late, false, cfg), true
		}
		h := span(t, Rising, k, n-1)
		h.Level, h.Late = ref, late
		h.Ratio = late / ref
		h.Text = fmt.Sprintf("The derivative rises above its flat level %.4g m from %s to the last reading at %s, to about %.4g m (%.2f times): perhaps the approach of a no-flow boundary, which would double it; later readings will tell.",
			ref, fmtTime(h.From), fmtTime(h.To), h.Late, h.Ratio)
		return h, true
	}
	return Hint{}, false
}

// fallFromPeak looks, when no flat stretch was found, for a derivative that
// falls from its peak (the largest 5-point running median) below
// (1 − ChangeTol) of it to the end.
func fallFromPeak(t, d []float64, cfg config) (Hint, bool) {
	n := len(t)
	peak, at := math.Inf(-1), -1
	for i := range d {
		m := median(d[max(0, i-2):min(n, i+3)])
		if m > peak {
			peak, at = m, i
		}
	}
	if !(peak > 0) {
		return Hint{}, false
	}
	k := n
	for k > at+1 && d[k-1] < (1-cfg.changeTol)*peak {
		k--
	}
	if k == n || n-k < minPoints || cycles(t, k, n-1) < cfg.minCycles {
		return Hint{}, false
	}
	h := span(t, Falling, k, n-1)
	h.Late = median(d[max(k, n-5):n])
	h.Ratio = h.Late / peak
	h.Text = fmt.Sprintf("Possible leakage or a recharge boundary: with no flat stretch before it, from %s to the last reading at %s (%.1f log cycles) the derivative stays below %.0f %% of its peak %.4g m (at %s), ending near %.4g m (%.2f of it).",
		fmtTime(h.From), fmtTime(h.To), h.Cycles, 100*(1-cfg.changeTol), peak, fmtTime(t[at]), h.Late, h.Ratio)
	return h, true
}

// fmtTime formats a time in seconds for the hint sentences.
func fmtTime(s float64) string { return fmt.Sprintf("%.4g s", s) }
