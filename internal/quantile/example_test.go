package quantile_test

import (
	"fmt"

	"github.com/tabprep/tabprep/internal/quantile"
)

// Hyndman & Fan (1996) type 7: the 75th percentile of {1, 2, 3, 4} is 3.25.
func ExampleOf() {
	fmt.Println(quantile.Of([]float64{4, 1, 3, 2}, 0.75, quantile.Type7))
	// Output:
	// 3.25
}
