package units

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

// TestReferenceValues checks conversions against published values. The
// source is named beside each: "ref §9" is the project's reference
// folder §9 (exact values from 1 in = 0.0254 m and 1 US gal = 231 in³,
// NIST SP 811 (2008) App. B); "NIST B.8, from memory" are entries of NIST
// SP 811 (2008) Appendix B.8 recalled and not re-read.
func TestReferenceValues(t *testing.T) {
	tests := []struct {
		what   string
		from   string
		v      float64
		to     string
		want   float64
		tol    float64 // relative
		source string
	}{
		{"foot", "ft", 1, "m", 0.3048, 0, "ref §9 (exact)"},
		{"inch", "in", 1, "m", 0.0254, 0, "ref §9 (exact)"},
		{"US gallon", "US gal", 1, "m³", 3.785411784e-3, 1e-16, "ref §9 (exact)"},
		{"gpm in m³/s", "US gpm", 1, "m³/s", 6.30901964e-5, 1e-15, "ref §9 (exact)"},
		{"gpm in m³/d", "US gpm", 1, "m³/d", 5.45099296896, 1e-15, "ref §9 (exact)"},
		{"gpd/ft in m²/d", "US gpd/ft", 1, "m²/d", 0.01241933, 5e-7, "ref §9 (7 digits)"},
		{"gpd/ft in ft²/d", "US gpd/ft", 1, "ft²/d", 0.1336805556, 5e-10, "ref §9 (10 digits)"},
		{"gpd/ft² in m/d", "US gpd/ft²", 1, "m/d", 0.0407458333, 1.3e-9, "ref §9 (9 digits)"},
		{"psi", "psi", 1, "Pa", 6894.757293, 1e-10, "ref §9 (10 digits)"},
		{"mbar", "mbar", 1, "Pa", 100, 0, "ref §9 (exact)"},
		{"metre of water", "m H₂O", 1, "Pa", 999.97 * 9.80665, 1e-15, "ref §9 (ρ = 999.97 kg/m³, g = 9.80665 m/s²)"},
		{"centimetre of water", "cm H₂O", 1, "Pa", 98.0638, 5e-6, "NIST B.8 (4 °C), from memory"},
		{"inch of water", "in H₂O", 1, "Pa", 249.082, 5e-6, "NIST B.8 (39.2 °F), from memory"},
		{"foot of water", "ft H₂O", 1, "Pa", 2988.98, 5e-6, "NIST B.8 (39.2 °F), from memory"},
		{"L/s in m³/d", "L/s", 1, "m³/d", 86.4, 1e-15, "exact: 1e-3 m³ × 86400 s/d"},
		{"m²/d in m²/s", "m²/d", 86400, "m²/s", 1, 1e-15, "exact: 86400 s/d"},
		{"ft/d in m/s", "ft/d", 1, "m/s", 0.3048 / 86400, 1e-15, "exact: ref §9 foot"},
		{"in/h in mm/h", "in/h", 1, "mm/h", 25.4, 1e-15, "exact: ref §9 inch"},
		{"day in min", "d", 1, "min", 1440, 0, "exact"},
	}
	for _, tc := range tests {
		t.Run(tc.what, func(t *testing.T) {
			got, err := Convert(tc.v, tc.from, tc.to)
			if err != nil {
				t.Fatal(err)
			}
			if e := relErr(got, tc.want); e > tc.tol {
				t.Errorf("%g %s = %.15g %s, want %.15g (%s); relative error %.2g", tc.v, tc.from, got, tc.to, tc.want, tc.source, e)
			}
		})
	}
}

// TestSquareFoot checks the derived area factor against ref §9 (exact):
// 1 ft² = 0.09290304 m².
func TestSquareFoot(t *testing.T) {
	if got, want := Foot*Foot, 0.09290304; got != want {
		t.Errorf("Foot² = %.17g, want %.17g (ref §9, exact)", got, want)
	}
	// Constants are evaluated exactly: the float64 factor is the rounding
	// of the exact value.
	if got, want := SquareFootPerDay*86400, 0.09290304; relErr(got, want) > 2e-16 {
		t.Errorf("SquareFootPerDay·86400 = %.17g, want %.17g", got, want)
	}
}

