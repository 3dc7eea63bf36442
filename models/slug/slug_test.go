package slug

import (
	"errors"
	"math"
	"strings"
	"testing"

	"fieldfit/models"
	"fieldfit/models/units"
)

// Our own scenario (invented): monitoring well MW-3 at the Kestrel Lane
// depot — 50 mm casing, 150 mm borehole with a gravel pack, 3 m screen
// whose bottom is 6 m below the static level, in a 15 m aquifer.
var scGeom = Geometry{
	CasingRadius:     0.025,
	WellRadius:       0.075,
	ScreenLength:     3,
	ScreenBottom:     6,
	AquiferThickness: 15,
}

func logTimes(n int, a, b float64) []float64 {
	ts := make([]float64, n)
	for i := range ts {
		ts[i] = a * math.Pow(b/a, float64(i)/float64(n-1))
	}
	return ts
}

// noise is a fixed, zero-mean-ish perturbation of amplitude amp.
func noise(i int, amp float64) float64 { return amp * math.Sin(float64(7*i)+0.3) }

func relDiff(a, b float64) float64 { return math.Abs(a-b) / math.Abs(b) }

// lineTest builds a falling-head test with ln(H/H0) = −m t (H0 = 0.5 m),
// a fixed relative noise of ±0.2 %, and an optional early segment
// that is twice as steep until t1 (a draining pack).
func lineTest(g Geometry, m float64, t1 float64) Test {
	ts := logTimes(40, 1, 5/m)
	ts = append([]float64{0}, ts...)
	h := make([]float64, len(ts))
	for i, t := range ts {
		l := -m * t
		if t1 > 0 {
			if t < t1 {
				l = -2 * m * t
			} else {
				l = -2*m*t1 - m*(t-t1)
			}
		}
		h[i] = 0.5 * math.Exp(l) * (1 + noise(i, 2e-3))
	}
	return Test{Geometry: g, Readings: models.Data{Time: ts, Value: h}}
}

// TestHvorslevReference is the check of the project's reference §6:
// r_c = 0.025 m, R = 0.05 m, Le = 1.5 m, T0 = 600 s → K = 1.18097e-6 m/s
// (computed with scipy/mpmath, reference §6 [lib]; the formula K = r_c²
// ln(Le/R)/(2 Le T0) for Le/R > 8 is Hvorslev 1951 from memory).
func TestHvorslevReference(t *testing.T) {
	g := Geometry{CasingRadius: 0.025, WellRadius: 0.05, ScreenLength: 1.5}
	ts := []float64{0, 60, 120, 300, 600, 900, 1200, 1800}
	h := make([]float64, len(ts))
	for i, x := range ts {
		h[i] = 0.8 * math.Exp(-x/600)
	}
	r, err := Hvorslev(Test{Geometry: g, Readings: models.Data{Time: ts, Value: h}}, ScreenLong, nil)
	if err != nil {
		t.Fatal(err)
	}
	const want = 1.18097e-6 // reference §6 [lib]
	if d := relDiff(r.K.Value, want); d > 5e-6 {
		t.Errorf("K = %.7g m/s, want %.6g (reference §6)", r.K.Value, want)
	}
	if d := relDiff(r.T0.Value, 600); d > 1e-12 {
		t.Errorf("T0 = %.12g s, want 600", r.T0.Value)
	}
	// The general screen form tends to the long form as L/R grows:
	// asinh(L/(2R)) = ln(L/R) + O((R/L)²).
	F1, _ := ScreenLong.Factor(Geometry{CasingRadius: 0.025, WellRadius: 0.05, ScreenLength: 50})
	F2, _ := Screen.Factor(Geometry{CasingRadius: 0.025, WellRadius: 0.05, ScreenLength: 50})
	if d := relDiff(F2, F1); d > 1e-6 {
		t.Errorf("general screen factor %g vs long form %g: differ by %.2g", F2, F1, d)
	}
}

