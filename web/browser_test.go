package main

// Browser tests of the page shell, the service worker and the IndexedDB
// store, in headless Chromium (see package webtest). They need
// /usr/bin/chromium: without it they skip, or fail when CI is set.

import (
	"encoding/json"
	"fmt"
	"io/fs"
	"net/http"
	"slices"
	"strings"
	"testing"
	"testing/fstest"

	"github.com/chromedp/chromedp"

	"fieldfit/web/bundle"
	"fieldfit/web/static"
	"fieldfit/web/webtest"
)

func skipShort(t *testing.T) {
	t.Helper()
	if testing.Short() {
		t.Skip("browser test; skipped with -short")
	}
	webtest.RequireChromium(t)
}

// TestPageLoads loads the app's bundle and checks what the shell promises:
// the program starts, the version shows, the CSP arrives as a header and a
// meta tag and is enforced, nothing is requested from another origin, and
// the console stays clean.
func TestPageLoads(t *testing.T) {
	skipShort(t)
	b := webtest.App(t)
	srv := webtest.Serve(t, b)
	p := webtest.Open(t)
	resp := p.NavigateResponse(srv.URL + "/")
	if resp.Status != 200 {
		t.Fatalf("status %d", resp.Status)
	}
	var csp string
	for k, v := range resp.Headers {
		if strings.EqualFold(k, "Content-Security-Policy") {
			csp = fmt.Sprint(v)
		}
	}
	if csp != bundle.CSP {
		t.Errorf("the browser got CSP header %q, want %q", csp, bundle.CSP)
	}
	p.WaitRunning()
	p.WaitFor(`document.getElementById("loading").hidden`, "the loading message stayed after the app started")

	if got := strings.TrimSpace(p.Text("#app-version")); got != b.Version {
		t.Errorf("#app-version shows %q, want %q", got, b.Version)
	}
	if got := webtest.Eval[string](p, `document.querySelector('meta[name="fieldfit-version"]').content`); got != b.Version {
		t.Errorf("meta fieldfit-version %q, want %q", got, b.Version)
	}
	if got := webtest.Eval[string](p, `document.querySelector('meta[http-equiv="Content-Security-Policy"]').content`); got != bundle.MetaCSP {
		t.Errorf("meta CSP %q, want %q", got, bundle.MetaCSP)
	}
	if n := webtest.Eval[int](p, `document.querySelectorAll("script:not([src])").length`); n != 0 {
		t.Errorf("%d inline scripts in the page", n)
	}
	p.WaitFor(`document.documentElement.dataset.sw === "ready"`, "the service worker did not become ready")
	p.ShotAll("loaded")
	p.NoErrors()
	p.NoForeignRequests(srv.URL)
	if !slices.ContainsFunc(p.Requests(), func(u string) bool { return strings.HasSuffix(u, "/app.wasm") }) {
		t.Errorf("no request for app.wasm among %q", p.Requests())
	}

	// The policy is enforced: an inline script added to the page does not
	// run (this logs a CSP error, so it comes after the console check).
	// DevTools' own evaluation is exempt from CSP, so the test cannot try
	// eval directly.
	if got := webtest.Eval[string](p, `(() => {
		const s = document.createElement("script");
		s.textContent = "window.fieldfitInlineRan = true;";
		document.head.appendChild(s);
		return window.fieldfitInlineRan ? "ran" : "blocked";
	})()`); got != "blocked" {
		t.Errorf("an inline script under the page's CSP: %s, want blocked", got)
	}

	// Served to Go's client too, with gzip on request.
	req, _ := http.NewRequest("GET", srv.URL+"/app.wasm", nil)
	req.Header.Set("Accept-Encoding", "gzip")
	r, err := http.DefaultTransport.RoundTrip(req)
	if err != nil {
		t.Fatal(err)
	}
	r.Body.Close()
	if r.Header.Get("Content-Type") != "application/wasm" || r.Header.Get("Content-Encoding") != "gzip" {
		t.Errorf("app.wasm: Content-Type %q, Content-Encoding %q", r.Header.Get("Content-Type"), r.Header.Get("Content-Encoding"))
	}
}

