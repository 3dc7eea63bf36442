package plot

import (
	"encoding/xml"
	"errors"
	"io"
	"math"
	"strconv"
	"strings"
	"testing"
)

func render(t testing.TB, c *Chart) (*Node, *Layout) {
	t.Helper()
	root, lay, err := c.Render()
	if err != nil {
		t.Fatal(err)
	}
	return root, lay
}

func near(a, b, tol float64) bool { return math.Abs(a-b) <= tol }

// TestScaleRoundTrip: Value inverts Pixel and Pixel inverts Value, on
// linear, log and inverted scales.
func TestScaleRoundTrip(t *testing.T) {
	scales := []Scale{
		{Log: false, Min: -2.5, Max: 7, From: 80, To: 900},
		{Log: true, Min: 0.5, Max: 5000, From: 80, To: 900},
		{Log: true, Min: 1e-3, Max: 5, From: 540, To: 40},
		{Log: false, Min: 0, Max: 2, From: 40, To: 540},   // inverted y
		{Log: true, Min: 1, Max: 1000, From: 900, To: 80}, // inverted x
	}
	for _, s := range scales {
		if !near(s.Pixel(s.Min), s.From, 1e-9) || !near(s.Pixel(s.Max), s.To, 1e-9) {
			t.Errorf("%+v: ends map to %g, %g", s, s.Pixel(s.Min), s.Pixel(s.Max))
		}
		for k := 0; k <= 20; k++ {
			p := s.From + (s.To-s.From)*float64(k)/20
			v := s.Value(p)
			if back := s.Pixel(v); !near(back, p, 1e-9) {
				t.Errorf("%+v: pixel %g → %g → %g", s, p, v, back)
			}
			if back := s.Value(s.Pixel(v)); math.Abs(back-v) > 1e-12*math.Max(1, math.Abs(v)) {
				t.Errorf("%+v: value %g → %g", s, v, back)
			}
		}
		if s.Log {
			for _, v := range []float64{0, -1, math.NaN()} {
				if p := s.Pixel(v); !math.IsNaN(p) {
					t.Errorf("log scale: Pixel(%g) = %g, want NaN", v, p)
				}
			}
		}
	}
	// Log mapping: each decade is the same length (definition of a log axis).
	s := Scale{Log: true, Min: 0.1, Max: 1000, From: 100, To: 900}
	for _, v := range []float64{0.1, 1, 10, 100, 1000} {
		want := 100 + 200*(math.Log10(v)+1)
		if !near(s.Pixel(v), want, 1e-9) {
			t.Errorf("Pixel(%g) = %g, want %g", v, s.Pixel(v), want)
		}
	}
}

func TestLayoutMapping(t *testing.T) {
	root, lay := render(t, logLogChart())
	p := lay.Plot
	if lay.X.From != p.Left || lay.X.To != p.Right || lay.Y.From != p.Bottom || lay.Y.To != p.Top {
		t.Errorf("scales %+v %+v do not span the plot %+v", lay.X, lay.Y, p)
	}
	for _, d := range [][2]float64{{1, 0.01}, {3, 0.2}, {900, 1.7}, {0.5, 0.001}} {
		px, py := lay.Pixel(d[0], d[1])
		x, y := lay.Value(px, py)
		if math.Abs(x-d[0]) > 1e-12*d[0] || math.Abs(y-d[1]) > 1e-12*d[1] {
			t.Errorf("data %v → pixel (%g, %g) → data (%g, %g)", d, px, py, x, y)
		}
		if !lay.Inside(px, py) {
			t.Errorf("data %v at (%g, %g) is not inside the plot %+v", d, px, py, p)
		}
	}
	if lay.Inside(p.Left-1, p.Top) || lay.Inside(p.Left, p.Bottom+1) {
		t.Error("Inside accepts points outside the plot")
	}
	// A drag from the window's right end leftwards past the plot.
	p900 := lay.X.Pixel(900)
	lo, hi, ok := lay.XSpan(p900, p.Left-50)
	if !ok || !near(hi, 900, 1e-9) || !near(lo, lay.X.Min, 1e-12) {
		t.Errorf("XSpan = %g, %g, %v; want %g, 900", lo, hi, ok, lay.X.Min)
	}
	if _, _, ok := lay.XSpan(p900, p900+1); ok {
		t.Error("XSpan of 1 px accepted")
	}
	if _, _, ok := lay.XSpan(math.NaN(), p900); ok {
		t.Error("XSpan of NaN accepted")
	}
	// viewBox ↔ screen: the SVG shown at half size in a box 200 px taller
	// than needed (letterboxed vertically by "xMidYMid meet").
	vb := root.Attr("viewBox")
	if vb != "0 0 "+num(lay.Width)+" "+num(lay.Height) {
		t.Errorf("viewBox %q, layout %g × %g", vb, lay.Width, lay.Height)
	}
	box := Rect{Left: 10, Top: 20, Right: 10 + lay.Width/2, Bottom: 20 + lay.Height/2 + 200}
	px, py := lay.ViewBoxPoint(10+300/2, 20+100+400/2, box)
	if !near(px, 300, 1e-9) || !near(py, 400, 1e-9) {
		t.Errorf("ViewBoxPoint = %g, %g, want 300, 400", px, py)
	}
	if px, _ := lay.ViewBoxPoint(1, 1, Rect{}); !math.IsNaN(px) {
		t.Error("ViewBoxPoint of an empty box is not NaN")
	}
}

