package units

import (
	"errors"
	"fmt"
	"strings"
)

// Errors returned by Convert, wrapped with the symbols concerned.
var (
	ErrUnknownUnit = errors.New("unknown unit")
	ErrMismatch    = errors.New("units measure different quantities")
)

// Quantity is a kind of physical quantity that the UI lets the user enter
// in a unit of choice.
type Quantity int

const (
	// Dimensionless quantities (storativity, ratios) have the single
	// unit "1".
	Dimensionless  Quantity = iota
	Length                  // m: depth to water, drawdown, distance
	Time                    // s
	Volume                  // m³
	Rate                    // m³/s: pumping rate
	Transmissivity          // m²/s
	Conductivity            // m/s: hydraulic conductivity, infiltration rate
	Pressure                // Pa: transducer and barometric readings
	numQuantities
)

var quantityNames = [...]string{
	Dimensionless:  "dimensionless",
	Length:         "length",
	Time:           "time",
	Volume:         "volume",
	Rate:           "rate",
	Transmissivity: "transmissivity",
	Conductivity:   "conductivity",
	Pressure:       "pressure",
}

func (q Quantity) String() string {
	if q < 0 || q >= numQuantities {
		return fmt.Sprintf("Quantity(%d)", int(q))
	}
	return quantityNames[q]
}

// Unit is a unit of measure with its factor to the SI unit of its
// quantity.
type Unit struct {
	// Symbol is the symbol shown to the user, e.g. "m³/d".
	Symbol string
	// Name is the unit's name in words, e.g. "cubic metre per day".
	Name string
	// Quantity is the kind of quantity the unit measures.
	Quantity Quantity
	// Factor is the value in SI units of one of this unit.
	Factor float64
	// Exact reports whether Factor is exact by definition (to float64
	// rounding).
	Exact bool
	// Aliases are other spellings Lookup accepts, e.g. "m3/d". The
	// slice is shared and must not be modified.
	Aliases []string
}

// ToSI converts v from u to the SI unit of u's quantity.
func (u Unit) ToSI(v float64) float64 { return v * u.Factor }

// FromSI converts v from the SI unit of u's quantity to u.
func (u Unit) FromSI(v float64) float64 { return v / u.Factor }

func (u Unit) String() string { return u.Symbol }

