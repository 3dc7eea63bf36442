package ui

import (
	"context"
	"errors"
	"fmt"
	"strings"
	"sync"
	"time"

	"fieldfit/ui/project"
	"fieldfit/ui/store"
)

// Timing of the app's background work.
const (
	// SaveDelay is how long after the first of a burst of changes the
	// project is saved: changes are on the device within a second.
	SaveDelay = 400 * time.Millisecond
	// UndoWindow is how long a deleted project can be brought back.
	UndoWindow = 10 * time.Second
	// AutoFitDelay is the pause after the last edit before an automatic
	// refit.
	AutoFitDelay = 300 * time.Millisecond
	// storeTimeout bounds one storage call.
	storeTimeout = 15 * time.Second
)

// Options configure an App. Only Store is required.
type Options struct {
	// Store keeps the projects.
	Store store.Store
	// StoreProblem, if not nil, is why the real store could not be
	// opened (Store is then a memory fallback); it is shown to the user.
	StoreProblem error
	// Now returns the current time; nil means time.Now.
	Now func() time.Time
	// After runs f once after d in its own goroutine and returns a stop
	// function; nil means time.AfterFunc.
	After func(d time.Duration, f func()) (stop func())
	// Changed is called, from any goroutine, whenever the screen should
	// be rendered again. It must not block; nil means nothing is called.
	Changed func()
	// Download offers data to the user as a file. nil means exports are
	// not available (the buttons are not shown).
	Download func(filename, mime string, data []byte)
	// Fit fits a test; nil means FitTest.
	Fit func(ctx context.Context, req FitRequest) (*FitOutcome, error)
	// Print opens the browser's print dialog; nil hides the report's
	// print button.
	Print func()
	// RasterPNG draws an SVG document as a PNG image of w × h pixels
	// (the browser's canvas); nil offers SVG exports only.
	RasterPNG func(ctx context.Context, svg []byte, w, h float64) ([]byte, error)
	// Journal, if not nil, keeps an unsaved project synchronously when
	// the page is hidden (see FlushSave); it is read back on Start.
	Journal Journal
	// Saved, if not nil, is called after a project was written to the
	// store at revision rev, to tell other tabs (see OtherTabSaved).
	Saved func(id string, rev int64)
}

// Screen names the two screens of the app.
type Screen string

const (
	ListScreen    Screen = "list"
	ProjectScreen Screen = "project"
)

// Tabs of the project screen.
const (
	TabSite     = "site"
	TabWells    = "wells"
	TabTest     = "test"
	TabReadings = "readings"
	TabFit      = "fit"
	TabLogger   = "logger"
	TabReport   = "report"
)

// ListItem is one project of the list.
type ListItem struct {
	ID      string
	Name    string
	Changed time.Time
	// Unexported reports changes not exported from this device, the
	// first of them made at Since.
	Unexported bool
	Since      time.Time
}

// deleted is a project removed within the undo window.
type deleted struct {
	rec  store.Record
	stop func()
}

// App is the state of the whole app. Its exported methods are the user's
// actions; they are safe for concurrent use and return quickly, starting
// goroutines for storage and fits.
type App struct {
	mu  sync.Mutex
	opt Options

	screen   Screen
	busy     map[string]string // what is running: key → label
	notice   string
	problem  string // storage problem, shown until a save succeeds
	fatal    string // an unexpected error (recovered panic)
	focus    string // id to focus after the next render
	loaded   bool   // the list has been read once
	list     []ListItem
	listErr  string
	renaming string // project ID being renamed in the list
	renameTo string
	askDel   string // project ID awaiting delete confirmation
	undo     *deleted

	cur       *project.Project
	tab       string
	testIdx   int
	openErr   string
	dirty     bool
	saveStop  func()
	saveMu    sync.Mutex // orders Puts
	removeArm string     // well ID whose remove button was pressed once

	fit  fitState
	kfit kindState // the fit step of a slug, infiltration or decay test

	imp  *importState // a logger file being imported, nil when none
	pick string       // "start" or "stop": the next tap on the raw plot sets it
	cond condCache    // the last conditioned logger record

	files filesState // revisions, project files in and out (files.go)

	report reportState
}

