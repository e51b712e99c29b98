package impute

import (
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// Mean fills the gaps of numeric columns with their train mean, computed by
// the corrected two-pass algorithm (Chan, Golub & LeVeque 1983) over the
// present values.
type Mean struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
}

func init() { state.Register(Mean{}) }

// Kind returns "impute.mean".
func (Mean) Kind() string { return "impute.mean" }

// Fit learns the mean of each chosen column. A column with no present value
// in train is an error wrapping [tabprep.ErrAllMissing].
func (s Mean) Fit(train *tabprep.Frame) (FillParams, error) {
	return fitNumericStat(s.Kind(), train, s.Columns, Rule{Stat: StatMean})
}

// Transform fills the gaps of the fitted columns of data with p.
func (s Mean) Transform(p FillParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return applyFill(s.Kind()+" transform", p, data)
}

// RowKernel returns the fill of p for single rows laid out by l.
func (s Mean) RowKernel(p FillParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return fillKernel(s.Kind()+" row", p, l)
}

// RowSource writes the fill of p as Go source, for generated plans.
func (s Mean) RowSource(p FillParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return fillSource(s.Kind()+" row", p, l, w)
}
