package impute_test

import (
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/impute"
	"github.com/tabprep/tabprep/pipeline"
)

func TestRowOrderFills(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("booked_on", []float64{0, 1, 2, 3}),
		tabprep.NewNumeric("pet_age", []float64{1, 2, nan, 9}), // median 2
	)
	data := tabprep.MustFrame(
		tabprep.NewNumeric("booked_on", []float64{0, 1, 4, 5, 6, 10, 11}),
		tabprep.NewNumeric("pet_age", []float64{nan, 4, nan, nan, 10, nan, nan}),
	)
	// Expected values worked by hand from the documented rules.
	cases := []struct {
		name string
		fit  func() (*tabprep.Frame, error)
		want []float64
	}{
		{"carry forward", func() (*tabprep.Frame, error) {
			s := impute.CarryForward{Columns: tabprep.Names("pet_age")}
			p, err := s.Fit(train)
			require.NoError(t, err)
			return s.Transform(p, data)
		}, []float64{2, 4, 4, 4, 10, 10, 10}},
		{"carry backward", func() (*tabprep.Frame, error) {
			s := impute.CarryBackward{Columns: tabprep.Names("pet_age"), Edge: impute.Rule{Stat: impute.StatMax}}
			p, err := s.Fit(train)
			require.NoError(t, err)
			return s.Transform(p, data)
		}, []float64{4, 4, 10, 10, 10, 9, 9}},
		{"interpolate by row", func() (*tabprep.Frame, error) {
			s := impute.Interpolate{Columns: tabprep.Names("pet_age")}
			p, err := s.Fit(train)
			require.NoError(t, err)
			return s.Transform(p, data)
		}, []float64{4, 4, 6, 8, 10, 10, 10}},
		{"interpolate by booked_on", func() (*tabprep.Frame, error) {
			s := impute.Interpolate{By: "booked_on"}
			p, err := s.Fit(train)
			require.NoError(t, err)
			require.Len(t, p.Edges, 1) // the axis is not filled
			return s.Transform(p, data)
		}, []float64{4, 4, 4 + 6*3.0/5, 4 + 6*4.0/5, 10, 10, 10}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			out, err := tc.fit()
			require.NoError(t, err)
			require.InDeltaSlice(t, tc.want, column(t, out, "pet_age").Float64s(), 1e-12)
			require.Same(t, column(t, data, "booked_on"), column(t, out, "booked_on"))
		})
	}
}

func TestRowOrderEdges(t *testing.T) {
	train := tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{1, 2, 6}))
	empty := tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{nan, nan}))
	s := impute.Interpolate{Edge: impute.Rule{Stat: impute.StatMean}}
	p, err := s.Fit(train)
	require.NoError(t, err)
	out, err := s.Transform(p, empty)
	require.NoError(t, err)
	require.Equal(t, []float64{3, 3}, column(t, out, "pet_age").Float64s())

	keep := impute.CarryForward{Edge: impute.Rule{Stat: impute.StatKeep}}
	kp, err := keep.Fit(train)
	require.NoError(t, err)
	out, err = keep.Transform(kp, tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{nan, 5, nan})))
	require.NoError(t, err)
	got := column(t, out, "pet_age").Float64s()
	require.True(t, got[0] != got[0])
	require.Equal(t, []float64{5, 5}, got[1:])

	_, err = impute.Interpolate{By: "booked_on"}.Fit(train)
	require.ErrorIs(t, err, tabprep.ErrNoColumn)
	require.EqualError(t, err, `impute.interpolate fit: column "booked_on": is the interpolation axis (By): not in frame; it has ["pet_age"]`)
	_, err = impute.Interpolate{By: "pet_age", Columns: tabprep.Names("pet_age")}.Fit(train)
	require.EqualError(t, err, `impute.interpolate fit: column "pet_age": is the interpolation axis (By) and cannot be filled by the same step`)
	_, err = impute.CarryForward{}.Fit(empty)
	require.ErrorIs(t, err, tabprep.ErrAllMissing)
}

func TestRowOrderContracts(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 42))
	for range 5 {
		train := vetFrame(rng, 30+rng.IntN(100), 0.3)
		fresh := withHoldout(t, vetFrame(rng, 1+rng.IntN(50), 0.4))
		numeric := []string{"pet_age", "distance_km", "days_ahead"}
		requireNoGaps(t, checkContract(t, impute.CarryForward{}, train, fresh, false), numeric...)
		requireNoGaps(t, checkContract(t, impute.CarryBackward{}, train, fresh, false), numeric...)
		requireNoGaps(t, checkContract(t, impute.Interpolate{}, train, fresh, false), numeric...)
	}
}

// TestCompileRefusesWholeFrameSteps checks that a step whose output for a
// row depends on other rows of the frame has no row kernel, and that
// compiling a pipeline with it fails with an error naming the step.
func TestCompileRefusesWholeFrameSteps(t *testing.T) {
	rng := rand.New(rand.NewPCG(67, 68))
	train := vetFrame(rng, 40, 0.2)
	cases := []struct {
		kind  string
		stage pipeline.Stage
	}{
		{"impute.carryforward", pipeline.Use(impute.CarryForward{})},
		{"impute.carrybackward", pipeline.Use(impute.CarryBackward{})},
		{"impute.interpolate", pipeline.Use(impute.Interpolate{})},
		{"impute.droprows", pipeline.Use(impute.DropRows{})},
	}
	for _, tc := range cases {
		t.Run(tc.kind, func(t *testing.T) {
			fitted, err := pipeline.New(pipeline.Use(impute.Mean{}), tc.stage).Fit(train)
			require.NoError(t, err)
			_, err = fitted.Compile()
			require.Error(t, err)
			require.ErrorContains(t, err, "step 1 ("+tc.kind+") cannot act on one row")
		})
	}
}