// NewApp returns an App on the given options; call Start to load the list.
func NewApp(opt Options) *App {
	if opt.Now == nil {
		opt.Now = time.Now
	}
	if opt.After == nil {
		opt.After = func(d time.Duration, f func()) func() {
			t := time.AfterFunc(d, f)
			return func() { t.Stop() }
		}
	}
	if opt.Changed == nil {
		opt.Changed = func() {}
	}
	if opt.Fit == nil {
		opt.Fit = FitTest
	}
	a := &App{opt: opt, screen: ListScreen, busy: map[string]string{}}
	a.files.actor = "s" + project.NewID()[:8]
	// Timer callbacks run in goroutines of their own: recover there too.
	after := opt.After
	a.opt.After = func(d time.Duration, f func()) func() {
		return after(d, func() {
			defer func() {
				if v := recover(); v != nil {
					a.Recovered(v)
				}
			}()
			f()
		})
	}
	if opt.StoreProblem != nil {
		a.problem = storageMessage(opt.StoreProblem) + " Projects are kept in memory only until this page is closed: export them to keep them."
	}
	return a
}

// Start reads the project list in the background.
func (a *App) Start() { a.recoverJournal() }

// Screen returns the current screen.
func (a *App) Screen() Screen {
	a.mu.Lock()
	defer a.mu.Unlock()
	return a.screen
}

// Current returns a copy of the open project, or nil.
func (a *App) Current() *project.Project {
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.cur == nil {
		return nil
	}
	return a.cur.Clone()
}

// List returns the project list as last read.
func (a *App) List() []ListItem {
	a.mu.Lock()
	defer a.mu.Unlock()
	return append([]ListItem(nil), a.list...)
}

// TakeFocus returns the id of the element to focus after this render,
// once.
func (a *App) TakeFocus() string {
	a.mu.Lock()
	defer a.mu.Unlock()
	f := a.focus
	a.focus = ""
	return f
}

// Idle reports whether no storage call, save or fit is running or
// scheduled. A save that failed is retried with the next change.
func (a *App) Idle() bool {
	a.mu.Lock()
	defer a.mu.Unlock()
	return len(a.busy) == 0 && a.saveStop == nil && !a.fit.running && a.fit.timer == nil
}

// Recovered records a panic recovered at the browser boundary so that it
// is shown instead of silently breaking the page.
func (a *App) Recovered(v any) {
	a.mu.Lock()
	a.fatal = fmt.Sprintf("Something went wrong inside Fieldfit (%v). Your data is kept; export the project to be safe.", v)
	a.mu.Unlock()
	a.opt.Changed()
}

// goBusy runs work in a goroutine with the label shown as progress, and
// recovers a panic in it.
func (a *App) goBusy(key, label string, work func(ctx context.Context)) {
	a.busy[key] = label
	go func() {
		ctx, cancel := context.WithTimeout(context.Background(), storeTimeout)
		defer cancel()
		defer func() {
			if v := recover(); v != nil {
				a.Recovered(v)
			}
			a.mu.Lock()
			delete(a.busy, key)
			a.mu.Unlock()
			a.opt.Changed()
		}()
		work(ctx)
	}()
}

// storageMessage turns a store error into a sentence for the user.
func storageMessage(err error) string {
	switch {
	case errors.Is(err, store.ErrQuota):
		return "The device's storage for Fieldfit is full: the last changes are not saved on the device."
	case errors.Is(err, store.ErrBlocked):
		return "Another Fieldfit tab holds the project store open: close the other tabs and reload. Changes are not saved on the device meanwhile."
	case errors.Is(err, store.ErrUnavailable):
		return "This browser does not let Fieldfit store projects (private browsing, or site storage turned off)."
	case errors.Is(err, store.ErrSchemaTooNew):
		return "The projects on this device were saved by a newer Fieldfit: reload to update."
	}
	return "Saving on the device failed: " + err.Error() + "."
}

func (a *App) setProblem(err error) {
	a.problem = storageMessage(err) + " Your data is kept in memory: export it to keep a copy."
}

// reloadList reads the list of projects.
func (a *App) reloadList() {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.reloadListLocked()
}

