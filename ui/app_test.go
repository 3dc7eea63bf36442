package ui

import (
	"context"
	"errors"
	"fmt"
	"go/build/constraint"
	"go/parser"
	"go/token"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"testing"

	"fieldfit/models"
	"fieldfit/ui/project"
	"fieldfit/ui/store"
	v "fieldfit/ui/view"
)

func TestListLifecycle(t *testing.T) {
	h := newHarness(t, nil)
	// Empty device: the example is offered.
	h.byID("demo-project")
	h.click("new-project")
	if h.app.Screen() != ProjectScreen || h.app.TakeFocus() != "project-name" {
		t.Fatal("new project did not open with the name focused")
	}
	h.input("project-name", "Tern Lake bore field")
	id := h.app.Current().ID
	if got := h.stored(id).Name; got != "Tern Lake bore field" {
		t.Fatalf("stored name %q", got)
	}
	h.click("back-to-list")

	// Rename in the list.
	li := h.listItem("Tern Lake bore field")
	action(li, "rename").Fire("click", nil)
	h.settle()
	h.input("rename-input", "Tern Lake bores")
	h.click("rename-save")
	if got := h.stored(id).Name; got != "Tern Lake bores" {
		t.Fatalf("renamed to %q", got)
	}
	if h.render().ByID("demo-project") != nil {
		t.Error("example still offered on a device with projects")
	}

	// Duplicate.
	action(h.listItem("Tern Lake bores"), "duplicate").Fire("click", nil)
	h.settle()
	dup := h.listItem("Tern Lake bores (copy)")
	dupID := dup.Attrs["data-project-id"]
	if dupID == id || dupID == "" {
		t.Fatalf("duplicate id %q", dupID)
	}

	// Delete asks first; Keep keeps.
	action(dup, "delete").Fire("click", nil)
	h.settle()
	h.click("cancel-delete")
	h.listItem("Tern Lake bores (copy)")
	action(h.listItem("Tern Lake bores (copy)"), "delete").Fire("click", nil)
	h.settle()
	h.click("confirm-delete")
	if _, err := h.st.Get(context.Background(), dupID); !errors.Is(err, store.ErrNotFound) {
		t.Fatalf("deleted project still stored: %v", err)
	}
	if n := h.render().Find(func(n *v.Node) bool { return n.Attrs["data-project-id"] == dupID }); n != nil {
		t.Fatal("deleted project still listed")
	}
	// Undo within the window brings it back whole.
	h.click("undo-delete")
	if got := h.stored(dupID).Name; got != "Tern Lake bores (copy)" {
		t.Fatalf("restored name %q", got)
	}
	h.listItem("Tern Lake bores (copy)")

	// After the undo window the project is gone for good.
	action(h.listItem("Tern Lake bores (copy)"), "delete").Fire("click", nil)
	h.settle()
	h.click("confirm-delete")
	h.byID("undo-delete")
	h.ts.fire(UndoWindow)
	h.settle()
	if h.render().ByID("undo-delete") != nil {
		t.Error("undo offered after the window")
	}
	if len(h.app.List()) != 1 {
		t.Errorf("list = %+v", h.app.List())
	}
}

// fieldSession enters the scripted test of the browser test: a pumping
// well, an observation well at 25 m, the test and 25 readings.
func fieldSession(h *harness) {
	h.t.Helper()
	h.click("new-project")
	h.input("project-name", "Scripted session")
	h.input("aquifer-b", "18")
	h.click("tab-wells")
	h.click("add-pumping-well")
	h.input("well-0-radius", "0.1")
	h.click("add-observation-well")
	h.input("well-1-distance", "25")
	h.click("tab-test")
	h.input("test-rate", "7.5")
	h.input("test-static", "5.12")
	h.click("tab-readings")
	for i, r := range sessionReadings {
		h.input(fmt.Sprintf("r-%d-time", i), r[0])
		h.input(fmt.Sprintf("r-%d-depth", i), r[1])
	}
}

