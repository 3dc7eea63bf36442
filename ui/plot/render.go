package plot

import (
	"fmt"
	"math"
	"strings"
)

// Sizes at 1×, in px.
const (
	fontTick   = 16.0
	fontAxis   = 18.0
	fontTitle  = 21.0
	fontLegend = 16.0
	fontNote   = 15.0
	pad        = 14.0
	tickMajor  = 9.0
	tickMinor  = 5.0
	legendRow  = 30.0
	noteLine   = 21.0
	swatchW    = 36.0
	axisLine   = 1.25 // line height of axis titles, in em
	minDecade  = 36.0 // least px per decade for minor ticks
	labelGap   = 10.0 // least px between two tick labels
)

// Colours of the frame and furniture (our own choice).
const (
	colText       = "#000000"
	colBackground = "#ffffff"
	colGridMajor  = "#b4b4b4"
	colGridMinor  = "#dcdcdc"
	colWindowFill = "#dfe8f3"
	colWindowEdge = "#2a3b52"
	bandOpacity   = "0.24"
	fontFamily    = "system-ui, Roboto, 'Segoe UI', Arial, sans-serif"
)

// Render checks the chart and draws it. It returns the root <svg> element,
// the layout, and an *Error (wrapping ErrSize, ErrRange, ErrLength,
// ErrSeries or ErrStyle) when the chart cannot be drawn. Values that cannot
// be placed on the axes are not errors: they are counted in Layout.Counts
// and noted on the chart. The chart is not modified.
func (c *Chart) Render() (*Node, *Layout, error) {
	w, h, rs, err := c.check()
	if err != nil {
		return nil, nil, err
	}
	r := &renderer{c: c, rs: rs, w: w, h: h}
	return r.render()
}

type extent struct {
	lo, hi float64
	ok     bool
}

func (e *extent) add(v float64) {
	if !e.ok {
		e.lo, e.hi, e.ok = v, v, true
		return
	}
	e.lo, e.hi = math.Min(e.lo, v), math.Max(e.hi, v)
}

type legendEntry struct {
	r      *resolved
	hollow bool // excluded points
	window bool
	text   string
	x, y   float64 // swatch left, row centre
}

type renderer struct {
	c      *Chart
	rs     []resolved
	w, h   float64
	lay    *Layout
	legend []legendEntry
}

// inRange reports whether v lies in [lo, hi] with a tolerance of 1e-9 of
// the range (of its logarithm on a log axis).
func inRange(v, lo, hi float64, log bool) bool {
	if log {
		v, lo, hi = math.Log10(v), math.Log10(lo), math.Log10(hi)
	}
	tol := 1e-9 * (hi - lo)
	return v >= lo-tol && v <= hi+tol
}

