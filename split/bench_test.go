package split_test

import (
	"math/rand/v2"
	"testing"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/split"
)

const benchRows = 10_000_000

// benchFrame is a frame of n rows with a five-class column drawn with
// unequal class weights, plus a numeric column.
func benchFrame(b *testing.B, n int) *tabprep.Frame {
	b.Helper()
	r := rand.New(rand.NewPCG(3, 4))
	codes := make([]int32, n)
	vals := make([]float64, n)
	for i := range codes {
		u := r.Float64()
		switch {
		case u < 0.4:
			codes[i] = 0
		case u < 0.65:
			codes[i] = 1
		case u < 0.85:
			codes[i] = 2
		case u < 0.95:
			codes[i] = 3
		default:
			codes[i] = 4
		}
		vals[i] = u
	}
	species, err := tabprep.AdoptCategorical("species", []string{"dog", "cat", "rabbit", "bird", "ferret"}, codes)
	if err != nil {
		b.Fatal(err)
	}
	return tabprep.MustFrame(species, tabprep.AdoptNumeric("pet_age", vals))
}

// BenchmarkStratifiedSplit10M is the stratified split the issue names; its
// baseline is BenchmarkPerm10M in the same run.
func BenchmarkStratifiedSplit10M(b *testing.B) {
	f := benchFrame(b, benchRows)
	s := split.Stratified{Column: "species", Fraction: 0.2, Seed: 7}
	out, rep, err := s.Apply(f)
	if err != nil {
		b.Fatal(err)
	}
	if out.HoldoutCount() != benchRows/5 || len(rep.Classes) != 5 {
		b.Fatalf("holdout %d rows, %d classes", out.HoldoutCount(), len(rep.Classes))
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, _, err := s.Apply(f); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPerm10M is the baseline: a permutation of 10,000,000 indexes
// from a PCG source.
func BenchmarkPerm10M(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		p := rand.New(rand.NewPCG(1, 2)).Perm(benchRows)
		if len(p) != benchRows {
			b.Fatal(len(p))
		}
	}
}