func TestInvertedAxis(t *testing.T) {
	_, lay := render(t, semilogChart())
	if !(lay.Y.Pixel(1.5) > lay.Y.Pixel(0.5)) {
		t.Errorf("inverted y: 1.5 m at %g is not below 0.5 m at %g", lay.Y.Pixel(1.5), lay.Y.Pixel(0.5))
	}
	if lay.Y.From != lay.Plot.Top {
		t.Errorf("inverted y starts at %g, want the top %g", lay.Y.From, lay.Plot.Top)
	}
	c := semilogChart()
	c.X.Invert = true
	_, lay = render(t, c)
	if !(lay.X.Pixel(10) > lay.X.Pixel(100)) {
		t.Error("inverted x: 10 is not right of 100")
	}
}

// TestEscaping: user text is escaped in the SVG string and kept whole in
// the tree, where the browser layer sets it with textContent.
func TestEscaping(t *testing.T) {
	const evil = `<img src=x onerror="alert('x')">&amp;`
	c := &Chart{
		Title: "title " + evil,
		X:     Axis{Label: evil, Log: true},
		Y:     Axis{Label: "bad\x00control\x1b and \xff byte"},
		Series: []Series{
			{Name: "name " + evil, X: []float64{1, 10}, Y: []float64{1, 2}},
		},
		WindowLabel: "</text><script>alert(1)</script>",
		Window:      &[2]float64{2, 5},
		Notes:       []string{"note " + evil + "\nsecond line"},
	}
	root, _ := render(t, c)
	svg := root.SVG()
	for _, bad := range []string{"<img", "<script", "\x00", "\x1b", "\xff"} {
		if strings.Contains(svg, bad) {
			t.Errorf("SVG contains %q", bad)
		}
	}
	if !strings.Contains(svg, "&lt;img src=x onerror=&#34;alert(&#39;x&#39;)&#34;&gt;&amp;amp;") &&
		!strings.Contains(svg, "&lt;img src=x onerror=\"alert('x')\"&gt;&amp;amp;") {
		t.Errorf("escaped label not found in\n%s", svg)
	}
	// The output is well-formed XML and every text decodes to what the
	// tree holds.
	var texts []string
	root.Walk(func(n *Node) {
		if n.Text != "" {
			texts = append(texts, n.Text)
		}
	})
	dec := xml.NewDecoder(strings.NewReader(svg))
	var got []string
	var attrs []string
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
		switch tk := tok.(type) {
		case xml.CharData:
			if s := strings.TrimSpace(string(tk)); s != "" {
				got = append(got, string(tk))
			}
		case xml.StartElement:
			for _, a := range tk.Attr {
				attrs = append(attrs, a.Value)
			}
		}
	}
	if strings.Join(got, "|") != strings.Join(texts, "|") {
		t.Errorf("decoded texts\n%q\nwant\n%q", got, texts)
	}
	foundLabel := false
	for _, tx := range texts {
		if tx == evil {
			foundLabel = true
		}
	}
	if !foundLabel {
		t.Errorf("x label not kept whole in the tree: %q", texts)
	}
	if !strings.Contains(strings.Join(attrs, "|"), "title "+evil) {
		t.Error("aria-label attribute does not decode to the title")
	}
	if !strings.Contains(strings.Join(texts, "|"), "bad\uFFFDcontrol\uFFFD and \uFFFD byte") {
		t.Errorf("control characters not replaced: %q", texts)
	}
}

