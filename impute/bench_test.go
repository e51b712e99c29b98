package impute_test

import (
	"math"
	"math/rand/v2"
	"slices"
	"sync"
	"testing"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/impute"
)

// The 10M-row column is built only when a benchmark that needs it runs.
var bigColumn = sync.OnceValue(func() []float64 {
	rng := rand.New(rand.NewPCG(81, 82))
	x := make([]float64, 10_000_000)
	for i := range x {
		x[i] = rng.NormFloat64()*20 + 100
	}
	return x
})

// BenchmarkMedianFit10M is the median fit (copy of the present values and
// selection) on 10M rows; compare with BenchmarkSortFloat64s10M.
func BenchmarkMedianFit10M(b *testing.B) {
	x := bigColumn()
	train := tabprep.MustFrame(tabprep.AdoptNumeric("days_ahead", x))
	b.SetBytes(int64(8 * len(x)))
	b.ReportAllocs()
	for b.Loop() {
		if _, err := (impute.Median{}).Fit(train); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSortFloat64s10M is the baseline: sorting a copy of the same
// column.
func BenchmarkSortFloat64s10M(b *testing.B) {
	x := bigColumn()
	b.SetBytes(int64(8 * len(x)))
	b.ReportAllocs()
	for b.Loop() {
		y := slices.Clone(x)
		slices.Sort(y)
		if math.IsNaN(y[len(y)/2]) {
			b.Fatal("NaN median")
		}
	}
}

var knnData = sync.OnceValues(func() (*tabprep.Frame, *tabprep.Frame) {
	rng := rand.New(rand.NewPCG(83, 84))
	return vetFrame(rng, 100_000, 0.1), vetFrame(rng, 100, 0.3)
})

// BenchmarkKNearest100k fills 100 query rows (about 30% of cells missing)
// from 100,000 train rows; compare per query row with BenchmarkScan100k.
func BenchmarkKNearest100k(b *testing.B) {
	train, query := knnData()
	s := impute.KNearest{K: 5}
	p, err := s.Fit(train)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := s.Transform(p, query); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkScan100k is the baseline: a hand-written loop that computes the
// plain squared distance of each of the same 100 query rows to every train
// row over the same columns, with no gap handling and no neighbour search.
func BenchmarkScan100k(b *testing.B) {
	train, query := knnData()
	p, err := impute.KNearest{K: 5}.Fit(train)
	if err != nil {
		b.Fatal(err)
	}
	d := len(p.Columns)
	ref := p.Reference
	q := make([]float64, d)
	b.ReportAllocs()
	var sink float64
	for b.Loop() {
		for i := range query.NumRows() {
			for j, name := range p.Columns {
				c, _ := query.Column(name)
				q[j] = c.Value(i)
			}
			best := math.Inf(1)
			for r := range p.Rows {
				var s float64
				for j, v := range ref[r*d : r*d+d] {
					z := q[j] - v
					s += z * z
				}
				best = min(best, s)
			}
			sink += best
		}
	}
	_ = sink
}
