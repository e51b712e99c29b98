// Package sourcetest holds the generated row plans of one small pipeline
// per built-in step kind that has a Go source form, fitted on the demo
// data, and the tests that each gives the interpreted plan's values bit for
// bit and its errors word for word. Regenerate the plans with go generate
// after changing a step's source form; a test fails while one is stale.
package sourcetest

//go:generate go run ./gen

import (
	"bytes"
	"fmt"
	"math/rand/v2"
	"slices"
	"strings"
	"time"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/examples/quickstart/demodata"
	"github.com/tabprep/tabprep/impute"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/scale"
	"github.com/tabprep/tabprep/split"
	"github.com/tabprep/tabprep/state"
)

// Case is one generated plan: the stages of its pipeline and the columns it
// drops from the data first.
type Case struct {
	Name   string // the name of its Generated variable
	Stages []pipeline.Stage
	Drop   []string
}

// Cases returns every case. Each pipeline ends with a one-hot step over the
// categorical columns left, so that its output is numeric.
func Cases() []Case {
	unknown := "unknown"
	minusOne, minusTwo := state.Float(-1), state.Float(-2)
	rest := pipeline.Use(encode.OneHot{})
	texts := []string{"booked_on", "fee"}
	c := func(name string, stages ...pipeline.Stage) Case {
		return Case{Name: name, Stages: append(stages, rest), Drop: texts}
	}
	return []Case{
		c("ImputeStats",
			pipeline.Use(impute.Mean{Columns: tabprep.Names("pet_age")}),
			pipeline.Use(impute.Median{Columns: tabprep.Names("distance_km")}),
			pipeline.Use(impute.Min{Columns: tabprep.Names("days_ahead")}),
			pipeline.Use(impute.Max{Columns: tabprep.Names("prior_no_shows")}),
			pipeline.Use(impute.MostFrequent{Columns: tabprep.Names("reminder", "species")})),
		c("ImputeRules",
			pipeline.Use(impute.Constant{Columns: tabprep.Names("reminder"), Level: &unknown}),
			pipeline.Use(impute.Fill{Numeric: impute.Rule{Stat: impute.StatMedian}, Categorical: impute.ConstantLevel("unknown")})),
		c("ImputeStructure",
			pipeline.Use(impute.Indicators{}),
			pipeline.Use(impute.DropSparse{MaxShare: 0.05})),
		c("OneHot",
			pipeline.Use(encode.OneHot{Columns: tabprep.Names("clinic", "species"), MinCount: 100, Unseen: encode.UnseenOther}),
			pipeline.Use(encode.OneHot{Columns: tabprep.Names("reminder"), Unseen: encode.UnseenError})),
		c("Ordinal",
			pipeline.Use(encode.Ordinal{Columns: tabprep.Names("visit_type")}),
			pipeline.Use(encode.Ordinal{Columns: tabprep.Names("reminder"), UnseenCode: &minusOne, MissingCode: &minusTwo})),
		c("Tables",
			pipeline.Use(encode.Frequency{Columns: tabprep.Names("species"), Share: true}),
			pipeline.Use(encode.Frequency{Columns: tabprep.Names("visit_type")}),
			pipeline.Use(encode.Target{Columns: tabprep.Names("clinic"), Target: "no_show", K: 10, Folds: 3, Seed: 2})),
		c("HashAndBin",
			pipeline.Use(encode.Hash{Columns: tabprep.Names("clinic"), Buckets: 3, Seed: 5}),
			pipeline.Use(encode.Bin{Columns: tabprep.Names("distance_km"), Method: encode.BinQuantile, Bins: 4}),
			pipeline.Use(encode.Bin{Columns: tabprep.Names("days_ahead"), Method: encode.BinWidth, Bins: 5, Codes: true}),
			pipeline.Use(encode.Bin{Columns: tabprep.Names("pet_age"), Edges: map[string][]float64{"pet_age": {1, 1, 3, 8.5}}, Codes: true})),
		{Name: "Parse", Stages: []pipeline.Stage{
			pipeline.Use(encode.ParseNumber{Columns: tabprep.Names("fee"), Decimal: ",", Thousands: "."}),
			pipeline.Use(encode.ParseTime{Columns: tabprep.Names("booked_on"), Layout: time.DateOnly, Parts: []encode.TimePart{encode.PartUnix, encode.PartWeekday}}),
			rest}},
		c("Affine",
			pipeline.Use(scale.ZScore{Columns: tabprep.Names("days_ahead")}),
			pipeline.Use(scale.MinMax{Columns: tabprep.Names("pet_age"), Low: -1, High: 1, Clamp: true}),
			pipeline.Use(scale.DecimalScaling{Columns: tabprep.Names("distance_km")}),
			pipeline.Use(scale.Robust{Columns: tabprep.Names("prior_no_shows")}),
			pipeline.Use(scale.MaxAbs{Columns: tabprep.Names("no_show")})),
		c("RowNorms",
			pipeline.Use(scale.RowNorm{Columns: tabprep.Names("days_ahead", "distance_km"), Norm: scale.NormL1}),
			pipeline.Use(scale.RowNorm{Columns: tabprep.Names("pet_age", "prior_no_shows"), Norm: scale.NormL2}),
			pipeline.Use(scale.RowNorm{Columns: tabprep.Names("no_show", "days_ahead"), Norm: scale.NormMax})),
		c("Powers",
			pipeline.Use(scale.BoxCox{Columns: tabprep.Names("distance_km"), ZScore: true}),
			pipeline.Use(scale.YeoJohnson{Columns: tabprep.Names("days_ahead")}),
			pipeline.Use(scale.YeoJohnson{Columns: tabprep.Names("pet_age"), ZScore: true, OutOfDomain: scale.DomainMissing})),
		c("Quantiles",
			pipeline.Use(scale.Quantile{Columns: tabprep.Names("days_ahead"), Points: 50, Output: scale.OutputNormal}),
			pipeline.Use(scale.Quantile{Columns: tabprep.Names("distance_km", "pet_age")})),
		c("ModelFills",
			pipeline.Use(impute.KNearest{Columns: tabprep.Names("pet_age", "days_ahead"), K: 5, Weights: impute.WeightDistance}),
			pipeline.Use(impute.Chained{Columns: tabprep.Names("distance_km", "days_ahead", "prior_no_shows"), Seed: 1})),
		c("Logs",
			pipeline.Use(scale.Log{Columns: tabprep.Names("distance_km")}),
			pipeline.Use(scale.Log1p{Columns: tabprep.Names("days_ahead")}),
			pipeline.Use(scale.Log1p{Columns: tabprep.Names("prior_no_shows"), OutOfDomain: scale.DomainMissing})),
	}
}

