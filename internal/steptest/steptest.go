// Package steptest holds test helpers shared by the step packages: checks
// that a step's compiled row kernel agrees with its batch transform.
package steptest

import (
	"math"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/pipeline"
)

// Row returns row i of f as plan input cells: Num for a numeric column, Str
// for a categorical one.
func Row(f *tabprep.Frame, i int) []tabprep.Cell {
	out := make([]tabprep.Cell, f.NumCols())
	for j := range out {
		c := f.Col(j)
		if c.Kind() == tabprep.Numeric {
			out[j].Num = c.Value(i)
		} else {
			out[j].Str = c.Level(i)
		}
	}
	return out
}

// RowsMatch fits a pipeline of the given stages on train, compiles it, and
// requires that every row of data through the plan equals the batch
// transform bit for bit (NaN matching NaN) and, outside the race detector,
// allocates nothing. It returns the fitted pipeline and its plan.
func RowsMatch(t testing.TB, train, data *tabprep.Frame, stages ...pipeline.Stage) (*pipeline.Fitted, *pipeline.Plan) {
	t.Helper()
	fitted, err := pipeline.New(stages...).Fit(train)
	require.NoError(t, err)
	plan, err := fitted.Compile()
	require.NoError(t, err)
	batch, err := fitted.Transform(data)
	require.NoError(t, err)
	require.Equal(t, batch.Names(), plan.Output().Names())
	in, err := fitted.Input().Conform("steptest", data)
	require.NoError(t, err)
	dst := make([]tabprep.Cell, plan.OutputWidth())
	for i := 0; i < data.NumRows(); i++ {
		src := Row(in, i)
		require.NoError(t, plan.Apply(dst, src), "row %d", i)
		for j, cell := range dst {
			c := batch.Col(j)
			if c.Kind() == tabprep.Numeric {
				want := c.Value(i)
				same := math.Float64bits(want) == math.Float64bits(cell.Num) || (math.IsNaN(want) && math.IsNaN(cell.Num))
				require.True(t, same, "row %d column %s: batch %v, plan %v", i, c.Name(), want, cell.Num)
			} else {
				require.Equal(t, c.Level(i), cell.Str, "row %d column %s", i, c.Name())
			}
		}
		if !raceEnabled {
			require.Zero(t, testing.AllocsPerRun(20, func() { _ = plan.Apply(dst, src) }), "row %d allocates", i)
		}
	}
	return fitted, plan
}
