//go:build !js

package ui

import (
	"bytes"
	"context"
	"encoding/xml"
	"fmt"
	"image/png"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/browser"
	"github.com/chromedp/chromedp"

	"fieldfit/web/webtest"
)

// pdfToText is Debian's poppler-utils, which .ci/test installs.
const pdfToText = "/usr/bin/pdftotext"

// TestBrowserReport opens the example project's report in the real page,
// prints it to PDF through the browser's own print path (page.PrintToPDF
// with the page's CSS page size) on A4 and on Letter, reads the PDFs'
// text and page size back with poppler's pdftotext, and saves the
// readings, the fitted curve and a plot as CSV, SVG and PNG through real
// downloads.
func TestBrowserReport(t *testing.T) {
	if testing.Short() {
		t.Skip("browser test skipped with -short")
	}
	webtest.RequireChromium(t)
	if _, err := os.Stat(pdfToText); err != nil {
		if os.Getenv("CI") != "" {
			t.Fatalf("%s is missing and CI is set: install Debian's poppler-utils", pdfToText)
		}
		t.Skipf("%s is missing: install Debian's poppler-utils", pdfToText)
	}
	srv := webtest.Serve(t, webtest.App(t))
	p := webtest.Open(t)
	u := user{t, p}
	dir := t.TempDir()

	// Downloads go to dir, named by their id; the suggested names are
	// kept from the events.
	begun := chromedp.Events(p.Ctx, browser.DownloadWillBegin)
	progress := chromedp.Events(p.Ctx, browser.DownloadProgress)
	names := make(chan [2]string, 20)
	done := make(chan string, 20)
	go func() {
		for ev, err := range begun {
			if err != nil {
				return
			}
			names <- [2]string{ev.GUID, ev.SuggestedFilename}
		}
	}()
	go func() {
		for ev, err := range progress {
			if err != nil {
				return
			}
			if ev.State == browser.DownloadProgressStateCompleted {
				done <- ev.GUID
			}
		}
	}()
	yes := true
	u.run(chromedp.Func(func(ctx context.Context, _ *chromedp.Target) error {
		_, err := chromedp.Call(ctx, browser.SetDownloadBehavior, browser.SetDownloadBehaviorParams{
			Behavior: browser.SetDownloadBehaviorBehaviorAllowAndName, DownloadPath: dir, EventsEnabled: &yes})
		return err
	}))
	// fetch waits for the next download and returns its name and bytes.
	fetch := func(what string) (string, []byte) {
		t.Helper()
		var guid, name string
		select {
		case n := <-names:
			guid, name = n[0], n[1]
		case <-time.After(20 * time.Second):
			t.Fatalf("%s: no download began", what)
		}
		for {
			select {
			case g := <-done:
				if g != guid {
					continue
				}
				data, err := os.ReadFile(filepath.Join(dir, guid))
				if err != nil {
					t.Fatalf("%s: %v", what, err)
				}
				return name, data
			case <-time.After(20 * time.Second):
				t.Fatalf("%s: the download of %s did not complete", what, name)
			}
		}
	}

	p.Navigate(srv.URL + "/")
	p.WaitRunning()
	u.click("demo-project")
	u.waitFor("the example fitted", `(document.getElementById("fit-status")||{}).textContent.startsWith("Fitted")`)
	u.click("tab-report")
	u.waitFor("the report's plots", `!!document.getElementById("report-plot-loglog")`)
	shownT := u.text("report-fits-table")
	p.Shot("report-screen")

	// printPDF prints the page as the browser's print dialog would, and
	// returns the PDF's text and its first page's size in points.
	printPDF := func(name string) (string, string) {
		t.Helper()
		ctx, cancel := context.WithTimeout(p.Ctx, 60*time.Second)
		defer cancel()
		pdf, err := chromedp.Run(ctx, chromedp.PrintToPDF(chromedp.PDFPreferCSSPageSize(), chromedp.PDFPrintBackground()))
		if err != nil {
			t.Fatalf("PrintToPDF: %v", err)
		}
		file := filepath.Join(webtest.ShotsDir(), "report-"+name+".pdf")
		if err := os.WriteFile(file, pdf, 0o644); err != nil {
			file = filepath.Join(dir, name+".pdf")
			os.WriteFile(file, pdf, 0o644)
		}
		text, err := exec.Command(pdfToText, "-layout", file, "-").Output()
		if err != nil {
			t.Fatalf("pdftotext %s: %v", file, err)
		}
		info, _ := exec.Command("/usr/bin/pdfinfo", file).Output()
		size := regexp.MustCompile(`Page size:\s+([0-9.]+ x [0-9.]+)`).FindSubmatch(info)
		if size == nil {
			return string(text), "(no pdfinfo)"
		}
		return string(text), string(size[1])
	}
	// squash joins the PDF's text into single-spaced words, as it wraps
	// and aligns lines at will.
	squash := func(s string) string { return strings.Join(strings.Fields(s), " ") }

	text, size := printPDF("a4")
	flat := squash(text)
	for _, want := range []string{
		"Field test report · Pumping test", "Constant rate, 6 h", "Example: Larkspur Dairy well field",
		"Site and wells", "PW-1", "OW-1", "Test and schedule", "9.5 L/s", "Data summary", "25 rows in the readings table",
		"Plots", "time since pumping started (min)", "Fitted parameters", "Fit and validity", "Cooper–Jacob straight line valid",
		"Notes", "An invented example", "Preliminary field interpretation only.", "licensed hydrogeologist",
	} {
		if !strings.Contains(flat, want) {
			t.Errorf("the A4 PDF lacks %q", want)
		}
	}
	// The T of the page's table is in the PDF, digit for digit.
	if m := regexp.MustCompile(`T([0-9.]+ m²/d)`).FindStringSubmatch(shownT); m == nil || !strings.Contains(flat, m[1]) {
		t.Errorf("the PDF lacks the T of the page (%q)", shownT)
	}
	for _, not := range []string{"Print or save as PDF", "Save plot as SVG", "Logger data", "‹ Projects", "Export file"} {
		if strings.Contains(flat, not) {
			t.Errorf("the PDF shows the screen's %q", not)
		}
	}
	// Every page is numbered in its margin ("Page 1 of 4").
	if pages := regexp.MustCompile(`Page 1 of ([0-9]+)`).FindStringSubmatch(flat); pages == nil ||
		!strings.Contains(flat, "Page "+pages[1]+" of "+pages[1]) {
		t.Errorf("the pages are not numbered %v", pages)
	}
	if n := strings.Count(flat, "Preliminary field interpretation only."); n < 2 {
		t.Errorf("the caution is printed %d times, want at least 2", n)
	}
	// A4 is 210 × 297 mm = 595.28 × 841.89 pt (ISO 216, from memory; 1 pt = 1/72 in);
	// Chromium rounds the page to whole CSS pixels, within 1 pt.
	if !pageIs(size, 595.28, 841.89) {
		t.Errorf("A4 page size %s pt, want 595.28 x 841.89", size)
	}

	u.choose("report-paper", PaperLetter)
	u.waitFor("Letter chosen", `document.getElementById("report").dataset.paper === "letter"`)
	text, size = printPDF("letter")
	// US Letter is 8.5 × 11 in = 612 × 792 pt (ANSI/ASME Y14.1, from memory).
	if !pageIs(size, 612, 792) {
		t.Errorf("Letter page size %s pt, want 612 x 792", size)
	}
	if !strings.Contains(squash(text), "Preliminary field interpretation only.") {
		t.Error("the Letter PDF lacks the caution")
	}

	// The exports, through real downloads.
	u.click("export-readings")
	name, data := fetch("readings CSV")
	meta, head, rows := readCSV(t, data)
	if !strings.HasSuffix(name, "-readings.csv") || len(rows) != 25 || head[5] != "drawdown (m)" || meta["caution"] != Caution {
		t.Errorf("readings CSV %q: header %q, %d rows, meta %v", name, head, len(rows), meta)
	}
	u.click("export-curves")
	name, data = fetch("curves CSV")
	if _, _, rows := readCSV(t, data); !strings.HasSuffix(name, "-curves.csv") || len(rows) != curvePoints {
		t.Errorf("curves CSV %q: %d rows", name, len(rows))
	}
	u.click("report-plot-loglog-svg")
	name, data = fetch("plot SVG")
	if err := xml.Unmarshal(data, new(struct{})); err != nil || !strings.HasSuffix(name, "-loglog.svg") {
		t.Errorf("SVG %q does not parse as XML: %v", name, err)
	}
	u.click("report-plot-loglog-png")
	name, data = fetch("plot PNG")
	img, err := png.Decode(bytes.NewReader(data))
	if err != nil || !strings.HasSuffix(name, "-loglog.png") {
		t.Fatalf("PNG %q does not decode: %v", name, err)
	}
	vb := strings.Fields(u.eval(`document.getElementById("report-plot-loglog").getAttribute("viewBox")`))
	w, _ := strconv.ParseFloat(vb[2], 64)
	if got := img.Bounds().Dx(); got != int(w*pngScale) {
		t.Errorf("PNG %d px wide, want %g", got, w*pngScale)
	}
	// Not a blank canvas: the plot's dark ink is there.
	dark := 0
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y += 3 {
		for x := b.Min.X; x < b.Max.X; x += 3 {
			if r, g, bb, _ := img.At(x, y).RGBA(); r+g+bb < 3*0x4000 {
				dark++
			}
		}
	}
	if dark < 100 {
		t.Errorf("the PNG has %d dark samples: the plot was not drawn", dark)
	}
	if errs := p.Errors(); len(errs) > 0 {
		t.Errorf("console errors: %s", fmt.Sprint(errs))
	}
}

// pageIs reports whether pdfinfo's "W x H" page size is w × h pt within
// 1 pt.
func pageIs(size string, w, h float64) bool {
	ws, hs, ok := strings.Cut(size, " x ")
	gw, err1 := strconv.ParseFloat(ws, 64)
	gh, err2 := strconv.ParseFloat(hs, 64)
	return ok && err1 == nil && err2 == nil && math.Abs(gw-w) <= 1 && math.Abs(gh-h) <= 1
}