func TestFieldSession(t *testing.T) {
	h := newHarness(t, nil)
	fieldSession(h)
	p := h.app.Current()
	test := p.Tests[0]
	if len(test.Readings) != len(sessionReadings) {
		t.Fatalf("%d readings", len(test.Readings))
	}
	// Drawdown shown at once in the row: depth − static.
	if got := h.text("r-0-dd"); got != "0.260" {
		t.Errorf("row 1 drawdown %q, want 0.260 (5.380 − 5.12)", got)
	}
	if o := p.Well(test.ObservationWell); o == nil || o.Kind != project.Observation || o.Distance.SI != 25 {
		t.Fatalf("observation well = %+v", o)
	}
	// The automatic fit has run.
	h.click("tab-fit")
	if test := h.app.Current().Tests[0]; test.Result == nil {
		t.Fatalf("no fit result; status %q", h.text("fit-status"))
	}
	// The figures on the page are those of models.Fit on the same data.
	times, dd := sessionData()
	ref, err := models.Fit(models.Theis{Q: 7.5e-3, R: 25}, models.Data{Time: times, Value: dd}, nil)
	if err != nil {
		t.Fatal(err)
	}
	wantT := ref.Params[0] * 86400 // m²/s → m²/d (1 d = 86400 s, exact)
	gotT, _ := strconv.ParseFloat(h.byID("result-T").Attrs["data-value"], 64)
	if math.Abs(gotT-wantT) > 1e-6*wantT {
		t.Errorf("T on page %v m²/d, models.Fit %v", gotT, wantT)
	}
	gotS, _ := strconv.ParseFloat(h.byID("result-S").Attrs["data-value"], 64)
	if math.Abs(gotS-ref.Params[1]) > 1e-6*ref.Params[1] {
		t.Errorf("S on page %v, models.Fit %v", gotS, ref.Params[1])
	}
	// The invented data came from sessionT and sessionS: the fit finds
	// them within its 95 % interval.
	est, _ := ref.Estimate("T")
	if !(est.Lower <= sessionT && sessionT <= est.Upper) {
		t.Errorf("T interval %v–%v misses the generating %v", est.Lower, est.Upper, sessionT)
	}
	for _, id := range []string{"result-T", "result-S", "result-K", "result-rmse", "result-iterations", "result-cj", "caution"} {
		if strings.TrimSpace(h.text(id)) == "" {
			t.Errorf("#%s is empty", id)
		}
	}
	if !strings.Contains(h.text("result-T"), "m²/d (95 % CI") {
		t.Errorf("result-T text %q lacks unit or CI", h.text("result-T"))
	}
	wantK := wantT / 18
	gotK, _ := strconv.ParseFloat(h.byID("result-K").Attrs["data-value"], 64)
	if math.Abs(gotK-wantK) > 1e-6*wantK {
		t.Errorf("K = %v m/d, want T/b = %v", gotK, wantK)
	}
	if !strings.Contains(h.text("caution"), "licensed hydrogeologist") {
		t.Error("caution missing")
	}
	for _, id := range []string{"plot-loglog", "plot-semilog", "plot-residuals"} {
		if n := h.byID(id); n.Tag != "svg" {
			t.Errorf("#%s is a %s", id, n.Tag)
		}
	}
	// Everything is saved.
	st := h.stored(p.ID)
	if len(st.Tests[0].Readings) != 25 || st.Tests[0].Result == nil {
		t.Errorf("stored project incomplete: %d readings, result %v", len(st.Tests[0].Readings), st.Tests[0].Result)
	}

	// Cooper–Jacob on a late window: a straight-line fit with validity.
	h.input("fit-model", "cooper-jacob")
	h.input("window-start", "30")
	r := h.app.Current().Tests[0].Result
	if r.Model != project.CooperJacob || r.N >= 25 {
		t.Errorf("Cooper–Jacob result model %q on %d readings", r.Model, r.N)
	}
	if !strings.Contains(h.text("result-cj"), "min") {
		t.Errorf("result-cj %q", h.text("result-cj"))
	}
}

func TestBadEntriesKeepText(t *testing.T) {
	h := newHarness(t, nil)
	fieldSession(h)
	h.input("r-3-depth", "5,4x")
	h.input("r-5-time", "3")
	h.input("r-8-depth", "4.9")
	if got := h.byID("r-3-depth").Attrs["value"]; got != "5,4x" {
		t.Errorf("typed text replaced by %q", got)
	}
	for id, want := range map[string]string{
		"r-3-msg": `Depth "5,4x" is not a number.`,
		"r-5-msg": "not after the row above",
		"r-8-msg": "Negative drawdown",
	} {
		if got := h.text(id); !strings.Contains(got, want) {
			t.Errorf("#%s = %q, want %q", id, got, want)
		}
	}
	if got := h.stored(h.app.Current().ID).Tests[0].Readings[3].DepthText; got != "5,4x" {
		t.Errorf("stored text %q", got)
	}
	h.click("tab-wells")
	h.input("well-1-distance", "2S")
	if got := h.text("well-1-distance-msg"); !strings.Contains(got, `"2S" is not a number`) {
		t.Errorf("well message %q", got)
	}
	h.click("tab-fit")
	if got := h.text("fit-status"); !strings.Contains(got, "distance") {
		t.Errorf("fit status %q should ask for the distance", got)
	}
}

