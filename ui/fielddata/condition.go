package fielddata

import (
	"fmt"
	"math"
	"sort"
	"strconv"
)

// Conditioning holds the steps that turn a record of readings into
// drawdown: each a field that the project stores with the test. The zero
// value applies nothing (the readings become levels, one pumping
// segment from the first reading, no drawdown); each step is undone by
// clearing its field. Apply runs the steps in this order: sort by time,
// barometric compensation, conversion to level, barometric efficiency,
// split at Start and Stop, trend removal, static level and drawdown,
// thinning; the rate schedule is checked against Start and Stop.
type Conditioning struct {
	// Start is when the pump started (s, on the record's time axis: Unix
	// seconds for clock times, see UnixSeconds); readings before it form
	// the antecedent series. nil means the first reading.
	Start *float64 `json:"start,omitempty"`
	// Stop is when the pump stopped; readings after it form the recovery
	// series. nil means the pump ran past the last reading.
	Stop *float64 `json:"stop,omitempty"`
	// Baro subtracts a barometric record from an unvented pressure
	// record. nil: not applied.
	Baro *BaroCompensation `json:"baro,omitempty"`
	// Efficiency corrects the levels for the aquifer's barometric
	// efficiency, with the barometric record. nil: not applied.
	Efficiency *BaroEfficiency `json:"efficiency,omitempty"`
	// Trend removes a linear trend fitted to the antecedent readings and
	// extrapolated. nil: not applied.
	Trend *Trend `json:"trend,omitempty"`
	// Static says how the static level is found; drawdown is computed
	// only with it. nil: no drawdown.
	Static *Static `json:"static,omitempty"`
	// Thin thins the pumping and recovery readings log-spaced (the fit
	// uses the thinned readings, the plots may show all). nil: not
	// applied.
	Thin *Thinning `json:"thin,omitempty"`
	// Rates is the pumping-rate schedule; nil: none given.
	Rates Schedule `json:"rates,omitempty"`
}

// BaroCompensation subtracts a barometric logger's pressure from an
// unvented logger's: h = h_total − h_baro·ρ_baro/ρ_water, the barometric
// record aligned to the water record's times by linear interpolation.
type BaroCompensation struct {
	// Record names the barometric record in the project (for the
	// screen; Apply takes the series itself). "" is allowed.
	Record string `json:"record,omitempty"`
	// Shift (s) is added to the barometric times before alignment, for
	// logger clocks that disagree; 0: none.
	Shift float64 `json:"shift,omitempty"`
	// DropUncovered leaves out the water readings outside the
	// barometric record (they are counted in the notes); false uses the
	// nearest barometric reading for them, with a note.
	DropUncovered bool `json:"dropUncovered,omitempty"`
}

// BaroEfficiency corrects a level record for the barometric efficiency
// BE of a confined aquifer (Jacob 1940): L_c(t) = L(t) + BE·(B(t) − B(t₀)),
// B the barometric pressure as head of water, t₀ the pumping start. It
// uses the barometric record and the Shift of Baro, if set.
type BaroEfficiency struct {
	// BE is the barometric efficiency, 0 to 1.
	BE float64 `json:"be"`
}

// Trend removes a linear trend of the level before pumping: the line
// L = a + b·(t − t₀) is fitted by least squares to the antecedent
// readings and b·(t − t₀) subtracted from every reading.
type Trend struct {
	// Window (s) limits the fit to the antecedent readings within this
	// time before the pumping start; 0 means all of them.
	Window float64 `json:"window,omitempty"`
}

// Static says how the static (pre-pumping) level is found.
type Static struct {
	// Typed, when true, takes Value; otherwise the static level is the
	// mean of the antecedent readings (after trend removal, which makes it
	// the trend line's level at the pumping start).
	Typed bool `json:"typed,omitempty"`
	// Value is the static level in the record's own quantity, m: a depth
	// below the measuring point for depth records, a level above the
	// datum for level records, the head above the sensor for pressure
	// records.
	Value float64 `json:"value,omitempty"`
}

