package ui

import (
	"context"
	"errors"
	"hash/fnv"
	"math"
	"strconv"
	"strings"

	"fieldfit/models"
	"fieldfit/models/decay"
	"fieldfit/models/infiltration"
	"fieldfit/models/slug"
	"fieldfit/ui/project"
)

// KindRequest is everything the fit of a slug test, infiltration test or
// decay curve needs, copied out of the project so that the fit can run
// in a goroutine while the user goes on typing.
type KindRequest struct {
	Kind  project.TestKind
	Model string
	// TimeUnit is the symbol of the readings' time unit (display only:
	// the times of Data are in seconds).
	TimeUnit string
	// ValueUnit is the user's unit of a decay curve's values.
	ValueUnit string
	Data      kindData
	// From and To bound the fit window, s; zero leaves a side open.
	From, To float64

	Slug  slug.Test
	Shape slug.Shape
	Coef  *slug.Coefficients // nil: the built-in fits (from memory)

	Infil    infiltration.Test
	InfilSet infiltration.Settings

	Decay decay.Settings
}

// kindRequest assembles the fit of kind test t, or says in plain
// sentences what is missing. cond conditions the logger record when the
// test fits it (conditionTest when nil).
func kindRequest(p *project.Project, t *project.Test, cond conditioner) (*KindRequest, []string) {
	d := descFor(t.Kind)
	s := t.Setup
	if s == nil {
		s = &project.KindSetup{}
	}
	req := &KindRequest{Kind: t.Kind, Model: d.model(s), TimeUnit: d.option(s, "time-unit"),
		From: s.WindowStart, To: s.WindowEnd}
	var missing []string
	fm := d.fieldMessages(s)
	for _, f := range d.fields {
		if m := fm[f.key]; m != "" {
			missing = append(missing, f.label+": "+m)
		}
	}
	if t.FitsLogger() {
		missing = append(missing, kindLoggerData(&req.Data, t, cond)...)
	} else {
		req.Data, _ = checkKindRows(d, s)
	}
	v := func(key string) float64 { x, _ := kindValue(s, key); return x }
	switch d {
	case slugDesc:
		g := slug.Geometry{CasingRadius: v("casing-radius"), WellRadius: v("well-radius"), ScreenLength: v("screen-length"),
			ScreenBottom: v("screen-bottom"), AquiferThickness: v("thickness"), PackPorosity: v("pack-porosity"),
			LevelInScreen: d.option(s, "level-in-screen") == "screen"}
		if g.CasingRadius <= 0 {
			missing = append(missing, "Enter the casing radius r_c on the Test tab.")
		}
		if g.WellRadius <= 0 {
			missing = append(missing, "Enter the screen radius r_w on the Test tab.")
		}
		req.Slug = slug.Test{Geometry: g, Readings: models.Data{Time: req.Data.T, Value: req.Data.V}, SlugVolume: v("slug-volume")}
		if d.option(s, "h0-from") == "typed" {
			h0, ok := kindValue(s, "h0")
			if !ok || h0 == 0 {
				missing = append(missing, "Enter H0 on the Test tab, or take it from the first reading.")
			} else if len(req.Data.V) > 0 {
				req.Slug.H0 = math.Copysign(math.Abs(h0), req.Data.V[0])
			}
		}
		if sh, err := strconv.Atoi(d.option(s, "shape")); err == nil {
			req.Shape = slug.Shape(sh)
		}
		_, okA := kindValue(s, "br-a")
		_, okB := kindValue(s, "br-b")
		_, okC := kindValue(s, "br-c")
		if okA || okB || okC {
			req.Coef = &slug.Coefficients{A: v("br-a"), B: v("br-b"), C: v("br-c"), Source: "read from the curves of Bouwer & Rice (1976) and entered by the user"}
		}
	case infilDesc:
		it := infiltration.Test{InnerDiameter: v("inner-diameter"), OuterDiameter: v("outer-diameter"),
			Unit: d.option(s, "value-unit"), DistanceDown: d.option(s, "level-sense") == "down"}
		if d.option(s, "readings") == "volumes" {
			it.Kind = infiltration.Volumes
		}
		if req.Data.FromLogger {
			it.Kind, it.Unit, it.DistanceDown = infiltration.Levels, "m", true
		}
		if it.InnerDiameter <= 0 {
			missing = append(missing, "Enter the inner ring diameter on the Test tab.")
		}
		for i := range req.Data.T {
			r := infiltration.Reading{Time: req.Data.T[i], Value: req.Data.V[i]}
			if rf := req.Data.Refill[i]; !math.IsNaN(rf) {
				r.Refill, r.RefillTo = true, rf
			}
			it.Readings = append(it.Readings, r)
		}
		req.Infil = it
		req.InfilSet = infiltration.Settings{Rate: d.option(s, "fit-curve") == "rate", From: req.From, To: req.To, SafetyFactor: v("safety")}
	case decayDesc:
		req.ValueUnit = strings.TrimSpace(d.option(s, "value-unit"))
		if req.Data.FromLogger {
			req.ValueUnit = "m"
		}
		ds := decay.Settings{ValueUnit: req.ValueUnit, TimeUnit: "s", From: req.From, To: req.To}
		if req.Model == "decay-2" {
			ds.Form = decay.TwoTerm
		}
		if d.option(s, "y0-mode") == "fixed" {
			y0, ok := kindValue(s, "y0")
			if !ok {
				missing = append(missing, "Enter the initial value y0 to hold it fixed.")
			}
			if ds.Form == decay.TwoTerm {
				missing = append(missing, "y0 can be held fixed only with the first-order (one-term) curve.")
			}
			ds.FixY0, ds.Y0 = true, y0
		}
		if d.option(s, "baseline-mode") == "fixed" {
			b, ok := kindValue(s, "baseline")
			if !ok {
				missing = append(missing, "Enter the baseline y∞ to hold it fixed.")
			}
			ds.FixBaseline, ds.Baseline = true, b
		}
		req.Decay = ds
	}
	if n := len(req.Data.T); n < 3 {
		missing = append(missing, "At least 3 usable readings are needed ("+strconv.Itoa(n)+" so far).")
	}
	if req.To > 0 && req.To <= req.From {
		missing = append(missing, "The end of the fit window must be after its start.")
	}
	return req, missing
}

