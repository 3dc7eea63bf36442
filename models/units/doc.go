// Package units converts field units to SI and back, with one named factor
// per unit and the source of each factor beside it.
//
// Fieldfit computes in SI (m, s, m³/s, m²/s, m/s, Pa) and converts at the
// edges, once: a value read in a unit u becomes SI by u.ToSI and goes back
// for display by u.FromSI. The factors are Go constants, so expressions such
// as USGallon/Minute are evaluated exactly and rounded to float64 once.
// Exact factors follow from the definitions 1 in = 0.0254 m, 1 US gal =
// 231 in³, 1 lb = 0.45359237 kg and g = 9.80665 m/s² (NIST Special
// Publication 811, 2008 edition, Appendix B); water-column units use
// ρ = 999.97 kg/m³ (water at 4 °C) and are not exact.
//
// Lookup finds a unit by its symbol (or an ASCII spelling such as "m3/d");
// Of lists the units offered for a quantity, SI unit first.
package units
