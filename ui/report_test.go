package ui

import (
	"bytes"
	"context"
	"encoding/csv"
	"encoding/xml"
	"io"
	"math"
	"strconv"
	"strings"
	"testing"
	"time"

	"fieldfit/models"
	"fieldfit/models/units"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// reportPayload is user text that would be markup if it were put into
// the page as HTML.
const reportPayload = `<img src=x onerror="window.__pwned=1"><script>alert(1)</script>`

// offered is a file the app offered.
type offered struct {
	name, mime string
	data       []byte
}

// reportHarness is the harness with the demo project open on the Report
// tab, printing and PNG drawing faked, and every download kept.
func reportHarness(t *testing.T) (*harness, chan offered, *[]float64) {
	t.Helper()
	h := newHarness(t, nil)
	files := make(chan offered, 10)
	var png []float64
	h.app.mu.Lock()
	h.app.opt.Download = func(name, mime string, data []byte) { files <- offered{name, mime, data} }
	h.app.opt.Print = func() {}
	h.app.opt.RasterPNG = func(_ context.Context, svg []byte, w, h float64) ([]byte, error) {
		png = append(png, w, h)
		return []byte("\x89PNG fake of " + strconv.Itoa(len(svg)) + " bytes"), nil
	}
	h.app.mu.Unlock()
	h.click("demo-project")
	h.click("tab-report")
	return h, files, &png
}

func next(t *testing.T, files chan offered) offered {
	t.Helper()
	select {
	case f := <-files:
		return f
	case <-time.After(5 * time.Second):
		t.Fatal("no file was offered")
	}
	return offered{}
}

// readCSV reads an exported table back with encoding/csv (the standard
// library's RFC 4180 reader, the reference here): the metadata records
// and the table after the header.
func readCSV(t *testing.T, data []byte) (meta map[string]string, head []string, rows [][]string) {
	t.Helper()
	if !bytes.HasPrefix(data, []byte("\uFEFF")) {
		t.Error("the CSV does not start with the UTF-8 byte order mark")
	}
	r := csv.NewReader(bytes.NewReader(bytes.TrimPrefix(data, []byte("\uFEFF"))))
	r.FieldsPerRecord = -1
	recs, err := r.ReadAll()
	if err != nil {
		t.Fatalf("encoding/csv cannot read the export: %v\n%s", err, data)
	}
	meta = map[string]string{}
	for i, rec := range recs {
		if strings.HasPrefix(rec[0], "# ") {
			meta[strings.TrimPrefix(rec[0], "# ")] = rec[1]
			continue
		}
		return meta, rec, recs[i+1:]
	}
	t.Fatal("the CSV has no header")
	return
}

func TestReportSections(t *testing.T) {
	h, _, _ := reportHarness(t)
	rep := h.byID("report")
	if got := rep.Attrs["data-paper"]; got != PaperA4 {
		t.Errorf("paper of an SI project = %q, want a4", got)
	}
	text := rep.TextContent()
	if n := strings.Count(text, Caution); n != 2 {
		t.Errorf("the caution appears %d times in the report, want 2 (top and end)", n)
	}
	// The sections in their order.
	var ids []string
	rep.Walk(func(n *v.Node) bool {
		if id := n.Attrs["id"]; n.Tag == "section" || strings.HasPrefix(id, "report-caution") || id == "report-title" {
			ids = append(ids, id)
		}
		return true
	})
	if got, want := strings.Join(ids, " "), "report-title report-caution-top report-site report-test report-data "+
		"report-plots report-fits report-validity report-hints report-notes report-caution"; got != want {
		t.Errorf("sections\n%s\nwant\n%s", got, want)
	}
	for _, want := range []string{"Larkspur Dairy", "PW-1", "OW-1", "9.5 L/s", "25 rows in the readings table",
		"Usable for the fit25 readings", "1.00 – 360 min", "Theis", "An invented example"} {
		if !strings.Contains(text, want) {
			t.Errorf("the report lacks %q", want)
		}
	}
	// The plots are still pictures with ids of their own, each with its
	// export buttons.
	for _, id := range []string{"report-plot-loglog", "report-plot-semilog", "report-plot-residuals"} {
		n := h.byID(id)
		if n.Tag != "svg" || len(n.On) != 0 || n.Attrs["data-drag"] != "" {
			t.Errorf("#%s: tag %s, handlers %d, data-drag %q", id, n.Tag, len(n.On), n.Attrs["data-drag"])
		}
		h.byID(id + "-svg")
		h.byID(id + "-png")
	}
	if h.render().ByID("plot-loglog") != nil {
		t.Error("the report reuses the Fit tab's plot id")
	}
	// The fitted parameters: the stored result, in m²/d.
	r := h.app.Current().Tests[0].Result
	T := formatSig(r.T.Value*units.Day, 3)
	fits := h.text("report-fits-table")
	for _, want := range []string{"T" + T + " m²/d", "S" + formatSig(r.S.Value, 3), "K = T/b", "0.00" /* RMSE */} {
		if !strings.Contains(fits, want) {
			t.Errorf("fits table %q lacks %q", fits, want)
		}
	}
	// The demo's T is 3.2e-3 m²/s (ui/demo.go, our own invented value):
	// its interval must hold it.
	if !(r.T.Lower < demoT && demoT < r.T.Upper) {
		t.Errorf("T interval %g – %g misses the demo's %g", r.T.Lower, r.T.Upper, demoT)
	}
	if !strings.Contains(h.text("report-validity"), "Cooper–Jacob straight line valid from") {
		t.Error("no Cooper–Jacob validity in the report")
	}
}

func TestReportPaper(t *testing.T) {
	h, _, _ := reportHarness(t)
	h.input("report-paper", PaperLetter)
	if got := h.byID("report").Attrs["data-paper"]; got != PaperLetter {
		t.Errorf("after choosing Letter, data-paper = %q", got)
	}
	h.input("report-paper", "tabloid") // not offered: ignored
	if got := h.byID("report").Attrs["data-paper"]; got != PaperLetter {
		t.Errorf("an unknown paper changed data-paper to %q", got)
	}
	// A US customary project prints on Letter until told otherwise.
	h2, _, _ := reportHarness(t)
	h2.click("tab-site")
	h2.input("project-units", string(project.USCustomary))
	h2.click("tab-report")
	if got := h2.byID("report").Attrs["data-paper"]; got != PaperLetter {
		t.Errorf("paper of a US customary project = %q, want letter", got)
	}
	if !strings.Contains(h2.text("report-fits-table"), "ft²/d") {
		t.Error("the fits of a US customary project are not in ft²/d")
	}
}

func TestReportUserTextStaysText(t *testing.T) {
	h, files, _ := reportHarness(t)
	h.click("tab-site")
	h.input("project-name", reportPayload)
	h.input("project-notes", "line one\n"+reportPayload)
	h.click("tab-report")
	rep := h.byID("report")
	if img := rep.Find(func(n *v.Node) bool { return n.Tag == "img" || n.Tag == "script" }); img != nil {
		t.Fatalf("user text became an element: %v", img)
	}
	if !strings.Contains(h.text("report-ident"), reportPayload) || !strings.Contains(h.text("report-notes"), reportPayload) {
		t.Error("the payload is not shown as the text it is")
	}
	h.click("export-readings")
	f := next(t, files)
	meta, _, _ := readCSV(t, f.data)
	if meta["project"] != reportPayload {
		t.Errorf("project in the CSV = %q, want %q", meta["project"], reportPayload)
	}
	if strings.ContainsAny(f.name, "<>\"= ") {
		t.Errorf("file name %q keeps characters of the payload", f.name)
	}
}

func TestExportReadingsCSV(t *testing.T) {
	h, files, _ := reportHarness(t)
	h.click("export-readings")
	f := next(t, files)
	if f.mime != "text/csv;charset=utf-8" || !strings.HasSuffix(f.name, "-readings.csv") {
		t.Errorf("file %q of type %q", f.name, f.mime)
	}
	meta, head, rows := readCSV(t, f.data)
	if meta["caution"] != Caution || meta["test"] != "Constant rate, 6 h" {
		t.Errorf("metadata %v", meta)
	}
	if len(head) != 10 || head[4] != "depth to water (m)" {
		t.Fatalf("header %q", head)
	}
	if len(rows) != len(demoMinutes) {
		t.Fatalf("%d rows, want %d", len(rows), len(demoMinutes))
	}
	r := h.app.Current().Tests[0].Result
	theis := models.Theis{Q: demoQ, R: demoR}
	for i, row := range rows {
		num := func(j int) float64 {
			x, err := strconv.ParseFloat(row[j], 64)
			if err != nil {
				t.Fatalf("row %d column %q: %q", i+1, head[j], row[j])
			}
			return x
		}
		if got, want := num(3), demoMinutes[i]*60; got != want {
			t.Errorf("row %d elapsed %g s, want %g", i+1, got, want)
		}
		depth, dd := num(4), num(5)
		if math.Abs(depth-demoStatic-dd) > 1e-12 {
			t.Errorf("row %d: drawdown %g is not depth %g − static %g", i+1, dd, depth, demoStatic)
		}
		var s [1]float64
		theis.Eval(s[:], []float64{num(3)}, []float64{r.T.Value, r.S.Value})
		if fit := num(7); math.Abs(fit-s[0]) > 1e-12*s[0] {
			t.Errorf("row %d: fitted %g, Theis at the stored T and S %g", i+1, fit, s[0])
		}
		if res := num(8); math.Abs(res-(num(7)-dd)) > 1e-12 {
			t.Errorf("row %d: residual %g is not fit − observed", i+1, res)
		}
		if row[6] != "yes" {
			t.Errorf("row %d in window %q", i+1, row[6])
		}
	}
}

func TestExportCurvesCSV(t *testing.T) {
	h, files, _ := reportHarness(t)
	h.click("export-curves")
	f := next(t, files)
	meta, head, rows := readCSV(t, f.data)
	if meta["model"] != "Theis" || len(head) != 5 || len(rows) != curvePoints {
		t.Fatalf("model %q, header %q, %d rows", meta["model"], head, len(rows))
	}
	r := h.app.Current().Tests[0].Result
	theis := models.Theis{Q: demoQ, R: demoR}
	prev := 0.0
	for i, row := range rows {
		var x [5]float64
		for j := range x {
			var err error
			if x[j], err = strconv.ParseFloat(row[j], 64); err != nil {
				t.Fatalf("row %d: %q", i, row)
			}
		}
		var s [1]float64
		theis.Eval(s[:], x[:1], []float64{r.T.Value, r.S.Value})
		if math.Abs(x[2]-s[0]) > 1e-12*s[0] || !(x[3] <= x[2] && x[2] <= x[4]) || x[0] <= prev ||
			math.Abs(x[1]*60-x[0]) > 1e-9*x[0] {
			t.Errorf("row %d: %v (Theis %g)", i, x, s[0])
		}
		prev = x[0]
	}
	if first, _ := strconv.ParseFloat(rows[0][1], 64); math.Abs(first-1) > 1e-12 {
		t.Errorf("the curve starts at %g min, want the first reading's 1 min", first)
	}
}

func TestExportPlotSVGAndPNG(t *testing.T) {
	h, files, png := reportHarness(t)
	h.click("report-plot-loglog-svg")
	f := next(t, files)
	if f.mime != "image/svg+xml" || !strings.HasSuffix(f.name, "-loglog.svg") {
		t.Errorf("file %q of type %q", f.name, f.mime)
	}
	// encoding/xml (the reference XML reader) reads it; the root has a
	// size of its own and the chart's texts.
	type svgRoot struct {
		XMLName xml.Name
		Width   string `xml:"width,attr"`
		Height  string `xml:"height,attr"`
		ViewBox string `xml:"viewBox,attr"`
		Title   string `xml:"title"`
	}
	var root svgRoot
	if err := xml.Unmarshal(f.data, &root); err != nil {
		t.Fatalf("the SVG is not XML: %v", err)
	}
	if root.XMLName.Space != v.SVGNS || root.XMLName.Local != "svg" || root.Title != "Drawdown and derivative (log–log)" {
		t.Errorf("root %+v", root)
	}
	if w, err := strconv.ParseFloat(root.Width, 64); err != nil || !strings.HasSuffix(root.ViewBox, " "+root.Width+" "+root.Height) || w <= 0 {
		t.Errorf("width %q height %q viewBox %q", root.Width, root.Height, root.ViewBox)
	}
	if bytes.Contains(f.data, []byte(`class="ff-plot"`)) || bytes.Contains(f.data, []byte(`id=`)) {
		t.Error("the SVG file keeps the page's id or class")
	}
	if !bytes.Contains(f.data, []byte(Caution[:40])) {
		t.Error("the exported plot lacks the caution note")
	}

	h.click("report-plot-semilog-png")
	f = next(t, files)
	if f.mime != "image/png" || !strings.HasSuffix(f.name, "-semilog.png") || !bytes.HasPrefix(f.data, []byte("\x89PNG")) {
		t.Errorf("file %q of type %q", f.name, f.mime)
	}
	semi := h.byID("report-plot-semilog")
	vb := strings.Fields(semi.Attrs["viewBox"])
	w, _ := strconv.ParseFloat(vb[2], 64)
	hh, _ := strconv.ParseFloat(vb[3], 64)
	if len(*png) != 2 || (*png)[0] != w*pngScale || (*png)[1] != hh*pngScale {
		t.Errorf("PNG drawn at %v, want %g × %g", *png, w*pngScale, hh*pngScale)
	}
}

func TestSVGDocumentEscapes(t *testing.T) {
	const nasty = `</text><script>alert("x")</script> & 'q' ` + "\x01"
	n := v.El("svg", v.A("xmlns", v.SVGNS, "viewBox", "0 0 300 200", "width", "100%", "id", "p", "data-drag", "window"),
		v.El("g", v.A("aria-label", nasty), v.TextEl("text", v.A("x", "1"), nasty)),
		v.El("text", nil, v.T("a"), v.T("b")))
	doc, w, h := svgDocument(n)
	if w != 300 || h != 200 {
		t.Errorf("size %g × %g", w, h)
	}
	// encoding/xml must give back the text, with the control character
	// (not allowed in XML 1.0) replaced.
	d := xml.NewDecoder(strings.NewReader(doc))
	var texts, attrs []string
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("not XML: %v\n%s", err, doc)
		}
		switch x := tok.(type) {
		case xml.StartElement:
			for _, a := range x.Attr {
				attrs = append(attrs, a.Name.Local+"="+a.Value)
			}
		case xml.CharData:
			if s := strings.TrimSpace(string(x)); s != "" {
				texts = append(texts, s)
			}
		}
	}
	want := strings.TrimSpace(strings.ReplaceAll(nasty, "\x01", "\uFFFD"))
	if len(texts) != 2 || texts[0] != want || texts[1] != "ab" {
		t.Errorf("texts %q, want %q and \"ab\"", texts, want)
	}
	joined := strings.Join(attrs, " ")
	if !strings.Contains(joined, "aria-label="+strings.ReplaceAll(nasty, "\x01", "\uFFFD")) ||
		!strings.Contains(joined, "width=300") || !strings.Contains(joined, "height=200") ||
		strings.Contains(joined, "id=") || strings.Contains(joined, "data-drag") {
		t.Errorf("attributes %q", joined)
	}
}

