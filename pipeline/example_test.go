package pipeline_test

import (
	"bytes"
	"errors"
	"fmt"
	"log"
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/impute"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/scale"
	"github.com/tabprep/tabprep/split"
)

// This example is the README's usage example: split, fit on train rows
// only, save, load, and transform the holdout.
func Example() {
	frame := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{2, math.NaN(), 7, 4, 11, 1, 9, 3, 5, 6}),
		tabprep.NewNumeric("days_ahead", []float64{1, 14, 3, 30, 2, 7, 5, 60, 4, 10}),
	)
	tagged, _, err := split.Random{Fraction: 0.3, Seed: 1}.Apply(frame)
	if err != nil {
		log.Fatal(err)
	}

	prep := pipeline.New(
		pipeline.Use(impute.Mean{}),  // fill gaps with the train mean
		pipeline.Use(scale.ZScore{}), // then centre and scale
	)
	if _, err := prep.Fit(tagged); errors.Is(err, tabprep.ErrHoldout) {
		fmt.Println("refused: the frame holds holdout rows")
	}
	fitted, err := prep.Fit(tagged.Train())
	if err != nil {
		log.Fatal(err)
	}

	var saved bytes.Buffer
	if err := fitted.Save(&saved); err != nil {
		log.Fatal(err)
	}
	loaded, err := pipeline.Load(&saved)
	if err != nil {
		log.Fatal(err)
	}
	out, err := loaded.Transform(tagged.HoldoutRows())
	if err != nil {
		log.Fatal(err)
	}
	fmt.Println(loaded.OutputNames())
	for i := 0; i < out.NumRows(); i++ {
		fmt.Printf("%-8v %6.3f %6.3f\n", out.Role(i), out.Col(0).Value(i), out.Col(1).Value(i))
	}
	// Output:
	// refused: the frame holds holdout rows
	// [pet_age days_ahead]
	// holdout  -0.995 -0.759
	// holdout   1.204 -0.571
	// holdout   0.262 -0.336
}
