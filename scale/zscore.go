package scale

import (
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/moment"
	"github.com/tabprep/tabprep/internal/par"
	"github.com/tabprep/tabprep/state"
)

func init() { state.Register(ZScore{}) }

// ZScore centres each chosen numeric column on its train mean and divides by
// its train standard deviation:
//
//	z = (x − mean) / std
//
// computed as (x − mean)·(1/std), within about an ulp of the quotient and
// several times faster on large columns.
//
// The default std is the sample standard deviation, with denominator n−1:
// the train rows are a sample of the rows the model will meet, n−1 makes
// the variance estimate unbiased for that population, and it is the value
// reference datasets certify (NIST StRD) and statistics packages report.
// Set Population for the denominator n. The two differ by the factor
// √(n/(n−1)), which matters only for small train sets.
//
// The mean and M2 come from the corrected two-pass algorithm, and chunks are
// merged by the update of Chan, Golub & LeVeque (1983, The American
// Statistician 37(3)), so the fit keeps its accuracy on data such as NIST
// StRD NumAcc4 (mean 10000000.2, std 0.1), where a sum-of-squares formula
// fails.
//
// A column whose non-missing train values are all equal (one value
// included) has std 0 and Mean exactly that value: it is shifted, not
// scaled (divisor 1), so its train values map to 0 and new values to
// x − mean; never NaN or an infinity.
type ZScore struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// Population selects the population standard deviation (denominator
	// n) instead of the sample one (n−1).
	Population bool `json:"population,omitempty"`
}

// ZScoreParams is what [ZScore] learns: per column, the train mean and
// standard deviation (0 for a constant column).
type ZScoreParams struct {
	Columns []string     `json:"columns"`
	Mean    state.Floats `json:"mean"`
	Std     state.Floats `json:"std"`
}

// Kind returns "scale.zscore".
func (ZScore) Kind() string { return "scale.zscore" }

// Fit learns the mean and standard deviation of each chosen column from
// train, skipping missing cells.
func (s ZScore) Fit(train *tabprep.Frame) (ZScoreParams, error) {
	acc := s.Accumulator()
	if err := acc.Add(train); err != nil {
		return ZScoreParams{}, err
	}
	return acc.Finish()
}

func (p ZScoreParams) mapper(op string, inverse bool) (*mapper, error) {
	if err := checkWidths(op, p.Columns, len(p.Mean), len(p.Std)); err != nil {
		return nil, err
	}
	maps := make([]affine, len(p.Columns))
	for j := range maps {
		maps[j] = affine{center: p.Mean[j], scale: divisor(p.Std[j])}
	}
	return linear(op, p.Columns, maps, inverse), nil
}

// Transform returns data with each fitted column replaced by its z-scores.
func (s ZScore) Transform(p ZScoreParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return transform(s.Kind(), p, data)
}

// Inverse maps z-scores back: x = z·std + mean.
func (s ZScore) Inverse(p ZScoreParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return invert(s.Kind(), p, data)
}

