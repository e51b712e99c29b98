package impute_test

import (
	"encoding/json"
	"os"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/impute"
)

var penguinNumeric = []string{"Beak Length (mm)", "Beak Depth (mm)", "Flipper Length (mm)", "Body Mass (g)"}

// loadPenguins reads testdata/penguins.json (Palmer penguins, CC0; see
// testdata/penguins.SOURCE.md). JSON null is a gap; in Sex, "." is too.
func loadPenguins(t *testing.T) *tabprep.Frame {
	t.Helper()
	b, err := os.ReadFile("testdata/penguins.json")
	require.NoError(t, err)
	var rows []map[string]any
	require.NoError(t, json.Unmarshal(b, &rows))
	var cols []*tabprep.Column
	for _, name := range []string{"Species", "Island", "Sex"} {
		v := make([]string, len(rows))
		for i, r := range rows {
			if s, ok := r[name].(string); ok && s != "." {
				v[i] = s
			}
		}
		cols = append(cols, tabprep.NewCategorical(name, v))
	}
	for _, name := range penguinNumeric {
		v := make([]float64, len(rows))
		for i, r := range rows {
			v[i] = nan
			if x, ok := r[name].(float64); ok {
				v[i] = x
			}
		}
		cols = append(cols, tabprep.NewNumeric(name, v))
	}
	return tabprep.MustFrame(cols...)
}

func TestPenguinGaps(t *testing.T) {
	f := loadPenguins(t)
	require.Equal(t, 344, f.NumRows())
	// Gap counts as the palmerpenguins documentation states them (2 rows
	// without measurements, 11 penguins of unknown sex) and as a plain count
	// of the file gives (see testdata/penguins.SOURCE.md).
	want := map[string]int{"Species": 0, "Island": 0, "Sex": 11,
		"Beak Length (mm)": 2, "Beak Depth (mm)": 2, "Flipper Length (mm)": 2, "Body Mass (g)": 2}
	for name, n := range want {
		require.Equal(t, n, column(t, f, name).MissingCount(), name)
	}

	fill := impute.Fill{Numeric: impute.Rule{Stat: impute.StatMedian}, Categorical: impute.Rule{Stat: impute.StatMode}}
	out := checkContract(t, fill, f, f, false)
	requireNoGaps(t, out, out.Names()...)

	knn := checkContract(t, impute.KNearest{K: 5}, f, f, false)
	requireNoGaps(t, knn, penguinNumeric...)
	ch := checkContract(t, impute.Chained{Seed: 2}, f, f, false)
	requireNoGaps(t, ch, penguinNumeric...)
	// A row without any measurement shares no coordinate with a donor, so
	// KNearest gives it the train mean, as documented.
	mean, err := impute.Mean{}.Fit(f)
	require.NoError(t, err)
	gapRow := -1
	for i := range f.NumRows() {
		if column(t, f, "Body Mass (g)").IsMissing(i) {
			gapRow = i
			break
		}
	}
	require.Equal(t, float64(mean.Columns[0].Number), column(t, knn, penguinNumeric[0]).Value(gapRow))

	dr := impute.DropRows{}
	p, err := dr.Fit(f)
	require.NoError(t, err)
	// 333 complete rows: the palmerpenguins documentation's count of
	// complete cases (from memory), and 344 − 11, since both rows without
	// measurements also lack the sex.
	require.Equal(t, impute.DropReport{Rows: 344, Dropped: 11, Gaps: []int{0, 0, 11, 2, 2, 2, 2}}, p.Train)
	kept, err := dr.Transform(p, f)
	require.NoError(t, err)
	require.Equal(t, 333, kept.NumRows())
	requireNoGaps(t, kept, kept.Names()...)
}