// Thinning keeps readings log-spaced (see ThinLog).
type Thinning struct {
	// PerCycle is the number of readings per log cycle of time; 0 means
	// DefaultPerCycle (20).
	PerCycle int `json:"perCycle,omitempty"`
}

// Check reports the first setting that is out of range.
func (c Conditioning) Check() error {
	num := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	finite := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
	if c.Start != nil && !finite(*c.Start) {
		return settingErr(ErrSetting, "start", num(*c.Start), "not a finite time")
	}
	if c.Stop != nil && !finite(*c.Stop) {
		return settingErr(ErrSetting, "stop", num(*c.Stop), "not a finite time")
	}
	if c.Start != nil && c.Stop != nil && !(*c.Stop > *c.Start) {
		return settingErr(ErrSetting, "stop", num(*c.Stop), "the pump must stop after it started (%s)", num(*c.Start))
	}
	if c.Baro != nil && !finite(c.Baro.Shift) {
		return settingErr(ErrSetting, "baro.shift", num(c.Baro.Shift), "not a finite time")
	}
	if c.Efficiency != nil && !(c.Efficiency.BE >= 0 && c.Efficiency.BE <= 1) {
		return settingErr(ErrSetting, "efficiency.be", num(c.Efficiency.BE), "a barometric efficiency lies between 0 and 1")
	}
	if c.Trend != nil && !(c.Trend.Window >= 0 && finite(c.Trend.Window)) {
		return settingErr(ErrSetting, "trend.window", num(c.Trend.Window), "a window is a time of 0 s or more")
	}
	if c.Static != nil && c.Static.Typed && !finite(c.Static.Value) {
		return settingErr(ErrSetting, "static.value", num(c.Static.Value), "not a finite level")
	}
	if c.Thin != nil && (c.Thin.PerCycle < 0 || c.Thin.PerCycle > 1000) {
		return settingErr(ErrSetting, "thin.perCycle", strconv.Itoa(c.Thin.PerCycle), "1 to 1000 readings per log cycle (0 for the default 20)")
	}
	dur := math.Inf(1)
	if c.Stop != nil && c.Start != nil {
		dur = *c.Stop - *c.Start
	}
	return c.Rates.Check(dur)
}

// Segment is a part of a conditioned record: the readings before pumping,
// during pumping, or of recovery.
type Segment struct {
	// Time (s) is on the record's time axis.
	Time []float64
	// Elapsed (s) is the time since pumping started for the antecedent
	// (negative) and pumping segments, and since the pump stopped for
	// recovery (t′; t = Time − Result.Start).
	Elapsed []float64
	// Level (m, up positive) is the conditioned water level: the level
	// above the datum, minus the depth below the measuring point, or the
	// head above the sensor.
	Level []float64
	// Drawdown (m) is static level − Level, nil without Static: for the
	// recovery segment the residual drawdown s′.
	Drawdown []float64
	// Row holds each reading's line in the file, when known.
	Row []int32
	// Keep lists the readings that thinning kept (indices, increasing);
	// nil without thinning.
	Keep []int
}

// Len returns the number of readings.
func (s Segment) Len() int { return len(s.Time) }

// Kept returns the number of readings left after thinning.
func (s Segment) Kept() int {
	if s.Keep == nil {
		return len(s.Time)
	}
	return len(s.Keep)
}

// Thinned returns the readings that thinning kept (s itself without
// thinning), in new slices.
func (s Segment) Thinned() Segment {
	if s.Keep == nil {
		return s
	}
	pick := func(v []float64) []float64 {
		if v == nil {
			return nil
		}
		out := make([]float64, len(s.Keep))
		for i, k := range s.Keep {
			out[i] = v[k]
		}
		return out
	}
	t := Segment{Time: pick(s.Time), Elapsed: pick(s.Elapsed), Level: pick(s.Level), Drawdown: pick(s.Drawdown)}
	if s.Row != nil {
		t.Row = make([]int32, len(s.Keep))
		for i, k := range s.Keep {
			t.Row[i] = s.Row[k]
		}
	}
	return t
}

