package moment

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
	"gonum.org/v1/gonum/stat"
)

func TestOfAgainstGonum(t *testing.T) {
	// gonum stat.MeanVariance (a general-purpose reference library) on
	// random data with NaNs removed.
	rng := rand.New(rand.NewPCG(5, 6))
	for trial := 0; trial < 100; trial++ {
		n := 2 + rng.IntN(1000)
		x := make([]float64, n)
		var clean []float64
		for i := range x {
			x[i] = 1e6 + rng.NormFloat64()
			if rng.IntN(10) == 0 {
				x[i] = math.NaN()
			} else {
				clean = append(clean, x[i])
			}
		}
		if len(clean) < 2 {
			continue
		}
		s := Of(x)
		m, v := stat.MeanVariance(clean, nil)
		require.Equal(t, len(clean), s.N)
		require.InEpsilon(t, m, s.Mean, 1e-14)
		require.InEpsilon(t, v, s.Var(true), 1e-9)
	}
}

func TestAddAndMergeAgreeWithOf(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	x := make([]float64, 10_000)
	for i := range x {
		x[i] = 50 + 3*rng.NormFloat64()
	}
	all := Of(x)
	var a, b Summary
	for _, v := range x[:3000] {
		a = a.Add(v)
	}
	b = Of(x[3000:])
	m := Merge(a, b)
	require.Equal(t, all.N, m.N)
	require.InEpsilon(t, all.Mean, m.Mean, 1e-14)
	require.InEpsilon(t, all.M2, m.M2, 1e-11)
	require.Equal(t, b, Merge(Summary{}, b))
	require.True(t, math.IsNaN(Summary{N: 1}.Var(true)))
	require.Equal(t, 0.0, Summary{N: 1}.Var(false))
}
