//go:build !js

package ui

// Browser tests of "nothing lost" and of project files, on the real page
// and the real IndexedDB in headless Chromium: an edit followed at once
// by a reload, two tabs on one project, a full storage quota, and
// refused or unsafe import files.

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"

	"fieldfit/ui/project"
	"fieldfit/web/webtest"
)

// noBusy is true when the app has no storage call, save or fit running.
const noBusy = `!document.getElementById("busy")`

func TestBrowserReloadAtOnce(t *testing.T) {
	if testing.Short() {
		t.Skip("browser test skipped with -short")
	}
	srv := webtest.Serve(t, webtest.App(t))
	p := webtest.Open(t)
	u := user{t, p}
	p.Navigate(srv.URL + "/")
	p.WaitRunning()
	u.click("new-project")
	u.set("project-name", "Whimbrel Point")
	u.click("tab-readings")
	u.set("r-0-time", "1")
	u.set("r-0-depth", "7.5")
	// Reload at once: no wait for the autosave.
	p.Reload()
	p.WaitRunning()
	u.waitFor("the list after reload", `!!document.querySelector("[data-project-id] [data-action=open]")`)
	if got := u.eval(`document.querySelector("[data-project-id] .project-name").textContent`); got != "Whimbrel Point" {
		t.Errorf("after the reload the list shows %q", got)
	}
	u.run(chromedp.Click(chromedp.CSS("[data-project-id] [data-action=open]")))
	u.waitFor("the readings", `!!document.getElementById("r-0-depth")`)
	if gt, gd := u.value("r-0-time"), u.value("r-0-depth"); gt != "1" || gd != "7.5" {
		t.Errorf("after the reload the reading is %q %q, want 1 7.5", gt, gd)
	}
	p.NoErrors()
}

func TestBrowserTwoTabs(t *testing.T) {
	if testing.Short() {
		t.Skip("browser test skipped with -short")
	}
	srv := webtest.Serve(t, webtest.App(t))
	p1 := webtest.Open(t)
	a := user{t, p1}
	p1.Navigate(srv.URL + "/")
	p1.WaitRunning()
	a.click("new-project")
	a.set("project-name", "Godwit Marsh")
	a.click("tab-wells")
	a.click("add-observation-well")
	a.set("well-0-distance", "25")
	a.click("tab-readings")
	a.set("r-0-time", "1")
	a.set("r-0-depth", "7.012")
	a.waitFor("the first save", noBusy+` && !!document.querySelector("#r-1-time")`)
	a.run(chromedp.Sleep(800e6))

	p2 := p1.NewTab()
	b := user{t, p2}
	p2.Navigate(srv.URL + "/")
	p2.WaitRunning()
	b.waitFor("the list in tab 2", `!!document.querySelector("[data-project-id] [data-action=open]")`)
	b.run(chromedp.Click(chromedp.CSS("[data-project-id] [data-action=open]")))
	b.waitFor("the readings in tab 2", `!!document.getElementById("r-0-depth")`)

	// Different parts in each tab: both kept.
	a.click("tab-wells")
	a.set("well-0-name", "OW-tab1")
	a.run(chromedp.Sleep(1000e6))
	b.set("r-0-depth", "7.333")
	b.run(chromedp.Sleep(1000e6))
	b.click("tab-wells")
	b.waitFor("tab 2 to have tab 1's well name", `document.getElementById("well-0-name").value === "OW-tab1"`)
	a.click("tab-readings")
	a.waitFor("tab 1 to have tab 2's reading", `document.getElementById("r-0-depth").value === "7.333"`)

	// The same reading in both tabs, typed before either saves: the
	// later save asks.
	b.click("tab-readings")
	b.waitFor("the readings in tab 2", `!!document.getElementById("r-0-depth")`)
	typeNow := func(u user, v string) {
		u.run(chromedp.Evaluate[chromedp.Void](`(() => { const e = document.getElementById("r-0-depth");
			e.value = "` + v + `"; e.dispatchEvent(new Event("input", {bubbles: true})); })()`))
	}
	typeNow(a, "7.401")
	typeNow(b, "7.402")
	var asker, other user
	var mine string
	hasMerge := func(u user) bool { return u.eval(`String(!!document.getElementById("screen-merge"))`) == "true" }
	for deadline := time.Now().Add(30 * time.Second); asker.p == nil; {
		switch {
		case hasMerge(b):
			asker, other, mine = b, a, "7.402"
		case hasMerge(a):
			asker, other, mine = a, b, "7.401"
		case time.Now().After(deadline):
			t.Fatalf("no tab asks after both changed the same reading; tab 1 shows %q, tab 2 %q", a.value("r-0-depth"), b.value("r-0-depth"))
		default:
			time.Sleep(100 * time.Millisecond)
		}
	}
	asker.waitFor("the decisions screen", `!!document.getElementById("screen-merge")`)
	screen := asker.text("screen-merge")
	if !strings.Contains(screen, "7.401") || !strings.Contains(screen, "7.402") || !strings.Contains(screen, "another tab") {
		t.Errorf("the decisions screen does not show both readings:\n%s", screen)
	}
	asker.run(chromedp.Click(chromedp.CSS(`[id^="merge-local-"]`)))
	asker.click("merge-apply")
	asker.waitFor("the project again", `!!document.getElementById("r-0-depth")`)
	if got := asker.value("r-0-depth"); got != mine {
		t.Errorf("after keeping this tab's, it shows %q, want %q", got, mine)
	}
	other.waitFor("the other tab to follow", `document.getElementById("r-0-depth") && document.getElementById("r-0-depth").value === "`+mine+`"`)
	p1.NoErrors()
	p2.NoErrors()
}

