// Package steptest holds test helpers shared by the step packages: checks
// that a step's compiled row kernel agrees with its batch transform, and
// that a saved and loaded pipeline transforms as the one in memory.
package steptest

import (
	"bytes"
	"math"
	"math/rand/v2"
	"strings"
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
	MatchBatch(t, plan.Apply, plan.Output(), in, batch)
	return fitted, plan
}

// Compile compiles the row kernel of a step with fitted parameters p for
// rows of schema in, and returns a function that runs one input row through
// it as a compiled plan does (level codes from in's levels), writing the
// output row laid out by the returned schema. The function reuses one
// register file, so it is for one goroutine.
func Compile[P any](kernel func(P, *tabprep.RowLayout) (tabprep.RowFunc, error), p P, in tabprep.Schema) (func(dst, src []tabprep.Cell) error, tabprep.Schema, error) {
	l := tabprep.NewRowLayout(in)
	fn, err := kernel(p, l)
	if err != nil {
		return nil, tabprep.Schema{}, err
	}
	regs := make([]tabprep.Cell, l.Slots())
	out := l.Schema()
	slots := make([]int, l.Len())
	for i := range slots {
		slots[i] = l.SlotAt(i)
	}
	run := func(dst, src []tabprep.Cell) error {
		if len(src) != len(in.Columns) || len(dst) != len(slots) {
			return tabprep.Errorf("steptest", tabprep.ErrLength, "", "row of %d cells into %d; the kernel reads %d and writes %d", len(src), len(dst), len(in.Columns), len(slots))
		}
		copy(regs, src)
		for i, f := range in.Columns {
			if f.Kind == tabprep.Categorical {
				regs[i].Code = codeOf(f.Levels, src[i].Str)
			}
		}
		if err := fn(regs); err != nil {
			return err
		}
		for i, k := range slots {
			dst[i] = regs[k]
		}
		return nil
	}
	return run, out, nil
}

func codeOf(levels []string, s string) int32 {
	if s == "" {
		return tabprep.MissingCode
	}
	for i, l := range levels {
		if l == s {
			return int32(i)
		}
	}
	return tabprep.UnseenCode
}

// MatchBatch requires that run, from [Compile], gives for every row of data
// the cells of batch, the batch transform of data, bit for bit (NaN matching
// NaN), under the same names, and that a row allocates nothing outside the
// race detector.
func MatchBatch(t testing.TB, run func(dst, src []tabprep.Cell) error, out tabprep.Schema, data, batch *tabprep.Frame) {
	t.Helper()
	require.Equal(t, batch.Names(), out.Names())
	dst := make([]tabprep.Cell, len(out.Columns))
	for i := 0; i < data.NumRows(); i++ {
		src := Row(data, i)
		require.NoError(t, run(dst, src), "row %d", i)
		for j, cell := range dst {
			c := batch.Col(j)
			if c.Kind() == tabprep.Numeric {
				want := c.Value(i)
				same := math.Float64bits(want) == math.Float64bits(cell.Num) || (math.IsNaN(want) && math.IsNaN(cell.Num))
				require.True(t, same, "row %d column %s: batch %v, kernel %v", i, c.Name(), want, cell.Num)
			} else {
				require.Equal(t, c.Level(i), cell.Str, "row %d column %s", i, c.Name())
			}
		}
		if !raceEnabled {
			require.Zero(t, testing.AllocsPerRun(20, func() { _ = run(dst, src) }), "row %d allocates", i)
		}
	}
}

// Reloaded saves fitted to a state document and loads it back.
func Reloaded(t testing.TB, fitted *pipeline.Fitted) *pipeline.Fitted {
	t.Helper()
	var buf bytes.Buffer
	require.NoError(t, fitted.Save(&buf))
	loaded, err := pipeline.Load(&buf)
	require.NoError(t, err)
	return loaded
}

