package impute_test

import (
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"sync"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/impute"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
)

func TestKNearestByHand(t *testing.T) {
	// Expected values worked by hand: each query row below has one present
	// coordinate, so the scaling does not change which rows are nearest.
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, 2, 3, 10}),
		tabprep.NewNumeric("distance_km", []float64{10, 20, 30, 100}),
	)
	s := impute.KNearest{K: 2}
	p, err := s.Fit(train)
	require.NoError(t, err)
	require.Equal(t, 4, p.Rows)
	require.Len(t, p.Reference, 8)
	data := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{2.9, nan, nan}),
		tabprep.NewNumeric("distance_km", []float64{nan, 12, nan}),
	)
	out, err := s.Transform(p, data)
	require.NoError(t, err)
	// Row 0: nearest by pet_age are rows 2 (3) and 1 (2): (30+20)/2.
	// Row 1: nearest by distance_km are rows 0 (10) and 1 (20): (1+2)/2.
	// Row 2: no present coordinate, so no donor: the train means.
	require.Equal(t, []float64{2.9, 1.5, 4}, column(t, out, "pet_age").Float64s())
	require.Equal(t, []float64{25, 12, 40}, column(t, out, "distance_km").Float64s())

	dw := impute.KNearest{K: 2, Weights: impute.WeightDistance}
	pd, err := dw.Fit(train)
	require.NoError(t, err)
	out, err = dw.Transform(pd, tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{3, nan}),
		tabprep.NewNumeric("distance_km", []float64{nan, 15}),
	))
	require.NoError(t, err)
	// Row 0 is at distance 0 from train row 2: only that donor counts.
	// Row 1 is equally far from rows 0 and 1: weights are equal.
	require.Equal(t, []float64{30, 15}, column(t, out, "distance_km").Float64s())
	require.InDelta(t, 1.5, column(t, out, "pet_age").Float64s()[1], 1e-12)
}

// bruteNearest is the reference: every donor sorted by distance, then row.
func bruteNearest(p impute.KNearestParams, q []float64, j int) float64 {
	d := len(p.Columns)
	type cand struct {
		d2  float64
		row int
	}
	var cands []cand
	for r := range p.Rows {
		row := p.Reference[r*d : (r+1)*d]
		if math.IsNaN(row[j]) {
			continue
		}
		var sum float64
		m := 0
		for c := range d {
			if !math.IsNaN(q[c]) && !math.IsNaN(row[c]) {
				z := (q[c] - row[c]) / p.Scale[c]
				sum += z * z
				m++
			}
		}
		if m > 0 {
			cands = append(cands, cand{sum * float64(d) / float64(m), r})
		}
	}
	sort.Slice(cands, func(a, b int) bool {
		if cands[a].d2 != cands[b].d2 {
			return cands[a].d2 < cands[b].d2
		}
		return cands[a].row < cands[b].row
	})
	if len(cands) == 0 {
		return p.Center[j]
	}
	cands = cands[:min(p.K, len(cands))]
	var sum float64
	for _, c := range cands {
		sum += p.Reference[c.row*d+j]
	}
	return sum / float64(len(cands))
}

func TestKNearestMatchesBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(61, 62))
	for trial := range 10 {
		train := vetFrame(rng, 50+rng.IntN(300), 0.2)
		fresh := vetFrame(rng, 40, 0.35)
		s := impute.KNearest{K: 1 + trial}
		p, err := s.Fit(train)
		require.NoError(t, err)
		out, err := s.Transform(p, fresh)
		require.NoError(t, err)
		q := make([]float64, len(p.Columns))
		for i := range fresh.NumRows() {
			for j, name := range p.Columns {
				q[j] = column(t, fresh, name).Value(i)
			}
			for j, name := range p.Columns {
				if math.IsNaN(q[j]) {
					require.InDelta(t, bruteNearest(p, q, j), column(t, out, name).Value(i), 1e-9, "row %d %s", i, name)
				}
			}
		}
	}
}

