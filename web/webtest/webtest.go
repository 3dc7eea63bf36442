// Package webtest runs Fieldfit's browser tests: it builds a bundle once
// per test binary, serves it from a fresh 127.0.0.1 origin, and drives
// Debian's headless Chromium through chromedp, collecting what a test
// asserts on — console errors and uncaught exceptions, the URL of every
// request the page makes, and screenshots.
//
// A test gets a Page with Open, which skips when /usr/bin/chromium is
// missing (and fails instead when the environment variable CI is set):
//
//	func TestSomething(t *testing.T) {
//		srv := webtest.Serve(t, webtest.App(t))
//		p := webtest.Open(t)
//		p.Navigate(srv.URL)
//		p.WaitRunning()
//		p.Shot("start")
//		p.NoErrors()
//		p.NoForeignRequests(srv.URL)
//	}
package webtest

import (
	"context"
	"errors"
	"fmt"
	"net/http"
	"net/http/httptest"
	"net/url"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/network"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/cdproto/storage"
	"github.com/chromedp/chromedp"

	"fieldfit/web/bundle"
)

// Chromium is the browser the tests drive: Debian's package "chromium".
const Chromium = "/usr/bin/chromium"

// Timeout bounds each step of a Page (a navigation, a wait, an evaluation).
// If Timeout is 0, it is defaulted to 30 s.
var Timeout time.Duration

func timeout() time.Duration {
	if Timeout == 0 {
		return 30 * time.Second
	}
	return Timeout
}

// Bundles are built once per test binary and package path.
var (
	buildMu sync.Mutex
	builds  = map[string]*buildResult{}
)

type buildResult struct {
	once sync.Once
	b    *bundle.Bundle
	err  error
}

// Build returns the bundle of the WebAssembly main package pkg (relative to
// the module root, such as "./wasm"), with the extra files of the app (see
// AppExtra). It compiles once per test binary and package; later calls
// return the same bundle. A failed build fails the test.
func Build(t testing.TB, pkg string) *bundle.Bundle {
	t.Helper()
	buildMu.Lock()
	r, ok := builds[pkg]
	if !ok {
		r = &buildResult{}
		builds[pkg] = r
	}
	buildMu.Unlock()
	r.once.Do(func() {
		ctx, cancel := context.WithTimeout(context.Background(), 5*time.Minute)
		defer cancel()
		start := time.Now()
		r.b, r.err = bundle.Build(ctx, bundle.Options{Package: pkg, Extra: AppExtra})
		if r.err == nil {
			raw, gz := r.b.Size()
			t.Logf("webtest: built %s as bundle %s in %.1f s (compile %.1f s): %d bytes, %d gzipped",
				pkg, r.b.Version, time.Since(start).Seconds(), r.b.Compile.Seconds(), raw, gz)
		}
	})
	if r.err != nil {
		t.Fatalf("webtest: building %s: %v", pkg, r.err)
	}
	return r.b
}

// AppExtra are the files of other packages that the app's page needs, as
// `go run ./web` adds them.
var AppExtra = []string{"ui/screens.css", "ui/report.css"}

// App returns the bundle of the app, ./wasm, built once per test binary.
func App(t testing.TB) *bundle.Bundle { return Build(t, "./wasm") }

// Probe returns the bundle of the storage probe (testdata/storeprobe of
// this package), a program that runs the store checks against the real
// IndexedDB and lists the outcome in the page.
func Probe(t testing.TB) *bundle.Bundle { return Build(t, "./web/webtest/testdata/storeprobe") }

// Server serves bundles on 127.0.0.1 at a port of its own, so that each
// test starts with an origin that has no stored data and no service
// worker. It is closed when the test ends.
type Server struct {
	*httptest.Server
	mu       sync.Mutex
	h        http.Handler
	requests []string
}

