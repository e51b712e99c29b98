package pipeline_test

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
)

func requireSameCell(t *testing.T, c *tabprep.Column, i int, got tabprep.Cell) {
	t.Helper()
	if c.Kind() == tabprep.Numeric {
		want := c.Value(i)
		require.True(t, math.Float64bits(want) == math.Float64bits(got.Num) || (math.IsNaN(want) && math.IsNaN(got.Num)),
			"column %s row %d: batch %v, plan %v", c.Name(), i, want, got.Num)
		return
	}
	require.Equal(t, c.Level(i), got.Str)
}

// TestPlanMatchesBatch is the property that the compiled plan is
// bit-identical to the batch transform, over random rows, including levels
// never seen in training.
func TestPlanMatchesBatch(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	fp, err := testPipeline().Fit(randomFrame(rng, 300))
	require.NoError(t, err)
	plan, err := fp.Compile()
	require.NoError(t, err)
	require.Equal(t, fp.OutputNames(), plan.Output().Names())
	data := randomFrame(rng, 500)
	sp, _ := data.Column("species")
	codes := append([]int32(nil), sp.Codes()...)
	levels := append(append([]string(nil), sp.Levels()...), "ferret")
	for i := range codes {
		if i%7 == 0 {
			codes[i] = int32(len(levels) - 1)
		}
	}
	unseen, err := tabprep.NewCategoricalCodes("species", levels, codes)
	require.NoError(t, err)
	data, err = data.With(unseen)
	require.NoError(t, err)
	batch, err := fp.Transform(data)
	require.NoError(t, err)
	dst := make([]tabprep.Cell, plan.OutputWidth())
	for i := 0; i < data.NumRows(); i++ {
		require.NoError(t, plan.Apply(dst, steptest.Row(data, i)))
		for j := range dst {
			requireSameCell(t, batch.Col(j), i, dst[j])
		}
	}
}

func TestPlanFloatsAndBinding(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 24))
	p := pipeline.New(pipeline.Use(center{Column: "pet_age"}))
	num := tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{1, 2, 3, 6}))
	fp, err := p.Fit(num)
	require.NoError(t, err)
	plan, err := fp.Compile()
	require.NoError(t, err)
	src := make([]tabprep.Cell, plan.InputWidth())
	require.NoError(t, plan.FromMap(src, map[string]any{"pet_age": 5}))
	out := make([]float64, plan.OutputWidth())
	require.NoError(t, plan.ApplyFloats(out, src))
	require.Equal(t, []float64{2}, out)
	require.NoError(t, plan.FromMap(src, map[string]any{}))
	require.NoError(t, plan.ApplyFloats(out, src))
	require.True(t, math.IsNaN(out[0]), "an absent field is missing")

	err = plan.FromMap(src, map[string]any{"pet_agee": 5})
	require.ErrorIs(t, err, tabprep.ErrNoColumn)
	require.EqualError(t, err, `pipeline.plan: column "pet_agee": not an input column; the input columns are pet_age`)
	err = plan.FromMap(src, map[string]any{"pet_age": "five"})
	require.ErrorIs(t, err, tabprep.ErrKind)
	require.EqualError(t, err, `pipeline.plan: column "pet_age": got string, want a number (the column is numeric)`)

	type request struct {
		Age *float64 `tabprep:"pet_age"`
	}
	age := 9.0
	require.NoError(t, plan.FromStruct(src, request{Age: &age}))
	require.NoError(t, plan.ApplyFloats(out, src))
	require.Equal(t, []float64{6}, out)
	require.NoError(t, plan.FromStruct(src, &request{}))
	require.NoError(t, plan.ApplyFloats(out, src))
	require.True(t, math.IsNaN(out[0]))
	type wrong struct{ Weight float64 }
	err = plan.FromStruct(src, wrong{})
	require.ErrorIs(t, err, tabprep.ErrNoColumn)

	// A categorical output cannot be written as floats.
	fp2, err := testPipeline().Fit(randomFrame(rng, 50))
	require.NoError(t, err)
	plan2, err := fp2.Compile()
	require.NoError(t, err)
	require.Error(t, plan2.ApplyFloats(make([]float64, plan2.OutputWidth()), make([]tabprep.Cell, plan2.InputWidth())))
	require.Error(t, plan2.Apply(make([]tabprep.Cell, 1), make([]tabprep.Cell, 1)))
}

