package slug

import (
	"fmt"
	"math"

	"fieldfit/models"
)

// Geometry is the construction of the tested well, all lengths in metres.
// A zero length means "not known" where the field says so.
type Geometry struct {
	// CasingRadius is r_c, the inside radius of the casing (riser) in
	// which the water level moves during the test. Required.
	CasingRadius float64

	// WellRadius is r_w, the radius of the screened interval: the radius
	// of the borehole with its gravel pack (Bouwer & Rice 1976) or of the
	// intake (Hvorslev 1951, R). Required.
	WellRadius float64

	// ScreenLength is Le, the length of the screen (of its saturated part
	// when it crosses the water table). Needed by Bouwer–Rice and by the
	// Hvorslev screen shapes; 0 = not known.
	ScreenLength float64

	// ScreenBottom is Lw, the depth of the bottom of the screen below the
	// static water level. Needed by Bouwer–Rice; 0 = not known.
	ScreenBottom float64

	// AquiferThickness is H, the saturated thickness of the aquifer
	// (Bouwer–Rice: from the static water level to the base of the
	// aquifer). 0 = not known.
	AquiferThickness float64

	// PackPorosity is n, the porosity of the gravel pack (0 ≤ n < 1).
	// It is used only when LevelInScreen is set; 0 = no pack correction.
	PackPorosity float64

	// LevelInScreen says that the water level moves within the screened,
	// gravel-packed interval, so that the pack drains and fills with the
	// casing. The casing radius is then replaced by the effective radius
	// √((1−n)r_c² + n r_w²) (see EffectiveCasingRadius).
	LevelInScreen bool
}

// checkLength reports a length that is negative or not finite, or zero
// when it is required.
func checkLength(method, field string, v float64, required bool) error {
	switch {
	case bad(v):
		return &models.Error{Method: method, Index: -1, Field: field, Value: v, Err: models.ErrBadConstant, Reason: "not a finite number"}
	case v < 0:
		return &models.Error{Method: method, Index: -1, Field: field, Value: v, Err: models.ErrBadConstant, Reason: "a length cannot be negative"}
	case required && v == 0:
		return &models.Error{Method: method, Index: -1, Field: field, Value: v, Err: models.ErrBadConstant, Reason: "this length is needed and must be greater than zero"}
	}
	return nil
}

// Check reports the first unusable field of g as a *models.Error naming
// it: a radius that is not positive, a negative or non-finite length, a
// screen longer than its depth below the water level, a screen reaching
// below the base of the aquifer, or a pack porosity outside [0, 1).
func (g Geometry) Check() error { return g.check("geometry") }

func (g Geometry) check(method string) error {
	if err := checkLength(method, "casing radius", g.CasingRadius, true); err != nil {
		return err
	}
	if err := checkLength(method, "well radius", g.WellRadius, true); err != nil {
		return err
	}
	for _, f := range []struct {
		name string
		v    float64
	}{{"screen length", g.ScreenLength}, {"screen bottom depth", g.ScreenBottom}, {"aquifer thickness", g.AquiferThickness}} {
		if err := checkLength(method, f.name, f.v, false); err != nil {
			return err
		}
	}
	if bad(g.PackPorosity) || g.PackPorosity < 0 || g.PackPorosity >= 1 {
		return &models.Error{Method: method, Index: -1, Field: "gravel-pack porosity", Value: g.PackPorosity, Err: models.ErrBadConstant,
			Reason: "the porosity must lie in [0, 1)"}
	}
	if g.ScreenBottom > 0 && g.ScreenLength > g.ScreenBottom {
		return &models.Error{Method: method, Index: -1, Field: "screen length", Value: g.ScreenLength, Err: models.ErrBadConstant,
			Reason: fmt.Sprintf("the screen is longer than the depth of its bottom below the water level (%g m); when it crosses the water level, enter its saturated length", g.ScreenBottom)}
	}
	if g.AquiferThickness > 0 {
		if g.ScreenBottom > g.AquiferThickness {
			return &models.Error{Method: method, Index: -1, Field: "screen bottom depth", Value: g.ScreenBottom, Err: models.ErrBadConstant,
				Reason: fmt.Sprintf("the screen reaches below the base of the aquifer (thickness %g m)", g.AquiferThickness)}
		}
		if g.ScreenLength > g.AquiferThickness {
			return &models.Error{Method: method, Index: -1, Field: "screen length", Value: g.ScreenLength, Err: models.ErrBadConstant,
				Reason: fmt.Sprintf("the screen is longer than the aquifer is thick (%g m)", g.AquiferThickness)}
		}
	}
	return nil
}

// EffectiveCasingRadius returns the radius of the casing as the test sees
// it: r_c, or, when the water level moves within a gravel-packed screen
// (LevelInScreen), the radius of the casing that holds the same volume per
// unit of level change as the casing and the drained pack together,
//
//	r_c,eff = √((1 − n) r_c² + n r_w²),
//
// with n the pack porosity. Source: Bouwer, H. (1989), The Bouwer and
// Rice slug test — an update, Ground Water 27(3), 304–309 — from memory,
// not re-read.
func (g Geometry) EffectiveCasingRadius() float64 {
	if !g.LevelInScreen {
		return g.CasingRadius
	}
	n := g.PackPorosity
	return math.Sqrt((1-n)*g.CasingRadius*g.CasingRadius + n*g.WellRadius*g.WellRadius)
}

// assumptions lists the geometry as the methods use it, in plain
// sentences.
func (g Geometry) assumptions() []string {
	var a []string
	rc := g.EffectiveCasingRadius()
	if g.LevelInScreen && g.PackPorosity > 0 {
		a = append(a, fmt.Sprintf("The water level moves within the gravel-packed screen: the effective casing radius √((1−n)r_c² + n r_w²) = %.4g m (n = %g, r_c = %g m, r_w = %g m) is used in place of r_c (Bouwer 1989, from memory).",
			rc, g.PackPorosity, g.CasingRadius, g.WellRadius))
	} else {
		a = append(a, fmt.Sprintf("The water level moves in the casing of radius r_c = %g m.", rc))
	}
	a = append(a, "The aquifer is homogeneous and isotropic around the screen, the test is short enough for the static level to stay put, and the well has no skin of different permeability.")
	return a
}
