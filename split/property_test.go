package split_test

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/split"
)

// prior is the partition some generated frames already hold out, to check
// that a split leaves those rows alone.
const prior = "earlier"

// randomFrame returns n rows: a skewed categorical "species" of 1 to 6
// classes (with missing cells when withMissing), a numeric "pet_id" group,
// a numeric "days_ahead" with many ties, and a categorical "booked_on" of
// ISO dates with ties. Some frames have rows already tagged prior.
func randomFrame(r *rand.Rand, n int, withMissing bool) *tabprep.Frame {
	classes := 1 + r.IntN(6)
	names := []string{"dog", "cat", "rabbit", "bird", "ferret", "lizard"}
	species := make([]string, n)
	pet := make([]float64, n)
	days := make([]float64, n)
	booked := make([]string, n)
	pets := 1 + r.IntN(n)
	for i := range n {
		// Skewed: class c has weight 2^-c.
		c := 0
		for c < classes-1 && r.IntN(2) == 0 {
			c++
		}
		species[i] = names[c]
		if withMissing && r.IntN(10) == 0 {
			species[i] = ""
		}
		pet[i] = float64(r.IntN(pets))
		days[i] = float64(r.IntN(1 + n/3))
		booked[i] = fmt.Sprintf("2024-%02d-%02d", 1+r.IntN(12), 1+r.IntN(28))
	}
	f := tabprep.MustFrame(
		tabprep.NewCategorical("species", species),
		tabprep.NewNumeric("pet_id", pet),
		tabprep.NewNumeric("days_ahead", days),
		tabprep.NewCategorical("booked_on", booked),
	)
	if n > 4 && r.IntN(3) == 0 {
		var rows []int
		for i := range n {
			if r.IntN(5) == 0 {
				rows = append(rows, i)
			}
		}
		if len(rows) < n-3 {
			g, err := f.Tag(tabprep.Holdout(prior), rows)
			if err != nil {
				panic(err)
			}
			f = g
		}
	}
	return f
}

// checkCarried checks that out has f's columns (shared, not copied), that
// rows f held out keep their role, that every other row is train or in one
// of parts, and that the report counts agree. It returns the rows of each
// partition, train first.
func checkCarried(t *testing.T, f, out *tabprep.Frame, rep *split.Report, parts []string) [][]int {
	t.Helper()
	require.Equal(t, f.NumRows(), out.NumRows())
	require.Equal(t, f.NumCols(), out.NumCols())
	for i := range f.NumCols() {
		require.Same(t, f.Col(i), out.Col(i), "columns must be shared")
	}
	got := make([][]int, len(parts)+1)
	kept := 0
	for i := range f.NumRows() {
		if f.Role(i).Holdout {
			require.Equal(t, f.Role(i), out.Role(i), "row %d was holdout before the split", i)
			kept++
			continue
		}
		r := out.Role(i)
		if !r.Holdout {
			got[0] = append(got[0], i)
			continue
		}
		p := slices.Index(parts, r.Partition)
		require.GreaterOrEqual(t, p, 0, "row %d in unexpected partition %q", i, r.Partition)
		got[p+1] = append(got[p+1], i)
	}
	if rep != nil {
		require.Equal(t, kept, rep.Kept)
		require.Equal(t, f.NumRows()-kept, rep.Rows)
		require.Len(t, rep.Partitions, len(parts)+1)
		for p, c := range rep.Partitions {
			require.Equal(t, len(got[p]), c.Rows, "partition %s", c.Partition)
		}
	}
	return got
}

// classCounts counts rows per class code (missing last) of column in rows.
func classCounts(f *tabprep.Frame, column string, rows []int) map[string]int {
	c, _ := f.Column(column)
	m := map[string]int{}
	for _, i := range rows {
		m[c.Level(i)]++
	}
	return m
}

