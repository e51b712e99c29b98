package scale_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/steptest"
)

var nan = math.NaN()

// clinicFrame returns n invented appointment rows of the veterinary clinic
// scenario: positive skewed columns, one of any sign, a categorical one,
// missing cells, and the last quarter of rows tagged holdout when holdout
// is set.
func clinicFrame(t testing.TB, n int, seed uint64, holdout bool) *tabprep.Frame {
	t.Helper()
	rng := rand.New(rand.NewPCG(seed, 2))
	days := make([]float64, n)
	dist := make([]float64, n)
	age := make([]float64, n)
	change := make([]float64, n)
	species := make([]string, n)
	kinds := []string{"dog", "cat", "rabbit"}
	for i := range n {
		days[i] = float64(1 + rng.IntN(60))
		dist[i] = 0.5 + rng.ExpFloat64()*8
		age[i] = 0.2 + 14*rng.Float64()
		change[i] = rng.NormFloat64() * 3
		species[i] = kinds[rng.IntN(3)]
		if rng.IntN(12) == 0 {
			dist[i] = nan
		}
		if rng.IntN(15) == 0 {
			age[i] = nan
		}
	}
	f := tabprep.MustFrame(
		tabprep.NewNumeric("days_ahead", days),
		tabprep.NewNumeric("distance_km", dist),
		tabprep.NewNumeric("pet_age", age),
		tabprep.NewNumeric("weight_change", change),
		tabprep.NewCategorical("species", species),
	)
	if holdout {
		rows := make([]int, 0, n/4)
		for i := n - n/4; i < n; i++ {
			rows = append(rows, i)
		}
		f, err := f.Tag(tabprep.Holdout("test"), rows)
		require.NoError(t, err)
		return f
	}
	return f
}

// snapshot returns deep copies of the numeric columns of f, to prove later
// that a transform left them alone.
func snapshot(f *tabprep.Frame) *tabprep.Frame {
	cols := f.Columns()
	for i, c := range cols {
		if c.Kind() == tabprep.Numeric {
			cols[i] = tabprep.NewNumeric(c.Name(), c.Float64s())
		}
	}
	g := tabprep.MustFrame(cols...)
	g, _ = g.WithRoles(f.Roles())
	return g
}

// roundTrip is steptest.RoundTrip: fit, save, load, and the same output
// bit for bit.
var roundTrip = steptest.RoundTrip

// requireMissingKept requires every missing cell of in to be missing in out
// and every other cell of the named columns to be present.
func requireMissingKept(t *testing.T, in, out *tabprep.Frame, names ...string) {
	t.Helper()
	for _, n := range names {
		a, err := in.Column(n)
		require.NoError(t, err)
		b, err := out.Column(n)
		require.NoError(t, err)
		for i := range a.Len() {
			require.Equal(t, a.IsMissing(i), b.IsMissing(i), "column %s row %d", n, i)
		}
	}
}
