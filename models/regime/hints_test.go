package regime

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"fieldfit/models/diagnostic"
)

// TestHantushW checks the test's own leaky well function against
// reference §3 (the reference-library values computed there by
// quadrature) and the identity W(u, β) + W(β²/(4u), β) = 2·K0(β) with
// 2K0(0.1) = 4.85413805 (reference §3, [lib]).
func TestHantushW(t *testing.T) {
	cases := []struct{ u, beta, want float64 }{
		{1e-3, 0.01, 6.30687772},
		{1e-3, 0.05, 5.79648131},
		{1e-2, 0.1, 3.81501652},
		{0.1, 0.5, 1.44219572},
		{1, 1, 0.185474811},
		{1, 2, 0.113893873},
	}
	for _, c := range cases {
		if got := hantushW(c.u, c.beta); math.Abs(got-c.want) > 2e-8*c.want+1e-8 {
			t.Errorf("W(%g, %g) = %.10g, want %.9g (reference §3)", c.u, c.beta, got, c.want)
		}
	}
	if got := hantushW(0.01, 0.1) + hantushW(0.01/0.04, 0.1); math.Abs(got-4.85413805) > 1e-7 {
		t.Errorf("W(u, β) + W(β²/4u, β) = %.10g, want 2K0(0.1) = 4.85413805", got)
	}
}

func kinds(hs []Hint) []Kind {
	k := make([]Kind, len(hs))
	for i, h := range hs {
		k[i] = h.Kind
	}
	return k
}

func find(hs []Hint, k Kind) (Hint, bool) {
	for _, h := range hs {
		if h.Kind == k {
			return h, true
		}
	}
	return Hint{}, false
}

func sameKinds(a, b []Kind) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// TestDiagnoseTheis: the Theis drawdown of the scenario, without and with
// seeded noise of 2 mm, gives a single flat-derivative hint whose
// transmissivity lies within 5 % of the generator's (measured: 0.01 %
// without noise, 0.2 % with), starting where the Theis derivative
// Q/(4πT)·e^(−u) has come within the band, and nothing else.
func TestDiagnoseTheis(t *testing.T) {
	ts := logTimes(161, 10, 1e6)
	clean := series(ts, func(t float64) float64 { return theis(scQ, scR, scT, scS, t) })
	rng := rand.New(rand.NewPCG(3, 5))
	noisy := series(ts, func(t float64) float64 { return theis(scQ, scR, scT, scS, t) + 0.002*rng.NormFloat64() })
	for _, c := range []struct {
		name   string
		s      []float64
		window float64
		tol    float64
	}{
		{"exact", clean, 0, 0.01},
		{"noisy", noisy, diagnostic.WindowFromCycles(0.2), 0.02},
	} {
		t.Run(c.name, func(t *testing.T) {
			dg, err := Diagnose(ts, c.s, &Settings{Rate: scQ, Window: c.window})
			if err != nil {
				t.Fatal(err)
			}
			if got := kinds(dg.Hints); !sameKinds(got, []Kind{Flat}) {
				t.Fatalf("hints %v, want one flat derivative: %+v", got, dg.Hints)
			}
			h := dg.Hints[0]
			if e := math.Abs(h.T/scT - 1); e > c.tol {
				t.Errorf("T = %.4g m²/s, %.2g off %.4g", h.T, e, scT)
			}
			if e := math.Abs(h.Level/(scQ/(4*math.Pi*scT)) - 1); e > c.tol {
				t.Errorf("level %.4g m, %.2g off Q/(4πT)", h.Level, e)
			}
			// The band is entered where e^(−u) ≥ (1 − 0.1)/(1 + 0.1) of the
			// late level, u = −ln(0.818) = 0.2007 → t = r²S/(4T·0.2007) =
			// 38.9 s; allow a few readings' spacing for the derivative's
			// smoothing and the noise.
			if t1 := scR * scR * scS / (4 * scT * 0.2007); h.From < t1/2 || h.From > 2*t1 {
				t.Errorf("flat from %g s, want near %.3g s", h.From, t1)
			}
			if h.Last != len(ts)-1 {
				t.Errorf("flat to reading %d, want the last", h.Last)
			}
			for _, w := range []string{"radial flow", "T = Q/(4π·ds/d ln t)", "m²/s"} {
				if !strings.Contains(h.Text, w) {
					t.Errorf("text %q lacks %q", h.Text, w)
				}
			}
			t.Logf("%s: %s", c.name, h.Text)
		})
	}
	// Without a rate, no T.
	dg, err := Diagnose(ts, clean, nil)
	if err != nil {
		t.Fatal(err)
	}
	if h := dg.Hints[0]; !math.IsNaN(h.T) || strings.Contains(h.Text, "T =") {
		t.Errorf("no rate: T %g, text %q", h.T, h.Text)
	}
}

