package ui

import (
	"context"
	"errors"
	"strconv"
	"strings"

	"fieldfit/ui/project"
	"fieldfit/ui/store"
)

// Journal keeps the open project's unsaved changes when the page is
// hidden or closed: a write to the store runs in the background and may
// not finish before the page goes, so the changes are also written here,
// synchronously (localStorage in the browser). Start reads them back.
type Journal interface {
	// Write keeps data under key, replacing what was there; it reports
	// whether it could (the journal may be full).
	Write(key, data string) bool
	// Keys lists the keys kept.
	Keys() []string
	// Read returns the data under key, "" when none.
	Read(key string) string
	// Remove forgets key.
	Remove(key string)
}

// journalPrefix begins the journal's keys, followed by the project ID.
const journalPrefix = "fieldfit-unsaved-"

// journalLocked writes the open project to the journal when it has
// changes that may not be on the device yet. The entry is "BASE\nFILE":
// the stored revision the changes were made on, and the project file.
func (a *App) journalLocked() {
	if a.opt.Journal == nil || a.cur == nil {
		return
	}
	_, saving := a.busy["save-"+a.cur.ID]
	if !a.dirty && !saving {
		return
	}
	p := a.cur.Clone()
	project.Touch(p, a.files.fp, a.files.actor, a.opt.Now())
	data, err := project.Marshal(p)
	if err != nil {
		return
	}
	a.opt.Journal.Write(journalPrefix+p.ID, strconv.FormatInt(a.files.rec.Rev, 10)+"\n"+string(data))
}

// dropJournal forgets the journal entry of project id once a save of
// revision rev (or later) is on the device.
func (a *App) dropJournal(id string, rev int64) {
	j := a.opt.Journal
	if j == nil {
		return
	}
	e := j.Read(journalPrefix + id)
	if e == "" {
		return
	}
	if p, _, err := readJournal(e); err == nil && p.Rev > rev {
		return
	}
	j.Remove(journalPrefix + id)
}

func readJournal(e string) (*project.Project, int64, error) {
	base, file, ok := strings.Cut(e, "\n")
	if !ok {
		return nil, 0, errors.New("the entry has no revision line")
	}
	rev, err := strconv.ParseInt(base, 10, 64)
	if err != nil {
		return nil, 0, err
	}
	p, err := project.Unmarshal([]byte(file))
	return p, rev, err
}

// recoverJournal stores the changes a closed page left in the journal,
// then reads the list. A change made on a stored revision that is still
// the stored one is written as it is; otherwise it is merged, and when
// the same part was changed on both sides the decisions screen asks.
func (a *App) recoverJournal() {
	if a.opt.Journal == nil {
		a.reloadList()
		return
	}
	a.mu.Lock()
	defer a.mu.Unlock()
	a.goBusy("journal", "Storing the changes of the last session…", func(ctx context.Context) {
		var said []string
		var waiting *pendingMerge
		a.saveMu.Lock()
		for _, key := range a.opt.Journal.Keys() {
			if !strings.HasPrefix(key, journalPrefix) {
				continue
			}
			p, base, err := readJournal(a.opt.Journal.Read(key))
			if err != nil {
				said = append(said, "Unsaved changes of the last session could not be read ("+err.Error()+").")
				continue
			}
			rec, err := a.opt.Store.Get(ctx, p.ID)
			switch {
			case errors.Is(err, store.ErrNotFound) || (err == nil && rec.Rev == base):
				if err != nil {
					rec = store.Record{}
				}
				rec.Data = nil
				if p.Rev <= rec.Rev {
					p.Rev = rec.Rev + 1
				}
				err = a.putLocked(ctx, p, rec)
			case err == nil && rec.Rev >= p.Rev:
				// Saved after all, or later changes: compare.
				fallthrough
			case err == nil:
				var local *project.Project
				if local, err = project.Unmarshal(rec.Data); err == nil {
					rec.Data = nil
					m := project.NewMerge(local, p)
					switch {
					case m.Unchanged():
					case len(m.Conflicts()) > 0:
						if waiting == nil {
							waiting = &pendingMerge{m: m, choices: map[string]project.Choice{}, from: "unsaved changes of the last session", rec: rec}
						}
						continue // kept in the journal until decided
					default:
						var merged *project.Project
						if merged, err = m.Apply(nil, a.files.actor, a.opt.Now()); err == nil {
							err = a.putLocked(ctx, merged, rec)
						}
					}
				}
			}
			if err != nil {
				said = append(said, "Unsaved changes of “"+p.Name+"” could not be stored: "+storageMessage(err))
				continue
			}
			a.opt.Journal.Remove(key)
		}
		a.saveMu.Unlock()
		a.mu.Lock()
		defer a.mu.Unlock()
		if len(said) > 0 {
			a.notice = strings.Join(said, " ")
		}
		if waiting != nil && a.files.merge == nil {
			a.files.merge = waiting
		}
		a.reloadListLocked()
	})
}
