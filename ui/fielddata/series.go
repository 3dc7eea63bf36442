package fielddata

import (
	"fmt"
	"math"

	"fieldfit/models/units"
)

// Series is one record of readings for conditioning: times and values in
// SI, as Record.Series returns them.
type Series struct {
	Name string
	Kind ValueKind
	// Unit is the unit the file gave, for display only.
	Unit string
	// Density (kg/m³) is the water density a Pressure series was turned
	// into head with; 0 means units.WaterDensity.
	Density float64
	// Clock reports that Time holds Unix seconds (else elapsed seconds).
	Clock bool
	// Time (s) and Value (m: depth, level, or head of water for
	// pressure) have one entry per reading.
	Time, Value []float64
	// Row, when not nil, holds each reading's line in its file.
	Row []int32
}

// Len returns the number of readings.
func (s Series) Len() int { return len(s.Time) }

// check reports whether the series can be conditioned.
func (s Series) check(what string) error {
	if len(s.Time) != len(s.Value) || (s.Row != nil && len(s.Row) != len(s.Time)) {
		return fmt.Errorf("%s series %q: %w: %d times, %d values", what, s.Name, ErrSeries, len(s.Time), len(s.Value))
	}
	if len(s.Time) == 0 {
		return fmt.Errorf("%s series %q: %w: no readings", what, s.Name, ErrSeries)
	}
	for i := range s.Time {
		if math.IsNaN(s.Time[i]) || math.IsInf(s.Time[i], 0) || math.IsNaN(s.Value[i]) || math.IsInf(s.Value[i], 0) {
			return fmt.Errorf("%s series %q: %w: reading %d (%s) is not finite", what, s.Name, ErrSeries, i, s.rowName(i))
		}
	}
	switch s.Kind {
	case Depth, Level, Pressure:
	default:
		return fmt.Errorf("%s series %q: %w: unknown kind %q", what, s.Name, ErrSeries, s.Kind)
	}
	return nil
}

func (s Series) rowName(i int) string {
	if s.Row != nil && i < len(s.Row) {
		return fmt.Sprintf("row %d", s.Row[i])
	}
	return fmt.Sprintf("reading %d", i+1)
}

func (s Series) density() float64 {
	if s.Density == 0 {
		return units.WaterDensity
	}
	return s.Density
}
