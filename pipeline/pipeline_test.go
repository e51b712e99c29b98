package pipeline_test

import (
	"bytes"
	"errors"
	"math"
	"math/rand/v2"
	"sync"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/scale"
	"github.com/tabprep/tabprep/state"
)

// center subtracts the train mean of one column; it is invertible. It
// records every frame it is fitted on, to check what a fit reads.
type center struct {
	Column string `json:"column"`
}

type centerParams struct {
	Mean state.Float `json:"mean"`
}

var (
	seenMu sync.Mutex
	seen   []*tabprep.Frame
)

func (center) Kind() string { return "pipetest.center" }

func (c center) Fit(train *tabprep.Frame) (centerParams, error) {
	if err := tabprep.RequireTrain("pipetest.center", train); err != nil {
		return centerParams{}, err
	}
	seenMu.Lock()
	seen = append(seen, train)
	seenMu.Unlock()
	col, err := train.ColumnOf(c.Column, tabprep.Numeric)
	if err != nil {
		return centerParams{}, err
	}
	sum, n := 0.0, 0
	for _, v := range col.Float64s() {
		if v == v {
			sum += v
			n++
		}
	}
	if n == 0 {
		return centerParams{}, tabprep.Errorf("pipetest.center", tabprep.ErrAllMissing, c.Column, "no values")
	}
	return centerParams{Mean: state.Float(sum / float64(n))}, nil
}

func (c center) apply(data *tabprep.Frame, f func(float64) float64) (*tabprep.Frame, error) {
	col, err := data.ColumnOf(c.Column, tabprep.Numeric)
	if err != nil {
		return nil, err
	}
	out := make([]float64, col.Len())
	for i, v := range col.Float64s() {
		out[i] = f(v)
	}
	return data.With(tabprep.AdoptNumeric(c.Column, out))
}

func (c center) Transform(p centerParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return c.apply(data, func(v float64) float64 { return v - float64(p.Mean) })
}

func (c center) Inverse(p centerParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return c.apply(data, func(v float64) float64 { return v + float64(p.Mean) })
}

// flag appends a 0/1 column telling whether a categorical column equals the
// train's most common level: a step with a different parameter type.
type flag struct {
	Column string `json:"column"`
}

type flagParams struct {
	Level string `json:"level"`
}

func (flag) Kind() string { return "pipetest.flag" }

func (f flag) Fit(train *tabprep.Frame) (flagParams, error) {
	col, err := train.ColumnOf(f.Column, tabprep.Categorical)
	if err != nil {
		return flagParams{}, err
	}
	counts := make([]int, len(col.Levels()))
	for _, k := range col.Codes() {
		if k >= 0 {
			counts[k]++
		}
	}
	best := 0
	for i, c := range counts {
		if c > counts[best] {
			best = i
		}
	}
	return flagParams{Level: col.Levels()[best]}, nil
}

func (f flag) Transform(p flagParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	col, err := data.ColumnOf(f.Column, tabprep.Categorical)
	if err != nil {
		return nil, err
	}
	out := make([]float64, col.Len())
	for i := range out {
		if col.Level(i) == p.Level {
			out[i] = 1
		}
	}
	return data.With(tabprep.AdoptNumeric(f.Column+"_is_"+p.Level, out))
}

func init() {
	state.Register(center{})
	state.Register(flag{})
}

func randomFrame(rng *rand.Rand, n int) *tabprep.Frame {
	x := make([]float64, n)
	s := make([]string, n)
	for i := range x {
		x[i] = 100 + 10*rng.NormFloat64()
		if rng.IntN(10) == 0 {
			x[i] = math.NaN()
		}
		s[i] = []string{"cat", "dog", "dog", "rabbit", ""}[rng.IntN(5)]
	}
	return tabprep.MustFrame(tabprep.NewNumeric("pet_age", x), tabprep.NewCategorical("species", s))
}

func testPipeline() *pipeline.Pipeline {
	return pipeline.New(
		pipeline.Use(center{Column: "pet_age"}),
		pipeline.Use(flag{Column: "species"}),
		pipeline.Use(center{Column: "pet_age"}),
	)
}

func TestFitRefusesHoldout(t *testing.T) {
	f := randomFrame(rand.New(rand.NewPCG(1, 2)), 10)
	f, err := f.Tag(tabprep.Holdout("test"), []int{2, 5, 7})
	require.NoError(t, err)
	_, err = testPipeline().Fit(f)
	require.True(t, errors.Is(err, tabprep.ErrHoldout))
	require.EqualError(t, err, "pipeline.fit: 3 of 10 rows are tagged holdout; fit only on train rows: pass frame.Train() (or frame.Select(tabprep.Train))")
	fp, err := testPipeline().Fit(f.Train())
	require.NoError(t, err)
	require.Equal(t, 7, fp.Training().Rows)
}

