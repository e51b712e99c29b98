package encode_test

import (
	"fmt"
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
)

func visits() *tabprep.Frame {
	return tabprep.MustFrame(
		tabprep.NewCategorical("visit_type", []string{"checkup", "vaccine", "surgery", "checkup", "vaccine", "checkup"}),
		tabprep.NewCategorical("species", []string{"dog", "cat", "dog", "rabbit", "cat", ""}),
		tabprep.NewNumeric("no_show", []float64{0, 1, 0, 1, 0, 0}),
	)
}

func printFrame(f *tabprep.Frame) {
	for j := 0; j < f.NumCols(); j++ {
		c := f.Col(j)
		fmt.Printf("%-16s", c.Name())
		for i := 0; i < f.NumRows(); i++ {
			if c.Kind() == tabprep.Numeric {
				fmt.Printf(" %6.3g", c.Value(i))
			} else if c.IsMissing(i) {
				fmt.Printf(" %6s", "NA")
			} else {
				fmt.Printf(" %6s", c.Level(i))
			}
		}
		fmt.Println()
	}
}

func ExampleOneHot() {
	step := encode.OneHot{
		Columns:   tabprep.Names("species"),
		Reference: map[string]string{"species": "dog"},
		MinCount:  2, // rabbit is seen once: grouped into species#other
		Unseen:    encode.UnseenOther,
		Missing:   encode.MissingColumn,
	}
	p, err := step.Fit(visits())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(p.Outputs())
	batch := tabprep.MustFrame(tabprep.NewCategorical("species", []string{"cat", "dog", "ferret", ""}))
	out, err := step.Transform(p, batch)
	if err != nil {
		fmt.Println(err)
		return
	}
	printFrame(out)
	// Output:
	// [species=cat species#other species#missing]
	// species=cat           1      0      0      0
	// species#other         0      0      1      0
	// species#missing       0      0      0      1
}

func ExampleOrdinal() {
	step := encode.Ordinal{
		Columns:     tabprep.Names("visit_type"),
		Order:       map[string][]string{"visit_type": {"vaccine", "checkup", "surgery"}},
		UnseenCode:  encode.Code(-1),
		MissingCode: encode.Code(math.NaN()),
	}
	p, err := step.Fit(visits())
	if err != nil {
		fmt.Println(err)
		return
	}
	batch := tabprep.MustFrame(tabprep.NewCategorical("visit_type", []string{"surgery", "grooming", "", "vaccine"}))
	out, err := step.Transform(p, batch)
	if err != nil {
		fmt.Println(err)
		return
	}
	printFrame(out)
	// Output:
	// visit_type            2     -1    NaN      0
}

func ExampleTarget() {
	train := visits()
	step := encode.Target{Columns: tabprep.Names("visit_type"), Target: "no_show", K: 1, F: 1, Folds: 3, Seed: 42}
	// FitOutOfFold is what a pipeline calls: the training rows get values
	// from the folds they are not in; the parameters hold full-train values.
	p, oof, err := step.FitOutOfFold(train)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("prior %.4f\n", p.Prior[0])
	for i, l := range p.Columns[0].Levels {
		fmt.Printf("%-8s n=%d S=%.4f\n", l, p.Columns[0].Counts[i], p.Columns[0].Values[i])
	}
	c, _ := oof.Column("visit_type")
	fmt.Printf("out of fold %.4f\n", c.Float64s())
	// Output:
	// prior 0.3333
	// checkup  n=3 S=0.3333
	// surgery  n=1 S=0.1667
	// vaccine  n=2 S=0.4552
	// out of fold [0.5000 0.1250 0.2500 0.1250 0.7500 0.1250]
}

func ExampleFrequency() {
	step := encode.Frequency{Columns: tabprep.Names("visit_type"), Share: true}
	p, err := step.Fit(visits())
	if err != nil {
		fmt.Println(err)
		return
	}
	batch := tabprep.MustFrame(tabprep.NewCategorical("visit_type", []string{"checkup", "surgery", "grooming"}))
	out, err := step.Transform(p, batch)
	if err != nil {
		fmt.Println(err)
		return
	}
	printFrame(out)
	// Output:
	// visit_type          0.5  0.167      0
}

func ExampleHash() {
	step := encode.Hash{Columns: tabprep.Names("species"), Buckets: 4, Seed: 1}
	p, err := step.Fit(visits())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(p.Outputs())
	batch := tabprep.MustFrame(tabprep.NewCategorical("species", []string{"dog", "dog", ""}))
	out, err := step.Transform(p, batch)
	if err != nil {
		fmt.Println(err)
		return
	}
	// The same level always lands in the same bucket with the same sign; a
	// missing cell is all zeros.
	sum := 0.0
	for j := 0; j < out.NumCols(); j++ {
		v := out.Col(j).Float64s()
		fmt.Println(v[0] == v[1], v[2])
		sum += v[0] * v[0]
	}
	fmt.Println(sum)
	// Output:
	// [species#0 species#1 species#2 species#3]
	// true 0
	// true 0
	// true 0
	// true 0
	// 1
}

func ExampleBin() {
	train := tabprep.MustFrame(tabprep.NewNumeric("days_ahead", []float64{1, 2, 3, 5, 8, 13, 21, 34}))
	step := encode.Bin{Bins: 4} // equal frequency, Hyndman & Fan type 7 cuts
	p, err := step.Fit(train)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(p.Columns[0].Levels())
	batch := tabprep.MustFrame(tabprep.NewNumeric("days_ahead", []float64{0, 4, 40, math.NaN()}))
	out, err := step.Transform(p, batch)
	if err != nil {
		fmt.Println(err)
		return
	}
	printFrame(out)
	// Output:
	// [(-inf,2.75) [2.75,6.5) [6.5,15) [15,+inf)]
	// days_ahead       (-inf,2.75) [2.75,6.5) [15,+inf)     NA
}

func ExampleParseNumber() {
	train := tabprep.MustFrame(tabprep.NewCategorical("distance_km", []string{"1.250,5", " 3,75 ", "unknown", "12"}))
	step := encode.ParseNumber{Decimal: ",", Thousands: ".", Trim: true}
	p, err := step.Fit(train)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d bad: %+v\n", p.Columns[0].BadCells, p.Columns[0].Samples)
	out, err := step.Transform(p, train)
	if err != nil {
		fmt.Println(err)
		return
	}
	printFrame(out)
	// Output:
	// 1 bad: [{Row:2 Value:unknown}]
	// distance_km      1.25e+03   3.75    NaN     12
}

func ExampleParseTime() {
	train := tabprep.MustFrame(tabprep.NewCategorical("booked_on", []string{"2024-03-04 09:15", "2024-03-09 17:40", ""}))
	step := encode.ParseTime{Layout: "2006-01-02 15:04", Parts: []encode.TimePart{encode.PartWeekday, encode.PartHour}}
	p, err := step.Fit(train)
	if err != nil {
		fmt.Println(err)
		return
	}
	out, err := step.Transform(p, train)
	if err != nil {
		fmt.Println(err)
		return
	}
	printFrame(out)
	// Output:
	// booked_on.weekday      1      6    NaN
	// booked_on.hour        9     17    NaN
}
