package ui

import (
	"math"
	"strconv"

	"fieldfit/models/diagnostic"
	"fieldfit/models/units"
	"fieldfit/ui/plot"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// minDragPx is the least drag, in viewBox pixels, taken as choosing a
// window rather than a tap.
const minDragPx = 12

// plotData are the series the three plots share, in display units.
type plotData struct {
	tMin, dd   []float64 // usable readings: minutes, drawdown
	used       []bool    // inside the fit window
	deriv      []float64 // Bourdet derivative of drawdown, display length
	resid      []float64 // fitted − observed, display length
	curveT     []float64 // minutes
	curve      []float64 // fitted curve
	lo, hi     []float64 // its 95 % band
	modelDeriv []float64 // the model's own log-derivative at curveT
}

func (a *App) plotData(p *project.Project, t *project.Test, d Display) *plotData {
	req, _ := a.fitRequestLocked(t)
	pd := &plotData{}
	L := d.Length
	for i := range req.Time {
		pd.tMin = append(pd.tMin, req.Time[i]/units.Minute)
		pd.dd = append(pd.dd, L.FromSI(req.Drawdown[i]))
		in := (req.From == 0 || req.Time[i] >= req.From) && (req.To == 0 || req.Time[i] <= req.To)
		pd.used = append(pd.used, in)
	}
	if len(req.Time) >= 2 {
		if r, err := diagnostic.Derivative(req.Time, req.Drawdown,
			&diagnostic.Settings{Window: diagnostic.WindowFromCycles(t.Fit.SmoothingOrDefault())}); err == nil {
			for _, dv := range r.D {
				pd.deriv = append(pd.deriv, L.FromSI(dv))
			}
		}
	}
	out := a.fit.out
	if out == nil || len(out.Residual) != len(req.Time) || t.Result == nil || out.Result.Inputs != req.Fingerprint() {
		return pd
	}
	for _, r := range out.Residual {
		pd.resid = append(pd.resid, L.FromSI(r))
	}
	lo, hi := req.Time[0], req.Time[len(req.Time)-1]
	if !(hi > lo) {
		return pd
	}
	const n = 120
	ts := make([]float64, n)
	for i := range ts {
		ts[i] = lo * math.Pow(hi/lo, float64(i)/(n-1))
	}
	c, l, h := out.Band(ts)
	for i := range ts {
		pd.curveT = append(pd.curveT, ts[i]/units.Minute)
		pd.curve = append(pd.curve, L.FromSI(c[i]))
		pd.lo = append(pd.lo, L.FromSI(l[i]))
		pd.hi = append(pd.hi, L.FromSI(h[i]))
	}
	if s, err := diagnostic.SampleCurve(diagnostic.Curve{S: func(x float64) float64 { return out.Eval([]float64{x})[0] }}, lo, hi, n); err == nil {
		for _, dv := range s.D {
			pd.modelDeriv = append(pd.modelDeriv, L.FromSI(dv))
		}
	}
	return pd
}

func (a *App) renderPlots(p *project.Project, t *project.Test, d Display) *v.Node {
	box := v.El("div", v.A("id", "plots", "class", "ff-plots"))
	pd := a.plotData(p, t, d)
	if len(pd.tMin) == 0 {
		return box.Add(v.TextEl("p", v.A("class", "ff-hint"), "The plots appear once there are usable readings."))
	}
	ylab := "drawdown s (" + d.Length.Symbol + ")"
	xlab := "time since pumping started (min)"
	var window *[2]float64
	if a.fit.dragging {
		window = &[2]float64{a.fit.dragStart / units.Minute, a.fit.dragEnd / units.Minute}
	} else if t.Fit.WindowStart > 0 || t.Fit.WindowEnd > 0 {
		w0, w1 := t.Fit.WindowStart/units.Minute, t.Fit.WindowEnd/units.Minute
		if w0 == 0 {
			w0 = pd.tMin[0]
		}
		if w1 == 0 {
			w1 = pd.tMin[len(pd.tMin)-1]
		}
		window = &[2]float64{w0, w1}
	}
	fitted := len(pd.curve) > 0
	name := modelName(t.Fit.ModelOrDefault())
	notes := []string{Caution}

	// Log–log with derivative.
	ll := plot.Chart{Title: "Drawdown and derivative (log–log)", X: plot.Axis{Label: xlab, Log: true},
		Y: plot.Axis{Label: ylab + ", derivative ds/d ln t", Log: true}, Window: window, Notes: notes}
	if fitted {
		ll.Series = append(ll.Series,
			plot.Series{Name: "95 % band", Kind: plot.Band, X: pd.curveT, Y: pd.lo, Y2: pd.hi},
			plot.Series{Name: name + " fit", Kind: plot.Line, X: pd.curveT, Y: pd.curve, Style: plot.Style{Color: plot.Orange}})
		if len(pd.modelDeriv) == len(pd.curveT) {
			ll.Series = append(ll.Series, plot.Series{Name: "fit derivative", Kind: plot.Line, X: pd.curveT, Y: pd.modelDeriv,
				Style: plot.Style{Color: plot.Green, Dash: plot.Dashed}})
		}
	}
	ll.Series = append(ll.Series, plot.Series{Name: "drawdown", Kind: plot.Points, X: pd.tMin, Y: pd.dd, Used: pd.used,
		Style: plot.Style{Color: plot.Blue, Marker: plot.Circle}})
	if len(pd.deriv) == len(pd.tMin) {
		ll.Series = append(ll.Series, plot.Series{Name: "derivative (L = " + strconv.FormatFloat(t.Fit.SmoothingOrDefault(), 'g', 3, 64) + ")",
			Kind: plot.Points, X: pd.tMin, Y: pd.deriv, Style: plot.Style{Color: plot.Magenta, Marker: plot.Triangle}})
	}
	box.Add(a.chartNode("plot-loglog", &ll, true, t))

	// Semilog.
	sl := plot.Chart{Title: "Drawdown (semilog)", X: plot.Axis{Label: xlab, Log: true}, Y: plot.Axis{Label: ylab}, Window: window, Notes: notes}
	if fitted {
		sl.Series = append(sl.Series,
			plot.Series{Name: "95 % band", Kind: plot.Band, X: pd.curveT, Y: pd.lo, Y2: pd.hi},
			plot.Series{Name: name + " fit", Kind: plot.Line, X: pd.curveT, Y: pd.curve, Style: plot.Style{Color: plot.Orange}})
	}
	sl.Series = append(sl.Series, plot.Series{Name: "drawdown", Kind: plot.Points, X: pd.tMin, Y: pd.dd, Used: pd.used,
		Style: plot.Style{Color: plot.Blue, Marker: plot.Circle}})
	box.Add(a.chartNode("plot-semilog", &sl, false, t))

	// Residuals.
	if len(pd.resid) == len(pd.tMin) {
		rc := plot.Chart{Title: "Residuals (fit − observed)", X: plot.Axis{Label: xlab, Log: true},
			Y: plot.Axis{Label: "residual (" + d.Length.Symbol + ")"}, Window: window, Notes: notes,
			Series: []plot.Series{
				{Name: "zero", Kind: plot.Line, X: []float64{pd.tMin[0], pd.tMin[len(pd.tMin)-1]}, Y: []float64{0, 0},
					Style: plot.Style{Color: plot.Black, Dash: plot.Dotted, Width: 2}},
				{Name: "residual", Kind: plot.Points, X: pd.tMin, Y: pd.resid, Used: pd.used,
					Style: plot.Style{Color: plot.Blue, Marker: plot.Square}},
			}}
		box.Add(a.chartNode("plot-residuals", &rc, false, t))
	}
	return box
}

// chartNode renders a chart into a view node with the given id; when drag
// is true, dragging across it chooses the fit window.
func (a *App) chartNode(id string, c *plot.Chart, drag bool, t *project.Test) *v.Node {
	n, lay, err := c.Render()
	if err != nil {
		return v.TextEl("p", v.A("id", id, "class", "ff-msg"), "This plot cannot be drawn: "+err.Error())
	}
	root := fromPlot(n)
	root.Set("id", id)
	root.Set("class", "ff-plot")
	wrap := v.El("figure", v.A("class", "ff-figure"), root)
	if !drag {
		return wrap
	}
	root.Set("data-drag", "window")
	toSeconds := func(e *v.Event) (float64, bool) {
		if e.Width <= 0 {
			return 0, false
		}
		px := e.X * lay.Width / e.Width
		if px < lay.Plot.Left || px > lay.Plot.Right {
			px = math.Max(lay.Plot.Left, math.Min(lay.Plot.Right, px))
		}
		m := lay.X.Value(px)
		return m * units.Minute, m > 0 && !math.IsInf(m, 0)
	}
	var startPx float64
	root.Handle("pointerdown", func(e *v.Event) {
		s, ok := toSeconds(e)
		if !ok {
			return
		}
		e.Prevent = true
		startPx = e.X * lay.Width / math.Max(e.Width, 1)
		a.DragWindow("start", s, 0)
	})
	root.Handle("pointermove", func(e *v.Event) {
		if s, ok := toSeconds(e); ok {
			a.DragWindow("move", s, 0)
		}
	})
	root.Handle("pointerup", func(e *v.Event) {
		s, ok := toSeconds(e)
		moved := math.Abs(e.X*lay.Width/math.Max(e.Width, 1) - startPx)
		if !ok {
			a.DragWindow("cancel", 0, 0)
			return
		}
		a.DragWindow("end", s, moved)
	})
	root.Handle("pointercancel", func(e *v.Event) { a.DragWindow("cancel", 0, 0) })
	return wrap
}

// DragWindow follows a drag across the log–log plot: phase "start",
// "move", "end" (moved is the drag length in viewBox pixels; shorter
// than minDragPx is a tap and changes nothing) or "cancel"; s is the time
// under the pointer (s).
func (a *App) DragWindow(phase string, s, moved float64) {
	a.mu.Lock()
	defer a.mu.Unlock()
	t := a.currentTest()
	if t == nil {
		return
	}
	switch phase {
	case "start":
		a.fit.dragging, a.fit.dragStart, a.fit.dragEnd = true, s, s
	case "move":
		if a.fit.dragging {
			a.fit.dragEnd = s
		}
	case "end":
		if a.fit.dragging {
			a.fit.dragging = false
			if moved >= minDragPx {
				a.setWindowLocked(t, a.fit.dragStart, s)
			}
		}
	default:
		a.fit.dragging = false
	}
}

// fromPlot turns a plot element tree into view nodes.
func fromPlot(n *plot.Node) *v.Node {
	out := &v.Node{Tag: n.Tag, Text: n.Text}
	if n.Tag == "svg" {
		out.NS = v.SVGNS
	}
	if len(n.Attrs) > 0 {
		out.Attrs = make(map[string]string, len(n.Attrs)+2)
		for _, at := range n.Attrs {
			out.Attrs[at.Name] = at.Value
		}
	}
	if n.Text != "" && len(n.Children) > 0 {
		out.Children = append(out.Children, v.T(n.Text))
	}
	for _, c := range n.Children {
		out.Children = append(out.Children, fromPlot(c))
	}
	return out
}

func nan() float64 { return math.NaN() }
