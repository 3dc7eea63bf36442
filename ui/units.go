package ui

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"fieldfit/models/units"
	"fieldfit/ui/project"
)

// Display is the set of units a project is shown in. Values are stored in
// SI; conversion happens here, once, at the edge of the screen.
type Display struct {
	System         project.UnitSystem
	Length         units.Unit // depths, distances, drawdown
	Rate           units.Unit // the default unit for a new pumping rate
	Transmissivity units.Unit
	Conductivity   units.Unit
	Time           units.Unit // elapsed time of readings and windows
}

// DisplayFor returns the display units of a unit system (SI when unknown).
func DisplayFor(sys project.UnitSystem) Display {
	if sys == project.USCustomary {
		return Display{System: sys, Length: mustUnit("ft"), Rate: mustUnit("US gpm"),
			Transmissivity: mustUnit("ft²/d"), Conductivity: mustUnit("ft/d"), Time: mustUnit("min")}
	}
	return Display{System: project.SI, Length: mustUnit("m"), Rate: mustUnit("L/s"),
		Transmissivity: mustUnit("m²/d"), Conductivity: mustUnit("m/d"), Time: mustUnit("min")}
}

// RateUnits are the units offered for a pumping rate in a unit system.
func RateUnits(sys project.UnitSystem) []units.Unit {
	syms := []string{"L/s", "m³/h", "m³/d", "L/min", "m³/s"}
	if sys == project.USCustomary {
		syms = []string{"US gpm", "US gpd"}
	}
	us := make([]units.Unit, len(syms))
	for i, s := range syms {
		us[i] = mustUnit(s)
	}
	return us
}

func mustUnit(sym string) units.Unit {
	u, ok := units.Lookup(sym)
	if !ok {
		panic("ui: unit " + sym + " missing from models/units")
	}
	return u
}

// errNotNumber is wrapped by the errors of parseNumber.
var errNotNumber = errors.New("is not a number")

// parseNumber reads a decimal number as typed on a tablet: surrounding
// spaces are ignored and a single comma is taken as the decimal mark when
// there is no point ("7,42"). NaN and infinities are refused.
func parseNumber(text string) (float64, error) {
	s := strings.TrimSpace(text)
	if s == "" {
		return 0, fmt.Errorf("nothing typed: %w", errNotNumber)
	}
	if strings.Count(s, ",") == 1 && !strings.Contains(s, ".") {
		s = strings.Replace(s, ",", ".", 1)
	}
	s = strings.Replace(s, "−", "-", 1) // U+2212 minus sign
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q %w", strings.TrimSpace(text), errNotNumber)
	}
	return v, nil
}

// entryFrom parses text typed in unit u into an Entry that keeps the text.
func entryFrom(text string, u units.Unit) (project.Entry, error) {
	e := project.Entry{Text: text, Unit: u.Symbol}
	if strings.TrimSpace(text) == "" {
		e.Text = ""
		return e, nil
	}
	v, err := parseNumber(text)
	if err != nil {
		return e, err
	}
	e.SI, e.OK = u.ToSI(v), true
	return e, nil
}

// shownText is the text an input shows for an entry in display unit u:
// what was typed when it was typed in u, else the SI value converted.
func shownText(e project.Entry, u units.Unit) string {
	if e.Unit == u.Symbol || e.Unit == "" || !e.OK {
		return e.Text
	}
	return formatPlain(u.FromSI(e.SI))
}

// formatSig formats v with sig significant digits, in plain decimal
// between 0.001 and 10⁶ and as m × 10ⁿ outside.
func formatSig(v float64, sig int) string {
	switch {
	case math.IsNaN(v):
		return "—"
	case math.IsInf(v, 1):
		return "∞"
	case math.IsInf(v, -1):
		return "−∞"
	case v == 0:
		return "0"
	}
	a := math.Abs(v)
	if a >= 1e-3 && a < 1e6 {
		exp := int(math.Floor(math.Log10(a)))
		dec := sig - 1 - exp
		if dec < 0 {
			dec = 0
		}
		return minus(strconv.FormatFloat(v, 'f', dec, 64))
	}
	s := strconv.FormatFloat(v, 'e', sig-1, 64)
	mant, exp, _ := strings.Cut(s, "e")
	n, _ := strconv.Atoi(exp)
	return minus(mant) + " × 10" + superscript(n)
}

// formatPlain formats v with up to 6 significant digits, no exponent
// where avoidable, for putting back into an input.
func formatPlain(v float64) string {
	return strconv.FormatFloat(v, 'g', 6, 64)
}

func minus(s string) string { return strings.Replace(s, "-", "−", 1) }

func superscript(n int) string {
	const digits = "⁰¹²³⁴⁵⁶⁷⁸⁹"
	d := []rune(digits)
	s := strconv.Itoa(n)
	var b strings.Builder
	for _, c := range s {
		if c == '-' {
			b.WriteRune('⁻')
		} else {
			b.WriteRune(d[c-'0'])
		}
	}
	return b.String()
}
