package demodata

import (
	"bytes"
	"encoding/csv"
	"testing"

	"github.com/stretchr/testify/require"
)

// TestEmbeddedMatchesGenerator guards that appointments.csv is exactly what
// the seeded generator writes, so the data and its generator never drift.
// Run go generate in this directory after changing Generate.
func TestEmbeddedMatchesGenerator(t *testing.T) {
	var buf bytes.Buffer
	require.NoError(t, Generate(&buf, Seed, Rows))
	require.True(t, bytes.Equal(buf.Bytes(), CSV), "appointments.csv is stale: run go generate ./examples/quickstart/demodata")
}

func TestShape(t *testing.T) {
	recs, err := csv.NewReader(bytes.NewReader(CSV)).ReadAll()
	require.NoError(t, err)
	require.Equal(t, Header, recs[0])
	require.Len(t, recs, Rows+1)
	noShows := 0
	for _, r := range recs[1:] {
		if r[9] == "1" {
			noShows++
		}
	}
	// About one in eight, as the scenario says (common practice for such
	// data, no source: the generator is tuned to it).
	require.InDelta(t, 0.125, float64(noShows)/Rows, 0.02)
}
