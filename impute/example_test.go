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

// printFill prints the decision per column of a statistic fill.
func printFill(p impute.FillParams) {
	for _, c := range p.Columns {
		if c.Kind == tabprep.Numeric {
			fmt.Printf("%s: %s by %s = %g\n", c.Name, c.Stat, c.From, float64(c.Number))
		} else {
			fmt.Printf("%s: %s by %s = %q\n", c.Name, c.Stat, c.From, c.Level)
		}
	}
}

func ExampleMedian() {
	train := tabprep.MustFrame(tabprep.NewNumeric("days_ahead", []float64{1, 30, nan, 2, 7}))
	p, _ := impute.Median{}.Fit(train)
	printFill(p)
	// Output:
	// days_ahead: median by step = 4.5
}

func ExampleMin() {
	train := tabprep.MustFrame(tabprep.NewNumeric("prior_no_shows", []float64{2, nan, 0, 5}))
	p, _ := impute.Min{}.Fit(train)
	printFill(p)
	// Output:
	// prior_no_shows: min by step = 0
}

func ExampleMax() {
	train := tabprep.MustFrame(tabprep.NewNumeric("distance_km", []float64{2, nan, 12.5, 5}))
	p, _ := impute.Max{}.Fit(train)
	printFill(p)
	// Output:
	// distance_km: max by step = 12.5
}

func ExampleMostFrequent() {
	train := tabprep.MustFrame(
		tabprep.NewCategorical("species", []string{"dog", "cat", "", "cat", "dog"}),
		tabprep.NewNumeric("prior_no_shows", []float64{0, 1, 1, nan, 0}),
	)
	p, _ := impute.MostFrequent{}.Fit(train)
	printFill(p) // both columns tie: the first level in byte order, the smallest number
	// Output:
	// species: mode by step = "cat"
	// prior_no_shows: mode by step = 0
}

func ExampleConstant() {
	train := tabprep.MustFrame(tabprep.NewCategorical("reminder", []string{"sms", "", "email"}))
	level := "none"
	step := impute.Constant{Columns: tabprep.Names("reminder"), Level: &level}
	p, _ := step.Fit(train)
	out, _ := step.Transform(p, train)
	fmt.Println(out.Col(0).Level(1), out.Col(0).Levels())
	// Output:
	// none [sms email none]
}

func ExampleFill() {
	train := tabprep.MustFrame(
		tabprep.NewCategorical("species", []string{"dog", "", "cat", "dog"}),
		tabprep.NewNumeric("pet_age", []float64{3, 8, nan, 1}),
		tabprep.NewNumeric("distance_km", []float64{nan, 4, 9, 2}),
		tabprep.NewNumeric("distance_home", []float64{12, nan, 3, 6}),
		tabprep.NewCategorical("reminder", []string{"", "sms", "sms", "email"}),
	)
	step := impute.Fill{
		Numeric:     impute.Rule{Stat: impute.StatMedian},
		Categorical: impute.Rule{Stat: impute.StatMode},
		Patterns:    []impute.PatternRule{{Pattern: "distance_*", Rule: impute.Rule{Stat: impute.StatMax}}},
		Columns:     []impute.ColumnRule{{Name: "reminder", Rule: impute.ConstantLevel("none")}},
	}
	p, err := step.Fit(train)
	if err != nil {
		fmt.Println(err)
		return
	}
	printFill(p)
	// Output:
	// species: mode by kind = "dog"
	// pet_age: median by kind = 3
	// distance_km: max by pattern distance_* = 9
	// distance_home: max by pattern distance_* = 12
	// reminder: constant by name = "none"
}

func ExampleCarryForward() {
	train := tabprep.MustFrame(tabprep.NewNumeric("prior_no_shows", []float64{0, 1, 3}))
	step := impute.CarryForward{}
	p, _ := step.Fit(train) // learns only the edge fill: the train median, 1
	batch := tabprep.MustFrame(tabprep.NewNumeric("prior_no_shows", []float64{nan, 2, nan, 4}))
	out, _ := step.Transform(p, batch)
	fmt.Println(out.Col(0).Float64s())
	// Output:
	// [1 2 2 4]
}

