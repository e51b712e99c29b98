package split_test

import (
	"fmt"
	"slices"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/split"
)

// clinicFrame is twelve appointments at the veterinary clinics, in booking
// order.
func clinicFrame() *tabprep.Frame {
	return tabprep.MustFrame(
		tabprep.NewCategorical("clinic", []string{"north", "north", "south", "east", "south", "north", "east", "east", "south", "north", "south", "east"}),
		tabprep.NewCategorical("species", []string{"dog", "cat", "dog", "dog", "cat", "dog", "rabbit", "cat", "dog", "cat", "dog", "rabbit"}),
		tabprep.NewCategorical("booked_on", []string{"2024-01-03", "2024-01-05", "2024-01-05", "2024-01-09", "2024-01-12", "2024-01-15",
			"2024-01-15", "2024-01-20", "2024-01-22", "2024-01-26", "2024-01-29", "2024-02-02"}),
		tabprep.NewNumeric("pet_id", []float64{101, 102, 103, 104, 105, 101, 106, 102, 107, 108, 103, 106}),
		tabprep.NewNumeric("no_show", []float64{0, 1, 0, 0, 0, 1, 0, 0, 1, 0, 0, 1}),
	)
}

// heldOut lists the rows of f in holdout partition name.
func heldOut(f *tabprep.Frame, name string) []int {
	var rows []int
	for i := range f.NumRows() {
		if f.Role(i) == tabprep.Holdout(name) {
			rows = append(rows, i)
		}
	}
	return rows
}

func ExampleRandom() {
	out, rep, err := split.Random{Fraction: 0.25, Seed: 7}.Apply(clinicFrame())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("holdout rows:", heldOut(out, "holdout"))
	fmt.Println("train rows to fit on:", out.Train().NumRows())
	fmt.Print(rep)
	// Output:
	// holdout rows: [0 2 7]
	// train rows to fit on: 9
	// random split, seed 7: 12 rows
	// partition  rows  share
	// train         9  75.0%
	// holdout       3  25.0%
}

func ExampleStratified() {
	s := split.Stratified{Column: "species", Fraction: 0.5, Seed: 1}
	out, rep, err := s.Apply(clinicFrame())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("holdout rows:", heldOut(out, "holdout"))
	fmt.Print(rep)
	// Output:
	// holdout rows: [0 4 5 6 7 10]
	// stratified split on species, seed 1: 12 rows
	// partition  rows  share
	// train         6  50.0%
	// holdout       6  50.0%
	//
	// species     train   holdout
	// dog      3  50.0%  3  50.0%
	// cat      2  33.3%  2  33.3%
	// rabbit   1  16.7%  1  16.7%
}

func ExampleOrdered() {
	// Hold out the latest six bookings. Two bookings share
	// 2024-01-15 at the cut, so both stay in train.
	out, rep, err := split.Ordered{Column: "booked_on", Rows: 6}.Apply(clinicFrame())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("holdout rows:", heldOut(out, "holdout"))
	fmt.Print(rep)
	// Output:
	// holdout rows: [7 8 9 10 11]
	// ordered split by booked_on: 12 rows
	// partition  rows  share
	// train         7  58.3%
	// holdout       5  41.7%
	// note: partition "holdout" has 5 rows, not 6, so that equal values of booked_on stay on one side
}

func ExampleSystematic() {
	out, rep, err := split.Systematic{Every: 4, Offset: 1}.Apply(clinicFrame())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("holdout rows:", heldOut(out, "holdout"))
	fmt.Print(rep)
	// Output:
	// holdout rows: [1 5 9]
	// systematic split, every 4 from 1: 12 rows
	// partition  rows  share
	// train         9  75.0%
	// holdout       3  25.0%
}

func ExampleKeyHash() {
	// Every visit of one pet lands on the same side, today and after new
	// visits are added.
	s := split.KeyHash{Column: "pet_id", Fraction: 0.3, Salt: "2024"}
	out, rep, err := s.Apply(clinicFrame())
	if err != nil {
		fmt.Println(err)
		return
	}
	pets := clinicFrame().Col(3).Float64s()
	var held []float64
	for _, i := range heldOut(out, "holdout") {
		if !slices.Contains(held, pets[i]) {
			held = append(held, pets[i])
		}
	}
	fmt.Println("pets held out:", held)
	fmt.Printf("share of pet 105: %.4f\n", split.KeyShare("2024", "105"))
	fmt.Print(rep)
	// Output:
	// pets held out: [104 105]
	// share of pet 105: 0.1193
	// key hash split on pet_id, salt "2024": 12 rows
	// partition  rows  share
	// train        10  83.3%
	// holdout       2  16.7%
	// note: partition "holdout": asked 30.0%, realised 16.7%
}

