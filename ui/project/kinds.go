package project

// KindSetup is what a slug test, an infiltration test or a decay curve
// holds besides the fields every Test has: the numbers and choices of
// its entry form, its readings and the settings of its fit step. Its
// fitted models are in Test.Fits, one per model.
//
// The form's numbers and choices are keyed by the names listed in
// FORMAT.md (for example "casing-radius", "shape"), so that a field added
// to a form needs no change of the file format. A key that is missing
// means nothing was typed or chosen there (the form's default).
type KindSetup struct {
	// Values are the numbers typed, by field key. Each Entry keeps the
	// text as typed and the unit it was typed in; SI holds the value in
	// SI units when OK (a dimensionless number, or a decay value in the
	// user's own unit, is stored as typed).
	Values map[string]Entry `json:"values,omitempty"`
	// Options are the choices made, by key.
	Options map[string]string `json:"options,omitempty"`
	// Rows are the readings in the order typed.
	Rows []KindRow `json:"rows,omitempty"`
	// Model is the model shown in the fit step (the ModelFit.Model
	// name, for example "hvorslev"); empty means the kind's first.
	Model string `json:"model,omitempty"`
	// WindowStart and WindowEnd bound the times fitted, s since the start
	// of the test; zero leaves that side open. The texts keep what was
	// typed, in the readings' time unit.
	WindowStart     float64 `json:"windowStartS,omitempty"`
	WindowEnd       float64 `json:"windowEndS,omitempty"`
	WindowStartText string  `json:"windowStartText,omitempty"`
	WindowEndText   string  `json:"windowEndText,omitempty"`
}

// KindRow is one reading as typed: the time since the start of the test
// (in the test's time unit), the value (depth to water or displacement of
// a slug test, water level or volume added of an infiltration test, the
// decaying quantity of a decay curve) and, for infiltration level
// readings only, the level the ring was refilled to right after this
// reading (empty: no refill).
type KindRow struct {
	Time   string `json:"time"`
	Value  string `json:"value"`
	Refill string `json:"refill,omitempty"`
}

// Blank reports whether nothing is typed in the row.
func (r KindRow) Blank() bool { return r.Time == "" && r.Value == "" && r.Refill == "" }

// Option returns the choice under key, or def when none was made.
func (s *KindSetup) Option(key, def string) string {
	if v, ok := s.Options[key]; ok && v != "" {
		return v
	}
	return def
}

// SetOption records a choice.
func (s *KindSetup) SetOption(key, value string) {
	if s.Options == nil {
		s.Options = map[string]string{}
	}
	s.Options[key] = value
}

// SetValue records a number typed; an empty text removes it.
func (s *KindSetup) SetValue(key string, e Entry) {
	if e.Empty() && e.Unit == "" {
		delete(s.Values, key)
		return
	}
	if s.Values == nil {
		s.Values = map[string]Entry{}
	}
	s.Values[key] = e
}

func (s *KindSetup) clone() *KindSetup {
	if s == nil {
		return nil
	}
	c := *s
	c.Values = make(map[string]Entry, len(s.Values))
	for k, v := range s.Values {
		c.Values[k] = v
	}
	c.Options = make(map[string]string, len(s.Options))
	for k, v := range s.Options {
		c.Options[k] = v
	}
	c.Rows = append([]KindRow(nil), s.Rows...)
	return &c
}

func cloneFits(fs []ModelFit) []ModelFit {
	if fs == nil {
		return nil
	}
	out := make([]ModelFit, len(fs))
	for i, f := range fs {
		f.Params = append([]NamedEstimate(nil), f.Params...)
		f.Warnings = append([]string(nil), f.Warnings...)
		f.Notes = append([]string(nil), f.Notes...)
		out[i] = f
	}
	return out
}
