package split_test

import (
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/split"
)

func TestErrors(t *testing.T) {
	f := clinicFrame() // 12 rows
	empty := tabprep.MustFrame(tabprep.NewNumeric("pet_age", nil))
	withMissing := tabprep.MustFrame(tabprep.NewCategorical("species", []string{"dog", "", "cat", "dog"}))
	allHeld, err := f.Tag(tabprep.Holdout("old"), []int{0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11})
	require.NoError(t, err)
	tests := []struct {
		name string
		s    split.Strategy
		f    *tabprep.Frame
		want error
		msg  string
	}{
		{"fraction above 1", split.Random{Fraction: 1.5}, f, tabprep.ErrOption, `split.random: partition "holdout": Fraction 1.5 is outside (0, 1); give the share of rows to hold out, such as 0.2`},
		{"fraction negative", split.Stratified{Column: "species", Fraction: -0.1}, f, tabprep.ErrOption, `Fraction -0.1 is outside (0, 1)`},
		{"no size", split.Random{}, f, tabprep.ErrOption, `has no size; set Fraction in (0, 1) or Rows`},
		{"both sizes", split.Random{Fraction: 0.2, Rows: 3}, f, tabprep.ErrOption, `both Fraction 0.2 and Rows 3; set one`},
		{"count too large", split.Random{Rows: 13}, f, split.ErrTooFew, `Rows 13 is not below the 12 rows to split; give a count in [1, 11]`},
		{"fraction rounds to zero", split.Random{Fraction: 0.01}, f, split.ErrTooFew, `Fraction 0.01 of 12 rows rounds to 0 rows`},
		{"empty frame", split.Random{Fraction: 0.2}, empty, split.ErrTooFew, `split.random: the frame has no rows to split`},
		{"all holdout", split.Random{Fraction: 0.2}, allHeld, split.ErrTooFew, `all 12 rows are already tagged holdout`},
		{"stratum numeric", split.Stratified{Column: "pet_id", Fraction: 0.2}, f, tabprep.ErrKind, `split.stratified: column "pet_id": is numeric; classes come from a categorical column`},
		{"stratum absent", split.Stratified{Column: "breed", Fraction: 0.2}, f, tabprep.ErrNoColumn, `column "breed": not in the frame`},
		{"stratum missing", split.Stratified{Column: "species", Fraction: 0.5}, withMissing, tabprep.ErrValue, `column "species": row 1: missing class; fill it, or set MissingAsClass`},
		{"report column numeric", split.Random{Fraction: 0.2, ReportBy: "pet_id"}, f, tabprep.ErrKind, `report column is numeric`},
		{"every too small", split.Systematic{Every: 1}, f, tabprep.ErrOption, `Every 1 is below 2`},
		{"every too large", split.Systematic{Every: 13}, f, split.ErrTooFew, `Every 13 is more than the 12 rows to split; use at most 12`},
		{"offset", split.Systematic{Every: 3, Offset: 3}, f, tabprep.ErrOption, `Offset 3 is outside [0, 3)`},
		{"ordered missing", split.Ordered{Column: "species", Fraction: 0.5}, withMissing, tabprep.ErrValue, `row 1: missing value in the ordering column`},
		{"ordered all ties", split.Ordered{Column: "x", Fraction: 0.5}, tabprep.MustFrame(tabprep.NewNumeric("x", []float64{1, 1, 1, 1})), split.ErrTooFew, `equal values around row position 2`},
		{"keyhash fraction", split.KeyHash{Column: "pet_id", Fraction: 1}, f, tabprep.ErrOption, `Fraction 1 is outside (0, 1)`},
		{"three-way sum", split.ThreeWay{By: split.Random{}, Validation: 0.5, Test: 0.5}, f, tabprep.ErrOption, `Validation 0.5 and Test 0.5 add up to 1; they must add up to less than 1`},
		{"three-way sized", split.ThreeWay{By: split.Random{Fraction: 0.1}, Validation: 0.2, Test: 0.2}, f, tabprep.ErrOption, `leave them zero`},
		{"three-way systematic", split.ThreeWay{By: split.Systematic{Every: 3}, Validation: 0.2, Test: 0.2}, f, tabprep.ErrOption, `By is split.Systematic; use split.Random`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			out, rep, err := tt.s.Apply(tt.f)
			require.ErrorIs(t, err, tt.want)
			require.ErrorContains(t, err, tt.msg)
			require.Nil(t, out)
			require.Nil(t, rep)
		})
	}
}

func TestFoldErrors(t *testing.T) {
	f := clinicFrame() // 12 rows, 8 pets
	tests := []struct {
		name string
		s    split.Folding
		want error
		msg  string
	}{
		{"k below 2", split.RandomFolds{K: 1}, tabprep.ErrOption, `split.randomfolds: K 1 is below 2; use at least 2 folds`},
		{"k above rows", split.RandomFolds{K: 13}, split.ErrTooFew, `K 13 is more than the 12 rows to split; use at most 12 folds`},
		{"stratified numeric", split.StratifiedFolds{Column: "no_show", K: 2}, tabprep.ErrKind, `column "no_show": is numeric`},
		{"stratified absent", split.StratifiedFolds{Column: "breed", K: 2}, tabprep.ErrNoColumn, `column "breed"`},
		{"groups fewer than k", split.GroupFolds{Column: "clinic", K: 4}, split.ErrTooFew, `column "clinic": 3 groups, fewer than K 4; use at most 3 folds`},
		{"group k below 2", split.GroupFolds{Column: "clinic", K: 0}, tabprep.ErrOption, `K 0 is below 2`},
		{"time too many folds", split.TimeFolds{K: 6, Holdout: 2}, split.ErrTooFew, `12 rows cannot hold 6 blocks of 2 rows, a buffer of 0 and a train row`},
		{"time negative", split.TimeFolds{K: 2, Buffer: -1}, tabprep.ErrOption, `Buffer -1`},
		{"report numeric", split.RandomFolds{K: 2, ReportBy: "no_show"}, tabprep.ErrKind, `report column is numeric`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			folds, err := tt.s.Folds(f)
			require.ErrorIs(t, err, tt.want)
			require.ErrorContains(t, err, tt.msg)
			require.Nil(t, folds)
		})
	}
}

func TestReportTable(t *testing.T) {
	// The one-row class (bird) stays in train and is noted; the missing
	// class is its own stratum.
	f := tabprep.MustFrame(tabprep.NewCategorical("species", []string{"dog", "dog", "cat", "cat", "bird", "", "", "dog", "cat", "dog"}))
	out, rep, err := split.Stratified{Column: "species", Fraction: 0.5, Seed: 4, MissingAsClass: true}.Apply(f)
	require.NoError(t, err)
	require.Equal(t, tabprep.Train, out.Role(4))
	// By hand: 5 of 10 rows; quotas dog 2.0, cat 1.5, missing 1.0, bird
	// kept in train, so the one row still owed goes to cat, the largest
	// remainder.
	require.Equal(t, `stratified split on species, seed 4: 10 rows
partition  rows  share
train         5  50.0%
holdout       5  50.0%

species       train   holdout
dog        2  40.0%  2  40.0%
cat        1  20.0%  2  40.0%
bird       1  20.0%  0   0.0%
(missing)  1  20.0%  1  20.0%
note: class "bird" has 1 row; kept in train
`, rep.String())
}
