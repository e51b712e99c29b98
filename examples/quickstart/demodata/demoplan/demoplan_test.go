package demoplan_test

import (
	"bytes"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"sync"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/examples/quickstart/demodata"
	"github.com/tabprep/tabprep/examples/quickstart/demodata/demoplan"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
)

// TestUpToDate guards that plan.go is what the generator writes today.
func TestUpToDate(t *testing.T) {
	fitted, _, err := demodata.Serving()
	require.NoError(t, err)
	var b bytes.Buffer
	require.NoError(t, fitted.WriteGo(&b, pipeline.GoOptions{Package: "demoplan"}))
	onDisk, err := os.ReadFile("plan.go")
	require.NoError(t, err)
	require.Equal(t, b.String(), string(onDisk), "plan.go is stale: run go generate in this directory")
}

// TestMatchesInterpreted is the property that the generated plan gives the
// interpreted plan's values bit for bit and its errors word for word: on
// every demo row, and on random rows with gaps, levels never seen in
// training (which the generated code leaves to the interpreter when they
// are errors) and extreme numbers.
func TestMatchesInterpreted(t *testing.T) {
	fitted, data, err := demodata.Serving()
	require.NoError(t, err)
	rows := make([][]tabprep.Cell, 0, 2*data.NumRows())
	for i := range data.NumRows() {
		rows = append(rows, steptest.Row(data, i))
	}
	rows = append(rows, steptest.Perturbed(rand.New(rand.NewPCG(7, 8)), data, data.NumRows())...)
	failed := steptest.MatchGenerated(t, fitted, demoplan.Plan, rows)
	// An unseen or missing visit_type is an error (the ordinal step has no
	// fallback codes), so some rows must have taken that path.
	require.Positive(t, failed)
	require.Less(t, failed, len(rows)/10)

	// TransformInto takes the generated path too.
	interp, err := fitted.Compile()
	require.NoError(t, err)
	gen, err := fitted.CompileWith(demoplan.Plan)
	require.NoError(t, err)
	want := make([]float64, data.NumRows()*interp.OutputWidth())
	got := make([]float64, len(want))
	require.NoError(t, interp.TransformInto(want, data))
	require.NoError(t, gen.TransformInto(got, data))
	for i := range want {
		require.Equal(t, math.Float64bits(want[i]), math.Float64bits(got[i]), "value %d", i)
	}
}

// TestRefusesOtherFit checks that code generated from one fit is refused
// for another.
func TestRefusesOtherFit(t *testing.T) {
	_, data, err := demodata.Serving()
	require.NoError(t, err)
	half, err := data.Slice(0, 1000)
	require.NoError(t, err)
	refit, err := demodata.Pipeline().Fit(half)
	require.NoError(t, err)
	_, err = refit.CompileWith(demoplan.Plan)
	require.ErrorIs(t, err, tabprep.ErrSchema)
	require.ErrorContains(t, err, "regenerate it with Fitted.WriteGo")
}

// TestConcurrent shares one plan with generated code among 64 goroutines,
// each checking its rows against values worked out beforehand; run it
// under -race.
func TestConcurrent(t *testing.T) {
	fitted, data, err := demodata.Serving()
	require.NoError(t, err)
	interp, err := fitted.Compile()
	require.NoError(t, err)
	gen, err := fitted.CompileWith(demoplan.Plan)
	require.NoError(t, err)
	w := interp.OutputWidth()
	want := make([]float64, data.NumRows()*w)
	require.NoError(t, interp.TransformInto(want, data))
	var wg sync.WaitGroup
	errs := make(chan error, 64)
	for g := range 64 {
		wg.Go(func() {
			dst := make([]float64, w)
			for i := g; i < data.NumRows(); i += 8 {
				if err := gen.ApplyFloats(dst, steptest.Row(data, i)); err != nil {
					errs <- err
					return
				}
				for j, v := range dst {
					if math.Float64bits(v) != math.Float64bits(want[i*w+j]) {
						errs <- fmt.Errorf("row %d column %d: %v, want %v", i, j, v, want[i*w+j])
						return
					}
				}
			}
		})
	}
	wg.Wait()
	close(errs)
	for err := range errs {
		t.Error(err)
	}
}