func TestSVGEscapeNode(t *testing.T) {
	n := &Node{Tag: "g", Attrs: []Attr{{"data-x", "a\"b'c<d>&\te\nf"}}, Children: []*Node{
		{Tag: "text", Text: "1 < 2 & 3 > \"q\" 'a'"},
		{Tag: "path"},
	}}
	want := "<g data-x=\"a&quot;b&#39;c&lt;d&gt;&amp;&#9;e&#10;f\">\n<text>1 &lt; 2 &amp; 3 &gt; \"q\" 'a'</text>\n<path/>\n</g>\n"
	if got := n.SVG(); got != want {
		t.Errorf("SVG()\n%q\nwant\n%q", got, want)
	}
}

// TestSkippedCounted: NaN, ±Inf and values ≤ 0 on a log axis are not
// drawn, counted per series and noted on the chart.
func TestSkippedCounted(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	c := &Chart{
		X: Axis{Label: "t", Log: true},
		Y: Axis{Label: "s", Log: true},
		Series: []Series{
			{Name: "pts", X: []float64{1, 2, nan, 4, -5, 6, 0, 8, 9}, Y: []float64{1, 0, 3, inf, 5, -6, 7, 8, 9},
				Used: []bool{true, true, true, true, true, true, true, false, true}},
			{Name: "curve", Kind: Line, X: []float64{1, 2, 3, 4}, Y: []float64{1, nan, 3, -4}},
			{Kind: Band, X: []float64{1, 2, 3}, Y: []float64{1, 0.5, 1}, Y2: []float64{2, 2, -inf}},
		},
	}
	root, lay := render(t, c)
	want := []Count{
		{Total: 9, Drawn: 3, NotFinite: 2, NotPositive: 4, Excluded: 1},
		{Total: 4, Drawn: 2, NotFinite: 1, NotPositive: 1},
		{Total: 3, Drawn: 2, NotFinite: 1},
	}
	for i := range want {
		if lay.Counts[i] != want[i] {
			t.Errorf("series %d: %+v, want %+v", i, lay.Counts[i], want[i])
		}
	}
	if lay.Skipped() != 9 {
		t.Errorf("Skipped() = %d, want 9", lay.Skipped())
	}
	wantNotes := []string{
		"Not shown from “pts” (9 points): 2 missing or non-finite values, 4 values ≤ 0 on a log axis.",
		"Not shown from “curve” (4 points): 1 missing or non-finite value, 1 value ≤ 0 on a log axis.",
		"Not shown from “series 3” (3 points): 1 missing or non-finite value.",
	}
	if strings.Join(lay.Notes, "\n") != strings.Join(wantNotes, "\n") {
		t.Errorf("notes\n%s\nwant\n%s", strings.Join(lay.Notes, "\n"), strings.Join(wantNotes, "\n"))
	}
	svg := root.SVG()
	for _, n := range wantNotes {
		if !strings.Contains(svg, n) {
			t.Errorf("note %q not drawn", n)
		}
	}
	// Drawn markers: 2 filled, 1 hollow.
	filled, hollow := 0, 0
	root.Walk(func(n *Node) {
		if n.Tag == "path" && n.Attr("stroke") == colorHex[Blue] && n.Attr("fill") == colorHex[Blue] && !strings.Contains(n.Attr("d"), "h") {
			filled += strings.Count(n.Attr("d"), "Z")
		}
		if n.Tag == "path" && n.Attr("stroke") == Grey.Hex() {
			hollow += strings.Count(n.Attr("d"), "Z")
		}
	})
	if filled != 2+1 || hollow != 1+1 { // + one legend swatch each
		t.Errorf("%d filled and %d hollow markers, want 3 and 2 (with the legend)", filled, hollow)
	}
	// On linear axes the same values ≤ 0 are drawn.
	c.X.Log, c.Y.Log = false, false
	_, lay = render(t, c)
	if got := lay.Counts[0]; got.NotPositive != 0 || got.Drawn != 7 {
		t.Errorf("linear axes: %+v, want 7 drawn", got)
	}
}