func TestEnterAndPaste(t *testing.T) {
	h := newHarness(t, nil)
	h.click("new-project")
	h.click("tab-readings")
	h.byID("r-0-time").Fire("keydown", &v.Event{Key: "Enter"})
	if f := h.app.TakeFocus(); f != "r-0-depth" {
		t.Errorf("Enter in time focuses %q", f)
	}
	h.byID("r-0-depth").Fire("keydown", &v.Event{Key: "Enter"})
	if f := h.app.TakeFocus(); f != "r-1-time" {
		t.Errorf("Enter in depth focuses %q", f)
	}
	e := &v.Event{Pasted: "1\t7.5\n2\t7.6\n3\t7.7"}
	h.byID("r-0-time").Fire("paste", e)
	h.settle()
	if !e.Prevent || len(h.app.Current().Tests[0].Readings) != 3 {
		t.Fatalf("paste: prevented %v, readings %+v", e.Prevent, h.app.Current().Tests[0].Readings)
	}
	if !strings.Contains(h.text("notice"), "Pasted 3 rows") {
		t.Errorf("notice %q", h.text("notice"))
	}
	// A single value pastes as usual, into the one input.
	e = &v.Event{Pasted: "7.8"}
	h.byID("r-3-time").Fire("paste", e)
	if e.Prevent {
		t.Error("single value paste was taken over")
	}
}

func TestDemoProject(t *testing.T) {
	h := newHarness(t, nil)
	h.click("demo-project")
	p := h.app.Current()
	if p == nil || !p.Demo || h.app.Tab() != TabFit {
		t.Fatalf("example not opened on the fit tab: %+v", p)
	}
	r := p.Tests[0].Result
	if r == nil || len(p.Tests[0].Readings) != 25 {
		t.Fatal("example not fitted or not 25 readings")
	}
	// The fit finds the invented parameters within its intervals.
	if !(r.T.Lower <= demoT && demoT <= r.T.Upper && r.S.Lower <= demoS && demoS <= r.S.Upper) {
		t.Errorf("T %v (%v–%v), S %v (%v–%v) miss %v, %v", r.T.Value, r.T.Lower, r.T.Upper, r.S.Value, r.S.Lower, r.S.Upper, demoT, demoS)
	}
	for _, id := range []string{"result-T", "result-S", "result-K", "caution", "plot-loglog"} {
		h.byID(id)
	}
	// Deletable like any project.
	h.click("back-to-list")
	li := h.listItem(p.Name)
	action(li, "delete").Fire("click", nil)
	h.settle()
	h.click("confirm-delete")
	if len(h.app.List()) != 0 {
		t.Error("example not deleted")
	}
}

func TestUSCustomary(t *testing.T) {
	h := newHarness(t, nil)
	h.click("demo-project")
	h.click("tab-site")
	h.input("project-units", "us")
	// The thickness typed as 24 m shows as 78.7402 ft.
	if got := h.byID("aquifer-b").Attrs["value"]; got != "78.7402" {
		t.Errorf("thickness shown as %q ft, want 78.7402 (24 m / 0.3048 m/ft, exact foot)", got)
	}
	if got := h.render().Find(func(n *v.Node) bool { return n.Tag == "label" && n.Attrs["for"] == "aquifer-b" }).TextContent(); !strings.Contains(got, "(ft)") {
		t.Errorf("label %q", got)
	}
	h.click("tab-fit")
	r := h.app.Current().Tests[0].Result
	want := r.T.Value * 86400 / (0.3048 * 0.3048) // ft²/d; 1 ft = 0.3048 m exactly
	got, _ := strconv.ParseFloat(h.byID("result-T").Attrs["data-value"], 64)
	if math.Abs(got-want) > 1e-9*want || !strings.Contains(h.text("result-T"), "ft²/d") {
		t.Errorf("T shown %v %q, want %v ft²/d", got, h.text("result-T"), want)
	}
}

func TestAutosaveWithinASecond(t *testing.T) {
	if SaveDelay >= 1e9 {
		t.Fatalf("SaveDelay %v is not under a second", SaveDelay)
	}
	h := newHarness(t, nil)
	h.click("new-project")
	id := h.app.Current().ID
	h.byID("project-site").Fire("input", &v.Event{Value: "Quarry road"})
	// The save is scheduled at once, no later than SaveDelay.
	h.ts.mu.Lock()
	scheduled := false
	for _, tm := range h.ts.pending {
		if !tm.stopped && tm.d <= SaveDelay {
			scheduled = true
		}
	}
	h.ts.mu.Unlock()
	if !scheduled {
		t.Fatal("no save scheduled after an edit")
	}
	h.settle()
	if got := h.stored(id).Site; got != "Quarry road" {
		t.Errorf("stored site %q", got)
	}
}

