package plot

import (
	"fmt"
	"math"
)

// Default and limiting chart sizes, in px at 1×.
const (
	DefaultWidth  = 960
	DefaultHeight = 620
	MinWidth      = 320
	MinHeight     = 240
	MaxSize       = 10000
)

// Chart describes one chart. The zero value is an empty pair of linear
// axes; Render draws it.
type Chart struct {
	// Width and Height are the size of the viewBox in px at 1×. If 0,
	// DefaultWidth and DefaultHeight are used. Otherwise Width must be
	// from MinWidth to MaxSize and Height from MinHeight to MaxSize. When
	// the legend and notes leave the plot less than 160 px of height, the
	// chart grows taller; Layout.Height is the height used.
	Width, Height float64
	// Title, if not empty, is drawn above the plot and used as the SVG's
	// accessible name.
	Title string
	// X and Y are the axes.
	X, Y Axis
	// Series are drawn in order: bands first, then lines, then points, so
	// that data stay on top.
	Series []Series
	// Window, if not nil, is an x-range in data units (either order)
	// shaded across the plot, such as the time window used for a fit. An
	// automatic x range includes it.
	Window *[2]float64
	// WindowLabel is the legend text for Window. If empty, "fit window".
	WindowLabel string
	// Notes are lines of text below the legend, such as the caution that
	// results are a preliminary field interpretation. Long lines wrap.
	Notes []string
}

// Axis describes one axis.
type Axis struct {
	// Label is the axis title with its unit, such as
	// "time since pumping started (min)".
	Label string
	// Log selects a logarithmic (base 10) axis.
	Log bool
	// Min and Max fix the range when Min < Max. When they are equal (the
	// zero value) the range is chosen to cover every drawable value.
	// Min > Max is an error, and so is a fixed Min ≤ 0 on a log axis.
	Min, Max float64
	// Invert makes values increase downwards (y) or leftwards (x), as for
	// drawdown plotted below the ground.
	Invert bool
}

// Kind is the way a series is drawn.
type Kind uint8

const (
	// Points draws a marker at each (X[i], Y[i]): filled when used,
	// hollow grey when Used[i] is false.
	Points Kind = iota
	// Line joins the points (X[i], Y[i]) in order, with a gap at a value
	// that cannot be drawn. Two points make a straight line of the plot
	// (a Cooper–Jacob line on semilog axes).
	Line
	// Band shades the area between the lower curve (X[i], Y[i]) and the
	// upper curve (X[i], Y2[i]), such as a 95 % band of a fitted curve.
	Band
)

func (k Kind) String() string {
	switch k {
	case Points:
		return "points"
	case Line:
		return "line"
	case Band:
		return "band"
	}
	return fmt.Sprintf("Kind(%d)", uint8(k))
}

// Series is one set of values to draw.
type Series struct {
	// Name is the legend text. A series with no name has no legend entry.
	Name string
	Kind Kind
	// X and Y are the coordinates, in the units of the axes; they must
	// have the same length.
	X, Y []float64
	// Y2 is the upper edge of a Band (Y is the lower); len(Y2) == len(X).
	// It must be nil for other kinds.
	Y2 []float64
	// Used marks, for Points, which points were used (for example in a
	// fit). If nil every point is used; otherwise len(Used) == len(X).
	// It must be nil for other kinds.
	Used []bool
	// Style sets colour, marker, dash and sizes; the zero value chooses
	// them automatically.
	Style Style
}

// Style says how a series looks. Every zero field is chosen automatically.
type Style struct {
	// Color: if AutoColor, the palette colour of the series' place among
	// the series that are not bands (Blue, Orange, Green, Magenta, Black,
	// then again); a Band takes the colour of the first Line series, or
	// Orange if there is none.
	Color Color
	// Marker (Points only): if AutoMarker, the shape of the series' place
	// among the Points series (Circle, Square, Triangle, Diamond,
	// TriangleDown, then again).
	Marker Marker
	// Dash (Line only): if AutoDash, the dash of the series' place among
	// the Line series (Solid, Dashed, Dotted, DashDot, then again).
	Dash Dash
	// Width is the line width in px (Line). If 0, 3.5. At most 20.
	Width float64
	// Size is the marker width in px (Points). If 0, 12. At most 60.
	Size float64
}