func (r *renderer) render() (*Node, *Layout, error) {
	c := r.c
	lay := &Layout{Width: r.w, Counts: make([]Count, len(r.rs))}
	r.lay = lay
	xFixed, yFixed := c.X.Min < c.X.Max, c.Y.Min < c.Y.Max

	// Pass 1: sort values into drawable and not, and find the extents.
	var ex, ey extent
	if w := c.Window; w != nil && !xFixed {
		ex.add(w[0])
		ex.add(w[1])
	}
	for i := range r.rs {
		s := r.rs[i]
		cnt := &lay.Counts[i]
		cnt.Total = len(s.X)
		for j := range s.X {
			x, y := s.X[j], s.Y[j]
			y2 := y
			if s.Kind == Band {
				y2 = s.Y2[j]
			}
			if !finite(x) || !finite(y) || !finite(y2) {
				cnt.NotFinite++
				continue
			}
			if (c.X.Log && x <= 0) || (c.Y.Log && (y <= 0 || y2 <= 0)) {
				cnt.NotPositive++
				continue
			}
			if s.Kind == Points && ((xFixed && !inRange(x, c.X.Min, c.X.Max, c.X.Log)) ||
				(yFixed && !inRange(y, c.Y.Min, c.Y.Max, c.Y.Log))) {
				cnt.Outside++
				continue
			}
			cnt.Drawn++
			if s.Kind == Points && s.Used != nil && !s.Used[j] {
				cnt.Excluded++
			}
			ex.add(x)
			ey.add(y)
			ey.add(y2)
		}
	}

	// Text blocks whose size depends on the width only.
	inner := r.w - 2*pad
	var titleLines []string
	if c.Title != "" {
		titleLines = wrap(cleanText(c.Title), fontTitle, inner-120) // centred on the plot, not the chart
	}
	xTitle := wrap(cleanText(c.X.Label), fontAxis, inner-80)
	lay.Notes = r.notes(xFixed)
	var noteLines []string
	for _, n := range lay.Notes {
		noteLines = append(noteLines, wrap(n, fontNote, inner)...)
	}
	rows := r.layoutLegend(inner)

	top := pad + fontTick/2
	if len(titleLines) > 0 {
		top = pad + float64(len(titleLines))*fontTitle*1.2 + 10
	}
	bottom := tickMajor + 6 + fontTick + pad
	if len(xTitle) > 0 {
		bottom += 10 + float64(len(xTitle))*fontAxis*axisLine
	}
	if rows > 0 {
		bottom += 10 + float64(rows)*legendRow
	}
	if len(noteLines) > 0 {
		bottom += 8 + float64(len(noteLines))*noteLine
	}
	if r.h-top-bottom < minPlotHeight {
		r.h = math.Ceil(top + bottom + minPlotHeight)
	}
	lay.Height = r.h
	plotTop, plotBottom := top, r.h-bottom

	// Y axis: range, ticks, then the left margin from the label widths.
	ylo, yhi := c.Y.Min, c.Y.Max
	if !yFixed {
		ylo, yhi = autoRange(ey.lo, ey.hi, ey.ok, c.Y.Log, plotBottom-plotTop, false)
	}
	yTicks := axisTicks(ylo, yhi, c.Y.Log, plotBottom-plotTop, false)
	labelW := 0.0
	for _, t := range yTicks {
		labelW = math.Max(labelW, textWidth(t.Label, fontTick))
	}
	yTitle := wrap(cleanText(c.Y.Label), fontAxis, plotBottom-plotTop)
	left := pad + labelW + 6 + tickMajor
	if len(yTitle) > 0 {
		left += float64(len(yTitle))*fontAxis*axisLine + 4
	}
	right := pad + 12.0

	// X axis: the right margin must hold half the last label.
	var xlo, xhi float64
	var xTicks []Tick
	for range 2 {
		xlo, xhi = c.X.Min, c.X.Max
		if !xFixed {
			xlo, xhi = autoRange(ex.lo, ex.hi, ex.ok, c.X.Log, r.w-left-right, true)
		}
		xTicks = axisTicks(xlo, xhi, c.X.Log, r.w-left-right, true)
		need := right
		plotW := r.w - left - right
		for _, t := range xTicks {
			if t.Label == "" {
				continue
			}
			s := Scale{Log: c.X.Log, Min: xlo, Max: xhi, From: 0, To: plotW}
			if c.X.Invert {
				s.From, s.To = plotW, 0
			}
			over := textWidth(t.Label, fontTick)/2 - (plotW - s.Pixel(t.Value))
			need = math.Max(need, over+4)
		}
		if need <= right {
			break
		}
		right = need
	}
	plotLeft, plotRight := left, math.Max(left+100, r.w-right)
	lay.Plot = Rect{plotLeft, plotTop, plotRight, plotBottom}
	lay.X = Scale{Log: c.X.Log, Min: xlo, Max: xhi, From: plotLeft, To: plotRight}
	if c.X.Invert {
		lay.X.From, lay.X.To = plotRight, plotLeft
	}
	lay.Y = Scale{Log: c.Y.Log, Min: ylo, Max: yhi, From: plotBottom, To: plotTop}
	if c.Y.Invert {
		lay.Y.From, lay.Y.To = plotTop, plotBottom
	}
	thin(xTicks, lay.X, true)
	thin(yTicks, lay.Y, false)
	lay.XTicks, lay.YTicks = xTicks, yTicks

	// Draw.
	root := el("svg",
		"xmlns", SVGNamespace,
		"viewBox", "0 0 "+num(r.w)+" "+num(r.h),
		"width", "100%",
		"preserveAspectRatio", "xMidYMid meet",
		"role", "img",
		"aria-label", ariaLabel(c),
		"font-family", fontFamily,
	)
	if c.Title != "" {
		root.add(&Node{Tag: "title", Text: cleanText(c.Title)})
	}
	root.add(el("rect", "x", "0", "y", "0", "width", num(r.w), "height", num(r.h), "fill", colBackground))
	if n := r.window(); n != nil {
		root.add(n)
	}
	root.add(r.grid()...)
	root.add(r.data())
	root.add(el("rect", "x", num(plotLeft), "y", num(plotTop), "width", num(plotRight-plotLeft),
		"height", num(plotBottom-plotTop), "fill", "none", "stroke", colText, "stroke-width", "2"))
	root.add(r.axes(xTitle, yTitle)...)
	if len(titleLines) > 0 {
		g := el("g", "font-size", num(fontTitle), "font-weight", "700", "fill", colText, "text-anchor", "middle")
		for i, l := range titleLines {
			g.add(text(l, (plotLeft+plotRight)/2, pad+fontTitle*0.8+float64(i)*fontTitle*1.2))
		}
		root.add(g)
	}
	y := plotBottom + tickMajor + 6 + fontTick + pad/2
	if len(xTitle) > 0 {
		y += 10 + float64(len(xTitle))*fontAxis*axisLine
	}
	if rows > 0 {
		root.add(r.drawLegend(y + 10))
		y += 10 + float64(rows)*legendRow
	}
	if len(noteLines) > 0 {
		g := el("g", "font-size", num(fontNote), "fill", colText)
		for i, l := range noteLines {
			g.add(text(l, pad, y+8+fontNote*0.9+float64(i)*noteLine))
		}
		root.add(g)
	}
	return root, lay, nil
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

func ariaLabel(c *Chart) string {
	if c.Title != "" {
		return cleanText(c.Title)
	}
	parts := []string{}
	for _, l := range []string{c.Y.Label, c.X.Label} {
		if l != "" {
			parts = append(parts, cleanText(l))
		}
	}
	if len(parts) == 2 {
		return parts[0] + " against " + parts[1]
	}
	if len(parts) == 1 {
		return parts[0]
	}
	return "chart"
}

func text(s string, x, y float64, attrs ...string) *Node {
	n := el("text", append([]string{"x", num(x), "y", num(y)}, attrs...)...)
	n.Text = s
	return n
}

func axisTicks(lo, hi float64, log bool, px float64, horizontal bool) []Tick {
	if log {
		return LogTicks(lo, hi)
	}
	return LinearTicks(lo, hi, linearTarget(px, horizontal))
}

// thin clears labels so that no two overlap, keeping every n-th label for
// the smallest n that works, counted from the label at 1 (log) or 0
// (linear) when there is one.
func thin(ticks []Tick, s Scale, horizontal bool) {
	var idx []int
	anchor := 0
	best := math.Inf(1)
	for i, t := range ticks {
		if t.Label == "" {
			continue
		}
		d := math.Abs(t.Value)
		if s.Log {
			d = math.Abs(math.Log10(t.Value))
		}
		if d < best {
			best, anchor = d, len(idx)
		}
		idx = append(idx, i)
	}
	half := func(i int) float64 {
		if horizontal {
			return textWidth(ticks[i].Label, fontTick) / 2
		}
		return fontTick * 0.6
	}
	for stride := 1; stride <= len(idx); stride++ {
		fits := true
		prev := -1
		for n, i := range idx {
			if (n-anchor)%stride != 0 {
				continue
			}
			if prev >= 0 && math.Abs(s.Pixel(ticks[i].Value)-s.Pixel(ticks[prev].Value)) < half(i)+half(prev)+labelGap {
				fits = false
				break
			}
			prev = i
		}
		if fits {
			for n, i := range idx {
				if (n-anchor)%stride != 0 {
					ticks[i].Label = ""
				}
			}
			return
		}
	}
}

// notes returns the chart's notes and a line for each series with values
// not shown.
func (r *renderer) notes(xFixed bool) []string {
	var out []string
	for _, n := range r.c.Notes {
		if n = strings.TrimSpace(cleanText(n)); n != "" {
			out = append(out, n)
		}
	}
	for i, cnt := range r.lay.Counts {
		var parts []string
		if cnt.NotFinite > 0 {
			parts = append(parts, plural(cnt.NotFinite, "missing or non-finite value", "missing or non-finite values"))
		}
		if cnt.NotPositive > 0 {
			parts = append(parts, plural(cnt.NotPositive, "value ≤ 0 on a log axis", "values ≤ 0 on a log axis"))
		}
		if cnt.Outside > 0 {
			parts = append(parts, plural(cnt.Outside, "point outside the shown range", "points outside the shown range"))
		}
		if len(parts) == 0 {
			continue
		}
		name := cleanText(r.rs[i].Name)
		if name == "" {
			name = fmt.Sprintf("series %d", i+1)
		}
		out = append(out, fmt.Sprintf("Not shown from “%s” (%d points): %s.", name, cnt.Total, strings.Join(parts, ", ")))
	}
	if w := r.c.Window; w != nil && xFixed {
		lo, hi := math.Min(w[0], w[1]), math.Max(w[0], w[1])
		if hi < r.c.X.Min || lo > r.c.X.Max {
			out = append(out, fmt.Sprintf("The %s (%g to %g) lies outside the shown range.", r.windowLabel(), lo, hi))
		}
	}
	return out
}

func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return fmt.Sprintf("%d %s", n, many)
}

