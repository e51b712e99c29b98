package impute_test

import (
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/impute"
	"github.com/tabprep/tabprep/state"
	"gonum.org/v1/gonum/stat"
)

func TestStatisticContracts(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	unknown := "unknown"
	zero := state.Float(0)
	for range 5 {
		train := vetFrame(rng, 20+rng.IntN(100), 0.25)
		fresh := withHoldout(t, vetFrame(rng, 1+rng.IntN(60), 0.3))
		numeric := []string{"pet_age", "distance_km", "days_ahead"}
		requireNoGaps(t, checkContract(t, impute.Median{}, train, fresh, false), numeric...)
		requireNoGaps(t, checkContract(t, impute.Min{}, train, fresh, false), numeric...)
		requireNoGaps(t, checkContract(t, impute.Max{}, train, fresh, false), numeric...)
		requireNoGaps(t, checkContract(t, impute.MostFrequent{}, train, fresh, false), append(numeric, "species")...)
		requireNoGaps(t, checkContract(t, impute.Constant{Columns: tabprep.Names("species"), Level: &unknown}, train, fresh, false), "species")
		requireNoGaps(t, checkContract(t, impute.Constant{Columns: tabprep.Matching("d*"), Number: &zero}, train, fresh, false), "distance_km", "days_ahead")
		rules := impute.Fill{
			Numeric:     impute.Rule{Stat: impute.StatMedian},
			Categorical: impute.ConstantLevel("unknown"),
			Patterns:    []impute.PatternRule{{Pattern: "dist*", Rule: impute.Quantile(0.9, 6)}},
			Columns:     []impute.ColumnRule{{Name: "days_ahead", Rule: impute.Rule{Stat: impute.StatMax}}},
		}
		requireNoGaps(t, checkContract(t, rules, train, fresh, false), append(numeric, "species")...)
	}
}

func TestStatisticRowKernels(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 24))
	train := vetFrame(rng, 200, 0.2)
	fresh := vetFrame(rng, 50, 0.5)
	rules := impute.Fill{Numeric: impute.Rule{Stat: impute.StatMin}, Categorical: impute.ConstantLevel("unknown")}
	p, err := rules.Fit(train)
	require.NoError(t, err)
	checkRowKernel(t, rules.RowKernel, p, fresh, rules.Transform)
	l := tabprep.NewRowLayout(fresh.Schema())
	_, err = rules.RowKernel(p, l)
	require.NoError(t, err)
	out := l.Schema()
	require.Contains(t, out.Columns[out.Index("species")].Levels, "unknown")
	mf := impute.MostFrequent{}
	p, err = mf.Fit(train)
	require.NoError(t, err)
	checkRowKernel(t, mf.RowKernel, p, fresh, mf.Transform)
	md := impute.Median{}
	p, err = md.Fit(train)
	require.NoError(t, err)
	checkRowKernel(t, md.RowKernel, p, fresh, md.Transform)
}

func TestMedianAgainstGonum(t *testing.T) {
	// Reference: gonum stat.Quantile with stat.Empirical (a general-purpose
	// reference library; its Empirical is the inverse of the empirical CDF,
	// Hyndman & Fan type 1). For odd n the type-7 median is the middle order
	// statistic, which Empirical returns at p = 0.5; for even n it is the
	// mean of order statistics n/2 and n/2+1, which Empirical returns at
	// p = 0.5 and p = (n/2+0.5)/n.
	rng := rand.New(rand.NewPCG(31, 32))
	for range 100 {
		x, present := gappy(rng, 1+rng.IntN(1500), 0.15, func() float64 {
			if rng.IntN(4) == 0 {
				return float64(rng.IntN(3)) // ties
			}
			return rng.NormFloat64() * 10
		})
		p, err := impute.Median{}.Fit(tabprep.MustFrame(tabprep.NewNumeric("pet_age", x)))
		require.NoError(t, err)
		slices.Sort(present)
		m := len(present)
		want := stat.Quantile(0.5, stat.Empirical, present, nil)
		if m%2 == 0 {
			want = (want + stat.Quantile((float64(m/2)+0.5)/float64(m), stat.Empirical, present, nil)) / 2
		}
		require.InDelta(t, want, float64(p.Columns[0].Number), 1e-12, "n=%d", m)
	}
}