// Color is a colour of the chart palette.
type Color uint8

// The palette. The hex codes are our own choice: each has a contrast ratio
// ≥ 4.5 against white and ≥ 3 against the fit-window shading (WCAG 2.1
// definitions of relative luminance and contrast ratio), and they differ
// in hue and lightness.
const (
	AutoColor Color = iota
	Blue            // #1b4aa0
	Orange          // #c04f00
	Green           // #007a68 (bluish green)
	Magenta         // #a8327c
	Black           // #1a1a1a
	Grey            // #6e6e6e, used for excluded points
	numColors
)

var colorHex = [numColors]string{"", "#1b4aa0", "#c04f00", "#007a68", "#a8327c", "#1a1a1a", "#6e6e6e"}

var autoColors = []Color{Blue, Orange, Green, Magenta, Black}

// Hex returns the colour as "#rrggbb" ("" for AutoColor).
func (c Color) Hex() string {
	if c >= numColors {
		return ""
	}
	return colorHex[c]
}

// Marker is the shape of a point marker.
type Marker uint8

const (
	AutoMarker Marker = iota
	Circle
	Square
	Triangle
	Diamond
	TriangleDown
	numMarkers
)

var autoMarkers = []Marker{Circle, Square, Triangle, Diamond, TriangleDown}

// Dash is the dash pattern of a line.
type Dash uint8

const (
	AutoDash Dash = iota
	Solid
	Dashed
	Dotted
	DashDot
	numDashes
)

var autoDashes = []Dash{Solid, Dashed, Dotted, DashDot}

// dashArray returns the stroke-dasharray for a line of width w.
func (d Dash) dashArray(w float64) string {
	switch d {
	case Dashed:
		return num(4*w) + " " + num(2.2*w)
	case Dotted:
		return num(0.01) + " " + num(2.2*w)
	case DashDot:
		return num(4*w) + " " + num(1.8*w) + " " + num(0.01) + " " + num(1.8*w)
	}
	return ""
}

const (
	defaultLineWidth  = 3.5
	defaultMarkerSize = 12.0
	maxLineWidth      = 20
	maxMarkerSize     = 60
	minPlotHeight     = 160
)

// resolved is a series with its style settled.
type resolved struct {
	*Series
	index  int
	color  string
	marker Marker
	dash   Dash
	width  float64
	size   float64
}

