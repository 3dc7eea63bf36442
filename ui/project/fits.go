package project

import "time"

// TestKind says what kind of field test a Test is.
type TestKind string

const (
	// PumpingTest is a pumping test: constant rate or a rate schedule,
	// drawdown and recovery read in the pumping well and observation
	// wells. It is the zero value.
	PumpingTest TestKind = ""
	// SlugTest is a rising- or falling-head slug test in one well.
	SlugTest TestKind = "slug"
	// InfiltrationTest is a single- or double-ring infiltration test or a
	// borehole percolation test.
	InfiltrationTest TestKind = "infiltration"
	// DecayTest is a decay curve: any quantity relaxing to a baseline.
	DecayTest TestKind = "decay"
)

// Valid reports whether k is one of the known kinds.
func (k TestKind) Valid() bool {
	switch k {
	case PumpingTest, SlugTest, InfiltrationTest, DecayTest:
		return true
	}
	return false
}

// NamedEstimate is one fitted parameter of any model with its 95 %
// confidence interval, in SI units.
type NamedEstimate struct {
	// Name is the model's parameter name, for example "T", "S", "B",
	// "K", "k".
	Name string `json:"name"`
	// Unit is the SI unit symbol of the value, for example "m²/s"; empty
	// for a dimensionless parameter.
	Unit  string  `json:"unit,omitempty"`
	Value float64 `json:"value"`
	Lower float64 `json:"lower"`
	Upper float64 `json:"upper"`
	// NoCI says that the fit gave no confidence interval (the
	// parameters cannot be told apart from the data); Lower and Upper
	// are then 0.
	NoCI bool `json:"noCI,omitempty"`
}

// ModelFit is the outcome of fitting one model to a test, in SI units:
// one row of the comparison table and of the report.
type ModelFit struct {
	// Model names the model, for example "theis", "hantush",
	// "hvorslev", "horton", "decay".
	Model string `json:"model"`
	// Params are the fitted parameters in the model's order, with
	// derived ones (K = T/b, a half-life) after them.
	Params []NamedEstimate `json:"params"`
	// RMSE is the root-mean-square residual in the unit of the fitted
	// quantity (m for drawdown and head).
	RMSE float64 `json:"rmse"`
	// AICc is the small-sample Akaike information criterion of the fit;
	// only differences between fits of the same data mean anything.
	AICc       float64 `json:"aicc,omitempty"`
	N          int     `json:"n"`
	Iterations int     `json:"iterations,omitempty"`
	Status     string  `json:"status,omitempty"`
	// Warnings are plain sentences: identifiability, validity, data.
	Warnings []string `json:"warnings,omitempty"`
	// Notes are plain sentences about the fit that are not warnings: the
	// assumptions of the method, how H0 was found, plausibility lines.
	Notes []string `json:"notes,omitempty"`
	// Inputs fingerprints the data and settings that were fitted, so a
	// stale fit can be told from a current one.
	Inputs string    `json:"inputs,omitempty"`
	At     time.Time `json:"at"`
}

// Param returns the estimate named name and whether there is one.
func (f *ModelFit) Param(name string) (NamedEstimate, bool) {
	for _, p := range f.Params {
		if p.Name == name {
			return p, true
		}
	}
	return NamedEstimate{}, false
}