func TestOutsideFixedRange(t *testing.T) {
	c := &Chart{
		X: Axis{Log: true, Min: 1, Max: 100},
		Y: Axis{Min: 0, Max: 1},
		Series: []Series{
			{Name: "p", X: []float64{0.5, 1, 50, 100, 200, 50}, Y: []float64{0.5, 0.5, 0.5, 1, 0.5, 1.5}},
			{Name: "l", Kind: Line, X: []float64{0.1, 1000}, Y: []float64{-1, 2}},
		},
		Window: &[2]float64{200, 300},
	}
	root, lay := render(t, c)
	if got := lay.Counts[0]; got.Outside != 3 || got.Drawn != 3 {
		t.Errorf("points %+v, want 3 outside, 3 drawn", got)
	}
	if got := lay.Counts[1]; got.Outside != 0 || got.Drawn != 2 {
		t.Errorf("line %+v, want 2 drawn, none outside", got)
	}
	if !strings.Contains(strings.Join(lay.Notes, "|"), "3 points outside the shown range") ||
		!strings.Contains(strings.Join(lay.Notes, "|"), "The fit window (200 to 300) lies outside the shown range.") {
		t.Errorf("notes %q", lay.Notes)
	}
	// The line is clipped to the plot: every coordinate lies inside.
	root.Walk(func(n *Node) {
		if n.Tag != "path" || n.Attr("stroke") != colorHex[Orange] || strings.Contains(n.Attr("d"), "h") {
			return
		}
		coords := strings.FieldsFunc(n.Attr("d"), func(r rune) bool { return r == 'M' || r == 'L' || r == ' ' })
		for k := 0; k+1 < len(coords); k += 2 {
			var x, y float64
			if _, err := fmtSscan(coords[k], coords[k+1], &x, &y); err != nil {
				t.Fatal(err)
			}
			if !lay.Plot.Contains(x+0.05, y) && !lay.Plot.Contains(x-0.05, y) && !lay.Plot.Contains(x, y+0.05) && !lay.Plot.Contains(x, y-0.05) {
				t.Errorf("line vertex (%g, %g) outside the plot %+v", x, y, lay.Plot)
			}
		}
	})
}

func TestRenderErrors(t *testing.T) {
	two := []float64{1, 2}
	cases := []struct {
		name   string
		c      Chart
		err    error
		series int
		field  string
	}{
		{"narrow", Chart{Width: 100}, ErrSize, -1, "Width"},
		{"NaN height", Chart{Height: math.NaN()}, ErrSize, -1, "Height"},
		{"huge", Chart{Width: 1e6}, ErrSize, -1, "Width"},
		{"reversed range", Chart{X: Axis{Min: 5, Max: 1}}, ErrRange, -1, "X.Max"},
		{"log min zero", Chart{Y: Axis{Log: true, Min: 0, Max: 10}}, ErrRange, -1, "Y.Min"},
		{"NaN min", Chart{Y: Axis{Min: math.NaN()}}, ErrRange, -1, "Y.Min"},
		{"infinite max", Chart{X: Axis{Max: math.Inf(1)}}, ErrRange, -1, "X.Max"},
		{"NaN window", Chart{Window: &[2]float64{1, math.NaN()}}, ErrRange, -1, "Window[1]"},
		{"window ≤ 0 on log", Chart{X: Axis{Log: true}, Window: &[2]float64{0, 5}}, ErrRange, -1, "Window[0]"},
		{"Y length", Chart{Series: []Series{{X: two, Y: two[:1]}}}, ErrLength, 0, "Y"},
		{"band without Y2", Chart{Series: []Series{{Kind: Line, X: two, Y: two}, {Kind: Band, X: two, Y: two}}}, ErrLength, 1, "Y2"},
		{"Y2 on points", Chart{Series: []Series{{X: two, Y: two, Y2: two}}}, ErrSeries, 0, "Y2"},
		{"Used on a line", Chart{Series: []Series{{Kind: Line, X: two, Y: two, Used: []bool{true, true}}}}, ErrSeries, 0, "Used"},
		{"Used length", Chart{Series: []Series{{X: two, Y: two, Used: []bool{true}}}}, ErrLength, 0, "Used"},
		{"unknown kind", Chart{Series: []Series{{Kind: 7}}}, ErrSeries, 0, "Kind"},
		{"unknown colour", Chart{Series: []Series{{Style: Style{Color: 99}}}}, ErrStyle, 0, "Style.Color"},
		{"unknown marker", Chart{Series: []Series{{Style: Style{Marker: 99}}}}, ErrStyle, 0, "Style.Marker"},
		{"unknown dash", Chart{Series: []Series{{Style: Style{Dash: 99}}}}, ErrStyle, 0, "Style.Dash"},
		{"negative width", Chart{Series: []Series{{Style: Style{Width: -1}}}}, ErrStyle, 0, "Style.Width"},
		{"NaN size", Chart{Series: []Series{{Style: Style{Size: math.NaN()}}}}, ErrStyle, 0, "Style.Size"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			root, lay, err := c.c.Render()
			if err == nil {
				t.Fatal("no error")
			}
			if root != nil || lay != nil {
				t.Error("result with error")
			}
			if !errors.Is(err, c.err) {
				t.Errorf("%v does not wrap %v", err, c.err)
			}
			var pe *Error
			if !errors.As(err, &pe) || pe.Series != c.series || pe.Field != c.field {
				t.Errorf("%v: want series %d field %q", err, c.series, c.field)
			}
		})
	}
	_, _, err := (&Chart{Series: []Series{{Name: "B2", X: []float64{1}, Y: nil}}}).Render()
	if want := `plot: series 0 ("B2"), Y: slice lengths differ: len(Y) = 0, len(X) = 1`; err == nil || err.Error() != want {
		t.Errorf("message %q, want %q", err, want)
	}
}

