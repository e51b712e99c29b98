package encode_test

import (
	"sync"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/pipeline"
)

// TestStepsKeepInvariants: for every step, Transform leaves its input
// unchanged, keeps the row count and roles, and gives the same result from
// several goroutines at once.
func TestStepsKeepInvariants(t *testing.T) {
	stages := map[string]pipeline.Stage{
		"onehot":    pipeline.Use(encode.OneHot{Missing: encode.MissingColumn, Unseen: encode.UnseenOther}),
		"ordinal":   pipeline.Use(encode.Ordinal{UnseenCode: encode.Code(-1), MissingCode: encode.Code(-2)}),
		"frequency": pipeline.Use(encode.Frequency{Share: true}),
		"target":    pipeline.Use(encode.Target{Columns: tabprep.Names("clinic", "species"), Target: "no_show", Folds: 2}),
		"hash":      pipeline.Use(encode.Hash{Buckets: 4}),
		"bin":       pipeline.Use(encode.Bin{Bins: 3}),
	}
	for name, stage := range stages {
		t.Run(name, func(t *testing.T) {
			fitted, err := pipeline.New(stage).Fit(clinicTrain())
			require.NoError(t, err)
			data := clinicNew(t)
			want, err := fitted.Transform(data)
			require.NoError(t, err)
			require.True(t, tabprep.Equal(clinicNew(t), data), "input modified")
			require.Equal(t, data.NumRows(), want.NumRows())
			require.Equal(t, data.Roles(), want.Roles())
			var wg sync.WaitGroup
			for range 4 {
				wg.Go(func() {
					got, err := fitted.Transform(data)
					if assert.NoError(t, err) {
						assert.True(t, tabprep.Equal(want, got), "concurrent transform differs")
					}
				})
			}
			wg.Wait()
		})
	}
}