func (a *App) reloadListLocked() {
	a.goBusy("list", "Reading the projects on this device…", func(ctx context.Context) {
		recs, err := a.opt.Store.List(ctx)
		a.mu.Lock()
		defer a.mu.Unlock()
		a.loaded = true
		a.list = a.list[:0]
		for _, r := range recs {
			if a.undo != nil && a.undo.rec.ID == r.ID {
				continue
			}
			a.list = append(a.list, ListItem{ID: r.ID, Name: r.Name, Changed: r.Changed,
				Unexported: r.ChangedSinceExport(), Since: r.Unexported})
		}
		a.listErr = ""
		if err != nil {
			a.listErr = "Some projects could not be read: " + err.Error()
		}
	})
}

// ---- project list actions ----

// NewProject creates an empty project, saves it and opens it.
func (a *App) NewProject() {
	a.mu.Lock()
	defer a.mu.Unlock()
	now := a.opt.Now()
	p := project.New("New project "+now.Format("2006-01-02 15:04"), project.SI, now)
	a.openLocked(p, TabSite)
	a.focus = "project-name"
	a.changedLocked()
}

// CreateDemo adds the invented example project, already fitted, and opens
// it on the fit step.
func (a *App) CreateDemo() {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.goBusy("demo", "Preparing the example project…", func(ctx context.Context) {
		p, err := DemoProject(ctx, a.opt.Now(), a.opt.Fit)
		a.mu.Lock()
		defer a.mu.Unlock()
		if err != nil {
			a.notice = "The example project could not be prepared: " + err.Error()
			return
		}
		a.openLocked(p, TabFit)
		a.changedLocked()
	})
}

// Open reads a project and opens it.
func (a *App) Open(id string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.goBusy("open", "Opening the project…", func(ctx context.Context) {
		rec, err := a.opt.Store.Get(ctx, id)
		var p *project.Project
		if err == nil {
			p, err = project.Unmarshal(rec.Data)
		}
		a.mu.Lock()
		defer a.mu.Unlock()
		if err != nil {
			a.notice = "The project could not be opened: " + err.Error()
			return
		}
		if p.Rev < rec.Rev {
			p.Rev = rec.Rev
		}
		tab := TabSite
		if len(p.Tests) > 0 && len(p.Tests[0].Readings) > 0 {
			tab = TabReadings
		}
		a.openLocked(p, tab)
		a.files.openedStored(p, rec)
	})
}

func (a *App) openLocked(p *project.Project, tab string) {
	a.flushSaveLocked()
	a.cur = p
	a.screen = ProjectScreen
	a.tab = tab
	a.testIdx = 0
	a.removeArm = ""
	a.fit = fitState{}
	a.endImportLocked()
	a.cond = condCache{}
	a.notice = ""
	a.restorePlotLocked()
	a.files.opened()
}

// Back saves the open project and returns to the list.
func (a *App) Back() {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.flushSaveLocked()
	if a.fit.timer != nil {
		a.fit.timer()
	}
	a.cur = nil
	a.fit = fitState{}
	a.endImportLocked()
	a.cond = condCache{}
	a.screen = ListScreen
	a.reloadListLocked()
}

// StartRename turns the list item into a name input.
func (a *App) StartRename(id string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	for _, it := range a.list {
		if it.ID == id {
			a.renaming, a.renameTo = id, it.Name
			a.focus = "rename-input"
		}
	}
}

// SetRenameText keeps what is typed in the rename input.
func (a *App) SetRenameText(s string) {
	a.mu.Lock()
	a.renameTo = s
	a.mu.Unlock()
}

// CancelRename leaves the name as it was.
func (a *App) CancelRename() {
	a.mu.Lock()
	a.renaming = ""
	a.mu.Unlock()
}

// CommitRename stores the new name of the project being renamed.
func (a *App) CommitRename() {
	a.mu.Lock()
	defer a.mu.Unlock()
	id, name := a.renaming, strings.TrimSpace(a.renameTo)
	a.renaming = ""
	if id == "" || name == "" {
		return
	}
	for i := range a.list {
		if a.list[i].ID == id {
			a.list[i].Name = name
		}
	}
	a.editStored(id, "Renaming…", func(p *project.Project) { p.Name = name })
}

