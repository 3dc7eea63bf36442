package infiltration

import (
	"fmt"
	"math"
	"sort"

	"fieldfit/models/units"
)

// Texture is one row of the Green–Ampt parameter table by soil texture.
type Texture struct {
	Name string
	// Porosity and EffectivePorosity θe are fractions; Suction is the
	// wetting-front suction head ψ, m; K is the hydraulic conductivity,
	// m/s.
	Porosity, EffectivePorosity, Suction, K float64
}

// TextureSource names the table. The values are those of the project's
// reference §7, which marks them as recalled and not re-read; they are
// therefore FROM MEMORY, and serve only as plausibility data.
const TextureSource = "Rawls, Brakensiek & Miller (1983), J. Hydraulic Eng. 109(1), as in Chow, Maidment & Mays (1988), Applied Hydrology, Table 4.3.1 (values from memory, reference §7)"

// textures holds the table in its published units (ψ in cm, K in cm/h),
// converted to SI by Textures.
var textures = []struct {
	name       string
	n, ne      float64
	psiCm, kCm float64
}{
	{"sand", 0.437, 0.417, 4.95, 11.78},
	{"loamy sand", 0.437, 0.401, 6.13, 2.99},
	{"sandy loam", 0.453, 0.412, 11.01, 1.09},
	{"loam", 0.463, 0.434, 8.89, 0.34},
	{"silt loam", 0.501, 0.486, 16.68, 0.65},
	{"clay loam", 0.464, 0.309, 20.88, 0.10},
	{"clay", 0.475, 0.385, 31.63, 0.03},
}

// Textures returns the Green–Ampt parameters by soil texture of
// TextureSource (rows of the table kept in this project; from memory), in
// SI units, in the order of the table. The slice is a fresh copy.
func Textures() []Texture {
	out := make([]Texture, len(textures))
	for i, r := range textures {
		out[i] = Texture{Name: r.name, Porosity: r.n, EffectivePorosity: r.ne,
			Suction: r.psiCm * units.Centimetre, K: r.kCm * units.CentimetrePerHour}
	}
	return out
}

// Plausibility compares a conductivity or steady infiltration rate k
// (m/s) with the K of the texture table: it returns the textures sorted by
// the distance of their K from k on a log scale (nearest first) and a
// plain sentence naming the nearest ones, or where k lies outside the
// table. It is plausibility data only: field rates depend on structure,
// compaction and the test as much as on texture.
func Plausibility(k float64) ([]Texture, string) {
	tex := Textures()
	if !(k > 0) || bad(k) {
		return nil, fmt.Sprintf("No comparison with the texture table: the rate %g m/s is not a positive number.", k)
	}
	sort.SliceStable(tex, func(a, b int) bool {
		return math.Abs(math.Log(tex[a].K/k)) < math.Abs(math.Log(tex[b].K/k))
	})
	mmh := func(v float64) string { return fmt.Sprintf("%.3g mm/h", v/units.MillimetrePerHour) }
	lo, hi := tex[0], tex[0]
	for _, t := range tex {
		if t.K < lo.K {
			lo = t
		}
		if t.K > hi.K {
			hi = t
		}
	}
	var s string
	switch {
	case k > hi.K:
		s = fmt.Sprintf("%s is above the K of every texture in the table (highest: %s, %s)", mmh(k), hi.Name, mmh(hi.K))
	case k < lo.K:
		s = fmt.Sprintf("%s is below the K of every texture in the table (lowest: %s, %s)", mmh(k), lo.Name, mmh(lo.K))
	default:
		s = fmt.Sprintf("%s is closest to the K of %s (%s), then %s (%s)", mmh(k), tex[0].Name, mmh(tex[0].K), tex[1].Name, mmh(tex[1].K))
	}
	return tex, s + " in the Green–Ampt table of " + TextureSource + "."
}