// fullStore is a test hook put into the page before its scripts: while
// window.__fieldfitFull is set, every IndexedDB write is refused as the
// browser refuses it when the site's storage quota is used up (a
// QuotaExceededError DOMException). Chromium's quota override
// (Storage.overrideQuotaForOrigin) did not reach a database already
// open, so the refusal is simulated here.
const fullStore = `(() => {
	for (const m of ["put", "add"]) {
		const orig = IDBObjectStore.prototype[m];
		IDBObjectStore.prototype[m] = function (...args) {
			if (window.__fieldfitFull && this.name === "projects") {
				throw new DOMException("The quota has been exceeded.", "QuotaExceededError");
			}
			return orig.apply(this, args);
		};
	}
})()`

func TestBrowserQuotaFull(t *testing.T) {
	if testing.Short() {
		t.Skip("browser test skipped with -short")
	}
	srv := webtest.Serve(t, webtest.App(t))
	p := webtest.Open(t)
	u := user{t, p}
	p.BeforeLoad(fullStore)
	p.Navigate(srv.URL + "/")
	p.WaitRunning()
	u.click("new-project")
	u.set("project-name", "Stint Hollow")
	u.waitFor("the first save", noBusy)
	u.run(chromedp.Sleep(800e6))
	storedNow := func() string {
		return u.eval(`new Promise((ok, fail) => { const r = indexedDB.open("fieldfit"); r.onsuccess = () => {
		const g = r.result.transaction("projects").objectStore("projects").getAll();
		g.onsuccess = () => { ok(g.result.map(x => x.name + ":" + x.rev + ":" + x.data.length).join(",")); r.result.close(); };
		g.onerror = fail; }; r.onerror = fail; })`)
	}
	before := storedNow()
	if !strings.HasPrefix(before, "Stint Hollow:") {
		t.Fatalf("the store holds %q before the device is full", before)
	}
	// The device is full.
	u.run(chromedp.Evaluate[chromedp.Void](`window.__fieldfitFull = true`))
	u.run(chromedp.Evaluate[chromedp.Void](`(() => { const e = document.getElementById("project-notes");
		e.value = "Pump set at 30 m; flow meter read every 10 minutes."; e.dispatchEvent(new Event("input", {bubbles: true})); })()`))
	u.waitFor("the storage message", `!!document.getElementById("storage-status")`)
	if msg := u.text("storage-status"); !strings.Contains(msg, "full") || !strings.Contains(msg, "export") {
		t.Errorf("storage message %q does not say the storage is full and offer an export", msg)
	}
	u.waitFor("an export offered", `!!document.getElementById("export-current-banner")`)
	// Nothing half-written: the store holds the project as last saved.
	if got := storedNow(); got != before {
		t.Errorf("the store holds %q, want %q as before the refused save", got, before)
	}
	if got := u.value("project-notes"); !strings.HasPrefix(got, "Pump set at 30 m") {
		t.Errorf("the notes on screen are %q", got)
	}
	// Room again: the next change is saved and the message goes.
	u.run(chromedp.Evaluate[chromedp.Void](`window.__fieldfitFull = false`))
	u.set("project-site", "Stint Hollow, west bank")
	u.waitFor("the message to go after a save", `!document.getElementById("storage-status")`)
	u.waitFor("the save", noBusy)
	if got := storedNow(); got == before {
		t.Error("the change after room was made is not stored")
	}
	p.NoErrors()
}