// TestDiagnoseUnitSlope: s = c·t, the early drawdown of a well whose own
// storage supplies the water (analytic), gives a unit-slope hint over the
// record but its ends and no flat derivative.
func TestDiagnoseUnitSlope(t *testing.T) {
	ts := logTimes(41, 1, 100)
	s := series(ts, func(t float64) float64 { return 0.004 * t })
	dg, err := Diagnose(ts, s, nil)
	if err != nil {
		t.Fatal(err)
	}
	if got := kinds(dg.Hints); !sameKinds(got, []Kind{UnitSlope}) {
		t.Fatalf("hints %v, want one unit slope: %+v", got, dg.Hints)
	}
	// The ends, where the derivative takes one-sided differences, may
	// fall out; 0.2 of a log cycle is 4 readings here.
	h := dg.Hints[0]
	if h.First > 4 || h.Last < len(ts)-5 || math.Abs(h.Slope-1) > 0.02 || math.Abs(h.DerivSlope-1) > 0.02 {
		t.Errorf("hint %+v", h)
	}
	if !strings.Contains(h.Text, "wellbore storage") || len(dg.Notes) == 0 {
		t.Errorf("text %q, notes %q", h.Text, dg.Notes)
	}
	// A straight line in log time is flat, not unit slope.
	line := series(ts, func(t float64) float64 { return 0.1 + 0.2*math.Log(t) })
	dg, err = Diagnose(ts, line, nil)
	if err != nil {
		t.Fatal(err)
	}
	if got := kinds(dg.Hints); !sameKinds(got, []Kind{Flat}) {
		t.Errorf("semilog line: hints %v", got)
	}
}

// TestDiagnoseBoundaries: image wells (Theis 1935 superposed in space, an
// image at 500 m from OB-2) give a doubling for a no-flow boundary
// (s = Q/4πT·[W(u) + W(uᵢ)]), a rise short of double when the record stops
// early, and a fall for a recharge boundary (W(u) − W(uᵢ)); the Hantush–
// Jacob leaky drawdown with r/B = 0.01 gives a fall after the flat
// stretch. The flat stretch's T lies within 5 % of the generator's even
// though the boundary or the leakage keeps the derivative from reaching
// Q/(4πT) exactly (measured: 2.6 % high with the no-flow boundary, 2.9 %
// with the recharge boundary, 1.5 % with leakage).
func TestDiagnoseBoundaries(t *testing.T) {
	b := scQ / (4 * math.Pi * scT)
	u := func(r, t float64) float64 { return r * r * scS / (4 * scT * t) }
	noflow := func(t float64) float64 { return theis(scQ, scR, scT, scS, t) + theis(scQ, scRi, scT, scS, t) }
	recharge := func(t float64) float64 { return theis(scQ, scR, scT, scS, t) - theis(scQ, scRi, scT, scS, t) }
	leaky := func(t float64) float64 { return b * hantushW(u(scR, t), 0.01) }
	cases := []struct {
		name      string
		ts        []float64
		f         func(float64) float64
		want      []Kind
		ratioLo   float64
		ratioHi   float64
		textWords []string
	}{
		{"no-flow boundary", logTimes(161, 10, 1e6), noflow, []Kind{Flat, Doubling}, 1.85, 2.05, []string{"no-flow boundary", "doubles"}},
		{"no-flow boundary, stopped early", logTimes(81, 10, 7800), noflow, []Kind{Flat, Rising}, 1.4, 1.7, []string{"rises above", "would double"}},
		{"recharge boundary", logTimes(141, 10, 1e5), recharge, []Kind{Flat, Falling}, 0, 0.5, []string{"recharge boundary"}},
		{"leaky aquifer", logTimes(161, 10, 1e6), leaky, []Kind{Flat, Falling}, 0, 0.5, []string{"leakage"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dg, err := Diagnose(c.ts, series(c.ts, c.f), &Settings{Rate: scQ})
			if err != nil {
				t.Fatal(err)
			}
			if got := kinds(dg.Hints); !sameKinds(got, c.want) {
				for _, h := range dg.Hints {
					t.Log(h.Text)
				}
				t.Fatalf("hints %v, want %v", got, c.want)
			}
			flat, late := dg.Hints[0], dg.Hints[1]
			if e := math.Abs(flat.T/scT - 1); e > 0.05 {
				t.Errorf("flat stretch: T = %.4g, %.2g off %g", flat.T, e, scT)
			}
			if !(late.Ratio >= c.ratioLo && late.Ratio <= c.ratioHi) {
				t.Errorf("%v: ratio %.3g, want %g … %g", late.Kind, late.Ratio, c.ratioLo, c.ratioHi)
			}
			if late.First <= flat.Last || late.Last != len(c.ts)-1 || late.Level != flat.Level {
				t.Errorf("late hint %+v after flat %+v", late, flat)
			}
			for _, w := range c.textWords {
				if !strings.Contains(late.Text, w) {
					t.Errorf("text %q lacks %q", late.Text, w)
				}
			}
			t.Log(late.Text)
		})
	}
}