func (r *renderer) windowLabel() string {
	if l := cleanText(r.c.WindowLabel); l != "" {
		return l
	}
	return "fit window"
}

// layoutLegend places the legend entries in rows of the given width and
// returns the number of rows; entry positions are relative to the top of
// the legend.
func (r *renderer) layoutLegend(width float64) int {
	var es []legendEntry
	for i := range r.rs {
		s := &r.rs[i]
		if s.Name == "" {
			continue
		}
		name := cleanText(s.Name)
		es = append(es, legendEntry{r: s, text: name})
		if s.Kind == Points && r.lay.Counts[i].Excluded > 0 {
			es = append(es, legendEntry{r: s, hollow: true, text: name + " (excluded)"})
		}
	}
	if r.c.Window != nil {
		es = append(es, legendEntry{window: true, text: r.windowLabel()})
	}
	if len(es) == 0 {
		return 0
	}
	x, row := pad, 0
	for i := range es {
		ew := swatchW + 8 + textWidth(es[i].text, fontLegend)
		if x > pad && x+ew > pad+width {
			x, row = pad, row+1
		}
		es[i].x, es[i].y = x, float64(row)*legendRow+legendRow/2
		x += ew + 26
	}
	r.legend = es
	return row + 1
}

func (r *renderer) drawLegend(top float64) *Node {
	g := el("g", "font-size", num(fontLegend), "fill", colText)
	for _, e := range r.legend {
		cy := top + e.y
		var sw *Node
		switch {
		case e.window:
			sw = el("rect", "x", num(e.x), "y", num(cy-10), "width", num(swatchW), "height", "20",
				"fill", colWindowFill, "stroke", colWindowEdge, "stroke-width", "2", "stroke-dasharray", "6 4")
		case e.r.Kind == Points:
			b := appendMarker(nil, e.r.marker, e.x+swatchW/2, cy, e.r.size)
			sw = markerNode(string(b), e.r, e.hollow)
		case e.r.Kind == Line:
			sw = lineNode("M"+num(e.x)+" "+num(cy)+"h"+num(swatchW), e.r)
		case e.r.Kind == Band:
			sw = el("rect", "x", num(e.x), "y", num(cy-10), "width", num(swatchW), "height", "20",
				"fill", e.r.color, "fill-opacity", bandOpacity)
		}
		g.add(sw, text(e.text, e.x+swatchW+8, cy+fontLegend*0.35))
	}
	return g
}

