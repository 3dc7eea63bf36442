package ui

import (
	"context"
	"errors"
	"fmt"
	"strconv"
	"strings"
	"time"

	"fieldfit/ui/project"
	"fieldfit/ui/store"
	v "fieldfit/ui/view"
)

// ExportReminder is how old unexported changes get before the project
// list reminds the user to export them.
const ExportReminder = 24 * time.Hour

// filesState is the part of the App that keeps revisions and moves
// projects in and out as files.
type filesState struct {
	// actor names this editing session in the revision records
	// (project.Stamp.By): a random name per App, so that two tabs are
	// two sessions.
	actor string
	// fp are the fingerprints of the open project as last saved (nil for
	// a project never saved: all its objects are stamped at the first
	// save).
	fp map[string]uint64
	// rec is the stored record of the open project as last read or
	// written, without Data: its Rev tells whether another tab wrote
	// meanwhile, and it carries the export marks.
	rec store.Record
	// merge is a merge waiting for the user's decisions, nil when none.
	merge *pendingMerge
}

// pendingMerge is a merge shown on the decisions screen.
type pendingMerge struct {
	m       *project.Merge
	choices map[string]project.Choice
	// from says where the incoming copy comes from, for the screen: the
	// file name, or "" for another tab or window.
	from string
	// rec is the local project's stored record (marks to keep).
	rec store.Record
	// queue holds the file's further projects waiting for decisions.
	queue []*pendingMerge
}

// fromText names the incoming copy's source in a sentence.
func (pm *pendingMerge) fromText() string {
	if pm.from == "" {
		return "the changes of another tab or window"
	}
	if strings.HasPrefix(pm.from, "unsaved") {
		return "the " + pm.from
	}
	return "“" + pm.from + "”"
}

func (f *filesState) opened() {
	f.fp, f.rec, f.merge = nil, store.Record{}, nil
}

func (f *filesState) openedStored(p *project.Project, rec store.Record) {
	f.fp = project.Fingerprints(p)
	rec.Data = nil
	f.rec = rec
}

// withMarks returns r with the export marks of prev, and the time of the
// first unexported change set when r holds one.
func withMarks(r, prev store.Record) store.Record {
	r.Exported, r.Unexported = prev.Exported, prev.Unexported
	if r.Rev > r.Exported && r.Unexported.IsZero() {
		r.Unexported = r.Changed
	}
	if r.Rev <= r.Exported {
		r.Unexported = time.Time{}
	}
	return r
}

// saveChecked writes p, the open project, unless another tab or window
// saved the same project since this one last read or wrote it: then the
// two are merged, objects changed on one side only taken, and when some
// object was changed on both sides nothing is written and the decisions
// screen is shown. The caller holds saveMu.
func (a *App) saveChecked(ctx context.Context, p *project.Project) error {
	for try := 0; ; try++ {
		err := a.saveOnce(ctx, p)
		if !errors.Is(err, store.ErrConflict) || try == 3 {
			return err
		}
	}
}

// saveOnce is one attempt of saveChecked; it fails with store.ErrConflict
// when another tab wrote between its read and its write.
func (a *App) saveOnce(ctx context.Context, p *project.Project) error {
	a.mu.Lock()
	expect := a.files.rec
	a.mu.Unlock()
	stored, err := a.opt.Store.Get(ctx, p.ID)
	switch {
	case errors.Is(err, store.ErrNotFound):
		stored = store.Record{}
	case err != nil:
		return err
	}
	read := stored.Rev
	if stored.Rev != expect.Rev && stored.Data != nil {
		other, err := project.Unmarshal(stored.Data)
		if err != nil {
			return fmt.Errorf("the copy saved by another tab cannot be read (%w); not overwritten", err)
		}
		m := project.NewMerge(p, other)
		stored.Data = nil
		if len(m.Conflicts()) > 0 {
			a.mu.Lock()
			defer a.mu.Unlock()
			if a.cur != nil && a.cur.ID == p.ID && a.files.merge == nil {
				a.files.merge = &pendingMerge{m: project.NewMerge(a.cur.Clone(), other), choices: map[string]project.Choice{}, rec: stored}
				a.notice = "This project was changed in another tab or window too: choose what to keep below. Nothing is saved until then."
			}
			return nil
		}
		merged, err := m.Apply(nil, a.files.actor, a.opt.Now())
		if err != nil {
			return err
		}
		p = merged
		expect = stored
		defer func() {
			a.mu.Lock()
			defer a.mu.Unlock()
			if a.cur != nil && a.cur.ID == p.ID {
				if mine, err := project.NewMerge(a.cur, other).Apply(nil, a.files.actor, a.opt.Now()); err == nil {
					mine.Rev = max(mine.Rev, p.Rev)
					a.cur = mine
					a.files.fp = project.Fingerprints(mine)
				}
				a.notice = "Changes saved in another tab or window were added to this project."
			}
		}()
	}
	data, err := project.Marshal(p)
	if err != nil {
		return err
	}
	r := withMarks(store.Record{ID: p.ID, Name: p.Name, Rev: p.Rev, Changed: p.Changed, Data: data}, expect)
	if c, ok := a.opt.Store.(store.Conditional); ok {
		err = c.PutIfRev(ctx, r, read)
	} else {
		err = a.opt.Store.Put(ctx, r)
	}
	if err != nil {
		return err
	}
	r.Data = nil
	a.mu.Lock()
	if a.cur != nil && a.cur.ID == p.ID {
		a.files.rec = r
	}
	if a.screen == ListScreen {
		a.reloadListLocked() // the list may have been read before this save
	}
	a.mu.Unlock()
	a.saved(p.ID, p.Rev)
	a.dropJournal(p.ID, p.Rev)
	return nil
}

