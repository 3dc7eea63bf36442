package slug

import (
	"fmt"
	"math"

	"fieldfit/models"
)

const bouwerRiceName = "Bouwer–Rice (1976)"

// Coefficients are the dimensionless coefficients A, B (partially
// penetrating screens) and C (fully penetrating screens) of Bouwer &
// Rice (1976), functions of Le/r_w read from the curves of their paper
// (their Fig. 3).
type Coefficients struct {
	A, B, C float64
	// Source says where the values come from, in words.
	Source string
	// FromMemory is true for the built-in polynomial fits, which are
	// recalled from memory and not verified against the published source
	// (see PolynomialCoefficients); values the user read from the paper's
	// curves and entered leave it false.
	FromMemory bool
}

// Polynomial fits of A, B and C in x = Le/r_w, recalled FROM MEMORY as
// the published fits of the curves of Bouwer & Rice (1976) — believed to
// be those of Van Rooy (1988), the source the project's reference §6
// names, but NOT VERIFIED against it nor against the curves. They are
// used only for 1 ≤ Le/r_w ≤ 1000 (beyond that the recalled A and C turn
// down, unlike the curves), and every result that uses them says so.
var (
	polyA = [...]float64{1.4720, 3.537e-2, -8.148e-5, 1.028e-7, -6.484e-11, 1.573e-14}
	polyB = [...]float64{0.2372, 5.151e-3, -2.682e-6, -3.491e-10, 4.738e-13}
	polyC = [...]float64{0.7920, 3.993e-2, -5.743e-5, 3.858e-8, -9.659e-12}
)

// PolynomialMinRatio and PolynomialMaxRatio bound Le/r_w where
// PolynomialCoefficients is used.
const (
	PolynomialMinRatio = 1.0
	PolynomialMaxRatio = 1000.0
)

// polyUnverified is the caveat every result from the built-in
// coefficients carries.
const polyUnverified = "A, B and C come from polynomial fits of the curves of Bouwer & Rice (1976) that are recalled from memory (believed to be Van Rooy 1988) and have NOT been verified against the published source: check them against the paper's curves, or enter the values read from the curves, before relying on K."

func horner(c []float64, x float64) float64 {
	v := 0.0
	for i := len(c) - 1; i >= 0; i-- {
		v = v*x + c[i]
	}
	return v
}

// PolynomialCoefficients returns A, B and C at ratio = Le/r_w from the
// built-in polynomial fits (from memory, not verified; see polyA). It
// fails outside 1 ≤ Le/r_w ≤ 1000.
func PolynomialCoefficients(ratio float64) (Coefficients, error) {
	if bad(ratio) || ratio < PolynomialMinRatio || ratio > PolynomialMaxRatio {
		return Coefficients{}, &models.Error{Method: bouwerRiceName, Index: -1, Field: "Le/r_w", Value: ratio, Err: models.ErrBadConstant,
			Reason: fmt.Sprintf("the built-in fits of A, B, C are used only for %g ≤ Le/r_w ≤ %g; enter A, B, C read from the curves of Bouwer & Rice (1976)", PolynomialMinRatio, PolynomialMaxRatio)}
	}
	return Coefficients{
		A: horner(polyA[:], ratio), B: horner(polyB[:], ratio), C: horner(polyC[:], ratio),
		Source:     "polynomial fits of the curves of Bouwer & Rice (1976), recalled from memory (believed Van Rooy 1988), not verified",
		FromMemory: true,
	}, nil
}

// LnReRw returns ln(Re/r_w) of Bouwer & Rice (1976) for the geometry g and
// the coefficients c:
//
//	partially penetrating (Lw < H, or H not known):
//	  ln(Re/r_w) = [1.1/ln(Lw/r_w) + (A + B·ln((H − Lw)/r_w))/(Le/r_w)]⁻¹,
//	  with ln((H − Lw)/r_w) taken as at most 6 (and as 6 when H is not known);
//	fully penetrating (Lw = H):
//	  ln(Re/r_w) = [1.1/ln(Lw/r_w) + C/(Le/r_w)]⁻¹.
//
// It also reports whether the fully penetrating form was used.
func LnReRw(g Geometry, c Coefficients) (v float64, full bool, err error) {
	if err := g.check(bouwerRiceName); err != nil {
		return 0, false, err
	}
	if err := checkLength(bouwerRiceName, "screen length", g.ScreenLength, true); err != nil {
		return 0, false, err
	}
	if err := checkLength(bouwerRiceName, "screen bottom depth", g.ScreenBottom, true); err != nil {
		return 0, false, err
	}
	rw, le, lw, h := g.WellRadius, g.ScreenLength, g.ScreenBottom, g.AquiferThickness
	if !(lw > rw) {
		return 0, false, &models.Error{Method: bouwerRiceName, Index: -1, Field: "screen bottom depth", Value: lw, Err: models.ErrBadConstant,
			Reason: fmt.Sprintf("Lw must exceed the well radius r_w = %g m for ln(Lw/r_w) to be positive", rw)}
	}
	for _, f := range []struct {
		name string
		v    float64
	}{{"A", c.A}, {"B", c.B}, {"C", c.C}} {
		if bad(f.v) {
			return 0, false, &models.Error{Method: bouwerRiceName, Index: -1, Field: f.name, Value: f.v, Err: models.ErrBadConstant, Reason: "not a finite number"}
		}
	}
	full = h > 0 && lw >= h
	inv := 1.1 / math.Log(lw/rw)
	if full {
		inv += c.C / (le / rw)
	} else {
		l := 6.0
		if h > 0 {
			l = math.Min(math.Log((h-lw)/rw), 6)
		}
		inv += (c.A + c.B*l) / (le / rw)
	}
	v = 1 / inv
	if !(v > 0) || bad(v) {
		return 0, full, &models.Error{Method: bouwerRiceName, Index: -1, Field: "ln(Re/r_w)", Value: v, Err: models.ErrBadConstant,
			Reason: "the geometry and coefficients give no positive ln(Re/r_w); check Lw, H, Le and A, B, C"}
	}
	return v, full, nil
}

