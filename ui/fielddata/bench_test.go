package fielddata

import (
	"bufio"
	"bytes"
	"context"
	"fmt"
	"runtime"
	"runtime/metrics"
	"sync"
	"testing"
	"time"
)

// Timing targets (1 000 000 rows in ≤ 3 s and ≤ 300 MB) are checked here
// and reported in the README, never in pass/fail tests.

// benchFile returns 1 000 000 rows of a logger file in one of three
// shapes: ISO times with two values ("iso"), day-first dates and clock
// times with a decimal comma ("comma"), or "iso" in UTF-16 LE.
func benchFile(shape string) []byte {
	var b bytes.Buffer
	w := bufio.NewWriter(&b)
	switch shape {
	case "iso", "utf16":
		w.WriteString("Time,Pressure (kPa),Barometer (kPa)\n")
		for i := 0; i < 1_000_000; i++ {
			fmt.Fprintf(w, "2024-05-%02dT%02d:%02d:%02d.500Z,%.4f,%.3f\n", 1+i/86400, i/3600%24, i/60%60, i%60, 150+float64(i%1000)*1e-3, 101.325)
		}
	case "comma":
		w.WriteString("Site;Larkspur Flats\nDate;Time;Depth to water (m);Temperature (°C)\n")
		for i := 0; i < 1_000_000; i++ {
			fmt.Fprintf(w, "%02d.05.2024;%02d:%02d:%02d;%d,%04d;11,2\n", 1+i/86400, i/3600%24, i/60%60, i%60, 12, i%10000)
		}
	}
	w.Flush()
	if shape != "utf16" {
		return b.Bytes()
	}
	// The text is ASCII: each byte becomes a UTF-16 LE code unit.
	src := b.Bytes()
	out := make([]byte, 2+2*len(src))
	out[0], out[1] = 0xFF, 0xFE
	for i, c := range src {
		out[2+2*i] = c
	}
	return out
}

// peakHeap samples the heap in use while f runs and returns its largest
// value and its value before f, in bytes. On js/wasm, with one thread, the
// sampler would only steal time from f and miss the peak: f runs alone and
// both values are 0.
func peakHeap(f func()) (peak, base uint64) {
	if runtime.GOARCH == "wasm" {
		f()
		return 0, 0
	}
	runtime.GC()
	s := []metrics.Sample{{Name: "/memory/classes/heap/objects:bytes"}}
	metrics.Read(s)
	base = s[0].Value.Uint64()
	done := make(chan struct{})
	var wg sync.WaitGroup
	wg.Add(1)
	go func() {
		defer wg.Done()
		for {
			metrics.Read(s)
			if v := s[0].Value.Uint64(); v > peak {
				peak = v
			}
			select {
			case <-done:
				return
			case <-time.After(200 * time.Microsecond):
			}
		}
	}()
	f()
	close(done)
	wg.Wait()
	return peak, base
}

// benchImport reports, beside time and allocations, the peak of the heap
// in use during the import (input included: "peak-heap-MB") and above what
// was in use before it ("import-MB": the columns, buffers and garbage).
func benchImport(b *testing.B, data []byte, opt Options, m Mapping) {
	b.ReportAllocs()
	b.SetBytes(int64(len(data)))
	var peak, above uint64
	n := 0
	for b.Loop() {
		p, base := peakHeap(func() {
			rec, err := Import(context.Background(), bytes.NewReader(data), opt, m, &ImportSettings{Size: int64(len(data)), Progress: func(float64) {}})
			if err != nil {
				b.Fatal(err)
			}
			n = rec.Len()
		})
		peak, above = max(peak, p), max(above, p-base)
	}
	if n != 1_000_000 {
		b.Fatalf("%d rows", n)
	}
	if runtime.GOARCH != "wasm" {
		b.ReportMetric(float64(peak)/1e6, "peak-heap-MB")
		b.ReportMetric(float64(above)/1e6, "import-MB")
	}
	b.ReportMetric(float64(len(data))/1e6, "input-MB")
}

func BenchmarkImport1M(b *testing.B) {
	benchImport(b, benchFile("iso"), Options{HeaderRow: 1},
		Mapping{Values: []ValueColumn{{Column: 1, Kind: Pressure, Unit: "kPa"}, {Column: 2, Kind: Pressure, Unit: "kPa"}}})
}

func BenchmarkImport1MDecimalComma(b *testing.B) {
	benchImport(b, benchFile("comma"), Options{Delimiter: Semicolon, Decimal: CommaMark, HeaderRow: 2},
		Mapping{Time: TimeColumns{Format: DateAndClock, ClockColumn: 1, Order: DayFirst, Zone: "Europe/Berlin"},
			Values: []ValueColumn{{Column: 2, Kind: Depth, Unit: "m"}}})
}

func BenchmarkImport1MUTF16(b *testing.B) {
	benchImport(b, benchFile("utf16"), Options{Encoding: UTF16LE, HeaderRow: 1},
		Mapping{Values: []ValueColumn{{Column: 1, Kind: Pressure, Unit: "kPa"}, {Column: 2, Kind: Pressure, Unit: "kPa"}}})
}

func BenchmarkSniff(b *testing.B) {
	sample := benchFile("comma")[:SampleSize]
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Sniff(sample); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkApply1M conditions 1 000 000 readings: barometric compensation
// by a record of 20 000 readings, trend removal, static level, split and
// thinning.
func BenchmarkApply1M(b *testing.B) {
	n := 1_000_000
	w := Series{Kind: Pressure, Time: make([]float64, n), Value: make([]float64, n)}
	for i := range w.Time {
		w.Time[i] = float64(i)
		w.Value[i] = 16 + float64(i%100)*1e-3
	}
	bs := Series{Kind: Pressure, Time: make([]float64, 20001), Value: make([]float64, 20001)}
	for i := range bs.Time {
		bs.Time[i] = float64(i * 50)
		bs.Value[i] = 10.33
	}
	start, stop := 100000.0, 800000.0
	c := Conditioning{Start: &start, Stop: &stop, Baro: &BaroCompensation{}, Trend: &Trend{}, Static: &Static{}, Thin: &Thinning{}}
	b.ReportAllocs()
	var above uint64
	for b.Loop() {
		p, base := peakHeap(func() {
			if _, err := Apply(w, &bs, c); err != nil {
				b.Fatal(err)
			}
		})
		above = max(above, p-base)
	}
	if runtime.GOARCH != "wasm" {
		b.ReportMetric(float64(above)/1e6, "apply-MB")
	}
}
