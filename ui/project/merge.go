package project

import (
	"errors"
	"fmt"
	"time"
)

// State says how the two copies of one object of a merge relate.
type State int

const (
	// Equal: both copies hold the same content.
	Equal State = iota
	// TakeIncoming: only the incoming copy was changed since the two
	// parted; it is taken.
	TakeIncoming
	// KeepLocal: only the local copy was changed; it is kept.
	KeepLocal
	// OnlyLocal: the object is on the device only; it is kept.
	OnlyLocal
	// OnlyIncoming: the object is in the incoming copy only; it is added.
	OnlyIncoming
	// Conflict: both copies were changed; the user decides.
	Conflict
)

// Choice is the user's decision on a Conflict.
type Choice int

const (
	// Undecided: no decision yet; Apply refuses to run.
	Undecided Choice = iota
	// ChooseLocal keeps the device's copy.
	ChooseLocal
	// ChooseIncoming takes the incoming copy.
	ChooseIncoming
	// ChooseBoth keeps the device's copy and adds the incoming one under
	// a new identity, its name marked. Not offered for the details.
	ChooseBoth
)

// Part is one object of a merge: the project's details (Key DetailsKey),
// a well or a test (Key its ID).
type Part struct {
	Key string
	// What is "details", "well" or "test".
	What  string
	Name  string
	State State
	// Local and Incoming are the two copies (*Project for the details,
	// *Well, *Test); nil on the side that lacks the object.
	Local, Incoming any
}

// Merge is the comparison of a project on the device with an incoming
// copy of the same project (same ID): from a file, or saved meanwhile by
// another tab. Nothing is changed until Apply.
type Merge struct {
	Local, Incoming *Project
	Parts           []Part
}

// ErrUndecided is returned by Apply while a conflict has no decision.
var ErrUndecided = errors.New("a change made on both sides has no decision yet")

// NewMerge compares local and incoming, which must have the same ID.
func NewMerge(local, incoming *Project) *Merge {
	m := &Merge{Local: local, Incoming: incoming}
	lf, inf := Fingerprints(local), Fingerprints(incoming)
	state := func(key string, ls, is Stamp) State {
		if lf[key] == inf[key] {
			return Equal
		}
		switch ls.Compare(is) {
		case Older:
			return TakeIncoming
		case Newer:
			return KeepLocal
		}
		return Conflict
	}
	m.Parts = append(m.Parts, Part{Key: DetailsKey, What: "details", Name: incoming.Name,
		State: state(DetailsKey, local.Details, incoming.Details), Local: local, Incoming: incoming})
	for i := range local.Wells {
		w := &local.Wells[i]
		p := Part{Key: w.ID, What: "well", Name: w.Name, Local: w, State: OnlyLocal}
		if o := incoming.Well(w.ID); o != nil {
			p.Incoming, p.State = o, state(w.ID, w.Stamp, o.Stamp)
		}
		m.Parts = append(m.Parts, p)
	}
	for i := range incoming.Wells {
		if w := &incoming.Wells[i]; local.Well(w.ID) == nil {
			m.Parts = append(m.Parts, Part{Key: w.ID, What: "well", Name: w.Name, Incoming: w, State: OnlyIncoming})
		}
	}
	for i := range local.Tests {
		t := &local.Tests[i]
		p := Part{Key: t.ID, What: "test", Name: t.Name, Local: t, State: OnlyLocal}
		if o := incoming.Test(t.ID); o != nil {
			p.Incoming, p.State = o, state(t.ID, t.Stamp, o.Stamp)
		}
		m.Parts = append(m.Parts, p)
	}
	for i := range incoming.Tests {
		if t := &incoming.Tests[i]; local.Test(t.ID) == nil {
			m.Parts = append(m.Parts, Part{Key: t.ID, What: "test", Name: t.Name, Incoming: t, State: OnlyIncoming})
		}
	}
	return m
}

// Conflicts returns the parts changed on both sides.
func (m *Merge) Conflicts() []Part {
	var out []Part
	for _, p := range m.Parts {
		if p.State == Conflict {
			out = append(out, p)
		}
	}
	return out
}

// Count returns the number of parts in state s.
func (m *Merge) Count(s State) int {
	n := 0
	for _, p := range m.Parts {
		if p.State == s {
			n++
		}
	}
	return n
}

// Unchanged reports whether applying the merge would leave the local
// project as it is: nothing to take from the incoming copy.
func (m *Merge) Unchanged() bool {
	for _, p := range m.Parts {
		if p.State != Equal && p.State != KeepLocal && p.State != OnlyLocal {
			return false
		}
	}
	return true
}

