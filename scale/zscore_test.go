package scale_test

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/scale"
)

func TestZScoreValues(t *testing.T) {
	// {2,4,4,4,5,5,7,9}: mean 5, Σ(x−5)² = 32, so the population std is 2
	// and the sample std √(32/7) (arithmetic from the definitions).
	x := []float64{2, 4, 4, 4, 5, 5, 7, 9, nan}
	train := tabprep.MustFrame(tabprep.NewNumeric("pet_age", x))
	for _, tc := range []struct {
		name string
		step scale.ZScore
		std  float64
	}{
		{"sample default", scale.ZScore{}, math.Sqrt(32.0 / 7)},
		{"population", scale.ZScore{Population: true}, 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, err := tc.step.Fit(train)
			require.NoError(t, err)
			require.Equal(t, []string{"pet_age"}, p.Columns)
			require.Equal(t, 5.0, p.Mean[0])
			require.InEpsilon(t, tc.std, p.Std[0], 1e-15)
			out, err := tc.step.Transform(p, train)
			require.NoError(t, err)
			got := out.Col(0).Float64s()
			for i, v := range x[:8] {
				require.InDelta(t, (v-5)/tc.std, got[i], 1e-15)
			}
			require.True(t, math.IsNaN(got[8]), "missing stays missing")
		})
	}
}

func TestZScoreTextbook(t *testing.T) {
	// Han, Kamber & Pei, Data Mining: Concepts and Techniques (3rd ed.),
	// §3.5.2: with mean 54,000 and standard deviation 16,000, the z-score of
	// 73,600 is 1.225.
	p := scale.ZScoreParams{Columns: []string{"income"}, Mean: []float64{54000}, Std: []float64{16000}}
	data := tabprep.MustFrame(tabprep.NewNumeric("income", []float64{73600}))
	out, err := scale.ZScore{}.Transform(p, data)
	require.NoError(t, err)
	require.InDelta(t, 1.225, out.Col(0).Value(0), 1e-12)
}

func TestZScoreConstantColumn(t *testing.T) {
	// Documented: a constant column is shifted, not scaled; its train
	// values map to 0 exactly, even when the mean of the copies rounds.
	train := tabprep.MustFrame(tabprep.NewNumeric("reminder", []float64{0.1, 0.1, nan, 0.1, 0.1, 0.1, 0.1, 0.1}))
	for _, step := range []scale.ZScore{{}, {Population: true}} {
		p, err := step.Fit(train)
		require.NoError(t, err)
		require.Equal(t, 0.1, p.Mean[0])
		require.Equal(t, 0.0, p.Std[0])
		data := tabprep.MustFrame(tabprep.NewNumeric("reminder", []float64{0.1, 1.1, nan}))
		out, err := step.Transform(p, data)
		require.NoError(t, err)
		got := out.Col(0).Float64s()
		require.Equal(t, 0.0, got[0])
		require.InDelta(t, 1.0, got[1], 1e-15)
		require.True(t, math.IsNaN(got[2]))
	}
	// One value: the sample std is 0, not NaN.
	p, err := scale.ZScore{}.Fit(tabprep.MustFrame(tabprep.NewNumeric("x", []float64{3})))
	require.NoError(t, err)
	require.Equal(t, 0.0, p.Std[0])
}

func TestZScoreErrors(t *testing.T) {
	train := clinicFrame(t, 40, 1, false)
	withHoldout := clinicFrame(t, 40, 1, true)
	empty := tabprep.MustFrame(tabprep.NewNumeric("distance_km", []float64{nan, nan}))
	fitted, err := scale.ZScore{Columns: tabprep.Names("pet_age")}.Fit(train)
	require.NoError(t, err)
	noAge, err := train.Without("pet_age")
	require.NoError(t, err)
	ageAsText := tabprep.MustFrame(tabprep.NewCategorical("pet_age", []string{"old"}))

	cases := []struct {
		name     string
		run      func() error
		sentinel error
		msg      string
	}{
		{"holdout rows", func() error { _, err := scale.ZScore{}.Fit(withHoldout); return err },
			tabprep.ErrHoldout,
			`scale.zscore fit: 10 of 40 rows are tagged holdout; fit only on train rows: pass frame.Train() (or frame.Select(tabprep.Train))`},
		{"categorical column", func() error { _, err := scale.ZScore{Columns: tabprep.Names("species")}.Fit(train); return err },
			tabprep.ErrKind,
			`scale.zscore fit: column "species": is categorical; this step takes numeric columns`},
		{"absent column", func() error { _, err := scale.ZScore{Columns: tabprep.Names("weight")}.Fit(train); return err },
			tabprep.ErrNoColumn,
			`scale.zscore fit: column "weight": selected by name but not in the frame; it has ["days_ahead" "distance_km" "pet_age" "weight_change" "species"]`},
		{"all missing", func() error { _, err := scale.ZScore{}.Fit(empty); return err },
			tabprep.ErrAllMissing,
			`scale.zscore fit: column "distance_km": every train value is missing; fill the column first or leave it out of Columns`},
		{"transform lacks column", func() error { _, err := scale.ZScore{}.Transform(fitted, noAge); return err },
			tabprep.ErrNoColumn,
			`scale.zscore transform: column "pet_age": fitted on this column, which the data lacks; pass a frame with every fitted column`},
		{"transform wrong kind", func() error { _, err := scale.ZScore{}.Transform(fitted, ageAsText); return err },
			tabprep.ErrKind,
			`scale.zscore transform: column "pet_age": is categorical; the step was fitted on a numeric column`},
		{"damaged params", func() error {
			_, err := scale.ZScore{}.Transform(scale.ZScoreParams{Columns: []string{"pet_age"}}, train)
			return err
		}, tabprep.ErrOption, `scale.zscore transform: parameters list 0 values for 1 columns; refit the step`},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			err := tc.run()
			require.Error(t, err)
			require.True(t, errors.Is(err, tc.sentinel), "%v", err)
			var te *tabprep.Error
			require.ErrorAs(t, err, &te)
			require.Equal(t, tc.msg, err.Error())
		})
	}
}

