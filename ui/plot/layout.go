package plot

import "math"

// Layout is where Render put things, for the screen code: the plot area,
// the two scales that map data to pixels and back, the ticks drawn and how
// many values of each series could not be drawn. Coordinates are viewBox
// pixels, (0, 0) at the top left.
type Layout struct {
	// Width and Height are the size of the viewBox; Height can exceed
	// Chart.Height when the legend and notes needed room.
	Width, Height float64
	// Plot is the plotting area inside the axes.
	Plot Rect
	// X and Y map data values to pixels and back.
	X, Y Scale
	// XTicks and YTicks are the ticks drawn, with the labels shown (a
	// label thinned for lack of room is "").
	XTicks, YTicks []Tick
	// Counts has one entry per Chart.Series, in order.
	Counts []Count
	// Notes are the note lines drawn below the legend: Chart.Notes
	// followed by the lines the chart added about values not shown.
	Notes []string
}

// Count says what became of the values of one series.
type Count struct {
	// Total is len(Series.X).
	Total int
	// Drawn is the number of points drawn (Points), or of vertices used
	// (Line, Band; the drawing is clipped to the plot).
	Drawn int
	// NotFinite counts points with a NaN or infinite X, Y or Y2.
	NotFinite int
	// NotPositive counts the other points with a value ≤ 0 on a log axis.
	NotPositive int
	// Outside counts points of a Points series that are drawable but lie
	// outside a fixed axis range.
	Outside int
	// Excluded counts drawn points whose Used value is false.
	Excluded int
}

// Skipped returns the number of points, over all series, that could not be
// drawn because a value was NaN, infinite, or ≤ 0 on a log axis.
func (l *Layout) Skipped() int {
	n := 0
	for _, c := range l.Counts {
		n += c.NotFinite + c.NotPositive
	}
	return n
}

// Pixel returns the viewBox pixel of the data point (x, y); a coordinate
// is NaN when the value cannot be placed (≤ 0 on a log axis).
func (l *Layout) Pixel(x, y float64) (px, py float64) { return l.X.Pixel(x), l.Y.Pixel(y) }

// Value returns the data point at viewBox pixel (px, py), the inverse of
// Pixel. Pixels outside the plot give values outside the axis ranges.
func (l *Layout) Value(px, py float64) (x, y float64) { return l.X.Value(px), l.Y.Value(py) }

// Inside reports whether the viewBox pixel (px, py) lies in the plot area.
func (l *Layout) Inside(px, py float64) bool { return l.Plot.Contains(px, py) }

// XSpan turns a horizontal drag between viewBox x-pixels p0 and p1 (either
// order) into an x-range in data units, lo < hi, with both ends held to the
// plot area: the time window the drag selects. ok is false when the drag
// is narrower than 2 px after that, or a pixel is NaN.
func (l *Layout) XSpan(p0, p1 float64) (lo, hi float64, ok bool) {
	if math.IsNaN(p0) || math.IsNaN(p1) {
		return 0, 0, false
	}
	clamp := func(p float64) float64 { return math.Max(l.Plot.Left, math.Min(l.Plot.Right, p)) }
	p0, p1 = clamp(p0), clamp(p1)
	if math.Abs(p1-p0) < 2 {
		return 0, 0, false
	}
	a, b := l.X.Value(p0), l.X.Value(p1)
	if a > b {
		a, b = b, a
	}
	return a, b, true
}

// ViewBoxPoint turns a pointer position in CSS pixels (clientX, clientY)
// into viewBox pixels, given the SVG element's bounding box (its
// getBoundingClientRect, as a Rect). It accounts for the uniform scaling
// and centring of preserveAspectRatio "xMidYMid meet", which Render sets.
// A box of zero size gives NaN.
func (l *Layout) ViewBoxPoint(clientX, clientY float64, box Rect) (px, py float64) {
	bw, bh := box.Right-box.Left, box.Bottom-box.Top
	if !(bw > 0 && bh > 0) {
		return math.NaN(), math.NaN()
	}
	k := math.Min(bw/l.Width, bh/l.Height)
	ox := (bw - l.Width*k) / 2
	oy := (bh - l.Height*k) / 2
	return (clientX - box.Left - ox) / k, (clientY - box.Top - oy) / k
}
