package scale_test

import (
	"errors"
	"math"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"
	"gonum.org/v1/gonum/stat"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/scale"
)

func col(name string, v ...float64) *tabprep.Frame {
	return tabprep.MustFrame(tabprep.NewNumeric(name, v))
}

// values returns a function that requires a transform to succeed and
// returns its first column.
func values(t *testing.T) func(*tabprep.Frame, error) []float64 {
	return func(f *tabprep.Frame, err error) []float64 {
		t.Helper()
		require.NoError(t, err)
		return f.Col(0).Float64s()
	}
}

func TestDecimalScalingTextbook(t *testing.T) {
	// Han, Kamber & Pei, Data Mining: Concepts and Techniques (3rd ed.),
	// §3.5.2: values from −986 to 917 are divided by 10³, so −986 → −0.986
	// and 917 → 0.917.
	train := col("cost", -986, 12, nan, 917)
	p, err := scale.DecimalScaling{}.Fit(train)
	require.NoError(t, err)
	require.Equal(t, []int{3}, p.Exponent)
	got := values(t)(scale.DecimalScaling{}.Transform(p, train))
	require.Equal(t, -0.986, got[0])
	require.Equal(t, 0.917, got[3])
	require.True(t, math.IsNaN(got[2]))
	// The exponent is frozen: a new value keeps the train scale.
	require.Equal(t, []float64{1.5}, values(t)(scale.DecimalScaling{}.Transform(p, col("cost", 1500))))
	// The definition, at its edges (arithmetic from it): 1000/10³ = 1 is not
	// inside (−1, 1), so j = 4; 0.05 needs j = −1; zeros keep j = 0.
	for _, tc := range []struct {
		max  float64
		want int
	}{{1000, 4}, {999.9, 3}, {1, 1}, {0.99, 0}, {0.1, 0}, {0.05, -1}, {0, 0}, {1e-300, -299}} {
		p, err := scale.DecimalScaling{}.Fit(col("x", -tc.max/2, tc.max))
		require.NoError(t, err)
		require.Equal(t, tc.want, p.Exponent[0], "max %v", tc.max)
	}
}

func TestMinMaxTextbook(t *testing.T) {
	// Han, Kamber & Pei (3rd ed.) §3.5.2: min 12,000 and max 98,000 mapped
	// to [0, 1] take 73,600 to 0.716.
	train := col("income", 12000, 98000, 73600, nan)
	p, err := scale.MinMax{}.Fit(train)
	require.NoError(t, err)
	got := values(t)(scale.MinMax{}.Transform(p, train))
	require.Equal(t, []float64{0, 1}, got[:2])
	require.InDelta(t, 0.716, got[2], 5e-4)
	require.InDelta(t, 61600.0/86000, got[2], 1e-15)
	require.True(t, math.IsNaN(got[3]))
}

func TestMinMaxRangeAndClip(t *testing.T) {
	train := col("days_ahead", 2, 4, 12)
	s := scale.MinMax{Low: -1, High: 1}
	p, err := s.Fit(train)
	require.NoError(t, err)
	require.Equal(t, []float64{-1, -0.6, 1, 3}, values(t)(s.Transform(p, col("days_ahead", 2, 4, 12, 22))))
	s.Clamp = true
	p, err = s.Fit(train)
	require.NoError(t, err)
	require.Equal(t, []float64{-1, 1, 1}, values(t)(s.Transform(p, col("days_ahead", -30, 12, 22))))
	// Documented: a constant column maps to the midpoint of the target.
	p, err = scale.MinMax{Low: 2, High: 4}.Fit(col("c", 7, 7, nan))
	require.NoError(t, err)
	require.Equal(t, []float64{3, 4}, values(t)(scale.MinMax{}.Transform(p, col("c", 7, 8))))
}