// BouwerRice interprets the slug test by Bouwer & Rice (1976):
//
//	K = r_c² ln(Re/r_w) / (2 Le) · (1/t) ln(y0/y_t),
//
// where (1/t) ln(y0/y_t) is the decay rate m of the straight line of
// ln(H/H0) against time, fitted by least squares on the window of the
// settings with a free intercept (start the window on the second straight
// segment for the "double straight line" of a draining gravel pack), r_c
// the effective casing radius and ln(Re/r_w) from LnReRw. coef holds A,
// B, C read from the paper's curves by the user; nil means the
// built-in polynomial fits, which are from memory and unverified — the
// result then carries a caveat saying so.
//
// Reference: Bouwer, H. and Rice, R.C. (1976), A slug test for
// determining hydraulic conductivity of unconfined aquifers with
// completely or partially penetrating wells, Water Resources Research
// 12(3), 423–428.
func BouwerRice(t Test, coef *Coefficients, s *Settings) (*Result, error) {
	g := t.Geometry
	if err := g.check(bouwerRiceName); err != nil {
		return nil, err
	}
	if err := checkLength(bouwerRiceName, "screen length", g.ScreenLength, true); err != nil {
		return nil, err
	}
	var c Coefficients
	if coef != nil {
		c = *coef
		if c.Source == "" {
			c.Source = "entered by the user"
		}
	} else {
		var err error
		if c, err = PolynomialCoefficients(g.ScreenLength / g.WellRadius); err != nil {
			return nil, err
		}
	}
	lnr, full, err := LnReRw(g, c)
	if err != nil {
		return nil, err
	}
	nd, fr, err := fitLogLine(bouwerRiceName, t, s)
	if fr == nil {
		return nil, err
	}
	rc := g.EffectiveCasingRadius()
	r := lineResult(bouwerRiceName, nd, fr, rc*rc*lnr/(2*g.ScreenLength))
	r.LnReRw, r.Coefficients = lnr, c
	r.Assumptions = g.assumptions()
	if full {
		r.Assumptions = append(r.Assumptions, fmt.Sprintf("The screen fully penetrates the aquifer (Lw = H = %g m): ln(Re/r_w) = [1.1/ln(Lw/r_w) + C/(Le/r_w)]⁻¹ = %.4g with C = %.4g.", g.ScreenBottom, lnr, c.C))
	} else {
		how := fmt.Sprintf("ln((H − Lw)/r_w) = %.3g", math.Min(math.Log((g.AquiferThickness-g.ScreenBottom)/g.WellRadius), 6))
		if g.AquiferThickness == 0 {
			how = "the aquifer thickness is not known, so ln((H − Lw)/r_w) is taken at its limit of 6 (a thick aquifer)"
		} else if math.Log((g.AquiferThickness-g.ScreenBottom)/g.WellRadius) > 6 {
			how = "ln((H − Lw)/r_w) is limited to 6"
		}
		r.Assumptions = append(r.Assumptions, fmt.Sprintf("The screen partially penetrates the aquifer (Lw = %g m below the water level): ln(Re/r_w) = [1.1/ln(Lw/r_w) + (A + B ln((H − Lw)/r_w))/(Le/r_w)]⁻¹ = %.4g with A = %.4g, B = %.4g; %s.",
			g.ScreenBottom, lnr, c.A, c.B, how))
	}
	r.Assumptions = append(r.Assumptions,
		fmt.Sprintf("Le = %g m, r_w = %g m, Le/r_w = %.4g; A, B, C: %s.", g.ScreenLength, g.WellRadius, g.ScreenLength/g.WellRadius, c.Source),
		"The aquifer is unconfined (or leaky with a water table above the screen), the drawdown around the well is negligible, and the flow above the water table is ignored (Bouwer & Rice 1976).")
	if c.FromMemory {
		r.Caveats = append(r.Caveats, polyUnverified)
	}
	return r, err
}