func TestCSVFields(t *testing.T) {
	// Each field written and read back by encoding/csv (RFC 4180).
	tests := []struct{ in, file, back string }{
		{"plain", "plain", "plain"},
		{"", "", ""},
		{"a,b", `"a,b"`, "a,b"},
		{`say "hi"`, `"say ""hi"""`, `say "hi"`},
		{"two\nlines", "\"two\nlines\"", "two\nlines"},
		{" padded ", `" padded "`, " padded "},
		{"-0.25", "-0.25", "-0.25"},
		{"+3e-4", "+3e-4", "+3e-4"},
		{"=HYPERLINK(\"x\")", `"'=HYPERLINK(""x"")"`, `'=HYPERLINK("x")`}, // OWASP CSV injection note (from memory)
		{"@SUM(A1)", "'@SUM(A1)", "'@SUM(A1)"},
		{"-2+3", "'-2+3", "'-2+3"},
		{"m²/d µS", "m²/d µS", "m²/d µS"},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			var b strings.Builder
			writeCSVField(&b, tt.in)
			if b.String() != tt.file {
				t.Errorf("written %q, want %q", b.String(), tt.file)
			}
			tb := &CSVTable{Head: []string{"h", "x"}, Rows: [][]string{{tt.in, "end"}}}
			_, _, rows := readCSV(t, tb.Bytes())
			if len(rows) != 1 || rows[0][0] != tt.back || rows[0][1] != "end" {
				t.Errorf("read back %q, want %q", rows, tt.back)
			}
		})
	}
	if got := string((&CSVTable{Head: []string{"a"}, Rows: [][]string{{"1"}}}).Bytes()); got != "\uFEFFa\r\n1\r\n" {
		t.Errorf("records %q, want CRLF line ends", got)
	}
	for _, x := range []float64{0.1, 1.0 / 3, 6.02214076e23, -2.5e-300} {
		if y, _ := strconv.ParseFloat(csvNum(x), 64); y != x {
			t.Errorf("csvNum(%v) = %q reads back as %v", x, csvNum(x), y)
		}
	}
	if csvNum(math.NaN()) != "" || csvNum(math.Inf(1)) != "" {
		t.Error("NaN or Inf written as a number")
	}
}