// TestShapeFactors checks each shape factor against its formula evaluated
// apart (Python's math module as a calculator) for R = 0.05 m, L = 1.5 m
// (formulas: Hvorslev 1951, from memory).
func TestShapeFactors(t *testing.T) {
	g := Geometry{CasingRadius: 0.025, WellRadius: 0.05, ScreenLength: 1.5}
	for _, c := range []struct {
		s    Shape
		want float64
	}{
		// 2π·1.5/ln 30 = 9.42477796/3.40119738 = 2.77101765
		{ScreenLong, 2.7710176456},
		// 2π·1.5/ln(15 + √226) = 9.42477796/3.40230665 = 2.77011420
		{Screen, 2.7701142028},
		// 2π·1.5/ln(30 + √901) = 9.42477796/4.09462222 = 2.30174542
		{ScreenAtBoundary, 2.3017454223},
		{FlushBottom, 0.275},
		{FlushBottomAtBoundary, 0.2},
	} {
		got, err := c.s.Factor(g)
		if err != nil {
			t.Fatalf("%v: %v", c.s, err)
		}
		if relDiff(got, c.want) > 1e-10 {
			t.Errorf("%v: F = %.8g m, want %.8g", c.s, got, c.want)
		}
	}
	if _, err := Shape(99).Factor(g); !errors.Is(err, models.ErrBadConstant) {
		t.Errorf("unknown shape: err = %v", err)
	}
	if _, err := ScreenLong.Factor(Geometry{CasingRadius: 0.025, WellRadius: 0.05}); !errors.Is(err, models.ErrBadConstant) || !strings.Contains(err.Error(), "screen length") {
		t.Errorf("missing screen length: err = %v", err)
	}
	if _, err := FlushBottom.Factor(Geometry{CasingRadius: 0.025, WellRadius: 0.05}); err != nil {
		t.Errorf("flush bottom needs no screen length: %v", err)
	}
}

// TestEffectiveCasingRadius: √((1−n)r_c² + n r_w²) by hand for n = 0.3,
// r_c = 0.025, r_w = 0.075: √(0.0004375 + 0.0016875) = √0.002125.
func TestEffectiveCasingRadius(t *testing.T) {
	g := scGeom
	g.PackPorosity = 0.3
	if got := g.EffectiveCasingRadius(); got != 0.025 {
		t.Errorf("level in the casing: r_c,eff = %v, want r_c", got)
	}
	g.LevelInScreen = true
	if got, want := g.EffectiveCasingRadius(), math.Sqrt(0.002125); relDiff(got, want) > 1e-15 {
		t.Errorf("r_c,eff = %.15g, want %.15g", got, want)
	}
}

// TestLnReRw checks the Bouwer–Rice formulas (reference §6) evaluated
// apart (Python's math module as a calculator) with coefficients entered
// as if read from the curves (A = 2, B = 0.3, C = 1.5; invented values for
// the arithmetic).
func TestLnReRw(t *testing.T) {
	c := Coefficients{A: 2, B: 0.3, C: 1.5}
	// Partial: Lw/rw = 80, Le/rw = 40, (H−Lw)/rw = 120, ln 120 = 4.787492;
	// 1.1/ln 80 = 0.2510254; (2 + 0.3·4.787492)/40 = 0.0859062;
	// sum 0.3369316 → 2.9679615.
	v, full, err := LnReRw(scGeom, c)
	if err != nil || full {
		t.Fatalf("partial: %v, full %v", err, full)
	}
	want := 1 / (1.1/math.Log(80) + (2+0.3*math.Log(120))/40)
	if relDiff(v, want) > 1e-14 || math.Abs(v-2.9679615323) > 1e-9 {
		t.Errorf("partial: ln(Re/rw) = %.11g, want %.11g (2.9679615323)", v, want)
	}
	// Thick aquifer: ln((H−Lw)/rw) capped at 6: (2 + 1.8)/40 = 0.095.
	g := scGeom
	g.AquiferThickness = 500
	v, _, _ = LnReRw(g, c)
	if want := 1 / (1.1/math.Log(80) + 0.095); relDiff(v, want) > 1e-14 {
		t.Errorf("capped: %.9g, want %.9g", v, want)
	}
	g.AquiferThickness = 0 // not known: the cap as well
	if v2, _, _ := LnReRw(g, c); v2 != v {
		t.Errorf("unknown thickness: %.9g, want the capped %.9g", v2, v)
	}
	// Full: H = Lw = 6 m; 1.1/ln 80 + 1.5/40 = 0.2885254 → 3.4658993.
	g = scGeom
	g.AquiferThickness = 6
	v, full, err = LnReRw(g, c)
	if err != nil || !full {
		t.Fatalf("full: %v, full %v", err, full)
	}
	if want := 1 / (1.1/math.Log(80) + 1.5/40); relDiff(v, want) > 1e-14 || math.Abs(v-3.465899332) > 1e-9 {
		t.Errorf("full: ln(Re/rw) = %.9g, want %.9g", v, want)
	}
}

