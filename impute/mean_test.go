package impute_test

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/impute"
	"gonum.org/v1/gonum/stat"
)

func TestMeanFit(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, nan, 2, 6}),
		tabprep.NewCategorical("species", []string{"dog", "", "cat", "dog"}),
	)
	p, err := impute.Mean{}.Fit(train)
	require.NoError(t, err)
	require.Len(t, p.Columns, 1)
	got := p.Columns[0]
	require.Equal(t, "pet_age", got.Name)
	require.Equal(t, impute.StatMean, got.Stat)
	require.Equal(t, 3.0, float64(got.Number)) // (1+2+6)/3, by hand
	require.Equal(t, 1, got.Gaps)

	out, err := impute.Mean{}.Transform(p, train)
	require.NoError(t, err)
	require.Equal(t, []float64{1, 3, 2, 6}, column(t, out, "pet_age").Float64s())
	// The categorical column is not chosen and is shared, not copied.
	require.Same(t, column(t, train, "species"), column(t, out, "species"))
}

func TestMeanContract(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for trial := range 20 {
		train := vetFrame(rng, 5+rng.IntN(200), 0.3)
		fresh := withHoldout(t, vetFrame(rng, 1+rng.IntN(100), 0.3*float64(trial%3)))
		out := checkContract(t, impute.Mean{}, train, fresh, false)
		requireNoGaps(t, out, "pet_age", "distance_km", "days_ahead")
		// Present cells are kept as they were.
		for _, name := range []string{"pet_age", "distance_km", "days_ahead"} {
			in, got := column(t, fresh, name).Float64s(), column(t, out, name).Float64s()
			for i, v := range in {
				if !math.IsNaN(v) {
					require.Equal(t, v, got[i])
				}
			}
		}
		require.Same(t, column(t, fresh, "species"), column(t, out, "species"))
	}
}

func TestMeanRefusesHoldout(t *testing.T) {
	train := withHoldout(t, vetFrame(rand.New(rand.NewPCG(1, 1)), 9, 0.2))
	_, err := impute.Mean{}.Fit(train)
	require.ErrorIs(t, err, tabprep.ErrHoldout)
	require.EqualError(t, err, "impute.mean fit: 3 of 9 rows are tagged holdout; fit only on train rows: pass frame.Train() (or frame.Select(tabprep.Train))")
}

func TestMeanErrors(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, 2}),
		tabprep.NewNumeric("distance_km", []float64{nan, nan}),
		tabprep.NewCategorical("species", []string{"dog", ""}),
	)
	cases := []struct {
		name     string
		sel      tabprep.Selection
		sentinel error
		msg      string
	}{
		{"unknown column", tabprep.Names("weight"), tabprep.ErrNoColumn,
			`impute.mean fit: column "weight": selected by name but not in the frame; it has ["pet_age" "distance_km" "species"]`},
		{"categorical column", tabprep.Names("species"), tabprep.ErrKind,
			`impute.mean fit: column "species": is categorical; this step takes numeric columns`},
		{"all missing", tabprep.Names("distance_km"), tabprep.ErrAllMissing,
			`impute.mean fit: column "distance_km": no value in the 2 train rows to compute the mean from; give this column a constant rule or drop it (impute.DropSparse)`},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := impute.Mean{Columns: tc.sel}.Fit(train)
			require.ErrorIs(t, err, tc.sentinel)
			require.EqualError(t, err, tc.msg)
			var te *tabprep.Error
			require.True(t, errors.As(err, &te))
		})
	}

	p, err := impute.Mean{Columns: tabprep.Names("pet_age")}.Fit(train)
	require.NoError(t, err)
	other := tabprep.MustFrame(tabprep.NewNumeric("distance_km", []float64{1}))
	_, err = impute.Mean{}.Transform(p, other)
	require.ErrorIs(t, err, tabprep.ErrSchema)
	require.EqualError(t, err, `impute.mean transform: column "pet_age": fitted on this column but the data lacks it; pass data with the train columns`)
	wrongKind := tabprep.MustFrame(tabprep.NewCategorical("pet_age", []string{"old"}))
	_, err = impute.Mean{}.Transform(p, wrongKind)
	require.EqualError(t, err, `impute.mean transform: column "pet_age": is categorical, but was numeric at fit time`)
}

func TestMeanAgainstGonum(t *testing.T) {
	// Reference: gonum stat.Mean (a general-purpose reference library) on
	// the present values of random columns with gaps.
	rng := rand.New(rand.NewPCG(5, 6))
	for range 50 {
		x, present := gappy(rng, 1+rng.IntN(2000), 0.2, func() float64 { return 1e3 + rng.NormFloat64()*1e2 })
		p, err := impute.Mean{}.Fit(tabprep.MustFrame(tabprep.NewNumeric("distance_km", x)))
		require.NoError(t, err)
		want := stat.Mean(present, nil)
		require.InEpsilon(t, want, float64(p.Columns[0].Number), 1e-13)
	}
}

func TestMeanRowKernel(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	train := vetFrame(rng, 300, 0.2)
	fresh := vetFrame(rng, 100, 0.4)
	s := impute.Mean{}
	p, err := s.Fit(train)
	require.NoError(t, err)
	checkRowKernel(t, s.RowKernel, p, fresh, s.Transform)
}