func TestFitChainsSteps(t *testing.T) {
	seenMu.Lock()
	seen = nil
	seenMu.Unlock()
	train := randomFrame(rand.New(rand.NewPCG(3, 4)), 200)
	fp, err := testPipeline().Fit(train)
	require.NoError(t, err)
	require.Equal(t, 3, fp.NumSteps())
	// The third step is fitted on the first step's output, so it learns a
	// mean of zero (up to rounding).
	require.InDelta(t, 0, float64(fp.Step(2).Params().(centerParams).Mean), 1e-12)
	require.NotEqual(t, 0.0, float64(fp.Step(0).Params().(centerParams).Mean))
	require.Equal(t, []string{"pet_age", "species", "species_is_dog"}, fp.OutputNames())
	require.Equal(t, train.Schema(), fp.Input())
	seenMu.Lock()
	require.Len(t, seen, 2)
	require.Same(t, train, seen[0])
	seenMu.Unlock()
}

func TestTransformInvariants(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	train := randomFrame(rng, 300)
	fp, err := testPipeline().Fit(train)
	require.NoError(t, err)
	data := randomFrame(rng, 50)
	data, err = data.Tag(tabprep.Holdout("validation"), []int{0, 1, 2})
	require.NoError(t, err)
	before := data.Col(0).Float64s()[:]
	snapshot := append([]float64(nil), before...)
	out, err := fp.Transform(data)
	require.NoError(t, err)
	require.Equal(t, data.NumRows(), out.NumRows())
	require.Equal(t, data.Roles(), out.Roles())
	require.Equal(t, fp.OutputNames(), out.Names())
	require.True(t, tabprep.Equal(
		tabprep.MustFrame(tabprep.NewNumeric("x", snapshot)),
		tabprep.MustFrame(tabprep.NewNumeric("x", data.Col(0).Float64s()))), "Transform must not modify its input")

	// Extra columns are ignored, a missing or retyped column is an error.
	extra, err := data.With(tabprep.NewNumeric("extra", make([]float64, data.NumRows())))
	require.NoError(t, err)
	out2, err := fp.Transform(extra)
	require.NoError(t, err)
	require.True(t, tabprep.Equal(out, out2))
	lacking, err := data.Without("species")
	require.NoError(t, err)
	_, err = fp.Transform(lacking)
	require.ErrorIs(t, err, tabprep.ErrSchema)
	require.EqualError(t, err, `pipeline.transform: column "species": input lacks this column; the fitted schema needs ["pet_age" "species"]`)
}

func TestSaveLoadBitIdentical(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	fp, err := testPipeline().Fit(randomFrame(rng, 500))
	require.NoError(t, err)
	var buf bytes.Buffer
	require.NoError(t, fp.Save(&buf))
	loaded, err := pipeline.Load(bytes.NewReader(buf.Bytes()))
	require.NoError(t, err)
	require.Equal(t, fp.OutputNames(), loaded.OutputNames())
	require.Equal(t, fp.Training(), loaded.Training())
	data := randomFrame(rng, 1000)
	a, err := fp.Transform(data)
	require.NoError(t, err)
	b, err := loaded.Transform(data)
	require.NoError(t, err)
	require.True(t, tabprep.Equal(a, b))
	for i := 0; i < a.NumCols(); i++ {
		if a.Col(i).Kind() == tabprep.Numeric {
			for r, v := range a.Col(i).Float64s() {
				require.Equal(t, math.Float64bits(v), math.Float64bits(b.Col(i).Value(r)))
			}
		}
	}
	path := t.TempDir() + "/state.json"
	require.NoError(t, fp.SaveFile(path))
	fromFile, err := pipeline.LoadFile(path)
	require.NoError(t, err)
	c, err := fromFile.Transform(data)
	require.NoError(t, err)
	require.True(t, tabprep.Equal(a, c))
}

func TestInverse(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	p := pipeline.New(pipeline.Use(flag{Column: "species"}), pipeline.Use(center{Column: "pet_age"}), pipeline.Use(center{Column: "pet_age"}))
	fp, err := p.Fit(randomFrame(rng, 100))
	require.NoError(t, err)
	data := randomFrame(rng, 20)
	out, err := fp.Transform(data)
	require.NoError(t, err)
	back, err := fp.Inverse(1, out)
	require.NoError(t, err)
	want, err := fp.Step(0).Apply(data)
	require.NoError(t, err)
	for i, v := range want.Col(0).Float64s() {
		if math.IsNaN(v) {
			require.True(t, math.IsNaN(back.Col(0).Value(i)))
			continue
		}
		require.InDelta(t, v, back.Col(0).Value(i), 1e-12)
	}
	_, err = fp.Inverse(0, out)
	require.ErrorIs(t, err, tabprep.ErrNotInvertible)
	require.EqualError(t, err, "pipeline: step 0 (pipetest.flag): not invertible; invert only from a step after it")
	_, err = fp.Inverse(4, out)
	require.Error(t, err)
}

