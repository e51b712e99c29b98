package tabprep_test

import (
	"fmt"
	"os"
	"strings"

	"github.com/tabprep/tabprep"
)

// Appointments at the clinics, with the holdout rows tagged in the role
// column. "NA" and the empty cell are missing.
const visitsCSV = `_role,clinic,species,days_ahead,pet_age,no_show
train,north,dog,14,3.5,0
train,river,cat,3,NA,1
test,north,rabbit,30,,0
train,"east, annex",dog,7,9,0
`

func ExampleReadCSV() {
	f, err := tabprep.ReadCSV(strings.NewReader(visitsCSV), nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(f.Schema())
	fmt.Println("holdout rows:", f.HoldoutCount(), f.Partitions())
	fmt.Println("pet_age missing:", f.Col(3).MissingCount())

	// A cell that is not a finite number names its line and column.
	_, err = tabprep.ReadCSV(strings.NewReader("clinic,pet_age\nnorth,Inf\n"), nil)
	fmt.Println(err)
	// Output:
	// [clinic:categorical(3) species:categorical(3) days_ahead:numeric pet_age:numeric no_show:numeric]
	// holdout rows: 1 [test]
	// pet_age missing: 2
	// tabprep.csv read: line 2: column "pet_age": "Inf" is not a finite number; write a missing cell as one of the missing tokens ["" "NA" "NaN" "null"], or list "Inf" in CSVOptions.Missing
}

func ExampleCSVReader() {
	// Clinic numbers are digit strings: Kinds keeps them categorical.
	opts := &tabprep.CSVOptions{ChunkRows: 2, Kinds: map[string]tabprep.Kind{"clinic": tabprep.Categorical}}
	r, err := tabprep.NewCSVReader(strings.NewReader("clinic,days_ahead\n01,14\n02,3\n01,30\n"), opts)
	if err != nil {
		fmt.Println(err)
		return
	}
	for f, err := range r.Chunks() {
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Println(f.NumRows(), "rows, clinics", f.Col(0).Levels(), "days", f.Col(1).Float64s())
	}
	// Output:
	// 2 rows, clinics [01 02] days [14 3]
	// 1 rows, clinics [01] days [30]
}

func ExampleWriteCSV() {
	// Numbers are written in the shortest form that reads back bit for bit.
	tenth, fifth := 0.1, 0.2
	f := tabprep.MustFrame(
		tabprep.NewCategorical("clinic", []string{"north", "east, annex", ""}),
		tabprep.NewNumeric("distance_km", []float64{2.1, tenth + fifth, 12}),
	)
	f, err := f.Tag(tabprep.Holdout("validation"), []int{2})
	if err != nil {
		fmt.Println(err)
		return
	}
	if err := tabprep.WriteCSV(os.Stdout, f, &tabprep.CSVOptions{Missing: []string{"NA"}}); err != nil {
		fmt.Println(err)
	}
	// Output:
	// _role,clinic,distance_km
	// train,north,2.1
	// train,"east, annex",0.30000000000000004
	// validation,NA,12
}
