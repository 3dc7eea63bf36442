package plot

import (
	"encoding/binary"
	"encoding/xml"
	"io"
	"math"
	"strings"
	"testing"
)

// benchChart has 10 000 logger readings, a 400-point fitted curve and its
// band.
func benchChart() *Chart {
	const n = 10_000
	t := fxTimes(n, 0.05, 4000)
	s := make([]float64, n)
	used := make([]bool, n)
	for i, ti := range t {
		s[i] = fxDrawdown(ti) * (1 + 0.02*math.Sin(float64(i)))
		used[i] = ti > 1
	}
	tc := fxTimes(400, 0.05, 4000)
	sc, lo, hi := make([]float64, 400), make([]float64, 400), make([]float64, 400)
	for i, ti := range tc {
		sc[i] = fxDrawdown(ti)
		lo[i], hi[i] = sc[i]*0.95, sc[i]*1.05
	}
	return &Chart{
		X: Axis{Label: "time since pumping started (min)", Log: true},
		Y: Axis{Label: "drawdown (m)", Log: true},
		Series: []Series{
			{Name: "logger", X: t, Y: s, Used: used},
			{Name: "fit", Kind: Line, X: tc, Y: sc},
			{Name: "95 % band", Kind: Band, X: tc, Y: lo, Y2: hi},
		},
		Window: &[2]float64{1, 4000},
		Notes:  []string{caution},
	}
}

func BenchmarkRender10k(b *testing.B) {
	c := benchChart()
	b.ReportAllocs()
	for b.Loop() {
		if _, _, err := c.Render(); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkRenderSVG10k(b *testing.B) {
	c := benchChart()
	b.ReportAllocs()
	for b.Loop() {
		root, _, err := c.Render()
		if err != nil {
			b.Fatal(err)
		}
		_ = root.SVG()
	}
}

// FuzzRender draws charts of arbitrary values and range settings: Render
// must not panic, must account for every point, and its SVG must be
// well-formed XML.
func FuzzRender(f *testing.F) {
	enc := func(v ...float64) []byte {
		b := make([]byte, 8*len(v))
		for i, x := range v {
			binary.LittleEndian.PutUint64(b[8*i:], math.Float64bits(x))
		}
		return b
	}
	f.Add(enc(1, 1, 2, 2, 3, 0.5), uint8(3), 0.0, 0.0, "drawdown")
	f.Add(enc(0, -1, math.NaN(), math.Inf(1), 1e300, 1e-300), uint8(1), 1.0, 10.0, "<b>&")
	f.Add(enc(5, 5, 5, 5), uint8(0), -3.0, 3.0, "\xff\x00")
	f.Fuzz(func(t *testing.T, data []byte, flags uint8, lo, hi float64, name string) {
		n := len(data) / 16
		if n > 200 {
			n = 200
		}
		x, y := make([]float64, n), make([]float64, n)
		used := make([]bool, n)
		for i := 0; i < n; i++ {
			x[i] = math.Float64frombits(binary.LittleEndian.Uint64(data[16*i:]))
			y[i] = math.Float64frombits(binary.LittleEndian.Uint64(data[16*i+8:]))
			used[i] = data[16*i]&1 == 0
		}
		c := &Chart{
			Title: name,
			X:     Axis{Label: name, Log: flags&1 != 0, Invert: flags&8 != 0},
			Y:     Axis{Label: name, Log: flags&2 != 0},
			Series: []Series{
				{Name: name, X: x, Y: y, Used: used},
				{Name: name, Kind: Line, X: x, Y: y},
				{Name: name, Kind: Band, X: x, Y: y, Y2: x},
			},
			Notes: []string{name},
		}
		if flags&4 != 0 {
			c.Y.Min, c.Y.Max = lo, hi
		}
		if flags&16 != 0 {
			c.Window = &[2]float64{lo, hi}
		}
		root, lay, err := c.Render()
		if err != nil {
			return
		}
		for i, cnt := range lay.Counts {
			if cnt.Drawn+cnt.NotFinite+cnt.NotPositive+cnt.Outside != cnt.Total || cnt.Total != n {
				t.Fatalf("series %d: counts %+v do not add up to %d", i, cnt, n)
			}
		}
		dec := xml.NewDecoder(strings.NewReader(root.SVG()))
		for {
			_, err := dec.Token()
			if err == io.EOF {
				break
			}
			if err != nil {
				t.Fatalf("SVG not well-formed: %v", err)
			}
		}
	})
}
