package slug

import (
	"fmt"
	"math"

	"fieldfit/models"
)

// Test is one slug test: the well, the readings and the initial
// displacement.
type Test struct {
	// Geometry is the construction of the well.
	Geometry Geometry

	// Readings hold the time since the slug was introduced or removed
	// (or the pressure released), s, and the displacement of the water
	// level from the static level at that time, m (either sign: positive
	// above the static level for a falling-head test, negative below it
	// for a rising-head test). Weight and Exclude work as in models.Data.
	Readings models.Data

	// H0 is the initial displacement, m, in the sense of the readings.
	// 0 means the displacement of the earliest reading not excluded.
	H0 float64

	// SlugVolume is the volume of the slug, m³; 0 means not given. When
	// it is given, the expected initial displacement V/(π r_c²) is shown
	// beside H0 as a check (r_c the effective casing radius).
	SlugVolume float64
}

// Normalised is a slug test's readings as normalised head H/H0.
type Normalised struct {
	// Data has the times, weights and exclusion marks of the readings
	// and Value = H/H0.
	Data models.Data
	// H0 is the initial displacement used, m; H0Reading is the index of
	// the reading it was taken from, or -1 when it was entered.
	H0        float64
	H0Reading int
	// ExpectedH0 = V/(π r_c²) from the slug volume, m (sign of H0), or
	// NaN when no volume was given; H0Ratio = H0/ExpectedH0 (NaN likewise).
	ExpectedH0, H0Ratio float64
	// Notes are plain sentences about H0 for the user.
	Notes []string
}

// Normalise checks the test's geometry and readings and returns the
// normalised head H/H0. Readings marked excluded are carried over
// unchecked; every other reading must have a finite time ≥ 0 and a finite
// displacement. tolerance is the relative difference between H0 and the
// displacement expected from the slug volume above which a note warns of
// it (0 means 0.1, our choice).
func Normalise(t Test, tolerance float64) (*Normalised, error) {
	const method = "slug test"
	if err := t.Geometry.Check(); err != nil {
		return nil, err
	}
	d := t.Readings
	n := len(d.Time)
	if len(d.Value) != n {
		return nil, &models.Error{Method: method, Index: -1, Err: models.ErrLength,
			Reason: fmt.Sprintf("%d displacements for %d times", len(d.Value), n)}
	}
	if d.Weight != nil && len(d.Weight) != n {
		return nil, &models.Error{Method: method, Index: -1, Err: models.ErrLength,
			Reason: fmt.Sprintf("%d weights for %d times", len(d.Weight), n)}
	}
	if d.Exclude != nil && len(d.Exclude) != n {
		return nil, &models.Error{Method: method, Index: -1, Err: models.ErrLength,
			Reason: fmt.Sprintf("%d exclusion marks for %d times", len(d.Exclude), n)}
	}
	if bad(tolerance) || tolerance < 0 {
		return nil, &models.Error{Method: method, Index: -1, Field: "H0 tolerance", Value: tolerance, Err: models.ErrBadConstant,
			Reason: "the tolerance must be a finite number ≥ 0"}
	}
	if tolerance == 0 {
		tolerance = 0.1
	}
	first := -1
	for i := 0; i < n; i++ {
		if d.Exclude != nil && d.Exclude[i] {
			continue
		}
		if bad(d.Time[i]) || d.Time[i] < 0 {
			return nil, &models.Error{Method: method, Index: i, Field: "time", Value: d.Time[i], Err: models.ErrBadReading,
				Reason: "the time since the start of the test must be a finite number ≥ 0"}
		}
		if bad(d.Value[i]) {
			return nil, &models.Error{Method: method, Index: i, Field: "displacement", Value: d.Value[i], Err: models.ErrBadReading,
				Reason: "not a finite number"}
		}
		if first < 0 || d.Time[i] < d.Time[first] {
			first = i
		}
	}
	out := &Normalised{H0: t.H0, H0Reading: -1, ExpectedH0: math.NaN(), H0Ratio: math.NaN()}
	switch {
	case bad(t.H0):
		return nil, &models.Error{Method: method, Index: -1, Field: "H0", Value: t.H0, Err: models.ErrBadConstant, Reason: "not a finite number"}
	case t.H0 == 0 && first < 0:
		return nil, &models.Error{Method: method, Index: -1, Err: models.ErrTooFewPoints, Reason: "no readings to take the initial displacement from"}
	case t.H0 == 0:
		out.H0, out.H0Reading = d.Value[first], first
		if out.H0 == 0 {
			return nil, &models.Error{Method: method, Index: first, Field: "displacement", Value: 0, Err: models.ErrBadReading,
				Reason: "the first reading, taken as the initial displacement H0, is zero; enter H0"}
		}
		out.Notes = append(out.Notes, fmt.Sprintf("H0 = %.4g m is the displacement of the first reading (point %d, t = %g s).", out.H0, first, d.Time[first]))
	default:
		out.Notes = append(out.Notes, fmt.Sprintf("H0 = %.4g m as entered.", out.H0))
	}
	if bad(t.SlugVolume) || t.SlugVolume < 0 {
		return nil, &models.Error{Method: method, Index: -1, Field: "slug volume", Value: t.SlugVolume, Err: models.ErrBadConstant,
			Reason: "the slug volume must be a finite number ≥ 0"}
	}
	if t.SlugVolume > 0 {
		rc := t.Geometry.EffectiveCasingRadius()
		out.ExpectedH0 = math.Copysign(t.SlugVolume/(math.Pi*rc*rc), out.H0)
		out.H0Ratio = out.H0 / out.ExpectedH0
		s := fmt.Sprintf("The slug volume %.4g L gives an expected initial displacement V/(π r_c²) = %.4g m; H0 is %.3g times that.",
			t.SlugVolume*1e3, out.ExpectedH0, out.H0Ratio)
		if math.Abs(out.H0Ratio-1) > tolerance {
			s += fmt.Sprintf(" They differ by more than %.3g %%: check H0, the volume and the casing radius (or the first reading was late or disturbed).", 100*tolerance)
		}
		out.Notes = append(out.Notes, s)
	}
	out.Data = models.Data{Time: d.Time, Value: make([]float64, n), Weight: d.Weight, Exclude: d.Exclude}
	for i, v := range d.Value {
		out.Data.Value[i] = v / out.H0
	}
	return out, nil
}

// checkNormalised checks one normalised reading; positive says that it
// must be positive (for the log-line methods).
func checkNormalised(t, y float64, positive bool) error {
	if bad(t) || t < 0 {
		return &models.Error{Index: -1, Field: "time", Value: t, Err: models.ErrBadReading,
			Reason: "the time since the start of the test must be a finite number ≥ 0"}
	}
	if bad(y) {
		return &models.Error{Index: -1, Field: "normalised head", Value: y, Err: models.ErrBadReading, Reason: "not a finite number"}
	}
	if positive && !(y > 0) {
		return &models.Error{Index: -1, Field: "normalised head", Value: y, Err: models.ErrBadReading,
			Reason: "H/H0 must be positive to take its logarithm; leave this reading out or end the window before it"}
	}
	return nil
}
