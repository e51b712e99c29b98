package pipeline_test

import (
	"bytes"
	"errors"
	"fmt"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/examples/quickstart/demodata"
	"github.com/tabprep/tabprep/impute"
	"github.com/tabprep/tabprep/internal/sourcetest"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/scale"
	"github.com/tabprep/tabprep/split"
	"github.com/tabprep/tabprep/state"
)

// stepCase is one built-in step with typical options, for the checks that
// every step must pass.
type stepCase struct {
	stage pipeline.Stage
	fit   func(*tabprep.Frame) error // the step's own Fit, called directly
	drops bool                       // documented to drop rows
	// source says whether the step has a Go source form, for generated
	// plans; package internal/sourcetest checks those.
	source bool
}

func caseOf[S tabprep.Step[P], P any](s S) stepCase {
	_, source := any(s).(tabprep.RowSource[P])
	return stepCase{stage: pipeline.Use(s), fit: func(f *tabprep.Frame) error { _, err := s.Fit(f); return err }, source: source}
}

func builtinCases() []stepCase {
	unknown := "unknown"
	drop := caseOf(impute.DropRows{Columns: tabprep.Names("pet_age")})
	drop.drops = true
	return []stepCase{
		caseOf(impute.Mean{}),
		caseOf(impute.Median{}),
		caseOf(impute.Min{}),
		caseOf(impute.Max{}),
		caseOf(impute.MostFrequent{}),
		caseOf(impute.Constant{Columns: tabprep.Names("reminder"), Level: &unknown}),
		caseOf(impute.Fill{Numeric: impute.Rule{Stat: impute.StatMedian}, Categorical: impute.ConstantLevel("unknown")}),
		caseOf(impute.CarryForward{Columns: tabprep.Names("pet_age")}),
		caseOf(impute.CarryBackward{Columns: tabprep.Names("pet_age")}),
		caseOf(impute.Interpolate{Columns: tabprep.Names("distance_km"), By: "days_ahead"}),
		drop,
		caseOf(impute.Indicators{}),
		caseOf(impute.DropSparse{MaxShare: 0.05}),
		caseOf(impute.KNearest{Columns: tabprep.Names("pet_age"), K: 5, Weights: impute.WeightDistance}),
		caseOf(impute.Chained{Columns: tabprep.Names("pet_age", "distance_km", "days_ahead"), Seed: 1}),
		caseOf(encode.OneHot{Columns: tabprep.Names("clinic", "species"), MinCount: 100, Unseen: encode.UnseenOther}),
		caseOf(encode.Ordinal{Columns: tabprep.Names("visit_type")}),
		caseOf(encode.Frequency{Columns: tabprep.Names("species"), Share: true}),
		caseOf(encode.Target{Columns: tabprep.Names("clinic"), Target: "no_show", K: 10, Folds: 3, Seed: 2}),
		caseOf(encode.Hash{Columns: tabprep.Names("clinic"), Buckets: 3, Seed: 5}),
		caseOf(encode.Bin{Columns: tabprep.Names("distance_km"), Method: encode.BinQuantile, Bins: 4}),
		caseOf(encode.ParseNumber{Columns: tabprep.Names("fee"), Decimal: ",", Thousands: "."}),
		caseOf(encode.ParseTime{Columns: tabprep.Names("booked_on"), Layout: time.DateOnly, Parts: []encode.TimePart{encode.PartUnix, encode.PartWeekday}}),
		caseOf(scale.ZScore{}),
		caseOf(scale.MinMax{Low: -1, High: 1, Clamp: true}),
		caseOf(scale.DecimalScaling{}),
		caseOf(scale.Robust{}),
		caseOf(scale.MaxAbs{}),
		caseOf(scale.RowNorm{Columns: tabprep.Names("days_ahead", "distance_km"), Norm: scale.NormL1}),
		caseOf(scale.Log{Columns: tabprep.Names("distance_km")}),
		caseOf(scale.Log1p{Columns: tabprep.Names("days_ahead")}),
		caseOf(scale.BoxCox{Columns: tabprep.Names("distance_km"), ZScore: true}),
		caseOf(scale.YeoJohnson{Columns: tabprep.Names("days_ahead")}),
		caseOf(scale.Quantile{Columns: tabprep.Names("days_ahead"), Points: 50, Output: scale.OutputNormal}),
	}
}

