package impute_test

import (
	"bytes"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/pipeline"
)

var nan = math.NaN()

// vetFrame returns n rows of invented clinic appointments with a share gap
// of cells missing in every column but clinic.
func vetFrame(rng *rand.Rand, n int, gap float64) *tabprep.Frame {
	age := make([]float64, n)
	dist := make([]float64, n)
	ahead := make([]float64, n)
	species := make([]string, n)
	clinic := make([]string, n)
	kinds := []string{"dog", "cat", "rabbit", "bird"}
	for i := range n {
		age[i] = math.Round(rng.ExpFloat64()*50) / 10
		dist[i] = math.Round(rng.ExpFloat64()*80) / 10
		ahead[i] = float64(rng.IntN(30))
		species[i] = kinds[rng.IntN(len(kinds))]
		clinic[i] = []string{"north", "south", "harbour"}[rng.IntN(3)]
		if rng.Float64() < gap {
			age[i] = nan
		}
		if rng.Float64() < gap {
			dist[i] = nan
		}
		if rng.Float64() < gap {
			ahead[i] = nan
		}
		if rng.Float64() < gap {
			species[i] = ""
		}
	}
	return tabprep.MustFrame(
		tabprep.NewCategorical("clinic", clinic),
		tabprep.NewNumeric("pet_age", age),
		tabprep.NewNumeric("distance_km", dist),
		tabprep.NewNumeric("days_ahead", ahead),
		tabprep.NewCategorical("species", species),
	)
}

// withHoldout tags every third row of f as holdout "test".
func withHoldout(t *testing.T, f *tabprep.Frame) *tabprep.Frame {
	var rows []int
	for i := 0; i < f.NumRows(); i += 3 {
		rows = append(rows, i)
	}
	g, err := f.Tag(tabprep.Holdout("test"), rows)
	require.NoError(t, err)
	return g
}

// deepCopy returns a frame equal to f that shares no column storage.
func deepCopy(t *testing.T, f *tabprep.Frame) *tabprep.Frame {
	g, err := tabprep.Concat(f)
	require.NoError(t, err)
	return g
}

// checkContract checks the step contract for s: Fit refuses holdout rows;
// Transform leaves its input unchanged, keeps rows, order and roles (unless
// dropsRows), is repeatable; and a pipeline of s saved and loaded gives the
// bit-identical output and the byte-identical document. It returns the
// transform of fresh.
func checkContract[S tabprep.Step[P], P any](t *testing.T, s S, train, fresh *tabprep.Frame, dropsRows bool) *tabprep.Frame {
	t.Helper()
	_, err := s.Fit(withHoldout(t, train))
	require.ErrorIs(t, err, tabprep.ErrHoldout)

	p, err := s.Fit(train)
	require.NoError(t, err)
	before := deepCopy(t, fresh)
	out, err := s.Transform(p, fresh)
	require.NoError(t, err)
	require.True(t, tabprep.Equal(before, fresh), "transform modified its input")
	again, err := s.Transform(p, fresh)
	require.NoError(t, err)
	require.True(t, tabprep.Equal(out, again), "transform is not repeatable")
	if !dropsRows {
		require.Equal(t, fresh.NumRows(), out.NumRows())
		require.Equal(t, fresh.Roles(), out.Roles())
	}

	fitted, err := pipeline.New(pipeline.Use(s)).Fit(train)
	require.NoError(t, err)
	var buf bytes.Buffer
	require.NoError(t, fitted.Save(&buf))
	saved := buf.Bytes()
	loaded, err := pipeline.Load(bytes.NewReader(saved))
	require.NoError(t, err)
	var buf2 bytes.Buffer
	require.NoError(t, loaded.Save(&buf2))
	require.Equal(t, string(saved), buf2.String(), "document changed on Save -> Load -> Save")
	viaPipe, err := fitted.Transform(fresh)
	require.NoError(t, err)
	viaLoad, err := loaded.Transform(fresh)
	require.NoError(t, err)
	require.True(t, bitEqual(viaPipe, viaLoad), "loaded pipeline differs from the fitted one")
	require.True(t, bitEqual(out, viaLoad), "loaded pipeline differs from the step")
	return out
}

// bitEqual is tabprep.Equal with NaNs compared by bits too.
func bitEqual(a, b *tabprep.Frame) bool {
	if !tabprep.Equal(a, b) {
		return false
	}
	for i := range a.NumCols() {
		x, y := a.Col(i).Float64s(), b.Col(i).Float64s()
		for j := range x {
			if math.Float64bits(x[j]) != math.Float64bits(y[j]) {
				return false
			}
		}
	}
	return true
}

// column returns the named column of f.
func column(t *testing.T, f *tabprep.Frame, name string) *tabprep.Column {
	t.Helper()
	c, err := f.Column(name)
	require.NoError(t, err)
	return c
}

// requireNoGaps checks that none of the named columns of f has a gap.
func requireNoGaps(t *testing.T, f *tabprep.Frame, names ...string) {
	t.Helper()
	for _, n := range names {
		require.Zero(t, column(t, f, n).MissingCount(), "gaps left in %s", n)
	}
}

// gappy returns n values drawn by gen with a share gap of them (never the
// first) replaced by NaN, and the present values in order.
func gappy(rng *rand.Rand, n int, gap float64, gen func() float64) (x, present []float64) {
	x = make([]float64, n)
	for i := range x {
		x[i] = gen()
		if i > 0 && rng.Float64() < gap {
			x[i] = nan
			continue
		}
		present = append(present, x[i])
	}
	return x, present
}