func TestRobustQuantiles(t *testing.T) {
	// Hyndman & Fan (1996) type 7: for {1, 2, 3, 4} the 75th percentile is
	// 3.25, the 25th 1.75 and the median 2.5.
	p, err := scale.Robust{}.Fit(col("x", 4, nan, 1, 3, 2))
	require.NoError(t, err)
	require.Equal(t, []float64{2.5}, []float64(p.Median))
	require.Equal(t, []float64{1.75}, []float64(p.Lower))
	require.Equal(t, []float64{3.25}, []float64(p.Upper))
	require.Equal(t, []float64{-1, 0, 1}, values(t)(scale.Robust{}.Transform(p, col("x", 1, 2.5, 4))))
	// NIST/SEMATECH e-Handbook §7.2.5.2 percentile data: type 7 gives
	// 95.19568 for the 90th percentile (type 6, the handbook's own, 95.1981).
	nist := []float64{95.1772, 95.1567, 95.1937, 95.1959, 95.1442, 95.0610,
		95.1591, 95.1195, 95.1772, 95.0925, 95.1990, 95.1682}
	p, err = scale.Robust{Low: 0.1, High: 0.9}.Fit(col("y", nist...))
	require.NoError(t, err)
	require.InDelta(t, 95.19568, p.Upper[0], 5e-6)
	// gonum stat.Quantile as reference library: its Empirical kind is
	// Hyndman & Fan type 1, which agrees with type 7 at p = k/(n−1) for
	// 1 ≤ k ≤ n−1 (both give the (k+1)-th order statistic), and at the
	// median of an odd count.
	// With n = 401 values, (n−1)·0.25 and (n−1)·0.75 are whole, so the
	// quartiles are order statistics as well.
	ages := present(clinicFrame(t, 480, 21, false).Col(2).Float64s())[:401]
	sorted := slices.Sorted(slices.Values(ages))
	lo, hi := 0.25, 0.75
	p, err = scale.Robust{}.Fit(col("a", ages...))
	require.NoError(t, err)
	require.Equal(t, stat.Quantile(0.5, stat.Empirical, sorted, nil), p.Median[0])
	require.Equal(t, stat.Quantile(lo, stat.Empirical, sorted, nil), p.Lower[0])
	require.Equal(t, stat.Quantile(hi, stat.Empirical, sorted, nil), p.Upper[0])
	// Documented: zero inter-quantile range shifts by the median only.
	p, err = scale.Robust{}.Fit(col("z", 5, 5, 5, 5, 9))
	require.NoError(t, err)
	require.Equal(t, []float64{0, 4}, values(t)(scale.Robust{}.Transform(p, col("z", 5, 9))))
}

func present(x []float64) []float64 {
	return slices.DeleteFunc(slices.Clone(x), func(v float64) bool { return v != v })
}

func TestMaxAbs(t *testing.T) {
	p, err := scale.MaxAbs{}.Fit(col("change", -8, 2, nan, 4))
	require.NoError(t, err)
	require.Equal(t, []float64{8}, []float64(p.MaxAbs))
	require.Equal(t, []float64{-1, 0.25, 2}, values(t)(scale.MaxAbs{}.Transform(p, col("change", -8, 2, 16))))
	p, err = scale.MaxAbs{}.Fit(col("zeros", 0, 0))
	require.NoError(t, err)
	require.Equal(t, []float64{0, 3}, values(t)(scale.MaxAbs{}.Transform(p, col("zeros", 0, 3))))
}

func TestRowNorm(t *testing.T) {
	f := tabprep.MustFrame(
		tabprep.NewNumeric("a", []float64{3, 0, 1, nan, 1e300}),
		tabprep.NewNumeric("b", []float64{-4, 0, nan, nan, 1e300}),
		tabprep.NewCategorical("species", []string{"dog", "cat", "dog", "cat", "dog"}),
	)
	for _, tc := range []struct {
		norm string
		a, b []float64
	}{
		// Arithmetic from the definitions; the last row would overflow an
		// unscaled L2 norm.
		{scale.NormL2, []float64{0.6, 0, 1, nan, 1 / math.Sqrt2}, []float64{-0.8, 0, nan, nan, 1 / math.Sqrt2}},
		{scale.NormL1, []float64{3.0 / 7, 0, 1, nan, 0.5}, []float64{-4.0 / 7, 0, nan, nan, 0.5}},
		{scale.NormMax, []float64{0.75, 0, 1, nan, 1}, []float64{-1, 0, nan, nan, 1}},
	} {
		s := scale.RowNorm{Norm: tc.norm}
		p, err := s.Fit(f)
		require.NoError(t, err)
		out, err := s.Transform(p, f)
		require.NoError(t, err)
		for j, want := range [][]float64{tc.a, tc.b} {
			got := out.Col(j).Float64s()
			for i := range want {
				if math.IsNaN(want[i]) {
					require.True(t, math.IsNaN(got[i]))
				} else {
					require.InDelta(t, want[i], got[i], 1e-15, "%s col %d row %d", tc.norm, j, i)
				}
			}
		}
	}
}

