package sourcetest_test

import (
	"bytes"
	"math/rand/v2"
	"os"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/sourcetest"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
)

var plans = map[string]pipeline.Generated{
	"ImputeStats":     sourcetest.ImputeStats,
	"ImputeRules":     sourcetest.ImputeRules,
	"ImputeStructure": sourcetest.ImputeStructure,
	"OneHot":          sourcetest.OneHot,
	"Ordinal":         sourcetest.Ordinal,
	"Tables":          sourcetest.Tables,
	"HashAndBin":      sourcetest.HashAndBin,
	"Parse":           sourcetest.Parse,
	"Affine":          sourcetest.Affine,
	"Logs":            sourcetest.Logs,
	"RowNorms":        sourcetest.RowNorms,
	"Powers":          sourcetest.Powers,
	"ModelFills":      sourcetest.ModelFills,
	"Quantiles":       sourcetest.Quantiles,
}

// TestGeneratedMatchesInterpreted checks, for every case, that its file is
// what the generator writes today, and that the generated plan gives the
// interpreted plan's values bit for bit and its errors word for word on the
// test rows and on perturbed rows (gaps, infinities, unseen levels).
func TestGeneratedMatchesInterpreted(t *testing.T) {
	train, test, err := sourcetest.Data()
	require.NoError(t, err)
	require.Len(t, plans, len(sourcetest.Cases()))
	for i, c := range sourcetest.Cases() {
		t.Run(c.Name, func(t *testing.T) {
			g, ok := plans[c.Name]
			require.True(t, ok, "case %s has no entry in plans", c.Name)
			fitted, err := c.Fit(train)
			require.NoError(t, err)

			var b bytes.Buffer
			require.NoError(t, fitted.WriteGo(&b, pipeline.GoOptions{Package: "sourcetest", Name: c.Name}))
			onDisk, err := os.ReadFile(sourcetest.File(c))
			require.NoError(t, err)
			require.Equal(t, b.String(), string(onDisk), "%s is stale: run go generate in this directory", sourcetest.File(c))

			data, err := fitted.Input().Conform("test", test)
			require.NoError(t, err)
			rows := make([][]tabprep.Cell, 0, 3*data.NumRows())
			for r := range data.NumRows() {
				rows = append(rows, steptest.Row(data, r))
			}
			rows = append(rows, steptest.Perturbed(rand.New(rand.NewPCG(uint64(i), 70)), data, 2*data.NumRows())...)
			steptest.MatchGenerated(t, fitted, g, rows)
		})
	}
}