// RowKernel returns the z-score of one row, for rows laid out by l.
func (s ZScore) RowKernel(p ZScoreParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return rowKernel(s.Kind(), p, l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s ZScore) RowSource(p ZScoreParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return rowSource(s.Kind(), p, l, w)
}

// Accumulator returns an empty accumulator that fits the z-score chunk by
// chunk; its Finish gives the same parameters as Fit on all the rows, to
// rounding.
func (s ZScore) Accumulator() tabprep.Accumulator[ZScoreParams] {
	return &zscoreAcc{step: s}
}

// spread is what a centre-and-scale fit needs of a column, mergeable
// across chunks: count, mean and M2, and whether every value is one and the
// same (flat), which M2 alone cannot tell: rounding can leave a tiny M2 for a
// constant column, and dividing by its root would blow noise up to order 1.
type spread struct {
	moment.Summary
	flat  bool
	value float64 // the value of a flat column
}

// spreadOf returns the spread of the non-missing values of x. It reads x a
// third time only when M2 is within rounding of zero, so the common case
// costs the two passes of [moment.Of].
func spreadOf(x []float64) spread {
	s := spread{Summary: moment.Of(x)}
	if s.N == 0 {
		return s
	}
	if tiny := 1e-14 * s.Mean; s.M2 > float64(s.N)*tiny*tiny {
		return s
	}
	s.flat, s.value = true, math.NaN()
	for _, v := range x {
		switch {
		case v != v:
		case s.value != s.value:
			s.value = v
		case v != s.value:
			s.flat = false
			return s
		}
	}
	return s
}

func mergeSpread(a, b spread) spread {
	switch {
	case a.N == 0:
		return b
	case b.N == 0:
		return a
	}
	return spread{
		Summary: moment.Merge(a.Summary, b.Summary),
		flat:    a.flat && b.flat && a.value == b.value,
		value:   a.value,
	}
}

// meanStd returns the mean and standard deviation of s; a flat column has
// its value as mean and std 0. The sample std of one value is 0 too.
func (s spread) meanStd(population bool) (mean, std float64) {
	if s.flat {
		return s.value, 0
	}
	return s.Mean, s.Std(!population)
}

type zscoreAcc struct {
	step    ZScore
	names   []string
	spreads []spread
}

// Add folds the chosen columns of chunk into the statistics. The first
// chunk resolves the selection; later chunks must hold those columns.
func (a *zscoreAcc) Add(chunk *tabprep.Frame) error {
	op := opName(a.step.Kind(), "fit")
	if err := tabprep.RequireTrain(op, chunk); err != nil {
		return err
	}
	if a.names == nil {
		names, err := a.step.Columns.Resolve(op, chunk, tabprep.Numeric)
		if err != nil {
			return err
		}
		a.names = names
		a.spreads = make([]spread, len(names))
	}
	cols, err := dataColumns(op, chunk, a.names)
	if err != nil {
		return err
	}
	// Columns are independent: fit them on all cores. Each call writes
	// only its own spread, so the result is the serial loop's, bit for bit.
	return par.Each(len(cols), chunk.NumRows(), func(j int) error {
		s := spreadOf(cols[j].Float64s())
		if math.IsInf(s.Mean, 0) || math.IsNaN(s.Mean) || math.IsInf(s.M2, 0) {
			// Rare, so looked into only now: an infinite value, or
			// values so large that their squares overflow.
			if err := finite(op, a.names[j:j+1], cols[j:j+1]); err != nil {
				return err
			}
			return tabprep.Errorf(op, tabprep.ErrValue, a.names[j], "the sum of squares overflows float64; rescale the column (divide it by a power of ten) first")
		}
		a.spreads[j] = mergeSpread(a.spreads[j], s)
		return nil
	})
}

// Merge folds another z-score accumulator, fitted on other rows of the same
// columns, into a.
func (a *zscoreAcc) Merge(other tabprep.Accumulator[ZScoreParams]) error {
	op := opName(a.step.Kind(), "merge")
	b, ok := other.(*zscoreAcc)
	if !ok {
		return tabprep.Errorf(op, tabprep.ErrOption, "", "cannot merge a %T; merge accumulators of scale.ZScore only", other)
	}
	if b.names == nil {
		return nil
	}
	if a.names == nil {
		a.names = append([]string(nil), b.names...)
		a.spreads = append([]spread(nil), b.spreads...)
		return nil
	}
	if len(a.names) != len(b.names) {
		return tabprep.Errorf(op, tabprep.ErrSchema, "", "accumulators hold %d and %d columns; merge fits of the same columns", len(a.names), len(b.names))
	}
	for j, n := range a.names {
		if b.names[j] != n {
			return tabprep.Errorf(op, tabprep.ErrSchema, n, "the other accumulator has column %q here; merge fits of the same columns", b.names[j])
		}
		a.spreads[j] = mergeSpread(a.spreads[j], b.spreads[j])
	}
	return nil
}

// Finish returns the fitted parameters.
func (a *zscoreAcc) Finish() (ZScoreParams, error) {
	op := opName(a.step.Kind(), "fit")
	if a.names == nil {
		return ZScoreParams{}, tabprep.Errorf(op, tabprep.ErrAllMissing, "", "no chunk was added; add train rows before Finish")
	}
	p := ZScoreParams{
		Columns: append([]string(nil), a.names...),
		Mean:    make(state.Floats, len(a.names)),
		Std:     make(state.Floats, len(a.names)),
	}
	for j, s := range a.spreads {
		if s.N == 0 {
			return ZScoreParams{}, allMissing(op, a.names[j])
		}
		p.Mean[j], p.Std[j] = s.meanStd(a.step.Population)
	}
	return p, nil
}

var (
	_ tabprep.Step[ZScoreParams]         = ZScore{}
	_ tabprep.Inverter[ZScoreParams]     = ZScore{}
	_ tabprep.RowKernel[ZScoreParams]    = ZScore{}
	_ tabprep.Accumulating[ZScoreParams] = ZScore{}
)