func markerNode(d string, s *resolved, hollow bool) *Node {
	if hollow {
		return el("path", "d", d, "fill", colBackground, "stroke", Grey.Hex(), "stroke-width", "2.5",
			"stroke-linejoin", "round")
	}
	return el("path", "d", d, "fill", s.color, "stroke", s.color, "stroke-width", "1",
		"stroke-linejoin", "round")
}

func lineNode(d string, s *resolved) *Node {
	n := el("path", "d", d, "fill", "none", "stroke", s.color, "stroke-width", num(s.width),
		"stroke-linejoin", "round", "stroke-linecap", "round")
	if da := s.dash.dashArray(s.width); da != "" {
		n.Attrs = append(n.Attrs, Attr{"stroke-dasharray", da})
	}
	return n
}

// window draws the highlighted x-range, or returns nil.
func (r *renderer) window() *Node {
	w := r.c.Window
	if w == nil {
		return nil
	}
	p := r.lay.Plot
	a, b := r.lay.X.Pixel(w[0]), r.lay.X.Pixel(w[1])
	if a > b {
		a, b = b, a
	}
	if !(b >= p.Left && a <= p.Right) {
		return nil
	}
	a, b = math.Max(a, p.Left), math.Min(b, p.Right)
	g := el("g")
	g.add(el("rect", "x", num(a), "y", num(p.Top), "width", num(b-a), "height", num(p.Bottom-p.Top),
		"fill", colWindowFill))
	var d []byte
	for _, x := range []float64{a, b} {
		if x > p.Left+1 && x < p.Right-1 {
			d = append(d, 'M')
			d = appendNum(d, x)
			d = append(d, ' ')
			d = appendNum(d, p.Top)
			d = append(d, 'V')
			d = appendNum(d, p.Bottom)
		}
	}
	if len(d) > 0 {
		g.add(el("path", "d", string(d), "fill", "none", "stroke", colWindowEdge, "stroke-width", "2.5",
			"stroke-dasharray", "9 5"))
	}
	return g
}