// invariantData is the demo data with a column of decimal-comma fee texts,
// split into train and a tagged test holdout.
func invariantData(t *testing.T) (tagged, train, test *tabprep.Frame) {
	t.Helper()
	all, err := tabprep.ReadCSV(bytes.NewReader(demodata.CSV), nil)
	require.NoError(t, err)
	rng := rand.New(rand.NewPCG(51, 52))
	fees := make([]string, all.NumRows())
	for i := range fees {
		fees[i] = fmt.Sprintf("%d,%02d", 20+rng.IntN(180), rng.IntN(100))
		if i%40 == 0 {
			fees[i] = fmt.Sprintf("1.%03d,00", rng.IntN(1000))
		}
		if i%25 == 0 {
			fees[i] = ""
		}
	}
	all, err = all.With(tabprep.NewCategorical("fee", fees))
	require.NoError(t, err)
	tagged, _, err = split.Random{Fraction: 0.25, Partition: "test", Seed: 9}.Apply(all)
	require.NoError(t, err)
	return tagged, tagged.Train(), tagged.HoldoutRows()
}

// TestEveryStepKeepsTheInvariants checks the design's invariants 1 to 3 on
// every built-in step: no fit reads a holdout row, Transform never mutates
// its input and keeps rows, order and roles, and Save → Load → Transform is
// bit-identical; and that the compiled row plan, where a step has one, is
// bit-identical to the batch transform.
func TestEveryStepKeepsTheInvariants(t *testing.T) {
	tagged, train, test := invariantData(t)
	covered := map[string]bool{}
	var noKernel, sources []string
	for _, c := range builtinCases() {
		kind := c.stage.Kind()
		covered[kind] = true
		if c.source {
			sources = append(sources, kind)
		}
		t.Run(kind, func(t *testing.T) {
			// 1. No fit reads a holdout row, called directly or through a
			// pipeline.
			require.True(t, errors.Is(c.fit(tagged), tabprep.ErrHoldout), "direct Fit on holdout rows")
			_, err := pipeline.New(c.stage).Fit(tagged)
			require.ErrorIs(t, err, tabprep.ErrHoldout)

			fitted, err := pipeline.New(c.stage).Fit(train)
			require.NoError(t, err)

			// 2. Transform leaves its input alone and keeps rows and roles.
			all := make([]int, test.NumRows())
			for i := range all {
				all[i] = i
			}
			snapshot, err := test.Take(all)
			require.NoError(t, err)
			out, err := fitted.Transform(test)
			require.NoError(t, err)
			require.True(t, tabprep.Equal(snapshot, test), "Transform modified its input")
			if !c.drops {
				require.Equal(t, test.NumRows(), out.NumRows())
				require.Equal(t, test.Roles(), out.Roles())
			}
			require.Equal(t, fitted.OutputNames(), out.Names())

			// 3. Save → Load → Transform is bit-identical.
			again, err := steptest.Reloaded(t, fitted).Transform(test)
			require.NoError(t, err)
			require.True(t, tabprep.Equal(out, again), "Save/Load changed the output")

			// The row plan, where the step can act on one row.
			if _, err := fitted.Compile(); err != nil {
				require.ErrorContains(t, err, kind)
				noKernel = append(noKernel, kind)
				return
			}
			in, err := fitted.Input().Conform("test", test)
			require.NoError(t, err)
			steptest.RowsMatch(t, train, in, c.stage)
		})
	}
	// Every registered built-in kind has a case here.
	for _, k := range state.Kinds() {
		if strings.HasPrefix(k, "pipetest.") {
			continue
		}
		require.True(t, covered[k], "step kind %s has no invariant case; add one to builtinCases", k)
	}
	// Only the steps that need other rows to fill one have no row kernel.
	slices.Sort(noKernel)
	require.Equal(t, []string{"impute.carrybackward", "impute.carryforward", "impute.droprows", "impute.interpolate"}, noKernel)
	// Every step with a Go source form has a generated plan checked against
	// the interpreted one.
	require.ElementsMatch(t, sources, sourcetest.Kinds(), "a step with a Go source form needs a case in internal/sourcetest, and only those")
}
