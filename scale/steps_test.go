package scale_test

import (
	"fmt"
	"math"
	"sync"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/scale"
)

// stepCase runs one step through the checks every scaler must pass.
type stepCase struct {
	name string
	// check fits on train, transforms data, proves the invariants and
	// returns the largest inverse error in ulps of each column's largest
	// train magnitude (0 for a step with no inverse).
	check func(t *testing.T, train, data *tabprep.Frame) float64
	stage pipeline.Stage
	ulps  float64 // the inverse bound, in ulps of the largest train magnitude
}

// caseOf builds the stepCase of s. clamps says that the transform clamps
// values beyond the train range, so only values within it invert exactly.
func caseOf[S tabprep.Step[P], P any](name string, s S, ulps float64, clamps bool) stepCase {
	return stepCase{name: name, stage: pipeline.Use(s), ulps: ulps, check: func(t *testing.T, train, data *tabprep.Frame) float64 {
		p, err := s.Fit(train)
		require.NoError(t, err)
		before := snapshot(data)
		out, err := s.Transform(p, data)
		require.NoError(t, err)
		require.True(t, tabprep.Equal(before, data), "input modified")
		require.Equal(t, data.Names(), out.Names())
		require.Equal(t, data.Roles(), out.Roles())
		changed := map[string]bool{}
		for i := range out.NumCols() {
			a, b := data.Col(i), out.Col(i)
			if a != b {
				changed[a.Name()] = true
			}
		}
		require.NotEmpty(t, changed)
		for name := range changed {
			requireMissingKept(t, data, out, name)
		}
		for i := range out.NumCols() {
			if c := out.Col(i); changed[c.Name()] {
				for _, v := range c.Float64s() {
					require.False(t, math.IsInf(v, 0), "column %s: infinite output", c.Name())
				}
			}
		}
		requireRowKernelMatches(t, any(s), p, data, out)
		inv, ok := any(s).(tabprep.Inverter[P])
		if !ok {
			return 0
		}
		back, err := inv.Inverse(p, out)
		require.NoError(t, err)
		var worst float64
		for name := range changed {
			x, _ := data.Column(name)
			y, _ := back.Column(name)
			tr, _ := train.Column(name)
			lo, hi, big := math.Inf(1), math.Inf(-1), 0.0
			for _, v := range tr.Float64s() {
				if v == v {
					lo, hi, big = min(lo, v), max(hi, v), max(big, math.Abs(v))
				}
			}
			ulp := math.Nextafter(big, math.Inf(1)) - big
			for i, v := range x.Float64s() {
				w := y.Value(i)
				if v != v {
					require.True(t, math.IsNaN(w), "missing stays missing through the inverse")
					continue
				}
				if clamps && (v < lo || v > hi) {
					continue
				}
				worst = max(worst, math.Abs(w-v)/ulp)
			}
		}
		return worst
	}}
}

// requireRowKernelMatches requires the row kernel of s, if it has one, to
// give the batch output bit for bit on every row of data.
func requireRowKernelMatches[P any](t *testing.T, s any, p P, data, out *tabprep.Frame) {
	rk, ok := s.(tabprep.RowKernel[P])
	if !ok {
		return
	}
	run, schema, err := steptest.Compile(rk.RowKernel, p, data.Schema())
	require.NoError(t, err)
	steptest.MatchBatch(t, run, schema, data, out)
}

var positive = tabprep.Names("days_ahead", "distance_km", "pet_age")

// allSteps lists every scaler, with its inverse bound in ulps of the
// column's largest train magnitude (measured, then rounded up; see
// TestInverseProperty).
var allSteps = []stepCase{
	caseOf("zscore", scale.ZScore{}, 4, false),
	caseOf("zscore population", scale.ZScore{Population: true, Columns: tabprep.Matching("*_*")}, 4, false),
	caseOf("minmax", scale.MinMax{}, 4, false),
	caseOf("minmax clip", scale.MinMax{Low: -1, High: 1, Clamp: true}, 4, true),
	caseOf("decimal", scale.DecimalScaling{}, 2, false),
	caseOf("robust", scale.Robust{}, 4, false),
	caseOf("robust 10/90", scale.Robust{Low: 0.1, High: 0.9}, 4, false),
	caseOf("maxabs", scale.MaxAbs{}, 2, false),
	caseOf("rownorm l2", scale.RowNorm{}, 0, false),
	caseOf("rownorm l1", scale.RowNorm{Norm: scale.NormL1, Columns: positive}, 0, false),
	caseOf("rownorm max", scale.RowNorm{Norm: scale.NormMax}, 0, false),
	caseOf("log", scale.Log{Columns: positive}, 8, false),
	caseOf("log1p", scale.Log1p{Columns: positive}, 8, false),
	caseOf("boxcox", scale.BoxCox{Columns: positive}, 16, false),
	caseOf("boxcox standardized", scale.BoxCox{Columns: positive, ZScore: true}, 16, false),
	caseOf("yeojohnson", scale.YeoJohnson{}, 16, false),
	caseOf("yeojohnson standardized", scale.YeoJohnson{ZScore: true}, 16, false),
	caseOf("quantile uniform", scale.Quantile{Points: 200}, 64, true),
	caseOf("quantile normal", scale.Quantile{Output: scale.OutputNormal}, 64, true),
}

