package demoplan_test

import (
	"fmt"
	"log"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/examples/quickstart/demodata"
	"github.com/tabprep/tabprep/examples/quickstart/demodata/demoplan"
)

// A service built with this package compiles the loaded pipeline with the
// generated code; a request row then runs through plain Go code.
func Example() {
	fitted, _, err := demodata.Serving()
	if err != nil {
		log.Fatal(err)
	}
	plan, err := fitted.CompileWith(demoplan.Plan)
	if err != nil {
		log.Fatal(err) // the state is not the one the code was generated from
	}
	src := make([]tabprep.Cell, plan.InputWidth())
	err = plan.FromMap(src, map[string]any{
		"clinic": "Lakeview", "species": "cat", "visit_type": "dental", "days_ahead": 7,
		"pet_age": nil, "distance_km": 3.2, "reminder": "sms", "prior_no_shows": 1,
	})
	if err != nil {
		log.Fatal(err)
	}
	out := make([]float64, plan.OutputWidth())
	if err := plan.ApplyFloats(out, src); err != nil {
		log.Fatal(err)
	}
	names := plan.Output().Names()
	for i := range 5 {
		fmt.Printf("%s %.3f\n", names[i], out[i])
	}
	// Output:
	// visit_type 3.000
	// days_ahead -0.046
	// pet_age 0.000
	// distance_km -0.421
	// prior_no_shows 1.211
}
