package encode_test

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
)

const (
	benchRows   = 1_000_000
	benchLevels = 50
)

// benchClinics is one categorical column of 1,000,000 rows with 50 levels.
func benchClinics() *tabprep.Frame {
	levels := make([]string, benchLevels)
	for i := range levels {
		levels[i] = fmt.Sprintf("clinic_%02d", i)
	}
	r := rand.New(rand.NewPCG(5, 50))
	codes := make([]int32, benchRows)
	for i := range codes {
		codes[i] = int32(r.IntN(benchLevels))
	}
	c, err := tabprep.AdoptCategorical("clinic", levels, codes)
	if err != nil {
		panic(err)
	}
	return tabprep.MustFrame(c)
}

// BenchmarkOneHot1M is the one-hot transform of 1,000,000 rows of a
// 50-level column: 50,000,000 output cells. Compare with
// BenchmarkZeroFill50M; the target is at most 1.5 times its time.
func BenchmarkOneHot1M(b *testing.B) {
	f := benchClinics()
	s := encode.OneHot{}
	p, err := s.Fit(f)
	if err != nil {
		b.Fatal(err)
	}
	out, err := s.Transform(p, f)
	if err != nil || out.NumCols() != benchLevels {
		b.Fatalf("check before timing: %v, %d columns", err, out.NumCols())
	}
	b.SetBytes(benchRows * benchLevels * 8)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := s.Transform(p, f); err != nil {
			b.Fatal(err)
		}
	}
}

var fillSink []float64

func zeroFill() []float64 {
	block := make([]float64, benchRows*benchLevels)
	for i := range block {
		block[i] = 0
	}
	return block
}

// BenchmarkZeroFill50M allocates and writes the 50,000,000 cells the
// one-hot transform of BenchmarkOneHot1M writes: the baseline. Like the
// one-hot benchmark it runs once before timing, so that neither pays alone
// for the first touch of memory fresh from the operating system.
func BenchmarkZeroFill50M(b *testing.B) {
	fillSink = zeroFill()
	b.SetBytes(benchRows * benchLevels * 8)
	b.ReportAllocs()
	for b.Loop() {
		fillSink = zeroFill()
	}
}