// minorVisible reports whether minor ticks of a log axis have room.
func minorVisible(s Scale) bool {
	if !s.Log {
		return false
	}
	dec := math.Log10(s.Max) - math.Log10(s.Min)
	return math.Abs(s.To-s.From)/dec >= minDecade
}

func (r *renderer) grid() []*Node {
	p := r.lay.Plot
	var major, minor []byte
	for _, t := range r.lay.XTicks {
		x := r.lay.X.Pixel(t.Value)
		if x <= p.Left+0.5 || x >= p.Right-0.5 {
			continue
		}
		if t.Major {
			major = appendV(major, x, p.Top, p.Bottom)
		} else if minorVisible(r.lay.X) {
			minor = appendV(minor, x, p.Top, p.Bottom)
		}
	}
	for _, t := range r.lay.YTicks {
		y := r.lay.Y.Pixel(t.Value)
		if y <= p.Top+0.5 || y >= p.Bottom-0.5 {
			continue
		}
		if t.Major {
			major = appendH(major, p.Left, y, p.Right)
		} else if minorVisible(r.lay.Y) {
			minor = appendH(minor, p.Left, y, p.Right)
		}
	}
	var out []*Node
	if len(minor) > 0 {
		out = append(out, el("path", "d", string(minor), "fill", "none", "stroke", colGridMinor, "stroke-width", "1"))
	}
	if len(major) > 0 {
		out = append(out, el("path", "d", string(major), "fill", "none", "stroke", colGridMajor, "stroke-width", "1.2"))
	}
	return out
}

func appendV(b []byte, x, y0, y1 float64) []byte {
	b = append(b, 'M')
	b = appendNum(b, x)
	b = append(b, ' ')
	b = appendNum(b, y0)
	b = append(b, 'V')
	return appendNum(b, y1)
}