func TestQuantileDefinition(t *testing.T) {
	nistY := []float64{95.1772, 95.1567, 95.1937, 95.1959, 95.1442, 95.0610,
		95.1591, 95.1195, 95.1772, 95.0925, 95.1990, 95.1682}
	cases := []struct {
		name   string
		x      []float64
		rule   impute.Rule
		want   float64
		within float64
	}{
		// NIST/SEMATECH e-Handbook §7.2.5.2, percentile example: the 90th
		// percentile is reported as 95.1981 (type 6 gives 95.19807).
		{"NIST 90th type 6", nistY, impute.Quantile(0.9, 6), 95.1981, 5e-5},
		{"NIST 90th type 6 exact", nistY, impute.Quantile(0.9, 6), 95.19807, 5e-6},
		// Hyndman & Fan (1996) type 7 on the same data, h = 0.9·11 + 1 = 10.9:
		// x(10) + 0.9·(x(11) − x(10)) = 95.1937 + 0.9·0.0022 = 95.19568 (the
		// value the reference-data notes give for type 7).
		{"H&F type 7 on NIST data", nistY, impute.Quantile(0.9, 7), 95.19568, 1e-9},
		// Hyndman & Fan (1996) type 7: the 75th percentile of {1,2,3,4} is 3.25.
		{"H&F type 7 small", []float64{4, 1, nan, 3, 2}, impute.Quantile(0.75, 0), 3.25, 0},
		{"median even count is type 7", []float64{4, 1, nan, 3, 2}, impute.Rule{Stat: impute.StatMedian}, 2.5, 0},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			train := tabprep.MustFrame(tabprep.NewNumeric("distance_km", tc.x))
			p, err := impute.Fill{Numeric: tc.rule}.Fit(train)
			require.NoError(t, err)
			require.InDelta(t, tc.want, float64(p.Columns[0].Number), tc.within)
		})
	}
}

func TestStatisticValues(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("prior_no_shows", []float64{3, 1, nan, 3, 1, 2}),
		tabprep.NewCategorical("species", []string{"dog", "cat", "", "dog", "cat", "bird"}),
		tabprep.NewCategorical("clinic", []string{"south", "north", "north", "", "south", "north"}),
	)
	fit := func(s impute.Fill) impute.FillParams {
		p, err := s.Fit(train)
		require.NoError(t, err)
		return p
	}
	p := fit(impute.Fill{Numeric: impute.Rule{Stat: impute.StatMode}, Categorical: impute.Rule{Stat: impute.StatMode}})
	require.Equal(t, 1.0, float64(p.Columns[0].Number)) // 1 and 3 tie: smallest wins
	require.Equal(t, "cat", p.Columns[1].Level)         // cat and dog tie: byte order
	require.Equal(t, "north", p.Columns[2].Level)       // a clear winner
	require.Equal(t, 1.0, float64(fit(impute.Fill{Numeric: impute.Rule{Stat: impute.StatMin}}).Columns[0].Number))
	require.Equal(t, 3.0, float64(fit(impute.Fill{Numeric: impute.Rule{Stat: impute.StatMax}}).Columns[0].Number))
	require.Equal(t, 2.0, float64(fit(impute.Fill{Numeric: impute.Rule{Stat: impute.StatMean}}).Columns[0].Number))
	require.Equal(t, 2.0, float64(fit(impute.Fill{Numeric: impute.Rule{Stat: impute.StatMedian}}).Columns[0].Number))

	// A constant level new to the column is added to its levels.
	cp := fit(impute.Fill{Categorical: impute.ConstantLevel("unknown")})
	out, err := impute.Fill{}.Transform(cp, train)
	require.NoError(t, err)
	sp := column(t, out, "species")
	require.Equal(t, "unknown", sp.Level(2))
	require.Equal(t, []string{"dog", "cat", "bird", "unknown"}, sp.Levels())
	require.Equal(t, "south", column(t, out, "clinic").Level(0))
}

func TestFillPrecedence(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, nan, 5}),
		tabprep.NewNumeric("distance_km", []float64{2, 4, nan}),
		tabprep.NewNumeric("distance_home", []float64{nan, 10, 30}),
		tabprep.NewNumeric("days_ahead", []float64{nan, 7, 9}),
		tabprep.NewCategorical("species", []string{"dog", "", "dog"}),
		tabprep.NewCategorical("visit_type", []string{"", "vaccine", "check"}),
	)
	rules := impute.Fill{
		Numeric:     impute.Rule{Stat: impute.StatMean},
		Categorical: impute.ConstantLevel("unknown"),
		Patterns: []impute.PatternRule{
			{Pattern: "distance_*", Rule: impute.Rule{Stat: impute.StatMax}},
			{Pattern: "dist*", Rule: impute.Rule{Stat: impute.StatMin}}, // never reached: first match wins
		},
		Columns: []impute.ColumnRule{
			{Name: "distance_home", Rule: impute.Rule{Stat: impute.StatMin}},
			{Name: "days_ahead", Rule: impute.Rule{Stat: impute.StatKeep}},
			{Name: "species", Rule: impute.Rule{Stat: impute.StatMode}},
		},
	}
	p, err := rules.Fit(train)
	require.NoError(t, err)
	type decision struct {
		name, from string
		stat       impute.Stat
		num        float64
		level      string
	}
	var got []decision
	for _, c := range p.Columns {
		got = append(got, decision{c.Name, c.From, c.Stat, float64(c.Number), c.Level})
	}
	require.Equal(t, []decision{
		{"pet_age", "kind", impute.StatMean, 3, ""},
		{"distance_km", "pattern distance_*", impute.StatMax, 4, ""},
		{"distance_home", "name", impute.StatMin, 10, ""},
		{"days_ahead", "name", impute.StatKeep, 0, ""},
		{"species", "name", impute.StatMode, 0, "dog"},
		{"visit_type", "kind", impute.StatConstant, 0, "unknown"},
	}, got)
	out, err := rules.Transform(p, train)
	require.NoError(t, err)
	require.Equal(t, []float64{nan, 7, 9}[1:], column(t, out, "days_ahead").Float64s()[1:])
	require.Equal(t, 1, column(t, out, "days_ahead").MissingCount())
	require.Same(t, column(t, train, "days_ahead"), column(t, out, "days_ahead"))
}