// kindLoggerData takes the readings from the conditioned logger record:
// the change of level from the static level (m) against the time since
// the start of the record's test period.
func kindLoggerData(data *kindData, t *project.Test, cond conditioner) []string {
	var req FitRequest
	if m := loggerReadings(&req, t, cond); len(m) > 0 {
		return m
	}
	data.FromLogger = true
	for i := range req.Time {
		data.T = append(data.T, req.Time[i])
		data.V = append(data.V, req.Drawdown[i])
		data.Refill = append(data.Refill, math.NaN())
		data.Row = append(data.Row, -1)
	}
	return nil
}

func (a *App) kindRequestLocked(t *project.Test) (*KindRequest, []string) {
	return kindRequest(a.cur, t, a.conditionedLocked)
}

// Fingerprint identifies the inputs of the request.
func (r *KindRequest) Fingerprint() string {
	h := fnv.New64a()
	str := func(ss ...string) {
		for _, s := range ss {
			h.Write([]byte(s + ";"))
		}
	}
	num := func(vs ...float64) {
		for _, v := range vs {
			str(strconv.FormatFloat(v, 'g', -1, 64))
		}
	}
	str(string(r.Kind), r.Model, r.ValueUnit, strconv.FormatBool(r.Data.FromLogger))
	num(r.From, r.To)
	num(r.Data.T...)
	num(r.Data.V...)
	num(r.Data.Refill...)
	g := r.Slug.Geometry
	num(g.CasingRadius, g.WellRadius, g.ScreenLength, g.ScreenBottom, g.AquiferThickness, g.PackPorosity, r.Slug.H0, r.Slug.SlugVolume, float64(r.Shape))
	str(strconv.FormatBool(g.LevelInScreen), strconv.FormatBool(r.Coef != nil))
	if r.Coef != nil {
		num(r.Coef.A, r.Coef.B, r.Coef.C)
	}
	it := r.Infil
	num(it.InnerDiameter, it.OuterDiameter, float64(it.Kind), r.InfilSet.SafetyFactor)
	str(it.Unit, strconv.FormatBool(it.DistanceDown), strconv.FormatBool(r.InfilSet.Rate))
	ds := r.Decay
	num(float64(ds.Form), ds.Y0, ds.Baseline)
	str(strconv.FormatBool(ds.FixY0), strconv.FormatBool(ds.FixBaseline))
	return strconv.FormatUint(h.Sum64(), 16)
}

// KindOutcome is a fit of a kind test: the ModelFit kept in the project
// and what the plots need.
type KindOutcome struct {
	Fit project.ModelFit
	// Used marks the readings of the request that were fitted;
	// Residual is fitted − observed of the fitted quantity at each
	// (NaN where not fitted).
	Used     []bool
	Residual []float64
	// curve returns the fitted main quantity (H/H0, F in m, or the
	// decaying value) and its 95 % band at times t (s); rate the
	// infiltration rate f (m/s) and its band (nil for the other kinds).
	curve, rate func(t []float64) (y, lo, hi []float64)
	// residLabel names the residual's quantity.
	residLabel string
}

