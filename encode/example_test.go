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
