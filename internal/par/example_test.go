package par_test

import (
	"fmt"

	"github.com/tabprep/tabprep/internal/par"
)

// Each runs independent pieces of work; each writes only its own result.
func ExampleEach() {
	sums := make([]int, 4)
	_ = par.Each(len(sums), 1<<20, func(i int) error {
		for v := 0; v <= i*10; v++ {
			sums[i] += v
		}
		return nil
	})
	fmt.Println(sums)
	// Output:
	// [0 55 210 465]
}
