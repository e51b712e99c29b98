package moment_test

import (
	"fmt"
	"math"

	"github.com/tabprep/tabprep/internal/moment"
)

// Two chunks summarised apart and merged give the summary of all values.
func ExampleMerge() {
	a := moment.Of([]float64{2, 4, math.NaN()})
	b := moment.Of([]float64{4, 4, 5, 5, 7, 9})
	s := moment.Merge(a, b)
	fmt.Printf("n=%d mean=%.2f population sd=%.2f\n", s.N, s.Mean, s.Std(false))
	// Output:
	// n=8 mean=5.00 population sd=2.00
}
