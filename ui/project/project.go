package project

import (
	"encoding/hex"
	"math/rand/v2"
	"slices"
	"time"
)

// UnitSystem says in which units a project shows and takes its numbers.
// Values are stored in SI whatever the system.
type UnitSystem string

const (
	// SI shows lengths in metres, rates in litres per second and
	// transmissivity in square metres per day.
	SI UnitSystem = "si"
	// USCustomary shows lengths in feet, rates in US gallons per minute and
	// transmissivity in square feet per day.
	USCustomary UnitSystem = "us"
)

// Valid reports whether u is one of the known unit systems.
func (u UnitSystem) Valid() bool { return u == SI || u == USCustomary }

// WellKind says what a well is used for in a test.
type WellKind string

const (
	// Pumping is the well the pump runs in.
	Pumping WellKind = "pumping"
	// Observation is a well in which only the water level is read.
	Observation WellKind = "observation"
)

// Entry is a number the user typed. Text is exactly what was typed, Unit
// the symbol of the unit it was typed in (for example "m" or "ft"), and SI
// the value in SI units when OK is true. An Entry with OK false keeps its
// Text so that nothing typed is lost; Empty reports whether nothing was
// typed at all.
type Entry struct {
	Text string  `json:"text,omitempty"`
	Unit string  `json:"unit,omitempty"`
	SI   float64 `json:"si,omitempty"`
	OK   bool    `json:"ok,omitempty"`
}

// Empty reports whether the entry holds no text.
func (e Entry) Empty() bool { return e.Text == "" }

// Value returns the SI value and whether there is one.
func (e Entry) Value() (float64, bool) { return e.SI, e.OK }

// Project is one site with its wells and tests: the unit of storage and of
// the project file.
type Project struct {
	// ID is a random hexadecimal identifier (NewID), stable for the life
	// of the project, also across duplicates' sources.
	ID   string `json:"id"`
	Name string `json:"name"`
	Site string `json:"site,omitempty"`
	// Units is the unit system the project is shown in. The zero value
	// is treated as SI.
	Units UnitSystem `json:"units"`
	// Thickness is the saturated aquifer thickness b (m), when known. It
	// gives K = T/b.
	Thickness Entry  `json:"thickness,omitempty"`
	Wells     []Well `json:"wells"`
	Tests     []Test `json:"tests"`
	Notes     string `json:"notes,omitempty"`
	// Rev counts saved changes; the store uses it to keep the latest.
	Rev int64 `json:"rev"`
	// Changed is the time of the last change, in UTC.
	Changed time.Time `json:"changed"`
	// Demo marks the invented example project offered on first start.
	Demo bool `json:"demo,omitempty"`
	// Details is the revision record of the project's own fields (name,
	// site, units, thickness, notes, …: all but Wells and Tests).
	Details Stamp `json:"details"`
}

// Well is a pumping or an observation well.
type Well struct {
	ID   string   `json:"id"`
	Name string   `json:"name"`
	Kind WellKind `json:"kind"`
	// Radius is the well (casing) radius (m).
	Radius Entry `json:"radius,omitempty"`
	// ScreenTop and ScreenBottom are depths of the screened interval
	// below the measuring point (m).
	ScreenTop    Entry `json:"screenTop,omitempty"`
	ScreenBottom Entry `json:"screenBottom,omitempty"`
	// MPElevation is the elevation of the measuring point (m above the
	// local datum).
	MPElevation Entry `json:"mpElevation,omitempty"`
	// Distance is the radial distance r from the pumping well (m); for
	// the pumping well itself it is unused (its radius stands in).
	Distance Entry `json:"distance,omitempty"`
	// Stamp is the well's revision record.
	Stamp Stamp `json:"stamp"`
}

// TimeMode says how the times of readings are typed.
type TimeMode string

