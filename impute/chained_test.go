package impute_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/impute"
)

// Exact linear relations by definition of the units: t/°F = 1.8·t/°C + 32
// (NIST SP 811, Guide for the Use of the SI, Appendix B, conversion of
// temperature; from memory), and 1 lb = 0.45359237 kg exactly (the
// international pound, 1959 agreement; from memory).
const kgPerLb = 0.45359237

// unitFrame returns n pets with both temperature scales and both weight
// units, and gaps that never hit both columns of a pair in one row.
func unitFrame(rng *rand.Rand, n int, gap float64) *tabprep.Frame {
	tc, tf := make([]float64, n), make([]float64, n)
	kg, lb := make([]float64, n), make([]float64, n)
	age := make([]float64, n)
	for i := range n {
		tc[i] = 37.5 + 2*rng.Float64()
		tf[i] = 1.8*tc[i] + 32
		kg[i] = 1 + 40*rng.Float64()
		lb[i] = kg[i] / kgPerLb
		age[i] = 15 * rng.Float64()
		switch u := rng.Float64(); {
		case u < gap/2:
			tc[i] = nan
		case u < gap:
			tf[i] = nan
		}
		switch u := rng.Float64(); {
		case u < gap/2:
			kg[i] = nan
		case u < gap:
			lb[i] = nan
		}
		if rng.Float64() < gap/2 {
			age[i] = nan
		}
	}
	return tabprep.MustFrame(
		tabprep.NewNumeric("temp_c", tc), tabprep.NewNumeric("temp_f", tf),
		tabprep.NewNumeric("weight_kg", kg), tabprep.NewNumeric("weight_lb", lb),
		tabprep.NewNumeric("pet_age", age),
	)
}

func TestChainedExactRelation(t *testing.T) {
	rng := rand.New(rand.NewPCG(71, 72))
	train := unitFrame(rng, 400, 0.3)
	fresh := unitFrame(rng, 200, 0.5)
	s := impute.Chained{Ridge: 1e-12, Rounds: 30, Seed: 3}
	p, err := s.Fit(train)
	require.NoError(t, err)
	eq := p.Equations[1] // temp_f from the others
	require.Equal(t, "temp_f", eq.Target)
	require.InDelta(t, 1.8, eq.Coef[0], 1e-8)
	require.InDelta(t, 32, float64(eq.Intercept), 1e-6)

	out, err := s.Transform(p, fresh)
	require.NoError(t, err)
	requireNoGaps(t, out, out.Names()...)
	tc, tf := column(t, out, "temp_c").Float64s(), column(t, out, "temp_f").Float64s()
	kg, lb := column(t, out, "weight_kg").Float64s(), column(t, out, "weight_lb").Float64s()
	for i := range tc {
		require.InDelta(t, 1.8*tc[i]+32, tf[i], 1e-7, "row %d", i)
		require.InDelta(t, kg[i]/kgPerLb, lb[i], 1e-7, "row %d", i)
	}
	// Present cells are never changed.
	for j := range fresh.NumCols() {
		for i, v := range fresh.Col(j).Float64s() {
			if !math.IsNaN(v) {
				require.Equal(t, v, out.Col(j).Float64s()[i])
			}
		}
	}
}

func TestChainedSeedAndTolerance(t *testing.T) {
	rng := rand.New(rand.NewPCG(73, 74))
	train := vetFrame(rng, 300, 0.3)
	a, err := impute.Chained{Seed: 9}.Fit(train)
	require.NoError(t, err)
	b, err := impute.Chained{Seed: 9}.Fit(train)
	require.NoError(t, err)
	require.Equal(t, a, b)
	require.Equal(t, 10, a.Rounds)

	early, err := impute.Chained{Seed: 9, Rounds: 100, Tolerance: 1e-9}.Fit(train)
	require.NoError(t, err)
	require.Less(t, early.Rounds, 100)
	require.Greater(t, early.Rounds, 1)
}

func TestChainedContract(t *testing.T) {
	rng := rand.New(rand.NewPCG(75, 76))
	for range 4 {
		out := checkContract(t, impute.Chained{Rounds: 3, Seed: 1}, unitFrame(rng, 80, 0.3), withHoldout(t, unitFrame(rng, 40, 0.4)), false)
		requireNoGaps(t, out, out.Names()...)
	}
	// A column without gaps in the data is shared.
	train := vetFrame(rng, 50, 0.2)
	s := impute.Chained{Columns: tabprep.Names("pet_age", "days_ahead")}
	p, err := s.Fit(train)
	require.NoError(t, err)
	data := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{nan, 2}),
		tabprep.NewNumeric("days_ahead", []float64{3, 4}),
	)
	out, err := s.Transform(p, data)
	require.NoError(t, err)
	require.Same(t, column(t, data, "days_ahead"), column(t, out, "days_ahead"))
}

func TestChainedErrors(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, nan, 3}),
		tabprep.NewNumeric("distance_km", []float64{nan, nan, nan}),
	)
	_, err := impute.Chained{}.Fit(train)
	require.ErrorIs(t, err, tabprep.ErrAllMissing)
	require.EqualError(t, err, `impute.chained fit: column "distance_km": no value in the 3 train rows to model; drop the column (impute.DropSparse) or leave it out of Columns`)
	_, err = impute.Chained{Ridge: -1}.Fit(train)
	require.EqualError(t, err, `impute.chained fit: Rounds 0, Ridge -1, Tolerance 0: want Rounds in [0, 1000], Ridge > 0 finite, Tolerance ≥ 0`)
}

func TestChainedRowKernel(t *testing.T) {
	rng := rand.New(rand.NewPCG(77, 78))
	s := impute.Chained{Rounds: 4, Seed: 5}
	p, err := s.Fit(unitFrame(rng, 200, 0.3))
	require.NoError(t, err)
	checkRowKernel(t, s.RowKernel, p, unitFrame(rng, 60, 0.5), s.Transform)
	vp, err := s.Fit(vetFrame(rng, 100, 0.3))
	require.NoError(t, err)
	checkRowKernel(t, s.RowKernel, vp, vetFrame(rng, 40, 0.4), s.Transform)
}
