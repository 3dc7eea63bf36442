package infiltration

import (
	"errors"
	"fmt"
	"math"

	"fieldfit/models"
	"fieldfit/models/units"
)

// Sentinel errors of the readings, wrapped in *models.Error; test for
// them with errors.Is.
var (
	// ErrTimeOrder: a reading's time is not later than the one before.
	ErrTimeOrder = errors.New("times out of order")
	// ErrRefill: a refill mark that cannot be right (the refill does not
	// raise the water, or it is marked on a volume reading).
	ErrRefill = errors.New("refill mark out of order")
)

const readingsName = "infiltration readings"

// Kind says what the readings of a test measure.
type Kind int

const (
	// Levels: each reading is the water level in the inner ring; refills
	// are marked on the reading taken just before them, with the level
	// after the refill.
	Levels Kind = iota
	// Volumes: each reading is the volume of water added at that time to
	// bring the level in the inner ring back to a fixed mark; the volume
	// of the first reading (the initial fill) is not infiltration and is
	// not counted.
	Volumes
)

// Reading is one line of the field sheet.
type Reading struct {
	// Time is the clock time of the reading in seconds, on any origin:
	// the first reading marks the start of the test (t = 0).
	Time float64
	// Value is the water level (Levels) or the volume added (Volumes),
	// in the test's Unit.
	Value float64
	// Refill marks that the ring was refilled right after this reading
	// (Levels only); RefillTo is the level after the refill, in Unit.
	Refill   bool
	RefillTo float64
}

// Test is a ring infiltration test (single or double ring).
type Test struct {
	// InnerDiameter is the diameter of the inner (or only) ring, m. It
	// converts volumes to depths: F = V / (π D²/4). Required for Volumes.
	InnerDiameter float64
	// OuterDiameter is the diameter of the outer ring of a double-ring
	// test, m; 0 for a single ring. It is only checked (it must exceed
	// the inner diameter) and reported.
	OuterDiameter float64
	// Kind says whether the readings are levels or volumes.
	Kind Kind
	// Unit is the symbol of the unit of Value and RefillTo: a length
	// ("mm", "cm", "in", "m", "ft") for Levels, a volume ("L", "m³",
	// "US gal") for Volumes.
	Unit string
	// DistanceDown says that level readings are distances from a
	// reference (the ring's rim, a bridge) down to the water surface,
	// which grow as the water infiltrates; by default a level is the
	// depth of water in the ring, which falls.
	DistanceDown bool
	// Readings are the readings in the order taken.
	Readings []Reading
}

// Cumulative is the cumulative infiltration rebuilt from a test's
// readings, in SI units.
type Cumulative struct {
	// Time is the time since the first reading, s, and Depth the
	// cumulative infiltration F at that time, m (Time[0] = Depth[0] = 0).
	Time, Depth []float64
	// Rate is the mean infiltration rate over each interval between
	// readings, m/s: Rate[i] = (Depth[i+1] − Depth[i]) / (Time[i+1] −
	// Time[i]); len(Rate) = len(Time) − 1.
	Rate []float64
	// Notes are plain sentences about the readings (refills counted,
	// readings where the infiltration went negative, the initial fill).
	Notes []string
}

func readingErr(i int, field string, v float64, sentinel error, format string, args ...any) *models.Error {
	return &models.Error{Method: readingsName, Index: i, Field: field, Value: v, Err: sentinel, Reason: fmt.Sprintf(format, args...)}
}