// TestElementsSafe: the tree uses only plain SVG elements and attributes,
// never scripts, event handlers, links or foreign content.
func TestElementsSafe(t *testing.T) {
	tags := map[string]bool{"svg": true, "title": true, "g": true, "rect": true, "path": true, "text": true}
	root, _ := render(t, logLogChart())
	if root.Tag != "svg" || root.Attr("xmlns") != SVGNamespace || root.Attr("width") != "100%" {
		t.Errorf("root %s %v", root.Tag, root.Attrs)
	}
	root.Walk(func(n *Node) {
		if !tags[n.Tag] {
			t.Errorf("element %q", n.Tag)
		}
		for _, a := range n.Attrs {
			if strings.HasPrefix(a.Name, "on") || strings.Contains(a.Name, "href") || a.Name == "style" {
				t.Errorf("attribute %q on %s", a.Name, n.Tag)
			}
		}
		if n.Tag == "text" {
			if fs := n.Attr("font-size"); fs != "" {
				t.Errorf("text with its own font size %s", fs)
			}
		}
		if fs := n.Attr("font-size"); fs != "" {
			var v float64
			if _, err := fmtSscan(fs, "0", &v, new(float64)); err != nil || v < 14 {
				t.Errorf("font size %q below 14 px", fs)
			}
		}
	})
}

// TestStyles: automatic colours, markers and dashes differ between series;
// the band takes the colour of the first line; excluded points are hollow
// grey and have a legend entry.
func TestStyles(t *testing.T) {
	c := logLogChart()
	w, h, rs, err := c.check()
	if err != nil || w != DefaultWidth || h != DefaultHeight {
		t.Fatal(err, w, h)
	}
	if rs[0].color != Blue.Hex() || rs[1].color != Orange.Hex() || rs[2].color != Green.Hex() || rs[3].color != Magenta.Hex() {
		t.Errorf("colours %s %s %s %s", rs[0].color, rs[1].color, rs[2].color, rs[3].color)
	}
	if rs[4].color != rs[1].color {
		t.Errorf("band colour %s, want the first line's %s", rs[4].color, rs[1].color)
	}
	if rs[0].marker == rs[2].marker || rs[1].dash == rs[3].dash {
		t.Error("two point series share a marker or two lines share a dash")
	}
	root, _ := render(t, c)
	svg := root.SVG()
	for _, entry := range []string{">drawdown<", ">drawdown (excluded)<", ">derivative ds/d ln t (excluded)<", ">Theis fit<", ">95 % band of the fit<", ">fit window<"} {
		if !strings.Contains(svg, entry) {
			t.Errorf("legend entry %s missing", entry)
		}
	}
	hollow := 0
	root.Walk(func(n *Node) {
		if n.Tag == "path" && n.Attr("stroke") == Grey.Hex() {
			hollow++
			if n.Attr("fill") != colBackground {
				t.Errorf("excluded points filled with %s", n.Attr("fill"))
			}
		}
	})
	if hollow != 4 { // two series, each in the plot and in the legend
		t.Errorf("%d hollow marker paths, want 4", hollow)
	}
	// A fixed colour and marker are kept.
	c.Series[0].Style = Style{Color: Black, Marker: Diamond}
	_, _, rs, _ = c.check()
	if rs[0].color != Black.Hex() || rs[0].marker != Diamond {
		t.Errorf("fixed style lost: %s %v", rs[0].color, rs[0].marker)
	}
	if Color(200).Hex() != "" || AutoColor.Hex() != "" {
		t.Error("Hex of a non-colour")
	}
}

