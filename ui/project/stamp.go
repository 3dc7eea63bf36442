package project

import (
	"hash/fnv"
	"time"

	"fieldfit/ui/project/jsonc"
)

// Stamp is the revision record of one object of a project: the project's
// own details (name, site, units, thickness, notes), a well or a test.
//
// Rev counts the changes of the object and Changed is the time of the
// last one (UTC). By counts the changes per editing session (a random
// name given to each opened page, see App), so that two copies of an
// object can be told apart: one is an earlier state of the other when its
// counts are all at most the other's, and they were changed on both sides
// when each has a count the other lacks. Merge relies on this.
type Stamp struct {
	Rev     int64            `json:"rev"`
	Changed time.Time        `json:"changed"`
	By      map[string]int64 `json:"by,omitempty"`
}

// Order says how two stamps of the same object relate.
type Order int

const (
	// Same: both copies have the same history.
	Same Order = iota
	// Older: the first copy is an earlier state of the second.
	Older
	// Newer: the first copy is a later state of the second.
	Newer
	// Both: each copy has changes the other lacks.
	Both
)

// Compare says how stamp s relates to stamp o.
func (s Stamp) Compare(o Stamp) Order {
	less, more := false, false
	for k, n := range s.By {
		switch m := o.By[k]; {
		case n < m:
			less = true
		case n > m:
			more = true
		}
	}
	for k, m := range o.By {
		if _, ok := s.By[k]; !ok && m > 0 {
			less = true
		}
	}
	switch {
	case less && more:
		return Both
	case less:
		return Older
	case more:
		return Newer
	}
	return Same
}

// bump records one change made in session by at time now. It never
// changes By in place (it makes a new map), so clones of a project may
// share their stamps' maps.
func (s *Stamp) bump(by string, now time.Time) {
	s.Rev++
	s.Changed = now.UTC()
	if by != "" {
		m := make(map[string]int64, len(s.By)+1)
		for k, v := range s.By {
			m[k] = v
		}
		m[by]++
		s.By = m
	}
}

// join returns a stamp that is a later state of both s and o: the
// larger count of each session, the larger Rev and the later time.
func join(s, o Stamp) Stamp {
	j := Stamp{Rev: max(s.Rev, o.Rev), Changed: s.Changed}
	if o.Changed.After(j.Changed) {
		j.Changed = o.Changed
	}
	if len(s.By)+len(o.By) > 0 {
		j.By = make(map[string]int64, len(s.By)+len(o.By))
		for k, v := range s.By {
			j.By[k] = v
		}
		for k, v := range o.By {
			j.By[k] = max(j.By[k], v)
		}
	}
	return j
}

// clone returns a copy of s that shares nothing with it.
func (s Stamp) clone() Stamp {
	if s.By != nil {
		m := make(map[string]int64, len(s.By))
		for k, v := range s.By {
			m[k] = v
		}
		s.By = m
	}
	return s
}

// DetailsKey is the key of the project's own details in a Fingerprints
// map; wells and tests are keyed by their IDs.
const DetailsKey = "details"

// Fingerprints returns a hash of the content of each object of p (the
// details under DetailsKey, each well and test under its ID), leaving out
// the stamps and revision counters, so that Touch can tell which objects
// changed. What the app derives is left out too (the parsed values of
// readings, fit results), so that a refit or a re-parse on opening is not
// taken for an edit. Logger readings are identified by their record ID (a record's
// readings never change once imported), so a fingerprint does not cost a
// pass over a million readings.
func Fingerprints(p *Project) map[string]uint64 {
	fp := make(map[string]uint64, 1+len(p.Wells)+len(p.Tests))
	d := *p
	d.Wells, d.Tests = nil, nil
	d.Rev, d.Changed, d.Details = 0, time.Time{}, Stamp{}
	fp[DetailsKey] = hashOf(&d)
	for i := range p.Wells {
		w := p.Wells[i]
		w.Stamp = Stamp{}
		fp[w.ID] = hashOf(&w)
	}
	for i := range p.Tests {
		t := p.Tests[i]
		t.Stamp = Stamp{}
		// What the app derives from the rest is no change of its own:
		// the parsed values of the readings, the fit results (they
		// follow the readings and settings, and carry the time of the
		// fit).
		t.Result, t.Fits = nil, nil
		rs := make([]Reading, len(t.Readings))
		for j, r := range t.Readings {
			rs[j] = Reading{TimeText: r.TimeText, DepthText: r.DepthText}
		}
		t.Readings = rs
		if t.Logger != nil {
			lg := *t.Logger
			lg.Water, lg.Baro = lg.Water.withoutSamples(), lg.Baro.withoutSamples()
			t.Logger = &lg
		}
		fp[t.ID] = hashOf(&t)
	}
	return fp
}

func (r *LoggerRecord) withoutSamples() *LoggerRecord {
	if r == nil {
		return nil
	}
	q := *r
	q.Time, q.Value = nil, nil
	return &q
}

// hashOf is the FNV-1a hash of v's JSON; a value that cannot be written
// hashes to 0, which still differs from any real hash in practice.
func hashOf(v any) uint64 {
	b, err := jsonc.Marshal(v)
	if err != nil {
		return 0
	}
	h := fnv.New64a()
	h.Write(b)
	return h.Sum64()
}

// Touch updates the stamps of the objects of p whose content differs from
// before (as returned by Fingerprints for the project last saved), and of
// the objects that are new, as changed in session by at now. It returns
// the fingerprints of p as it is now, for the next call.
func Touch(p *Project, before map[string]uint64, by string, now time.Time) map[string]uint64 {
	after := Fingerprints(p)
	changed := func(key string) bool {
		old, ok := before[key]
		return !ok || old != after[key]
	}
	if changed(DetailsKey) {
		p.Details.bump(by, now)
	}
	for i := range p.Wells {
		if changed(p.Wells[i].ID) {
			p.Wells[i].Stamp.bump(by, now)
		}
	}
	for i := range p.Tests {
		if changed(p.Tests[i].ID) {
			p.Tests[i].Stamp.bump(by, now)
		}
	}
	return after
}
