package pipeline_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/examples/quickstart/demodata"
	"github.com/tabprep/tabprep/examples/quickstart/demodata/demoplan"
	"github.com/tabprep/tabprep/impute"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/scale"
)

// servingPipeline is the quickstart's preprocessing (impute, one-hot,
// ordinal, z-score: demodata.Pipeline) fitted on the demo data without its
// outcome.
func servingPipeline(tb testing.TB) (*pipeline.Fitted, *tabprep.Frame) {
	tb.Helper()
	fitted, data, err := demodata.Serving()
	if err != nil {
		tb.Fatal(err)
	}
	return fitted, data
}

// handConsts are the fitted numbers the hand-written function needs, read
// from the fitted pipeline once.
type handConsts struct {
	ageFill, distFill float64
	reminderFill      string
	mean, inv         [4]float64 // days_ahead, pet_age, distance_km, prior_no_shows; inv = 1/std
}

func handConstsOf(f *pipeline.Fitted) handConsts {
	var k handConsts
	fill := f.Step(0).Params().(impute.FillParams)
	k.ageFill, k.distFill = float64(fill.Columns[0].Number), float64(fill.Columns[1].Number)
	k.reminderFill = f.Step(1).Params().(impute.FillParams).Columns[0].Level
	z := f.Step(4).Params().(scale.ZScoreParams)
	copy(k.mean[:], z.Mean)
	for i, sd := range z.Std {
		k.inv[i] = 1 / sd // scale.ZScore multiplies by the reciprocal
	}
	return k
}

// handWritten does the quickstart pipeline's arithmetic for its schema the
// way a Go developer would write it by hand: input cells clinic, species,
// visit_type, days_ahead, pet_age, distance_km, reminder, prior_no_shows;
// output visit_type, the four scaled numbers, then the one-hot columns.
func handWritten(dst []float64, src []tabprep.Cell, k *handConsts) {
	age, dist := src[4].Num, src[5].Num
	if age != age {
		age = k.ageFill
	}
	if dist != dist {
		dist = k.distFill
	}
	switch src[2].Str {
	case "vaccination":
		dst[0] = 0
	case "checkup":
		dst[0] = 1
	case "follow_up":
		dst[0] = 2
	case "dental":
		dst[0] = 3
	case "surgery":
		dst[0] = 4
	default:
		dst[0] = math.NaN()
	}
	dst[1] = (src[3].Num - k.mean[0]) * k.inv[0]
	dst[2] = (age - k.mean[1]) * k.inv[1]
	dst[3] = (dist - k.mean[2]) * k.inv[2]
	dst[4] = (src[7].Num - k.mean[3]) * k.inv[3]
	for i := 5; i < 19; i++ {
		dst[i] = 0
	}
	switch src[0].Str {
	case "Hillcrest":
		dst[5] = 1
	case "Lakeview":
		dst[6] = 1
	case "Northgate":
		dst[7] = 1
	case "Old Town":
		dst[8] = 1
	case "Riverside":
		dst[9] = 1
	}
	switch src[1].Str {
	case "bird":
		dst[10] = 1
	case "cat":
		dst[11] = 1
	case "dog":
		dst[12] = 1
	case "rabbit":
		dst[13] = 1
	case "reptile":
		dst[14] = 1
	}
	rem := src[6].Str
	if rem == "" {
		rem = k.reminderFill
	}
	switch rem {
	case "email":
		dst[15] = 1
	case "none":
		dst[16] = 1
	case "phone":
		dst[17] = 1
	case "sms":
		dst[18] = 1
	}
}

// servingRows returns the demo rows as input cells and the plan compiled
// with compile, and checks before any timing that the plan and the
// hand-written function agree bit for bit.
func servingRows(b *testing.B, compile func(*pipeline.Fitted) (*pipeline.Plan, error)) (*pipeline.Plan, [][]tabprep.Cell, handConsts) {
	fitted, data := servingPipeline(b)
	plan, err := compile(fitted)
	if err != nil {
		b.Fatal(err)
	}
	if plan.OutputWidth() != 19 {
		b.Fatalf("output has %d columns, the hand-written function writes 19: %v", plan.OutputWidth(), plan.Output().Names())
	}
	k := handConstsOf(fitted)
	rows := make([][]tabprep.Cell, data.NumRows())
	got, want := make([]float64, 19), make([]float64, 19)
	for i := range rows {
		rows[i] = steptest.Row(data, i)
		if err := plan.ApplyFloats(got, rows[i]); err != nil {
			b.Fatal(err)
		}
		handWritten(want, rows[i], &k)
		for j := range got {
			if math.Float64bits(got[j]) != math.Float64bits(want[j]) {
				b.Fatalf("row %d column %s: plan %v, hand-written %v", i, plan.Output().Columns[j].Name, got[j], want[j])
			}
		}
	}
	return plan, rows, k
}