// check validates the chart and settles automatic styles.
func (c *Chart) check() (w, h float64, rs []resolved, err error) {
	w, h = c.Width, c.Height
	if w == 0 {
		w = DefaultWidth
	}
	if h == 0 {
		h = DefaultHeight
	}
	if !(w >= MinWidth && w <= MaxSize) {
		return 0, 0, nil, chartErr("Width", ErrSize, "%s px, want %d to %d", fmtValue(w), MinWidth, MaxSize)
	}
	if !(h >= MinHeight && h <= MaxSize) {
		return 0, 0, nil, chartErr("Height", ErrSize, "%s px, want %d to %d", fmtValue(h), MinHeight, MaxSize)
	}
	for _, a := range []struct {
		name string
		ax   *Axis
	}{{"X", &c.X}, {"Y", &c.Y}} {
		if err := a.ax.check(a.name); err != nil {
			return 0, 0, nil, err
		}
	}
	if c.Window != nil {
		for i, v := range c.Window {
			f := fmt.Sprintf("Window[%d]", i)
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return 0, 0, nil, chartErr(f, ErrRange, "%s is not a finite number", fmtValue(v))
			}
			if c.X.Log && v <= 0 {
				return 0, 0, nil, chartErr(f, ErrRange, "%s is not > 0 on a log axis", fmtValue(v))
			}
		}
	}
	rs = make([]resolved, len(c.Series))
	var nColor, nMarker, nDash int
	firstLine := ""
	for i := range c.Series {
		s := &c.Series[i]
		r := resolved{Series: s, index: i}
		fail := func(field string, sentinel error, format string, args ...any) error {
			return seriesErr(i, s.Name, field, sentinel, format, args...)
		}
		if s.Kind > Band {
			return 0, 0, nil, fail("Kind", ErrSeries, "unknown kind %d", s.Kind)
		}
		if len(s.Y) != len(s.X) {
			return 0, 0, nil, fail("Y", ErrLength, "len(Y) = %d, len(X) = %d", len(s.Y), len(s.X))
		}
		switch {
		case s.Kind == Band && len(s.Y2) != len(s.X):
			return 0, 0, nil, fail("Y2", ErrLength, "len(Y2) = %d, len(X) = %d", len(s.Y2), len(s.X))
		case s.Kind != Band && s.Y2 != nil:
			return 0, 0, nil, fail("Y2", ErrSeries, "Y2 is for Band series only (kind %v)", s.Kind)
		case s.Kind == Points && s.Used != nil && len(s.Used) != len(s.X):
			return 0, 0, nil, fail("Used", ErrLength, "len(Used) = %d, len(X) = %d", len(s.Used), len(s.X))
		case s.Kind != Points && s.Used != nil:
			return 0, 0, nil, fail("Used", ErrSeries, "Used is for Points series only (kind %v)", s.Kind)
		}
		st := s.Style
		if st.Color >= numColors {
			return 0, 0, nil, fail("Style.Color", ErrStyle, "unknown colour %d", st.Color)
		}
		if st.Marker >= numMarkers {
			return 0, 0, nil, fail("Style.Marker", ErrStyle, "unknown marker %d", st.Marker)
		}
		if st.Dash >= numDashes {
			return 0, 0, nil, fail("Style.Dash", ErrStyle, "unknown dash %d", st.Dash)
		}
		if !(st.Width >= 0 && st.Width <= maxLineWidth) {
			return 0, 0, nil, fail("Style.Width", ErrStyle, "%s px, want 0 to %d", fmtValue(st.Width), maxLineWidth)
		}
		if !(st.Size >= 0 && st.Size <= maxMarkerSize) {
			return 0, 0, nil, fail("Style.Size", ErrStyle, "%s px, want 0 to %d", fmtValue(st.Size), maxMarkerSize)
		}
		if s.Kind != Band {
			col := st.Color
			if col == AutoColor {
				col = autoColors[nColor%len(autoColors)]
			}
			nColor++
			r.color = col.Hex()
			if s.Kind == Line && firstLine == "" {
				firstLine = r.color
			}
		}
		switch s.Kind {
		case Points:
			r.marker = st.Marker
			if r.marker == AutoMarker {
				r.marker = autoMarkers[nMarker%len(autoMarkers)]
			}
			nMarker++
			r.size = st.Size
			if r.size == 0 {
				r.size = defaultMarkerSize
			}
		case Line:
			r.dash = st.Dash
			if r.dash == AutoDash {
				r.dash = autoDashes[nDash%len(autoDashes)]
			}
			nDash++
			r.width = st.Width
			if r.width == 0 {
				r.width = defaultLineWidth
			}
		}
		rs[i] = r
	}
	for i := range rs {
		if rs[i].Kind == Band {
			switch {
			case rs[i].Style.Color != AutoColor:
				rs[i].color = rs[i].Style.Color.Hex()
			case firstLine != "":
				rs[i].color = firstLine
			default:
				rs[i].color = Orange.Hex()
			}
		}
	}
	return w, h, rs, nil
}

func (a *Axis) check(name string) error {
	for _, f := range []struct {
		field string
		v     float64
	}{{".Min", a.Min}, {".Max", a.Max}} {
		if math.IsNaN(f.v) || math.IsInf(f.v, 0) {
			return chartErr(name+f.field, ErrRange, "%s is not a finite number", fmtValue(f.v))
		}
	}
	if a.Min < a.Max && a.Log && a.Min <= 0 {
		return chartErr(name+".Min", ErrRange, "%s is not > 0 on a log axis", fmtValue(a.Min))
	}
	if a.Min > a.Max {
		return chartErr(name+".Max", ErrRange, "Max %s is below Min %s", fmtValue(a.Max), fmtValue(a.Min))
	}
	return nil
}

func fmtValue(v float64) string {
	switch {
	case math.IsNaN(v):
		return "NaN"
	case math.IsInf(v, 1):
		return "+Inf"
	case math.IsInf(v, -1):
		return "-Inf"
	}
	return fmt.Sprintf("%g", v)
}