func TestBrowserImportFiles(t *testing.T) {
	if testing.Short() {
		t.Skip("browser test skipped with -short")
	}
	dir := t.TempDir()
	write := func(name string, data []byte) string {
		path := filepath.Join(dir, name)
		if err := os.WriteFile(path, data, 0o644); err != nil {
			t.Fatal(err)
		}
		return path
	}
	unsafe := project.New(xssPayload, project.SI, clock0)
	unsafe.Notes = `<script>window.__pwned=2</script>`
	good, err := project.Marshal(unsafe)
	if err != nil {
		t.Fatal(err)
	}
	huge := filepath.Join(dir, "huge.fieldfit.json")
	f, err := os.Create(huge)
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Truncate(300 << 20); err != nil { // sparse: no 300 MB written
		t.Fatal(err)
	}
	f.Close()

	srv := webtest.Serve(t, webtest.App(t))
	p := webtest.Open(t)
	u := user{t, p}
	p.Navigate(srv.URL + "/")
	p.WaitRunning()
	u.click("new-project")
	u.set("project-name", "Knot Shoal")
	u.click("back-to-list")
	u.waitFor("the list", `!!document.querySelector("[data-project-id]")`+" && "+noBusy)
	list := func() string { return u.text("project-list") }
	before := list()
	upload := func(path string) string {
		t.Helper()
		p.Do(chromedp.SetUploadFiles(chromedp.ID("import-file"), []string{path}))
		u.waitFor("the import's message", `document.getElementById("notice") && document.getElementById("notice").textContent.includes(`+
			jsString("“"+filepath.Base(path)+"”")+`) && `+noBusy)
		return u.text("notice")
	}
	for _, tc := range []struct{ name, path, says string }{
		{"truncated", write("cut.fieldfit.json", good[:len(good)/2]), "damaged or cut short"},
		{"another kind", write("levels.csv", []byte("Time,Level\n2024-05-14 08:00,12.3\n")), "not a Fieldfit project file"},
		{"300 MB", huge, "up to 200 MB"},
	} {
		msg := upload(tc.path)
		if !strings.Contains(msg, tc.says) || !strings.Contains(msg, "Nothing") {
			t.Errorf("%s: message %q, want it to say %q and that nothing changed", tc.name, msg, tc.says)
		}
		if got := list(); got != before {
			t.Errorf("%s: the list changed to %q", tc.name, got)
		}
	}
	// A name and notes holding HTML and script: imported as text.
	msg := upload(write("unsafe.fieldfit.json", good))
	if !strings.Contains(msg, "was added") {
		t.Errorf("unsafe name: message %q", msg)
	}
	u.waitFor("the imported project in the list", `[...document.querySelectorAll(".project-name")].some(e => e.textContent === `+jsString(xssPayload)+`)`)
	if u.eval(`String(document.querySelectorAll("#app-root img, #app-root script").length + (window.__pwned ? 100 : 0))`) != "0" {
		t.Error("the imported name or notes became markup or ran")
	}
	p.NoErrors()
}

func jsString(s string) string {
	return "`" + strings.ReplaceAll(strings.ReplaceAll(s, `\`, `\\`), "`", "\\`") + "`"
}