// TrendFit is the trend removed.
type TrendFit struct {
	// Slope is the level's rise before pumping, m/s; Level the trend
	// line's level at the pumping start, m.
	Slope, Level float64
	// N is the number of antecedent readings fitted.
	N int
}

// Result is a conditioned record.
type Result struct {
	Clock bool
	// Start is the pumping start used (s, on the time axis); Stop the
	// stop when HasStop.
	Start, Stop float64
	HasStop     bool
	Antecedent  Segment
	Pumping     Segment
	Recovery    Segment
	// Static is the static level as a level (m, up positive) when
	// HasStatic.
	Static    float64
	HasStatic bool
	// Trend is the trend removed, nil without Trend.
	Trend *TrendFit
	// Coverage is how the barometric record covers the water record,
	// nil without Baro or Efficiency.
	Coverage *Coverage
	// Dropped counts the readings left out because no barometric reading
	// covers them (BaroCompensation.DropUncovered).
	Dropped int
	// Sorted counts the readings that were out of time order and were
	// put in order.
	Sorted int
	// Rates is the checked rate schedule.
	Rates Schedule
	// Notes say, in sentences for the user, what the steps did and
	// what to check.
	Notes []string
}

// RateAt returns the pumping rate (m³/s) at t seconds since pumping
// started: from the schedule, and 0 once the pump stopped.
func (r *Result) RateAt(t float64) float64 {
	if r.HasStop && t > r.Stop-r.Start {
		return 0
	}
	return r.Rates.RateAt(t)
}

// ThinSummary says what thinning did to the pumping and recovery
// readings, e.g. "12 400 → 143 readings"; "" without thinning.
func (r *Result) ThinSummary() string {
	if r.Pumping.Keep == nil && r.Recovery.Keep == nil {
		return ""
	}
	return CountText(r.Pumping.Len()+r.Recovery.Len(), r.Pumping.Kept()+r.Recovery.Kept())
}

func (r *Result) note(format string, args ...any) {
	r.Notes = append(r.Notes, fmt.Sprintf(format, args...))
}

