package state_test

import (
	"bytes"
	"flag"
	"math"
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/examples/quickstart/demodata"
	"github.com/tabprep/tabprep/impute"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/scale"
)

// createGolden writes the golden files of the current format version when
// they do not exist yet. A released golden file is never rewritten: every
// later version of the library must load it and give the same output.
var createGolden = flag.Bool("create-golden", false, "write missing golden state files")

// goldenPipeline uses many built-in step kinds, so that the golden file
// guards the spec and params format of each.
func goldenPipeline() *pipeline.Pipeline {
	unknown := "unknown"
	return pipeline.New(
		pipeline.Use(impute.Indicators{Columns: tabprep.Names("pet_age")}),
		pipeline.Use(impute.Mean{Columns: tabprep.Names("pet_age", "distance_km")}),
		pipeline.Use(impute.Constant{Columns: tabprep.Names("reminder"), Level: &unknown}),
		pipeline.Use(encode.Hash{Columns: tabprep.Names("clinic"), Buckets: 4, Seed: 11}),
		pipeline.Use(encode.OneHot{Columns: tabprep.Names("species"), MinCount: 20}),
		pipeline.Use(encode.Target{Columns: tabprep.Names("visit_type"), Target: "no_show", K: 5, F: 2, Folds: 4, Seed: 3}),
		pipeline.Use(encode.Frequency{Columns: tabprep.Names("reminder"), Share: true}),
		pipeline.Use(encode.ParseTime{Columns: tabprep.Names("booked_on"), Layout: time.DateOnly, Parts: []encode.TimePart{encode.PartWeekday, encode.PartMonth}}),
		pipeline.Use(scale.Log1p{Columns: tabprep.Names("days_ahead")}),
		pipeline.Use(scale.ZScore{Columns: tabprep.Names("days_ahead")}),
		pipeline.Use(scale.YeoJohnson{Columns: tabprep.Names("pet_age"), ZScore: true}),
		pipeline.Use(encode.Bin{Columns: tabprep.Names("distance_km"), Method: encode.BinQuantile, Bins: 4, Codes: true}),
		pipeline.Use(scale.MinMax{Columns: tabprep.Names("prior_no_shows")}),
	)
}

func TestGoldenV1(t *testing.T) {
	dir := filepath.Join("testdata", "v1")
	statePath := filepath.Join(dir, "vet-no-show.state.json")
	inPath := filepath.Join(dir, "vet-no-show.input.csv")
	outPath := filepath.Join(dir, "vet-no-show.output.csv")
	if *createGolden {
		writeGoldenOnce(t, statePath, inPath, outPath)
	}

	f, err := os.Open(statePath)
	require.NoError(t, err)
	defer f.Close()
	fitted, err := pipeline.Load(f)
	require.NoError(t, err, "a released golden state file must always load")
	inBytes, err := os.ReadFile(inPath)
	require.NoError(t, err)
	in, err := tabprep.ReadCSV(bytes.NewReader(inBytes), nil)
	require.NoError(t, err)
	got, err := fitted.Transform(in)
	require.NoError(t, err)
	wantBytes, err := os.ReadFile(outPath)
	require.NoError(t, err)
	want, err := tabprep.ReadCSV(bytes.NewReader(wantBytes), nil)
	require.NoError(t, err)
	require.True(t, tabprep.Equal(want, got), "the golden state must give the golden output, bit for bit")

	// The compiled plan agrees with the batch transform on the golden rows.
	plan, err := fitted.Compile()
	require.NoError(t, err)
	rows, err := fitted.Input().Conform("golden", in)
	require.NoError(t, err)
	dst := make([]float64, plan.OutputWidth())
	run := plan.Runner()
	for i := 0; i < in.NumRows(); i++ {
		require.NoError(t, run.ApplyFloats(dst, steptest.Row(rows, i)))
		for j, v := range dst {
			w := got.Col(j).Value(i)
			require.True(t, math.Float64bits(v) == math.Float64bits(w) || (v != v && w != w), "row %d column %s", i, got.Col(j).Name())
		}
	}
}

func writeGoldenOnce(t *testing.T, statePath, inPath, outPath string) {
	if _, err := os.Stat(statePath); err == nil {
		t.Logf("%s exists; golden files are never rewritten", statePath)
		return
	}
	all, err := tabprep.ReadCSV(bytes.NewReader(demodata.CSV), nil)
	require.NoError(t, err)
	train, err := all.Slice(0, 1500)
	require.NoError(t, err)
	fresh, err := all.Slice(1500, 1700)
	require.NoError(t, err)
	fitted, err := goldenPipeline().Fit(train)
	require.NoError(t, err)
	require.NoError(t, fitted.SaveFile(statePath))
	var in, out bytes.Buffer
	require.NoError(t, tabprep.WriteCSV(&in, fresh, nil))
	require.NoError(t, os.WriteFile(inPath, in.Bytes(), 0o644))
	res, err := fitted.Transform(fresh)
	require.NoError(t, err)
	require.NoError(t, tabprep.WriteCSV(&out, res, nil))
	require.NoError(t, os.WriteFile(outPath, out.Bytes(), 0o644))
}
