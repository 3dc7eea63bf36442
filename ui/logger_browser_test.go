//go:build !js

package ui

// The logger browser test drives the Logger data tab of the real app in
// headless Chromium: two files picked through the page's file inputs
// (DOM.setFileInputFiles, chromedp.SetUploadFiles), the column mapping,
// thinning, the fit, and a reload that finds it all again in IndexedDB.

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"

	"fieldfit/web/webtest"
)

func TestBrowserLoggerFiles(t *testing.T) {
	if testing.Short() {
		t.Skip("browser test skipped with -short")
	}
	webtest.RequireChromium(t)
	start := time.Now()
	srv := webtest.Serve(t, webtest.App(t))
	origin := srv.URL
	p := webtest.Open(t)
	u := user{t, p}
	run, eval, set, choose, click := u.run, u.eval, u.set, u.choose, u.click
	value, text, waitFor := u.value, u.text, u.waitFor
	upload := func(id, name string) {
		t.Helper()
		path, err := filepath.Abs(filepath.Join("..", "testdata", "fielddata", name))
		if err != nil {
			t.Fatal(err)
		}
		run(chromedp.SetUploadFiles(chromedp.ID(id), []string{path}))
		waitFor("the preview of "+name, `!!document.getElementById("import-preview")`)
	}

	p.Navigate(origin + "/")
	p.WaitRunning()
	waitFor("the project list", `!!document.getElementById("new-project")`)
	click("new-project")
	set("project-name", "Larkspur Flats logger test")
	click("tab-wells")
	click("add-pumping-well")
	set("well-0-radius", "0.1")
	click("add-observation-well")
	set("well-1-distance", "20")
	click("tab-test")
	set("test-rate", "5")
	click("tab-logger")

	// The water-level logger: the choices found, with their reasons.
	upload("logger-file", "pressure-kpa.csv")
	for id, want := range map[string]string{"imp-delimiter": "comma", "imp-decimal": "point", "imp-time-format": "datetime",
		"imp-value-col": "1", "imp-kind": "pressure", "imp-unit": "kPa", "imp-zone": "UTC+02:00"} {
		if got := value(id); got != want {
			t.Errorf("#%s shows %q, want %q", id, got, want)
		}
	}
	if got := text("imp-why-zone"); !strings.Contains(got, "line 3") {
		t.Errorf("zone reason %q", got)
	}
	// Map the columns: the temperature column is not a water level;
	// back to the pressure column, in kPa.
	choose("imp-value-col", "2")
	waitFor("the mapping of column 3", `document.getElementById("imp-value-col").value === "2"`)
	choose("imp-value-col", "1")
	choose("imp-kind", "pressure")
	choose("imp-unit", "kPa")
	waitFor("the preview in head of water", `document.getElementById("imp-preview") && document.getElementById("imp-preview").textContent.includes("16.8230")`)
	p.Shot("logger-preview")
	click("import-start")
	waitFor("the water record", `!!document.getElementById("water-summary")`)
	if got := text("water-summary"); !strings.Contains(got, "301 readings of pressure in kPa") || !strings.Contains(got, "(UTC+02:00)") {
		t.Errorf("water summary %q", got)
	}

	// The barometric logger.
	upload("baro-file", "baro-mbar.csv")
	if got := value("imp-unit"); got != "mbar" {
		t.Errorf("barometric unit %q", got)
	}
	set("imp-zone", "+02:00")
	click("import-start")
	waitFor("the barometric record", `!!document.getElementById("baro-summary")`)
	if eval(`String(document.getElementById("cond-baro").checked)`) != "true" {
		t.Error("compensation is not on with both records")
	}

	// Conditioning: the pump's start and stop, thinning to 15 a cycle.
	set("cond-start", "2024-05-14 08:00")
	set("cond-stop", "2024-05-14 11:00")
	set("cond-per-cycle", "15")
	count, T, S := loggerReference(t, 15)
	waitFor("the thinning count", fmt.Sprintf(`(document.getElementById("thin-count") || {}).textContent === %q`, count))
	if !strings.HasPrefix(count, "241 → ") {
		t.Errorf("count %q", count)
	}
	if n := eval(`String(document.querySelectorAll("#plot-raw, #plot-drawdown").length)`); n != "2" {
		t.Errorf("%s logger plots drawn, want 2", n)
	}
	p.Shot("logger-conditioning")

	// The fit of the logger record.
	click("tab-fit")
	if got := value("fit-source"); got != "logger" {
		t.Errorf("the fit uses %q", got)
	}
	click("fit")
	waitFor("the fit", `(() => { const e = document.getElementById("result-T"); const s = document.getElementById("fit-status");
		return !!e && e.dataset.value && s && s.textContent.startsWith("Fitted"); })()`)
	pageT, _ := strconv.ParseFloat(eval(`document.getElementById("result-T").dataset.value`), 64)
	pageS, _ := strconv.ParseFloat(eval(`document.getElementById("result-S").dataset.value`), 64)
	if want := T * 86400; math.Abs(pageT-want) > 1e-6*want {
		t.Errorf("T on the page %v m²/d, the same pipeline natively %v", pageT, want)
	}
	if math.Abs(pageS-S) > 1e-6*S {
		t.Errorf("S on the page %v, natively %v", pageS, S)
	}
	p.Shot("logger-fit")

	// Reload: the records, the settings and the fit are still there.
	run(chromedp.Sleep(1200 * time.Millisecond))
	p.Reload()
	p.WaitRunning()
	waitFor("the list after reload", `!!document.querySelector("[data-project-id] [data-action=open]")`)
	run(chromedp.Click(chromedp.CSS("[data-project-id] [data-action=open]")))
	waitFor("the project", `!!document.getElementById("tab-logger")`)
	click("tab-logger")
	waitFor("the records", `!!document.getElementById("water-summary") && !!document.getElementById("baro-summary")`)
	if value("cond-start") != "2024-05-14 08:00" || value("cond-stop") != "2024-05-14 11:00" || value("cond-per-cycle") != "15" {
		t.Errorf("settings after reload: %q %q %q", value("cond-start"), value("cond-stop"), value("cond-per-cycle"))
	}
	if got := text("thin-count"); got != count {
		t.Errorf("count after reload %q, want %q", got, count)
	}
	click("tab-fit")
	waitFor("the stored fit", `!!document.getElementById("result-T") && !!document.getElementById("result-T").dataset.value`)
	if again, _ := strconv.ParseFloat(eval(`document.getElementById("result-T").dataset.value`), 64); again != pageT {
		t.Errorf("T after reload %v, before %v", again, pageT)
	}
	p.NoErrors()
	p.NoForeignRequests(origin)
	t.Logf("logger browser test: %.1f s", time.Since(start).Seconds())
}