// Serve starts a Server for b.
func Serve(t testing.TB, b *bundle.Bundle) *Server {
	t.Helper()
	s := &Server{h: b.Handler()}
	s.Server = httptest.NewServer(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		s.mu.Lock()
		s.requests = append(s.requests, r.URL.Path)
		h := s.h
		s.mu.Unlock()
		h.ServeHTTP(w, r)
	}))
	t.Cleanup(s.Close)
	return s
}

// Swap makes the server serve b from now on, as a new release on the same
// origin would.
func (s *Server) Swap(b *bundle.Bundle) {
	s.mu.Lock()
	defer s.mu.Unlock()
	s.h = b.Handler()
}

// Requests returns the paths the server was asked for, in order.
func (s *Server) Requests() []string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return slices.Clone(s.requests)
}

// Viewport is a screen size in CSS pixels.
type Viewport struct {
	Name          string
	Width, Height int64
	Mobile        bool // emulate a touch device with a mobile viewport
}

// The sizes the screens are checked at.
var (
	Tablet = Viewport{Name: "tablet-768x1024", Width: 768, Height: 1024, Mobile: true}
	Laptop = Viewport{Name: "laptop-1280x800", Width: 1280, Height: 800}
	Phone  = Viewport{Name: "phone-390x844", Width: 390, Height: 844, Mobile: true}
)

// Viewports lists Tablet, Laptop and Phone.
var Viewports = []Viewport{Tablet, Laptop, Phone}

// Page is one tab of a headless Chromium with a fresh profile.
type Page struct {
	T   testing.TB
	Ctx context.Context // the chromedp context of the tab; no deadline

	mu       sync.Mutex
	console  []chromedp.ConsoleMessage
	requests []string
}

// RequireChromium skips the test when Chromium is missing, or fails it
// when the environment variable CI is set: CI must not skip browser tests.
func RequireChromium(t testing.TB) {
	t.Helper()
	if _, err := os.Stat(Chromium); err != nil {
		if os.Getenv("CI") != "" {
			t.Fatalf("webtest: %s is missing, and CI is set, so the browser tests cannot be skipped: install Debian's chromium package (%v)", Chromium, err)
		}
		t.Skipf("webtest: %s is missing; install Debian's chromium package to run the browser tests (%v)", Chromium, err)
	}
}

// Open starts Chromium with a fresh user-data folder and opens a tab, at
// the Laptop size. Everything is closed when the test ends.
func Open(t testing.TB) *Page {
	t.Helper()
	RequireChromium(t)
	profile, err := os.MkdirTemp("", "fieldfit-chromium-")
	if err != nil {
		t.Fatal(err)
	}
	opts := []chromedp.ExecAllocatorOption{
		chromedp.ExecPath(Chromium),
		chromedp.UserDataDir(profile),
		chromedp.Flag("headless", true),
		chromedp.Flag("no-sandbox", true),
		chromedp.Flag("disable-gpu", true),
		chromedp.Flag("disable-quic", true),
		chromedp.Flag("no-first-run", true),
		chromedp.Flag("no-default-browser-check", true),
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("disable-dev-shm-usage", true),
		chromedp.Flag("disable-extensions", true),
		chromedp.Flag("disable-default-apps", true),
		chromedp.Flag("mute-audio", true),
		chromedp.Flag("hide-scrollbars", true),
		chromedp.Flag("password-store", "basic"),
		// Everything but loopback goes to a closed port: nothing leaves
		// the machine, whatever the page tries.
		chromedp.ProxyServer("127.0.0.1:9"),
		chromedp.WindowSize(int(Laptop.Width), int(Laptop.Height)),
	}
	actx, acancel := chromedp.NewExecAllocator(context.Background(), opts...)
	ctx, cancel := chromedp.NewContext(actx)
	t.Cleanup(func() {
		cancel()
		acancel() // waits for the browser to exit
		removeAll(profile)
	})
	p := &Page{T: t, Ctx: ctx}
	start, scancel := context.WithTimeout(context.Background(), timeout())
	defer scancel()
	done := make(chan error, 1)
	go func() { done <- chromedp.Do(ctx) }() // starts the browser, with no deadline on its life
	select {
	case err := <-done:
		if err != nil {
			t.Fatalf("webtest: starting %s: %v", Chromium, err)
		}
	case <-start.Done():
		t.Fatalf("webtest: %s did not start within %v", Chromium, timeout())
	}

	p.listen()
	return p
}

