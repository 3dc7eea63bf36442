package plot_test

import (
	"fmt"
	"strings"

	"fieldfit/ui/plot"
)

// A log–log drawdown chart with a fit window; the first reading, at t = 0,
// cannot be placed on a log axis and is counted, not dropped silently.
func ExampleChart_Render() {
	c := &plot.Chart{
		Width: 800, Height: 500,
		X: plot.Axis{Label: "time since pumping started (min)", Log: true},
		Y: plot.Axis{Label: "drawdown (m)", Log: true},
		Series: []plot.Series{{
			Name: "drawdown",
			X:    []float64{0, 1, 2, 5, 10, 20, 50, 100},
			Y:    []float64{0, 0.05, 0.11, 0.21, 0.30, 0.38, 0.50, 0.58},
			Used: []bool{false, false, true, true, true, true, true, true},
		}},
		Window: &[2]float64{2, 100},
		Notes:  []string{"Preliminary field interpretation."},
	}
	root, lay, err := c.Render()
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("x from %g to %g, y from %g to %g\n", lay.X.Min, lay.X.Max, lay.Y.Min, lay.Y.Max)
	var xl []string
	for _, t := range lay.XTicks {
		if t.Label != "" {
			xl = append(xl, t.Label)
		}
	}
	fmt.Println("x labels:", strings.Join(xl, " "))
	fmt.Println("not drawn:", lay.Skipped())
	fmt.Println(lay.Notes[1])

	// A drag on the plot becomes a time window.
	lo, hi, ok := lay.XSpan(lay.X.Pixel(5), lay.X.Pixel(50))
	fmt.Printf("window %.4g to %.4g min (%v)\n", lo, hi, ok)

	svg := root.SVG()
	fmt.Println(strings.HasPrefix(svg, `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 800 500" width="100%"`))
	// Output:
	// x from 1 to 100, y from 0.05 to 1
	// x labels: 1 10 100
	// not drawn: 1
	// Not shown from “drawdown” (8 points): 1 value ≤ 0 on a log axis.
	// window 5 to 50 min (true)
	// true
}