// editStored reads a stored project, changes it and writes it back.
func (a *App) editStored(id, label string, edit func(p *project.Project)) {
	a.goBusy("edit-"+id, label, func(ctx context.Context) {
		a.saveMu.Lock()
		defer a.saveMu.Unlock()
		rec, err := a.opt.Store.Get(ctx, id)
		var p *project.Project
		if err == nil {
			p, err = project.Unmarshal(rec.Data)
		}
		if err == nil {
			fp := project.Fingerprints(p)
			edit(p)
			p.Rev = rec.Rev + 1
			p.Changed = a.opt.Now().UTC()
			project.Touch(p, fp, a.files.actor, p.Changed)
			err = a.putLocked(ctx, p, rec)
		}
		a.mu.Lock()
		defer a.mu.Unlock()
		if err != nil {
			a.setProblem(err)
		}
		a.reloadListLocked()
	})
}

// Duplicate stores a copy of a project under a new name.
func (a *App) Duplicate(id string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.goBusy("dup-"+id, "Duplicating…", func(ctx context.Context) {
		a.saveMu.Lock()
		defer a.saveMu.Unlock()
		rec, err := a.opt.Store.Get(ctx, id)
		var p *project.Project
		if err == nil {
			p, err = project.Unmarshal(rec.Data)
		}
		if err == nil {
			q := p.Duplicate(p.Name+" (copy)", a.opt.Now())
			q.Rev = 1
			err = a.putLocked(ctx, q, store.Record{})
		}
		a.mu.Lock()
		defer a.mu.Unlock()
		if err != nil {
			a.setProblem(err)
		} else {
			a.notice = fmt.Sprintf("Duplicated “%s”.", p.Name)
		}
		a.reloadListLocked()
	})
}

// putLocked writes p to the store, keeping the export marks of prev (the
// record p was read from, if any); the caller holds saveMu.
func (a *App) putLocked(ctx context.Context, p *project.Project, prev store.Record) error {
	data, err := project.Marshal(p)
	if err != nil {
		return err
	}
	if err := a.opt.Store.Put(ctx, withMarks(store.Record{ID: p.ID, Name: p.Name, Rev: p.Rev, Changed: p.Changed, Data: data}, prev)); err != nil {
		return err
	}
	a.saved(p.ID, p.Rev)
	return nil
}

// AskDelete asks for confirmation before deleting a project.
func (a *App) AskDelete(id string) {
	a.mu.Lock()
	a.askDel = id
	a.mu.Unlock()
}

// CancelDelete keeps the project.
func (a *App) CancelDelete() {
	a.mu.Lock()
	a.askDel = ""
	a.mu.Unlock()
}

// ConfirmDelete deletes the project awaiting confirmation; it can be
// brought back with Undo within UndoWindow.
func (a *App) ConfirmDelete() {
	a.mu.Lock()
	defer a.mu.Unlock()
	id := a.askDel
	a.askDel = ""
	if id == "" {
		return
	}
	a.goBusy("del-"+id, "Deleting…", func(ctx context.Context) {
		a.saveMu.Lock()
		defer a.saveMu.Unlock()
		rec, err := a.opt.Store.Get(ctx, id)
		if err == nil {
			err = a.opt.Store.Delete(ctx, id)
		}
		a.mu.Lock()
		defer a.mu.Unlock()
		if err != nil {
			a.setProblem(err)
			a.reloadListLocked()
			return
		}
		if a.undo != nil {
			a.undo.stop()
		}
		d := &deleted{rec: rec}
		d.stop = a.opt.After(UndoWindow, func() {
			a.mu.Lock()
			if a.undo == d {
				a.undo = nil
			}
			a.mu.Unlock()
			a.opt.Changed()
		})
		a.undo = d
		for i, it := range a.list {
			if it.ID == id {
				a.list = append(a.list[:i], a.list[i+1:]...)
				break
			}
		}
		a.notice = ""
	})
}