// NewTab opens another tab of the same browser (same profile, so the
// same IndexedDB and BroadcastChannel), closed when the test ends.
func (p *Page) NewTab() *Page {
	p.T.Helper()
	ctx, cancel := chromedp.NewContext(p.Ctx)
	p.T.Cleanup(cancel)
	q := &Page{T: p.T, Ctx: ctx}
	start, scancel := context.WithTimeout(context.Background(), timeout())
	defer scancel()
	done := make(chan error, 1)
	go func() { done <- chromedp.Do(ctx) }()
	select {
	case err := <-done:
		if err != nil {
			p.T.Fatalf("webtest: opening a tab: %v", err)
		}
	case <-start.Done():
		p.T.Fatalf("webtest: a new tab did not open within %v", timeout())
	}
	q.listen()
	return q
}

// listen collects the tab's console messages and requests.
func (p *Page) listen() {
	ctx := p.Ctx
	console := chromedp.Console(ctx)
	requests := chromedp.Events(ctx, network.RequestWillBeSent)
	go func() {
		for m, err := range console {
			if err != nil {
				return
			}
			p.mu.Lock()
			p.console = append(p.console, m)
			p.mu.Unlock()
		}
	}()
	go func() {
		for ev, err := range requests {
			if err != nil {
				return
			}
			p.mu.Lock()
			p.requests = append(p.requests, ev.Request.URL)
			p.mu.Unlock()
		}
	}()
}

// removeAll removes the profile folder, retrying while the browser's last
// writes finish.
func removeAll(dir string) {
	for range 20 {
		if err := os.RemoveAll(dir); err == nil {
			return
		}
		time.Sleep(100 * time.Millisecond)
	}
}

// step returns a context for one step.
func (p *Page) step() (context.Context, context.CancelFunc) {
	return context.WithTimeout(p.Ctx, timeout())
}

// Do runs actions, failing the test on an error.
func (p *Page) Do(actions ...chromedp.Action[chromedp.Void]) {
	p.T.Helper()
	ctx, cancel := p.step()
	defer cancel()
	if err := chromedp.Do(ctx, actions...); err != nil {
		p.T.Fatalf("webtest: %v", err)
	}
}

// Navigate loads url and waits for its load event.
func (p *Page) Navigate(url string) {
	p.T.Helper()
	p.Do(chromedp.Navigate(url))
}

// Reload reloads the page and waits for its load event.
func (p *Page) Reload() {
	p.T.Helper()
	p.Do(chromedp.Reload())
}

// Eval evaluates a JavaScript expression in the page and returns its value
// decoded into T; a promise is awaited.
func Eval[T any](p *Page, expr string) T {
	p.T.Helper()
	ctx, cancel := p.step()
	defer cancel()
	v, err := chromedp.Run(ctx, chromedp.Evaluate[T](expr, chromedp.EvalAwaitPromise))
	if err != nil {
		p.T.Fatalf("webtest: evaluating %s: %v", expr, err)
	}
	return v
}

// WaitFor evaluates a JavaScript expression every 50 ms until it is
// truthy, failing the test after Timeout with msg and the page's console
// errors. Evaluations that fail while the page navigates are retried.
func (p *Page) WaitFor(expr, msg string) {
	p.T.Helper()
	ctx, cancel := p.step()
	defer cancel()
	var last error
	for {
		ok, err := chromedp.Run(ctx, chromedp.Evaluate[bool]("!!("+expr+")"))
		if err == nil && ok {
			return
		}
		if err != nil {
			last = err
		}
		select {
		case <-ctx.Done():
			p.T.Fatalf("webtest: %s (waited %v for %s; last error %v); console errors: %q", msg, timeout(), expr, last, p.Errors())
		case <-time.After(50 * time.Millisecond):
		}
	}
}

