package project

// Models of a pumping test beyond Theis and Cooper–Jacob (values of
// FitSettings.Model and ModelFit.Model).
const (
	// Hantush is the Hantush–Jacob (1955) leaky aquifer.
	Hantush Model = "hantush"
	// TheisNoFlow is Theis with one straight no-flow boundary (image
	// well).
	TheisNoFlow Model = "theis-no-flow"
	// TheisConstantHead is Theis with one straight constant-head boundary
	// (image well).
	TheisConstantHead Model = "theis-constant-head"
	// RecoveryLine is the Theis (1935) recovery straight line: residual
	// drawdown against log(t/t′).
	RecoveryLine Model = "theis-recovery-line"
)

// PumpData holds what a pumping test has beyond one constant rate read in
// one well: the pump's stop (readings after it are recovery), the steps
// of the rate, more observation wells with their readings, and the
// settings of the analyses that use them. The zero value is a test
// pumped at Test.Rate from its start with no stop, read in one well.
type PumpData struct {
	// Stop is when the pump stopped (s since it started); zero when it
	// has not or is not given. StopText keeps what was typed (minutes).
	Stop     float64 `json:"stopS,omitempty"`
	StopText string  `json:"stopText,omitempty"`
	// Steps are the changes of rate after the start, in the order typed;
	// the first rate is Test.Rate from time zero.
	Steps []RateStepEntry `json:"steps,omitempty"`
	// Main is the weight and bearing of the test's own observation well
	// (Test.ObservationWell) in a joint fit.
	Main WellSetting `json:"main,omitempty"`
	// Wells are the other observation wells read during the test.
	Wells []WellReadings `json:"wells,omitempty"`
	// Boundary is the distance a (m) from the pumping well to a straight
	// boundary when it is given; zero fits it. BoundaryText keeps what was
	// typed (display length unit).
	Boundary     float64 `json:"boundaryM,omitempty"`
	BoundaryText string  `json:"boundaryText,omitempty"`
	// Jacob applies Jacob's correction s′ = s − s²/(2b) for an unconfined
	// aquifer to the drawdowns fitted by Theis and Cooper–Jacob.
	Jacob bool `json:"jacob,omitempty"`
	// DistanceAt is the time (s) of the distance–drawdown analysis; zero
	// means the latest time every well has read. The text is in minutes.
	DistanceAt     float64 `json:"distanceAtS,omitempty"`
	DistanceAtText string  `json:"distanceAtText,omitempty"`
	// StepDuration is the equal duration Δt (s) at which each step's
	// drawdown is taken in the step-drawdown analysis; zero means the
	// shortest step. The text is in minutes.
	StepDuration     float64 `json:"stepDurationS,omitempty"`
	StepDurationText string  `json:"stepDurationText,omitempty"`
	// Rorabaugh asks for Rorabaugh's exponent n besides Jacob's law.
	Rorabaugh bool `json:"rorabaugh,omitempty"`
	// EfficiencyRate is the rate (m³/s) at which the well efficiency is
	// given; zero means each step's rate. The text is in the rate unit.
	EfficiencyRate     float64 `json:"efficiencyRate,omitempty"`
	EfficiencyRateText string  `json:"efficiencyRateText,omitempty"`
}

// RateStepEntry is one change of the pumping rate as typed: from Start
// (s since the pump started; the text in minutes) the rate is Rate
// (m³/s; the text in the unit of Test.Rate, 0 for a stop). OK reports
// whether both texts could be read.
type RateStepEntry struct {
	StartText string  `json:"start"`
	RateText  string  `json:"rate"`
	Start     float64 `json:"startS,omitempty"`
	Rate      float64 `json:"rateSI,omitempty"`
	OK        bool    `json:"ok,omitempty"`
}

// WellSetting is how one observation well enters a joint fit: its
// weight relative to the other wells (zero means 1) and its bearing, the
// angle in degrees at the pumping well between the direction to this well
// and the direction to a straight boundary (used by the boundary models;
// empty means 90°, alongside). The texts keep what was typed.
type WellSetting struct {
	Weight      float64 `json:"weight,omitempty"`
	WeightText  string  `json:"weightText,omitempty"`
	Bearing     float64 `json:"bearingDeg,omitempty"`
	BearingText string  `json:"bearingText,omitempty"`
	BearingOK   bool    `json:"bearingOK,omitempty"`
}

// WellReadings are the readings of one more observation well of a test,
// on the test's clock and in its time mode and depth unit.
type WellReadings struct {
	// WellID is the Well read.
	WellID string `json:"wellId"`
	// StaticLevel is the depth to water before pumping (m).
	StaticLevel Entry       `json:"staticLevel"`
	Readings    []Reading   `json:"readings"`
	Setting     WellSetting `json:"setting,omitempty"`
}

// clone returns a deep copy of p.
func (p *PumpData) clone() *PumpData {
	if p == nil {
		return nil
	}
	q := *p
	q.Steps = append([]RateStepEntry(nil), p.Steps...)
	q.Wells = append([]WellReadings(nil), p.Wells...)
	for i := range q.Wells {
		q.Wells[i].Readings = append([]Reading(nil), p.Wells[i].Readings...)
	}
	return &q
}