// saved tells other tabs that project id was written at revision rev.
func (a *App) saved(id string, rev int64) {
	if a.opt.Saved != nil {
		a.opt.Saved(id, rev)
	}
}

// OtherTabSaved is told that another tab or window wrote project id at
// revision rev. The list is read again; an open copy of that project
// with no unsaved change is read again too (one with unsaved changes is
// merged when it is saved, see saveChecked).
func (a *App) OtherTabSaved(id string, rev int64) {
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.cur == nil {
		if a.screen == ListScreen {
			a.reloadListLocked()
		}
		return
	}
	if a.cur.ID != id || rev == a.files.rec.Rev || a.dirty || a.files.merge != nil {
		return
	}
	if _, saving := a.busy["save-"+id]; saving {
		return
	}
	a.goBusy("refresh-"+id, "Reading the changes of another tab…", func(ctx context.Context) {
		rec, err := a.opt.Store.Get(ctx, id)
		var p *project.Project
		if err == nil {
			p, err = project.Unmarshal(rec.Data)
		}
		a.mu.Lock()
		defer a.mu.Unlock()
		if err != nil || a.cur == nil || a.cur.ID != id || a.dirty || rec.Rev == a.files.rec.Rev {
			return
		}
		tab, idx := a.tab, a.testIdx
		a.openLocked(p, tab)
		a.files.openedStored(p, rec)
		if idx < len(p.Tests) {
			a.testIdx = idx
		}
		a.notice = "Updated with the changes saved in another tab or window."
	})
}

// ---- import ----

// ImportFile reads a project file the user chose and imports it (see
// ImportData). A file larger than project.MaxFileSize is refused before
// it is read.
func (a *App) ImportFile(f v.File) {
	a.mu.Lock()
	defer a.mu.Unlock()
	name := f.Name()
	if n := f.Size(); n > project.MaxFileSize {
		a.notice = fmt.Sprintf("“%s” is %s; Fieldfit reads project files of up to %d MB. Nothing was imported.", name, sizeText(n), project.MaxFileSize>>20)
		return
	}
	a.goBusy("file-import", "Reading "+name+"…", func(ctx context.Context) {
		data, err := f.Read(context.Background(), nil)
		if err != nil {
			a.mu.Lock()
			a.notice = fmt.Sprintf("“%s” could not be read: %v. Nothing was imported.", name, err)
			a.mu.Unlock()
			return
		}
		a.importData(ctx, name, data)
	})
}

// ImportData imports the project file data (named name): every project
// in it is checked before anything is stored. A project new to this
// device is added; one that is already here (same identity) is merged:
// objects changed on one side only are taken, and objects changed on
// both sides wait on the decisions screen.
func (a *App) ImportData(name string, data []byte) {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.goBusy("file-import", "Reading "+name+"…", func(ctx context.Context) { a.importData(ctx, name, data) })
}

func sizeText(n int64) string {
	return strconv.FormatFloat(float64(n)/(1<<20), 'f', 0, 64) + " MB"
}