// BenchmarkBrowserImport1M times the import of a 1 000 000-row logger file
// (elapsed seconds, depth to water; about 17 MB) through the page: from
// the click on the import button to the record's summary, in the real
// app in headless Chromium. The README records the figure; nothing
// asserts it.
//
//	go test ./ui -run X -bench BrowserImport1M -benchtime 3x
func BenchmarkBrowserImport1M(b *testing.B) {
	webtest.RequireChromium(b)
	path := filepath.Join(b.TempDir(), "million.csv")
	var sb strings.Builder
	sb.WriteString("# Larkspur Flats, well LF-OB1, a long record\nElapsed time (s),Depth to water (m)\n")
	for i := 0; i < 1_000_000; i++ {
		s := 0.8 * math.Log10(1+float64(i)/60)
		sb.WriteString(strconv.Itoa(i))
		sb.WriteByte(',')
		sb.WriteString(strconv.FormatFloat(8+s, 'f', 4, 64))
		sb.WriteByte('\n')
	}
	if err := os.WriteFile(path, []byte(sb.String()), 0o644); err != nil {
		b.Fatal(err)
	}
	srv := webtest.Serve(b, webtest.App(b))
	p := webtest.Open(b)
	p.Navigate(srv.URL + "/")
	p.WaitRunning()
	p.WaitFor(`!!document.getElementById("new-project")`, "the project list")
	click := user{b, p}.click
	var total time.Duration
	for i := 0; b.Loop(); i++ {
		if i > 0 {
			click("back-to-list")
		}
		click("new-project")
		click("tab-logger")
		p.Do(chromedp.SetUploadFiles(chromedp.ID("logger-file"), []string{path}))
		p.WaitFor(`!!document.getElementById("import-start")`, "the preview")
		webtest.Eval[bool](p, `(window.__t0 = performance.now(), true)`)
		click("import-start")
		p.WaitFor(`/1\D?000\D?000 readings/.test((document.getElementById("water-summary") || {textContent: ""}).textContent)`, "the imported record")
		total += time.Duration(webtest.Eval[float64](p, `performance.now() - window.__t0`) * float64(time.Millisecond))
	}
	b.ReportMetric(total.Seconds()/float64(b.N), "s-to-record")
	b.ReportMetric(0, "ns/op")
}