// TestPolynomialCoefficients pins the built-in fits at Le/r_w = 10 and
// 100 (values of the polynomials as recalled — from memory, NOT a check
// against the published curves) and their range.
func TestPolynomialCoefficients(t *testing.T) {
	c, err := PolynomialCoefficients(10)
	if err != nil {
		t.Fatal(err)
	}
	if !c.FromMemory || !strings.Contains(c.Source, "memory") {
		t.Errorf("built-in coefficients not marked from memory: %+v", c)
	}
	// Horner by hand at x = 10: A = 1.472 + 0.3537 − 0.008148 + 0.0001028
	// − 6.484e-7 + 1.573e-9 = 1.8176536; B = 0.2372 + 0.05151 − 0.0002682
	// − 3.491e-7 + 4.738e-9 = 0.2884415; C = 0.792 + 0.3993 − 0.005743 +
	// 0.00003858 − 9.659e-8 = 1.1855955.
	for _, v := range []struct {
		name      string
		got, want float64
	}{{"A", c.A, 1.8176536}, {"B", c.B, 0.2884415}, {"C", c.C, 1.1855955}} {
		if math.Abs(v.got-v.want) > 1e-6 {
			t.Errorf("%s(10) = %.8g, want %.8g", v.name, v.got, v.want)
		}
	}
	for _, x := range []float64{0.5, 1001, math.NaN()} {
		if _, err := PolynomialCoefficients(x); !errors.Is(err, models.ErrBadConstant) {
			t.Errorf("Le/rw = %g: err = %v, want ErrBadConstant", x, err)
		}
	}
	// The fits rise with Le/r_w over their range, as the curves do.
	prev, _ := PolynomialCoefficients(1)
	for x := 2.0; x <= 1000; x++ {
		c, _ := PolynomialCoefficients(x)
		if c.A < prev.A || c.B < prev.B || c.C < prev.C {
			t.Fatalf("coefficients fall at Le/rw = %g: %+v after %+v", x, c, prev)
		}
		prev = c
	}
}

