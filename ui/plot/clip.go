package plot

import "math"

type pt struct{ x, y float64 }

// farPixel bounds pixel coordinates before clipping, so that values far
// outside the range cannot overflow the clipping arithmetic.
const farPixel = 1e9

func clampFar(v float64) float64 { return math.Max(-farPixel, math.Min(farPixel, v)) }

// clipSegment clips the segment a–b to r (Liang & Barsky 1984, ACM TOG
// 3(1)); ok is false when no part of it lies in r.
func clipSegment(r Rect, a, b pt) (pt, pt, bool) {
	t0, t1 := 0.0, 1.0
	dx, dy := b.x-a.x, b.y-a.y
	for _, e := range [4][2]float64{
		{-dx, a.x - r.Left}, {dx, r.Right - a.x},
		{-dy, a.y - r.Top}, {dy, r.Bottom - a.y},
	} {
		p, q := e[0], e[1]
		if p == 0 {
			if q < 0 {
				return a, b, false
			}
			continue
		}
		t := q / p
		if p < 0 {
			if t > t1 {
				return a, b, false
			}
			t0 = math.Max(t0, t)
		} else {
			if t < t0 {
				return a, b, false
			}
			t1 = math.Min(t1, t)
		}
	}
	na, nb := a, b
	if t0 > 0 {
		na = pt{a.x + t0*dx, a.y + t0*dy}
	}
	if t1 < 1 {
		nb = pt{a.x + t1*dx, a.y + t1*dy}
	}
	return na, nb, true
}

// clipPolygon clips a polygon to r (Sutherland & Hodgman 1974, CACM 17(1)).
// The result may have edges along the border of r, which do not change the
// filled area.
func clipPolygon(r Rect, poly []pt) []pt {
	type edge struct {
		in  func(pt) bool
		cut func(a, b pt) pt
	}
	lerpX := func(a, b pt, x float64) pt { return pt{x, a.y + (b.y-a.y)*(x-a.x)/(b.x-a.x)} }
	lerpY := func(a, b pt, y float64) pt { return pt{a.x + (b.x-a.x)*(y-a.y)/(b.y-a.y), y} }
	edges := [4]edge{
		{func(p pt) bool { return p.x >= r.Left }, func(a, b pt) pt { return lerpX(a, b, r.Left) }},
		{func(p pt) bool { return p.x <= r.Right }, func(a, b pt) pt { return lerpX(a, b, r.Right) }},
		{func(p pt) bool { return p.y >= r.Top }, func(a, b pt) pt { return lerpY(a, b, r.Top) }},
		{func(p pt) bool { return p.y <= r.Bottom }, func(a, b pt) pt { return lerpY(a, b, r.Bottom) }},
	}
	out := poly
	for _, e := range edges {
		if len(out) == 0 {
			break
		}
		in := out
		out = make([]pt, 0, len(in)+4)
		prev := in[len(in)-1]
		for _, cur := range in {
			switch {
			case e.in(cur) && e.in(prev):
				out = append(out, cur)
			case e.in(cur):
				out = append(out, e.cut(prev, cur), cur)
			case e.in(prev):
				out = append(out, e.cut(prev, cur))
			}
			prev = cur
		}
	}
	return out
}
