// Package par runs independent pieces of work, such as the statistics of
// separate columns, on all cores.
package par

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// minWork is the fewest cells worth a goroutine: below it the cost of
// starting one is larger than the work (common practice, no source; tuned
// by the pipeline fit benchmark).
const minWork = 1 << 15

// Each calls fn(i) for every i in [0, n), on up to GOMAXPROCS goroutines,
// and returns the error of the smallest i that failed, or nil. cells is
// the amount of work per call, in cells; small work runs serially. Each
// call writes only its own outputs, so the results are the same, bit for
// bit, as a serial loop's.
func Each(n, cells int, fn func(i int) error) error {
	workers := min(runtime.GOMAXPROCS(0), n)
	if workers <= 1 || n*cells < 2*minWork {
		for i := 0; i < n; i++ {
			if err := fn(i); err != nil {
				return err
			}
		}
		return nil
	}
	errs := make([]error, n)
	var next atomic.Int64
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				i := int(next.Add(1) - 1)
				if i >= n {
					return
				}
				errs[i] = fn(i)
			}
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	return nil
}
