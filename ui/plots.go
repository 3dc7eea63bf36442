package ui

import (
	"math"
	"strconv"

	"fieldfit/models"
	"fieldfit/models/diagnostic"
	"fieldfit/models/units"
	"fieldfit/ui/plot"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// minDragPx is the least drag, in viewBox pixels, taken as choosing a
// window rather than a tap.
const minDragPx = 12

// curveN is the number of points of a fitted curve.
const curveN = 120

// plotSet is one set of readings and its fitted curve on one time axis,
// in display units (x in minutes, y in the display length).
type plotSet struct {
	x, y   []float64
	used   []bool
	cx, c  []float64 // fitted curve
	lo, hi []float64 // its 95 % band
}

// logSpace returns n times log-spaced from lo to hi.
func logSpace(lo, hi float64, n int) []float64 {
	ts := make([]float64, n)
	for i := range ts {
		ts[i] = lo * math.Pow(hi/lo, float64(i)/float64(n-1))
	}
	return ts
}

// derivative returns the Bourdet derivative of y(x) with the window L
// (log cycles), or nil.
func derivative(x, y []float64, L float64) []float64 {
	if len(x) < 2 {
		return nil
	}
	r, err := diagnostic.Derivative(x, y, &diagnostic.Settings{Window: diagnostic.WindowFromCycles(L)})
	if err != nil {
		return nil
	}
	return r.D
}

// pumpPlots are the series of the plots of a test.
type pumpPlots struct {
	draw  plotSet // drawdown while pumping, against t
	rec   plotSet // recovered drawdown s(tp) − s′ against Agarwal time
	line  plotSet // residual drawdown s′ against t/t′
	all   plotSet // every reading against t, for the residuals
	resid []float64
	wells []plotSet // every well while pumping, for the joint plot
	names []string
}

func (a *App) plotData(p *project.Project, t *project.Test, d Display) *pumpPlots {
	req, _ := a.fitRequestLocked(t)
	pp := &pumpPlots{}
	L := d.Length
	out := a.fit.out
	fitted := out != nil && len(out.Residual) == len(req.Time) && t.Result != nil && out.Result.Inputs == req.Fingerprint()
	tp := req.Stop
	var sp float64 // drawdown at the stop, for the recovered drawdown
	for k, w := range req.wells() {
		var ws plotSet
		for i, tm := range w.Time {
			in := (req.From == 0 || tm >= req.From) && (req.To == 0 || tm <= req.To)
			if k == 0 {
				pp.all.x, pp.all.y = append(pp.all.x, tm/units.Minute), append(pp.all.y, L.FromSI(w.Drawdown[i]))
				pp.all.used = append(pp.all.used, in)
			}
			if tp > 0 && tm > tp {
				if k == 0 && sp > 0 {
					te := models.AgarwalTime(tp, tm-tp)
					pp.rec.x, pp.rec.y = append(pp.rec.x, te/units.Minute), append(pp.rec.y, L.FromSI(sp-w.Drawdown[i]))
					pp.rec.used = append(pp.rec.used, in)
					pp.line.x, pp.line.y = append(pp.line.x, tm/(tm-tp)), append(pp.line.y, L.FromSI(w.Drawdown[i]))
					pp.line.used = append(pp.line.used, in)
				}
				continue
			}
			if k == 0 {
				sp = w.Drawdown[i]
			}
			ws.x, ws.y, ws.used = append(ws.x, tm/units.Minute), append(ws.y, L.FromSI(w.Drawdown[i])), append(ws.used, in)
		}
		if fitted && len(ws.x) > 1 && k < len(out.Wells) {
			ts := logSpace(ws.x[0]*units.Minute, ws.x[len(ws.x)-1]*units.Minute, curveN)
			c, lo, hi := out.WellBand(k, ts)
			for i := range ts {
				ws.cx, ws.c = append(ws.cx, ts[i]/units.Minute), append(ws.c, L.FromSI(c[i]))
				ws.lo, ws.hi = append(ws.lo, L.FromSI(lo[i])), append(ws.hi, L.FromSI(hi[i]))
			}
		}
		pp.wells = append(pp.wells, ws)
		pp.names = append(pp.names, w.Name)
	}
	pp.draw = pp.wells[0]
	if fitted {
		for _, r := range out.Residual {
			pp.resid = append(pp.resid, L.FromSI(r))
		}
		if n := len(pp.line.x); n > 1 && sp > 0 {
			// The fitted curve on the recovery axes, from the model's
			// drawdown at the stop and after it.
			tr := logSpace((tp*pp.line.x[n-1]/(pp.line.x[n-1]-1))-tp, (tp*pp.line.x[0]/(pp.line.x[0]-1))-tp, curveN)
			ts := make([]float64, len(tr))
			for i := range tr {
				ts[i] = tp + tr[i]
			}
			c, lo, hi := out.Band(ts)
			s0 := out.Eval([]float64{tp})[0]
			for i := range tr {
				pp.line.cx, pp.line.c = append(pp.line.cx, ts[i]/tr[i]), append(pp.line.c, L.FromSI(c[i]))
				pp.line.lo, pp.line.hi = append(pp.line.lo, L.FromSI(lo[i])), append(pp.line.hi, L.FromSI(hi[i]))
				if !math.IsNaN(s0) && req.Model != project.RecoveryLine {
					pp.rec.cx, pp.rec.c = append(pp.rec.cx, models.AgarwalTime(tp, tr[i])/units.Minute), append(pp.rec.c, L.FromSI(s0-c[i]))
				}
			}
		}
	}
	return pp
}

// logLog is a log–log chart of s with its derivative (window L), and the
// fitted curve with its band and derivative.
func logLog(title, xlab, ylab, name string, s *plotSet, L float64, window *[2]float64) plot.Chart {
	ch := plot.Chart{Title: title, X: plot.Axis{Label: xlab, Log: true},
		Y: plot.Axis{Label: ylab + ", derivative ds/d ln t", Log: true}, Window: window, Notes: []string{Caution}}
	if len(s.c) > 0 {
		if len(s.lo) == len(s.cx) {
			ch.Series = append(ch.Series, plot.Series{Name: "95 % band", Kind: plot.Band, X: s.cx, Y: s.lo, Y2: s.hi})
		}
		ch.Series = append(ch.Series, plot.Series{Name: name + " fit", Kind: plot.Line, X: s.cx, Y: s.c, Style: plot.Style{Color: plot.Orange}})
		if md := derivative(s.cx, s.c, 0.05); len(md) == len(s.cx) {
			ch.Series = append(ch.Series, plot.Series{Name: "fit derivative", Kind: plot.Line, X: s.cx, Y: md,
				Style: plot.Style{Color: plot.Green, Dash: plot.Dashed}})
		}
	}
	ch.Series = append(ch.Series, plot.Series{Name: "readings", Kind: plot.Points, X: s.x, Y: s.y, Used: s.used,
		Style: plot.Style{Color: plot.Blue, Marker: plot.Circle}})
	if dv := derivative(s.x, s.y, L); len(dv) == len(s.x) {
		ch.Series = append(ch.Series, plot.Series{Name: "derivative (L = " + strconv.FormatFloat(L, 'g', 3, 64) + ")",
			Kind: plot.Points, X: s.x, Y: dv, Style: plot.Style{Color: plot.Magenta, Marker: plot.Triangle}})
	}
	return ch
}

// semiLog is a semilog chart of s with the fitted curve and its band.
func semiLog(title, xlab, ylab, name string, s *plotSet, window *[2]float64) plot.Chart {
	ch := plot.Chart{Title: title, X: plot.Axis{Label: xlab, Log: true}, Y: plot.Axis{Label: ylab}, Window: window, Notes: []string{Caution}}
	if len(s.c) > 0 {
		ch.Series = append(ch.Series,
			plot.Series{Name: "95 % band", Kind: plot.Band, X: s.cx, Y: s.lo, Y2: s.hi},
			plot.Series{Name: name + " fit", Kind: plot.Line, X: s.cx, Y: s.c, Style: plot.Style{Color: plot.Orange}})
	}
	ch.Series = append(ch.Series, plot.Series{Name: "readings", Kind: plot.Points, X: s.x, Y: s.y, Used: s.used,
		Style: plot.Style{Color: plot.Blue, Marker: plot.Circle}})
	return ch
}

func (a *App) renderPlots(p *project.Project, t *project.Test, d Display) *v.Node {
	box := v.El("div", v.A("id", "plots", "class", "ff-plots"))
	pp := a.plotData(p, t, d)
	if len(pp.all.x) == 0 {
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
			w0 = pp.all.x[0]
		}
		if w1 == 0 {
			w1 = pp.all.x[len(pp.all.x)-1]
		}
		window = &[2]float64{w0, w1}
	}
	name := modelName(t.Fit.ModelOrDefault())
	L := t.Fit.SmoothingOrDefault()
	if len(pp.draw.x) > 0 {
		ll := logLog("Drawdown and derivative (log–log)", xlab, ylab, name, &pp.draw, L, window)
		box.Add(a.chartNode("plot-loglog", &ll, true, t))
		sl := semiLog("Drawdown (semilog)", xlab, ylab, name, &pp.draw, window)
		box.Add(a.chartNode("plot-semilog", &sl, false, t))
	}
	if len(pp.rec.x) > 1 {
		rl := logLog("Recovery on Agarwal time (log–log)", "Agarwal equivalent time tₑ = tp·t′/(tp + t′) (min)",
			"recovered drawdown s(tp) − s′ ("+d.Length.Symbol+")", name, &pp.rec, L, nil)
		box.Add(a.chartNode("plot-recovery", &rl, false, t))
		ln := semiLog("Residual drawdown against t/t′ (Theis recovery)", "t/t′ (time since start / time since stop)",
			"residual drawdown s′ ("+d.Length.Symbol+")", name, &pp.line, nil)
		box.Add(a.chartNode("plot-recovery-line", &ln, false, t))
	}
	if len(pp.wells) > 1 {
		ch := plot.Chart{Title: "Drawdown and derivative at every well (log–log)", X: plot.Axis{Label: xlab, Log: true},
			Y: plot.Axis{Label: ylab + ", derivative ds/d ln t (L = " + strconv.FormatFloat(L, 'g', 3, 64) + ")", Log: true}, Notes: []string{Caution}}
		marks := []plot.Marker{plot.Circle, plot.Square, plot.Triangle, plot.Diamond}
		for k, ws := range pp.wells {
			col := []plot.Color{plot.Blue, plot.Orange, plot.Green, plot.Magenta, plot.Black}[k%5]
			if len(ws.c) > 0 {
				ch.Series = append(ch.Series, plot.Series{Name: pp.names[k] + " fit", Kind: plot.Line, X: ws.cx, Y: ws.c, Style: plot.Style{Color: col}})
			}
			ch.Series = append(ch.Series, plot.Series{Name: pp.names[k], Kind: plot.Points, X: ws.x, Y: ws.y, Used: ws.used,
				Style: plot.Style{Color: col, Marker: marks[k%4]}})
			if dv := derivative(ws.x, ws.y, L); len(dv) == len(ws.x) {
				ch.Series = append(ch.Series, plot.Series{Name: pp.names[k] + " derivative", Kind: plot.Points, X: ws.x, Y: dv,
					Style: plot.Style{Color: col, Marker: plot.Triangle}})
			}
		}
		box.Add(a.chartNode("plot-wells", &ch, false, t))
	}
	if len(pp.resid) == len(pp.all.x) {
		rc := plot.Chart{Title: "Residuals (fit − observed)", X: plot.Axis{Label: xlab, Log: true},
			Y: plot.Axis{Label: "residual (" + d.Length.Symbol + ")"}, Window: window, Notes: []string{Caution},
			Series: []plot.Series{
				{Name: "zero", Kind: plot.Line, X: []float64{pp.all.x[0], pp.all.x[len(pp.all.x)-1]}, Y: []float64{0, 0},
					Style: plot.Style{Color: plot.Black, Dash: plot.Dotted, Width: 2}},
				{Name: "residual", Kind: plot.Points, X: pp.all.x, Y: pp.resid, Used: pp.all.used,
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
