package pipeline_test

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"log"
	"math"
	"strings"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
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

// A fitted pipeline compiles to a row plan for serving: one request row in,
// the output vector out, into a buffer the caller owns.
func ExampleFitted_Compile() {
	train := tabprep.MustFrame(
		tabprep.NewCategorical("species", []string{"dog", "cat", "dog", "rabbit"}),
		tabprep.NewNumeric("pet_age", []float64{3, math.NaN(), 9, 2}),
	)
	fitted, err := pipeline.New(
		pipeline.Use(impute.Mean{}),
		pipeline.Use(encode.OneHot{}),
	).Fit(train)
	if err != nil {
		log.Fatal(err)
	}
	plan, err := fitted.Compile()
	if err != nil {
		log.Fatal(err)
	}
	src := make([]tabprep.Cell, plan.InputWidth())
	if err := plan.FromMap(src, map[string]any{"species": "cat", "pet_age": nil}); err != nil {
		log.Fatal(err)
	}
	out := make([]float64, plan.OutputWidth())
	if err := plan.ApplyFloats(out, src); err != nil {
		log.Fatal(err)
	}
	fmt.Println(plan.Output().Names())
	fmt.Println(out)
	// Output:
	// [pet_age species=cat species=dog species=rabbit]
	// [4.666666666666667 1 0 0]
}

// Stream transforms CSV chunk by chunk, so the input can be larger than
// memory.
// A scoring service that needs the lowest latency generates its plan as Go
// source once (a go:generate command, say), compiles the file into the
// program and hands it to CompileWith; rows then run through plain Go code
// with the fitted numbers as constants.
func ExampleFitted_WriteGo() {
	train := tabprep.MustFrame(
		tabprep.NewCategorical("species", []string{"dog", "cat", "dog", "rabbit"}),
		tabprep.NewNumeric("pet_age", []float64{3, math.NaN(), 9, 2}),
	)
	fitted, err := pipeline.New(
		pipeline.Use(impute.Mean{}),
		pipeline.Use(encode.OneHot{}),
	).Fit(train)
	if err != nil {
		log.Fatal(err)
	}
	var src bytes.Buffer
	if err := fitted.WriteGo(&src, pipeline.GoOptions{Package: "petplan"}); err != nil {
		log.Fatal(err)
	}
	for _, line := range strings.Split(src.String(), "\n") {
		if strings.Contains(line, "n1 = 4.") || strings.HasPrefix(line, "var Plan") || strings.Contains(line, `case "cat"`) {
			fmt.Println(strings.TrimSpace(line))
		}
	}
	// Output:
	// var Plan = pipeline.Generated{
	// case "cat":
	// n1 = 4.666666666666667
}

func ExampleFitted_Stream() {
	train := tabprep.MustFrame(tabprep.NewNumeric("days_ahead", []float64{2, 4, 6}))
	fitted, err := pipeline.New(pipeline.Use(scale.ZScore{})).Fit(train)
	if err != nil {
		log.Fatal(err)
	}
	in := strings.NewReader("days_ahead\n2\n8\n\"\"\n") // "" is a missing cell
	var out bytes.Buffer
	prog, err := fitted.Stream(context.Background(), in, &out, pipeline.StreamOptions{})
	if err != nil {
		log.Fatal(err)
	}
	fmt.Print(out.String())
	fmt.Println(prog.Rows, "rows")
	// Output:
	// days_ahead
	// -1
	// 2
	// ""
	// 3 rows
}
