package steptest

import (
	"errors"
	"math"
	"strings"
	"testing"

	"fieldfit/models/units"
)

// TestSecondSquaredPerFootFifth: 1 s²/ft⁵ = 1/0.3048⁵ s²/m⁵ = 380.1239…
// s²/m⁵ (exact arithmetic on 1 ft = 0.3048 m, NIST SP 811 (2008) App. B,
// reference §9), which is 5.09211e-8 d²/m⁵ as reference §8 gives it (the
// section is marked from memory; that figure is marked there as computed
// with a reference library).
func TestSecondSquaredPerFootFifth(t *testing.T) {
	if got := SecondSquaredPerFootFifth; math.Abs(got-380.1239089860632) > 1e-12 {
		t.Errorf("1 s²/ft⁵ = %.16g s²/m⁵, want 380.1239089860632", got)
	}
	if got := SecondSquaredPerFootFifth / (units.Day * units.Day); math.Abs(got-5.09211e-8) > 0.5e-13 {
		t.Errorf("1 s²/ft⁵ = %.6g d²/m⁵, want 5.09211e-8 (reference §8)", got)
	}
}

// TestWellCondition: the classes of Walton (1962) on C in s²/ft⁵ as
// reference §8 gives them (from memory): < 5 properly developed; 5–10 mild
// deterioration; 10–40 severe clogging; > 40 difficult to restore. A lower
// bound belongs to its class (our convention; the source gives ranges).
func TestWellCondition(t *testing.T) {
	cases := []struct {
		cft  float64
		want Class
	}{
		{0.5, ProperlyDeveloped},
		{4.99, ProperlyDeveloped},
		{5, MildDeterioration},
		{9.99, MildDeterioration},
		{10, SevereClogging},
		{39.9, SevereClogging},
		{40, DifficultToRestore},
		{400, DifficultToRestore},
	}
	for _, c := range cases {
		cond, err := WellCondition(c.cft * SecondSquaredPerFootFifth)
		if err != nil {
			t.Fatal(err)
		}
		if cond.Class != c.want || math.Abs(cond.CFeet-c.cft) > 1e-12*c.cft {
			t.Errorf("C = %g s²/ft⁵: class %v (%g), want %v", c.cft, cond.Class, cond.CFeet, c.want)
		}
		if !strings.Contains(cond.String(), "Walton (1962)") || !strings.Contains(cond.String(), c.want.String()) {
			t.Errorf("text %q", cond.String())
		}
	}
	for _, c := range []float64{0, -1, math.NaN(), math.Inf(1)} {
		cond, err := WellCondition(c)
		if !errors.Is(err, ErrLaw) {
			t.Errorf("C = %g: error %v", c, err)
		}
		if c <= 0 && cond.Class != NoClass {
			t.Errorf("C = %g: class %v", c, cond.Class)
		}
	}
	if from, to := SevereClogging.Bounds(); from != 10 || to != 40 {
		t.Errorf("bounds %g, %g", from, to)
	}
	if _, to := DifficultToRestore.Bounds(); !math.IsInf(to, 1) {
		t.Errorf("upper bound %g", to)
	}
}

// TestLossFitCondition: the class of a fitted C and of the ends of its
// interval; Rorabaugh's law has no class.
func TestLossFitCondition(t *testing.T) {
	// The scenario's C = 3000 s²/m⁵ is 7.9 s²/ft⁵: mild deterioration.
	law := Law{B: 280, C: 3000, N: 2}
	pts := []Point{}
	for k, q := range []float64{0.004, 0.008, 0.012, 0.016} {
		pts = append(pts, Point{q, law.Drawdown(q) + 0.05*float64(k%2)})
	}
	f, err := Jacob(pts, nil)
	if err != nil {
		t.Fatal(err)
	}
	cond, err := f.Condition()
	if err != nil {
		t.Fatal(err)
	}
	if cond.Class != MildDeterioration || cond.LowerClass == MildDeterioration && cond.UpperClass == MildDeterioration {
		t.Errorf("condition %+v", cond)
	}
	if !strings.Contains(cond.String(), "confidence interval") {
		t.Errorf("text %q", cond.String())
	}
	f.Law.N = 2.5
	if _, err := f.Condition(); !errors.Is(err, ErrLaw) {
		t.Errorf("n = 2.5: %v", err)
	}
}