// TestLabelsDoNotOverlap: on a narrow chart over many decades the labels
// are thinned until they keep apart.
func TestLabelsDoNotOverlap(t *testing.T) {
	for _, c := range []*Chart{
		{Width: MinWidth, Height: MinHeight, X: Axis{Log: true, Min: 1e-9, Max: 1e9}, Y: Axis{Log: true, Min: 1e-12, Max: 1e12}},
		{Width: MinWidth, X: Axis{Min: 123456.5, Max: 123499.5}, Y: Axis{Min: -1e-6, Max: 1e-6}},
	} {
		_, lay := render(t, c)
		check := func(ticks []Tick, s Scale, horizontal bool) {
			prev := -1
			shown := 0
			for i, tk := range ticks {
				if tk.Label == "" {
					continue
				}
				shown++
				if prev >= 0 {
					gap := math.Abs(s.Pixel(tk.Value) - s.Pixel(ticks[prev].Value))
					need := fontTick * 1.2
					if horizontal {
						need = (textWidth(tk.Label, fontTick) + textWidth(ticks[prev].Label, fontTick)) / 2
					}
					if gap < need {
						t.Errorf("labels %q and %q %g px apart, need %g", ticks[prev].Label, tk.Label, gap, need)
					}
				}
				prev = i
			}
			if shown < 2 {
				t.Errorf("only %d labels shown: %v", shown, ticks)
			}
		}
		check(lay.XTicks, lay.X, true)
		check(lay.YTicks, lay.Y, false)
	}
}

func TestClipSegment(t *testing.T) {
	r := Rect{0, 0, 10, 10}
	cases := []struct {
		a, b, wa, wb pt
		ok           bool
	}{
		{pt{1, 1}, pt{9, 9}, pt{1, 1}, pt{9, 9}, true},
		{pt{-5, 5}, pt{15, 5}, pt{0, 5}, pt{10, 5}, true},
		{pt{5, -5}, pt{5, 5}, pt{5, 0}, pt{5, 5}, true},
		{pt{-5, -5}, pt{-1, 20}, pt{}, pt{}, false},
		{pt{-10, 0}, pt{0, -10}, pt{}, pt{}, false},
		{pt{-1e9, -1e9}, pt{1e9, 1e9}, pt{0, 0}, pt{10, 10}, true},
	}
	for _, c := range cases {
		a, b, ok := clipSegment(r, c.a, c.b)
		if ok != c.ok || (ok && (!near(a.x, c.wa.x, 1e-6) || !near(a.y, c.wa.y, 1e-6) || !near(b.x, c.wb.x, 1e-6) || !near(b.y, c.wb.y, 1e-6))) {
			t.Errorf("clip %v–%v = %v–%v %v, want %v–%v %v", c.a, c.b, a, b, ok, c.wa, c.wb, c.ok)
		}
	}
}

func area(p []pt) float64 {
	s := 0.0
	for i := range p {
		j := (i + 1) % len(p)
		s += p[i].x*p[j].y - p[j].x*p[i].y
	}
	return math.Abs(s) / 2
}

