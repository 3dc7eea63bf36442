//go:build !js

package ui

import (
	"math"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"

	"fieldfit/models/decay"
	"fieldfit/models/infiltration"
	"fieldfit/models/slug"
	"fieldfit/ui/project"
	"fieldfit/web/webtest"
)

// TestBrowserKinds runs a slug test, an infiltration test and a decay
// curve of our own invented scenario ("Quarry Bend"; readings made from
// the models with seeded noise, kinds_demo.go) through the real page and
// IndexedDB: the form, the readings typed, the fit, a reload. The values
// on the page are checked against the pure-Go fits of models/slug,
// models/infiltration and models/decay on the same SI inputs.
func TestBrowserKinds(t *testing.T) {
	if testing.Short() {
		t.Skip("browser test skipped with -short")
	}
	webtest.RequireChromium(t)
	srv := webtest.Serve(t, webtest.App(t))
	p := webtest.Open(t)
	u := user{t, p}
	p.Navigate(srv.URL + "/")
	p.WaitRunning()
	u.waitFor("the project list", `!!document.getElementById("new-project")`)
	u.click("new-project")
	u.set("project-name", "Quarry Bend")
	u.click("tab-test")

	rows := func(rs []project.KindRow) {
		t.Helper()
		u.click("tab-readings")
		for i, r := range rs {
			pre := "kr-" + strconv.Itoa(i) + "-"
			u.set(pre+"time", r.Time)
			u.set(pre+"value", r.Value)
			if r.Refill != "" {
				u.set(pre+"refill", r.Refill)
			}
		}
	}
	// shown waits for the fitted value of param in unit and returns it.
	shown := func(param, unit string) float64 {
		t.Helper()
		sel := `document.querySelector('[data-param="` + param + `"][data-unit="` + unit + `"]')`
		defer func() {
			if t.Failed() {
				t.Logf("fit status: %q", u.text("fit-status"))
			}
		}()
		u.waitFor(param+" on the page", `(() => { const e = `+sel+`; const s = document.getElementById("fit-status");
			return !!e && !!e.dataset.value && !!s && s.textContent.startsWith("Fitted"); })()`)
		x, err := strconv.ParseFloat(u.eval(sel+`.dataset.value`), 64)
		if err != nil {
			t.Fatalf("%s: %v", param, err)
		}
		return x
	}
	check := func(what string, got, want float64) {
		t.Helper()
		if math.Abs(got-want) > 1e-9*math.Abs(want) {
			t.Errorf("%s on the page %v, pure-Go fit %v", what, got, want)
		}
	}

	// The slug test.
	u.click("add-slug-test")
	u.set("k-casing-radius", "2.5")
	u.set("k-well-radius", "5")
	u.set("k-screen-length", "1.5")
	u.set("k-screen-bottom", "4.2")
	u.set("k-static", "3.415")
	u.set("k-slug-volume", "1.2")
	rows(DemoSlugRows())
	u.click("tab-test")
	if got := u.text("k-h0-check"); !strings.Contains(got, "expected initial displacement") {
		t.Errorf("H0 check %q", got)
	}
	u.click("tab-fit")
	hv, err := slug.Hvorslev(slugInputs(), slug.ScreenLong, nil)
	if err != nil {
		t.Fatal(err)
	}
	pageK := shown("K", "m/s")
	check("Hvorslev K (m/s)", pageK, hv.K.Value)
	check("Hvorslev K (ft/d)", shown("K", "ft/d"), hv.K.Value*86400/0.3048)
	if !strings.Contains(u.text("caution"), "licensed hydrogeologist") {
		t.Error("no caution on the slug results")
	}
	if n := u.eval(`String(document.querySelectorAll("#plot-kind, #plot-residuals").length)`); n != "2" {
		t.Errorf("%s slug plots, want 2", n)
	}
	// A window dragged across the plot is taken.
	u.run(chromedp.Evaluate[chromedp.Void](`(() => {
		const e = document.getElementById("plot-kind"), r = e.getBoundingClientRect();
		const ev = (type, f) => e.dispatchEvent(new PointerEvent(type, {bubbles: true, clientX: r.left + f*r.width, clientY: r.top + r.height/2, pointerId: 1}));
		ev("pointerdown", 0.3); ev("pointermove", 0.5); ev("pointerup", 0.7);
	})()`))
	u.waitFor("the dragged window", `document.getElementById("window-start").value !== ""`)
	from, _ := strconv.ParseFloat(u.value("window-start"), 64)
	to, _ := strconv.ParseFloat(u.value("window-end"), 64)
	if !(from > 0 && to > from) {
		t.Errorf("dragged window %v–%v s", from, to)
	}
	u.click("window-clear")

	// The infiltration test.
	u.click("add-infiltration-test")
	u.set("k-inner-diameter", "30")
	u.set("k-outer-diameter", "60")
	rs := DemoInfiltrationRows()
	rows(rs)
	u.click("tab-fit")
	c, err := infiltration.Rebuild(infilInputs(rs))
	if err != nil {
		t.Fatal(err)
	}
	ho, err := infiltration.Fit(c, infiltration.Horton, nil)
	if err != nil {
		t.Fatal(err)
	}
	pageFc := shown("steady rate", "mm/h")
	check("Horton fc (mm/h)", pageFc, ho.Steady.Value*3.6e6)
	if n := u.eval(`String(document.querySelectorAll("#plot-kind, #plot-rate").length)`); n != "2" {
		t.Errorf("%s infiltration plots, want 2 (F and f)", n)
	}

	// The decay curve.
	u.click("add-decay-test")
	u.set("k-value-unit", "mg/L")
	ds := DemoDecayRows()
	rows(ds)
	u.click("tab-fit")
	dc, err := decay.Fit(decayInputs(ds), nil)
	if err != nil {
		t.Fatal(err)
	}
	pageHalf := shown("t½ (k)", "min")
	check("half-life (min)", pageHalf, dc.HalfLives[0].Value/60)

	// Reload: the three tests and their fits are still there.
	u.run(chromedp.Sleep(1200 * time.Millisecond))
	p.Reload()
	p.WaitRunning()
	u.waitFor("the list after reload", `!!document.querySelector("[data-project-id] [data-action=open]")`)
	u.run(chromedp.Click(chromedp.CSS("[data-project-id] [data-action=open]")))
	u.waitFor("the project", `!!document.getElementById("tab-fit")`)
	u.click("tab-fit")
	for i, want := range []struct {
		param, unit string
		v           float64
	}{{"K", "m/s", pageK}, {"steady rate", "mm/h", pageFc}, {"t½ (k)", "min", pageHalf}} {
		u.choose("test-select", strconv.Itoa(i))
		if got := shown(want.param, want.unit); got != want.v {
			t.Errorf("after reload %s = %v, before %v", want.param, got, want.v)
		}
	}
	u.click("tab-readings")
	if got := u.value("kr-0-value"); got != ds[0].Value {
		t.Errorf("after reload the first decay reading is %q, want %q", got, ds[0].Value)
	}
	p.NoErrors()
	p.NoForeignRequests(srv.URL)
}