func TestDeltaAICc(t *testing.T) {
	fits := []project.ModelFit{{AICc: -40, N: 25}, {AICc: -37.5, N: 25}, {N: 25}, {AICc: -60, N: 12}}
	// By the number of readings: the fit of 12 readings has no peer.
	d := deltaAICc(fits, nil)
	want := []float64{0, 2.5, math.NaN(), math.NaN()}
	for i := range want {
		if !(d[i] == want[i] || math.IsNaN(d[i]) && math.IsNaN(want[i])) {
			t.Errorf("by N: ΔAICc %v, want %v", d, want)
		}
	}
	// By a group the kind names: the first and the last compare.
	fits[3].Inputs, fits[0].Inputs = "a", "a"
	d = deltaAICc(fits, func(f *project.ModelFit) string { return f.Inputs })
	want = []float64{20, math.NaN(), math.NaN(), 0}
	for i := range want {
		if !(d[i] == want[i] || math.IsNaN(d[i]) && math.IsNaN(want[i])) {
			t.Errorf("by group: ΔAICc %v, want %v", d, want)
		}
	}
	if d := deltaAICc(fits[2:], nil); d != nil {
		t.Errorf("ΔAICc %v with nothing to compare", d)
	}
}

// TestReportKindExtension checks that a kind's registered sections land
// where the package comment says, with the generic parts around them.
func TestReportKindExtension(t *testing.T) {
	old, had := reportKinds[project.DecayTest]
	defer func() {
		if had {
			reportKinds[project.DecayTest] = old
		} else {
			delete(reportKinds, project.DecayTest)
		}
	}()
	sec := func(id string) func(*App, *ReportContext) []*v.Node {
		return func(*App, *ReportContext) []*v.Node { return []*v.Node{reportSection(id, id)} }
	}
	reportKinds[project.DecayTest] = ReportKind{
		Label: "Tracer decay", Test: sec("k-test"), After: sec("k-after"),
		Data: func(*App, *ReportContext) [][2]string { return [][2]string{{"Tracer readings", "41"}} },
		Plots: func(*App, *ReportContext) []*v.Node {
			return []*v.Node{v.El("figure", nil, v.El("svg", v.A("id", "plot-decay", "class", "ff-plot", "viewBox", "0 0 10 10")))}
		},
		Fits: func(*App, *ReportContext) []project.ModelFit {
			return []project.ModelFit{{Model: "decay", N: 41, RMSE: 0.01, Params: []project.NamedEstimate{
				{Name: "k", Unit: "1/s", Value: 2e-3, Lower: 1.5e-3, Upper: 2.5e-3}}}}
		},
	}
	h, _, _ := reportHarness(t)
	h.app.mu.Lock()
	h.app.cur.Tests[0].Kind = project.DecayTest
	h.app.mu.Unlock()
	text := h.byID("report").TextContent()
	last := -1
	for _, s := range []string{"Tracer decay", "Site and wells", "k-test", "Tracer readings41", "report-plot-decay", "decayk0.00200 1/s", "k-after", Caution} {
		i := strings.Index(text, s)
		if s == Caution {
			i = strings.LastIndex(text, s)
		}
		if s == "report-plot-decay" {
			h.byID("report-plot-decay-svg")
			continue
		}
		if i < last {
			t.Errorf("%q missing or out of order in %q", s, text)
		}
		last = i
	}
	if h.render().ByID("export-readings") != nil {
		t.Error("a readings export is offered for a kind that has none")
	}
}

