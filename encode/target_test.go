package encode_test

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
	"gonum.org/v1/gonum/stat"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
)

// TestTargetMicciBarreca checks the smoothing against the published
// formula: Micci-Barreca (2001), ACM SIGKDD Explorations 3(1), eq. (4)–(5),
// S = λ(n)·ȳᵢ + (1−λ(n))·ȳ, λ(n) = 1/(1+exp(−(n−k)/f)). Check value from
// testdata/SOURCE.md (arithmetic from the formula): k = 1, f = 1, nᵢ = 2,
// ȳᵢ = 0.5, ȳ = 0.4 gives λ = 0.7311 and Sᵢ = 0.4731, to 4 decimals.
func TestTargetMicciBarreca(t *testing.T) {
	require.InDelta(t, 0.7311, encode.Weight(2, 1, 1), 5e-5)
	// Level "a" has 2 rows with mean 0.5; all 5 rows have mean 0.4.
	train := tabprep.MustFrame(
		tabprep.NewCategorical("clinic", []string{"a", "a", "b", "b", "b"}),
		tabprep.NewNumeric("no_show", []float64{1, 0, 1, 0, 0}),
	)
	s := encode.Target{Columns: tabprep.Names("clinic"), Target: "no_show", K: 1, F: 1}
	p, err := s.Fit(train)
	require.NoError(t, err)
	require.InDelta(t, 0.4731, p.Columns[0].Values[0], 5e-5)
	require.Equal(t, []float64{0.4}, []float64(p.Prior))
	// b: n = 3, ȳᵢ = 1/3, λ = 1/(1+e⁻²): the formula evaluated here.
	lb := 1 / (1 + math.Exp(-2))
	require.InDelta(t, lb/3+(1-lb)*0.4, p.Columns[0].Values[1], 1e-15)

	out, err := s.Transform(p, tabprep.MustFrame(tabprep.NewCategorical("clinic", []string{"a", "zzz", ""})))
	require.NoError(t, err)
	got := column(t, out, "clinic")
	require.InDelta(t, 0.4731, got[0], 5e-5)
	require.Equal(t, 0.4, got[1], "unseen level gets the global mean")
	require.Equal(t, 0.4, got[2], "missing, absent in train, gets the global mean")
}

func TestTargetCategoricalTarget(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewCategorical("species", []string{"dog", "dog", "cat", "cat", "cat", ""}),
		tabprep.NewCategorical("outcome", []string{"came", "late", "came", "no_show", "no_show", "came"}),
	)
	s := encode.Target{Target: "outcome", K: 2, F: 0.5, Folds: 2, Seed: 7}
	p, err := s.Fit(train)
	require.NoError(t, err)
	require.Equal(t, []string{"species@came", "species@late", "species@no_show"}, p.Outputs())
	// Per level the class shares sum to 1, and so do the smoothed ones.
	for l := range p.Columns[0].Levels {
		v := p.Columns[0].Values[3*l : 3*l+3]
		require.InDelta(t, 1, v[0]+v[1]+v[2], 1e-12)
	}
	// cat: n = 3, shares (1/3, 0, 2/3); prior (1/2, 1/6, 1/3).
	lc := encode.Weight(3, 2, 0.5)
	require.InDelta(t, lc*2/3+(1-lc)/3, p.Columns[0].Values[2], 1e-15)

	data := tabprep.MustFrame(
		tabprep.NewCategorical("species", []string{"cat", "ferret", ""}),
		tabprep.NewCategorical("outcome", []string{"came", "came", "came"}),
	)
	out := roundTrip(t, pipeline.Use(s), train, data)
	// The pipeline keeps the target out of its output (tabprep.Supervised).
	require.Equal(t, []string{"species@came", "species@late", "species@no_show"}, out.Names())
	require.Equal(t, 1.0/6, column(t, out, "species@late")[1], "unseen gets the prior")
}

func TestTargetErrors(t *testing.T) {
	gap := tabprep.MustFrame(
		tabprep.NewCategorical("clinic", []string{"a", "b", "a"}),
		tabprep.NewNumeric("no_show", []float64{1, math.NaN(), 0}),
		tabprep.NewCategorical("outcome", []string{"came", "", "late"}),
		tabprep.NewNumeric("days_ahead", []float64{1, 2, 3}),
	)
	tests := []struct {
		name string
		step encode.Target
		want error
		msg  string
	}{
		{"numeric target with a gap", encode.Target{Columns: tabprep.Names("clinic"), Target: "no_show"}, tabprep.ErrValue, `column "no_show": row 1: target value NaN`},
		{"categorical target with a gap", encode.Target{Columns: tabprep.Names("clinic"), Target: "outcome"}, tabprep.ErrValue, `column "outcome": row 1: missing target`},
		{"no target", encode.Target{Target: "attended"}, tabprep.ErrNoColumn, `column "attended"`},
		{"numeric column", encode.Target{Columns: tabprep.Names("days_ahead"), Target: "clinic"}, tabprep.ErrKind, `column "days_ahead"`},
		{"one fold", encode.Target{Target: "days_ahead", Folds: 1}, tabprep.ErrOption, "Folds 1"},
		{"negative f", encode.Target{Target: "days_ahead", F: -1}, tabprep.ErrOption, "F -1"},
		{"more folds than rows", encode.Target{Columns: tabprep.Names("clinic"), Target: "days_ahead", Folds: 4}, tabprep.ErrOption, "3 train rows for 4 folds"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, _, err := tt.step.FitOutOfFold(gap)
			require.ErrorIs(t, err, tt.want)
			require.ErrorContains(t, err, tt.msg)
		})
	}
	_, err := encode.Target{Columns: tabprep.Names("clinic", "species"), Target: "species"}.Fit(clinicTrain())
	require.ErrorIs(t, err, tabprep.ErrOption)
	require.ErrorContains(t, err, `column "species": is the target and also selected`)
}