// importMessage is the sentence shown when a file is refused.
func importMessage(name string, err error) string {
	why := err.Error()
	switch {
	case errors.Is(err, project.ErrTooLarge):
		why = "it is larger than the " + strconv.Itoa(project.MaxFileSize>>20) + " MB Fieldfit reads"
	case errors.Is(err, project.ErrNewerVersion):
		why = "it was written by a newer version of Fieldfit; update this one (reload while online) and try again"
	case errors.Is(err, project.ErrNotProject):
		why = "it is not a Fieldfit project file, or it is damaged or cut short (" + why + ")"
	}
	return fmt.Sprintf("“%s” was not imported: %s. Nothing on this device was changed.", name, why)
}

func (a *App) importData(ctx context.Context, name string, data []byte) {
	ps, err := project.UnmarshalFile(data)
	if err != nil {
		a.mu.Lock()
		a.notice = importMessage(name, err)
		a.mu.Unlock()
		return
	}
	a.saveMu.Lock()
	defer a.saveMu.Unlock()
	var said []string
	var waiting []*pendingMerge
	for _, p := range ps {
		title := "“" + p.Name + "”"
		rec, err := a.opt.Store.Get(ctx, p.ID)
		if errors.Is(err, store.ErrNotFound) {
			p.Changed = p.Changed.UTC()
			if err := a.putLocked(ctx, p, store.Record{Exported: p.Rev}); err != nil {
				said = append(said, title+" could not be stored: "+storageMessage(err))
				continue
			}
			said = append(said, title+" was added.")
			continue
		}
		var local *project.Project
		if err == nil {
			local, err = project.Unmarshal(rec.Data)
		}
		if err != nil {
			said = append(said, title+" is on this device but could not be read, so it was not merged: "+err.Error())
			continue
		}
		rec.Data = nil
		m := project.NewMerge(local, p)
		if n := len(m.Conflicts()); n > 0 {
			waiting = append(waiting, &pendingMerge{m: m, choices: map[string]project.Choice{}, from: name, rec: rec})
			said = append(said, fmt.Sprintf("%s: %d %s changed both here and in the file; choose what to keep.", title, n, plural(n, "part was", "parts were")))
			continue
		}
		if m.Unchanged() {
			said = append(said, title+" holds nothing new.")
			continue
		}
		merged, err := m.Apply(nil, a.files.actor, a.opt.Now())
		if err == nil {
			err = a.putLocked(ctx, merged, rec)
		}
		if err != nil {
			said = append(said, title+" could not be merged: "+storageMessage(err))
			continue
		}
		said = append(said, title+": "+mergeSummary(m))
	}
	a.mu.Lock()
	defer a.mu.Unlock()
	a.notice = "From “" + name + "”: " + strings.Join(said, " ")
	if len(waiting) > 0 {
		first := waiting[0]
		first.queue = waiting[1:]
		a.files.merge = first
	}
	a.reloadListLocked()
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// mergeSummary says what a merge without conflicts took.
func mergeSummary(m *project.Merge) string {
	took := m.Count(project.TakeIncoming) + m.Count(project.OnlyIncoming)
	kept := m.Count(project.KeepLocal) + m.Count(project.OnlyLocal)
	return fmt.Sprintf("%d %s taken from the file, %d kept as changed on this device.", took, plural(took, "part", "parts"), kept)
}

// ---- decisions ----

// MergePending reports whether a merge waits for decisions.
func (a *App) MergePending() bool {
	a.mu.Lock()
	defer a.mu.Unlock()
	return a.files.merge != nil
}

// ChooseMerge records the decision for the part with key: "local",
// "incoming" or "both".
func (a *App) ChooseMerge(key, choice string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	pm := a.files.merge
	if pm == nil {
		return
	}
	c := map[string]project.Choice{"local": project.ChooseLocal, "incoming": project.ChooseIncoming, "both": project.ChooseBoth}[choice]
	if c == project.ChooseBoth && key == project.DetailsKey {
		return
	}
	pm.choices[key] = c
}

// CancelMerge leaves the project on the device as it is; the next
// waiting merge of the same file, if any, is shown.
func (a *App) CancelMerge() {
	a.mu.Lock()
	defer a.mu.Unlock()
	pm := a.files.merge
	if pm == nil {
		return
	}
	a.files.merge = a.nextMerge(pm)
	if pm.from == "" {
		// From another tab: this tab's copy stays unsaved in memory;
		// reading the other tab's version means reopening the project.
		a.notice = "Nothing was merged. This tab's changes are not saved; open the project again to see the other tab's version, or export this one to keep it."
		return
	}
	a.notice = "“" + pm.m.Local.Name + "” was left as it is on this device."
}

func (a *App) nextMerge(pm *pendingMerge) *pendingMerge {
	if len(pm.queue) == 0 {
		return nil
	}
	n := pm.queue[0]
	n.queue = pm.queue[1:]
	return n
}

// ApplyMerge stores the merged project once every conflict is decided.
func (a *App) ApplyMerge() {
	a.mu.Lock()
	defer a.mu.Unlock()
	pm := a.files.merge
	if pm == nil {
		return
	}
	merged, err := pm.m.Apply(pm.choices, a.files.actor, a.opt.Now())
	if err != nil {
		a.notice = "Choose for every part changed on both sides first: " + err.Error() + "."
		return
	}
	a.files.merge = a.nextMerge(pm)
	if pm.from == "" {
		// Another tab: the merged project becomes the open one and is
		// saved over the other tab's record.
		if a.cur != nil && a.cur.ID == merged.ID {
			merged.Rev = max(merged.Rev, pm.rec.Rev+1)
			a.cur = merged
			a.files.fp = project.Fingerprints(merged)
			a.files.rec.Rev = pm.rec.Rev
			a.dirty = true
			a.flushSaveLocked()
			a.notice = "Merged with the other tab's changes."
		}
		return
	}
	a.goBusy("merge", "Merging…", func(ctx context.Context) {
		a.saveMu.Lock()
		stored, err := a.opt.Store.Get(ctx, merged.ID)
		if err == nil && stored.Rev != pm.rec.Rev {
			err = errors.New("the project was changed on this device while you decided; import the file again")
		}
		if err == nil {
			err = a.putLocked(ctx, merged, pm.rec)
		}
		a.saveMu.Unlock()
		a.mu.Lock()
		defer a.mu.Unlock()
		if err != nil {
			a.notice = "“" + merged.Name + "” was not merged: " + err.Error()
		} else {
			a.notice = "“" + merged.Name + "” was merged with " + pm.fromText() + "."
			a.dropJournal(merged.ID, merged.Rev)
		}
		a.reloadListLocked()
	})
}

// ---- export ----

// markExported records that the stored project id was exported at
// revision rev.
func (a *App) markExported(ctx context.Context, id string, rev int64) error {
	a.saveMu.Lock()
	defer a.saveMu.Unlock()
	rec, err := a.opt.Store.Get(ctx, id)
	if err != nil {
		return err
	}
	if rec.Rev != rev || rec.Exported == rev {
		return nil
	}
	rec.Exported, rec.Unexported = rev, time.Time{}
	return a.opt.Store.Put(ctx, rec)
}

// exportedCurrentLocked records the export of the open project as it is
// in memory, saving it at once with the mark.
func (a *App) exportedCurrentLocked() {
	a.files.rec.Exported = a.cur.Rev
	a.files.rec.Unexported = time.Time{}
	if a.saveStop != nil {
		a.saveStop()
		a.saveStop = nil
	}
	a.dirty = true
	a.startSaveLocked()
}

// ExportAll offers every project of the device as one file.
func (a *App) ExportAll() {
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.opt.Download == nil {
		return
	}
	a.flushSaveLocked()
	a.goBusy("export-all", "Preparing the file…", func(ctx context.Context) {
		recs, err := a.opt.Store.List(ctx)
		var ps []*project.Project
		var bad []string
		for _, r := range recs {
			p, err := project.Unmarshal(r.Data)
			if err != nil {
				bad = append(bad, "“"+r.Name+"”")
				continue
			}
			ps = append(ps, p)
		}
		var data []byte
		if err == nil {
			data, err = project.MarshalAll(ps)
		}
		if err != nil {
			a.mu.Lock()
			a.notice = "Export failed: " + err.Error()
			a.mu.Unlock()
			return
		}
		name := "fieldfit-all-" + a.opt.Now().Format("2006-01-02") + ".fieldfit.json"
		a.opt.Download(name, "application/json", data)
		for _, p := range ps {
			if err := a.markExported(ctx, p.ID, p.Rev); err != nil {
				break
			}
		}
		a.mu.Lock()
		a.notice = fmt.Sprintf("Exported %d %s as %s.", len(ps), plural(len(ps), "project", "projects"), name)
		if len(bad) > 0 {
			a.notice += " Not readable, so not in the file: " + strings.Join(bad, ", ") + "."
		}
		a.mu.Unlock()
		a.reloadList()
	})
}
