package scale_test

import (
	"math"
	"math/rand/v2"
	"slices"
	"sync"
	"testing"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/scale"
)

// The 10M-row benchmarks are reported as ratios, measured in the same run:
// BenchmarkZScoreTransform10M / BenchmarkCloneFloat64s10M (target ≤ 1.5)
// and BenchmarkZScoreFit10M / BenchmarkTwoPassMeanVar10M (target ≤ 1.5).
// Run them with: go test -run '^$' -bench 10M -benchtime 3x ./scale/

const benchRows = 10_000_000

var bench10M = sync.OnceValue(func() []float64 {
	rng := rand.New(rand.NewPCG(10, 10))
	x := make([]float64, benchRows)
	for i := range x {
		x[i] = 5 + 40*rng.ExpFloat64()
	}
	return x
})

func benchFrame(b *testing.B) *tabprep.Frame {
	return tabprep.MustFrame(tabprep.AdoptNumeric("distance_km", bench10M()))
}

var sinkF []float64
var sinkV float64

func BenchmarkCloneFloat64s10M(b *testing.B) {
	x := bench10M()
	for range 3 { // untimed runs, so the heap has grown before timing
		sinkF = slices.Clone(x)
	}
	b.SetBytes(int64(8 * len(x)))
	b.ReportAllocs()
	for b.Loop() {
		sinkF = slices.Clone(x)
	}
}

func BenchmarkZScoreTransform10M(b *testing.B) {
	f := benchFrame(b)
	step := scale.ZScore{}
	p, err := step.Fit(f)
	if err != nil {
		b.Fatal(err)
	}
	// Real data, checked before timing; untimed runs, so the heap has grown
	// before timing, as for the clone.
	out, err := step.Transform(p, f)
	if err != nil || out.NumRows() != benchRows || math.Abs(out.Col(0).Value(0)-(f.Col(0).Value(0)-p.Mean[0])/p.Std[0]) > 1e-15 {
		b.Fatal(err)
	}
	for range 2 {
		out, _ = step.Transform(p, f)
	}
	b.SetBytes(int64(8 * benchRows))
	b.ReportAllocs()
	for b.Loop() {
		out, _ = step.Transform(p, f)
	}
	sinkF = out.Col(0).Float64s()
}

// twoPass is the plain two-pass mean and variance loop. It is a function
// of its own so that b.Loop, which keeps the values of its body alive,
// does not push the loop's accumulators out of registers.
//
//go:noinline
func twoPass(x []float64) (mean, variance float64) {
	var sum float64
	for _, v := range x {
		sum += v
	}
	mean = sum / float64(len(x))
	var ss float64
	for _, v := range x {
		d := v - mean
		ss += d * d
	}
	return mean, ss / float64(len(x)-1)
}

// BenchmarkTwoPassMeanVar10M is the baseline of the fit.
func BenchmarkTwoPassMeanVar10M(b *testing.B) {
	x := bench10M()
	b.SetBytes(int64(8 * len(x)))
	b.ReportAllocs()
	for b.Loop() {
		_, sinkV = twoPass(x)
	}
}

func BenchmarkZScoreFit10M(b *testing.B) {
	f := benchFrame(b)
	p, err := scale.ZScore{}.Fit(f)
	if err != nil || p.Std[0] < 39 || p.Std[0] > 41 { // Exp(1)·40: std 40
		b.Fatal(err, p)
	}
	b.SetBytes(int64(8 * benchRows))
	b.ReportAllocs()
	for b.Loop() {
		p, err := scale.ZScore{}.Fit(f)
		if err != nil {
			b.Fatal(err)
		}
		sinkV = p.Std[0]
	}
}
