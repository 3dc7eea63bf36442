package ui_test

import (
	"fmt"
	"strings"

	"fieldfit/models/units"
	"fieldfit/ui"
	"fieldfit/ui/project"
)

func ExampleCheckReadings() {
	m, _ := units.Lookup("m")
	t := &project.Test{
		StaticLevel: project.Entry{Text: "4.20", Unit: "m", SI: 4.20, OK: true},
		Readings: []project.Reading{
			{TimeText: "1", DepthText: "4.55"},
			{TimeText: "2", DepthText: "4,71"},
			{TimeText: "2", DepthText: "4.80"},
			{TimeText: "3", DepthText: "4.1"},
			{TimeText: "4", DepthText: "n/a"},
		},
	}
	for i, c := range ui.CheckReadings(t, m) {
		fmt.Println(strings.TrimSpace(fmt.Sprintf("row %d: usable=%v drawdown=%.2f %s", i+1, c.Usable, c.Drawdown, strings.Join(c.Messages, " "))))
	}
	// Output:
	// row 1: usable=true drawdown=0.35
	// row 2: usable=true drawdown=0.51
	// row 3: usable=false drawdown=0.60 Time 2 min is not after the row above (2 min).
	// row 4: usable=false drawdown=-0.10 Negative drawdown (−0.100 m): the water is above the static level.
	// row 5: usable=false drawdown=0.00 Depth "n/a" is not a number.
}

func ExamplePasteReadings() {
	t := &project.Test{}
	n, msg := ui.PasteReadings(t, 0, "time", "min\tdepth\n1\t4.55\n2\t4.71\n")
	fmt.Println(n, msg)
	fmt.Println(t.Readings[1].TimeText, t.Readings[1].DepthText)
	// Output:
	// 2 Pasted 2 rows. Skipped the heading line "min\tdepth".
	// 2 4.71
}