// noiseFrame has a high-cardinality column (500 levels, about 4 rows each)
// and a 0/1 target drawn independently of it: pure noise.
func noiseFrame(r *rand.Rand, n int) *tabprep.Frame {
	levels := make([]string, n)
	y := make([]float64, n)
	for i := range levels {
		levels[i] = fmt.Sprintf("owner_%03d", r.IntN(n/4))
		if r.Float64() < 0.3 {
			y[i] = 1
		}
	}
	return tabprep.MustFrame(tabprep.NewCategorical("owner", levels), tabprep.NewNumeric("no_show", y))
}

// TestTargetLeakGuard: on a target that is pure noise, the out-of-fold values
// the pipeline gives the training rows must not predict the target, while
// the naive in-fold values would. Statistic: Pearson correlation r between
// encoded value and target over n = 2000 rows. Under independence r has
// standard deviation about 1/√n ≈ 0.022; the margin |r| < 0.1 is 4.5 of
// them (common practice, no source). The naive encoding, whose value for a
// level of about 4 rows includes the row's own target with weight about
// 1/4, must show r > 0.3.
func TestTargetLeakGuard(t *testing.T) {
	r := rand.New(rand.NewPCG(2001, 27))
	train := noiseFrame(r, 2000)
	y := column(t, train, "no_show")
	s := encode.Target{Columns: tabprep.Names("owner"), Target: "no_show", K: 1, F: 1, Folds: 5, Seed: 3}

	fitted, err := pipeline.New(pipeline.Use(s)).Fit(train)
	require.NoError(t, err)
	p, oof, err := s.FitOutOfFold(train)
	require.NoError(t, err)
	naive, err := s.Transform(p, train)
	require.NoError(t, err)

	rOOF := stat.Correlation(column(t, oof, "owner"), y, nil)
	rNaive := stat.Correlation(column(t, naive, "owner"), y, nil)
	t.Logf("correlation with a noise target: out of fold %.4f, naive in fold %.4f", rOOF, rNaive)
	require.Less(t, math.Abs(rOOF), 0.1)
	require.Greater(t, rNaive, 0.3)

	// The pipeline's own fit hands the out-of-fold values on, and keeps the
	// full-train parameters for new data. The target is kept out of the
	// pipeline's output (tabprep.Supervised).
	require.Equal(t, p, fitted.Step(0).Params())
	fresh, err := fitted.Transform(train)
	require.NoError(t, err)
	naiveFeatures, err := naive.Without("no_show")
	require.NoError(t, err)
	require.True(t, tabprep.Equal(naiveFeatures, fresh))
}

// TestTargetOwnRowNeverCounts is the leak guard as an invariant: a training
// row's out-of-fold value does not change when its own target changes.
func TestTargetOwnRowNeverCounts(t *testing.T) {
	r := rand.New(rand.NewPCG(11, 12))
	train := noiseFrame(r, 200)
	s := encode.Target{Target: "no_show", K: 2, F: 1, Folds: 4, Seed: 9}
	_, base, err := s.FitOutOfFold(train)
	require.NoError(t, err)
	y := column(t, train, "no_show")
	for trial := 0; trial < 20; trial++ {
		i := r.IntN(len(y))
		flipped := append([]float64(nil), y...)
		flipped[i] = 1 - flipped[i]
		g, err := train.With(tabprep.NewNumeric("no_show", flipped))
		require.NoError(t, err)
		_, out, err := s.FitOutOfFold(g)
		require.NoError(t, err)
		require.Equal(t, math.Float64bits(column(t, base, "owner")[i]), math.Float64bits(column(t, out, "owner")[i]), "row %d", i)
	}
}

func TestTargetSaveLoad(t *testing.T) {
	s := encode.Target{Target: "no_show", K: 1, F: 2, Folds: 2, Seed: 1}
	out := roundTrip(t, pipeline.Use(s), clinicTrain(), clinicNew(t))
	// The pipeline keeps the target out of its output, and new rows need
	// not carry it (tabprep.Supervised).
	require.Equal(t, []string{"clinic", "species", "days_ahead"}, out.Names())
}

func TestTargetRowKernel(t *testing.T) {
	// A numeric target replaces the source in place; a categorical one
	// (species here) appends one column per class. Both leave the target
	// out of the row, as the pipeline does.
	for _, s := range []encode.Target{
		{Target: "no_show", K: 1, F: 0.5, Folds: 2, Seed: 3},
		{Columns: tabprep.Names("clinic"), Target: "species", K: 2, Folds: 2, Seed: 5},
	} {
		_, plan := steptest.RowsMatch(t, clinicTrain(), clinicNew(t), pipeline.Use(s))
		require.NotContains(t, plan.Input().Names(), s.Target)
	}
	s := encode.Target{Columns: tabprep.Names("clinic"), Target: "no_show"}
	p, err := s.Fit(clinicTrain())
	require.NoError(t, err)
	p.Columns[0].Values = p.Columns[0].Values[:1]
	_, err = kernelOf(s, p, clinicTrain().Schema())
	require.ErrorIs(t, err, tabprep.ErrSchema)
}
