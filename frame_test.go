package tabprep_test

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
)

func demoFrame(t *testing.T) *tabprep.Frame {
	t.Helper()
	f, err := tabprep.NewFrame(
		tabprep.NewNumeric("age", []float64{3, math.NaN(), 7, 1}),
		tabprep.NewCategorical("species", []string{"cat", "dog", "", "cat"}),
	)
	require.NoError(t, err)
	return f
}

func TestNewFrameErrors(t *testing.T) {
	a := tabprep.NewNumeric("a", []float64{1, 2})
	tests := []struct {
		name string
		cols []*tabprep.Column
		want error
		msg  string
	}{
		{"duplicate", []*tabprep.Column{a, tabprep.NewNumeric("a", []float64{3, 4})}, tabprep.ErrName,
			`tabprep.frame: column "a": name used by columns 0 and 1; names must be distinct`},
		{"empty name", []*tabprep.Column{tabprep.NewNumeric("", nil)}, tabprep.ErrName,
			`tabprep.frame: column 0 has an empty name; give every column a name`},
		{"ragged", []*tabprep.Column{a, tabprep.NewNumeric("b", []float64{1})}, tabprep.ErrLength,
			`tabprep.frame: column "b": 1 rows, but column "a" has 2`},
		{"nil", []*tabprep.Column{nil}, tabprep.ErrName, `tabprep.frame: column 0 is nil`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := tabprep.NewFrame(tt.cols...)
			require.ErrorIs(t, err, tt.want)
			require.EqualError(t, err, tt.msg)
		})
	}
}

func TestRolesSurviveSelection(t *testing.T) {
	f := demoFrame(t)
	g, err := f.Tag(tabprep.Holdout("test"), []int{1, 3})
	require.NoError(t, err)
	require.Equal(t, 2, g.HoldoutCount())
	require.Equal(t, 0, f.HoldoutCount(), "Tag must not modify its receiver")
	tr := g.Train()
	require.Equal(t, 2, tr.NumRows())
	require.Equal(t, 0, tr.HoldoutCount())
	h := g.Select(tabprep.Holdout("test"))
	require.Equal(t, []float64{math.Float64frombits(math.Float64bits(math.NaN())), 1}[1], h.Col(0).Value(1))
	require.Equal(t, "cat", h.Col(1).Level(1))
	require.Equal(t, []string{"test"}, g.Partitions())
	err = tabprep.RequireTrain("x.fit", g)
	require.True(t, errors.Is(err, tabprep.ErrHoldout))
	require.EqualError(t, err, "x.fit: 2 of 4 rows are tagged holdout; fit only on train rows: pass frame.Train() (or frame.Select(tabprep.Train))")
}