// TestReportLoggerRecord: a test fitted from a logger record (the
// invented fixtures of testdata/fielddata) says in its data summary which
// records, how many readings and which conditioning, and its readings CSV
// holds the conditioned readings the fit used.
func TestReportLoggerRecord(t *testing.T) {
	h := newHarness(t, nil)
	files := make(chan offered, 4)
	h.app.mu.Lock()
	h.app.opt.Download = func(name, mime string, data []byte) { files <- offered{name, mime, data} }
	h.app.mu.Unlock()
	loggerTest(h)
	h.importFixture("logger-file", "pressure-kpa.csv")
	h.importFixture("baro-file", "baro-mbar.csv")
	h.input("cond-start", "2024-05-14 08:00")
	h.input("cond-stop", "2024-05-14 11:00:00")
	h.input("cond-trend", "true")
	h.click("tab-fit")
	h.click("fit")
	h.click("tab-report")
	data := h.text("report-data-table")
	for _, want := range []string{"Fitted fromthe logger record", "“pressure-kpa.csv”: 301 readings, 0 rows skipped",
		"“baro-mbar.csv”: 65 readings", "barometric record subtracted", "trend before pumping removed", "thinned in log time",
		"Before pumping 60 readings, pumping 181 readings, recovery 60 readings"} {
		if !strings.Contains(data, want) {
			t.Errorf("data summary %q lacks %q", data, want)
		}
	}
	if !strings.Contains(h.text("report-test-table"), "2024-05-14 08:00 to 2024-05-14 11:00:00") {
		t.Errorf("the pump's start and stop are missing: %q", h.text("report-test-table"))
	}
	h.click("export-readings")
	_, head, rows := readCSV(t, next(t, files).data)
	req, missing := fitRequest(h.app.Current(), &h.app.Current().Tests[0], nil)
	if len(missing) > 0 || len(rows) != len(req.Time) || len(req.Time) == 0 {
		t.Fatalf("%d CSV rows, %d fitted readings (%v)", len(rows), len(req.Time), missing)
	}
	for i, row := range rows {
		if row[3] != csvNum(req.Time[i]) || row[5] != csvNum(req.Drawdown[i]) || row[7] == "" || row[1] != "" {
			t.Errorf("row %d %q (%q), want t %v s, s %v m", i, row, head, req.Time[i], req.Drawdown[i])
			break
		}
	}
}

