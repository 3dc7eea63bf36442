package slug

import (
	"fmt"
	"math"

	"fieldfit/models"
)

const hvorslevName = "Hvorslev (1951)"

// Shape is a piezometer geometry of Hvorslev (1951) with its shape factor
// F (m): K = π r_c² / (F·T0), r_c the (effective) casing radius, T0 the
// basic time lag, R = Geometry.WellRadius the radius of the intake and
// L = Geometry.ScreenLength its length. The soil is uniform and isotropic
// (Hvorslev's transformed length mL with m = 1).
//
// Source of every shape factor: Hvorslev, M.J. (1951), Time lag and soil
// permeability in ground-water observations, Bulletin 36, Waterways
// Experiment Station, Corps of Engineers, U.S. Army, Vicksburg, Mississippi
// (Fig. 4 and its cases) — from memory, not re-read; the form for L/R > 8
// is that of the project's reference §6.
type Shape int

const (
	// ScreenLong is a screen or well point of length L in uniform soil,
	// with L/R > 8: F = 2πL / ln(L/R), so K = r_c² ln(L/R) / (2 L T0).
	ScreenLong Shape = iota
	// Screen is the same intake for any L/R:
	// F = 2πL / ln(L/(2R) + √(1 + (L/(2R))²)).
	Screen
	// ScreenAtBoundary is an intake of length L with one end at an
	// impervious boundary (the confining bed above or below):
	// F = 2πL / ln(L/R + √(1 + (L/R)²)).
	ScreenAtBoundary
	// FlushBottom is an open-ended casing whose end is flush with the
	// bottom of the borehole, in uniform soil: F = 11R/2.
	FlushBottom
	// FlushBottomAtBoundary is an open-ended casing flush with the top of
	// the tested layer, under an impervious bed: F = 4R.
	FlushBottomAtBoundary
	numShapes
)

var shapeNames = [...]string{
	ScreenLong:            "screen in uniform soil, L/R > 8: F = 2πL/ln(L/R)",
	Screen:                "screen in uniform soil, any L/R: F = 2πL/ln(L/(2R) + √(1 + (L/(2R))²))",
	ScreenAtBoundary:      "screen with one end at an impervious boundary: F = 2πL/ln(L/R + √(1 + (L/R)²))",
	FlushBottom:           "open end of casing flush with the borehole bottom, uniform soil: F = 11R/2",
	FlushBottomAtBoundary: "open end of casing flush with the top of the layer, under an impervious bed: F = 4R",
}

// String names the geometry and its shape factor formula.
func (s Shape) String() string {
	if s < 0 || s >= numShapes {
		return fmt.Sprintf("Shape(%d)", int(s))
	}
	return shapeNames[s]
}

// Shapes lists every Hvorslev geometry offered.
func Shapes() []Shape {
	s := make([]Shape, numShapes)
	for i := range s {
		s[i] = Shape(i)
	}
	return s
}

// needsLength reports whether the shape uses the screen length.
func (s Shape) needsLength() bool { return s <= ScreenAtBoundary }

// Factor returns the shape factor F (m) of the geometry g, or an error
// naming the missing or unusable length.
func (s Shape) Factor(g Geometry) (float64, error) {
	if s < 0 || s >= numShapes {
		return 0, &models.Error{Method: hvorslevName, Index: -1, Field: "shape", Value: float64(s), Err: models.ErrBadConstant, Reason: "unknown piezometer geometry"}
	}
	if err := g.check(hvorslevName); err != nil {
		return 0, err
	}
	R, L := g.WellRadius, g.ScreenLength
	if s.needsLength() {
		if err := checkLength(hvorslevName, "screen length", L, true); err != nil {
			return 0, err
		}
	}
	switch s {
	case ScreenLong:
		if !(L > R) {
			return 0, &models.Error{Method: hvorslevName, Index: -1, Field: "screen length", Value: L, Err: models.ErrBadConstant,
				Reason: fmt.Sprintf("the form 2πL/ln(L/R) needs L > R (R = %g m), and holds for L/R > 8; use the general screen form", R)}
		}
		return 2 * math.Pi * L / math.Log(L/R), nil
	case Screen:
		x := L / (2 * R)
		return 2 * math.Pi * L / math.Asinh(x), nil // asinh x = ln(x + √(1+x²))
	case ScreenAtBoundary:
		return 2 * math.Pi * L / math.Asinh(L/R), nil
	case FlushBottom:
		return 5.5 * R, nil
	default: // FlushBottomAtBoundary
		return 4 * R, nil
	}
}

// Hvorslev interprets the slug test by Hvorslev's (1951) basic time lag:
// the normalised head of a piezometer in a uniform soil falls as
//
//	H/H0 = exp(−t/T0),
//
// so ln(H/H0) is a straight line of slope −1/T0; it is fitted on the
// window of the settings by least squares (with a free intercept, so that
// an early segment can be left out), and
//
//	K = π r_c² / (F·T0)
//
// with the shape factor F of the geometry (see Shape) and r_c the
// effective casing radius. The confidence interval of K is that of the
// slope, scaled. For ScreenLong with L/R ≤ 8 the result carries a caveat
// (use Screen).
//
// Reference: Hvorslev, M.J. (1951), Time lag and soil permeability in
// ground-water observations, Bulletin 36, Waterways Experiment Station,
// Corps of Engineers, U.S. Army.
func Hvorslev(t Test, shape Shape, s *Settings) (*Result, error) {
	F, err := shape.Factor(t.Geometry)
	if err != nil {
		return nil, err
	}
	nd, fr, err := fitLogLine(hvorslevName, t, s)
	if fr == nil {
		return nil, err
	}
	rc := t.Geometry.EffectiveCasingRadius()
	r := lineResult(hvorslevName, nd, fr, math.Pi*rc*rc/F)
	r.Shape = shape.String()
	g := t.Geometry
	r.Assumptions = append(g.assumptions(),
		fmt.Sprintf("Piezometer geometry: %s; F = %.4g m with R = %g m", shape, F, g.WellRadius)+
			map[bool]string{true: fmt.Sprintf(" and L = %g m.", g.ScreenLength), false: "."}[shape.needsLength()],
		"The head falls as one exponential, H/H0 = exp(−t/T0): the aquifer's storage is neglected (Hvorslev 1951).")
	if shape == ScreenLong && g.ScreenLength/g.WellRadius <= 8 {
		r.Caveats = append(r.Caveats, fmt.Sprintf("L/R = %.3g is not above 8, where the shape factor 2πL/ln(L/R) holds; use the general screen form.", g.ScreenLength/g.WellRadius))
	}
	return r, err
}