// Undo brings back the project deleted last, within the undo window.
func (a *App) Undo() {
	a.mu.Lock()
	defer a.mu.Unlock()
	d := a.undo
	if d == nil {
		return
	}
	d.stop()
	a.undo = nil
	a.goBusy("undo", "Restoring…", func(ctx context.Context) {
		a.saveMu.Lock()
		err := a.opt.Store.Put(ctx, d.rec)
		a.saveMu.Unlock()
		a.mu.Lock()
		defer a.mu.Unlock()
		if err != nil {
			a.setProblem(err)
		} else {
			a.notice = fmt.Sprintf("Restored “%s”.", d.rec.Name)
		}
		a.reloadListLocked()
	})
}

// Export offers a stored project as a file.
func (a *App) Export(id string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.opt.Download == nil {
		return
	}
	if a.cur != nil && a.cur.ID == id {
		a.exportCurrentLocked()
		return
	}
	a.goBusy("export", "Preparing the file…", func(ctx context.Context) {
		rec, err := a.opt.Store.Get(ctx, id)
		if err != nil {
			a.mu.Lock()
			a.notice = "The project could not be read for export: " + err.Error()
			a.mu.Unlock()
			return
		}
		a.opt.Download(fileName(rec.Name), "application/json", rec.Data)
		if err := a.markExported(ctx, id, rec.Rev); err != nil {
			a.mu.Lock()
			a.setProblem(err)
			a.mu.Unlock()
		}
		a.reloadList()
	})
}

// ExportCurrent offers the open project, as it is in memory, as a file.
func (a *App) ExportCurrent() {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.exportCurrentLocked()
}

func (a *App) exportCurrentLocked() {
	if a.cur == nil || a.opt.Download == nil {
		return
	}
	data, err := project.Marshal(a.cur)
	if err != nil {
		a.notice = "Export failed: " + err.Error()
		return
	}
	name := fileName(a.cur.Name)
	go a.opt.Download(name, "application/json", data)
	a.notice = "Exported " + name + "."
	a.exportedCurrentLocked()
}

// fileName makes a file name from a project name: letters, digits, dashes.
func fileName(name string) string {
	var b strings.Builder
	for _, r := range name {
		switch {
		case r >= 'a' && r <= 'z', r >= 'A' && r <= 'Z', r >= '0' && r <= '9', r == '-', r == '_':
			b.WriteRune(r)
		case r == ' ' || r == '.':
			b.WriteRune('-')
		}
	}
	s := strings.Trim(b.String(), "-")
	if s == "" {
		s = "project"
	}
	if len(s) > 60 {
		s = s[:60]
	}
	return s + ".fieldfit.json"
}

// ---- saving ----

// changedLocked records a change of the open project and schedules the
// save (within SaveDelay of the first unsaved change) and, when the fit
// is automatic, a refit.
func (a *App) changedLocked() {
	if a.cur == nil {
		return
	}
	a.cur.Rev++
	a.cur.Changed = a.opt.Now().UTC()
	a.dirty = true
	if a.saveStop == nil {
		a.saveStop = a.opt.After(SaveDelay, a.save)
	}
}

// flushSaveLocked starts the pending save now.
func (a *App) flushSaveLocked() {
	if !a.dirty {
		return
	}
	if a.saveStop != nil {
		a.saveStop()
		a.saveStop = nil
	}
	a.startSaveLocked()
}

// FlushSave starts any pending save at once (the page is being hidden),
// and writes the unsaved project to the journal (see Options.Journal),
// as the save may not finish before the page goes.
func (a *App) FlushSave() {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.journalLocked()
	a.flushSaveLocked()
}

func (a *App) save() {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.saveStop = nil
	a.startSaveLocked()
}

func (a *App) startSaveLocked() {
	if !a.dirty || a.cur == nil {
		return
	}
	a.files.fp = project.Touch(a.cur, a.files.fp, a.files.actor, a.opt.Now())
	p := a.cur.Clone()
	a.dirty = false
	a.goBusy("save-"+p.ID, "Saving…", func(ctx context.Context) {
		a.saveMu.Lock()
		err := a.saveChecked(ctx, p)
		a.saveMu.Unlock()
		a.mu.Lock()
		defer a.mu.Unlock()
		if err != nil {
			a.setProblem(err)
			if a.cur != nil && a.cur.ID == p.ID {
				a.dirty = true // try again with the next change
			}
			return
		}
		if a.opt.StoreProblem == nil {
			a.problem = ""
		}
	})
}