// checkShares checks that each class is within one row of its exact share
// in every partition (train first). A one-row class must be in train when
// oneInTrain is set (a two-way split); in folds it is held out by one fold.
//
// share[p] is the share of the rows partition p was asked for.
func checkShares(t *testing.T, f *tabprep.Frame, column string, got [][]int, share []float64, oneInTrain bool) {
	t.Helper()
	all := classCounts(f, column, slices.Concat(got...))
	for p, rows := range got {
		counts := classCounts(f, column, rows)
		for level, m := range all {
			if m == 1 && oneInTrain {
				if p == 0 {
					require.Equal(t, 1, counts[level], "one-row class %q must stay in train", level)
				}
				continue
			}
			exact := share[p] * float64(m)
			require.Less(t, math.Abs(float64(counts[level])-exact), 1.0+1e-9,
				"class %q in partition %d: %d rows, exact share %.3f", level, p, counts[level], exact)
		}
	}
}

func TestTwoWayProperties(t *testing.T) {
	r := rand.New(rand.NewPCG(11, 12))
	for trial := range 300 {
		n := 2 + r.IntN(300)
		f := randomFrame(r, n, r.IntN(2) == 0)
		free := n - f.HoldoutCount()
		stream := r.Uint64()
		frac := 0.05 + 0.9*r.Float64()
		t.Run(fmt.Sprint(trial), func(t *testing.T) {
			h := int(math.Round(frac * float64(free)))
			if h < 1 || h >= free {
				t.Skip("fraction rounds to an empty side; TestErrors covers it")
			}

			out, rep, err := split.Random{Fraction: frac, Seed: stream}.Apply(f)
			require.NoError(t, err)
			got := checkCarried(t, f, out, rep, []string{"holdout"})
			require.Len(t, got[1], h)

			out, rep, err = split.Stratified{Column: "species", Fraction: frac, Seed: stream, MissingAsClass: true}.Apply(f)
			require.NoError(t, err)
			got = checkCarried(t, f, out, rep, []string{"holdout"})
			q := float64(h) / float64(free)
			checkShares(t, f, "species", got, []float64{1 - q, q}, true)
			// The holdout is exactly the size asked unless one-row classes
			// had to stay in train.
			require.LessOrEqual(t, len(got[1]), h)

			out, rep, err = split.Ordered{Column: "days_ahead", Fraction: frac}.Apply(f)
			if err == nil {
				got = checkCarried(t, f, out, rep, []string{"holdout"})
				days := f.Col(1 + 1).Float64s()
				maxTrain, minHold := math.Inf(-1), math.Inf(1)
				for _, i := range got[0] {
					maxTrain = max(maxTrain, days[i])
				}
				for _, i := range got[1] {
					minHold = min(minHold, days[i])
				}
				require.Less(t, maxTrain, minHold, "a train row is not earlier than every holdout row")
			} else {
				require.ErrorIs(t, err, split.ErrTooFew, "only ties may stop an ordered split")
			}

			every := 2 + r.IntN(free-1)
			offset := r.IntN(every)
			out, rep, err = split.Systematic{Every: every, Offset: offset}.Apply(f)
			require.NoError(t, err)
			got = checkCarried(t, f, out, rep, []string{"holdout"})
			require.Len(t, got[1], (free-offset+every-1)/every)

			out, rep, err = split.KeyHash{Column: "pet_id", Fraction: frac, Salt: "s"}.Apply(f)
			if err == nil {
				got = checkCarried(t, f, out, rep, []string{"holdout"})
				pets := f.Col(1).Float64s()
				side := map[float64]bool{}
				for p, rows := range got {
					for _, i := range rows {
						if s, ok := side[pets[i]]; ok {
							require.Equal(t, s, p == 1, "pet %v on both sides", pets[i])
						}
						side[pets[i]] = p == 1
						require.Equal(t, split.KeyShare("s", fmt.Sprint(pets[i])) < frac, p == 1)
					}
				}
			} else {
				require.ErrorIs(t, err, split.ErrTooFew, "only a one-sided hash may stop a key split")
			}
		})
	}
}

