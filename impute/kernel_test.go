package impute_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/tabprep/tabprep"
)

// checkRowKernel checks that the row kernel of p gives, row by row, the
// same cells as the batch transform, allocates nothing per row, and
// rejects a row of the wrong width.
func checkRowKernel[P any](t *testing.T,
	kernel func(P, tabprep.Schema) (tabprep.RowFunc, tabprep.Schema, error),
	p P, data *tabprep.Frame,
	transform func(P, *tabprep.Frame) (*tabprep.Frame, error),
) {
	t.Helper()
	fn, outSchema, err := kernel(p, data.Schema())
	require.NoError(t, err)
	batch, err := transform(p, data)
	require.NoError(t, err)
	require.Equal(t, batch.Names(), outSchema.Names())
	src := make([]tabprep.Cell, data.NumCols())
	dst := make([]tabprep.Cell, len(outSchema.Columns))
	for i := range data.NumRows() {
		rowCells(data, i, src)
		require.NoError(t, fn(dst, src))
		want := make([]tabprep.Cell, len(dst))
		rowCells(batch, i, want)
		for j := range want {
			require.Equal(t, want[j].Str, dst[j].Str, "row %d cell %d", i, j)
			require.Equal(t, math.Float64bits(want[j].Num), math.Float64bits(dst[j].Num), "row %d cell %d", i, j)
		}
	}
	rowCells(data, 0, src)
	allocs := testing.AllocsPerRun(100, func() { _ = fn(dst, src) })
	require.Zero(t, allocs)
	require.ErrorIs(t, fn(dst[:0], src), tabprep.ErrLength)
}

// rowCells writes row i of f into dst.
func rowCells(f *tabprep.Frame, i int, dst []tabprep.Cell) {
	for j := range f.NumCols() {
		c := f.Col(j)
		if c.Kind() == tabprep.Numeric {
			dst[j] = tabprep.Cell{Num: c.Value(i)}
		} else {
			dst[j] = tabprep.Cell{Str: c.Level(i)}
		}
	}
}