func TestFillErrors(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewNumeric("pet_age", []float64{1, nan}),
		tabprep.NewNumeric("distance_km", []float64{nan, nan}),
		tabprep.NewCategorical("species", []string{"dog", ""}),
	)
	nanConst := state.Float(nan)
	cases := []struct {
		name     string
		step     impute.Fill
		sentinel error
		msg      string
	}{
		{"unknown column", impute.Fill{Columns: []impute.ColumnRule{{Name: "weight", Rule: impute.Rule{Stat: impute.StatMean}}}},
			tabprep.ErrNoColumn, `impute.fill fit: column "weight": has a rule but is not in the train frame; remove the rule or fix the name`},
		{"mean of categorical", impute.Fill{Columns: []impute.ColumnRule{{Name: "species", Rule: impute.Rule{Stat: impute.StatMean}}}},
			tabprep.ErrKind, `impute.fill fit: column "species": mean needs a numeric column, this one is categorical; use mode or constant`},
		{"median of categorical by kind", impute.Fill{Categorical: impute.Rule{Stat: impute.StatMedian}},
			tabprep.ErrKind, `impute.fill fit: column "species": median needs a numeric column, this one is categorical; use mode or constant`},
		{"number for categorical", impute.Fill{Categorical: impute.ConstantNumber(0)},
			tabprep.ErrKind, `impute.fill fit: column "species": constant number 0 given for a categorical column; give Level (impute.ConstantLevel)`},
		{"level for numeric", impute.Fill{Columns: []impute.ColumnRule{{Name: "pet_age", Rule: impute.ConstantLevel("old")}}},
			tabprep.ErrKind, `impute.fill fit: column "pet_age": constant level "old" given for a numeric column; give Number (impute.ConstantNumber)`},
		{"constant without value", impute.Fill{Columns: []impute.ColumnRule{{Name: "pet_age", Rule: impute.Rule{Stat: impute.StatConstant}}}},
			tabprep.ErrOption, `impute.fill fit: column "pet_age": constant rule without Number; use impute.ConstantNumber`},
		{"NaN constant", impute.Fill{Columns: []impute.ColumnRule{{Name: "pet_age", Rule: impute.Rule{Stat: impute.StatConstant, Number: &nanConst}}}},
			tabprep.ErrValue, `impute.fill fit: column "pet_age": constant NaN is not finite; a fill must be a number`},
		{"all missing", impute.Fill{Numeric: impute.Rule{Stat: impute.StatMedian}},
			tabprep.ErrAllMissing, `impute.fill fit: column "distance_km": no value in the 2 train rows to compute the median from; give this column a constant rule or drop it (impute.DropSparse)`},
		{"bad quantile", impute.Fill{Numeric: impute.Quantile(1.5, 7)},
			tabprep.ErrOption, `impute.fill fit: column "pet_age": quantile p = 1.5 outside [0, 1]`},
		{"bad method", impute.Fill{Numeric: impute.Quantile(0.5, 5)},
			tabprep.ErrOption, `impute.fill fit: column "pet_age": quantile method 5; use 7 (default) or 6`},
		{"unknown stat", impute.Fill{Numeric: impute.Rule{Stat: "average"}},
			tabprep.ErrOption, `impute.fill fit: column "pet_age": unknown stat "average"; use mean, median, quantile, min, max, mode, constant or keep`},
		{"bad pattern", impute.Fill{Patterns: []impute.PatternRule{{Pattern: "[", Rule: impute.Rule{Stat: impute.StatMin}}}},
			tabprep.ErrOption, `impute.fill fit: bad column pattern "[": syntax error in pattern`},
		{"name twice", impute.Fill{Columns: []impute.ColumnRule{{Name: "pet_age", Rule: impute.Rule{Stat: impute.StatMin}}, {Name: "pet_age", Rule: impute.Rule{Stat: impute.StatMax}}}},
			tabprep.ErrOption, `impute.fill fit: column "pet_age": has two rules by name; keep one`},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := tc.step.Fit(train)
			require.ErrorIs(t, err, tc.sentinel)
			require.EqualError(t, err, tc.msg)
		})
	}
	_, err := impute.Constant{Columns: tabprep.Names("species")}.Fit(train)
	require.EqualError(t, err, `impute.constant fit: column "species": constant rule without a non-empty Level; use impute.ConstantLevel("unknown")`)
	_, err = impute.MostFrequent{Columns: tabprep.Names("weight")}.Fit(train)
	require.EqualError(t, err, `impute.mostfrequent fit: column "weight": selected by name but not in the frame; it has ["pet_age" "distance_km" "species"]`)
}