// TestDiagnoseFallWithoutFlat: a strongly leaky aquifer (r/B = 2) never
// shows a flat derivative (its peak, e^(−2)·Q/(4πT) at u = 1, stays within
// ±10 % for only 0.39 of a log cycle); the fall from the peak is reported.
// (With r/B = 0.5 or 1 the peak is flat within ±10 % for 0.74 and 0.54 of
// a cycle, and is reported as a possible flat stretch.)
func TestDiagnoseFallWithoutFlat(t *testing.T) {
	b := scQ / (4 * math.Pi * scT)
	ts := logTimes(121, 1, 1e4)
	s := series(ts, func(t float64) float64 { return b * hantushW(scR*scR*scS/(4*scT*t), 2) })
	dg, err := Diagnose(ts, s, nil)
	if err != nil {
		t.Fatal(err)
	}
	if got := kinds(dg.Hints); !sameKinds(got, []Kind{Falling}) {
		t.Fatalf("hints %v", got)
	}
	if h := dg.Hints[0]; !strings.Contains(h.Text, "no flat stretch") || !(h.Ratio < 0.8) {
		t.Errorf("hint %+v", h)
	}
	if len(dg.Notes) == 0 || !strings.Contains(dg.Notes[0], "No flat derivative") {
		t.Errorf("notes %q", dg.Notes)
	}
}

// TestDiagnoseBadInput: bad readings are named by package diagnostic, bad
// settings by this package.
func TestDiagnoseBadInput(t *testing.T) {
	ts := logTimes(10, 1, 100)
	s := series(ts, func(t float64) float64 { return math.Log(t) })
	unsorted := append([]float64(nil), ts...)
	unsorted[4], unsorted[5] = unsorted[5], unsorted[4]
	nan := append([]float64(nil), s...)
	nan[3] = math.NaN()
	cases := []struct {
		name  string
		t, s  []float64
		set   *Settings
		err   error
		words string
	}{
		{"unsorted", unsorted, s, nil, diagnostic.ErrUnsorted, "index 5"},
		{"NaN drawdown", ts, nan, nil, diagnostic.ErrNotFinite, "index 3"},
		{"one reading", ts[:1], s[:1], nil, diagnostic.ErrTooFew, "len(t)"},
		{"lengths", ts, s[:4], nil, diagnostic.ErrLength, "len(s)"},
		{"negative rate", ts, s, &Settings{Rate: -1}, ErrSetting, "Rate = -1"},
		{"flat tolerance", ts, s, &Settings{FlatTol: 1.5}, ErrSetting, "FlatTol = 1.5"},
		{"doubling tolerance", ts, s, &Settings{DoublingTol: math.NaN()}, ErrSetting, "DoublingTol = NaN"},
		{"window", ts, s, &Settings{Window: -0.1}, ErrSetting, "Window = -0.1"},
		{"cycles", ts, s, &Settings{MinCycles: -2}, ErrSetting, "MinCycles = -2"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dg, err := Diagnose(c.t, c.s, c.set)
			if err == nil || dg != nil {
				t.Fatalf("no error (%v)", dg)
			}
			if !errors.Is(err, c.err) || !strings.Contains(err.Error(), c.words) {
				t.Errorf("error %q, want %v naming %q", err, c.err, c.words)
			}
		})
	}
}

// TestDiagnoseBrokenFlat: a flat derivative broken by one bad reading is
// two flat stretches at about the same level, and the doubling after them
// is still recognised against the first.
func TestDiagnoseBrokenFlat(t *testing.T) {
	ts := logTimes(241, 10, 1e6)
	s := series(ts, func(t float64) float64 { return theis(scQ, scR, scT, scS, t) + theis(scQ, scRi, scT, scS, t) })
	// A reading 5 cm off at about 300 s, inside the radial-flow stretch.
	i := 0
	for ts[i] < 300 {
		i++
	}
	s[i] += 0.05
	dg, err := Diagnose(ts, s, &Settings{Rate: scQ})
	if err != nil {
		t.Fatal(err)
	}
	got := kinds(dg.Hints)
	if len(got) < 3 || got[0] != Flat || got[len(got)-1] != Doubling {
		for _, h := range dg.Hints {
			t.Log(h.Text)
		}
		t.Fatalf("hints %v, want flat stretches then a doubling", got)
	}
	for _, h := range dg.Hints[:len(got)-1] {
		if h.Kind != Flat || math.Abs(h.T/scT-1) > 0.1 {
			t.Errorf("hint %v with T %g before the doubling", h.Kind, h.T)
		}
	}
}
