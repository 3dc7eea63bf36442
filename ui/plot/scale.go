package plot

import "math"

// Scale maps the values of one axis to pixels of the viewBox and back.
type Scale struct {
	// Log is true for a logarithmic axis.
	Log bool
	// Min and Max are the data range shown.
	Min, Max float64
	// From and To are the pixel coordinates of Min and Max. On a y axis
	// To < From unless the axis is inverted.
	From, To float64
}

// Pixel returns the pixel coordinate of the data value v. On a log axis it
// is NaN for v ≤ 0. Values outside [Min, Max] map outside [From, To].
func (s Scale) Pixel(v float64) float64 {
	f := s.frac(v)
	return s.From + f*(s.To-s.From)
}

// Value returns the data value at pixel coordinate p, the inverse of Pixel.
// Pixels outside [From, To] give values outside [Min, Max].
func (s Scale) Value(p float64) float64 {
	f := (p - s.From) / (s.To - s.From)
	if s.Log {
		lo, hi := math.Log10(s.Min), math.Log10(s.Max)
		return math.Pow(10, lo+f*(hi-lo))
	}
	return s.Min + f*(s.Max-s.Min)
}

func (s Scale) frac(v float64) float64 {
	if s.Log {
		if !(v > 0) {
			return math.NaN()
		}
		lo, hi := math.Log10(s.Min), math.Log10(s.Max)
		return (math.Log10(v) - lo) / (hi - lo)
	}
	return (v - s.Min) / (s.Max - s.Min)
}

// drawable reports whether v can be placed on the axis.
func (s Scale) drawable(v float64) bool { return drawable(v, s.Log) }

func drawable(v float64, log bool) bool {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return false
	}
	return !log || v > 0
}

// Rect is a rectangle in viewBox pixels.
type Rect struct{ Left, Top, Right, Bottom float64 }

// Contains reports whether (x, y) lies in r, edges included.
func (r Rect) Contains(x, y float64) bool {
	return x >= r.Left && x <= r.Right && y >= r.Top && y <= r.Bottom
}

// autoRange returns the range to show for values between lo and hi (lo ≤ hi,
// both drawable; ok false when there were none) on an axis of length px.
func autoRange(lo, hi float64, ok, log bool, px float64, horizontal bool) (float64, float64) {
	if log {
		if !ok {
			return 1, 10
		}
		if lo == hi {
			lo, hi = lo/2, hi*2
		}
		a, b := floor125(lo), ceil125(hi)
		if !(a > 0) || math.IsInf(a, 0) {
			a = lo
		}
		if !(b > a) || math.IsInf(b, 0) {
			b = hi
		}
		return a, b
	}
	if !ok {
		return 0, 1
	}
	if lo == hi {
		d := math.Abs(lo) * 0.1
		if d == 0 {
			d = 1
		}
		lo, hi = lo-d, hi+d
	}
	m, e := niceStepParts((hi - lo) / float64(linearTarget(px, horizontal)))
	step := mant10(m, e)
	a, b := stepMultiple(math.Floor(lo/step), m, e), stepMultiple(math.Ceil(hi/step), m, e)
	if math.IsInf(a, 0) || math.IsInf(b, 0) || !(b > a) {
		return lo, hi
	}
	return a, b
}

// floor125 returns the largest of 1, 2, 5 × 10ᵏ that is ≤ v.
func floor125(v float64) float64 {
	k := math.Floor(math.Log10(v))
	p := math.Pow(10, k)
	m := v / p
	for _, c := range []float64{5, 2, 1} {
		if m >= c*(1-1e-12) {
			return c * p
		}
	}
	return p / 2 // m just below 1 from rounding
}

// ceil125 returns the smallest of 1, 2, 5 × 10ᵏ that is ≥ v.
func ceil125(v float64) float64 {
	k := math.Floor(math.Log10(v))
	p := math.Pow(10, k)
	m := v / p
	for _, c := range []float64{1, 2, 5, 10} {
		if m <= c*(1+1e-12) {
			return c * p
		}
	}
	return 20 * p
}

// stepMultiple returns i·m·10ᵉ, correctly rounded when i·m is exact.
func stepMultiple(i float64, m, e int) float64 {
	if e >= 0 {
		return i * float64(m) * math.Pow10(e)
	}
	return i * float64(m) / math.Pow10(-e)
}
