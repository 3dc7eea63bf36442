// Package plot draws the charts of a field test — log–log drawdown with its
// derivative, semilog drawdown with a straight line, residuals — as SVG,
// made to be read on a tablet in sunlight at arm's length.
//
// A Chart describes what to draw: two axes (each linear or logarithmic,
// with a title that carries the unit), any number of series (points, lines,
// or a shaded band between two curves), an optional highlighted x-range
// (the fit window) and note lines (the caution). Render checks it and
// returns the drawing as a small element tree (Node) together with a
// Layout, which maps data to pixels and back for the screen code, and counts
// the values that could not be drawn.
//
// The browser layer turns the tree into SVG elements with createElementNS
// (SVGNamespace), setAttribute and textContent — never innerHTML; Node.SVG
// serialises the same tree, with XML escaping, for export and tests.
//
// Typical use by a screen:
//
//	c := &plot.Chart{
//		X: plot.Axis{Label: "time since pumping started (min)", Log: true},
//		Y: plot.Axis{Label: "drawdown (m)", Log: true},
//		Series: []plot.Series{
//			{Name: "drawdown", Kind: plot.Points, X: t, Y: s, Used: used},
//			{Name: "Theis fit", Kind: plot.Line, X: tc, Y: sc},
//			{Name: "95 % band", Kind: plot.Band, X: tc, Y: lo, Y2: hi},
//		},
//		Window: &[2]float64{t0, t1},
//		Notes:  []string{caution},
//	}
//	root, layout, err := c.Render()
//	// DOM: build root; on a drag from clientX0 to clientX1 over the SVG:
//	//   p0, _ := layout.ViewBoxPoint(clientX0, clientY, box)
//	//   p1, _ := layout.ViewBoxPoint(clientX1, clientY, box)
//	//   lo, hi, ok := layout.XSpan(p0, p1)
//	// Export: root.SVG().
//
// Drawing rules:
//   - The SVG has a viewBox of Width × Height user units and width 100 %, so
//     it scales to its container; sizes below are at 1×. Tick labels are
//     16 px, axis titles 18 px, legend 16 px, notes 15 px; black text on
//     white, lines 3.5 px, markers 12 px across.
//   - The palette is our own: dark blue, dark orange, bluish green, magenta,
//     near-black, with grey for excluded points. Blue and orange, the first
//     two, stay apart for the common kinds of colour blindness, and series
//     differ in marker shape (circle, square, triangle, diamond, inverted
//     triangle) and line dash (solid, dashed, dotted, dash-dot) too.
//   - Used points are filled; excluded points (Series.Used[i] false) are
//     hollow grey and get their own legend entry.
//   - Log axes get a labelled tick at each decade (… 0.1, 1, 10, 100 …) and
//     minor ticks at 2…9; linear axes get "nice" ticks at 1, 2 or 5 × 10ᵏ.
//     Labels that would overlap are thinned evenly.
//   - Automatic ranges cover every drawable value: on a log axis the range
//     is widened to 1, 2 or 5 × 10ᵏ, on a linear one to a whole tick step.
//   - A value that is NaN, infinite, or ≤ 0 on a log axis is not drawn; it
//     is counted in Layout.Counts and the chart says so in a note line, so
//     nothing is dropped silently. Points outside a fixed range are counted
//     and noted as well; lines and bands are clipped to the plot.
package plot
