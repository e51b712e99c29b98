package impute_test

import (
	"encoding/json"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/impute"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/state"
)

// FuzzParams decodes arbitrary params for every step kind of the package
// and applies them: a malformed document may be refused, but must never
// make a transform panic; params that decode and apply must re-encode to
// params that decode again.
func FuzzParams(f *testing.F) {
	rng := rand.New(rand.NewPCG(91, 92))
	train := vetFrame(rng, 30, 0.2)
	stages := []pipeline.Stage{
		pipeline.Use(impute.Fill{Numeric: impute.Rule{Stat: impute.StatMedian}, Categorical: impute.ConstantLevel("unknown")}),
		pipeline.Use(impute.Mean{}), pipeline.Use(impute.Median{}), pipeline.Use(impute.Min{}),
		pipeline.Use(impute.Max{}), pipeline.Use(impute.MostFrequent{}),
		pipeline.Use(impute.CarryForward{}), pipeline.Use(impute.CarryBackward{}), pipeline.Use(impute.Interpolate{}),
		pipeline.Use(impute.DropRows{}), pipeline.Use(impute.Indicators{}), pipeline.Use(impute.DropSparse{MaxShare: 0.1}),
		pipeline.Use(impute.KNearest{K: 2}), pipeline.Use(impute.Chained{Rounds: 2}),
	}
	for _, st := range stages {
		fitted, err := pipeline.New(st).Fit(train)
		require.NoError(f, err)
		b, err := json.Marshal(fitted.Step(0).Params())
		require.NoError(f, err)
		f.Add(st.Kind(), b)
	}
	data := vetFrame(rng, 12, 0.4)
	f.Fuzz(func(t *testing.T, kind string, params []byte) {
		if len(params) > 1<<16 {
			return
		}
		fitted, err := state.Decode(kind, []byte(`{}`), params)
		if err != nil {
			return
		}
		if _, err := fitted.Apply(data); err != nil {
			return
		}
		b, err := json.Marshal(fitted.Params())
		require.NoError(t, err)
		_, err = state.Decode(kind, []byte(`{}`), b)
		require.NoError(t, err)
	})
}

// TestConcurrentTransforms runs transforms of one fitted step from many
// goroutines (meant for -race) and checks every result is the same.
func TestConcurrentTransforms(t *testing.T) {
	rng := rand.New(rand.NewPCG(93, 94))
	train := vetFrame(rng, 200, 0.2)
	data := vetFrame(rng, 50, 0.4)
	kn := impute.KNearest{K: 3}
	kp, err := kn.Fit(train)
	require.NoError(t, err)
	ch := impute.Chained{Rounds: 3}
	cp, err := ch.Fit(train)
	require.NoError(t, err)
	fl := impute.Fill{Numeric: impute.Rule{Stat: impute.StatMean}, Categorical: impute.ConstantLevel("unknown")}
	fp, err := fl.Fit(train)
	require.NoError(t, err)
	run := func() [3]*tabprep.Frame {
		a, err1 := kn.Transform(kp, data)
		b, err2 := ch.Transform(cp, data)
		c, err3 := fl.Transform(fp, data)
		require.NoError(t, err1)
		require.NoError(t, err2)
		require.NoError(t, err3)
		return [3]*tabprep.Frame{a, b, c}
	}
	want := run()
	results := make(chan [3]*tabprep.Frame, 8)
	for range 8 {
		go func() { results <- run() }()
	}
	for range 8 {
		got := <-results
		for i := range got {
			require.True(t, bitEqual(want[i], got[i]))
		}
	}
}

func TestMalformedParams(t *testing.T) {
	data := tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{nan}))
	_, err := impute.KNearest{}.Transform(impute.KNearestParams{Columns: []string{"pet_age"}, K: 1, Weights: "uniform", Center: state.Floats{1}, Scale: state.Floats{1}, Rows: 2, Reference: state.Floats{1}}, data)
	require.ErrorIs(t, err, tabprep.ErrValue)
	require.EqualError(t, err, "impute.knearest transform: malformed params: 1 reference values for 2 rows of 1 columns; fit the step again")
	_, err = impute.Chained{}.Transform(impute.ChainedParams{Columns: []string{"pet_age"}, Center: state.Floats{1}, Rounds: 1, Order: []int{3},
		Equations: []impute.Equation{{Target: "pet_age", Coef: state.Floats{0}}}}, data)
	require.EqualError(t, err, "impute.chained transform: malformed params: order index 3 outside [0, 1); fit the step again")
}
