package encode_test

import (
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/pipeline"
)

func TestOneHotLevelsAndNames(t *testing.T) {
	tests := []struct {
		name  string
		step  encode.OneHot
		names []string
		// clinic indicators of the new rows east, west (unseen), missing,
		// north, column by column in the order of names.
		want [][]float64
	}{
		{"defaults", encode.OneHot{Columns: tabprep.Names("clinic")},
			[]string{"clinic=east", "clinic=north", "clinic=south"},
			[][]float64{{1, 0, 0, 0}, {0, 0, 0, 1}, {0, 0, 0, 0}}},
		{"reference", encode.OneHot{Columns: tabprep.Names("clinic"), Reference: map[string]string{"clinic": "north"}},
			[]string{"clinic=east", "clinic=south"},
			[][]float64{{1, 0, 0, 0}, {0, 0, 0, 0}}},
		{"rare by count, unseen other, missing column", encode.OneHot{Columns: tabprep.Names("clinic"), MinCount: 3, Unseen: encode.UnseenOther, Missing: encode.MissingColumn},
			[]string{"clinic=north", "clinic#other", "clinic#missing"},
			[][]float64{{0, 0, 0, 1}, {1, 1, 0, 0}, {0, 0, 1, 0}}},
		{"rare by share", encode.OneHot{Columns: tabprep.Names("clinic"), MinShare: 0.3},
			[]string{"clinic=north", "clinic#other"},
			[][]float64{{0, 0, 0, 1}, {1, 0, 0, 0}}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := tt.step.Fit(clinicTrain())
			require.NoError(t, err)
			require.Equal(t, tt.names, p.Outputs())
			out := roundTrip(t, pipeline.Use(tt.step), clinicTrain(), clinicNew(t))
			require.False(t, out.Has("clinic"), "the source is replaced")
			require.Equal(t, append([]string{"species", "days_ahead", "no_show"}, tt.names...), out.Names())
			for j, name := range tt.names {
				require.Equal(t, tt.want[j], column(t, out, name), name)
			}
		})
	}
}

func TestOneHotErrors(t *testing.T) {
	train := clinicTrain()
	tests := []struct {
		name string
		step encode.OneHot
		want error
		msg  string
	}{
		{"unknown column", encode.OneHot{Columns: tabprep.Names("clinik")}, tabprep.ErrNoColumn, `column "clinik"`},
		{"numeric column", encode.OneHot{Columns: tabprep.Names("days_ahead")}, tabprep.ErrKind, `column "days_ahead": is numeric`},
		{"cap", encode.OneHot{Columns: tabprep.Names("clinic"), MaxLevels: 2}, encode.ErrTooManyLevels, `column "clinic": 3 output columns, over the cap of 2`},
		{"reference absent", encode.OneHot{Columns: tabprep.Names("clinic"), Reference: map[string]string{"clinic": "west"}}, tabprep.ErrOption, `reference level "west"`},
		{"bad policy", encode.OneHot{Unseen: "ignore"}, tabprep.ErrOption, `Unseen "ignore"`},
		{"bad share", encode.OneHot{MinShare: 1.5}, tabprep.ErrOption, `MinShare 1.5`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := tt.step.Fit(train)
			require.ErrorIs(t, err, tt.want)
			require.ErrorContains(t, err, tt.msg)
		})
	}
	t.Run("holdout rows", func(t *testing.T) {
		_, err := encode.OneHot{}.Fit(clinicNew(t))
		require.ErrorIs(t, err, tabprep.ErrHoldout)
	})
	t.Run("unseen is an error", func(t *testing.T) {
		s := encode.OneHot{Columns: tabprep.Names("clinic"), Unseen: encode.UnseenError}
		p, err := s.Fit(train)
		require.NoError(t, err)
		_, err = s.Transform(p, clinicNew(t))
		require.ErrorIs(t, err, encode.ErrUnseen)
		require.ErrorIs(t, err, tabprep.ErrValue)
		require.ErrorContains(t, err, `column "clinic": row 1: level "west" was not seen in training`)
	})
	t.Run("output clashes with a column", func(t *testing.T) {
		f := tabprep.MustFrame(
			tabprep.NewCategorical("clinic", []string{"north"}),
			tabprep.NewNumeric("clinic=north", []float64{1}),
		)
		s := encode.OneHot{Columns: tabprep.Names("clinic")}
		p, err := s.Fit(f)
		require.NoError(t, err)
		_, err = s.Transform(p, f)
		require.ErrorIs(t, err, tabprep.ErrName)
	})
}

func TestOneHotDoesNotModifyInput(t *testing.T) {
	train := clinicTrain()
	before := clinicTrain()
	s := encode.OneHot{Missing: encode.MissingColumn}
	p, err := s.Fit(train)
	require.NoError(t, err)
	out, err := s.Transform(p, train)
	require.NoError(t, err)
	require.True(t, tabprep.Equal(before, train))
	require.Equal(t, train.NumRows(), out.NumRows())
	// Every row has exactly one 1 per source column.
	for i := 0; i < out.NumRows(); i++ {
		sum := 0.0
		for _, name := range p.Outputs() {
			sum += column(t, out, name)[i]
		}
		require.Equal(t, 2.0, sum, "row %d", i)
	}
}

func TestOneHotRowKernel(t *testing.T) {
	for _, s := range []encode.OneHot{
		{},
		{Unseen: encode.UnseenOther, Missing: encode.MissingColumn, MinCount: 2, Reference: map[string]string{"species": "dog"}},
	} {
		requireKernel(t, s)
	}
	t.Run("errors", func(t *testing.T) {
		s := encode.OneHot{Columns: tabprep.Names("clinic"), Unseen: encode.UnseenError}
		p, err := s.Fit(clinicTrain())
		require.NoError(t, err)
		_, err = kernelOf(s, p, tabprep.Schema{Columns: []tabprep.Field{{Name: "clinic", Kind: tabprep.Numeric}}})
		require.ErrorIs(t, err, tabprep.ErrKind)
		_, err = kernelOf(s, p, tabprep.Schema{})
		require.ErrorIs(t, err, tabprep.ErrNoColumn)
		fn, err := kernelOf(s, p, clinicTrain().Schema())
		require.NoError(t, err)
		err = fn([]tabprep.Cell{{Str: "west"}, {Str: "dog"}, {Num: 1}, {Num: 0}})
		require.ErrorIs(t, err, encode.ErrUnseen)
	})
}