// named turns a models.Estimate into the stored form.
func named(e models.Estimate, name, unit string) project.NamedEstimate {
	if name == "" {
		name = e.Name
	}
	n := project.NamedEstimate{Name: name, Unit: unit, Value: e.Value, Lower: e.Lower, Upper: e.Upper}
	if bad(n.Lower) || bad(n.Upper) {
		n.Lower, n.Upper, n.NoCI = 0, 0, true
	}
	return n
}

func bad(x float64) bool { return math.IsNaN(x) || math.IsInf(x, 0) }

// addParams appends the estimates whose value is a finite number (the
// project file holds no NaN) and says which were left out.
func addParams(f *project.ModelFit, ps ...project.NamedEstimate) {
	for _, p := range ps {
		if bad(p.Value) {
			f.Warnings = append(f.Warnings, p.Name+" could not be computed from this fit.")
			continue
		}
		f.Params = append(f.Params, p)
	}
}

// KindFit fits the request's model with the kind's package and returns
// the ModelFit (SI units) with its warnings and notes.
func KindFit(ctx context.Context, req *KindRequest) (*KindOutcome, error) {
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	out := &KindOutcome{}
	f := &out.Fit
	f.Model = req.Model
	var fr *models.Result
	var err error
	shift := 0 // index of the first data point the fit's indices count from
	switch req.Kind {
	case project.SlugTest:
		set := &slug.Settings{From: req.From, To: req.To}
		var r *slug.Result
		switch req.Model {
		case "bouwer-rice":
			r, err = slug.BouwerRice(req.Slug, req.Coef, set)
		case "cbp":
			r, err = slug.CooperBredehoeftPapadopulos(req.Slug, set)
		default:
			r, err = slug.Hvorslev(req.Slug, req.Shape, set)
		}
		if r == nil {
			return nil, kindError(err, req.Data)
		}
		fr = r.Fit
		addParams(f, named(r.K, "K", "m/s"))
		if req.Model == "cbp" {
			addParams(f, named(r.Transmissivity, "T", "m²/s"), named(r.Storativity, "S", ""))
			out.residLabel = "H/H0"
		} else {
			addParams(f, named(r.T0, "T0", "s"))
			out.residLabel = "ln(H/H0)"
			if r.LnReRw > 0 {
				f.Notes = append(f.Notes, "ln(Re/r_w) = "+formatSig(r.LnReRw, 4)+".")
			}
		}
		f.Notes = append(f.Notes, r.Normalised.Notes...)
		f.Notes = append(f.Notes, r.Assumptions...)
		f.Warnings = append(f.Warnings, r.Caveats...)
		out.curve = r.Curve
	case project.InfiltrationTest:
		c, e := infiltration.Rebuild(req.Infil)
		if e != nil {
			return nil, kindError(e, req.Data)
		}
		m := infiltration.Method(optionIndex(infilDesc.models, req.Model))
		r, e := infiltration.Fit(c, m, &req.InfilSet)
		if r == nil {
			return nil, kindError(e, req.Data)
		}
		err = e
		fr, shift = r.Fit, 1
		for _, e := range r.Estimates {
			addParams(f, named(e, "", e.Unit))
		}
		if r.HasSteady {
			addParams(f, named(r.Steady, "steady rate", "m/s"))
			if r.SafetyFactor > 0 {
				addParams(f, named(r.Design, "design rate", "m/s"))
			}
		}
		f.Notes = append(f.Notes, "Fitted: the "+r.Fitted+".")
		f.Notes = append(f.Notes, r.Notes...)
		f.Notes = append(f.Notes, r.Plausibility)
		f.Warnings = append(f.Warnings, r.Caveats...)
		out.curve = func(t []float64) (y, lo, hi []float64) { y, lo, hi, _, _, _ = r.Curves(t); return }
		out.rate = func(t []float64) (y, lo, hi []float64) { _, _, _, y, lo, hi = r.Curves(t); return }
		out.residLabel = "F"
		if req.InfilSet.Rate {
			out.residLabel = "f"
		}
	case project.DecayTest:
		r, e := decay.Fit(models.Data{Time: req.Data.T, Value: req.Data.V}, &req.Decay)
		if r == nil {
			return nil, kindError(e, req.Data)
		}
		err = e
		fr = r.Fit
		for _, e := range r.Estimates {
			u := req.ValueUnit
			if strings.HasPrefix(e.Name, "k") {
				u = "1/s"
			}
			addParams(f, named(e, "", u))
		}
		for _, h := range r.HalfLives {
			addParams(f, named(h, "", "s"))
		}
		if req.Decay.Form == decay.TwoTerm {
			addParams(f, named(r.Y0, "y0", req.ValueUnit))
		}
		f.Warnings = append(f.Warnings, r.Caveats...)
		out.curve = r.Fit.Band
		out.residLabel = "value"
	default:
		return nil, errors.New("not a slug test, infiltration test or decay curve")
	}
	if err != nil {
		f.Warnings = append(f.Warnings, "The fit stopped early: "+kindError(err, req.Data).Error())
	}
	f.Warnings = dedupe(f.Warnings)
	if fr.Fit != nil {
		f.RMSE, f.Iterations, f.Status = fr.Fit.RMSE, fr.Fit.Iterations, fr.Fit.Status.String()
	}
	f.N = len(fr.Used)
	ssr := 0.0
	for _, r := range fr.Residuals {
		ssr += r * r
	}
	// The fitted parameters and the residual variance, as for the
	// pumping models.
	if f.AICc = aicc(len(fr.Residuals), len(fr.Params)+1, ssr); bad(f.AICc) {
		f.AICc = 0
	}
	if bad(f.RMSE) {
		f.RMSE = 0
	}
	f.Inputs = req.Fingerprint()
	n := len(req.Data.T)
	out.Used = make([]bool, n)
	out.Residual = make([]float64, n)
	for i := range out.Residual {
		out.Residual[i] = math.NaN()
	}
	for k, i := range fr.Used {
		if j := i + shift; j < n && k < len(fr.Residuals) {
			out.Used[j] = true
			out.Residual[j] = fr.Residuals[k]
		}
	}
	return out, nil
}