// BeforeLoad runs a script in every document the tab loads from now on,
// before the page's own scripts, as a browser quirk or a missing feature
// would be there before them.
func (p *Page) BeforeLoad(script string) {
	p.T.Helper()
	ctx, cancel := p.step()
	defer cancel()
	if _, err := chromedp.Call(ctx, page.AddScriptToEvaluateOnNewDocument, page.AddScriptToEvaluateOnNewDocumentParams{Source: script}); err != nil {
		p.T.Fatalf("webtest: %v", err)
	}
}

// SetQuota sets the storage quota of origin to bytes, as a nearly full
// device has it (Storage.overrideQuotaForOrigin); bytes < 0 gives back
// the browser's own quota.
func (p *Page) SetQuota(origin string, bytes float64) {
	p.T.Helper()
	ctx, cancel := p.step()
	defer cancel()
	params := storage.OverrideQuotaForOriginParams{Origin: origin}
	if bytes >= 0 {
		params.QuotaSize = &bytes
	}
	if _, err := chromedp.Call(ctx, storage.OverrideQuotaForOrigin, params); err != nil {
		p.T.Fatalf("webtest: setting the storage quota: %v", err)
	}
}

// NavigateResponse loads url and returns the browser's view of the
// response (status, headers).
func (p *Page) NavigateResponse(url string) *network.Response {
	p.T.Helper()
	ctx, cancel := p.step()
	defer cancel()
	resp, err := chromedp.Run(ctx, chromedp.NavigateResponse(url))
	if err != nil {
		p.T.Fatalf("webtest: %v", err)
	}
	return resp
}

// WaitRunning waits until the loader reports that the WebAssembly program
// has started (data-fieldfit="running" on <html>), failing on "failed".
func (p *Page) WaitRunning() {
	p.T.Helper()
	p.WaitFor(`["running","failed","exited"].includes(document.documentElement.dataset.fieldfit)`, "the program did not start")
	if s := Eval[string](p, `document.documentElement.dataset.fieldfit`); s != "running" {
		msg := Eval[string](p, `(document.getElementById("load-error")||{}).textContent||""`)
		p.T.Fatalf("webtest: the page says %q: %s; console errors: %q", s, msg, p.Errors())
	}
}

// Text returns the text content of the first element matching a CSS
// selector, failing the test when there is none.
func (p *Page) Text(css string) string {
	p.T.Helper()
	ctx, cancel := p.step()
	defer cancel()
	s, err := chromedp.Run(ctx, chromedp.TextContent(chromedp.CSS(css)))
	if err != nil {
		p.T.Fatalf("webtest: text of %s: %v", css, err)
	}
	return s
}

// SetViewport sets the page's size (and touch emulation for a Mobile one).
func (p *Page) SetViewport(v Viewport) {
	p.T.Helper()
	var opts []chromedp.EmulateViewportOption
	if v.Mobile {
		opts = append(opts, chromedp.EmulateMobile, chromedp.EmulateTouch)
	}
	p.Do(chromedp.EmulateViewport(v.Width, v.Height, opts...))
}

// Messages returns the console messages so far.
func (p *Page) Messages() []chromedp.ConsoleMessage {
	p.mu.Lock()
	defer p.mu.Unlock()
	return slices.Clone(p.console)
}

// goCrash matches what a Go program prints (through console.log) when it
// panics or dies.
var goCrash = regexp.MustCompile(`^(panic: |fatal error: |goroutine \d+ \[)`)