func TestClipPolygon(t *testing.T) {
	r := Rect{0, 0, 10, 10}
	for _, c := range []struct {
		poly []pt
		area float64
	}{
		{[]pt{{5, 5}, {15, 5}, {15, 15}, {5, 15}}, 25},
		{[]pt{{-5, -5}, {15, -5}, {15, 15}, {-5, 15}}, 100},
		{[]pt{{2, 2}, {4, 2}, {4, 4}}, 2},
		{[]pt{{20, 20}, {30, 20}, {30, 30}}, 0},
		{[]pt{{-10, 5}, {20, 5}, {20, 6}, {5, 6}, {5, 20}, {4, 20}, {4, 6}, {-10, 6}}, 10 + 4}, // a cross, not convex
	} {
		if got := area(clipPolygon(r, c.poly)); !near(got, c.area, 1e-9) {
			t.Errorf("clipped area of %v = %g, want %g", c.poly, got, c.area)
		}
	}
}

func TestEmptyChart(t *testing.T) {
	root, lay := render(t, &Chart{X: Axis{Log: true}})
	if lay.X.Min != 1 || lay.X.Max != 10 || lay.Y.Min != 0 || lay.Y.Max != 1 {
		t.Errorf("empty ranges %+v %+v", lay.X, lay.Y)
	}
	if root.SVG() == "" || len(lay.Notes) != 0 {
		t.Errorf("notes %q", lay.Notes)
	}
	// Height grows when the notes need room.
	c := &Chart{Width: MinWidth, Height: MinHeight}
	for range 12 {
		c.Notes = append(c.Notes, caution)
	}
	_, lay = render(t, c)
	if lay.Height <= MinHeight || lay.Plot.Bottom-lay.Plot.Top < minPlotHeight-1e-9 {
		t.Errorf("height %g, plot %+v", lay.Height, lay.Plot)
	}
}

func fmtSscan(a, b string, x, y *float64) (int, error) {
	var err error
	if *x, err = parseF(a); err != nil {
		return 0, err
	}
	if *y, err = parseF(b); err != nil {
		return 1, err
	}
	return 2, nil
}

// TestAppendNum compares the fast formatter with strconv.
func TestAppendNum(t *testing.T) {
	vals := []float64{0, 0.04, -0.04, 0.05, -0.05, 0.15, 1, -1, 12.34, -12.36, 99.95, 1e9, -1e9, 123456.78, 1e12, -3e15}
	for k := 0; k < 2000; k++ {
		vals = append(vals, math.Sin(float64(k))*math.Pow(10, float64(k%9)))
	}
	for _, v := range vals {
		r := math.Round(v*10) / 10
		want := strconv.FormatFloat(r, 'f', -1, 64)
		if r == 0 {
			want = "0"
		}
		if got := num(v); got != want {
			t.Errorf("num(%v) = %q, want %q", v, got, want)
		}
	}
}

// relLuminance is the relative luminance of an sRGB colour "#rrggbb"
// (WCAG 2.1, definition "relative luminance").
func relLuminance(t *testing.T, hex string) float64 {
	t.Helper()
	if len(hex) != 7 || hex[0] != '#' {
		t.Fatalf("colour %q", hex)
	}
	l := 0.0
	for i, w := range []float64{0.2126, 0.7152, 0.0722} {
		v, err := strconv.ParseUint(hex[1+2*i:3+2*i], 16, 8)
		if err != nil {
			t.Fatal(err)
		}
		c := float64(v) / 255
		if c <= 0.03928 {
			c /= 12.92
		} else {
			c = math.Pow((c+0.055)/1.055, 2.4)
		}
		l += w * c
	}
	return l
}

// TestPaletteContrast: every palette colour has a contrast ratio (WCAG 2.1
// definition (L1 + 0.05)/(L2 + 0.05)) of at least 4.5 against the white
// background (the level WCAG asks of text) and 3 against the fit-window
// shading (the level it asks of graphics).
func TestPaletteContrast(t *testing.T) {
	white := relLuminance(t, colBackground)
	window := relLuminance(t, colWindowFill)
	for c := Blue; c < numColors; c++ {
		l := relLuminance(t, c.Hex())
		if r := (white + 0.05) / (l + 0.05); r < 4.5 {
			t.Errorf("colour %d %s: contrast %.2f against white, want ≥ 4.5", c, c.Hex(), r)
		}
		if r := (window + 0.05) / (l + 0.05); r < 3 {
			t.Errorf("colour %d %s: contrast %.2f against the window shading, want ≥ 3", c, c.Hex(), r)
		}
	}
	if r := (white + 0.05) / (relLuminance(t, colText) + 0.05); r != 21 {
		t.Errorf("text contrast %g, want 21", r)
	}
}
