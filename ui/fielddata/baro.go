package fielddata

import (
	"math"
	"sort"
)

// Interpolate returns the values of the record (bt, bv) at the times t by
// linear interpolation between the two readings around each time, and
// the nearest end value outside [bt[0], bt[len-1]]. bt must be in
// non-decreasing order and non-empty; at a repeated time the later
// reading counts. t may be in any order.
func Interpolate(t, bt, bv []float64) []float64 {
	out := make([]float64, len(t))
	n := len(bt)
	for i, x := range t {
		switch {
		case n == 0:
			out[i] = math.NaN()
		case x <= bt[0]:
			out[i] = bv[0]
			if x == bt[0] {
				// the later of repeated first times
				j := sort.SearchFloat64s(bt, math.Nextafter(x, math.Inf(1))) - 1
				out[i] = bv[j]
			}
		case x >= bt[n-1]:
			out[i] = bv[n-1]
		default:
			// bt[j-1] <= x < bt[j]
			j := sort.Search(n, func(k int) bool { return bt[k] > x })
			a, b := bt[j-1], bt[j]
			w := (x - a) / (b - a)
			out[i] = bv[j-1] + w*(bv[j]-bv[j-1])
		}
	}
	return out
}

// Coverage says how well a barometric record covers a water record.
type Coverage struct {
	// From and To bound the barometric record (s, after the shift).
	From, To float64
	// Before and After count the water readings earlier than From and
	// later than To: for them the nearest barometric reading was used
	// (or they were left out, with BaroCompensation.DropUncovered).
	Before, After int
	// LongestGap is the longest interval between barometric readings
	// inside the span of the water record (s), starting at GapFrom, and
	// Interval the barometric record's median interval.
	LongestGap, GapFrom, Interval float64
}

// Covered reports whether every water reading lies inside the
// barometric record.
func (c Coverage) Covered() bool { return c.Before == 0 && c.After == 0 }

func coverage(t, bt []float64) Coverage {
	c := Coverage{From: bt[0], To: bt[len(bt)-1]}
	for _, x := range t {
		if x < c.From {
			c.Before++
		} else if x > c.To {
			c.After++
		}
	}
	if len(t) == 0 {
		return c
	}
	lo, hi := t[0], t[len(t)-1]
	var iv []float64
	for i := 1; i < len(bt); i++ {
		d := bt[i] - bt[i-1]
		if d > 0 {
			iv = append(iv, d)
		}
		if bt[i] > lo && bt[i-1] < hi && d > c.LongestGap {
			c.LongestGap, c.GapFrom = d, bt[i-1]
		}
	}
	if len(iv) > 0 {
		sort.Float64s(iv)
		c.Interval = iv[len(iv)/2]
	}
	return c
}
