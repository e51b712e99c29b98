package pipeline_test

import (
	"bytes"
	"context"
	"errors"
	"io"
	"math/rand/v2"
	"runtime"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/pipeline"
)

func TestStreamMatchesBatch(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 32))
	fp, err := testPipeline().Fit(randomFrame(rng, 200))
	require.NoError(t, err)
	data := randomFrame(rng, 1000)
	data, err = data.Tag(tabprep.Holdout("test"), []int{500, 501})
	require.NoError(t, err)
	var in bytes.Buffer
	require.NoError(t, tabprep.WriteCSV(&in, data, nil))
	size := int64(in.Len())

	var out bytes.Buffer
	var calls []pipeline.Progress
	prog, err := fp.Stream(context.Background(), &in, &out, pipeline.StreamOptions{
		Read:     &tabprep.CSVOptions{ChunkRows: 128},
		Progress: func(p pipeline.Progress) { calls = append(calls, p) },
	})
	require.NoError(t, err)
	require.Equal(t, int64(1000), prog.Rows)
	require.Equal(t, size, prog.Bytes)
	require.Len(t, calls, 8) // ceil(1000/128)
	require.Equal(t, int64(128), calls[0].Rows)

	want, err := fp.Transform(data)
	require.NoError(t, err)
	got, err := tabprep.ReadCSV(&out, &tabprep.CSVOptions{Kinds: map[string]tabprep.Kind{"species": tabprep.Categorical}})
	require.NoError(t, err)
	require.True(t, tabprep.Equal(want, got), "streamed output must equal the batch transform, roles included")
}

func TestStreamCancel(t *testing.T) {
	rng := rand.New(rand.NewPCG(33, 34))
	fp, err := testPipeline().Fit(randomFrame(rng, 50))
	require.NoError(t, err)
	ctx, cancel := context.WithCancel(context.Background())
	var out bytes.Buffer
	prog, err := fp.Stream(ctx, newGenerator(1<<30), &out, pipeline.StreamOptions{
		Read: &tabprep.CSVOptions{ChunkRows: 1000},
		Progress: func(p pipeline.Progress) {
			if p.Rows >= 3000 {
				cancel()
			}
		},
	})
	require.True(t, errors.Is(err, context.Canceled))
	require.Equal(t, int64(3000), prog.Rows)
	require.Equal(t, 3001, strings.Count(out.String(), "\n"), "header and three whole chunks")
}

func TestStreamBadInput(t *testing.T) {
	fp, err := testPipeline().Fit(randomFrame(rand.New(rand.NewPCG(35, 36)), 50))
	require.NoError(t, err)
	_, err = fp.Stream(context.Background(), strings.NewReader("pet_age,species\n1,dog\nx,cat\n"), io.Discard, pipeline.StreamOptions{})
	require.ErrorIs(t, err, tabprep.ErrValue)
	require.EqualError(t, err, `tabprep.csv read: line 3: column "pet_age": "x" is not a number, but CSVOptions.Kinds makes the column numeric; fix the cell or make the column tabprep.Categorical`)
}

// generator is an io.Reader of CSV rows for the test pipeline, made on the
// fly, so a gigabyte can be streamed with no file on disk.
type generator struct {
	left int64
	buf  []byte
	row  int
}

func newGenerator(size int64) *generator {
	return &generator{left: size, buf: []byte("pet_age,species\n")}
}

func (g *generator) Read(p []byte) (int, error) {
	species := []string{"dog", "cat", "rabbit", "", "dog", "bird"}
	for len(g.buf) < len(p) && g.left > int64(len(g.buf)) {
		g.row++
		g.buf = strconv.AppendFloat(g.buf, float64(g.row%997)/7, 'f', 4, 64)
		g.buf = append(g.buf, ',')
		g.buf = append(g.buf, species[g.row%len(species)]...)
		g.buf = append(g.buf, '\n')
	}
	if len(g.buf) == 0 || g.left <= 0 {
		return 0, io.EOF
	}
	n := copy(p, g.buf)
	g.buf = g.buf[:copy(g.buf, g.buf[n:])]
	g.left -= int64(n)
	return n, nil
}

// TestStream1GB streams a gigabyte of generated CSV and checks that the heap
// in use stays below 128 MiB throughout: memory is bounded by the chunk,
// not the input.
func TestStream1GB(t *testing.T) {
	if testing.Short() {
		t.Skip("streams 1 GB; skipped under -short")
	}
	if raceEnabled {
		t.Skip("too slow under the race detector; CI runs it without -race")
	}
	fp, err := testPipeline().Fit(randomFrame(rand.New(rand.NewPCG(37, 38)), 100))
	require.NoError(t, err)
	const size = 1 << 30
	var peak uint64
	var ms runtime.MemStats
	prog, err := fp.Stream(context.Background(), newGenerator(size), io.Discard, pipeline.StreamOptions{
		Progress: func(p pipeline.Progress) {
			runtime.ReadMemStats(&ms)
			peak = max(peak, ms.HeapInuse)
		},
	})
	require.NoError(t, err)
	require.GreaterOrEqual(t, prog.Bytes, int64(size-64))
	t.Logf("streamed %d rows, %d bytes; peak heap in use %.1f MiB", prog.Rows, prog.Bytes, float64(peak)/(1<<20))
	require.Less(t, peak, uint64(128<<20))
}