func TestRoundTrip(t *testing.T) {
	values := []float64{0, 1, -2.5, 1e-9, 123456.789, 6.02e23, 1e-290, -3e290}
	for q := Dimensionless; q < numQuantities; q++ {
		us := Of(q)
		if len(us) == 0 {
			t.Errorf("quantity %v has no units", q)
			continue
		}
		if us[0].Factor != 1 {
			t.Errorf("first unit of %v is %s with factor %g, want the SI unit (factor 1)", q, us[0].Symbol, us[0].Factor)
		}
		if SI(q).Symbol != us[0].Symbol {
			t.Errorf("SI(%v) = %s, want %s", q, SI(q).Symbol, us[0].Symbol)
		}
		for _, u := range us {
			for _, v := range values {
				back := u.FromSI(u.ToSI(v))
				if relErr(back, v) > 2.3e-16 {
					t.Errorf("%v %s: FromSI(ToSI) = %v", v, u.Symbol, back)
				}
				for _, w := range us {
					x, err := Convert(v, u.Symbol, w.Symbol)
					if err != nil {
						t.Fatal(err)
					}
					y, err := Convert(x, w.Symbol, u.Symbol)
					if err != nil {
						t.Fatal(err)
					}
					if relErr(y, v) > 1e-15 {
						t.Errorf("%v %s → %s → %s = %v", v, u.Symbol, w.Symbol, u.Symbol, y)
					}
				}
			}
		}
	}
}

func TestLookup(t *testing.T) {
	for _, u := range table {
		for _, s := range append([]string{u.Symbol, " " + u.Symbol + " "}, u.Aliases...) {
			got, ok := Lookup(s)
			if !ok || got.Symbol != u.Symbol {
				t.Errorf("Lookup(%q) = %q, %v; want %q", s, got.Symbol, ok, u.Symbol)
			}
		}
		if !(u.Factor > 0) || math.IsInf(u.Factor, 0) {
			t.Errorf("%s: factor %v", u.Symbol, u.Factor)
		}
		if u.Name == "" {
			t.Errorf("%s: no name", u.Symbol)
		}
	}
	for _, s := range []string{"", "M", "m^3/d", "furlong", "gpm "} {
		if u, ok := Lookup(s); ok && s != "gpm " {
			t.Errorf("Lookup(%q) = %q, want not found", s, u.Symbol)
		}
	}
	if _, err := Convert(1, "m", "s"); !errors.Is(err, ErrMismatch) {
		t.Errorf("Convert m → s: err = %v, want ErrMismatch", err)
	}
	if _, err := Convert(1, "parsec", "m"); !errors.Is(err, ErrUnknownUnit) {
		t.Errorf("Convert parsec → m: err = %v, want ErrUnknownUnit", err)
	}
	if got := Quantity(99).String(); got != "Quantity(99)" {
		t.Errorf("Quantity(99) = %q", got)
	}
}

func TestWaterHead(t *testing.T) {
	// 1 m H₂O of water at 4 °C (ref §9) is 1 m of head.
	if h := WaterHead(MetreOfWater, 0); relErr(h, 1) > 1e-15 {
		t.Errorf("WaterHead(1 m H₂O) = %v m, want 1", h)
	}
	// 10 kPa of water at 998.2 kg/m³ (a density entered by the user):
	// h = 10000/(998.2·9.80665) = 1.0215373… m (exact arithmetic).
	if h, want := WaterHead(10e3, 998.2), 10000/(998.2*9.80665); relErr(h, want) > 1e-15 {
		t.Errorf("WaterHead(10 kPa, 998.2) = %v, want %v", h, want)
	}
}

func FuzzLookup(f *testing.F) {
	for _, s := range []string{"m", "m³/d", "US gpd/ft", " in H2O", "", "\xff"} {
		f.Add(s, 1.5)
	}
	f.Fuzz(func(t *testing.T, s string, v float64) {
		u, ok := Lookup(s)
		if !ok {
			if _, err := Convert(v, s, "m"); err == nil {
				t.Errorf("Convert from unknown %q succeeded", s)
			}
			return
		}
		again, ok := Lookup(u.Symbol)
		if !ok || again.Symbol != u.Symbol {
			t.Errorf("Lookup(%q) = %q, but Lookup(%q) = %q, %v", s, u.Symbol, u.Symbol, again.Symbol, ok)
		}
		x := u.FromSI(u.ToSI(v))
		if !math.IsNaN(v) && !math.IsInf(v*u.Factor, 0) && relErr(x, v) > 2.3e-16 && math.Abs(v) > 1e-300 {
			t.Errorf("round trip of %v %s gave %v", v, u.Symbol, x)
		}
	})
}

func ExampleLookup() {
	u, ok := Lookup("US gpm")
	if !ok {
		return
	}
	q := u.ToSI(250) // 250 US gallons per minute in m³/s
	d, _ := Lookup("m³/d")
	fmt.Printf("%.6f m³/s = %.2f %s\n", q, d.FromSI(q), d.Symbol)
	// Output: 0.015773 m³/s = 1362.75 m³/d
}

func ExampleOf() {
	for _, u := range Of(Transmissivity) {
		fmt.Printf("%-10s %s\n", u.Symbol, u.Name)
	}
	// Output:
	// m²/s       square metre per second
	// m²/d       square metre per day
	// ft²/d      square foot per day
	// US gpd/ft  US gallon per day per foot
}

func ExampleConvert() {
	kPa, err := Convert(14.7, "psi", "kPa")
	if err != nil {
		return
	}
	fmt.Printf("%.3f kPa\n", kPa)
	// Output: 101.353 kPa
}