const (
	// ElapsedMinutes: minutes since the pump started, e.g. "12.5".
	ElapsedMinutes TimeMode = "elapsed-min"
	// ClockTime: the time of day read off a watch, e.g. "10:42" or
	// "10:42:30", on the day of the start (or the following days when the
	// clock wraps past midnight).
	ClockTime TimeMode = "clock"
)

// Model names the analytical model of a fit.
type Model string

const (
	// Theis is the Theis (1935) solution for a confined aquifer.
	Theis Model = "theis"
	// CooperJacob is the Cooper–Jacob (1946) straight-line approximation.
	CooperJacob Model = "cooper-jacob"
)

// Test is one field test of a project. Kind says which; the zero value is
// a pumping test (constant rate, read in one well), the only kind of
// format versions 1 and 2.
type Test struct {
	ID   string `json:"id"`
	Name string `json:"name"`
	// Kind is the kind of test; zero means PumpingTest.
	Kind TestKind `json:"kind,omitempty"`
	// Start is when the pump started (local wall-clock time stored as
	// given, without zone conversion). StartText keeps what was typed.
	Start     time.Time `json:"start"`
	StartText string    `json:"startText,omitempty"`
	// Rate is the pumping rate Q (m³/s); Rate.Unit records the unit the
	// user typed it in.
	Rate Entry `json:"rate"`
	// StaticLevel is the depth to water below the measuring point before
	// pumping (m).
	StaticLevel Entry `json:"staticLevel"`
	// PumpingWell and ObservationWell are Well IDs. The readings are taken
	// in ObservationWell; when it is the pumping well itself, r is its
	// radius.
	PumpingWell     string `json:"pumpingWell,omitempty"`
	ObservationWell string `json:"observationWell,omitempty"`
	// TimeMode says how reading times are typed; zero means
	// ElapsedMinutes.
	TimeMode TimeMode `json:"timeMode,omitempty"`
	// DepthUnit is the symbol of the unit the depths of the readings are
	// typed in ("m", "ft"); empty means metres.
	DepthUnit string `json:"depthUnit,omitempty"`
	// Readings are in the order typed (the row order of the table).
	Readings []Reading   `json:"readings"`
	Fit      FitSettings `json:"fit"`
	// Result is the last fit, nil before the first.
	Result *FitResult `json:"result,omitempty"`
	// Fits are the models fitted to this test, one per model, for the
	// comparison table; the user's choice stays with the user.
	Fits []ModelFit `json:"fits,omitempty"`
	// Source says which readings the fit uses: the table above (FromTape,
	// also when empty) or the logger record (FromLogger).
	Source Source `json:"source,omitempty"`
	// Logger holds the imported logger records and their conditioning;
	// nil before the first import.
	Logger *LoggerData `json:"logger,omitempty"`
	// Setup is the entry form, readings and fit settings of a slug test,
	// infiltration test or decay curve (see KindSetup); nil for a
	// pumping test.
	Setup *KindSetup `json:"setup,omitempty"`
	// Stamp is the test's revision record: every field of the test,
	// also those added later, counts as a change of the test.
	Stamp Stamp `json:"stamp"`
	// Pump holds the stop, rate steps and more observation wells of a
	// pumping test; nil for one constant rate read in one well.
	Pump *PumpData `json:"pump,omitempty"`
}

// FitsLogger reports whether the fit uses the logger record.
func (t *Test) FitsLogger() bool { return t.Source == FromLogger }

// Reading is one row of the readings table: when, and the depth to water.
// TimeText and DepthText are exactly what was typed. Elapsed (s) and Depth
// (m) hold the parsed SI values when TimeOK and DepthOK are true.
type Reading struct {
	TimeText  string  `json:"time"`
	DepthText string  `json:"depth"`
	Elapsed   float64 `json:"elapsedS,omitempty"`
	Depth     float64 `json:"depthM,omitempty"`
	TimeOK    bool    `json:"timeOK,omitempty"`
	DepthOK   bool    `json:"depthOK,omitempty"`
}