func TestThreeWayProperties(t *testing.T) {
	r := rand.New(rand.NewPCG(21, 22))
	parts := []string{split.Validation, split.Test}
	for trial := range 200 {
		n := 10 + r.IntN(300)
		f := randomFrame(r, n, false)
		v, te := 0.05+0.4*r.Float64(), 0.05+0.4*r.Float64()
		stream := r.Uint64()
		t.Run(fmt.Sprint(trial), func(t *testing.T) {
			out, rep, err := split.ThreeWay{By: split.Stratified{Column: "species", Seed: stream}, Validation: v, Test: te}.Apply(f)
			if err != nil {
				require.ErrorIs(t, err, split.ErrTooFew)
				return
			}
			got := checkCarried(t, f, out, rep, parts)
			free := n - f.HoldoutCount()
			qv := math.Round(v*float64(free)) / float64(free)
			qt := math.Round(te*float64(free)) / float64(free)
			checkShares(t, f, "species", got, []float64{1 - qv - qt, qv, qt}, true)

			out, rep, err = split.ThreeWay{By: split.Random{Seed: stream}, Validation: v, Test: te}.Apply(f)
			require.NoError(t, err)
			got = checkCarried(t, f, out, rep, parts)
			require.Len(t, got[1], int(math.Round(v*float64(free))))
			require.Len(t, got[2], int(math.Round(te*float64(free))))

			out, rep, err = split.ThreeWay{By: split.Ordered{Column: "booked_on"}, Validation: v, Test: te}.Apply(f)
			if err != nil {
				require.ErrorIs(t, err, split.ErrTooFew)
				return
			}
			got = checkCarried(t, f, out, rep, parts)
			booked := f.Col(3)
			for a := 1; a < len(got); a++ {
				latest := ""
				for _, i := range got[a-1] {
					latest = max(latest, booked.Level(i))
				}
				for _, i := range got[a] {
					if booked.Level(i) <= latest {
						require.Failf(t, "out of order", "partition %d row %d (%s) not after partition %d's latest %s", a, i, booked.Level(i), a-1, latest)
					}
				}
			}
		})
	}
}

// checkFolds ranges over folds twice, checks each fold's frame and that the
// holdout blocks cover every free row once, and returns the holdout rows and
// train rows of each fold.
func checkFolds(t *testing.T, f *tabprep.Frame, folds func(func(int, split.Fold) bool), k int, extra ...string) (hold, train [][]int) {
	t.Helper()
	seen := make([]int, f.NumRows())
	for i, fold := range folds {
		require.Equal(t, len(hold), i)
		got := checkCarried(t, f, fold.Frame, fold.Report, append([]string{"holdout"}, extra...))
		require.NotEmpty(t, got[0], "fold %d has no train rows", i)
		require.NotEmpty(t, got[1], "fold %d holds out nothing", i)
		for _, r := range got[1] {
			seen[r]++
		}
		hold = append(hold, got[1])
		train = append(train, got[0])
	}
	require.Len(t, hold, k)
	again := 0
	for i, fold := range folds {
		require.Equal(t, hold[i], heldOut(fold.Frame, "holdout"), "a second pass must give the same folds")
		again++
	}
	require.Equal(t, k, again)
	if len(extra) == 0 {
		for r, c := range seen {
			want := 1
			if f.Role(r).Holdout {
				want = 0
			}
			require.Equal(t, want, c, "row %d held out by %d folds", r, c)
		}
	}
	return hold, train
}

