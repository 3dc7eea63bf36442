//go:build !js

package ui

// The browser test drives the real app — the WebAssembly bundle served by
// web/bundle, the real IndexedDB — in headless Chromium through chromedp:
// the scripted field session, a reload, bad entries, an HTML payload as
// user text, console errors and requests, and screenshots at three sizes.
// It is skipped with -short or when no Chromium is installed.

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"

	"fieldfit/models"
	"fieldfit/web/webtest"
)

const xssPayload = `<img src=x onerror="window.__pwned=1">`

func TestBrowserFieldSession(t *testing.T) {
	if testing.Short() {
		t.Skip("browser test skipped with -short")
	}
	webtest.RequireChromium(t)
	srv := webtest.Serve(t, webtest.App(t))
	origin := srv.URL
	p := webtest.Open(t)

	u := user{t, p}
	run, eval, set, choose, click := u.run, u.eval, u.set, u.choose, u.click
	value, text, waitFor := u.value, u.text, u.waitFor
	// shot saves the screen at the three sizes and checks that every
	// control shown is a touch target of at least 44 × 44 CSS px.
	shot := func(name string) {
		t.Helper()
		for _, vp := range webtest.Viewports {
			p.SetViewport(vp)
			run(chromedp.Sleep(300 * time.Millisecond))
			p.Shot(name + "-" + vp.Name)
			small := eval(`[...document.querySelectorAll("#app-root button, #app-root select, #app-root input")]
				.filter(e => e.offsetParent !== null)
				.map(e => e.type === "checkbox" && e.closest("label") ? e.closest("label") : e)
				.filter(e => { const r = e.getBoundingClientRect(); return r.height < 43.5 || r.width < 43.5; })
				.map(e => e.id || e.textContent).join(", ")`)
			if small != "" {
				t.Errorf("%s at %s: touch targets under 44 px: %s", name, vp.Name, small)
			}
		}
		p.SetViewport(webtest.Laptop)
	}

	p.Navigate(origin + "/")
	p.WaitRunning()
	waitFor("the project list", `!!document.getElementById("demo-project")`)
	if !strings.Contains(text("app-root"), "example") {
		t.Error("the empty device does not offer the example project")
	}
	shot("list-empty")

	// The field session.
	click("new-project")
	set("project-name", xssPayload)
	set("aquifer-b", "18")
	click("tab-wells")
	click("add-pumping-well")
	set("well-0-name", xssPayload)
	set("well-0-radius", "0.1")
	click("add-observation-well")
	set("well-1-distance", "25")
	shot("wells")
	click("tab-test")
	set("test-rate", "7.5")
	choose("test-rate-unit", "L/s")
	set("test-static", "5.12")
	shot("test")
	click("tab-readings")
	// Enter moves from the time to the depth of the row.
	set("r-0-time", sessionReadings[0][0]+"\r")
	if got := eval(`document.activeElement.id`); got != "r-0-depth" {
		t.Errorf("after Enter the focus is on #%s, want #r-0-depth", got)
	}
	run(chromedp.SendKeys(chromedp.ID("r-0-depth"), sessionReadings[0][1]+"\r"))
	if got := eval(`document.activeElement.id`); got != "r-1-time" {
		t.Errorf("after Enter the focus is on #%s, want #r-1-time", got)
	}
	if got := text("r-0-dd"); got != "0.260" {
		t.Errorf("drawdown of row 1 shows %q, want 0.260", got)
	}
	typing := time.Now()
	for i, r := range sessionReadings[1:] {
		set(fmt.Sprintf("r-%d-time", i+1), r[0])
		set(fmt.Sprintf("r-%d-depth", i+1), r[1])
	}
	t.Logf("typing 24 rows took %v", time.Since(typing))
	// Bad entries below the 25 good rows: messages, typed text kept.
	set("r-25-time", "abc")
	set("r-25-depth", "5,9x")
	set("r-26-time", "250")
	set("r-26-depth", "5.0")
	if got := text("r-25-msg"); !strings.Contains(got, `Time "abc" is not a number.`) || !strings.Contains(got, `Depth "5,9x" is not a number.`) {
		t.Errorf("row 26 message %q", got)
	}
	if got := text("r-26-msg"); !strings.Contains(got, "not after the row above") || !strings.Contains(got, "Negative drawdown") {
		t.Errorf("row 27 message %q", got)
	}
	if value("r-25-time") != "abc" || value("r-25-depth") != "5,9x" {
		t.Errorf("typed text changed: %q %q", value("r-25-time"), value("r-25-depth"))
	}
	shot("readings")

	click("tab-fit")
	click("fit")
	waitFor("the fit", `(() => { const e = document.getElementById("result-T"); const s = document.getElementById("fit-status");
		return !!e && e.dataset.value && s && s.textContent.startsWith("Fitted"); })()`)
	times, dd := sessionData()
	ref, err := models.Fit(models.Theis{Q: sessionQ, R: sessionR}, models.Data{Time: times, Value: dd}, nil)
	if err != nil {
		t.Fatal(err)
	}
	pageT, _ := strconv.ParseFloat(eval(`document.getElementById("result-T").dataset.value`), 64)
	pageS, _ := strconv.ParseFloat(eval(`document.getElementById("result-S").dataset.value`), 64)
	if want := ref.Params[0] * 86400; math.Abs(pageT-want) > 1e-6*want {
		t.Errorf("T on the page %v m²/d, pure-Go fit %v", pageT, want)
	}
	if want := ref.Params[1]; math.Abs(pageS-want) > 1e-6*want {
		t.Errorf("S on the page %v, pure-Go fit %v", pageS, want)
	}
	// The shown text carries the same value to 3 digits, with its unit.
	if got, want := text("result-T"), formatSig(ref.Params[0]*86400, 3)+" m²/d"; !strings.HasPrefix(got, want) {
		t.Errorf("#result-T text %q, want it to start with %q", got, want)
	}
	if !strings.Contains(text("caution"), "licensed hydrogeologist") {
		t.Error("no caution on the results")
	}
	if n := eval(`String(document.querySelectorAll("#plot-loglog, #plot-semilog, #plot-residuals").length)`); n != "3" {
		t.Errorf("%s plots drawn, want 3", n)
	}
	shot("fit")

	// The payload is text, never markup.
	if got := text("project-title"); got != xssPayload {
		t.Errorf("project title shows %q", got)
	}
	if eval(`String(document.querySelectorAll("#app-root img").length + (window.__pwned ? 100 : 0))`) != "0" {
		t.Error("the payload made an <img> or ran")
	}

	// Reload: the project and every reading are still there.
	run(chromedp.Sleep(1200 * time.Millisecond)) // autosave is within a second
	p.Reload()
	p.WaitRunning()
	waitFor("the list after reload", `!!document.querySelector("[data-project-id] [data-action=open]")`)
	if got := eval(`document.querySelector("[data-project-id] .project-name").textContent`); got != xssPayload {
		t.Errorf("list shows the name %q", got)
	}
	run(chromedp.Click(chromedp.CSS("[data-project-id] [data-action=open]")))
	waitFor("the project", `!!document.getElementById("r-0-time")`)
	for i, r := range sessionReadings {
		if gt, gd := value(fmt.Sprintf("r-%d-time", i)), value(fmt.Sprintf("r-%d-depth", i)); gt != r[0] || gd != r[1] {
			t.Errorf("after reload row %d is %q %q, want %q %q", i+1, gt, gd, r[0], r[1])
		}
	}
	if value("r-25-time") != "abc" || value("r-25-depth") != "5,9x" {
		t.Error("the bad row was not kept across the reload")
	}
	click("tab-wells")
	if value("well-1-distance") != "25" || value("well-0-name") != xssPayload {
		t.Errorf("wells after reload: distance %q, name %q", value("well-1-distance"), value("well-0-name"))
	}
	click("tab-fit")
	waitFor("the stored fit", `!!document.getElementById("result-T") && !!document.getElementById("result-T").dataset.value`)
	if again, _ := strconv.ParseFloat(eval(`document.getElementById("result-T").dataset.value`), 64); again != pageT {
		t.Errorf("T after reload %v, before %v", again, pageT)
	}

	p.NoErrors()
	p.NoForeignRequests(origin)
}
