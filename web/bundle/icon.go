package bundle

import (
	"bytes"
	"fmt"
	"image"
	"image/color"
	"image/png"
	"maps"
	"math"
	"slices"
	"strings"
	"sync"
)

// The Fieldfit icon, drawn here so that the SVG and the PNGs come from one
// drawing: a pumped well in cross-section — ground above, the saturated
// aquifer below, and the water table drawn down into a cone around the
// well. The drawing is on a 512 × 512 grid and fills the square, with the
// well and cone inside the central 80 %, so it also serves as a maskable
// icon.

// Icon colours (our own).
var (
	iconDeep   = color.NRGBA{0x17, 0x41, 0x4d, 0xff} // sky / frame, the theme colour
	iconSand   = color.NRGBA{0xc8, 0xb4, 0x8a, 0xff} // unsaturated ground
	iconSoil   = color.NRGBA{0x8f, 0x7a, 0x4f, 0xff} // ground surface
	iconWater  = color.NRGBA{0x2f, 0x86, 0xa6, 0xff} // saturated aquifer
	iconCasing = color.NRGBA{0xee, 0xf1, 0xec, 0xff} // well casing
	iconPump   = color.NRGBA{0xf2, 0xa5, 0x41, 0xff} // pump head
)

type shape struct {
	pts []point // closed polygon, in drawing order
	col color.NRGBA
}

type point struct{ x, y float64 }

func rect(x0, y0, x1, y1 float64, c color.NRGBA) shape {
	return shape{pts: []point{{x0, y0}, {x1, y0}, {x1, y1}, {x0, y1}}, col: c}
}

// conePoint gives the water table at distance r from the well axis: a
// logarithmic cone, s = a ln(R/r), the shape of steady radial drawdown
// (Thiem), cut off at the well radius rw and at the radius of influence R.
func coneDepth(r float64) float64 {
	const (
		level = 300.0 // undisturbed water table
		a     = 28.0
		bigR  = 230.0
		rw    = 16.0
	)
	r = math.Max(r, rw)
	if r >= bigR {
		return level
	}
	return level + a*math.Log(bigR/r)
}

// iconShapes returns the drawing, back to front.
func iconShapes() []shape {
	const cx = 256.0
	var water []point
	for x := 0.0; x <= 512; x += 4 {
		water = append(water, point{x, coneDepth(math.Abs(x - cx))})
	}
	water = append(water, point{512, 512}, point{0, 512})
	return []shape{
		rect(0, 0, 512, 512, iconDeep),
		rect(0, 196, 512, 512, iconSand),
		rect(0, 190, 512, 202, iconSoil),
		{pts: water, col: iconWater},
		rect(cx-14, 150, cx+14, 440, iconCasing),
		// the screened part of the casing: three slots
		rect(cx-6, 384, cx+6, 392, iconDeep),
		rect(cx-6, 402, cx+6, 410, iconDeep),
		rect(cx-6, 420, cx+6, 428, iconDeep),
		rect(cx-34, 124, cx+34, 156, iconPump),
	}
}

// IconSVG returns the icon as SVG.
func IconSVG() []byte {
	var b strings.Builder
	b.WriteString(`<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 512 512" width="512" height="512">` + "\n")
	b.WriteString("<title>Fieldfit</title>\n")
	for _, s := range iconShapes() {
		b.WriteString(`<path fill="`)
		fmt.Fprintf(&b, "#%02x%02x%02x", s.col.R, s.col.G, s.col.B)
		b.WriteString(`" d="`)
		for i, p := range s.pts {
			if i == 0 {
				b.WriteString("M")
			} else {
				b.WriteString(" L")
			}
			fmt.Fprintf(&b, "%s %s", num(p.x), num(p.y))
		}
		b.WriteString(` Z"/>` + "\n")
	}
	b.WriteString("</svg>\n")
	return []byte(b.String())
}

func num(v float64) string {
	s := fmt.Sprintf("%.2f", v)
	s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	if s == "" || s == "-" {
		return "0"
	}
	return s
}

// IconPNG renders the icon at size × size pixels, with 4 × 4 samples per
// pixel for smooth edges.
func IconPNG(size int) []byte {
	img := renderIcon(size)
	var buf bytes.Buffer
	enc := png.Encoder{CompressionLevel: png.BestCompression}
	if err := enc.Encode(&buf, img); err != nil {
		panic(err) // encoding an in-memory NRGBA image does not fail
	}
	return buf.Bytes()
}

func renderIcon(size int) *image.NRGBA {
	const ss = 4 // samples per pixel along each axis
	shapes := iconShapes()
	n := size * ss
	scale := 512 / float64(n)
	sum := make([][3]uint32, size*size)
	owner := make([]int, n)
	var xs []float64
	for sy := range n {
		y := (float64(sy) + 0.5) * scale
		for i := range owner {
			owner[i] = -1
		}
		for si, s := range shapes {
			xs = crossings(xs[:0], s.pts, y)
			for k := 0; k+1 < len(xs); k += 2 {
				// sample columns whose centres lie in [xs[k], xs[k+1])
				lo := int(math.Ceil(xs[k]/scale - 0.5))
				hi := int(math.Ceil(xs[k+1]/scale - 0.5))
				for sx := max(lo, 0); sx < min(hi, n); sx++ {
					owner[sx] = si
				}
			}
		}
		py := sy / ss
		for sx, si := range owner {
			c := color.NRGBA{}
			if si >= 0 {
				c = shapes[si].col
			}
			p := &sum[py*size+sx/ss]
			p[0] += uint32(c.R)
			p[1] += uint32(c.G)
			p[2] += uint32(c.B)
		}
	}
	img := image.NewNRGBA(image.Rect(0, 0, size, size))
	const div = ss * ss
	for i, p := range sum {
		img.Pix[4*i+0] = uint8((p[0] + div/2) / div)
		img.Pix[4*i+1] = uint8((p[1] + div/2) / div)
		img.Pix[4*i+2] = uint8((p[2] + div/2) / div)
		img.Pix[4*i+3] = 0xff
	}
	return img
}

// crossings appends the sorted x where the horizontal line at y crosses
// the polygon's edges (even–odd rule; an edge's upper end is inclusive).
func crossings(xs []float64, pts []point, y float64) []float64 {
	for i := range pts {
		a, b := pts[i], pts[(i+1)%len(pts)]
		if (a.y <= y) == (b.y <= y) {
			continue
		}
		xs = append(xs, a.x+(y-a.y)*(b.x-a.x)/(b.y-a.y))
	}
	slices.Sort(xs)
	return xs
}

var icons = sync.OnceValue(func() map[string][]byte {
	return map[string][]byte{
		"icon.svg":             IconSVG(),
		"icon-192.png":         IconPNG(192),
		"icon-512.png":         IconPNG(512),
		"apple-touch-icon.png": IconPNG(180),
	}
})

// Icons returns the icon files of the bundle by name: icon.svg, and PNGs
// at 192 and 512 pixels (manifest) and 180 pixels (apple-touch-icon).
func Icons() map[string][]byte {
	return maps.Clone(icons())
}
