package units

// Conversion factors to SI: the value in SI units of one of the named unit.
// [N] = NIST SP 811 (2008), Appendix B (B.8, factors in alphabetical order;
// B.9, by kind of quantity); [SI] = the SI Brochure (BIPM, 9th ed. 2019);
// "derived" = exact arithmetic on the factors above it.

// Length, m.
const (
	Metre      = 1.0
	Centimetre = 1e-2   // [SI] prefix
	Millimetre = 1e-3   // [SI] prefix
	Inch       = 0.0254 // exact, [N] B.8 (international inch, 1959)
	Foot       = 0.3048 // exact, [N] B.8 (international foot = 12 in)
)

// Time, s.
const (
	Second = 1.0
	Minute = 60.0    // exact, [N] B.8
	Hour   = 3600.0  // exact, [N] B.8
	Day    = 86400.0 // exact, [N] B.8 (mean solar day as used with the SI)
)

// Volume, m³.
const (
	CubicMetre = 1.0
	Litre      = 1e-3                     // exact, [N] B.8 (1964 CGPM: 1 L = 1 dm³)
	USGallon   = 231 * Inch * Inch * Inch // exact = 3.785411784e-3, [N] B.8 (231 in³)
)

// Rate (volume per time), m³/s.
const (
	CubicMetrePerSecond = 1.0
	LitrePerSecond      = Litre / Second    // exact, derived
	LitrePerMinute      = Litre / Minute    // exact, derived
	CubicMetrePerHour   = CubicMetre / Hour // exact, derived
	CubicMetrePerDay    = CubicMetre / Day  // exact, derived
	USGallonPerMinute   = USGallon / Minute // exact = 6.30901964e-5, [N] B.8
	USGallonPerDay      = USGallon / Day    // exact, derived
)

// Transmissivity (area per time), m²/s.
const (
	SquareMetrePerSecond  = 1.0
	SquareMetrePerDay     = 1 / Day                 // exact, derived
	SquareFootPerDay      = Foot * Foot / Day       // exact, derived (1 ft² = 0.09290304 m², [N] B.8)
	USGallonPerDayPerFoot = USGallon / (Day * Foot) // exact, derived (= 0.01241933 m²/d, reference §9)
)

// Hydraulic conductivity and infiltration rate (length per time), m/s.
const (
	MetrePerSecond              = 1.0
	MetrePerDay                 = 1 / Day                        // exact, derived
	FootPerDay                  = Foot / Day                     // exact, derived
	CentimetrePerSecond         = Centimetre / Second            // exact, derived
	CentimetrePerHour           = Centimetre / Hour              // exact, derived
	MillimetrePerHour           = Millimetre / Hour              // exact, derived
	InchPerHour                 = Inch / Hour                    // exact, derived
	USGallonPerDayPerSquareFoot = USGallon / (Day * Foot * Foot) // exact, derived (= 0.0407458333 m/d, reference §9)
)

// Pressure, Pa.
const (
	Pascal      = 1.0
	Hectopascal = 1e2 // [SI] prefix
	Kilopascal  = 1e3 // [SI] prefix
	Millibar    = 1e2 // exact, [N] B.8 (1 bar = 1e5 Pa)
	Bar         = 1e5 // exact, [N] B.8

	// Pound is the avoirdupois pound, kg, exact ([N] B.8).
	Pound = 0.45359237
	// Psi is one pound-force per square inch, exact = 6894.757293168…
	// Pa (derived; reference §9: 6894.757293 Pa).
	Psi = Pound * StandardGravity / (Inch * Inch)

	// StandardGravity gn, m/s², exact by definition (3rd CGPM 1901;
	// [N] B.8 note).
	StandardGravity = 9.80665
	// WaterDensity is the density of pure water at 4 °C, kg/m³, used for
	// the water-column units (reference §9). It is not exact, and water
	// at field temperature is slightly lighter: use WaterHead with the
	// density of the water in question when it matters.
	WaterDensity = 999.97

	// MetreOfWater is the pressure of a 1 m column of water at 4 °C:
	// ρ·gn·1 m = 9806.3558… Pa (ρ = WaterDensity, reference §9); the
	// other water columns scale with their height.
	MetreOfWater      = WaterDensity * StandardGravity * Metre
	CentimetreOfWater = WaterDensity * StandardGravity * Centimetre
	FootOfWater       = WaterDensity * StandardGravity * Foot
	InchOfWater       = WaterDensity * StandardGravity * Inch
)

// WaterHead returns the height in metres of a column of water of the given
// density (kg/m³) that exerts the pressure p (Pa): h = p/(ρ·gn). A density
// of 0 means WaterDensity.
func WaterHead(p, density float64) float64 {
	if density == 0 {
		density = WaterDensity
	}
	return p / (density * StandardGravity)
}
