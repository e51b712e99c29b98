package encode_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
)

// clinicTrain is a small slice of the appointment no-show demo data.
func clinicTrain() *tabprep.Frame {
	return tabprep.MustFrame(
		tabprep.NewCategorical("clinic", []string{"north", "south", "north", "east", "south", "north", "", "east"}),
		tabprep.NewCategorical("species", []string{"dog", "cat", "dog", "rabbit", "cat", "dog", "cat", "dog"}),
		tabprep.NewNumeric("days_ahead", []float64{3, 10, 1, 7, math.NaN(), 14, 2, 5}),
		tabprep.NewNumeric("no_show", []float64{0, 1, 0, 1, 0, 0, 1, 0}),
	)
}

// clinicNew holds an unseen clinic ("west"), missing cells and a holdout row.
func clinicNew(t *testing.T) *tabprep.Frame {
	t.Helper()
	f := tabprep.MustFrame(
		tabprep.NewCategorical("clinic", []string{"east", "west", "", "north"}),
		tabprep.NewCategorical("species", []string{"cat", "dog", "ferret", "dog"}),
		tabprep.NewNumeric("days_ahead", []float64{4, math.NaN(), 30, -1}),
		tabprep.NewNumeric("no_show", []float64{0, 1, 1, 0}),
	)
	f, err := f.Tag(tabprep.Holdout("test"), []int{3})
	require.NoError(t, err)
	return f
}

// roundTrip fits a one-step pipeline on train, transforms data, saves,
// loads and transforms again, and requires the two results to be equal bit
// for bit. It returns the in-memory result.
func roundTrip(t *testing.T, stage pipeline.Stage, train, data *tabprep.Frame) *tabprep.Frame {
	t.Helper()
	want := steptest.RoundTrip(t, stage, train, data)
	require.Equal(t, data.Roles(), want.Roles())
	return want
}

// rowCells returns row i of f as cells.
func rowCells(f *tabprep.Frame, i int, dst []tabprep.Cell) []tabprep.Cell {
	dst = dst[:0]
	for j := 0; j < f.NumCols(); j++ {
		c := f.Col(j)
		if c.Kind() == tabprep.Numeric {
			dst = append(dst, tabprep.Cell{Num: c.Value(i)})
		} else {
			dst = append(dst, tabprep.Cell{Str: c.Level(i)})
		}
	}
	return dst
}

// requireKernel fits s on the demo train rows, checks its compiled row
// kernel against its batch transform on the new rows, bit for bit and with
// no allocation per row, and returns the parameters.
func requireKernel[S tabprep.Step[P], P any](t *testing.T, s S) P {
	t.Helper()
	fitted, _ := steptest.RowsMatch(t, clinicTrain(), clinicNew(t), pipeline.Use(s))
	return fitted.Step(0).Params().(P)
}

// kernelOf compiles the row kernel of s with p for rows of schema in, and
// returns a function that runs one row through it as a plan would.
func kernelOf[P any](s tabprep.RowKernel[P], p P, in tabprep.Schema) (func(row []tabprep.Cell) error, error) {
	run, out, err := steptest.Compile(s.RowKernel, p, in)
	if err != nil {
		return nil, err
	}
	dst := make([]tabprep.Cell, len(out.Columns))
	return func(row []tabprep.Cell) error { return run(dst, row) }, nil
}

func column(t *testing.T, f *tabprep.Frame, name string) []float64 {
	t.Helper()
	c, err := f.ColumnOf(name, tabprep.Numeric)
	require.NoError(t, err)
	return c.Float64s()
}