func ExampleCarryBackward() {
	train := tabprep.MustFrame(tabprep.NewNumeric("prior_no_shows", []float64{0, 1, 3}))
	step := impute.CarryBackward{Edge: impute.Rule{Stat: impute.StatMax}}
	p, _ := step.Fit(train)
	batch := tabprep.MustFrame(tabprep.NewNumeric("prior_no_shows", []float64{nan, 2, nan, 4, nan}))
	out, _ := step.Transform(p, batch)
	fmt.Println(out.Col(0).Float64s())
	// Output:
	// [2 2 4 4 3]
}

func ExampleInterpolate() {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("booked_on", []float64{0, 1, 2}),
		tabprep.NewNumeric("pet_age", []float64{1, 2, 3}),
	)
	step := impute.Interpolate{By: "booked_on"}
	p, _ := step.Fit(train)
	batch := tabprep.MustFrame(
		tabprep.NewNumeric("booked_on", []float64{0, 1, 4, 5}),
		tabprep.NewNumeric("pet_age", []float64{nan, 2, nan, 7}),
	)
	out, _ := step.Transform(p, batch)
	fmt.Println(out.Col(1).Float64s())
	// Output:
	// [2 2 5.75 7]
}

func ExampleDropRows() {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, nan, 3}),
		tabprep.NewCategorical("species", []string{"dog", "cat", ""}),
	)
	step := impute.DropRows{}
	p, _ := step.Fit(train)
	out, report, _ := step.Drop(p, train)
	fmt.Printf("kept %d of %d rows, dropped %d; gaps per column %v\n", out.NumRows(), report.Rows, report.Dropped, report.Gaps)
	// Output:
	// kept 1 of 3 rows, dropped 2; gaps per column [1 1]
}

func ExampleIndicators() {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("distance_km", []float64{2, nan, 5}),
		tabprep.NewNumeric("days_ahead", []float64{1, 3, 9}),
	)
	step := impute.Indicators{}
	p, _ := step.Fit(train)
	out, _ := step.Transform(p, train)
	fmt.Println(out.Names(), out.Col(2).Float64s())
	// Output:
	// [distance_km days_ahead distance_km_missing] [0 1 0]
}

func ExampleDropSparse() {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("distance_km", []float64{2, nan, 5, 1}),
		tabprep.NewCategorical("reminder", []string{"", "", "sms", ""}),
	)
	step := impute.DropSparse{MaxShare: 0.5}
	p, _ := step.Fit(train)
	out, _ := step.Transform(p, train)
	fmt.Println(p.Dropped, out.Names())
	// Output:
	// [reminder] [distance_km]
}

func ExampleKNearest() {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, 2, 8, 9}),
		tabprep.NewNumeric("prior_no_shows", []float64{0, 0, 3, 5}),
	)
	step := impute.KNearest{K: 2}
	p, _ := step.Fit(train)
	batch := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{8.5, 1.5}),
		tabprep.NewNumeric("prior_no_shows", []float64{nan, nan}),
	)
	out, _ := step.Transform(p, batch)
	fmt.Println(out.Col(1).Float64s(), "from", p.Rows, "reference rows")
	// Output:
	// [4 0] from 4 reference rows
}

func ExampleChained() {
	// Body temperature in both scales: t/°F = 1.8·t/°C + 32 exactly.
	train := tabprep.MustFrame(
		tabprep.NewNumeric("temp_c", []float64{38, 38.5, nan, 39, 37.5, 38.2}),
		tabprep.NewNumeric("temp_f", []float64{100.4, nan, 102.2, 102.2, 99.5, 100.76}),
	)
	step := impute.Chained{Rounds: 30, Ridge: 1e-12, Seed: 1}
	p, err := step.Fit(train)
	if err != nil {
		fmt.Println(err)
		return
	}
	eq := p.Equations[1]
	fmt.Printf("%s = %.4f + %.4f·temp_c\n", eq.Target, float64(eq.Intercept), eq.Coef[0])
	out, _ := step.Transform(p, tabprep.MustFrame(
		tabprep.NewNumeric("temp_c", []float64{40, nan}),
		tabprep.NewNumeric("temp_f", []float64{nan, 98.6}),
	))
	fmt.Printf("%.4f %.4f\n", out.Col(1).Value(0), out.Col(0).Value(1))
	// Output:
	// temp_f = 32.0000 + 1.8000·temp_c
	// 104.0000 37.0000
}