// Blank reports whether nothing is typed in the row.
func (r Reading) Blank() bool { return r.TimeText == "" && r.DepthText == "" }

// FitSettings say how a test is fitted. The zero value works: Theis on
// every reading, with the defaults below.
type FitSettings struct {
	// Model is the model to fit; zero means Theis.
	Model Model `json:"model,omitempty"`
	// WindowStart and WindowEnd bound the elapsed times (s) used in the
	// fit; zero means no bound on that side. The texts keep what was
	// typed (in minutes).
	WindowStart     float64 `json:"windowStartS,omitempty"`
	WindowEnd       float64 `json:"windowEndS,omitempty"`
	WindowStartText string  `json:"windowStartText,omitempty"`
	WindowEndText   string  `json:"windowEndText,omitempty"`
	// Smoothing is the Bourdet derivative window L in log cycles of time;
	// zero means 0.2. SmoothingText keeps what was typed.
	Smoothing     float64 `json:"smoothing,omitempty"`
	SmoothingText string  `json:"smoothingText,omitempty"`
	// CJUMax is the largest u = r²S/(4Tt) at which the Cooper–Jacob line
	// is taken as valid; zero means DefaultCJUMax (0.01).
	CJUMax float64 `json:"cjUMax,omitempty"`
	// Manual turns off the automatic refit when readings change; the zero
	// value refits automatically.
	Manual bool `json:"manual,omitempty"`
}

// Default values of FitSettings.
const (
	// DefaultSmoothing is the Bourdet window L in log cycles. Common
	// practice, no single source: values of 0.1–0.5 are usual.
	DefaultSmoothing = 0.2
	// DefaultCJUMax is the u below which Cooper–Jacob is taken as valid:
	// 0.01 after Cooper & Jacob (1946), Trans. AGU 27(4) (from memory), the
	// same default as models.LineSettings. 0.05 (many textbooks) and 0.1 (a
	// looser field rule) are common practice and can be chosen.
	DefaultCJUMax = 0.01
)

// ModelOrDefault returns the model, Theis when unset.
func (s FitSettings) ModelOrDefault() Model {
	if s.Model == "" {
		return Theis
	}
	return s.Model
}

// SmoothingOrDefault returns the smoothing window, DefaultSmoothing when
// unset.
func (s FitSettings) SmoothingOrDefault() float64 {
	if s.Smoothing <= 0 {
		return DefaultSmoothing
	}
	return s.Smoothing
}

// CJUMaxOrDefault returns the Cooper–Jacob u threshold, DefaultCJUMax when
// unset.
func (s FitSettings) CJUMaxOrDefault() float64 {
	if s.CJUMax <= 0 {
		return DefaultCJUMax
	}
	return s.CJUMax
}

// Estimate is a fitted value with its 95 % confidence interval, in SI.
type Estimate struct {
	Value float64 `json:"value"`
	Lower float64 `json:"lower"`
	Upper float64 `json:"upper"`
}

// FitResult is the outcome of the last fit of a test, in SI units.
type FitResult struct {
	Model Model `json:"model"`
	// T is transmissivity (m²/s), S storativity (–), K hydraulic
	// conductivity (m/s) when the aquifer thickness was known (HasK).
	T    Estimate `json:"T"`
	S    Estimate `json:"S"`
	K    Estimate `json:"K,omitempty"`
	HasK bool     `json:"hasK,omitempty"`
	// RMSE is the root-mean-square residual of drawdown (m).
	RMSE       float64 `json:"rmse"`
	Iterations int     `json:"iterations"`
	Status     string  `json:"status,omitempty"`
	// N is the number of readings used.
	N int `json:"n"`
	// EarliestValid is the earliest elapsed time (s) at which the
	// Cooper–Jacob line is valid for the fitted T and S.
	EarliestValid float64 `json:"earliestValidS,omitempty"`
	// Warnings are plain sentences: identifiability, validity, data.
	Warnings []string `json:"warnings,omitempty"`
	// Inputs fingerprints the readings and settings that were fitted, so
	// a stale result can be told from a current one.
	Inputs string    `json:"inputs,omitempty"`
	At     time.Time `json:"at"`
}

