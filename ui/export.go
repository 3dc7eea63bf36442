package ui

import (
	"context"
	"slices"
	"strconv"
	"strings"

	"fieldfit/ui/plot"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// CSVTable is a table for the CSV export: a few lines that say what the
// file holds, a header row, then the rows. Cells are text; numbers are
// written with csvNum so that every digit survives.
type CSVTable struct {
	// Meta are label and value pairs written first, each as a record of
	// two fields whose first starts with "#" (project, test, units, the
	// caution), then an empty line.
	Meta [][2]string
	// Head names the columns, each with its unit.
	Head []string
	Rows [][]string
}

// csvNum writes v with the fewest digits that read back to the same
// float64; NaN and infinities, which CSV readers disagree on, are left
// empty.
func csvNum(v float64) string {
	if v != v || v > 1.7976931348623157e308 || v < -1.7976931348623157e308 {
		return ""
	}
	return strconv.FormatFloat(v, 'g', -1, 64)
}

// Bytes writes the table as CSV after RFC 4180: comma-separated, records
// ended by CRLF, a field in double quotes (its quotes doubled) when it
// holds a comma, a quote, a line break or leading or trailing spaces. The
// file starts with a UTF-8 byte order mark so that spreadsheet programs
// read the units (m², ³) right (common practice, no standard). A field
// that a spreadsheet would take for a formula (it starts with =, +, -, @,
// a tab or a carriage return and is not a plain number) gets a leading
// apostrophe, as the OWASP note on CSV injection advises (from memory).
func (t *CSVTable) Bytes() []byte {
	var b strings.Builder
	b.WriteString("\uFEFF")
	rec := func(fields []string) {
		for i, f := range fields {
			if i > 0 {
				b.WriteByte(',')
			}
			writeCSVField(&b, f)
		}
		b.WriteString("\r\n")
	}
	for _, m := range t.Meta {
		rec([]string{"# " + m[0], m[1]})
	}
	if len(t.Meta) > 0 {
		b.WriteString("\r\n")
	}
	rec(t.Head)
	for _, r := range t.Rows {
		rec(r)
	}
	return []byte(b.String())
}

func writeCSVField(b *strings.Builder, f string) {
	if f != "" && strings.ContainsRune("=+-@\t\r", rune(f[0])) {
		if _, err := strconv.ParseFloat(f, 64); err != nil {
			f = "'" + f
		}
	}
	if f == "" || !(strings.ContainsAny(f, ",\"\r\n") || f[0] == ' ' || f[len(f)-1] == ' ') {
		b.WriteString(f)
		return
	}
	b.WriteByte('"')
	b.WriteString(strings.ReplaceAll(f, `"`, `""`))
	b.WriteByte('"')
}

// exportMeta are the lines that open every exported table.
func exportMeta(rc *ReportContext, what string) [][2]string {
	return [][2]string{
		{"Fieldfit export", what},
		{"project", rc.P.Name},
		{"site", rc.P.Site},
		{"test", rc.T.Name},
		{"exported", rc.Now.UTC().Format("2006-01-02T15:04:05Z")},
		{"caution", Caution},
	}
}

// exportStem is the start of an exported file's name: the project's and
// the test's names in letters, digits and dashes.
func exportStem(p *project.Project, t *project.Test) string {
	stem := strings.TrimSuffix(fileName(p.Name), ".fieldfit.json")
	if ts := strings.TrimSuffix(fileName(t.Name), ".fieldfit.json"); strings.TrimSpace(t.Name) != "" {
		stem += "-" + ts
	}
	return stem
}

// ExportCSV offers the selected test's readings ("readings") or fitted
// curves ("curves") as a CSV file, made by the test kind's ReportKind.
func (a *App) ExportCSV(what string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	t := a.currentTest()
	if t == nil || a.opt.Download == nil {
		return
	}
	rc := &ReportContext{P: a.cur, T: t, D: DisplayFor(a.cur.Units), Now: a.opt.Now()}
	rk := reportKinds[t.Kind]
	f := rk.Readings
	if what == "curves" {
		f = rk.Curves
	}
	var tb *CSVTable
	if f != nil {
		tb = f(a, rc)
	}
	if tb == nil {
		a.notice = "Nothing to export yet: the test needs usable readings, and a current fit for the curves."
		return
	}
	name := exportStem(a.cur, t) + "-" + what + ".csv"
	data := tb.Bytes()
	dl := a.opt.Download
	go dl(name, "text/csv;charset=utf-8", data)
	a.notice = "Exported " + name + "."
}

// addPlotExports makes the plots of sec (each a figure holding an
// svg.ff-plot with an id) still pictures with ids of the report's own
// ("report-" + id, no pointer handlers), and puts SVG and PNG buttons
// under each one; the buttons are not printed.
func (a *App) addPlotExports(sec *v.Node, rc *ReportContext) {
	for _, n := range sec.FindAll(func(n *v.Node) bool { return n.Tag == "svg" }) {
		n.Walk(func(m *v.Node) bool { m.On = nil; return true })
		delete(n.Attrs, "data-drag")
		if id := n.Attrs["id"]; id != "" && !strings.HasPrefix(id, "report-") {
			n.Attrs["id"] = "report-" + id
		}
	}
	if a.opt.Download == nil {
		return
	}
	figs := sec.FindAll(func(n *v.Node) bool { return n.Tag == "figure" })
	stem := exportStem(rc.P, rc.T)
	for _, fig := range figs {
		svg := fig.Find(func(n *v.Node) bool {
			return n.Tag == "svg" && n.Attrs["id"] != "" && strings.Contains(n.Attrs["class"], "ff-plot")
		})
		if svg == nil {
			continue
		}
		id := svg.Attrs["id"]
		name := stem + "-" + strings.TrimPrefix(strings.TrimPrefix(id, "report-"), "plot-")
		row := v.El("div", v.A("class", "ff-row ff-noprint"),
			button(id+"-svg", "Save plot as SVG", "ff-btn ff-small", func() { a.ExportPlot(svg, name, "svg") }))
		if a.opt.RasterPNG != nil {
			row.Add(button(id+"-png", "Save plot as PNG", "ff-btn ff-small", func() { a.ExportPlot(svg, name, "png") }))
		}
		fig.Add(row)
	}
}

// pngScale is how many PNG pixels a plot's viewBox unit becomes: 2 gives
// a plot of 800 units 1600 pixels across, sharp in a printed document.
const pngScale = 2

// ExportPlot offers a rendered plot (an svg node of the screen) as an SVG
// file, or as a PNG drawn by the browser; name is the file name without
// its extension.
func (a *App) ExportPlot(svg *v.Node, name, format string) {
	text, w, h := svgDocument(svg)
	a.mu.Lock()
	defer a.mu.Unlock()
	dl, raster := a.opt.Download, a.opt.RasterPNG
	if dl == nil {
		return
	}
	if format == "svg" {
		go dl(name+".svg", "image/svg+xml", []byte(text))
		a.notice = "Exported " + name + ".svg."
		return
	}
	if raster == nil || !(w > 0 && h > 0) {
		return
	}
	a.goBusy("png", "Drawing the PNG…", func(ctx context.Context) {
		png, err := raster(ctx, []byte(text), w*pngScale, h*pngScale)
		a.mu.Lock()
		defer a.mu.Unlock()
		if err != nil {
			a.notice = "The PNG could not be made: " + err.Error() + ". The SVG export still works."
			return
		}
		go dl(name+".png", "image/png", png)
		a.notice = "Exported " + name + ".png."
	})
}

// svgDocument returns the svg element n as a stand-alone SVG document with
// its width and height (from the viewBox, in CSS pixels). Attributes of
// the page (id, class, data-*) are left out; text and attribute values are
// escaped by plot.Node.SVG.
func svgDocument(n *v.Node) (doc string, w, h float64) {
	f := strings.Fields(n.Attrs["viewBox"])
	if len(f) == 4 {
		w, _ = strconv.ParseFloat(f[2], 64)
		h, _ = strconv.ParseFloat(f[3], 64)
	}
	root := toPlotNode(n)
	attrs := []plot.Attr{{Name: "xmlns", Value: v.SVGNS}}
	for _, a := range root.Attrs {
		if len(f) != 4 || a.Name != "width" && a.Name != "height" {
			attrs = append(attrs, a)
		}
	}
	if len(f) == 4 {
		attrs = append(attrs, plot.Attr{Name: "width", Value: f[2]}, plot.Attr{Name: "height", Value: f[3]})
	}
	root.Attrs = attrs
	return `<?xml version="1.0" encoding="UTF-8"?>` + "\n" + root.SVG(), w, h
}

// toPlotNode turns a view tree (an svg element and its descendants) back
// into a plot.Node tree for serialising: attributes in name order, the
// page's own attributes (id, class, data-*) and xmlns dropped, text
// children joined into the element's text.
func toPlotNode(n *v.Node) *plot.Node {
	out := &plot.Node{Tag: n.Tag, Text: n.Text}
	names := make([]string, 0, len(n.Attrs))
	for k := range n.Attrs {
		if k != "id" && k != "class" && k != "xmlns" && !strings.HasPrefix(k, "data-") {
			names = append(names, k)
		}
	}
	slices.Sort(names)
	for _, k := range names {
		out.Attrs = append(out.Attrs, plot.Attr{Name: k, Value: n.Attrs[k]})
	}
	for _, c := range n.Children {
		if c.Tag == "" {
			out.Text += c.Text
		} else {
			out.Children = append(out.Children, toPlotNode(c))
		}
	}
	return out
}
