package scale

import (
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/quantile"
	"github.com/tabprep/tabprep/state"
)

func init() { state.Register(Robust{}) }

// Robust centres each chosen numeric column on its train median and divides
// by its inter-quantile range, which outliers barely move:
//
//	y = (x − median) / (q_high − q_low)
//
// The quantiles are Hyndman & Fan (1996) type 7 (linear interpolation at
// h = p(n−1)+1, The American Statistician 50(4)), found by selection in
// expected linear time rather than by sorting. Low and High are the quantile
// probabilities; both zero (the zero value) mean the quartiles 0.25 and
// 0.75, and otherwise 0 ≤ Low < High ≤ 1.
//
// A column whose inter-quantile range is zero (for instance one with more
// than half its values equal) is shifted by its median and not scaled
// (divisor 1); never NaN or an infinity.
type Robust struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// Low and High are the quantile probabilities; both zero mean 0.25
	// and 0.75.
	Low  state.Float `json:"low,omitempty"`
	High state.Float `json:"high,omitempty"`
}

// RobustParams is what [Robust] learns: per column, the train median and
// the low and high quantiles.
type RobustParams struct {
	Columns []string     `json:"columns"`
	Median  state.Floats `json:"median"`
	Lower   state.Floats `json:"lower"`
	Upper   state.Floats `json:"upper"`
}

// Kind returns "scale.robust".
func (Robust) Kind() string { return "scale.robust" }

func (s Robust) probs(op string) (float64, float64, error) {
	lo, hi := float64(s.Low), float64(s.High)
	if lo == 0 && hi == 0 {
		return 0.25, 0.75, nil
	}
	if !(0 <= lo && lo < hi && hi <= 1) {
		return 0, 0, tabprep.Errorf(op, tabprep.ErrOption, "", "quantiles %v and %v: need 0 ≤ Low < High ≤ 1", lo, hi)
	}
	return lo, hi, nil
}

// Fit learns the median and the two quantiles of each chosen column from
// train, skipping missing cells.
func (s Robust) Fit(train *tabprep.Frame) (RobustParams, error) {
	op := opName(s.Kind(), "fit")
	lo, hi, err := s.probs(op)
	if err != nil {
		return RobustParams{}, err
	}
	names, cols, err := fitColumns(op, train, s.Columns)
	if err != nil {
		return RobustParams{}, err
	}
	k := len(names)
	p := RobustParams{Columns: names, Median: make(state.Floats, k), Lower: make(state.Floats, k), Upper: make(state.Floats, k)}
	for j, c := range cols {
		vals := quantile.DropNaN(c.Float64s()) // scratch: Of reorders it
		p.Median[j] = quantile.Of(vals, 0.5, quantile.Type7)
		p.Lower[j] = quantile.Of(vals, lo, quantile.Type7)
		p.Upper[j] = quantile.Of(vals, hi, quantile.Type7)
	}
	return p, nil
}

func (p RobustParams) mapper(op string, inverse bool) (*mapper, error) {
	if err := checkWidths(op, p.Columns, len(p.Median), len(p.Lower), len(p.Upper)); err != nil {
		return nil, err
	}
	maps := make([]affine, len(p.Columns))
	for j := range maps {
		maps[j] = affine{center: p.Median[j], scale: divisor(p.Upper[j] - p.Lower[j])}
	}
	return linear(op, p.Columns, maps, inverse), nil
}

// Transform returns data with each fitted column centred on its median and
// divided by its inter-quantile range.
func (s Robust) Transform(p RobustParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return transform(s.Kind(), p, data)
}

// Inverse maps robust-scaled values back: x = y·(q_high − q_low) + median.
func (s Robust) Inverse(p RobustParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return invert(s.Kind(), p, data)
}

// RowKernel returns the robust scaling of one row, for rows laid out by l.
func (s Robust) RowKernel(p RobustParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return rowKernel(s.Kind(), p, l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s Robust) RowSource(p RobustParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return rowSource(s.Kind(), p, l, w)
}

var (
	_ tabprep.Step[RobustParams]      = Robust{}
	_ tabprep.Inverter[RobustParams]  = Robust{}
	_ tabprep.RowKernel[RobustParams] = Robust{}
)