// Rebuild checks the test and rebuilds its cumulative infiltration across
// refills. For level readings the infiltration between readings i−1 and i
// is the fall of the water from the level after reading i−1 (RefillTo when
// it was refilled, its Value otherwise) to the Value of reading i; for
// volume readings it is the volume of reading i over the inner-ring area.
//
// Errors are *models.Error values naming the reading (0-based index) and
// the field: a time not later than the previous one (ErrTimeOrder), a
// refill that does not raise the water or is marked on a volume reading
// (ErrRefill), a value that is not finite or a negative volume
// (models.ErrBadReading), an unknown unit or a bad diameter
// (models.ErrBadConstant). A level that rises without a refill mark is not
// an error: the negative infiltration is kept and a note names the
// reading.
func Rebuild(t Test) (*Cumulative, error) {
	u, ok := units.Lookup(t.Unit)
	want := units.Length
	if t.Kind == Volumes {
		want = units.Volume
	}
	switch {
	case t.Kind != Levels && t.Kind != Volumes:
		return nil, readingErr(-1, "kind", float64(t.Kind), models.ErrBadConstant, "unknown kind of readings")
	case !ok:
		return nil, &models.Error{Method: readingsName, Index: -1, Err: models.ErrBadConstant, Reason: fmt.Sprintf("unknown unit %q", t.Unit)}
	case u.Quantity != want:
		return nil, &models.Error{Method: readingsName, Index: -1, Err: models.ErrBadConstant,
			Reason: fmt.Sprintf("unit %q is a %v, but these readings need a %v", t.Unit, u.Quantity, want)}
	}
	d := t.InnerDiameter
	if bad(d) || d < 0 || (t.Kind == Volumes && d == 0) {
		return nil, readingErr(-1, "inner diameter", d, models.ErrBadConstant, "the inner ring diameter must be a finite positive length")
	}
	if o := t.OuterDiameter; bad(o) || o < 0 || (o > 0 && o <= d) {
		return nil, readingErr(-1, "outer diameter", o, models.ErrBadConstant, "the outer ring must be wider than the inner ring (%g m), or 0 for a single ring", d)
	}
	n := len(t.Readings)
	if n < 2 {
		return nil, &models.Error{Method: readingsName, Index: -1, Err: models.ErrTooFewPoints, Reason: fmt.Sprintf("at least 2 readings are needed, %d given", n)}
	}
	area := math.Pi * d * d / 4
	c := &Cumulative{Time: make([]float64, n), Depth: make([]float64, n), Rate: make([]float64, n-1)}
	sign := 1.0 // infiltration = sign·(previous level − this level)
	if t.DistanceDown {
		sign = -1
	}
	t0 := t.Readings[0].Time
	refills, negative := 0, []int(nil)
	var level float64 // level after the previous reading, SI
	for i, r := range t.Readings {
		if bad(r.Time) {
			return nil, readingErr(i, "time", r.Time, models.ErrBadReading, "not a finite number")
		}
		if i > 0 && !(r.Time > t.Readings[i-1].Time) {
			return nil, readingErr(i, "time", r.Time, ErrTimeOrder, "the reading is not later than the one before (%g s)", t.Readings[i-1].Time)
		}
		if bad(r.Value) {
			return nil, readingErr(i, "value", r.Value, models.ErrBadReading, "not a finite number")
		}
		v := u.ToSI(r.Value)
		c.Time[i] = r.Time - t0
		switch t.Kind {
		case Levels:
			if i > 0 {
				inc := sign * (level - v)
				c.Depth[i] = c.Depth[i-1] + inc
				if inc < 0 {
					negative = append(negative, i)
				}
			}
			level = v
			if r.Refill {
				if bad(r.RefillTo) {
					return nil, readingErr(i, "refill level", r.RefillTo, models.ErrBadReading, "not a finite number")
				}
				to := u.ToSI(r.RefillTo)
				if !(sign*(to-v) > 0) {
					return nil, readingErr(i, "refill level", r.RefillTo, ErrRefill,
						"the refill does not raise the water above the reading before it (%g %s)", r.Value, u.Symbol)
				}
				level = to
				refills++
			}
		case Volumes:
			if r.Refill {
				return nil, readingErr(i, "refill", 1, ErrRefill, "refill marks belong to level readings; with volume readings every reading is a refill to the mark")
			}
			if v < 0 {
				return nil, readingErr(i, "value", r.Value, models.ErrBadReading, "a volume added cannot be negative")
			}
			if i == 0 {
				if v > 0 {
					c.Notes = append(c.Notes, fmt.Sprintf("The volume of the first reading (%g %s) is the initial fill and is not counted as infiltration.", r.Value, u.Symbol))
				}
				continue
			}
			c.Depth[i] = c.Depth[i-1] + v/area
		}
		if i > 0 {
			c.Rate[i-1] = (c.Depth[i] - c.Depth[i-1]) / (c.Time[i] - c.Time[i-1])
		}
	}
	if refills > 0 {
		c.Notes = append(c.Notes, fmt.Sprintf("%d refills were bridged: the infiltration after each counts from the refilled level.", refills))
	}
	if len(negative) > 0 {
		c.Notes = append(c.Notes, fmt.Sprintf("The water rose without a refill mark before reading(s) %v: the infiltration there is negative and kept as read; mark a refill if there was one.", negative))
	}
	return c, nil
}

func bad(v float64) bool { return math.IsNaN(v) || math.IsInf(v, 0) }