func optionIndex(opts []option, v string) int {
	for i, o := range opts {
		if o.value == v {
			return i
		}
	}
	return 0
}

// kindError rewrites an error of a kind's package for the user: the
// point it names becomes the row of the readings table.
func kindError(err error, data kindData) error {
	var me *models.Error
	if !errors.As(err, &me) {
		return err
	}
	var b strings.Builder
	if me.Index >= 0 && me.Index < len(data.Row) {
		if r := data.Row[me.Index]; r >= 0 {
			b.WriteString("Row " + strconv.Itoa(r+1) + ": ")
		} else {
			b.WriteString("Logger reading " + strconv.Itoa(me.Index+1) + ": ")
		}
	}
	if me.Field != "" {
		b.WriteString(me.Field)
		if !math.IsNaN(me.Value) {
			b.WriteString(" (" + strconv.FormatFloat(me.Value, 'g', 6, 64) + ")")
		}
		b.WriteString(": ")
	}
	reason := me.Reason
	if reason == "" && me.Err != nil {
		reason = me.Err.Error()
	}
	b.WriteString(reason)
	if me.Method != "" {
		b.WriteString(" [" + me.Method + "]")
	}
	return errors.New(capital(strings.TrimSpace(b.String())) + ".")
}

// ---- the fit step's state ----

// kindState is the fit step of the selected kind test, not stored.
type kindState struct {
	tid            string // the test it belongs to
	running, again bool
	out            *KindOutcome
	msg            string
	dragging       bool
	dragStart      float64 // s
	dragEnd        float64
}

// runKindFitLocked fits the selected kind test in the background.
func (a *App) runKindFitLocked(t *project.Test) {
	if a.kfit.tid != t.ID {
		a.kfit = kindState{tid: t.ID}
	}
	if a.kfit.running {
		a.kfit.again = true
		return
	}
	req, missing := a.kindRequestLocked(t)
	if len(missing) > 0 {
		a.kfit.msg = strings.Join(missing, " ")
		a.kfit.out = nil
		return
	}
	a.kfit.msg = ""
	a.kfit.running = true
	pid, tid := a.cur.ID, t.ID
	a.goBusy("fit", "Fitting…", func(ctx context.Context) {
		out, err := KindFit(ctx, req)
		a.mu.Lock()
		defer a.mu.Unlock()
		if a.kfit.tid != tid {
			return
		}
		a.kfit.running = false
		cur := a.currentTest()
		if a.cur == nil || a.cur.ID != pid || cur == nil || cur.ID != tid {
			return
		}
		if err != nil {
			a.kfit.msg = "The fit failed: " + err.Error()
			a.kfit.out = nil
		} else {
			out.Fit.At = a.opt.Now().UTC()
			a.kfit.out = out
			if storeFit(cur, out.Fit, out.Fit.At) {
				a.changedLocked()
			}
		}
		if a.kfit.again {
			a.kfit.again = false
			a.scheduleFitLocked()
		}
	})
}

// storedFit returns the stored fit of model m, or nil.
func storedFit(t *project.Test, m string) *project.ModelFit {
	for i := range t.Fits {
		if t.Fits[i].Model == m {
			return &t.Fits[i]
		}
	}
	return nil
}