func TestLogDomain(t *testing.T) {
	train := col("distance_km", 1, math.E, nan)
	p, err := scale.Log{}.Fit(train)
	require.NoError(t, err)
	require.Equal(t, []float64{0, 1}, values(t)(scale.Log{}.Transform(p, train))[:2])
	// A new value out of the domain: an error naming column, row, value.
	_, err = scale.Log{}.Transform(p, col("distance_km", 2, 0))
	require.EqualError(t, err, `scale.log transform: column "distance_km": row 1: value 0 is outside the domain (log needs x > 0); correct or remove it, or set OutOfDomain to scale.DomainMissing to make such cells missing`)
	require.ErrorIs(t, err, tabprep.ErrValue)
	// With DomainMissing it becomes a missing cell, in batch and row form.
	lenient := scale.Log{OutOfDomain: scale.DomainMissing}
	p, err = lenient.Fit(col("distance_km", 1, -1))
	require.NoError(t, err)
	got := values(t)(lenient.Transform(p, col("distance_km", -3, 1)))
	require.True(t, math.IsNaN(got[0]))
	require.Equal(t, 0.0, got[1])
	// Log1p takes zero, and is exact near it.
	p, err = scale.Log1p{}.Fit(col("prior_no_shows", 0, 3, 1e-17))
	require.NoError(t, err)
	require.Equal(t, []float64{0, math.Log(4), 1e-17}, values(t)(scale.Log1p{}.Transform(p, col("prior_no_shows", 0, 3, 1e-17))))
	// The inverse reports overflow by the same rule.
	_, err = scale.Log{}.Inverse(scale.LogParams{Columns: []string{"d"}}, col("d", 1, 800))
	require.EqualError(t, err, `scale.log inverse: column "d": row 1: value 800 is outside the domain (exp overflows above 709.78); correct or remove it, or set OutOfDomain to scale.DomainMissing to make such cells missing`)
}

func TestPowerTransforms(t *testing.T) {
	// λ = 0 of Box-Cox is the logarithm, λ = 1 a shift by one (Box & Cox
	// 1964, definition): check the formula through fixed parameters.
	p := scale.PowerParams{Columns: []string{"x"}, Lambda: []float64{0}}
	require.Equal(t, []float64{0, 1}, values(t)(scale.BoxCox{}.Transform(p, col("x", 1, math.E))))
	p.Lambda[0] = 1
	require.Equal(t, []float64{1}, values(t)(scale.BoxCox{}.Transform(p, col("x", 2))))
	// Yeo & Johnson (2000), definition: λ = 1 is the identity, for either
	// sign; λ = 0 is log1p for x ≥ 0; λ = 2 is −log1p(−x) for x < 0.
	p.Lambda[0] = 1
	require.Equal(t, []float64{-3, 0, 2.5}, values(t)(scale.YeoJohnson{}.Transform(p, col("x", -3, 0, 2.5))))
	p.Lambda[0] = 0
	require.Equal(t, []float64{math.Log1p(2)}, values(t)(scale.YeoJohnson{}.Transform(p, col("x", 2))))
	p.Lambda[0] = 2
	require.Equal(t, []float64{-math.Log1p(2)}, values(t)(scale.YeoJohnson{}.Transform(p, col("x", -2))))

	// ZScore: the transformed train values have mean 0 and std 1.
	train := col("radiation", microwave...)
	q, err := scale.BoxCox{ZScore: true}.Fit(train)
	require.NoError(t, err)
	z, err := scale.BoxCox{}.Transform(q, train)
	require.NoError(t, err)
	zp, err := scale.ZScore{}.Fit(z)
	require.NoError(t, err)
	require.InDelta(t, 0, zp.Mean[0], 1e-14)
	require.InDelta(t, 1, zp.Std[0], 1e-14)
	// Documented: a constant column gets λ = 1.
	q, err = scale.YeoJohnson{}.Fit(col("c", 4, 4, nan))
	require.NoError(t, err)
	require.Equal(t, []float64{1}, []float64(q.Lambda))
	// Box-Cox with DomainMissing fits on the positive values only.
	lenient := scale.BoxCox{OutOfDomain: scale.DomainMissing}
	q, err = lenient.Fit(col("radiation", append([]float64{0, -1}, microwave...)...))
	require.NoError(t, err)
	require.InDelta(t, 0.27594, q.Lambda[0], 5e-5) // NIST e-Handbook §6.5.2 data, as above
	got := values(t)(lenient.Transform(q, col("radiation", 0, 0.1)))
	require.True(t, math.IsNaN(got[0]))
	require.False(t, math.IsNaN(got[1]))
}

