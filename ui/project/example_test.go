package project_test

import (
	"fmt"
	"time"

	"fieldfit/ui/project"
)

func ExampleMarshal() {
	p := project.New("Example site", project.SI, time.Date(2026, 5, 1, 9, 0, 0, 0, time.UTC))
	p.Wells = append(p.Wells, project.Well{ID: "w1", Name: "PW", Kind: project.Pumping})
	data, _ := project.Marshal(p)
	q, err := project.Unmarshal(data)
	fmt.Println(q.Name, q.Units, len(q.Wells), err)
	// Output: Example site si 1 <nil>
}