// TestRoundTrips fits each method to readings made by its own model (our
// scenario) and recovers K.
func TestRoundTrips(t *testing.T) {
	const K = 2e-5 // m/s
	rc := scGeom.CasingRadius
	t.Run("Hvorslev", func(t *testing.T) {
		for _, shape := range Shapes() {
			F, err := shape.Factor(scGeom)
			if err != nil {
				t.Fatal(err)
			}
			m := K * F / (math.Pi * rc * rc) // 1/T0
			r, err := Hvorslev(lineTest(scGeom, m, 0), shape, nil)
			if err != nil {
				t.Fatalf("%v: %v", shape, err)
			}
			if relDiff(r.K.Value, K) > 2e-3 || math.Abs(r.K.Value-K) > 3*r.K.StdErr {
				t.Errorf("%v: K = %.5g (%.5g – %.5g), want %g", shape, r.K.Value, r.K.Lower, r.K.Upper, K)
			}
			if r.Shape != shape.String() || len(r.Assumptions) < 3 || r.Caution != Caution {
				t.Errorf("%v: shape %q, %d assumptions, caution %q", shape, r.Shape, len(r.Assumptions), r.Caution)
			}
		}
	})
	t.Run("BouwerRice/double-line", func(t *testing.T) {
		c, _ := PolynomialCoefficients(scGeom.ScreenLength / scGeom.WellRadius)
		lnr, _, _ := LnReRw(scGeom, c)
		m := K * 2 * scGeom.ScreenLength / (rc * rc * lnr)
		t1 := 0.3 / m
		test := lineTest(scGeom, m, t1)
		r, err := BouwerRice(test, nil, &Settings{From: 1.5 * t1})
		if err != nil {
			t.Fatal(err)
		}
		if relDiff(r.K.Value, K) > 2e-3 || math.Abs(r.K.Value-K) > 3*r.K.StdErr {
			t.Errorf("K = %.5g (%.5g – %.5g), want %g", r.K.Value, r.K.Lower, r.K.Upper, K)
		}
		if relDiff(r.Intercept, math.Exp(-0.3)) > 0.01 {
			t.Errorf("line meets t = 0 at %.4g, want e^−0.3 = %.4g", r.Intercept, math.Exp(-0.3))
		}
		if !hasCaveat(r, "NOT been verified") || !hasCaveat(r, "double straight line") {
			t.Errorf("caveats miss the unverified coefficients or the double line: %q", r.Caveats)
		}
		// Without the window the early segment biases K upwards.
		all, err := BouwerRice(test, nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		if !(all.K.Value > 1.02*K) {
			t.Errorf("whole record: K = %.4g, expected the early segment to raise it above %.4g", all.K.Value, 1.02*K)
		}
		// Coefficients entered by the user carry no such caveat.
		u, err := BouwerRice(test, &Coefficients{A: c.A, B: c.B, C: c.C}, &Settings{From: 1.5 * t1})
		if err != nil {
			t.Fatal(err)
		}
		if hasCaveat(u, "NOT been verified") || u.Coefficients.Source != "entered by the user" || u.K.Value != r.K.Value {
			t.Errorf("user coefficients: caveats %q, source %q, K %g vs %g", u.Caveats, u.Coefficients.Source, u.K.Value, r.K.Value)
		}
	})
	t.Run("CBP", func(t *testing.T) {
		const T, S = 1e-4, 1e-4
		m := CBP{CasingRadius: rc, WellRadius: scGeom.WellRadius}
		ts := logTimes(50, 0.5, 3000)
		h := make([]float64, len(ts))
		m.Eval(h, ts, []float64{T, S})
		for i := range h {
			h[i] = 0.6 * (h[i] + noise(i, 2e-3))
		}
		g := scGeom
		g.AquiferThickness = 3 // a confined layer as thick as the screen
		g.ScreenBottom = 0
		r, err := CooperBredehoeftPapadopulos(Test{Geometry: g, Readings: models.Data{Time: ts, Value: h}, H0: 0.6}, nil)
		if err != nil {
			t.Fatal(err)
		}
		if relDiff(r.Transmissivity.Value, T) > 0.05 || !(r.Transmissivity.Lower <= T && T <= r.Transmissivity.Upper) {
			t.Errorf("T = %.4g (%.4g – %.4g), want %g", r.Transmissivity.Value, r.Transmissivity.Lower, r.Transmissivity.Upper, T)
		}
		if !(r.Storativity.Lower <= S && S <= r.Storativity.Upper) || relDiff(r.Storativity.Value, S) > 1 {
			t.Errorf("S = %.4g (%.4g – %.4g), want %g", r.Storativity.Value, r.Storativity.Lower, r.Storativity.Upper, S)
		}
		if relDiff(r.K.Value, r.Transmissivity.Value/3) > 1e-15 {
			t.Errorf("K = %g, want T/b = %g", r.K.Value, r.Transmissivity.Value/3)
		}
		t.Logf("CBP: T = %.4g ± %.2g, S = %.3g ± %.2g, %d iterations, %v", r.Transmissivity.Value, r.Transmissivity.StdErr,
			r.Storativity.Value, r.Storativity.StdErr, r.Fit.Fit.Iterations, r.Fit.Fit.Status)
		h2, lo, hi := r.Curve([]float64{0, 10, 100})
		if h2[0] != 1 || !(lo[1] < h2[1] && h2[1] < hi[1]) {
			t.Errorf("curve %v, band %v – %v", h2, lo, hi)
		}
	})
}

func hasCaveat(r *Result, s string) bool {
	for _, c := range r.Caveats {
		if strings.Contains(c, s) {
			return true
		}
	}
	return false
}

// TestKUnits checks K in m/d, ft/d and cm/s against the exact factors of
// reference §9 (1 ft = 0.3048 m, 1 d = 86400 s).
func TestKUnits(t *testing.T) {
	ts := []float64{0, 10, 20, 40, 80}
	h := make([]float64, len(ts))
	for i, x := range ts {
		h[i] = math.Exp(-x / 50)
	}
	r, err := Hvorslev(Test{Geometry: scGeom, Readings: models.Data{Time: ts, Value: h}}, ScreenLong, nil)
	if err != nil {
		t.Fatal(err)
	}
	k := r.K.Value
	want := map[string]float64{"m/s": k, "m/d": k * 86400, "ft/d": k * 86400 / 0.3048, "cm/s": k * 100}
	if len(r.KIn) != 4 {
		t.Fatalf("%d units", len(r.KIn))
	}
	for _, u := range r.KIn {
		if relDiff(u.Value, want[u.Unit.Symbol]) > 1e-15 {
			t.Errorf("K = %g %s, want %g", u.Value, u.Unit.Symbol, want[u.Unit.Symbol])
		}
	}
	if u, _ := units.Lookup("ft/d"); r.KIn[2].Unit.Symbol != u.Symbol || r.KIn[2].Unit.Factor != u.Factor {
		t.Errorf("third unit %v", r.KIn[2].Unit)
	}
}

// TestExpectedH0: V/(π r_c²) by hand: 1 L in a 50 mm casing →
// 0.001/(π·0.000625) = 0.509296 m.
func TestExpectedH0(t *testing.T) {
	test := lineTest(scGeom, 0.01, 0)
	test.SlugVolume = 0.001
	nd, err := Normalise(test, 0)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(nd.ExpectedH0-0.5092958) > 1e-7 || nd.H0Reading != 0 {
		t.Errorf("expected H0 = %.7g m (reading %d), want 0.5092958", nd.ExpectedH0, nd.H0Reading)
	}
	if nd.Data.Value[0] != 1 {
		t.Errorf("first H/H0 = %v", nd.Data.Value[0])
	}
	test.H0 = 0.3
	nd, _ = Normalise(test, 0)
	if len(nd.Notes) != 2 || !strings.Contains(nd.Notes[1], "differ by more than 10 %") {
		t.Errorf("notes %q", nd.Notes)
	}
}

// TestErrors: bad geometry and readings give *models.Error values naming
// the field or reading.
func TestErrors(t *testing.T) {
	good := lineTest(scGeom, 0.01, 0)
	with := func(f func(*Test)) Test {
		c := good
		c.Readings.Time = append([]float64(nil), good.Readings.Time...)
		c.Readings.Value = append([]float64(nil), good.Readings.Value...)
		f(&c)
		return c
	}
	cases := []struct {
		name  string
		test  Test
		s     *Settings
		want  error
		field string
		index int
	}{
		{"zero casing radius", with(func(c *Test) { c.Geometry.CasingRadius = 0 }), nil, models.ErrBadConstant, "casing radius", -1},
		{"negative well radius", with(func(c *Test) { c.Geometry.WellRadius = -0.1 }), nil, models.ErrBadConstant, "well radius", -1},
		{"screen below aquifer", with(func(c *Test) { c.Geometry.AquiferThickness = 5 }), nil, models.ErrBadConstant, "screen bottom depth", -1},
		{"screen longer than aquifer", with(func(c *Test) { c.Geometry.ScreenBottom = 0; c.Geometry.AquiferThickness = 2 }), nil, models.ErrBadConstant, "screen length", -1},
		{"screen longer than Lw", with(func(c *Test) { c.Geometry.ScreenLength = 7 }), nil, models.ErrBadConstant, "screen length", -1},
		{"porosity 1", with(func(c *Test) { c.Geometry.PackPorosity = 1 }), nil, models.ErrBadConstant, "gravel-pack porosity", -1},
		{"NaN time", with(func(c *Test) { c.Readings.Time[3] = math.NaN() }), nil, models.ErrBadReading, "time", 3},
		{"negative time", with(func(c *Test) { c.Readings.Time[2] = -5 }), nil, models.ErrBadReading, "time", 2},
		{"Inf displacement", with(func(c *Test) { c.Readings.Value[4] = math.Inf(1) }), nil, models.ErrBadReading, "displacement", 4},
		{"zero first reading", with(func(c *Test) { c.Readings.Value[0] = 0 }), nil, models.ErrBadReading, "displacement", 0},
		{"overshoot in window", with(func(c *Test) { c.Readings.Value[30] = -0.001 }), nil, models.ErrBadReading, "normalised head", 30},
		{"rising head", with(func(c *Test) {
			for i := range c.Readings.Value {
				c.Readings.Value[i] = 0.1 + 0.001*c.Readings.Time[i]
			}
		}), nil, models.ErrNoTrend, "slope of ln(H/H0)", -1},
		{"lengths", with(func(c *Test) { c.Readings.Value = c.Readings.Value[:3] }), nil, models.ErrLength, "", -1},
		{"bad volume", with(func(c *Test) { c.SlugVolume = -1 }), nil, models.ErrBadConstant, "slug volume", -1},
		{"too few in window", good, &Settings{From: 1e6}, models.ErrTooFewPoints, "", -1},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := Hvorslev(c.test, ScreenLong, c.s)
			var e *models.Error
			if !errors.As(err, &e) || !errors.Is(err, c.want) {
				t.Fatalf("err = %v, want %v", err, c.want)
			}
			if e.Field != c.field || e.Index != c.index || e.Method != hvorslevName {
				t.Errorf("err = %v: field %q index %d method %q, want %q %d", err, e.Field, e.Index, e.Method, c.field, c.index)
			}
		})
	}
	// An overshoot outside the window is fine.
	_, err := Hvorslev(with(func(c *Test) { c.Readings.Value[40] = -0.001 }), ScreenLong, &Settings{To: 200})
	if err != nil {
		t.Errorf("overshoot outside the window: %v", err)
	}
	// Bouwer–Rice needs Lw.
	g := good
	g.Geometry.ScreenBottom = 0
	if _, err := BouwerRice(g, nil, nil); !errors.Is(err, models.ErrBadConstant) || !strings.Contains(err.Error(), "screen bottom depth") {
		t.Errorf("Bouwer–Rice without Lw: %v", err)
	}
	// CBP with readings that never fall below 0.95.
	flat := with(func(c *Test) {
		for i := range c.Readings.Value {
			c.Readings.Value[i] = 0.5
		}
	})
	if _, err := CooperBredehoeftPapadopulos(flat, nil); !errors.Is(err, models.ErrNoTrend) {
		t.Errorf("CBP on flat readings: %v", err)
	}
}