// generated compiles f with its generated source, as a latency-bound
// scoring service does.
func generated(f *pipeline.Fitted) (*pipeline.Plan, error) { return f.CompileWith(demoplan.Plan) }

// interpreted compiles f without generated source, as a service that loads
// state files it was not built with does.
var interpreted = (*pipeline.Fitted).Compile

// benchRows calls score on the demo rows in turn, one row per op.
func benchRows(b *testing.B, rows [][]tabprep.Cell, score func(row []tabprep.Cell) error) {
	b.ReportAllocs()
	i := 0
	for b.Loop() {
		if err := score(rows[i]); err != nil {
			b.Fatal(err)
		}
		i++
		if i == len(rows) {
			i = 0
		}
	}
}

// BenchmarkRowPlan runs the compiled plan one row per op, the way a
// scoring loop does: with a Runner, its register file of its own, and the
// plan compiled with its generated source (Fitted.CompileWith).
func BenchmarkRowPlan(b *testing.B) {
	plan, rows, _ := servingRows(b, generated)
	run := plan.Runner()
	dst := make([]float64, plan.OutputWidth())
	benchRows(b, rows, func(row []tabprep.Cell) error { return run.ApplyFloats(dst, row) })
}

// BenchmarkRowPlanInterpreted is BenchmarkRowPlan with the plan of
// Fitted.Compile alone, which walks its tables for every cell.
func BenchmarkRowPlanInterpreted(b *testing.B) {
	plan, rows, _ := servingRows(b, interpreted)
	run := plan.Runner()
	dst := make([]float64, plan.OutputWidth())
	benchRows(b, rows, func(row []tabprep.Cell) error { return run.ApplyFloats(dst, row) })
}

// BenchmarkRowPlanPooled is BenchmarkRowPlanInterpreted through
// Plan.ApplyFloats, which takes its registers from a pool on every row.
func BenchmarkRowPlanPooled(b *testing.B) {
	plan, rows, _ := servingRows(b, interpreted)
	dst := make([]float64, plan.OutputWidth())
	benchRows(b, rows, func(row []tabprep.Cell) error { return plan.ApplyFloats(dst, row) })
}

// BenchmarkRowHandWritten runs handWritten on the same rows.
func BenchmarkRowHandWritten(b *testing.B) {
	_, rows, k := servingRows(b, interpreted)
	dst := make([]float64, 19)
	benchRows(b, rows, func(row []tabprep.Cell) error { handWritten(dst, row, &k); return nil })
}

// BenchmarkPipelineFit fits mean imputation and z-score scaling on
// 1,000,000 rows × 20 numeric columns; run it with -cpu 1,2 to see the
// column-parallel fit.
func BenchmarkPipelineFit(b *testing.B) {
	const rows, cols = 1_000_000, 20
	rng := rand.New(rand.NewPCG(41, 42))
	columns := make([]*tabprep.Column, cols)
	for j := range columns {
		v := make([]float64, rows)
		for i := range v {
			v[i] = float64(j) + rng.NormFloat64()
			if i%50 == j {
				v[i] = math.NaN()
			}
		}
		columns[j] = tabprep.AdoptNumeric("x"+string(rune('a'+j)), v)
	}
	train := tabprep.MustFrame(columns...)
	p := pipeline.New(pipeline.Use(impute.Mean{}), pipeline.Use(scale.ZScore{}))
	// One untimed fit first, so that neither -cpu run is charged for
	// memory first taken from the operating system.
	if _, err := p.Fit(train); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.SetBytes(rows * cols * 8)
	b.ResetTimer()
	// A b.N loop, not b.Loop: with b.Loop the testing package measures the
	// first -cpu value in its discovery run, before it sets GOMAXPROCS, so
	// "-cpu 1,2" would time the 1-CPU case on every core.
	for i := 0; i < b.N; i++ {
		if _, err := p.Fit(train); err != nil {
			b.Fatal(err)
		}
	}
}