func TestZScoreInvariants(t *testing.T) {
	frame := clinicFrame(t, 200, 3, true)
	train := frame.Train()
	step := scale.ZScore{Columns: tabprep.Matching("d*")}
	p, err := step.Fit(train)
	require.NoError(t, err)
	require.Equal(t, []string{"days_ahead", "distance_km"}, p.Columns)

	before := snapshot(frame)
	out, err := step.Transform(p, frame)
	require.NoError(t, err)
	require.True(t, tabprep.Equal(before, frame), "input modified")
	require.Equal(t, frame.NumRows(), out.NumRows())
	require.Equal(t, frame.Names(), out.Names())
	require.Equal(t, frame.Roles(), out.Roles())
	for _, name := range []string{"pet_age", "weight_change", "species"} {
		a, _ := frame.Column(name)
		b, _ := out.Column(name)
		require.Same(t, a, b, "unchanged column %s is shared", name)
	}
	requireMissingKept(t, frame, out, p.Columns...)
	// The fitted columns of the train rows have mean 0 and std 1.
	q, err := scale.ZScore{Columns: tabprep.Names(p.Columns...)}.Fit(out.Train())
	require.NoError(t, err)
	for j := range q.Columns {
		require.InDelta(t, 0, q.Mean[j], 1e-14)
		require.InDelta(t, 1, q.Std[j], 1e-14)
	}
}

func TestZScoreChunkedFit(t *testing.T) {
	train := clinicFrame(t, 1000, 4, false)
	full, err := scale.ZScore{}.Fit(train)
	require.NoError(t, err)

	acc := scale.ZScore{}.Accumulator()
	other := scale.ZScore{}.Accumulator()
	for from := 0; from < 1000; from += 137 {
		chunk, err := train.Slice(from, min(from+137, 1000))
		require.NoError(t, err)
		if from < 500 {
			require.NoError(t, acc.Add(chunk))
		} else {
			require.NoError(t, other.Add(chunk))
		}
	}
	require.NoError(t, acc.Merge(other))
	chunked, err := acc.Finish()
	require.NoError(t, err)
	require.Equal(t, full.Columns, chunked.Columns)
	for j := range full.Columns {
		require.InEpsilon(t, full.Mean[j], chunked.Mean[j], 1e-14)
		require.InEpsilon(t, full.Std[j], chunked.Std[j], 1e-13)
	}

	// A chunk with holdout rows is refused, as by Fit.
	err = scale.ZScore{}.Accumulator().Add(clinicFrame(t, 40, 1, true))
	require.ErrorIs(t, err, tabprep.ErrHoldout)
	// Finish with nothing added says so.
	_, err = scale.ZScore{}.Accumulator().Finish()
	require.EqualError(t, err, "scale.zscore fit: no chunk was added; add train rows before Finish")
	// Accumulators of other columns do not merge.
	a, b := scale.ZScore{}.Accumulator(), scale.ZScore{Columns: tabprep.Names("pet_age")}.Accumulator()
	require.NoError(t, a.Add(train))
	require.NoError(t, b.Add(train))
	require.EqualError(t, a.Merge(b), "scale.zscore merge: accumulators hold 4 and 1 columns; merge fits of the same columns")
	// Constant chunks merge to a constant column only if they agree.
	c1 := scale.ZScore{}.Accumulator()
	require.NoError(t, c1.Add(tabprep.MustFrame(tabprep.NewNumeric("x", []float64{2, 2}))))
	require.NoError(t, c1.Add(tabprep.MustFrame(tabprep.NewNumeric("x", []float64{3, 3}))))
	pc, err := c1.Finish()
	require.NoError(t, err)
	require.InEpsilon(t, math.Sqrt(1.0/3), pc.Std[0], 1e-15)
}

func TestZScoreRowKernel(t *testing.T) {
	frame := clinicFrame(t, 100, 5, false)
	step := scale.ZScore{}
	p, err := step.Fit(frame)
	require.NoError(t, err)
	batch, err := step.Transform(p, frame)
	require.NoError(t, err)
	// Bit for bit the batch transform on every row, with no allocation.
	requireRowKernelMatches(t, step, p, frame, batch)
	_, err = step.RowKernel(p, tabprep.NewRowLayout(tabprep.Schema{}))
	require.EqualError(t, err, `scale.zscore row: column "days_ahead": fitted on this column, which the row layout lacks`)
}

func TestZScoreSaveLoad(t *testing.T) {
	frame := clinicFrame(t, 300, 6, true)
	out := roundTrip(t, pipeline.Use(scale.ZScore{Columns: tabprep.Names("distance_km", "pet_age")}), frame.Train(), frame)
	requireMissingKept(t, frame, out, "distance_km", "pet_age")
	// The pipeline refuses holdout rows too.
	_, err := pipeline.New(pipeline.Use(scale.ZScore{})).Fit(frame)
	require.ErrorIs(t, err, tabprep.ErrHoldout)
}