// failingStore refuses writes with err while fail is set.
type failingStore struct {
	store.Store
	mu   sync.Mutex
	fail error
}

func (f *failingStore) Put(ctx context.Context, r store.Record) error {
	f.mu.Lock()
	err := f.fail
	f.mu.Unlock()
	if err != nil {
		return &store.Error{Op: "put", ID: r.ID, Err: err}
	}
	return f.Store.Put(ctx, r)
}

func TestStorageErrors(t *testing.T) {
	for _, sentinel := range []error{store.ErrQuota, store.ErrBlocked, store.ErrUnavailable} {
		t.Run(sentinel.Error()[:12], func(t *testing.T) {
			fs := &failingStore{Store: store.NewMemory()}
			h := newHarness(t, fs)
			h.click("new-project")
			fs.mu.Lock()
			fs.fail = sentinel
			fs.mu.Unlock()
			h.input("project-name", "Unsaved edits")
			msg := h.text("storage-status")
			if !strings.Contains(msg, "kept in memory") {
				t.Errorf("message %q", msg)
			}
			// The data stays in memory and can be exported.
			if h.app.Current().Name != "Unsaved edits" {
				t.Error("edit lost")
			}
			h.click("export-current-banner")
			data := <-h.dl
			p, err := project.Unmarshal(data)
			if err != nil || p.Name != "Unsaved edits" {
				t.Fatalf("export: %v %+v", err, p)
			}
			// Once the store works again the next change is saved and the
			// message goes.
			fs.mu.Lock()
			fs.fail = nil
			fs.mu.Unlock()
			h.input("project-site", "x")
			if h.render().ByID("storage-status") != nil {
				t.Error("message still shown after a good save")
			}
			if got := h.stored(p.ID).Name; got != "Unsaved edits" {
				t.Errorf("stored %q", got)
			}
		})
	}
	// A store that could not be opened at all: memory fallback, said so.
	a := NewApp(Options{Store: store.NewMemory(), StoreProblem: &store.Error{Op: "open", Err: store.ErrUnavailable}})
	if n := a.Render().ByID("storage-status"); n == nil || !strings.Contains(n.TextContent(), "private browsing") {
		t.Errorf("no message for an unavailable store")
	}
}

func TestUserTextIsText(t *testing.T) {
	const payload = `<img src=x onerror="document.title='pwned'">`
	h := newHarness(t, nil)
	h.click("new-project")
	h.input("project-name", payload)
	h.click("tab-wells")
	h.click("add-pumping-well")
	h.input("well-0-name", payload)
	if got := h.text("project-title"); got != payload {
		t.Errorf("title %q", got)
	}
	// The payload never becomes an element or an attribute name.
	h.render().Walk(func(n *v.Node) bool {
		if n.Tag == "img" {
			t.Error("an <img> element was made from user text")
		}
		for k := range n.Attrs {
			if strings.Contains(k, "onerror") {
				t.Error("an onerror attribute was made from user text")
			}
		}
		return true
	})
}

// TestBuildConstraints checks that every file of ui/ and wasm/ that
// imports syscall/js or the dom package carries //go:build js && wasm.
func TestBuildConstraints(t *testing.T) {
	var files []string
	for _, dir := range []string{".", "view", "project", "../wasm"} {
		m, _ := filepath.Glob(filepath.Join(dir, "*.go"))
		files = append(files, m...)
	}
	if len(files) < 10 {
		t.Fatalf("found only %d files", len(files))
	}
	for _, f := range files {
		af, err := parser.ParseFile(token.NewFileSet(), f, nil, parser.ImportsOnly|parser.ParseComments)
		if err != nil {
			t.Fatal(err)
		}
		browser := false
		for _, im := range af.Imports {
			if im.Path.Value == `"syscall/js"` || im.Path.Value == `"honnef.co/go/js/dom/v2"` {
				browser = true
			}
		}
		if !browser {
			continue
		}
		src, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		s := string(src)
		ok := false
		for _, line := range strings.Split(s, "\n") {
			if constraint.IsGoBuild(line) {
				expr, err := constraint.Parse(line)
				if err == nil && !expr.Eval(func(tag string) bool { return tag == "linux" || tag == "amd64" }) &&
					expr.Eval(func(tag string) bool { return tag == "js" || tag == "wasm" }) {
					ok = true
				}
			}
		}
		if !ok {
			t.Errorf("%s uses the browser without //go:build js && wasm", f)
		}
	}
}