func TestQuantileTransform(t *testing.T) {
	// Hyndman & Fan (1996) type 7 quantiles at p = k/(m−1); with m = 5 on
	// 1…9 they are 1, 3, 5, 7, 9, so 4 maps to 0.375 (linear between 0.25
	// and 0.5) and 5 to 0.5.
	s := scale.Quantile{Points: 5}
	p, err := s.Fit(col("x", 9, 1, 2, 3, 4, nan, 5, 6, 7, 8))
	require.NoError(t, err)
	require.Equal(t, []float64{1, 3, 5, 7, 9}, []float64(p.Quantiles[0]))
	require.Equal(t, []float64{0, 0, 0.375, 0.5, 1, 1}, values(t)(s.Transform(p, col("x", -5, 1, 4, 5, 9, 20))))
	// Ties: a run of equal quantiles maps to the middle of its
	// probabilities; a constant column to 0.5.
	p, err = s.Fit(col("x", 1, 2, 2, 2, 3))
	require.NoError(t, err)
	require.Equal(t, []float64{0.5}, values(t)(s.Transform(p, col("x", 2))))
	p, err = s.Fit(col("x", 7, 7))
	require.NoError(t, err)
	require.Equal(t, []float64{0.5}, values(t)(s.Transform(p, col("x", 7))))
	// The normal output: Φ⁻¹ of the uniform one (gonum distuv.UnitNormal
	// as reference), bounded at ±5.199 for the extremes.
	n := scale.Quantile{Points: 5, Output: scale.OutputNormal}
	p, err = n.Fit(col("x", 1, 3, 5, 7, 9))
	require.NoError(t, err)
	got := values(t)(n.Transform(p, col("x", 5, 7, 100)))
	require.Equal(t, 0.0, got[0])
	require.InDelta(t, 0.6744897501960817, got[1], 1e-15) // Φ⁻¹(0.75), from memory to 16 digits
	require.InDelta(t, 5.199, got[2], 1e-3)
	// gonum stat.Quantile as reference library: at p = k/100 with 1001
	// train values, type 7 and gonum's Empirical (type 1) agree.
	frame := clinicFrame(t, 1080, 22, false)
	dist := present(frame.Col(1).Float64s())[:1001]
	p, err = scale.Quantile{Points: 101}.Fit(col("d", dist...))
	require.NoError(t, err)
	sorted := slices.Sorted(slices.Values(dist))
	for k, q := range p.Quantiles[0] {
		require.Equal(t, stat.Quantile(float64(k)/100, stat.Empirical, sorted, nil), q, "k=%d", k)
	}
	// Fewer train values than points: the quantiles are the values.
	p, err = scale.Quantile{}.Fit(col("x", 3, 1, 2))
	require.NoError(t, err)
	require.Equal(t, []float64{1, 2, 3}, []float64(p.Quantiles[0]))
}