func ExampleThreeWay() {
	s := split.ThreeWay{By: split.Stratified{Column: "species", Seed: 3}, Validation: 0.25, Test: 0.25}
	out, rep, err := s.Apply(clinicFrame())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("validation:", heldOut(out, split.Validation))
	fmt.Println("test:", heldOut(out, split.Test))
	fmt.Print(rep)
	// Output:
	// validation: [5 8 9]
	// test: [2 4 11]
	// three-way stratified split on species, seed 3: 12 rows
	// partition   rows  share
	// train          6  50.0%
	// validation     3  25.0%
	// test           3  25.0%
	//
	// species     train  validation      test
	// dog      3  50.0%    2  66.7%  1  33.3%
	// cat      2  33.3%    1  33.3%  1  33.3%
	// rabbit   1  16.7%    0   0.0%  1  33.3%
}

func ExampleRandomFolds() {
	folds, err := split.RandomFolds{K: 3, Seed: 5}.Folds(clinicFrame())
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, fold := range folds {
		fmt.Println("fold", i, "holdout:", heldOut(fold.Frame, "holdout"), "train:", fold.Frame.Train().NumRows())
	}
	// Output:
	// fold 0 holdout: [0 1 2 6] train: 8
	// fold 1 holdout: [4 5 7 11] train: 8
	// fold 2 holdout: [3 8 9 10] train: 8
}

func ExampleStratifiedFolds() {
	folds, err := split.StratifiedFolds{Column: "species", K: 2, Seed: 5}.Folds(clinicFrame())
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, fold := range folds {
		fmt.Println("fold", i, "holdout:", heldOut(fold.Frame, "holdout"))
		if i == 0 {
			fmt.Print(fold.Report)
		}
	}
	// Output:
	// fold 0 holdout: [1 2 3 6 9 10]
	// stratified 2-fold on species, seed 5, fold 1 of 2: 12 rows
	// partition  rows  share
	// train         6  50.0%
	// holdout       6  50.0%
	//
	// species     train   holdout
	// dog      3  50.0%  3  50.0%
	// cat      2  33.3%  2  33.3%
	// rabbit   1  16.7%  1  16.7%
	// fold 1 holdout: [0 4 5 7 8 11]
}

func ExampleGroupFolds() {
	// No pet is ever on both sides of a fold.
	folds, err := split.GroupFolds{Column: "pet_id", K: 3, Seed: 2}.Folds(clinicFrame())
	if err != nil {
		fmt.Println(err)
		return
	}
	pets := clinicFrame().Col(3).Float64s()
	for i, fold := range folds {
		var held []float64
		for _, r := range heldOut(fold.Frame, "holdout") {
			held = append(held, pets[r])
		}
		fmt.Println("fold", i, "holds out pets", held)
	}
	// Output:
	// fold 0 holds out pets [101 102 101 102]
	// fold 1 holds out pets [103 105 108 103]
	// fold 2 holds out pets [104 106 107 106]
}

func ExampleTimeFolds() {
	s := split.TimeFolds{K: 3, Column: "booked_on", Holdout: 2, Buffer: 1, Window: 4}
	folds, err := s.Folds(clinicFrame())
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, fold := range folds {
		f := fold.Frame
		var train []int
		for r := range f.NumRows() {
			if f.Role(r) == tabprep.Train {
				train = append(train, r)
			}
		}
		fmt.Println("fold", i, "train:", train, "holdout:", heldOut(f, "holdout"), "unused:", heldOut(f, split.Unused))
	}
	// Output:
	// fold 0 train: [1 2 3 4] holdout: [7] unused: [0 5 6 8 9 10 11]
	// fold 1 train: [3 4 5 6] holdout: [8 9] unused: [0 1 2 7 10 11]
	// fold 2 train: [5 6 7 8] holdout: [10 11] unused: [0 1 2 3 4 9]
}

func ExampleReport_WriteTo() {
	_, rep, err := split.Random{Rows: 4, Seed: 9, ReportBy: "clinic"}.Apply(clinicFrame())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("realised share %.3f\n", rep.Share("holdout"))
	fmt.Print(rep.String())
	// Output:
	// realised share 0.333
	// random split, seed 9: 12 rows
	// partition  rows  share
	// train         8  66.7%
	// holdout       4  33.3%
	//
	// clinic     train   holdout
	// north   3  37.5%  1  25.0%
	// south   2  25.0%  2  50.0%
	// east    3  37.5%  1  25.0%
}
