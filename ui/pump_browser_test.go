//go:build !js

package ui

import (
	"math"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"

	"fieldfit/models"
	"fieldfit/models/units"
	"fieldfit/ui/project"
	"fieldfit/web/webtest"
)

// TestBrowserPumpLeaky runs the invented two-well leaky test with
// recovery (pumpScenario, "Cinder Hollow") through the real page: wells,
// rate and stop, both wells' readings pasted as from a spreadsheet, the
// Hantush–Jacob fit over pumping and recovery, every model for the
// comparison table, and a reload. The page's T, S and B must be those of
// models.FitWells on the same readings.
func TestBrowserPumpLeaky(t *testing.T) {
	if testing.Short() {
		t.Skip("browser test skipped with -short")
	}
	webtest.RequireChromium(t)
	srv := webtest.Serve(t, webtest.App(t))
	p := webtest.Open(t)
	u := user{t, p}
	sc := pumpScenario
	paste := func(id, text string) {
		t.Helper()
		u.run(chromedp.WaitVisible(chromedp.ID(id)))
		u.eval(`(() => { const dt = new DataTransfer(); dt.setData("text/plain", ` + strconv.Quote(text) + `);
			document.getElementById(` + strconv.Quote(id) + `).dispatchEvent(new ClipboardEvent("paste", {clipboardData: dt, bubbles: true, cancelable: true}));
			return ""; })()`)
	}
	// pick sets a select in the page itself and fires its change event
	// (the select may be drawn again between a wait and a chromedp set).
	pick := func(id, value string) {
		t.Helper()
		u.run(chromedp.WaitVisible(chromedp.ID(id)))
		u.eval(`(() => { const e = document.getElementById(` + strconv.Quote(id) + `); e.value = ` + strconv.Quote(value) + `;
			e.dispatchEvent(new Event("change", {bubbles: true})); return ""; })()`)
	}
	num := func(id string) float64 {
		t.Helper()
		v, err := strconv.ParseFloat(u.eval(`(document.getElementById(`+strconv.Quote(id)+`) || {dataset: {}}).dataset.value || ""`), 64)
		if err != nil {
			t.Fatalf("#%s has no value: %v", id, err)
		}
		return v
	}

	p.Navigate(srv.URL + "/")
	p.WaitRunning()
	u.waitFor("the project list", `!!document.getElementById("new-project")`)
	u.click("new-project")
	u.set("project-name", "Cinder Hollow trial")
	u.set("aquifer-b", "30")
	u.click("tab-wells")
	u.click("add-pumping-well")
	u.set("well-0-name", "PB-1")
	u.set("well-0-radius", "0.1")
	for k, r := range sc.R {
		u.click("add-observation-well")
		u.set("well-"+strconv.Itoa(k+1)+"-name", []string{"CH-A", "CH-B"}[k])
		u.set("well-"+strconv.Itoa(k+1)+"-distance", strconv.FormatFloat(r, 'f', -1, 64))
	}
	u.click("tab-test")
	u.set("test-rate", strconv.FormatFloat(sc.Q*1000, 'f', -1, 64))
	u.choose("test-rate-unit", "L/s")
	u.set("test-static", strconv.FormatFloat(sc.Static[0], 'f', -1, 64))
	obs := u.eval(`[...document.querySelectorAll("#test-obs-well option")].find(o => o.textContent === "CH-A").value`)
	pick("test-obs-well", obs)
	u.set("pump-stop", strconv.FormatFloat(sc.Stop, 'f', -1, 64))
	u.click("tab-readings")
	paste("r-0-time", pasteText(sc.readings(0)))
	n0 := len(sc.Minutes) + len(sc.Recovery)
	u.waitFor("the first well's readings", `!!document.getElementById("r-`+strconv.Itoa(n0-1)+`-dd") && document.getElementById("r-`+strconv.Itoa(n0-1)+`-dd").textContent !== ""`)
	second := u.eval(`[...document.querySelectorAll("#readings-well option")].find(o => o.textContent.includes("CH-B")).value`)
	pick("readings-well", second)
	u.set("series-static", strconv.FormatFloat(sc.Static[1], 'f', -1, 64))
	paste("r-0-time", pasteText(sc.readings(1)))
	u.waitFor("the second well's readings", `!!document.getElementById("r-`+strconv.Itoa(n0-1)+`-dd") && document.getElementById("r-`+strconv.Itoa(n0-1)+`-dd").textContent !== ""`)

	u.click("tab-fit")
	pick("fit-model", string(project.Hantush))
	u.click("fit")
	u.waitFor("the Hantush–Jacob fit", `(() => { const s = document.getElementById("fit-status");
		return s && s.textContent.startsWith("Fitted Hantush") && !!document.getElementById("result-B"); })()`)
	steps := models.PumpAndStop(sc.Q, sc.Stop*units.Minute)
	ref, err := models.FitWells(scenarioWells(sc, func(r float64) models.Model {
		return models.VariableRate{Base: models.Hantush{Q: sc.Q, R: r}, Steps: steps}
	}), nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		id    string
		want  float64
		truth float64
	}{
		{"result-T", ref.Params[0] * units.Day, sc.T * units.Day},
		{"result-S", ref.Params[1], sc.S},
		{"result-B", ref.Params[2], sc.B},
	} {
		if got := num(c.id); math.Abs(got/c.want-1) > 1e-6 {
			t.Errorf("#%s on the page %v, pure-Go joint fit %v", c.id, got, c.want)
		}
		if got := num(c.id); math.Abs(got/c.truth-1) > 0.05 {
			t.Errorf("#%s = %v, far from the invented %v", c.id, got, c.truth)
		}
	}
	if n := u.eval(`String(document.querySelectorAll("#plot-loglog, #plot-semilog, #plot-recovery, #plot-recovery-line, #plot-wells, #plot-residuals").length)`); n != "6" {
		t.Errorf("%s plots drawn, want 6", n)
	}
	if !strings.Contains(u.text("caution"), "licensed hydrogeologist") {
		t.Error("no caution on the results")
	}

	u.click("fit-all")
	u.waitFor("every model in the comparison", `document.querySelectorAll("#compare-table tr[data-row]").length === `+strconv.Itoa(len(pumpModels)))
	if first := u.eval(`document.querySelector("#compare-table tr[data-row]").dataset.row`); first != string(project.Hantush) {
		t.Errorf("lowest AICc row %q, want the leaky model of the invented data", first)
	}

	// Reload: the stop, the second well and the fits are kept.
	u.run(chromedp.Sleep(1200 * time.Millisecond))
	p.Reload()
	p.WaitRunning()
	u.waitFor("the list after reload", `!!document.querySelector("[data-project-id] [data-action=open]")`)
	u.run(chromedp.Click(chromedp.CSS("[data-project-id] [data-action=open]")))
	u.click("tab-test")
	if got := u.value("pump-stop"); got != strconv.FormatFloat(sc.Stop, 'f', -1, 64) {
		t.Errorf("stop after reload %q", got)
	}
	u.click("tab-fit")
	u.waitFor("the stored comparison", `document.querySelectorAll("#compare-table tr[data-row]").length === `+strconv.Itoa(len(pumpModels)))
	u.waitFor("the refitted plots", `!!document.getElementById("plot-wells")`)
	p.NoErrors()
	p.NoForeignRequests(srv.URL)
}