func appendH(b []byte, x0, y, x1 float64) []byte {
	b = append(b, 'M')
	b = appendNum(b, x0)
	b = append(b, ' ')
	b = appendNum(b, y)
	b = append(b, 'H')
	return appendNum(b, x1)
}

// axes draws ticks, tick labels and axis titles.
func (r *renderer) axes(xTitle, yTitle []string) []*Node {
	p := r.lay.Plot
	var ticks []byte
	xl := el("g", "font-size", num(fontTick), "fill", colText, "text-anchor", "middle")
	for _, t := range r.lay.XTicks {
		if !t.Major && !minorVisible(r.lay.X) {
			continue
		}
		x := r.lay.X.Pixel(t.Value)
		n := tickMinor
		if t.Major {
			n = tickMajor
		}
		ticks = appendV(ticks, x, p.Bottom, p.Bottom+n)
		if t.Label != "" {
			xl.add(text(t.Label, x, p.Bottom+tickMajor+6+fontTick*0.8))
		}
	}
	yl := el("g", "font-size", num(fontTick), "fill", colText, "text-anchor", "end")
	for _, t := range r.lay.YTicks {
		if !t.Major && !minorVisible(r.lay.Y) {
			continue
		}
		y := r.lay.Y.Pixel(t.Value)
		n := tickMinor
		if t.Major {
			n = tickMajor
		}
		ticks = appendH(ticks, p.Left-n, y, p.Left)
		if t.Label != "" {
			yl.add(text(t.Label, p.Left-tickMajor-6, y+fontTick*0.35))
		}
	}
	out := []*Node{el("path", "d", string(ticks), "fill", "none", "stroke", colText, "stroke-width", "2"), xl, yl}
	titles := el("g", "font-size", num(fontAxis), "font-weight", "600", "fill", colText, "text-anchor", "middle")
	for i, l := range xTitle {
		titles.add(text(l, (p.Left+p.Right)/2, p.Bottom+tickMajor+6+fontTick+10+fontAxis*0.8+float64(i)*fontAxis*axisLine))
	}
	for i, l := range yTitle {
		x := pad + fontAxis*0.8 + float64(i)*fontAxis*axisLine
		y := (p.Top + p.Bottom) / 2
		titles.add(text(l, x, y, "transform", "rotate(-90 "+num(x)+" "+num(y)+")"))
	}
	if len(titles.Children) > 0 {
		out = append(out, titles)
	}
	return out
}

// data draws the series: bands, then lines, then points.
func (r *renderer) data() *Node {
	g := el("g")
	for _, kind := range []Kind{Band, Line, Points} {
		for i := range r.rs {
			s := &r.rs[i]
			if s.Kind != kind {
				continue
			}
			switch kind {
			case Band:
				if d := r.bandPath(s); d != "" {
					g.add(el("path", "d", d, "fill", s.color, "fill-opacity", bandOpacity, "stroke", "none"))
				}
			case Line:
				if d := r.linePath(s); d != "" {
					g.add(lineNode(d, s))
				}
			case Points:
				used, excl := r.pointPaths(s)
				if len(excl) > 0 {
					g.add(markerNode(string(excl), s, true))
				}
				if len(used) > 0 {
					g.add(markerNode(string(used), s, false))
				}
			}
		}
	}
	return g
}

// point returns the pixel of point j of s, and whether it is drawable.
func (r *renderer) point(x, y float64) (pt, bool) {
	if !r.lay.X.drawable(x) || !r.lay.Y.drawable(y) {
		return pt{}, false
	}
	return pt{clampFar(r.lay.X.Pixel(x)), clampFar(r.lay.Y.Pixel(y))}, true
}

