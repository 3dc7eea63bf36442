package infiltration_test

import (
	"fmt"
	"math"

	"fieldfit/models/infiltration"
)

// birchfield is a double-ring test of our own invention (Birchfield
// meadow soakaway trial): levels in mm in a 300 mm inner ring, refilled
// twice.
func birchfield() infiltration.Test {
	return infiltration.Test{
		InnerDiameter: 0.30, OuterDiameter: 0.60, Kind: infiltration.Levels, Unit: "mm",
		Readings: []infiltration.Reading{
			{Time: 0, Value: 150},
			{Time: 300, Value: 141},
			{Time: 600, Value: 134},
			{Time: 900, Value: 128.5, Refill: true, RefillTo: 150},
			{Time: 1500, Value: 140},
			{Time: 2100, Value: 131},
			{Time: 2700, Value: 122.5, Refill: true, RefillTo: 150},
			{Time: 3600, Value: 139},
			{Time: 4500, Value: 128},
			{Time: 5400, Value: 117.5},
			{Time: 7200, Value: 96.5},
		},
	}
}

func ExampleRebuild() {
	c, err := infiltration.Rebuild(birchfield())
	if err != nil {
		fmt.Println(err)
		return
	}
	for i := range c.Time {
		fmt.Printf("t = %4.0f min  F = %5.1f mm\n", c.Time[i]/60, c.Depth[i]*1e3)
	}
	fmt.Println(c.Notes[0])
	// Output:
	// t =    0 min  F =   0.0 mm
	// t =    5 min  F =   9.0 mm
	// t =   10 min  F =  16.0 mm
	// t =   15 min  F =  21.5 mm
	// t =   25 min  F =  31.5 mm
	// t =   35 min  F =  40.5 mm
	// t =   45 min  F =  49.0 mm
	// t =   60 min  F =  60.0 mm
	// t =   75 min  F =  71.0 mm
	// t =   90 min  F =  81.5 mm
	// t =  120 min  F = 102.5 mm
	// 2 refills were bridged: the infiltration after each counts from the refilled level.
}

func ExampleFit() {
	c, err := infiltration.Rebuild(birchfield())
	if err != nil {
		fmt.Println(err)
		return
	}
	// The safety factor is the user's, from the local rules; 2 here.
	r, err := infiltration.Fit(c, infiltration.Horton, &infiltration.Settings{SafetyFactor: 2})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(r.Method, "fitted to the", r.Fitted)
	for _, v := range r.SteadyIn[:2] {
		fmt.Printf("fc = %.3g %s (95 %%: %.3g – %.3g)\n", v.Value, v.Unit.Symbol, v.Lower, v.Upper)
	}
	fmt.Printf("design rate = %.3g mm/h\n", r.DesignIn[0].Value)
	fmt.Println(r.Plausibility)
	// Output:
	// Horton (1940) fitted to the cumulative infiltration
	// fc = 42.4 mm/h (95 %: 41.3 – 43.6)
	// fc = 1.67 in/h (95 %: 1.63 – 1.71)
	// design rate = 21.2 mm/h
	// 42.4 mm/h is closest to the K of loamy sand (29.9 mm/h), then sand (118 mm/h) in the Green–Ampt table of Rawls, Brakensiek & Miller (1983), J. Hydraulic Eng. 109(1), as in Chow, Maidment & Mays (1988), Applied Hydrology, Table 4.3.1 (values from memory, reference §7).
}

func ExampleGreenAmptDepth() {
	// Silt loam of the texture table: ψΔθ = 5.681 cm, K = 0.65 cm/h,
	// after one hour (units: cm, h).
	F := infiltration.GreenAmptDepth(1, 0.65, 5.681)
	f := infiltration.GreenAmptRate(1, 0.65, 5.681)
	fmt.Printf("F = %.4f cm, f = %.4f cm/h\n", F, f)
	fmt.Println(math.Abs(F-0.65*1-5.681*math.Log1p(F/5.681)) < 1e-14)
	// Output:
	// F = 3.1671 cm, f = 1.8159 cm/h
	// true
}
