package encode_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/pipeline"
)

func TestOrdinal(t *testing.T) {
	nan := math.NaN()
	tests := []struct {
		name string
		step encode.Ordinal
		// codes of the new clinic cells east, west (unseen), missing, north
		want []float64
	}{
		{"byte order", encode.Ordinal{Columns: tabprep.Names("clinic"), UnseenCode: encode.Code(-1), MissingCode: encode.Code(nan)},
			[]float64{0, -1, nan, 1}},
		{"given order", encode.Ordinal{Columns: tabprep.Names("clinic"), Order: map[string][]string{"clinic": {"south", "north", "east", "west"}}, UnseenCode: encode.Code(99), MissingCode: encode.Code(-1)},
			[]float64{2, 3, -1, 1}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			out := roundTrip(t, pipeline.Use(tt.step), clinicTrain(), clinicNew(t))
			require.Equal(t, []string{"clinic", "species", "days_ahead", "no_show"}, out.Names(), "replaced in place")
			got := column(t, out, "clinic")
			for i := range tt.want {
				require.Equal(t, math.Float64bits(tt.want[i]), math.Float64bits(got[i]), "row %d", i)
			}
		})
	}
}

func TestOrdinalErrors(t *testing.T) {
	train := clinicTrain()
	tests := []struct {
		name string
		step encode.Ordinal
		want error
		msg  string
	}{
		{"order misses a level", encode.Ordinal{Columns: tabprep.Names("clinic"), Order: map[string][]string{"clinic": {"north", "south"}}}, tabprep.ErrOption, `column "clinic": row 3: train level "east" is not in the given order`},
		{"order repeats", encode.Ordinal{Columns: tabprep.Names("clinic"), Order: map[string][]string{"clinic": {"north", "north"}}}, tabprep.ErrOption, `order lists "north" empty or twice`},
		{"order for unselected", encode.Ordinal{Columns: tabprep.Names("clinic"), Order: map[string][]string{"species": {"dog"}}}, tabprep.ErrOption, `column "species": has an order but is not selected`},
		{"numeric", encode.Ordinal{Columns: tabprep.Names("no_show")}, tabprep.ErrKind, `column "no_show"`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := tt.step.Fit(train)
			require.ErrorIs(t, err, tt.want)
			require.ErrorContains(t, err, tt.msg)
		})
	}
	s := encode.Ordinal{Columns: tabprep.Names("clinic")}
	p, err := s.Fit(train)
	require.NoError(t, err)
	_, err = s.Transform(p, clinicNew(t))
	require.ErrorIs(t, err, encode.ErrUnseen)
	require.ErrorContains(t, err, `column "clinic": row 1: level "west"`)
	s.UnseenCode = encode.Code(-1)
	_, err = s.Transform(p, clinicNew(t))
	require.ErrorIs(t, err, tabprep.ErrValue)
	require.ErrorContains(t, err, `column "clinic": row 2: missing cell and no MissingCode`)
}

func TestOrdinalRowKernel(t *testing.T) {
	p := requireKernel(t, encode.Ordinal{UnseenCode: encode.Code(-1), MissingCode: encode.Code(math.NaN())})
	data := clinicNew(t)
	fn, err := kernelOf(encode.Ordinal{}, p, data.Schema())
	require.NoError(t, err)
	require.ErrorIs(t, fn(rowCells(data, 1, nil)), encode.ErrUnseen)
	require.ErrorIs(t, fn(rowCells(data, 2, nil)), tabprep.ErrValue)
}