func TestPlanZeroAlloc(t *testing.T) {
	if raceEnabled {
		t.Skip("sync.Pool drops items under the race detector")
	}
	rng := rand.New(rand.NewPCG(25, 26))
	fp, err := testPipeline().Fit(randomFrame(rng, 100))
	require.NoError(t, err)
	plan, err := fp.Compile()
	require.NoError(t, err)
	src := []tabprep.Cell{{Num: 3}, {Str: "dog"}}
	dst := make([]tabprep.Cell, plan.OutputWidth())
	allocs := testing.AllocsPerRun(1000, func() {
		if err := plan.Apply(dst, src); err != nil {
			t.Fatal(err)
		}
	})
	require.Zero(t, allocs)
}

// TestPlanConcurrent shares one plan among 64 goroutines; under -race it
// proves the plan is safe for concurrent use.
func TestPlanConcurrent(t *testing.T) {
	rng := rand.New(rand.NewPCG(27, 28))
	fp, err := testPipeline().Fit(randomFrame(rng, 100))
	require.NoError(t, err)
	plan, err := fp.Compile()
	require.NoError(t, err)
	data := randomFrame(rng, 200)
	batch, err := fp.Transform(data)
	require.NoError(t, err)
	inParallel(t, 64, func(g int) error {
		dst := make([]tabprep.Cell, plan.OutputWidth())
		for i := g; i < data.NumRows(); i += 3 {
			if err := plan.Apply(dst, steptest.Row(data, i)); err != nil {
				return err
			}
			for j := range dst {
				c := batch.Col(j)
				if c.Kind() == tabprep.Numeric && math.Float64bits(c.Value(i)) != math.Float64bits(dst[j].Num) && !math.IsNaN(c.Value(i)) {
					return errors.New("mismatch")
				}
			}
		}
		return nil
	})
}

func TestTransformInto(t *testing.T) {
	rng := rand.New(rand.NewPCG(29, 30))
	p := pipeline.New(pipeline.Use(flag{Column: "species"}), pipeline.Use(center{Column: "pet_age"}))
	fp, err := p.Fit(randomFrame(rng, 100))
	require.NoError(t, err)
	// Drop the categorical column so the output is all numeric.
	fp2, err := pipeline.New(pipeline.Use(center{Column: "pet_age"})).Fit(tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{1, 2})))
	require.NoError(t, err)
	plan, err := fp2.Compile()
	require.NoError(t, err)
	data := randomFrame(rng, 40)
	dst := make([]float64, 40*plan.OutputWidth())
	require.NoError(t, plan.TransformInto(dst, data))
	batch, err := fp2.Transform(data)
	require.NoError(t, err)
	for i := 0; i < 40; i++ {
		requireSameCell(t, batch.Col(0), i, tabprep.Cell{Num: dst[i]})
	}
	if !raceEnabled {
		allocs := testing.AllocsPerRun(100, func() {
			if err := plan.TransformInto(dst, data); err != nil {
				t.Fatal(err)
			}
		})
		require.Zero(t, allocs)
	}
	require.Error(t, plan.TransformInto(dst[:3], data))
	plan1, err := fp.Compile()
	require.NoError(t, err)
	require.Error(t, plan1.TransformInto(make([]float64, 40*plan1.OutputWidth()), data), "categorical output")
	_, err = fp2.Compile()
	require.NoError(t, err)
	lacking := tabprep.MustFrame(tabprep.NewNumeric("x", make([]float64, 40)))
	require.ErrorIs(t, plan.TransformInto(dst, lacking), tabprep.ErrSchema)
}

// TestServingPlanConcurrent shares the quickstart pipeline's plan among 64
// goroutines, half through Plan.ApplyFloats and half through Runners; under
// -race it proves the plan is safe for concurrent use, and every answer is
// checked against the batch transform.
func TestServingPlanConcurrent(t *testing.T) {
	fitted, data := servingPipeline(t)
	plan, err := fitted.Compile()
	require.NoError(t, err)
	batch, err := fitted.Transform(data)
	require.NoError(t, err)
	inParallel(t, 64, func(g int) error {
		run := plan.Runner()
		dst := make([]float64, plan.OutputWidth())
		for i := g; i < data.NumRows(); i += 16 {
			var err error
			if g%2 == 0 {
				err = plan.ApplyFloats(dst, steptest.Row(data, i))
			} else {
				err = run.ApplyFloats(dst, steptest.Row(data, i))
			}
			if err != nil {
				return err
			}
			for j, v := range dst {
				if math.Float64bits(v) != math.Float64bits(batch.Col(j).Value(i)) {
					return fmt.Errorf("row %d column %s: plan %v, batch %v", i, batch.Col(j).Name(), v, batch.Col(j).Value(i))
				}
			}
		}
		return nil
	})
}