// Apply conditions the water record with the settings c. baro is the
// barometric record, needed by Baro and Efficiency and ignored otherwise.
// The inputs are not modified.
func Apply(water Series, baro *Series, c Conditioning) (*Result, error) {
	if err := water.check("water"); err != nil {
		return nil, err
	}
	if err := c.Check(); err != nil {
		return nil, err
	}
	res := &Result{Clock: water.Clock}
	n := water.Len()
	t := append([]float64(nil), water.Time...)
	v := append([]float64(nil), water.Value...)
	var rows []int32
	if water.Row != nil {
		rows = append([]int32(nil), water.Row...)
	}
	// Sort by time.
	if !sort.Float64sAreSorted(t) {
		idx := make([]int, n)
		for i := range idx {
			idx[i] = i
		}
		sort.SliceStable(idx, func(a, b int) bool { return t[idx[a]] < t[idx[b]] })
		moved := 0
		t2, v2 := make([]float64, n), make([]float64, n)
		var r2 []int32
		if rows != nil {
			r2 = make([]int32, n)
		}
		for i, k := range idx {
			if k != i {
				moved++
			}
			t2[i], v2[i] = t[k], v[k]
			if rows != nil {
				r2[i] = rows[k]
			}
		}
		t, v, rows = t2, v2, r2
		res.Sorted = moved
		res.note("%d readings were out of time order and were put in order; check the logger clock.", moved)
	}
	start := t[0]
	if c.Start != nil {
		start = *c.Start
	}
	res.Start = start
	if c.Baro != nil && water.Kind != Pressure {
		return nil, settingErr(ErrSetting, "baro", water.Name, "barometric compensation applies to pressure records of unvented loggers, not to a %s record", water.Kind)
	}
	// Barometric record aligned to the water times; bRef is its value at
	// the pumping start.
	var bAt []float64
	bRef := 0.0
	if c.Baro != nil || c.Efficiency != nil {
		if baro == nil {
			return nil, settingErr(ErrSetting, "baro", "", "barometric compensation and efficiency need the barometric record")
		}
		if err := baro.check("barometric"); err != nil {
			return nil, err
		}
		if baro.Kind != Pressure {
			return nil, settingErr(ErrSetting, "baro", baro.Name, "the barometric record must be a pressure record")
		}
		if baro.Clock != water.Clock {
			return nil, settingErr(ErrSetting, "baro", baro.Name, "one record has clock times and the other elapsed times; they cannot be aligned")
		}
		shift := 0.0
		if c.Baro != nil {
			shift = c.Baro.Shift
		}
		bt := make([]float64, baro.Len())
		bv := make([]float64, baro.Len())
		scale := baro.density() / water.density()
		for i := range bt {
			bt[i] = baro.Time[i] + shift
			bv[i] = baro.Value[i] * scale
		}
		if !sort.Float64sAreSorted(bt) {
			idx := make([]int, len(bt))
			for i := range idx {
				idx[i] = i
			}
			sort.SliceStable(idx, func(a, b int) bool { return bt[idx[a]] < bt[idx[b]] })
			bt2, bv2 := make([]float64, len(bt)), make([]float64, len(bt))
			for i, k := range idx {
				bt2[i], bv2[i] = bt[k], bv[k]
			}
			bt, bv = bt2, bv2
			res.note("The barometric readings were out of time order and were put in order.")
		}
		cov := coverage(t, bt)
		res.Coverage = &cov
		if !cov.Covered() {
			what := "the nearest barometric reading was used for them"
			if c.Baro != nil && c.Baro.DropUncovered {
				what = "they were left out"
			}
			res.note("The barometric record (%s to %s) does not cover the test: %d readings before it and %d after it; %s.",
				FormatTime(cov.From, water.Clock), FormatTime(cov.To, water.Clock), cov.Before, cov.After, what)
		}
		if cov.Interval > 0 && cov.LongestGap > 4*cov.Interval {
			res.note("The barometric record has a gap of %s s from %s, bridged by a straight line.",
				strconv.FormatFloat(cov.LongestGap, 'f', -1, 64), FormatTime(cov.GapFrom, water.Clock))
		}
		bAt = Interpolate(t, bt, bv)
		bRef = Interpolate([]float64{start}, bt, bv)[0]
		if c.Baro != nil && c.Baro.DropUncovered && !cov.Covered() {
			k := 0
			for i := range t {
				if t[i] < cov.From || t[i] > cov.To {
					continue
				}
				t[k], v[k], bAt[k] = t[i], v[i], bAt[i]
				if rows != nil {
					rows[k] = rows[i]
				}
				k++
			}
			res.Dropped = n - k
			t, v, bAt = t[:k], v[:k], bAt[:k]
			if rows != nil {
				rows = rows[:k]
			}
			n = k
			if n == 0 {
				return nil, settingErr(ErrSetting, "baro", baro.Name, "the barometric record covers none of the readings")
			}
		}
	}
	if c.Baro != nil {
		for i := range v {
			v[i] -= bAt[i]
		}
	}
	// Level, up positive.
	level := v
	if water.Kind == Depth {
		for i := range level {
			level[i] = -level[i]
		}
	}
	if c.Efficiency != nil {
		for i := range level {
			level[i] += c.Efficiency.BE * (bAt[i] - bRef)
		}
	}
	// Split.
	stop := math.Inf(1)
	if c.Stop != nil {
		stop = *c.Stop
		res.Stop, res.HasStop = stop, true
	}
	a0 := sort.SearchFloat64s(t, start) // first reading at or after start
	p1 := len(t)
	if c.Stop != nil {
		p1 = sort.Search(len(t), func(i int) bool { return t[i] > stop })
	}
	cut := func(lo, hi int, origin float64) Segment {
		s := Segment{Time: t[lo:hi:hi], Level: level[lo:hi:hi], Elapsed: make([]float64, hi-lo)}
		for i := range s.Elapsed {
			s.Elapsed[i] = s.Time[i] - origin
		}
		if rows != nil {
			s.Row = rows[lo:hi:hi]
		}
		return s
	}
	res.Antecedent = cut(0, a0, start)
	res.Pumping = cut(a0, p1, start)
	res.Recovery = cut(p1, len(t), stop)
	if c.Start != nil && a0 == 0 {
		res.note("No reading lies before the pumping start.")
	}
	if res.Pumping.Len() == 0 {
		res.note("No reading lies between the pumping start and stop.")
	}
	if c.Stop != nil && res.Recovery.Len() == 0 {
		res.note("No reading lies after the pump stopped.")
	}
	// Trend.
	if c.Trend != nil {
		lo := 0
		if c.Trend.Window > 0 {
			lo = sort.SearchFloat64s(t[:a0], start-c.Trend.Window)
		}
		a, b, err := FitTrend(t[lo:a0], level[lo:a0], start)
		if err != nil {
			return nil, &SettingError{Field: "trend", Err: fmt.Errorf("%w: %v", ErrSetting, err)}
		}
		res.Trend = &TrendFit{Slope: b, Level: a, N: a0 - lo}
		for i := range level {
			level[i] -= b * (t[i] - start)
		}
		res.note("A trend of %s m/d fitted to %d readings before pumping was removed.", strconv.FormatFloat(b*86400, 'g', 4, 64), a0-lo)
	}
	// Static level and drawdown.
	if c.Static != nil {
		if c.Static.Typed {
			res.Static = c.Static.Value
			if water.Kind == Depth {
				res.Static = -res.Static
			}
		} else {
			if a0 == 0 {
				return nil, settingErr(ErrSetting, "static", "", "the static level is the mean of the readings before pumping, and there are none: set the pumping start or type the static level")
			}
			sum := 0.0
			for _, x := range level[:a0] {
				sum += x
			}
			res.Static = sum / float64(a0)
		}
		res.HasStatic = true
		for _, s := range []*Segment{&res.Antecedent, &res.Pumping, &res.Recovery} {
			s.Drawdown = make([]float64, s.Len())
			for i, x := range s.Level {
				s.Drawdown[i] = res.Static - x
			}
		}
	}
	// Thinning.
	if c.Thin != nil {
		res.Pumping.Keep = ThinLog(res.Pumping.Elapsed, c.Thin.PerCycle)
		res.Recovery.Keep = ThinLog(res.Recovery.Elapsed, c.Thin.PerCycle)
		res.note("Thinning: %s.", res.ThinSummary())
	}
	res.Rates = c.Rates
	return res, nil
}

// FitTrend fits the line v = a + b·(t − at) to the points (t, v) by least
// squares and returns a, the line's value at at, and the slope b (per
// second). It needs two points at different times.
func FitTrend(t, v []float64, at float64) (a, b float64, err error) {
	n := len(t)
	if n < 2 || len(v) != n {
		return 0, 0, fmt.Errorf("a trend needs at least 2 readings before pumping, %d found", n)
	}
	var tm, vm float64
	for i := range t {
		tm += t[i]
		vm += v[i]
	}
	tm /= float64(n)
	vm /= float64(n)
	var stt, stv float64
	for i := range t {
		dt := t[i] - tm
		stt += dt * dt
		stv += dt * (v[i] - vm)
	}
	if stt == 0 {
		return 0, 0, fmt.Errorf("a trend needs readings at different times")
	}
	b = stv / stt
	return vm + b*(at-tm), b, nil
}