// TestReportEmpty: a project without a test, then a test without wells
// or readings: the report says what is missing instead of failing, and
// the exports offer nothing.
func TestReportEmpty(t *testing.T) {
	h := newHarness(t, nil)
	files := make(chan offered, 4)
	h.app.mu.Lock()
	h.app.opt.Download = func(name, mime string, data []byte) { files <- offered{name, mime, data} }
	h.app.mu.Unlock()
	h.click("new-project")
	h.click("tab-report")
	if h.render().ByID("report") != nil || !strings.Contains(h.text("panel-report"), "Add a test first") {
		t.Errorf("report of a project without tests: %s", h.render().ByID("panel-report"))
	}
	h.click("add-test")
	h.click("tab-report")
	text := h.text("report")
	for _, want := range []string{"Site and wells", "Pumping rate Q—", "No fit yet.", "Usable for the fit0 readings",
		"Missing for a fit", "Enter the static water level", Caution} {
		if !strings.Contains(text, want) {
			t.Errorf("report %q lacks %q", text, want)
		}
	}
	if h.render().ByID("report-plots") != nil {
		t.Error("a plots section without readings")
	}
	for _, id := range []string{"export-readings", "export-curves"} {
		h.click(id)
		if got := h.text("notice"); !strings.HasPrefix(got, "Nothing to export yet") {
			t.Errorf("#%s: notice %q", id, got)
		}
	}
	select {
	case f := <-files:
		t.Errorf("%s offered with nothing in it", f.name)
	default:
	}
}