// Kinds returns the step kinds of the cases, each once.
func Kinds() []string {
	var kinds []string
	for _, c := range Cases() {
		for _, st := range c.Stages {
			if !slices.Contains(kinds, st.Kind()) {
				kinds = append(kinds, st.Kind())
			}
		}
	}
	return kinds
}

// Data returns the demo data with a column of decimal-comma fee texts and
// one of notes with awkward levels, split into train rows and test rows.
func Data() (train, test *tabprep.Frame, err error) {
	all, err := tabprep.ReadCSV(bytes.NewReader(demodata.CSV), nil)
	if err != nil {
		return nil, nil, err
	}
	rng := rand.New(rand.NewPCG(61, 62))
	fees := make([]string, all.NumRows())
	for i := range fees {
		fees[i] = fmt.Sprintf("%d,%02d", 20+rng.IntN(180), rng.IntN(100))
		switch {
		case i%25 == 0:
			fees[i] = ""
		case i%40 == 0:
			fees[i] = fmt.Sprintf("1.%03d,00", rng.IntN(1000))
		case i%101 == 0:
			fees[i] = "free"
		}
	}
	// Levels that test the quoting of generated source: quotes, a
	// backslash, control characters, a comment marker and non-ASCII text.
	odd := []string{`O'Brien`, `say "hi"`, `back\slash`, "tab\there", "line\nbreak", "*/ end", "ünïcödé", "日本", "\x00nul"}
	notes := make([]string, all.NumRows())
	for i := range notes {
		if i%3 != 0 {
			notes[i] = odd[rng.IntN(len(odd))]
		}
	}
	if all, err = all.With(tabprep.NewCategorical("fee", fees), tabprep.NewCategorical("note", notes)); err != nil {
		return nil, nil, err
	}
	tagged, _, err := split.Random{Fraction: 0.25, Partition: "test", Seed: 9}.Apply(all)
	if err != nil {
		return nil, nil, err
	}
	return tagged.Train(), tagged.HoldoutRows(), nil
}

// Fit fits the pipeline of c on train and returns it with the data it
// reads (train without c.Drop).
func (c Case) Fit(train *tabprep.Frame) (*pipeline.Fitted, error) {
	data, err := train.Without(c.Drop...)
	if err != nil {
		return nil, err
	}
	return pipeline.New(c.Stages...).Fit(data)
}

// File returns the name of the generated file of c.
func File(c Case) string { return "plan_" + strings.ToLower(c.Name) + ".go" }