func TestStepErrors(t *testing.T) {
	train := clinicFrame(t, 40, 1, false)
	withHoldout := clinicFrame(t, 40, 1, true)
	uniform, err := scale.Quantile{Columns: tabprep.Names("days_ahead")}.Fit(train)
	require.NoError(t, err)
	cases := []struct {
		name     string
		err      error
		sentinel error
		msg      string
	}{
		{"minmax empty range", second(scale.MinMax{Low: 1, High: 1}.Fit(train)), tabprep.ErrOption,
			`scale.minmax fit: target range [1, 1] is empty; Low must be below High`},
		{"minmax reversed range", second(scale.MinMax{Low: 1, High: -1}.Fit(train)), tabprep.ErrOption,
			`scale.minmax fit: target range [1, -1] is empty; Low must be below High`},
		{"boxcox negative", second(scale.BoxCox{}.Fit(col("weight_change", 2, -0.5))), tabprep.ErrValue,
			`scale.boxcox fit: column "weight_change": row 1: value -0.5 is outside the domain (Box-Cox needs x > 0); shift the column to positive values, or use scale.YeoJohnson, which takes any sign`},
		{"boxcox zero", second(scale.BoxCox{}.Fit(col("visits", 2, 0))), tabprep.ErrValue,
			`scale.boxcox fit: column "visits": row 1: value 0 is outside the domain (Box-Cox needs x > 0); shift the column to positive values, or use scale.YeoJohnson, which takes any sign`},
		{"log fit", second(scale.Log{}.Fit(col("visits", 2, -1))), tabprep.ErrValue,
			`scale.log fit: column "visits": row 1: value -1 is outside the domain (log needs x > 0); correct or remove it, or set OutOfDomain to scale.DomainMissing to make such cells missing`},
		{"log1p fit", second(scale.Log1p{}.Fit(col("visits", -1))), tabprep.ErrValue,
			`scale.log1p fit: column "visits": row 0: value -1 is outside the domain (log1p needs x > −1); correct or remove it, or set OutOfDomain to scale.DomainMissing to make such cells missing`},
		{"bad domain rule", second(scale.Log{OutOfDomain: "skip"}.Fit(train)), tabprep.ErrOption,
			`scale.log fit: OutOfDomain "skip" unknown; use scale.DomainError or scale.DomainMissing`},
		{"robust quantiles", second(scale.Robust{Low: 0.8, High: 0.2}.Fit(train)), tabprep.ErrOption,
			`scale.robust fit: quantiles 0.8 and 0.2: need 0 ≤ Low < High ≤ 1`},
		{"quantile output", second(scale.Quantile{Output: "beta"}.Fit(train)), tabprep.ErrOption,
			`scale.quantile fit: Output "beta" unknown; use scale.OutputUniform or scale.OutputNormal`},
		{"quantile points", second(scale.Quantile{Points: 1}.Fit(train)), tabprep.ErrOption,
			`scale.quantile fit: Points 1 outside [2, 100000]`},
		{"quantile inverse out of [0,1]", second(scale.Quantile{}.Inverse(uniform, col("days_ahead", 0.5, 1.5))), tabprep.ErrValue,
			`scale.quantile inverse: column "days_ahead": row 1: value 1.5 is outside the domain (the inverse of a uniform output needs 0 ≤ u ≤ 1); correct or remove it`},
		{"zscore inverse overflow", second(scale.ZScore{}.Inverse(scale.ZScoreParams{Columns: []string{"x"}, Mean: []float64{0}, Std: []float64{1e300}}, col("x", 1e10))), tabprep.ErrValue,
			`scale.zscore inverse: column "x": row 0: value 1e+10 is outside the domain (values whose inverse is finite); correct or remove it`},
		{"rownorm norm", second(scale.RowNorm{Norm: "l3"}.Fit(train)), tabprep.ErrOption,
			`scale.rownorm fit: norm "l3" unknown; use scale.NormL1, scale.NormL2 or scale.NormMax`},
		{"boxcox inverse", second(scale.BoxCox{}.Inverse(scale.PowerParams{Columns: []string{"x"}, Lambda: []float64{0.5}}, col("x", -3))), tabprep.ErrValue,
			`scale.boxcox inverse: column "x": row 0: value -3 is outside the domain (the Box-Cox inverse needs 1 + λ·y > 0); correct or remove it, or set OutOfDomain to scale.DomainMissing to make such cells missing`},
		{"infinite train value", second(scale.MaxAbs{}.Fit(col("pet_age", 1, math.Inf(1)))), tabprep.ErrValue,
			`scale.maxabs fit: column "pet_age": row 1: train value +Inf is not finite; make it missing (NaN) or drop the row before fitting`},
		{"zscore infinite train value", second(scale.ZScore{}.Fit(col("pet_age", 1, math.Inf(-1)))), tabprep.ErrValue,
			`scale.zscore fit: column "pet_age": row 1: train value -Inf is not finite; make it missing (NaN) or drop the row before fitting`},
	}
	// Every step: holdout rows, a categorical column, an all-missing one.
	empty := tabprep.MustFrame(tabprep.NewNumeric("pet_age", []float64{nan}))
	for _, s := range []struct {
		kind string
		fit  func(*tabprep.Frame, tabprep.Selection) error
	}{
		{"scale.minmax", func(f *tabprep.Frame, c tabprep.Selection) error { return second(scale.MinMax{Columns: c}.Fit(f)) }},
		{"scale.decimal", func(f *tabprep.Frame, c tabprep.Selection) error {
			return second(scale.DecimalScaling{Columns: c}.Fit(f))
		}},
		{"scale.robust", func(f *tabprep.Frame, c tabprep.Selection) error { return second(scale.Robust{Columns: c}.Fit(f)) }},
		{"scale.maxabs", func(f *tabprep.Frame, c tabprep.Selection) error { return second(scale.MaxAbs{Columns: c}.Fit(f)) }},
		{"scale.rownorm", func(f *tabprep.Frame, c tabprep.Selection) error { return second(scale.RowNorm{Columns: c}.Fit(f)) }},
		{"scale.log", func(f *tabprep.Frame, c tabprep.Selection) error { return second(scale.Log{Columns: c}.Fit(f)) }},
		{"scale.log1p", func(f *tabprep.Frame, c tabprep.Selection) error { return second(scale.Log1p{Columns: c}.Fit(f)) }},
		{"scale.boxcox", func(f *tabprep.Frame, c tabprep.Selection) error { return second(scale.BoxCox{Columns: c}.Fit(f)) }},
		{"scale.yeojohnson", func(f *tabprep.Frame, c tabprep.Selection) error { return second(scale.YeoJohnson{Columns: c}.Fit(f)) }},
		{"scale.quantile", func(f *tabprep.Frame, c tabprep.Selection) error { return second(scale.Quantile{Columns: c}.Fit(f)) }},
	} {
		cases = append(cases,
			struct {
				name     string
				err      error
				sentinel error
				msg      string
			}{s.kind + " holdout", s.fit(withHoldout, tabprep.Selection{}), tabprep.ErrHoldout,
				s.kind + ` fit: 10 of 40 rows are tagged holdout; fit only on train rows: pass frame.Train() (or frame.Select(tabprep.Train))`},
			struct {
				name     string
				err      error
				sentinel error
				msg      string
			}{s.kind + " categorical", s.fit(train, tabprep.Names("species")), tabprep.ErrKind,
				s.kind + ` fit: column "species": is categorical; this step takes numeric columns`},
			struct {
				name     string
				err      error
				sentinel error
				msg      string
			}{s.kind + " all missing", s.fit(empty, tabprep.Selection{}), tabprep.ErrAllMissing,
				s.kind + ` fit: column "pet_age": every train value is missing; fill the column first or leave it out of Columns`},
		)
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			require.Error(t, tc.err)
			require.True(t, errors.Is(tc.err, tc.sentinel), "%v", tc.err)
			require.Equal(t, tc.msg, tc.err.Error())
		})
	}
}

// second returns the error of a (value, error) pair.
func second[T any](_ T, err error) error { return err }
