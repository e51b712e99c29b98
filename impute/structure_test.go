package impute_test

import (
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/impute"
)

func TestDropRows(t *testing.T) {
	data := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, nan, 3, 4, nan}),
		tabprep.NewCategorical("species", []string{"dog", "cat", "", "dog", "cat"}),
		tabprep.NewNumeric("distance_km", []float64{nan, 1, 1, 1, 1}),
	)
	s := impute.DropRows{Columns: tabprep.Names("pet_age", "species")}
	p, err := s.Fit(data)
	require.NoError(t, err)
	require.Equal(t, []string{"pet_age", "species"}, p.Columns)
	require.Equal(t, impute.DropReport{Rows: 5, Dropped: 3, Gaps: []int{2, 1}}, p.Train)

	fresh, err := data.Tag(tabprep.Holdout("test"), []int{3})
	require.NoError(t, err)
	out, rep, err := s.Drop(p, fresh)
	require.NoError(t, err)
	require.Equal(t, impute.DropReport{Rows: 5, Dropped: 3, Gaps: []int{2, 1}}, rep)
	require.Equal(t, []float64{1, 4}, column(t, out, "pet_age").Float64s())
	require.Equal(t, []tabprep.Role{tabprep.Train, tabprep.Holdout("test")}, out.Roles())
	require.Equal(t, 1, column(t, out, "distance_km").MissingCount()) // not checked

	rng := rand.New(rand.NewPCG(51, 52))
	for range 5 {
		train := vetFrame(rng, 40, 0.2)
		out := checkContract(t, impute.DropRows{}, train, withHoldout(t, vetFrame(rng, 30, 0.1)), true)
		requireNoGaps(t, out, out.Names()...)
	}
	_, err = s.Transform(p, tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{1})))
	require.EqualError(t, err, `impute.droprows transform: column "species": fitted on this column but the data lacks it; pass data with the train columns`)
}

func TestIndicators(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, nan, 3}),
		tabprep.NewCategorical("species", []string{"dog", "cat", ""}),
		tabprep.NewNumeric("days_ahead", []float64{1, 2, 3}),
	)
	s := impute.Indicators{}
	p, err := s.Fit(train)
	require.NoError(t, err)
	require.Equal(t, []impute.Indicator{{"pet_age", "pet_age_missing"}, {"species", "species_missing"}}, p.Columns)
	data := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{nan, 2}),
		tabprep.NewCategorical("species", []string{"dog", ""}),
		tabprep.NewNumeric("days_ahead", []float64{nan, 2}), // gaps now, but none in train: no indicator
	)
	out, err := s.Transform(p, data)
	require.NoError(t, err)
	require.Equal(t, []string{"pet_age", "species", "days_ahead", "pet_age_missing", "species_missing"}, out.Names())
	require.Equal(t, []float64{1, 0}, column(t, out, "pet_age_missing").Float64s())
	require.Equal(t, []float64{0, 1}, column(t, out, "species_missing").Float64s())
	checkRowKernel(t, s.RowKernel, p, data, s.Transform)

	all, err := impute.Indicators{All: true, Columns: tabprep.Names("days_ahead")}.Fit(train)
	require.NoError(t, err)
	require.Equal(t, []impute.Indicator{{"days_ahead", "days_ahead_missing"}}, all.Columns)

	clash := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{nan}),
		tabprep.NewNumeric("pet_age_missing", []float64{0}),
	)
	_, err = s.Fit(clash)
	require.ErrorIs(t, err, tabprep.ErrName)
	require.EqualError(t, err, `impute.indicators fit: column "pet_age_missing": already a column, so the indicator of "pet_age" cannot take its name; rename it first`)

	rng := rand.New(rand.NewPCG(53, 54))
	for range 5 {
		checkContract(t, impute.Indicators{}, vetFrame(rng, 40, 0.2), withHoldout(t, vetFrame(rng, 30, 0.3)), false)
	}
}

func TestDropSparse(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, nan, 3, 4}),                     // 0.25
		tabprep.NewNumeric("distance_km", []float64{nan, nan, 3, 4}),               // 0.5
		tabprep.NewCategorical("reminder", []string{"", "", "", "sms"}),            // 0.75
		tabprep.NewCategorical("species", []string{"dog", "cat", "dog", "rabbit"}), // 0
	)
	s := impute.DropSparse{MaxShare: 0.5}
	p, err := s.Fit(train)
	require.NoError(t, err)
	require.Equal(t, []string{"reminder"}, p.Dropped)
	require.Equal(t, 0.5, float64(p.Checked[1].Share))
	// The decision is frozen: new data without gaps still loses the column.
	data := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{nan}),
		tabprep.NewNumeric("distance_km", []float64{nan}),
		tabprep.NewCategorical("reminder", []string{"email"}),
		tabprep.NewCategorical("species", []string{"dog"}),
	)
	out, err := s.Transform(p, data)
	require.NoError(t, err)
	require.Equal(t, []string{"pet_age", "distance_km", "species"}, out.Names())

	p0, err := impute.DropSparse{MaxShare: 0}.Fit(train)
	require.NoError(t, err)
	require.Equal(t, []string{"pet_age", "distance_km", "reminder"}, p0.Dropped)

	_, err = impute.DropSparse{MaxShare: 1.5}.Fit(train)
	require.EqualError(t, err, `impute.dropsparse fit: MaxShare 1.5 outside [0, 1]`)
	_, err = s.Transform(p, tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{1})))
	require.EqualError(t, err, `impute.dropsparse transform: column "reminder": fitted on this column but the data lacks it; pass data with the train columns`)

	checkRowKernel(t, s.RowKernel, p, data, s.Transform)

	rng := rand.New(rand.NewPCG(55, 56))
	for range 5 {
		checkContract(t, impute.DropSparse{MaxShare: 0.2}, vetFrame(rng, 40, 0.2), withHoldout(t, vetFrame(rng, 30, 0.3)), false)
	}
}