// TestConcurrentTransform shares one fitted pipeline among many goroutines;
// run under -race it proves the fitted pipeline is safe for concurrent use.
func TestConcurrentTransform(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	fp, err := testPipeline().Fit(randomFrame(rng, 200))
	require.NoError(t, err)
	data := randomFrame(rng, 64)
	want, err := fp.Transform(data)
	require.NoError(t, err)
	inParallel(t, 64, func(int) error {
		for range 20 {
			got, err := fp.Transform(data)
			if err != nil {
				return err
			}
			if !tabprep.Equal(want, got) {
				return errors.New("concurrent transform differs")
			}
			_ = fp.OutputNames()
		}
		return nil
	})
}

// inParallel runs work(g) on n goroutines at once and requires every call
// to return nil.
func inParallel(t *testing.T, n int, work func(g int) error) {
	t.Helper()
	var wg sync.WaitGroup
	errs := make(chan error, n)
	for g := 0; g < n; g++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			if err := work(g); err != nil {
				errs <- err
			}
		}()
	}
	wg.Wait()
	close(errs)
	for err := range errs {
		require.NoError(t, err)
	}
}

func TestFitErrorNamesStep(t *testing.T) {
	p := pipeline.New(pipeline.Use(center{Column: "weight"}))
	_, err := p.Fit(randomFrame(rand.New(rand.NewPCG(1, 1)), 5))
	require.ErrorIs(t, err, tabprep.ErrNoColumn)
	require.EqualError(t, err, `pipeline: fitting step 0 (pipetest.center): tabprep.frame: column "weight": not in frame; it has ["pet_age" "species"]`)
	require.Panics(t, func() { pipeline.New(nil) })
}

func (c center) RowKernel(p centerParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	k, _, ok := l.Slot(c.Column)
	if !ok {
		return nil, errors.New("no column")
	}
	m := float64(p.Mean)
	return func(regs []tabprep.Cell) error {
		regs[k].Num -= m
		return nil
	}, nil
}

func (f flag) RowKernel(p flagParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	k, field, ok := l.Slot(f.Column)
	if !ok {
		return nil, errors.New("no column")
	}
	code := int32(slicesIndex(field.Levels, p.Level))
	out := l.Add(tabprep.Field{Name: f.Column + "_is_" + p.Level, Kind: tabprep.Numeric})
	return func(regs []tabprep.Cell) error {
		regs[out] = tabprep.Cell{}
		if regs[k].Code == code {
			regs[out].Num = 1
		}
		return nil
	}, nil
}

func slicesIndex(s []string, v string) int {
	for i, x := range s {
		if x == v {
			return i
		}
	}
	return -1
}

// TestTargetsStayOut checks that a target column reaches only the step that
// learns from it: a step choosing every numeric column does not scale it, the
// fitted input schema lacks it, and new rows without it transform.
func TestTargetsStayOut(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewCategorical("clinic", []string{"a", "b", "a", "b", "a", "b"}),
		tabprep.NewNumeric("days_ahead", []float64{1, 5, 2, 8, 3, 4}),
		tabprep.NewNumeric("no_show", []float64{0, 1, 0, 1, 1, 0}),
	)
	p := pipeline.New(
		pipeline.Use(encode.Target{Columns: tabprep.Names("clinic"), Target: "no_show", K: 1, Folds: 2}),
		pipeline.Use(scale.ZScore{}),
	)
	fp, err := p.Fit(train)
	require.NoError(t, err)
	require.Equal(t, []string{"clinic", "days_ahead"}, fp.Input().Names())
	require.Equal(t, []string{"clinic", "days_ahead"}, fp.Step(1).Params().(scale.ZScoreParams).Columns)
	fresh, err := train.Without("no_show")
	require.NoError(t, err)
	out, err := fp.Transform(fresh)
	require.NoError(t, err)
	require.Equal(t, []string{"clinic", "days_ahead"}, out.Names())

	_, err = pipeline.New(pipeline.Use(encode.Target{Target: "outcome"})).Fit(fresh)
	require.ErrorIs(t, err, tabprep.ErrNoColumn)
	require.ErrorContains(t, err, `pipeline: step 0 (encode.target) learns from target column "outcome", which train lacks`)
}
