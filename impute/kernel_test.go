package impute_test

import (
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/steptest"
)

// checkRowKernel checks that the row kernel of p gives, row by row, the
// cells of the batch transform, bit for bit, with no allocation per row.
func checkRowKernel[P any](t *testing.T,
	kernel func(P, *tabprep.RowLayout) (tabprep.RowFunc, error),
	p P, data *tabprep.Frame,
	transform func(P, *tabprep.Frame) (*tabprep.Frame, error),
) {
	t.Helper()
	run, out, err := steptest.Compile(kernel, p, data.Schema())
	require.NoError(t, err)
	batch, err := transform(p, data)
	require.NoError(t, err)
	steptest.MatchBatch(t, run, out, data, batch)
	require.ErrorIs(t, run(nil, steptest.Row(data, 0)), tabprep.ErrLength)
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
