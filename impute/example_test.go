package impute_test

import (
	"fmt"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/impute"
)

func ExampleMean() {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{2, nan, 4, 9}),
		tabprep.NewNumeric("distance_km", []float64{1.5, 3, nan, 7.5}),
	)
	step := impute.Mean{}
	p, err := step.Fit(train)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, c := range p.Columns {
		fmt.Printf("%s: %s %.2f (%d gaps)\n", c.Name, c.Stat, float64(c.Number), c.Gaps)
	}
	batch := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{nan, 1}),
		tabprep.NewNumeric("distance_km", []float64{2, nan}),
	)
	out, _ := step.Transform(p, batch)
	fmt.Println(out.Col(0).Float64s(), out.Col(1).Float64s())
	// Output:
	// pet_age: mean 5.00 (1 gaps)
	// distance_km: mean 4.00 (1 gaps)
	// [5 1] [2 4]
}
