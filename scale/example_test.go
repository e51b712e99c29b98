package scale_test

import (
	"bytes"
	"fmt"
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/scale"
)

// visits returns a few invented appointments at the clinics: days booked
// ahead, distance from the clinic in km (one missing), and the change in
// the pet's weight since the last visit.
func visits() *tabprep.Frame {
	return tabprep.MustFrame(
		tabprep.NewNumeric("days_ahead", []float64{1, 3, 7, 14, 30}),
		tabprep.NewNumeric("distance_km", []float64{0.8, 2.5, math.NaN(), 6.0, 24.0}),
		tabprep.NewNumeric("weight_change", []float64{-1.5, 0, 0.4, 2.1, -0.3}),
		tabprep.NewCategorical("species", []string{"dog", "cat", "dog", "rabbit", "cat"}),
	)
}

func show(f *tabprep.Frame, names ...string) {
	for _, n := range names {
		c, _ := f.Column(n)
		fmt.Printf("%s:", n)
		for _, v := range c.Float64s() {
			fmt.Printf(" %.3f", v)
		}
		fmt.Println()
	}
}

func ExampleZScore() {
	train := visits()
	fitted, err := pipeline.New(pipeline.Use(scale.ZScore{Columns: tabprep.Names("days_ahead")})).Fit(train)
	if err != nil {
		fmt.Println(err)
		return
	}
	p := fitted.Step(0).Params().(scale.ZScoreParams)
	fmt.Printf("mean %.1f, sample std %.3f\n", p.Mean[0], p.Std[0])

	// Save and load: the loaded pipeline applies the same numbers.
	var buf bytes.Buffer
	if err := fitted.Save(&buf); err != nil {
		fmt.Println(err)
		return
	}
	loaded, err := pipeline.Load(&buf)
	if err != nil {
		fmt.Println(err)
		return
	}
	out, err := loaded.Transform(train)
	if err != nil {
		fmt.Println(err)
		return
	}
	show(out, "days_ahead")
	// Output:
	// mean 11.0, sample std 11.726
	// days_ahead: -0.853 -0.682 -0.341 0.256 1.620
}

func ExampleZScore_Inverse() {
	s := scale.ZScore{Columns: tabprep.Names("distance_km")}
	p, _ := s.Fit(visits())
	z, _ := s.Transform(p, visits())
	back, _ := s.Inverse(p, z)
	show(back, "distance_km")
	// Output:
	// distance_km: 0.800 2.500 NaN 6.000 24.000
}

func ExampleMinMax() {
	s := scale.MinMax{Columns: tabprep.Names("days_ahead"), Low: -1, High: 1, Clamp: true}
	p, _ := s.Fit(visits())
	later := tabprep.MustFrame(tabprep.NewNumeric("days_ahead", []float64{1, 15.5, 60}))
	out, _ := s.Transform(p, later)
	show(out, "days_ahead")
	// Output:
	// days_ahead: -1.000 0.000 1.000
}

func ExampleDecimalScaling() {
	s := scale.DecimalScaling{Columns: tabprep.Names("days_ahead", "distance_km")}
	p, _ := s.Fit(visits())
	fmt.Println("exponents", p.Exponent)
	out, _ := s.Transform(p, visits())
	show(out, "days_ahead", "distance_km")
	// Output:
	// exponents [2 2]
	// days_ahead: 0.010 0.030 0.070 0.140 0.300
	// distance_km: 0.008 0.025 NaN 0.060 0.240
}

func ExampleRobust() {
	s := scale.Robust{Columns: tabprep.Names("distance_km")}
	p, _ := s.Fit(visits())
	fmt.Printf("median %.2f, quartiles %.3f and %.3f\n", p.Median[0], p.Lower[0], p.Upper[0])
	out, _ := s.Transform(p, visits())
	show(out, "distance_km")
	// Output:
	// median 4.25, quartiles 2.075 and 10.500
	// distance_km: -0.409 -0.208 NaN 0.208 2.344
}

func ExampleMaxAbs() {
	s := scale.MaxAbs{Columns: tabprep.Names("weight_change")}
	p, _ := s.Fit(visits())
	out, _ := s.Transform(p, visits())
	show(out, "weight_change")
	// Output:
	// weight_change: -0.714 0.000 0.190 1.000 -0.143
}

func ExampleRowNorm() {
	s := scale.RowNorm{Columns: tabprep.Names("days_ahead", "weight_change"), Norm: scale.NormL1}
	p, _ := s.Fit(visits())
	out, _ := s.Transform(p, visits())
	show(out, "days_ahead", "weight_change")
	// Output:
	// days_ahead: 0.400 1.000 0.946 0.870 0.990
	// weight_change: -0.600 0.000 0.054 0.130 -0.010
}

func ExampleLog() {
	s := scale.Log{Columns: tabprep.Names("distance_km")}
	p, _ := s.Fit(visits())
	out, _ := s.Transform(p, visits())
	show(out, "distance_km")
	_, err := s.Transform(p, tabprep.MustFrame(tabprep.NewNumeric("distance_km", []float64{3, 0})))
	fmt.Println(err)
	// Output:
	// distance_km: -0.223 0.916 NaN 1.792 3.178
	// scale.log transform: column "distance_km": row 1: value 0 is outside the domain (log needs x > 0); correct or remove it, or set OutOfDomain to scale.DomainMissing to make such cells missing
}

func ExampleLog1p() {
	s := scale.Log1p{Columns: tabprep.Names("days_ahead")}
	p, _ := s.Fit(visits())
	out, _ := s.Transform(p, visits())
	show(out, "days_ahead")
	// Output:
	// days_ahead: 0.693 1.386 2.079 2.708 3.434
}

func ExampleBoxCox() {
	s := scale.BoxCox{Columns: tabprep.Names("radiation"), ZScore: true}
	p, _ := s.Fit(tabprep.MustFrame(tabprep.NewNumeric("radiation", microwave)))
	fmt.Printf("lambda %.3f\n", p.Lambda[0])
	out, _ := s.Transform(p, tabprep.MustFrame(tabprep.NewNumeric("radiation", []float64{0.01, 0.1, 0.4})))
	show(out, "radiation")
	// Output:
	// lambda 0.276
	// radiation: -2.032 -0.027 1.960
}

func ExampleYeoJohnson() {
	s := scale.YeoJohnson{Columns: tabprep.Names("height_diff")}
	p, _ := s.Fit(tabprep.MustFrame(tabprep.NewNumeric("height_diff", zeaMays)))
	fmt.Printf("lambda %.3f\n", p.Lambda[0])
	out, _ := s.Transform(p, tabprep.MustFrame(tabprep.NewNumeric("height_diff", []float64{-6, 0, 6})))
	show(out, "height_diff")
	// Output:
	// lambda 1.305
	// height_diff: -4.123 0.000 8.948
}

func ExampleQuantile() {
	s := scale.Quantile{Columns: tabprep.Names("days_ahead"), Output: scale.OutputNormal}
	p, _ := s.Fit(visits())
	fmt.Println("quantiles", p.Quantiles[0])
	out, _ := s.Transform(p, tabprep.MustFrame(tabprep.NewNumeric("days_ahead", []float64{3, 7, 10, 30})))
	show(out, "days_ahead")
	// Output:
	// quantiles [1 3 7 14 30]
	// days_ahead: -0.674 0.000 0.272 5.199
}