// TestReportLeakyDemo: the example's second test (leaky, with recovery,
// read in two wells, fitted with every pumping model) shows its stop, its
// second well and the comparison of the models with ΔAICc.
func TestReportLeakyDemo(t *testing.T) {
	h, _, _ := reportHarness(t)
	h.input("test-select", "1")
	h.click("tab-report")
	cur := h.app.Current().Tests[1]
	if cur.Pump == nil || len(cur.Pump.Wells) == 0 || len(cur.Fits) < 2 {
		t.Skipf("the example's second test is not the leaky two-well test any more: %+v", cur.Pump)
	}
	test := h.text("report-test-table")
	for _, want := range []string{"Pump stopped" + formatSig(cur.Pump.Stop/units.Minute, 3) + " min", "Also read in",
		"OW-3 (orchard): " + countWord(len(cur.Pump.Wells[0].Readings), "row")} {
		if !strings.Contains(test, want) {
			t.Errorf("test and schedule %q lacks %q", test, want)
		}
	}
	if !strings.Contains(h.text("report-wells"), "OW-3 (orchard)observation, readings") {
		t.Errorf("the second well is not marked as read: %q", h.text("report-wells"))
	}
	fits := h.byID("report-fits-table")
	// One ΔAICc of 0.0 (the best) and one per other model fitted to the
	// same readings.
	var zero, models int
	for _, tr := range fits.FindAll(func(n *v.Node) bool { return n.Tag == "tr" }) {
		if len(tr.Children) == 8 && tr.Children[0].TextContent() != "" && tr.Children[0].TextContent() != "Model" {
			models++
			if tr.Children[7].TextContent() == "0.0" {
				zero++
			}
		}
	}
	if models != len(cur.Fits) || zero != 1 {
		t.Errorf("%d model rows (want %d), %d with ΔAICc 0.0 (want 1): %q", models, len(cur.Fits), zero, fits.TextContent())
	}
	if !strings.Contains(fits.TextContent(), "Hantush") {
		t.Errorf("no Hantush–Jacob row: %q", fits.TextContent())
	}
}