// TestOffline installs the service worker, stops the server and reloads:
// the page must come back from the device alone.
func TestOffline(t *testing.T) {
	skipShort(t)
	b := webtest.App(t)
	srv := webtest.Serve(t, b)
	p := webtest.Open(t)
	p.Navigate(srv.URL + "/")
	p.WaitRunning()
	p.WaitFor(`navigator.serviceWorker.controller !== null && document.documentElement.dataset.sw === "ready"`,
		"the service worker did not take control")

	keys := webtest.Eval[[]string](p, `caches.keys()`)
	if want := []string{"fieldfit-shell-" + b.Version}; !slices.Equal(keys, want) {
		t.Errorf("caches %q, want %q", keys, want)
	}
	cached := webtest.Eval[int](p, `caches.open("fieldfit-shell-`+b.Version+`").then(c => c.keys()).then(k => k.length)`)
	if want := len(b.Files) - 1; cached != want { // all but sw.js
		t.Errorf("%d files cached, want %d", cached, want)
	}

	srv.Close()
	before := len(p.Requests())
	p.Reload()
	p.WaitRunning()
	if got := strings.TrimSpace(p.Text("#app-version")); got != b.Version {
		t.Errorf("offline: #app-version %q, want %q", got, b.Version)
	}
	if n := len(p.Requests()) - before; n == 0 {
		t.Errorf("the reload made no requests at all; the test did not exercise the service worker")
	}
	p.Shot("offline")
	p.NoErrors()
	p.NoForeignRequests(srv.URL)
}

