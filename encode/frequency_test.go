package encode_test

import (
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/pipeline"
)

func TestFrequency(t *testing.T) {
	// Train clinic counts: north 3, south 2, east 2, missing 1, of 8 rows.
	// New cells: east, west (unseen), missing, north.
	tests := []struct {
		name string
		step encode.Frequency
		want []float64
	}{
		{"counts", encode.Frequency{Columns: tabprep.Names("clinic")}, []float64{2, 0, 1, 3}},
		{"shares", encode.Frequency{Columns: tabprep.Names("clinic"), Share: true}, []float64{0.25, 0, 0.125, 0.375}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			out := roundTrip(t, pipeline.Use(tt.step), clinicTrain(), clinicNew(t))
			require.Equal(t, []string{"clinic", "species", "days_ahead", "no_show"}, out.Names())
			require.Equal(t, tt.want, column(t, out, "clinic"))
		})
	}
	p, err := encode.Frequency{}.Fit(clinicTrain())
	require.NoError(t, err)
	require.Equal(t, []string{"clinic", "species"}, p.Outputs())
	_, err = encode.Frequency{Columns: tabprep.Names("no_show")}.Fit(clinicTrain())
	require.ErrorIs(t, err, tabprep.ErrKind)
	_, err = encode.Frequency{}.Transform(p, tabprep.MustFrame(tabprep.NewNumeric("clinic", []float64{1})))
	require.ErrorIs(t, err, tabprep.ErrKind)
	require.ErrorContains(t, err, `column "clinic": is numeric`)
}

func TestFrequencyRowKernel(t *testing.T) {
	for _, s := range []encode.Frequency{{}, {Share: true}} {
		requireKernel(t, s)
	}
}
