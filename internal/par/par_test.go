package par

import (
	"errors"
	"fmt"
	"runtime"
	"testing"

	"github.com/stretchr/testify/require"
)

func TestEachRunsEveryIndexOnce(t *testing.T) {
	for _, cells := range []int{1, 1 << 20} {
		hits := make([]int, 100)
		require.NoError(t, Each(len(hits), cells, func(i int) error { hits[i]++; return nil }))
		for i, h := range hits {
			require.Equal(t, 1, h, "index %d, cells %d", i, cells)
		}
	}
}

func TestEachReturnsFirstError(t *testing.T) {
	prev := runtime.GOMAXPROCS(4)
	defer runtime.GOMAXPROCS(prev)
	err := Each(50, 1<<20, func(i int) error {
		if i == 7 || i == 30 {
			return fmt.Errorf("fail %d", i)
		}
		return nil
	})
	require.EqualError(t, err, "fail 7")
	err = Each(3, 1, func(i int) error { return errors.New("serial") })
	require.EqualError(t, err, "serial")
}