// RoundTrip fits a pipeline of stage on train, saves and loads it, and
// requires the loaded pipeline to transform data bit for bit as the
// in-memory one does. It returns the transformed data.
func RoundTrip(t testing.TB, stage pipeline.Stage, train, data *tabprep.Frame) *tabprep.Frame {
	t.Helper()
	fitted, err := pipeline.New(stage).Fit(train)
	require.NoError(t, err)
	want, err := fitted.Transform(data)
	require.NoError(t, err)
	got, err := Reloaded(t, fitted).Transform(data)
	require.NoError(t, err)
	require.True(t, tabprep.Equal(want, got), "Save/Load changed the transform")
	return want
}

// MatchGenerated compiles fitted twice, as the interpreted plan and with
// the generated code g, and requires that every row of rows gives the same
// error, or none, and the same values bit for bit through both, by
// Plan.ApplyFloats and Runner.ApplyFloats, and that a row the generated
// code finishes allocates nothing outside the race detector. It also
// requires that g is refused once the pipeline's parameters differ
// from those it was generated from (g with another digest), and that the
// generated code finishes some of the rows itself. It returns the number of
// rows that gave an error.
func MatchGenerated(t testing.TB, fitted *pipeline.Fitted, g pipeline.Generated, rows [][]tabprep.Cell) (failed int) {
	t.Helper()
	interp, err := fitted.Compile()
	require.NoError(t, err)
	gen, err := fitted.CompileWith(g)
	require.NoError(t, err)
	stale := g
	stale.Digest = "sha256:0"
	_, err = fitted.CompileWith(stale)
	require.ErrorIs(t, err, tabprep.ErrSchema)

	w := interp.OutputWidth()
	want, got := make([]float64, w), make([]float64, w)
	run := gen.Runner()
	finished := 0
	for i, row := range rows {
		werr := interp.ApplyFloats(want, row)
		gerr := gen.ApplyFloats(got, row)
		rerr := run.ApplyFloats(got, row)
		if werr != nil {
			require.EqualError(t, gerr, werr.Error(), "row %d", i)
			require.EqualError(t, rerr, werr.Error(), "row %d", i)
			failed++
			continue
		}
		require.NoError(t, gerr, "row %d", i)
		require.NoError(t, rerr, "row %d", i)
		if g.ApplyFloats(got, row) {
			finished++
			if !raceEnabled {
				require.Zero(t, testing.AllocsPerRun(5, func() { _ = gen.ApplyFloats(got, row) }), "row %d allocates", i)
			}
		}
		for j := range want {
			require.Equal(t, math.Float64bits(want[j]), math.Float64bits(got[j]),
				"row %d column %s: interpreted %v, generated %v", i, interp.Output().Columns[j].Name, want[j], got[j])
		}
	}
	require.Positive(t, finished, "the generated code finished no row")
	return failed
}

// Perturbed returns n rows of data picked by rng, each with one cell
// changed to a value a serving row may bring: a gap, an infinity, a signed
// zero or an extreme number in a numeric column; in a categorical one, a
// missing cell, a level never seen in training or a near miss of a seen
// one.
func Perturbed(rng *rand.Rand, data *tabprep.Frame, n int) [][]tabprep.Cell {
	odd := []float64{math.NaN(), math.Inf(1), math.Inf(-1), 0, math.Copysign(0, -1), 1e308, -5e-324, -1, 1e9}
	rows := make([][]tabprep.Cell, n)
	for i := range rows {
		row := Row(data, rng.IntN(data.NumRows()))
		j := rng.IntN(len(row))
		if data.Col(j).Kind() == tabprep.Numeric {
			row[j].Num = odd[rng.IntN(len(odd))]
		} else {
			switch rng.IntN(4) {
			case 0:
				row[j].Str = ""
			case 1:
				row[j].Str = "ferret"
			case 2:
				row[j].Str += " "
			default:
				row[j].Str = strings.ToUpper(row[j].Str)
			}
		}
		rows[i] = row
	}
	return rows
}