func TestEveryStep(t *testing.T) {
	frame := clinicFrame(t, 400, 11, true)
	for _, tc := range allSteps {
		t.Run(tc.name, func(t *testing.T) {
			tc.check(t, frame.Train(), frame)
		})
	}
}

// TestEveryStepSaveLoad: every scaler survives Save/Load bit for bit
// through a pipeline, on new rows.
func TestEveryStepSaveLoad(t *testing.T) {
	frame := clinicFrame(t, 300, 12, true)
	for _, tc := range allSteps {
		t.Run(tc.name, func(t *testing.T) {
			out := roundTrip(t, tc.stage, frame.Train(), frame.HoldoutRows())
			require.Equal(t, frame.HoldoutCount(), out.NumRows())
		})
	}
}

// TestInverseProperty: inverse(transform(x)) returns x to within the
// step's bound, in ulps of the column's largest train magnitude, on random
// frames (math/rand/v2, fixed PCG seeds).
func TestInverseProperty(t *testing.T) {
	worst := make([]float64, len(allSteps))
	for trial := range 12 {
		frame := clinicFrame(t, 50+37*trial, uint64(100+trial), true)
		for k, tc := range allSteps {
			if tc.ulps == 0 {
				continue
			}
			t.Run(fmt.Sprintf("%s/%d", tc.name, trial), func(t *testing.T) {
				w := tc.check(t, frame.Train(), frame)
				worst[k] = max(worst[k], w)
				require.LessOrEqual(t, w, tc.ulps)
			})
		}
	}
	for k, tc := range allSteps {
		if tc.ulps > 0 {
			t.Logf("%-24s worst inverse error %8.1f ulps (bound %v)", tc.name, worst[k], tc.ulps)
		}
	}
}

// TestConcurrentTransform: a fitted step is used by many goroutines at
// once (run under -race) and each gets the same result.
func TestConcurrentTransform(t *testing.T) {
	frame := clinicFrame(t, 200, 13, true)
	for _, tc := range allSteps {
		t.Run(tc.name, func(t *testing.T) {
			fitted, err := pipeline.New(tc.stage).Fit(frame.Train())
			require.NoError(t, err)
			want, err := fitted.Transform(frame)
			require.NoError(t, err)
			var wg sync.WaitGroup
			results := make([]*tabprep.Frame, 8)
			for g := range results {
				wg.Go(func() {
					results[g], _ = fitted.Transform(frame)
				})
			}
			wg.Wait()
			for _, got := range results {
				require.True(t, tabprep.Equal(want, got))
			}
		})
	}
}

// TestPipelineInverse: the pipeline's inverse over a run of invertible
// steps gives back the input, as for a scaled regression target.
func TestPipelineInverse(t *testing.T) {
	frame := clinicFrame(t, 300, 14, false)
	p := pipeline.New(
		pipeline.Use(scale.Log1p{Columns: positive}),
		pipeline.Use(scale.YeoJohnson{Columns: tabprep.Names("weight_change")}),
		pipeline.Use(scale.ZScore{}),
	)
	fitted, err := p.Fit(frame)
	require.NoError(t, err)
	out, err := fitted.Transform(frame)
	require.NoError(t, err)
	back, err := fitted.Inverse(0, out)
	require.NoError(t, err)
	for i := range frame.NumCols() {
		a, b := frame.Col(i), back.Col(i)
		if a.Kind() != tabprep.Numeric {
			continue
		}
		for r, v := range a.Float64s() {
			if v != v {
				require.True(t, math.IsNaN(b.Value(r)))
				continue
			}
			require.InDelta(t, v, b.Value(r), 1e-12*max(1, math.Abs(v)), "%s row %d", a.Name(), r)
		}
	}
	// A row normalisation cannot be undone, and the pipeline says so.
	withNorm, err := pipeline.New(pipeline.Use(scale.ZScore{}), pipeline.Use(scale.RowNorm{})).Fit(frame)
	require.NoError(t, err)
	_, err = withNorm.Inverse(0, out)
	require.ErrorIs(t, err, tabprep.ErrNotInvertible)
}