// decide says how Apply treats part p with the user's choice c: whether
// the incoming copy is taken, whether the stamp is a decision's (a later
// state of both copies), and whether an incoming copy is added beside the
// device's.
func decide(p Part, c Choice) (fromInc, decided, both bool) {
	switch p.State {
	case TakeIncoming, OnlyIncoming:
		return true, false, false
	case Conflict:
		return c == ChooseIncoming, true, c == ChooseBoth
	}
	return false, false, false
}

// FromFileSuffix marks the name of an incoming copy kept beside the
// device's (ChooseBoth).
const FromFileSuffix = " (incoming copy)"

// Apply returns the merged project: each object as its State says, each
// conflict as choices (keyed by Part.Key) decide. A decided object's
// revision record is a later state of both copies, changed in session by
// at now, so that the next merge with either copy does not ask again.
// The local and incoming projects are not changed.
func (m *Merge) Apply(choices map[string]Choice, by string, now time.Time) (*Project, error) {
	for _, p := range m.Parts {
		if p.State != Conflict {
			continue
		}
		c := choices[p.Key]
		if c == Undecided || (c == ChooseBoth && p.What == "details") || c > ChooseBoth {
			return nil, fmt.Errorf("%w: the %s %q", ErrUndecided, p.What, p.Name)
		}
	}
	inc := m.Incoming.Clone()
	res := m.Local.Clone()
	decided := func(a, b Stamp) Stamp {
		j := join(a, b)
		j.bump(by, now)
		return j
	}
	// The details.
	d := m.Parts[0]
	take := d.State == TakeIncoming || (d.State == Conflict && choices[d.Key] == ChooseIncoming)
	if take {
		q := *inc
		q.Wells, q.Tests, q.Rev, q.Changed = res.Wells, res.Tests, res.Rev, res.Changed
		res = &q
	}
	switch d.State {
	case Conflict:
		res.Details = decided(m.Local.Details, m.Incoming.Details)
	case Equal:
		res.Details = join(m.Local.Details, m.Incoming.Details)
	}
	wellCopy := map[string]string{}
	var wells, addWells []Well
	for _, p := range m.Parts {
		if p.What != "well" {
			continue
		}
		fromInc, dec, both := decide(p, choices[p.Key])
		var w Well
		if fromInc {
			w = *inc.Well(p.Key)
		} else {
			w = *res.Well(p.Key)
		}
		switch {
		case dec:
			w.Stamp = decided(p.Local.(*Well).Stamp, p.Incoming.(*Well).Stamp)
		case p.State == Equal:
			w.Stamp = join(w.Stamp, p.Incoming.(*Well).Stamp)
		}
		if p.State == OnlyIncoming {
			addWells = append(addWells, w)
			continue
		}
		wells = append(wells, w)
		if both {
			c := *inc.Well(p.Key)
			c.ID = NewID()
			c.Name += FromFileSuffix
			wellCopy[p.Key] = c.ID
			addWells = append(addWells, c)
		}
	}
	res.Wells = append(wells, addWells...)
	// remap points a test taken from the incoming copy at the incoming
	// copies of wells kept both ways; a test so changed is a later state
	// of the incoming one.
	remap := func(t *Test) {
		moved := false
		if id, ok := wellCopy[t.PumpingWell]; ok {
			t.PumpingWell, moved = id, true
		}
		if id, ok := wellCopy[t.ObservationWell]; ok {
			t.ObservationWell, moved = id, true
		}
		if moved {
			t.Stamp = decided(t.Stamp, t.Stamp)
		}
	}
	var tests, addTests []Test
	for _, p := range m.Parts {
		if p.What != "test" {
			continue
		}
		fromInc, dec, both := decide(p, choices[p.Key])
		var t Test
		if fromInc {
			t = *inc.Test(p.Key)
		} else {
			t = *res.Test(p.Key)
		}
		switch {
		case dec:
			t.Stamp = decided(p.Local.(*Test).Stamp, p.Incoming.(*Test).Stamp)
		case p.State == Equal:
			t.Stamp = join(t.Stamp, p.Incoming.(*Test).Stamp)
		}
		if fromInc {
			remap(&t)
		}
		if p.State == OnlyIncoming {
			addTests = append(addTests, t)
			continue
		}
		tests = append(tests, t)
		if both {
			c := *inc.Test(p.Key)
			c.ID = NewID()
			c.Name += FromFileSuffix
			remap(&c)
			addTests = append(addTests, c)
		}
	}
	res.Tests = append(tests, addTests...)
	if res.Wells == nil {
		res.Wells = []Well{}
	}
	if res.Tests == nil {
		res.Tests = []Test{}
	}
	res.Rev = max(m.Local.Rev, m.Incoming.Rev) + 1
	res.Changed = now.UTC()
	if err := res.check(); err != nil {
		return nil, fmt.Errorf("the merged project is not consistent: %w", err)
	}
	return res, nil
}