func TestFoldProperties(t *testing.T) {
	r := rand.New(rand.NewPCG(31, 32))
	for trial := range 150 {
		n := 4 + r.IntN(200)
		f := randomFrame(r, n, false)
		free := n - f.HoldoutCount()
		k := 2 + r.IntN(min(free-1, 9))
		stream := r.Uint64()
		t.Run(fmt.Sprint(trial), func(t *testing.T) {
			folds, err := split.RandomFolds{K: k, Seed: stream}.Folds(f)
			require.NoError(t, err)
			hold, _ := checkFolds(t, f, folds, k)
			for _, h := range hold {
				require.InDelta(t, float64(free)/float64(k), float64(len(h)), 1)
			}

			folds, err = split.StratifiedFolds{Column: "species", K: k, Seed: stream}.Folds(f)
			require.NoError(t, err)
			hold, train := checkFolds(t, f, folds, k)
			for i := range hold {
				checkShares(t, f, "species", [][]int{train[i], hold[i]}, []float64{1 - 1/float64(k), 1 / float64(k)}, false)
			}

			folds, err = split.GroupFolds{Column: "pet_id", K: k, Seed: stream}.Folds(f)
			if err != nil {
				require.ErrorIs(t, err, split.ErrTooFew)
			} else {
				hold, train = checkFolds(t, f, folds, k)
				pets := f.Col(1).Float64s()
				for i := range hold {
					in := map[float64]bool{}
					for _, r := range hold[i] {
						in[pets[r]] = true
					}
					for _, r := range train[i] {
						require.False(t, in[pets[r]], "fold %d: pet %v on both sides", i, pets[r])
					}
				}
			}

			ts := split.TimeFolds{K: k, Column: "days_ahead", Buffer: r.IntN(3), Window: r.IntN(2) * (1 + r.IntN(n))}
			folds, err = ts.Folds(f)
			if err != nil {
				require.ErrorIs(t, err, split.ErrTooFew)
				return
			}
			hold, train = checkFolds(t, f, folds, k, split.Unused)
			days := f.Col(2).Float64s()
			for i := range hold {
				maxTrain := math.Inf(-1)
				for _, r := range train[i] {
					maxTrain = max(maxTrain, days[r])
				}
				for _, r := range hold[i] {
					require.Less(t, maxTrain, days[r], "fold %d trains on a row not earlier than its holdout", i)
				}
				if ts.Window > 0 {
					require.LessOrEqual(t, len(train[i]), ts.Window)
				}
				if i > 0 {
					require.Less(t, slices.Max(pick(days, hold[i-1])), slices.Min(pick(days, hold[i])), "holdout blocks out of order")
				}
			}
		})
	}
}

func pick(v []float64, rows []int) []float64 {
	out := make([]float64, len(rows))
	for j, i := range rows {
		out[j] = v[i]
	}
	return out
}

// TestKeyHashStable checks that a key keeps its side when the rows are
// reordered and when new rows are added.
func TestKeyHashStable(t *testing.T) {
	r := rand.New(rand.NewPCG(41, 42))
	f := randomFrame(r, 500, false).Train()
	s := split.KeyHash{Column: "pet_id", Fraction: 0.3, Salt: "clinic-2024"}
	out, _, err := s.Apply(f)
	require.NoError(t, err)
	side := map[float64]bool{}
	pets := f.Col(1).Float64s()
	for i := range f.NumRows() {
		side[pets[i]] = out.Role(i).Holdout
	}
	perm := r.Perm(f.NumRows())
	g, err := f.Take(perm)
	require.NoError(t, err)
	grown, err := tabprep.Concat(g, randomFrame(r, 300, false).Train())
	require.NoError(t, err)
	out, _, err = s.Apply(grown)
	require.NoError(t, err)
	gp := grown.Col(1).Float64s()
	for i := range grown.NumRows() {
		if want, ok := side[gp[i]]; ok {
			require.Equal(t, want, out.Role(i).Holdout, "pet %v changed side", gp[i])
		}
	}
}

// TestNested checks that a second split divides only the rows the first
// left in train.
func TestNested(t *testing.T) {
	f := clinicFrame()
	a, _, err := split.Ordered{Column: "booked_on", Rows: 3, Partition: split.Test}.Apply(f)
	require.NoError(t, err)
	b, rep, err := split.Random{Rows: 2, Partition: split.Validation, Seed: 1}.Apply(a)
	require.NoError(t, err)
	require.Equal(t, 3, rep.Kept)
	require.Equal(t, 9, rep.Rows)
	require.Equal(t, heldOut(a, split.Test), heldOut(b, split.Test))
	require.Len(t, heldOut(b, split.Validation), 2)
	require.Equal(t, 7, b.Train().NumRows())
	// The tags do what they are for: a fit refuses the split frame and
	// accepts its train rows.
	require.ErrorIs(t, tabprep.RequireTrain("x.fit", b), tabprep.ErrHoldout)
	require.NoError(t, tabprep.RequireTrain("x.fit", b.Train()))

	_, _, err = split.Random{Rows: 2, Partition: split.Test}.Apply(a)
	require.ErrorIs(t, err, tabprep.ErrRole, "a partition name already in use must be refused")
}