// NewID returns a new random identifier: 16 hexadecimal digits from
// math/rand/v2's global generator (ChaCha8, seeded by the runtime from
// the system's random source: in the browser crypto.getRandomValues).
// An identifier needs to be unique, not secret; crypto/rand would add
// its whole FIPS 140 module (about 40 kB gzipped) to app.wasm.
func NewID() string {
	var b [8]byte
	u := rand.Uint64()
	for i := range b {
		b[i] = byte(u >> (8 * i))
	}
	return hex.EncodeToString(b[:])
}

// New returns an empty project with a new ID, the given name and unit
// system.
func New(name string, units UnitSystem, now time.Time) *Project {
	if !units.Valid() {
		units = SI
	}
	return &Project{ID: NewID(), Name: name, Units: units, Changed: now.UTC(),
		Wells: []Well{}, Tests: []Test{}}
}

// Well returns the well with the given ID, or nil.
func (p *Project) Well(id string) *Well {
	for i := range p.Wells {
		if p.Wells[i].ID == id {
			return &p.Wells[i]
		}
	}
	return nil
}

// Test returns the test with the given ID, or nil.
func (p *Project) Test(id string) *Test {
	for i := range p.Tests {
		if p.Tests[i].ID == id {
			return &p.Tests[i]
		}
	}
	return nil
}

// RemoveWell deletes the well with the given ID and clears the references
// tests hold to it. It reports whether a well was removed.
func (p *Project) RemoveWell(id string) bool {
	for i := range p.Wells {
		if p.Wells[i].ID == id {
			p.Wells = append(p.Wells[:i], p.Wells[i+1:]...)
			for j := range p.Tests {
				t := &p.Tests[j]
				if t.PumpingWell == id {
					t.PumpingWell = ""
				}
				if t.ObservationWell == id {
					t.ObservationWell = ""
				}
				if t.Pump != nil {
					t.Pump.Wells = slices.DeleteFunc(t.Pump.Wells, func(w WellReadings) bool { return w.WellID == id })
				}
			}
			return true
		}
	}
	return false
}

// Clone returns a deep copy of p with the same IDs.
func (p *Project) Clone() *Project {
	q := *p
	q.Wells = append([]Well{}, p.Wells...)
	q.Tests = make([]Test, len(p.Tests))
	for i, t := range p.Tests {
		t.Readings = append([]Reading{}, t.Readings...)
		if t.Result != nil {
			r := *t.Result
			r.Warnings = append([]string(nil), t.Result.Warnings...)
			t.Result = &r
		}
		t.Logger = t.Logger.clone()
		t.Pump = t.Pump.clone()
		t.Setup = t.Setup.clone()
		t.Fits = cloneFits(t.Fits)
		q.Tests[i] = t
	}
	return &q
}

// Duplicate returns a deep copy of p under a new name, with new IDs for
// the project, its wells and its tests (references between them follow),
// Rev reset and Demo cleared.
func (p *Project) Duplicate(name string, now time.Time) *Project {
	q := p.Clone()
	q.ID = NewID()
	q.Name = name
	q.Rev = 0
	q.Demo = false
	q.Changed = now.UTC()
	ids := make(map[string]string, len(q.Wells))
	for i := range q.Wells {
		nid := NewID()
		ids[q.Wells[i].ID] = nid
		q.Wells[i].ID = nid
	}
	for i := range q.Tests {
		t := &q.Tests[i]
		t.ID = NewID()
		t.PumpingWell = ids[t.PumpingWell]
		t.ObservationWell = ids[t.ObservationWell]
		if t.Pump != nil {
			for k := range t.Pump.Wells {
				t.Pump.Wells[k].WellID = ids[t.Pump.Wells[k].WellID]
			}
		}
	}
	return q
}