func (r *renderer) pointPaths(s *resolved) (used, excl []byte) {
	c := r.c
	xFixed, yFixed := c.X.Min < c.X.Max, c.Y.Min < c.Y.Max
	for j := range s.X {
		x, y := s.X[j], s.Y[j]
		p, ok := r.point(x, y)
		if !ok || (xFixed && !inRange(x, c.X.Min, c.X.Max, c.X.Log)) || (yFixed && !inRange(y, c.Y.Min, c.Y.Max, c.Y.Log)) {
			continue
		}
		if s.Used != nil && !s.Used[j] {
			excl = appendMarker(excl, s.marker, p.x, p.y, s.size)
		} else {
			used = appendMarker(used, s.marker, p.x, p.y, s.size)
		}
	}
	return used, excl
}

func (r *renderer) linePath(s *resolved) string {
	var d []byte
	var prev pt
	havePrev, penDown := false, false
	var pen pt
	for j := range s.X {
		p, ok := r.point(s.X[j], s.Y[j])
		if !ok {
			havePrev, penDown = false, false
			continue
		}
		if havePrev {
			a, b, vis := clipSegment(r.lay.Plot, prev, p)
			if vis {
				if !penDown || a != pen {
					d = append(d, 'M')
					d = appendPt(d, a)
				}
				d = append(d, 'L')
				d = appendPt(d, b)
				pen, penDown = b, true
			} else {
				penDown = false
			}
		}
		prev, havePrev = p, true
	}
	return string(d)
}

func (r *renderer) bandPath(s *resolved) string {
	var d []byte
	flush := func(lo, hi []pt) {
		if len(lo) < 2 {
			return
		}
		poly := make([]pt, 0, 2*len(lo))
		poly = append(poly, lo...)
		for k := len(hi) - 1; k >= 0; k-- {
			poly = append(poly, hi[k])
		}
		poly = clipPolygon(r.lay.Plot, poly)
		if len(poly) < 3 {
			return
		}
		for k, q := range poly {
			if k == 0 {
				d = append(d, 'M')
			} else {
				d = append(d, 'L')
			}
			d = appendPt(d, q)
		}
		d = append(d, 'Z')
	}
	var lo, hi []pt
	for j := range s.X {
		a, ok1 := r.point(s.X[j], s.Y[j])
		b, ok2 := r.point(s.X[j], s.Y2[j])
		if !ok1 || !ok2 {
			flush(lo, hi)
			lo, hi = lo[:0], hi[:0]
			continue
		}
		lo, hi = append(lo, a), append(hi, b)
	}
	flush(lo, hi)
	return string(d)
}

func appendPt(b []byte, p pt) []byte {
	b = appendNum(b, p.x)
	b = append(b, ' ')
	return appendNum(b, p.y)
}

// appendMarker appends the outline of a marker of width size centred on
// (x, y). The shapes are scaled to look about equally large.
func appendMarker(b []byte, m Marker, x, y, size float64) []byte {
	move := func(px, py float64) {
		b = append(b, 'M')
		b = appendPt(b, pt{px, py})
	}
	line := func(px, py float64) {
		b = append(b, 'L')
		b = appendPt(b, pt{px, py})
	}
	switch m {
	case Square:
		h := size * 0.43
		move(x-h, y-h)
		line(x+h, y-h)
		line(x+h, y+h)
		line(x-h, y+h)
	case Triangle, TriangleDown:
		R := size * 0.62
		sgn := 1.0
		if m == TriangleDown {
			sgn = -1
		}
		move(x, y-sgn*R)
		line(x+0.866*R, y+sgn*0.5*R)
		line(x-0.866*R, y+sgn*0.5*R)
	case Diamond:
		h := size * 0.62
		move(x, y-h)
		line(x+h, y)
		line(x, y+h)
		line(x-h, y)
	default: // Circle
		rad := size / 2
		move(x-rad, y)
		b = append(b, 'a')
		b = appendNum(b, rad)
		b = append(b, ' ')
		b = appendNum(b, rad)
		b = append(b, " 0 1 0 "...)
		b = appendNum(b, 2*rad)
		b = append(b, " 0a"...)
		b = appendNum(b, rad)
		b = append(b, ' ')
		b = appendNum(b, rad)
		b = append(b, " 0 1 0 "...)
		b = appendNum(b, -2*rad)
		b = append(b, " 0"...)
	}
	return append(b, 'Z')
}