func TestKNearestContract(t *testing.T) {
	rng := rand.New(rand.NewPCG(63, 64))
	for range 4 {
		out := checkContract(t, impute.KNearest{K: 3, Weights: impute.WeightDistance}, vetFrame(rng, 60, 0.2), withHoldout(t, vetFrame(rng, 30, 0.3)), false)
		requireNoGaps(t, out, "pet_age", "distance_km", "days_ahead")
	}
}

func TestKNearestErrors(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, nan, 3}),
		tabprep.NewNumeric("distance_km", []float64{nan, nan, nan}),
	)
	cases := []struct {
		name string
		step impute.KNearest
		msg  string
	}{
		{"k above train values", impute.KNearest{K: 3, Columns: tabprep.Names("pet_age")},
			`impute.knearest fit: column "pet_age": 2 present train values (of 3 rows), fewer than K = 3; lower K`},
		{"all missing", impute.KNearest{K: 1},
			`impute.knearest fit: column "distance_km": no value in the 3 train rows, so no row can be a donor; drop the column (impute.DropSparse) or fill it first`},
		{"bad weights", impute.KNearest{Weights: "inverse"},
			`impute.knearest fit: Weights "inverse"; use "uniform" or "distance"`},
		{"negative k", impute.KNearest{K: -1},
			`impute.knearest fit: K = -1; give K in [1, 10000]`},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := tc.step.Fit(train)
			require.EqualError(t, err, tc.msg)
		})
	}
}

func TestKNearestRowKernel(t *testing.T) {
	rng := rand.New(rand.NewPCG(65, 66))
	train := vetFrame(rng, 120, 0.2)
	// Gaps in two of three columns of a row are common at this share, and
	// all three (no donor: the train mean) occur too.
	fresh := vetFrame(rng, 60, 0.5)
	for _, s := range []impute.KNearest{
		{K: 1},
		{K: 3, Weights: impute.WeightDistance},
		{K: 7, Columns: tabprep.Names("pet_age", "distance_km")},
	} {
		p, err := s.Fit(train)
		require.NoError(t, err)
		checkRowKernel(t, s.RowKernel, p, fresh, s.Transform)
		steptest.RowsMatch(t, train, fresh, pipeline.Use(s), pipeline.Use(impute.MostFrequent{}))
	}
	// Many goroutines share one plan, so one kernel and its pool, each
	// with its own output row.
	s := impute.KNearest{K: 4}
	fitted, plan := steptest.RowsMatch(t, train, fresh, pipeline.Use(s))
	p := fitted.Step(0).Params().(impute.KNearestParams)
	batch, err := fitted.Transform(fresh)
	require.NoError(t, err)
	errs := make([]error, 4)
	var wg sync.WaitGroup
	for g := range errs {
		wg.Go(func() {
			dst := make([]tabprep.Cell, plan.OutputWidth())
			for range 3 {
				for i := range fresh.NumRows() {
					if err := plan.Apply(dst, steptest.Row(fresh, i)); err != nil {
						errs[g] = err
						return
					}
					for k := range dst {
						want := batch.Col(k)
						if want.Kind() == tabprep.Numeric && math.Float64bits(want.Value(i)) != math.Float64bits(dst[k].Num) {
							errs[g] = fmt.Errorf("goroutine %d row %d column %s: batch %v, plan %v", g, i, want.Name(), want.Value(i), dst[k].Num)
							return
						}
					}
				}
			}
		})
	}
	wg.Wait()
	for _, err := range errs {
		require.NoError(t, err)
	}

	bad := p
	bad.Reference = bad.Reference[:1]
	_, err = s.RowKernel(bad, tabprep.NewRowLayout(fresh.Schema()))
	require.ErrorIs(t, err, tabprep.ErrValue)
	_, err = s.RowKernel(p, tabprep.NewRowLayout(tabprep.Schema{}))
	require.ErrorIs(t, err, tabprep.ErrSchema)
}
