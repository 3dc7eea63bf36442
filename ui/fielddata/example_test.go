package fielddata_test

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"time"

	"fieldfit/ui/fielddata"
)

// A logger export of our own invention: a preamble, semicolons, decimal
// commas, day-first dates.
const loggerFile = `Site;Larkspur Flats
Logger serial;FX-20417
Date;Time;Depth to water (m);Temperature (°C)
14.05.2024;08:00:00;12,300;11,2
14.05.2024;08:01:00;12,345;11,2
14.05.2024;08:02:00;n/a;11,2
14.05.2024;08:03:00;12,391;11,2
`

func ExampleSniff() {
	d, err := fielddata.Sniff([]byte(loggerFile))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s, %s, decimal %s, header on line %d\n", d.Options.Encoding, d.Options.Delimiter, d.Options.Decimal, d.Options.HeaderRow)
	fmt.Println("why:", d.Why.Decimal.Reason)
	for _, m := range d.Preamble {
		fmt.Printf("%s = %s\n", m.Key, m.Value)
	}
	fmt.Printf("time: %s, columns %d and %d, %s\n", d.Mapping.Time.Format, d.Mapping.Time.Column, d.Mapping.Time.ClockColumn, d.Mapping.Time.Order)
	fmt.Printf("values: %+v\n", d.Mapping.Values)
	for _, q := range d.Questions() {
		fmt.Println("ask:", q)
	}
	// Output:
	// utf-8, semicolon, decimal comma, header on line 3
	// why: numbers such as "12,300" have a decimal comma
	// Site = Larkspur Flats
	// Logger serial = FX-20417
	// time: date+clock, columns 0 and 1, day-first
	// values: [{Column:2 Name: Kind:depth Unit:m}]
	// ask: Time zone: the times carry no UTC offset: choose the time zone the logger clock was set to (UTC is used until then)
}

func ExampleImport() {
	d, _ := fielddata.Sniff([]byte(loggerFile))
	m := d.Mapping
	m.Time.Zone = "+02:00" // the user's answer
	rec, err := fielddata.Import(context.Background(), bytes.NewReader([]byte(loggerFile)), d.Options, m, nil)
	var bad *fielddata.BadRowsError
	if errors.As(err, &bad) {
		// The screen lists rec.Bad and asks: skip these rows, or stop?
		for _, e := range rec.Bad {
			fmt.Println(e)
		}
	}
	for i := range rec.Time {
		fmt.Printf("row %d: %s  %.3f m\n", rec.Row[i], fielddata.FormatTime(rec.Time[i], rec.Clock), rec.Columns[0].Values[i])
	}
	// Output:
	// row 6, column "Depth to water (m)": "n/a" is not a number
	// row 4: 2024-05-14 06:00:00Z  12.300 m
	// row 5: 2024-05-14 06:01:00Z  12.345 m
	// row 7: 2024-05-14 06:03:00Z  12.391 m
}

func ExampleApply() {
	// Depths to water every minute; the pump starts at 08:02 and stops
	// at 08:05.
	at := func(min int) float64 { return fielddata.UnixSeconds(time.Date(2024, 5, 14, 8, min, 0, 0, time.UTC)) }
	water := fielddata.Series{Name: "LF-OB1", Kind: fielddata.Depth, Clock: true,
		Time:  []float64{at(0), at(1), at(2), at(3), at(4), at(5), at(6), at(7)},
		Value: []float64{12.30, 12.30, 12.30, 12.52, 12.61, 12.66, 12.42, 12.36}}
	start, stop := at(2), at(5)
	c := fielddata.Conditioning{Start: &start, Stop: &stop, Static: &fielddata.Static{}}
	res, err := fielddata.Apply(water, nil, c)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("static depth %.2f m\n", -res.Static)
	fmt.Printf("pumping:  t = %v s, s = %.2f m\n", res.Pumping.Elapsed, res.Pumping.Drawdown)
	fmt.Printf("recovery: t′ = %v s, s′ = %.2f m\n", res.Recovery.Elapsed, res.Recovery.Drawdown)
	// Output:
	// static depth 12.30 m
	// pumping:  t = [0 60 120 180] s, s = [0.00 0.22 0.31 0.36] m
	// recovery: t′ = [60 120] s, s′ = [0.12 0.06] m
}

func ExampleThinLog() {
	// Readings every second for 1000 s, thinned to 10 per log cycle.
	e := make([]float64, 1000)
	for i := range e {
		e[i] = float64(i + 1)
	}
	keep := fielddata.ThinLog(e, 10)
	fmt.Println(fielddata.CountText(len(e), len(keep)))
	fmt.Println(keep[:10])
	// Output:
	// 1000 → 28 readings
	// [0 1 2 3 5 6 7 9 12 15]
}

func ExampleSchedule() {
	a, _ := fielddata.NewRateStep(0, 4, "L/s")
	b, _ := fielddata.NewRateStep(3600, 7, "L/s")
	s := fielddata.Schedule{a, b}
	fmt.Println(s.Check(7200))
	fmt.Println(s.RateAt(1800), s.RateAt(5400))
	bad := fielddata.Schedule{b, a}
	fmt.Println(bad.Check(7200))
	// Output:
	// <nil>
	// 0.004 0.007
	// rates[0].start = 3600: invalid setting: the first step starts when pumping starts (0 s)
}
