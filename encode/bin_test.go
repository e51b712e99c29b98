package encode_test

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
)

// type7 is Hyndman & Fan (1996), The American Statistician 50(4), 361–365,
// definition 7, written out here from the paper's formula: with h =
// (n−1)p + 1, Q(p) = x₍⌊h⌋₎ + (h − ⌊h⌋)(x₍⌊h⌋₊₁₎ − x₍⌊h⌋₎) on sorted x.
func type7(sorted []float64, p float64) float64 {
	h := float64(len(sorted)-1)*p + 1
	lo := math.Floor(h)
	if int(lo) >= len(sorted) {
		return sorted[len(sorted)-1]
	}
	return sorted[int(lo)-1] + (h-lo)*(sorted[int(lo)]-sorted[int(lo)-1])
}

// TestBinQuantileEdges checks equal-frequency cuts against the quantile
// definition they cite: Hyndman & Fan (1996) type 7. Check value from
// testdata/SOURCE.md: for {1, 2, 3, 4} the type-7 75th percentile is 3.25.
func TestBinQuantileEdges(t *testing.T) {
	small := tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{4, 1, math.NaN(), 3, 2}))
	p, err := encode.Bin{Bins: 4}.Fit(small)
	require.NoError(t, err)
	require.Equal(t, []float64{1.75, 2.5, 3.25}, []float64(p.Columns[0].Cuts))

	r := rand.New(rand.NewPCG(1996, 4))
	for trial := 0; trial < 20; trial++ {
		x := make([]float64, 5+r.IntN(200))
		for i := range x {
			x[i] = math.Round(r.NormFloat64()*1000) / 100
		}
		bins := 2 + r.IntN(8)
		p, err := encode.Bin{Bins: bins}.Fit(tabprep.MustFrame(tabprep.NewNumeric("distance_km", x)))
		require.NoError(t, err)
		sorted := slices.Sorted(slices.Values(x))
		var want []float64
		for j := 1; j < bins; j++ {
			v := type7(sorted, float64(j)/float64(bins))
			if v > sorted[0] && (len(want) == 0 || v > want[len(want)-1]) {
				want = append(want, v)
			}
		}
		require.InDeltaSlice(t, want, []float64(p.Columns[0].Cuts), 1e-12, "trial %d", trial)
	}
}

func TestBin(t *testing.T) {
	// Train days_ahead: 3 10 1 7 NaN 14 2 5, range [1, 14].
	// New: 4, NaN, 30 (above the range), -1 (below).
	tests := []struct {
		name   string
		step   encode.Bin
		cuts   []float64
		codes  []float64
		levels []string
	}{
		{"width", encode.Bin{Columns: tabprep.Names("days_ahead"), Method: encode.BinWidth, Bins: 2}, []float64{7.5},
			[]float64{0, math.NaN(), 1, 0}, []string{"(-inf,7.5)", "", "[7.5,+inf)", "(-inf,7.5)"}},
		{"edges", encode.Bin{Columns: tabprep.Names("days_ahead"), Method: encode.BinEdges, Edges: map[string][]float64{"days_ahead": {2, 7}}}, []float64{2, 7},
			[]float64{1, math.NaN(), 2, 0}, []string{"[2,7)", "", "[7,+inf)", "(-inf,2)"}},
		{"quantile", encode.Bin{Columns: tabprep.Names("days_ahead"), Bins: 2}, []float64{5},
			[]float64{0, math.NaN(), 1, 0}, []string{"(-inf,5)", "", "[5,+inf)", "(-inf,5)"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := tt.step.Fit(clinicTrain())
			require.NoError(t, err)
			require.Equal(t, tt.cuts, []float64(p.Columns[0].Cuts))
			out := roundTrip(t, pipeline.Use(tt.step), clinicTrain(), clinicNew(t))
			c, err := out.ColumnOf("days_ahead", tabprep.Categorical)
			require.NoError(t, err)
			for i, want := range tt.levels {
				require.Equal(t, want, c.Level(i), "row %d", i)
			}
			require.Equal(t, p.Columns[0].Levels(), c.Levels(), "every bin is a level, in bin order")

			codes := tt.step
			codes.Codes = true
			out = roundTrip(t, pipeline.Use(codes), clinicTrain(), clinicNew(t))
			got := column(t, out, "days_ahead")
			for i, want := range tt.codes {
				require.Equal(t, math.Float64bits(want), math.Float64bits(got[i]), "row %d", i)
			}
		})
	}
}

func TestBinErrors(t *testing.T) {
	tests := []struct {
		name string
		step encode.Bin
		want error
		msg  string
	}{
		{"categorical", encode.Bin{Columns: tabprep.Names("clinic")}, tabprep.ErrKind, `column "clinic"`},
		{"edges missing", encode.Bin{Columns: tabprep.Names("days_ahead"), Method: encode.BinEdges}, tabprep.ErrOption, `column "days_ahead": method "edges" but no edges`},
		{"edges unsorted", encode.Bin{Columns: tabprep.Names("days_ahead"), Method: encode.BinEdges, Edges: map[string][]float64{"days_ahead": {3, 3}}}, tabprep.ErrOption, "edge 3 at position 1"},
		{"edges unselected", encode.Bin{Columns: tabprep.Names("days_ahead"), Method: encode.BinEdges, Edges: map[string][]float64{"no_show": {1}}}, tabprep.ErrOption, `column "no_show": has edges but is not selected`},
		{"bins", encode.Bin{Bins: -2}, tabprep.ErrOption, "Bins -2"},
		{"method", encode.Bin{Method: "kmeans"}, tabprep.ErrOption, `Method "kmeans"`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := tt.step.Fit(clinicTrain())
			require.ErrorIs(t, err, tt.want)
			require.ErrorContains(t, err, tt.msg)
		})
	}
	_, err := encode.Bin{}.Fit(tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{math.NaN()})))
	require.ErrorIs(t, err, tabprep.ErrAllMissing)
	p, err := encode.Bin{}.Fit(tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{2, 2, 2})))
	require.NoError(t, err)
	require.Empty(t, p.Columns[0].Cuts, "a constant column has one bin")
}

func TestBinRowKernel(t *testing.T) {
	cols := tabprep.Names("days_ahead")
	for _, s := range []encode.Bin{
		{Columns: cols},
		{Columns: cols, Codes: true},
		{Columns: cols, Method: encode.BinWidth, Bins: 3},
		{Columns: cols, Method: encode.BinEdges, Edges: map[string][]float64{"days_ahead": {0, 4, 30}}},
	} {
		requireKernel(t, s)
	}
	// The interval levels and their codes feed the next step's kernel.
	steptest.RowsMatch(t, clinicTrain(), clinicNew(t), pipeline.Use(encode.Bin{Columns: cols, Bins: 3}),
		pipeline.Use(encode.OneHot{Columns: cols, Missing: encode.MissingColumn}))
	_, err := kernelOf(encode.Bin{}, encode.BinParams{Columns: []encode.BinColumn{{Name: "clinic"}}}, clinicTrain().Schema())
	require.ErrorIs(t, err, tabprep.ErrKind)
}