// TestUpdate serves a new release on the same origin and checks that the
// page offers it, takes it on request, and that the old cache is gone.
func TestUpdate(t *testing.T) {
	skipShort(t)
	v1 := webtest.App(t)
	wasm, _ := v1.File(bundle.WasmFile)
	exec, _ := v1.File(bundle.WasmExecFile)
	shell := fstest.MapFS{"release-note.txt": {Data: []byte("a later release\n")}}
	err := fs.WalkDir(static.FS, ".", func(p string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		data, err := fs.ReadFile(static.FS, p)
		shell[p] = &fstest.MapFile{Data: data}
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	for name, data := range extraFor(t, v1) {
		shell[name] = &fstest.MapFile{Data: data}
	}
	v2, err := bundle.Assemble(wasm.Data, exec.Data, shell)
	if err != nil {
		t.Fatal(err)
	}
	if v2.Version == v1.Version {
		t.Fatal("the second release has the version of the first")
	}

	srv := webtest.Serve(t, v1)
	p := webtest.Open(t)
	p.Navigate(srv.URL + "/")
	p.WaitRunning()
	p.WaitFor(`navigator.serviceWorker.controller !== null`, "the first release's service worker did not take control")
	if webtest.Eval[bool](p, `!document.getElementById("update-ready").hidden`) {
		t.Errorf("the first install showed an update notice")
	}

	srv.Swap(v2)
	webtest.Eval[chromedp.Void](p, `navigator.serviceWorker.getRegistration().then(r => r.update())`)
	p.WaitFor(`!document.getElementById("update-ready").hidden`, "no update notice for the new release")
	p.Shot("update-ready")
	p.Do(chromedp.Click(chromedp.ID("update-reload")))
	p.WaitFor(`document.getElementById("app-version") && document.getElementById("app-version").textContent.trim() === "`+v2.Version+`"`,
		"the page did not reload into the new release")
	p.WaitRunning()
	p.WaitFor(`caches.keys().then(k => k.length === 1 && k[0] === "fieldfit-shell-`+v2.Version+`")`, "the old release's cache lingers")
	p.NoErrors()
	p.NoForeignRequests(srv.URL)
}

// extraFor returns the extra files (the screens' style sheets) that a
// bundle carries beyond the shell and the generated files.
func extraFor(t *testing.T, b *bundle.Bundle) map[string][]byte {
	t.Helper()
	shellNames := map[string]bool{bundle.WasmFile: true, bundle.WasmExecFile: true}
	for name := range bundle.Icons() {
		shellNames[name] = true
	}
	fs.WalkDir(static.FS, ".", func(p string, d fs.DirEntry, err error) error {
		shellNames[p] = true
		return nil
	})
	out := map[string][]byte{}
	for _, f := range b.Files {
		if !shellNames[f.Name] {
			out[f.Name] = f.Data
		}
	}
	return out
}

// TestFallbacks removes WebAssembly, then the service worker, before the
// page's scripts run, and checks that the page says so plainly.
func TestFallbacks(t *testing.T) {
	skipShort(t)
	b := webtest.App(t)
	t.Run("no WebAssembly", func(t *testing.T) {
		srv := webtest.Serve(t, b)
		p := webtest.Open(t)
		p.BeforeLoad(`delete window.WebAssembly;`)
		p.Navigate(srv.URL + "/")
		p.WaitFor(`document.documentElement.dataset.fieldfit === "failed"`, "no failure state without WebAssembly")
		msg := p.Text("#load-error")
		if !strings.Contains(msg, "cannot run WebAssembly") || !webtest.Eval[bool](p, `document.getElementById("loading").hidden`) {
			t.Errorf("without WebAssembly the page says %q", msg)
		}
		p.Shot("no-wasm")
		p.NoErrors()
	})
	t.Run("no service worker", func(t *testing.T) {
		srv := webtest.Serve(t, b)
		p := webtest.Open(t)
		p.BeforeLoad(`delete Navigator.prototype.serviceWorker;`)
		p.Navigate(srv.URL + "/")
		p.WaitRunning()
		p.WaitFor(`!document.getElementById("offline-note").hidden`, "no notice without a service worker")
		p.WaitFor(`document.getElementById("loading").hidden`, "the app did not render without a service worker")
		if msg := p.Text("#offline-note"); !strings.Contains(msg, "Offline use is not available") {
			t.Errorf("without a service worker the page says %q", msg)
		}
		p.Shot("no-sw")
		p.NoErrors()
	})
}

// TestIndexedDB runs the storage probe: the store checks against the real
// IndexedDB, then a reload to see a record survive.
func TestIndexedDB(t *testing.T) {
	skipShort(t)
	b := webtest.Probe(t)
	srv := webtest.Serve(t, b)
	p := webtest.Open(t)
	type check struct {
		Name   string `json:"name"`
		OK     bool   `json:"ok"`
		Detail string `json:"detail"`
	}
	results := func() map[string]check {
		t.Helper()
		p.WaitFor(`document.documentElement.dataset.probe === "done"`, "the probe did not finish")
		raw := webtest.Eval[string](p, `JSON.stringify([...document.querySelectorAll("#probe-results li")].map(li => ({name: li.dataset.check, ok: li.dataset.ok === "true", detail: li.textContent})))`)
		var list []check
		if err := json.Unmarshal([]byte(raw), &list); err != nil {
			t.Fatal(err)
		}
		out := map[string]check{}
		for _, c := range list {
			out[c.Name] = c
			if !c.OK {
				t.Errorf("probe: %s", c.Detail)
			} else {
				t.Logf("probe: %s", c.Detail)
			}
		}
		for _, want := range []string{"conformance", "persist", "migrate", "migrate-atomic", "too-new", "bad-record", "blocked", "unavailable"} {
			if _, ok := out[want]; !ok {
				t.Errorf("probe: no result for %s", want)
			}
		}
		return out
	}
	p.Navigate(srv.URL + "/")
	first := results()
	if got := first["persist"].Detail; got != "persist: written rev 1" {
		t.Errorf("first load: %q, want a fresh write", got)
	}
	p.Shot("probe")
	p.Reload()
	second := results()
	if got := second["persist"].Detail; got != "persist: found, now rev 2" {
		t.Errorf("after reload: %q, want the record of the first load", got)
	}
	p.NoErrors()
	p.NoForeignRequests(srv.URL)
}

// BenchmarkColdStart measures a start of the app with the service worker
// warm: a reload, timed in the page from navigation start (performance.now)
// to the moment the project list accepts a tap (#new-project is in the
// document). The README records the figure; nothing asserts it.
//
//	go test ./web -run X -bench ColdStart -benchtime 10x
func BenchmarkColdStart(b *testing.B) {
	bun := webtest.App(b)
	srv := webtest.Serve(b, bun)
	p := webtest.Open(b)
	p.Navigate(srv.URL + "/")
	p.WaitRunning()
	p.WaitFor(`navigator.serviceWorker.controller !== null && document.documentElement.dataset.sw === "ready"`,
		"the service worker did not take control")
	const ready = `new Promise(resolve => {
		const done = () => document.getElementById("new-project") !== null;
		if (done()) { resolve(performance.now()); return; }
		new MutationObserver((_, obs) => { if (done()) { obs.disconnect(); resolve(performance.now()); } })
			.observe(document.documentElement, {childList: true, subtree: true});
	})`
	total := 0.0
	b.ResetTimer()
	for b.Loop() {
		p.Reload()
		total += webtest.Eval[float64](p, ready)
	}
	b.ReportMetric(total/float64(b.N), "ms-to-list")
	b.ReportMetric(0, "ns/op")
}