// table lists every unit, grouped by quantity, the SI unit first in each
// group; Of returns the groups in this order.
var table = []Unit{
	{"1", "dimensionless", Dimensionless, 1, true, []string{"-"}},

	{"m", "metre", Length, Metre, true, nil},
	{"cm", "centimetre", Length, Centimetre, true, nil},
	{"mm", "millimetre", Length, Millimetre, true, nil},
	{"ft", "foot", Length, Foot, true, []string{"feet"}},
	{"in", "inch", Length, Inch, true, nil},

	{"s", "second", Time, Second, true, []string{"sec"}},
	{"min", "minute", Time, Minute, true, nil},
	{"h", "hour", Time, Hour, true, []string{"hr"}},
	{"d", "day", Time, Day, true, []string{"day"}},

	{"m³", "cubic metre", Volume, CubicMetre, true, []string{"m3"}},
	{"L", "litre", Volume, Litre, true, []string{"l"}},
	{"US gal", "US gallon", Volume, USGallon, true, []string{"gal"}},

	{"m³/s", "cubic metre per second", Rate, CubicMetrePerSecond, true, []string{"m3/s"}},
	{"L/s", "litre per second", Rate, LitrePerSecond, true, []string{"l/s"}},
	{"L/min", "litre per minute", Rate, LitrePerMinute, true, []string{"l/min"}},
	{"m³/h", "cubic metre per hour", Rate, CubicMetrePerHour, true, []string{"m3/h"}},
	{"m³/d", "cubic metre per day", Rate, CubicMetrePerDay, true, []string{"m3/d"}},
	{"US gpm", "US gallon per minute", Rate, USGallonPerMinute, true, []string{"gpm", "gal/min"}},
	{"US gpd", "US gallon per day", Rate, USGallonPerDay, true, []string{"gpd", "gal/d"}},

	{"m²/s", "square metre per second", Transmissivity, SquareMetrePerSecond, true, []string{"m2/s"}},
	{"m²/d", "square metre per day", Transmissivity, SquareMetrePerDay, true, []string{"m2/d"}},
	{"ft²/d", "square foot per day", Transmissivity, SquareFootPerDay, true, []string{"ft2/d"}},
	{"US gpd/ft", "US gallon per day per foot", Transmissivity, USGallonPerDayPerFoot, true, []string{"gpd/ft"}},

	{"m/s", "metre per second", Conductivity, MetrePerSecond, true, nil},
	{"m/d", "metre per day", Conductivity, MetrePerDay, true, nil},
	{"ft/d", "foot per day", Conductivity, FootPerDay, true, nil},
	{"cm/s", "centimetre per second", Conductivity, CentimetrePerSecond, true, nil},
	{"cm/h", "centimetre per hour", Conductivity, CentimetrePerHour, true, nil},
	{"mm/h", "millimetre per hour", Conductivity, MillimetrePerHour, true, nil},
	{"in/h", "inch per hour", Conductivity, InchPerHour, true, nil},
	{"US gpd/ft²", "US gallon per day per square foot", Conductivity, USGallonPerDayPerSquareFoot, true, []string{"gpd/ft2"}},

	{"Pa", "pascal", Pressure, Pascal, true, nil},
	{"kPa", "kilopascal", Pressure, Kilopascal, true, nil},
	{"hPa", "hectopascal", Pressure, Hectopascal, true, nil},
	{"mbar", "millibar", Pressure, Millibar, true, nil},
	{"bar", "bar", Pressure, Bar, true, nil},
	{"psi", "pound-force per square inch", Pressure, Psi, true, nil},
	{"m H₂O", "metre of water (4 °C)", Pressure, MetreOfWater, false, []string{"mH2O", "m H2O", "mH₂O"}},
	{"cm H₂O", "centimetre of water (4 °C)", Pressure, CentimetreOfWater, false, []string{"cmH2O", "cm H2O", "cmH₂O"}},
	{"ft H₂O", "foot of water (4 °C)", Pressure, FootOfWater, false, []string{"ftH2O", "ft H2O", "ftH₂O"}},
	{"in H₂O", "inch of water (4 °C)", Pressure, InchOfWater, false, []string{"inH2O", "in H2O", "inH₂O"}},
}

var bySymbol = func() map[string]int {
	m := make(map[string]int, 2*len(table))
	add := func(s string, i int) {
		if _, dup := m[s]; dup {
			panic("units: duplicate symbol " + s)
		}
		m[s] = i
	}
	for i, u := range table {
		add(u.Symbol, i)
		for _, a := range u.Aliases {
			add(a, i)
		}
	}
	return m
}()

// Lookup returns the unit with the given symbol or alias. Surrounding
// spaces are ignored; case matters ("m" is not "M").
func Lookup(symbol string) (Unit, bool) {
	i, ok := bySymbol[strings.TrimSpace(symbol)]
	if !ok {
		return Unit{}, false
	}
	return table[i], true
}

// Of returns the units of quantity q, the SI unit first. The slice is a
// fresh copy.
func Of(q Quantity) []Unit {
	var us []Unit
	for _, u := range table {
		if u.Quantity == q {
			us = append(us, u)
		}
	}
	return us
}

// SI returns the SI unit of quantity q (the first of Of(q)).
func SI(q Quantity) Unit {
	for _, u := range table {
		if u.Quantity == q {
			return u
		}
	}
	return Unit{}
}

// Convert converts v from the unit with symbol from to the unit with
// symbol to. It fails when a symbol is unknown or the units measure
// different quantities.
func Convert(v float64, from, to string) (float64, error) {
	f, ok := Lookup(from)
	if !ok {
		return 0, fmt.Errorf("units: %w: %q", ErrUnknownUnit, from)
	}
	t, ok := Lookup(to)
	if !ok {
		return 0, fmt.Errorf("units: %w: %q", ErrUnknownUnit, to)
	}
	if f.Quantity != t.Quantity {
		return 0, fmt.Errorf("units: cannot convert %s (%v) to %s (%v): %w", f.Symbol, f.Quantity, t.Symbol, t.Quantity, ErrMismatch)
	}
	return t.FromSI(f.ToSI(v)), nil
}