// Errors returns the console errors, uncaught exceptions and Go crash
// output so far, as text.
func (p *Page) Errors() []string {
	var out []string
	for _, m := range p.Messages() {
		if m.Type == chromedp.ConsoleError || m.IsException() || goCrash.MatchString(m.Text) {
			s := string(m.Type) + ": " + m.Text
			if m.URL != "" {
				s += fmt.Sprintf(" (%s:%d)", m.URL, m.Line+1)
			}
			out = append(out, s)
		}
	}
	return out
}

// NoErrors fails the test for each console error, exception or crash.
func (p *Page) NoErrors() {
	p.T.Helper()
	for _, e := range p.Errors() {
		p.T.Errorf("webtest: console: %s", e)
	}
}

// Requests returns the URL of every request the page has made so far (as
// the page's network layer saw them, including those a service worker
// answered).
func (p *Page) Requests() []string {
	p.mu.Lock()
	defer p.mu.Unlock()
	return slices.Clone(p.requests)
}

// Foreign returns the requests that leave origin (such as
// "http://127.0.0.1:41234"): any URL but those of the origin, data: URLs,
// blob: URLs of the origin and about:blank.
func (p *Page) Foreign(origin string) []string {
	var out []string
	for _, u := range p.Requests() {
		if !sameOrigin(u, origin) {
			out = append(out, u)
		}
	}
	return out
}

func sameOrigin(raw, origin string) bool {
	switch {
	case raw == "about:blank", strings.HasPrefix(raw, "data:"):
		return true
	case strings.HasPrefix(raw, "blob:"):
		raw = strings.TrimPrefix(raw, "blob:")
	}
	u, err := url.Parse(raw)
	o, err2 := url.Parse(origin)
	if err != nil || err2 != nil {
		return false
	}
	return u.Scheme == o.Scheme && u.Host == o.Host
}

// NoForeignRequests fails the test for each request that left origin.
func (p *Page) NoForeignRequests(origin string) {
	p.T.Helper()
	for _, u := range p.Foreign(origin) {
		p.T.Errorf("webtest: a request left the origin %s: %s", origin, u)
	}
}

// ShotsDir returns the folder for screenshots: $FIELDFIT_SHOTS, or
// fieldfit-screenshots in the system's temporary folder.
func ShotsDir() string {
	if d := os.Getenv("FIELDFIT_SHOTS"); d != "" {
		return d
	}
	return filepath.Join(os.TempDir(), "fieldfit-screenshots")
}

var unsafeName = regexp.MustCompile(`[^A-Za-z0-9._-]+`)

// Shot saves a PNG of the viewport as ShotsDir()/<test>-<name>.png, logs
// its path and returns it.
func (p *Page) Shot(name string) string {
	p.T.Helper()
	ctx, cancel := p.step()
	defer cancel()
	png, err := chromedp.Run(ctx, chromedp.CaptureScreenshot())
	if err != nil {
		p.T.Fatalf("webtest: screenshot %s: %v", name, err)
	}
	dir := ShotsDir()
	if err := os.MkdirAll(dir, 0o755); err != nil {
		p.T.Fatal(err)
	}
	file := filepath.Join(dir, unsafeName.ReplaceAllString(p.T.Name()+"-"+name, "_")+".png")
	if err := os.WriteFile(file, png, 0o644); err != nil {
		p.T.Fatal(err)
	}
	p.T.Logf("webtest: screenshot %s", file)
	return file
}

// ShotAll saves one screenshot per viewport of Viewports and returns the
// paths, leaving the page at the last size.
func (p *Page) ShotAll(name string) []string {
	p.T.Helper()
	var files []string
	for _, v := range Viewports {
		p.SetViewport(v)
		files = append(files, p.Shot(name+"-"+v.Name))
	}
	return files
}

// ErrNoChromium is what Available reports when Chromium is missing.
var ErrNoChromium = errors.New("webtest: " + Chromium + " is missing")

// Available reports whether the browser tests can run here.
func Available() error {
	if _, err := os.Stat(Chromium); err != nil {
		return fmt.Errorf("%w: %v", ErrNoChromium, err)
	}
	return nil
}
