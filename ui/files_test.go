package ui

import (
	"context"
	"fmt"
	"reflect"
	"strings"
	"testing"
	"time"

	"fieldfit/ui/project"
	"fieldfit/ui/store"
	v "fieldfit/ui/view"
)

// storeDump returns every record of st, to compare before and after.
func storeDump(t *testing.T, st store.Store) []store.Record {
	t.Helper()
	rs, err := st.List(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	return rs
}

// makeProject creates a project with a well and a test of one reading
// through the screens and returns its ID.
func makeProject(h *harness, name string) string {
	h.click("new-project")
	h.input("project-name", name)
	h.click("tab-wells")
	h.click("add-observation-well")
	h.input("well-0-distance", "25")
	h.click("tab-readings")
	h.input("r-0-time", "1")
	h.input("r-0-depth", "7.012")
	id := h.app.Current().ID
	h.click("back-to-list")
	return id
}

// exportFile exports the stored project id and returns the file.
func exportFile(h *harness, name string) []byte {
	h.t.Helper()
	action(h.listItem(name), "export").Fire("click", nil)
	h.settle()
	select {
	case data := <-h.dl:
		return data
	case <-time.After(5 * time.Second):
		h.t.Fatal("no file was offered")
	}
	return nil
}

func TestImportRefusedLeavesStoreUnchanged(t *testing.T) {
	h := newHarness(t, nil)
	makeProject(h, "Plover Creek")
	good := exportFile(h, "Plover Creek")
	before := storeDump(t, h.st)
	newer := strings.Replace(string(good), fmt.Sprintf(`"version": %d`, project.Version), `"version": 99`, 1)
	badType := strings.Replace(string(good), `"elapsedS": 60`, `"elapsedS": "60"`, 1)
	for _, tt := range []struct {
		name, data, says string
	}{
		{"truncated", string(good[:len(good)*2/3]), "damaged or cut short"},
		{"another kind", "Time,Level\n2024-05-14 08:00,12.3\n", "not a Fieldfit project file"},
		{"other JSON", `{"type":"FeatureCollection","features":[]}`, "not a Fieldfit project file"},
		{"newer", newer, "newer version of Fieldfit"},
		{"wrong type", badType, "elapsedS"},
		{"empty", "", "not a Fieldfit project file"},
	} {
		t.Run(tt.name, func(t *testing.T) {
			h.app.ImportData("in.fieldfit.json", []byte(tt.data))
			h.settle()
			msg := h.app.Notice()
			if !strings.Contains(msg, tt.says) || !strings.Contains(msg, "Nothing on this device was changed") {
				t.Errorf("notice %q, want it to say %q and that nothing changed", msg, tt.says)
			}
			if after := storeDump(t, h.st); !reflect.DeepEqual(before, after) {
				t.Error("a refused import changed the store")
			}
		})
	}
}

// bigFile is a v.File of a given size that must never be read.
type bigFile struct{ t *testing.T }

func (bigFile) Name() string { return "huge.fieldfit.json" }
func (bigFile) Size() int64  { return 300 << 20 }
func (f bigFile) Read(context.Context, func(int64)) ([]byte, error) {
	f.t.Error("a 300 MB file was read")
	return nil, fmt.Errorf("not read")
}

func TestImportTooLarge(t *testing.T) {
	h := newHarness(t, nil)
	h.app.ImportFile(bigFile{t})
	h.settle()
	if msg := h.app.Notice(); !strings.Contains(msg, "300 MB") || !strings.Contains(msg, "up to 200 MB") {
		t.Errorf("notice %q", msg)
	}
	if len(storeDump(t, h.st)) != 0 {
		t.Error("the store changed")
	}
}

func TestImportNewAndHTMLName(t *testing.T) {
	office := newHarness(t, nil)
	id := makeProject(office, xssName)
	data := exportFile(office, xssName)
	dev := newHarness(t, nil)
	dev.app.ImportData("a.fieldfit.json", data)
	dev.settle()
	if !strings.Contains(dev.app.Notice(), "was added") {
		t.Errorf("notice %q", dev.app.Notice())
	}
	p := dev.stored(id)
	if p.Name != xssName || len(p.Tests) != 1 || p.Tests[0].Readings[0].DepthText != "7.012" {
		t.Errorf("imported %q with %d tests", p.Name, len(p.Tests))
	}
	// The name is a text node of the list, never markup.
	li := dev.listItem(xssName)
	if img := li.Find(func(n *v.Node) bool { return n.Tag == "img" }); img != nil {
		t.Error("the project name became an element")
	}
	// Just imported: nothing to export.
	if dev.app.List()[0].Unexported {
		t.Error("a project just imported is marked changed since export")
	}
}

const xssName = `<img src=x onerror="window.__pwned=1">`

func TestImportMerge(t *testing.T) {
	dev := newHarness(t, nil)
	id := makeProject(dev, "Sandpiper Flat")
	file := exportFile(dev, "Sandpiper Flat")
	if dev.app.List()[0].Unexported {
		t.Error("an exported project is still marked changed since export")
	}
	office := newHarness(t, nil)
	office.app.ImportData("f.fieldfit.json", file)
	office.settle()

	// The office changes the well and a reading; the device changes the
	// same reading and the notes.
	office.app.Open(id)
	office.settle()
	office.click("tab-wells")
	office.input("well-0-name", "OW-office")
	office.click("tab-readings")
	office.input("r-0-depth", "7.100")
	office.click("back-to-list")
	back := exportFile(office, "Sandpiper Flat")

	dev.app.Open(id)
	dev.settle()
	dev.click("tab-site")
	dev.input("project-notes", "checked the tape")
	dev.click("tab-readings")
	dev.input("r-0-depth", "7.020")
	dev.click("back-to-list")
	if !dev.app.List()[0].Unexported {
		t.Error("an edited project is not marked changed since export")
	}
	before := storeDump(t, dev.st)

	dev.app.ImportData("back.fieldfit.json", back)
	dev.settle()
	if !dev.app.MergePending() {
		t.Fatalf("no decisions asked; notice %q", dev.app.Notice())
	}
	if !reflect.DeepEqual(before, storeDump(t, dev.st)) {
		t.Fatal("the store changed before the decisions")
	}
	screen := dev.text("screen-merge")
	for _, want := range []string{"7.020", "7.100", "On this device", "back.fieldfit.json"} {
		if !strings.Contains(screen, want) {
			t.Errorf("the decisions screen does not show %q:\n%s", want, screen)
		}
	}
	if dev.byID("merge-apply").Attrs["disabled"] == "" && dev.byID("merge-apply").Attrs["aria-disabled"] != "true" {
		t.Error("apply is offered before a decision")
	}
	p := dev.stored(id)
	testID := p.Tests[0].ID
	dev.click("merge-incoming-" + testID)
	dev.click("merge-apply")
	if dev.app.MergePending() {
		t.Fatal("still pending after apply")
	}
	m := dev.stored(id)
	if m.Notes != "checked the tape" || m.Wells[0].Name != "OW-office" || m.Tests[0].Readings[0].DepthText != "7.100" {
		t.Errorf("merged: notes %q well %q reading %q", m.Notes, m.Wells[0].Name, m.Tests[0].Readings[0].DepthText)
	}
	// Importing the same file again asks nothing.
	dev.app.ImportData("back.fieldfit.json", back)
	dev.settle()
	if dev.app.MergePending() || !strings.Contains(dev.app.Notice(), "nothing new") {
		t.Errorf("second import of the same file: pending %v, notice %q", dev.app.MergePending(), dev.app.Notice())
	}
}

func TestMergeCancelChangesNothing(t *testing.T) {
	dev := newHarness(t, nil)
	id := makeProject(dev, "Curlew Bend")
	file := exportFile(dev, "Curlew Bend")
	office := newHarness(t, nil)
	office.app.ImportData("f.fieldfit.json", file)
	office.settle()
	office.app.Open(id)
	office.settle()
	office.click("tab-site")
	office.input("project-name", "Curlew Bend (office)")
	office.click("back-to-list")
	back := exportFile(office, "Curlew Bend (office)")
	dev.app.Open(id)
	dev.settle()
	dev.click("tab-site")
	dev.input("project-name", "Curlew Bend (field)")
	dev.click("back-to-list")
	before := storeDump(t, dev.st)
	dev.app.ImportData("b.fieldfit.json", back)
	dev.settle()
	if dev.render().ByID("merge-both-"+project.DetailsKey) != nil {
		t.Error("keep both is offered for the project details")
	}
	dev.click("merge-cancel")
	if !reflect.DeepEqual(before, storeDump(t, dev.st)) {
		t.Error("cancel changed the store")
	}
}

func TestExportReminder(t *testing.T) {
	h := newHarness(t, nil)
	makeProject(h, "Dotterel Rise")
	if h.render().ByID("export-reminder") != nil {
		t.Error("reminder shown for changes minutes old")
	}
	now := clock0.Add(25 * time.Hour)
	h.app.opt.Now = func() time.Time { return now }
	if n := h.render().ByID("export-reminder"); n == nil || !strings.Contains(n.TextContent(), "1 project has changes not exported for more than a day") {
		t.Errorf("no reminder a day later: %v", n)
	}
	exportFile(h, "Dotterel Rise")
	if h.render().ByID("export-reminder") != nil {
		t.Error("reminder still shown after the export")
	}
}

func TestExportAll(t *testing.T) {
	h := newHarness(t, nil)
	a := makeProject(h, "Avocet One")
	b := makeProject(h, "Avocet Two")
	h.click("export-all")
	var data []byte
	select {
	case data = <-h.dl:
	case <-time.After(5 * time.Second):
		t.Fatal("no file")
	}
	ps, err := project.UnmarshalFile(data)
	if err != nil || len(ps) != 2 {
		t.Fatalf("export of all: %d projects, %v", len(ps), err)
	}
	ids := map[string]bool{ps[0].ID: true, ps[1].ID: true}
	if !ids[a] || !ids[b] {
		t.Error("a project is missing from the file")
	}
	for _, it := range h.app.List() {
		if it.Unexported {
			t.Errorf("%q still marked changed since export", it.Name)
		}
	}
}

// TestTwoTabs runs two Apps on one store, as two tabs on one device: a
// save never overwrites the other's changes silently.
func TestTwoTabs(t *testing.T) {
	st := store.NewMemory()
	a := newHarness(t, st)
	id := makeProject(a, "Godwit Marsh")
	b := newHarness(t, st)
	a.app.Open(id)
	a.settle()
	b.app.Open(id)
	b.settle()

	// Different objects: both kept, each tab's save merging the other's.
	a.click("tab-wells")
	a.input("well-0-name", "OW-A")
	b.input("r-0-depth", "7.333")
	p := a.stored(id)
	if p.Wells[0].Name != "OW-A" || p.Tests[0].Readings[0].DepthText != "7.333" {
		t.Fatalf("after two tabs' saves: well %q, reading %q", p.Wells[0].Name, p.Tests[0].Readings[0].DepthText)
	}
	if !strings.Contains(b.app.Notice(), "another tab") {
		t.Errorf("tab B was not told of the merge: %q", b.app.Notice())
	}
	// Tab A hears of B's save and reads it again.
	a.app.OtherTabSaved(id, p.Rev)
	a.settle()
	if got := a.app.Current().Tests[0].Readings[0].DepthText; got != "7.333" {
		t.Errorf("tab A shows %q after the other tab's save", got)
	}

	// The same reading in both: the second save stops for a decision.
	a.click("tab-readings")
	a.input("r-0-depth", "7.401")
	b.input("r-0-depth", "7.402")
	if !b.app.MergePending() {
		t.Fatal("tab B overwrote tab A's reading without asking")
	}
	if got := b.stored(id).Tests[0].Readings[0].DepthText; got != "7.401" {
		t.Errorf("stored %q before the decision, want tab A's 7.401", got)
	}
	testID := p.Tests[0].ID
	b.click("merge-local-" + testID)
	b.click("merge-apply")
	if got := b.stored(id).Tests[0].Readings[0].DepthText; got != "7.402" || b.app.MergePending() {
		t.Errorf("stored %q after keeping tab B's, pending %v", got, b.app.MergePending())
	}
}
