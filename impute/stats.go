package impute

import (
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// Median fills the gaps of numeric columns with their train median,
// Hyndman & Fan (1996) type 7 (the mean of the two middle values for an
// even count), found by selection in expected linear time.
type Median struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
}

// Min fills the gaps of numeric columns with their smallest train value.
type Min struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
}

// Max fills the gaps of numeric columns with their largest train value.
type Max struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
}

// MostFrequent fills the gaps of columns of either kind with their most
// frequent train value or level. Ties go to the smallest number, or to the
// level first in byte order.
type MostFrequent struct {
	// Columns chooses the columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
}

// Constant fills the gaps of the chosen columns with a value given by the
// user: Number for numeric columns, Level for categorical ones. A column of
// the kind whose value is not given is an error wrapping [tabprep.ErrKind]
// or [tabprep.ErrOption].
type Constant struct {
	// Columns chooses the columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	Number  *state.Float      `json:"number,omitempty"`
	Level   *string           `json:"level,omitempty"`
}

func init() {
	state.Register(Median{})
	state.Register(Min{})
	state.Register(Max{})
	state.Register(MostFrequent{})
	state.Register(Constant{})
}

// Kind returns "impute.median".
func (Median) Kind() string { return "impute.median" }

// Fit learns the median of each chosen column.
func (s Median) Fit(train *tabprep.Frame) (FillParams, error) {
	return fitNumericStat(s.Kind(), train, s.Columns, Rule{Stat: StatMedian})
}

// Transform fills the gaps of the fitted columns of data with p.
func (s Median) Transform(p FillParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return applyFill(s.Kind()+" transform", p, data)
}

// RowKernel returns the fill of p for single rows laid out by l.
func (s Median) RowKernel(p FillParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return fillKernel(s.Kind()+" row", p, l)
}

// RowSource writes the fill of p as Go source, for generated plans.
func (s Median) RowSource(p FillParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return fillSource(s.Kind()+" row", p, l, w)
}

// Kind returns "impute.min".
func (Min) Kind() string { return "impute.min" }

// Fit learns the smallest value of each chosen column.
func (s Min) Fit(train *tabprep.Frame) (FillParams, error) {
	return fitNumericStat(s.Kind(), train, s.Columns, Rule{Stat: StatMin})
}

// Transform fills the gaps of the fitted columns of data with p.
func (s Min) Transform(p FillParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return applyFill(s.Kind()+" transform", p, data)
}

// RowKernel returns the fill of p for single rows laid out by l.
func (s Min) RowKernel(p FillParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return fillKernel(s.Kind()+" row", p, l)
}

// RowSource writes the fill of p as Go source, for generated plans.
func (s Min) RowSource(p FillParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return fillSource(s.Kind()+" row", p, l, w)
}

// Kind returns "impute.max".
func (Max) Kind() string { return "impute.max" }

// Fit learns the largest value of each chosen column.
func (s Max) Fit(train *tabprep.Frame) (FillParams, error) {
	return fitNumericStat(s.Kind(), train, s.Columns, Rule{Stat: StatMax})
}

// Transform fills the gaps of the fitted columns of data with p.
func (s Max) Transform(p FillParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return applyFill(s.Kind()+" transform", p, data)
}

// RowKernel returns the fill of p for single rows laid out by l.
func (s Max) RowKernel(p FillParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return fillKernel(s.Kind()+" row", p, l)
}

// RowSource writes the fill of p as Go source, for generated plans.
func (s Max) RowSource(p FillParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return fillSource(s.Kind()+" row", p, l, w)
}

// Kind returns "impute.mostfrequent".
func (MostFrequent) Kind() string { return "impute.mostfrequent" }

// Fit learns the most frequent value or level of each chosen column.
func (s MostFrequent) Fit(train *tabprep.Frame) (FillParams, error) {
	return fitAnyStat(s.Kind(), train, s.Columns, Rule{Stat: StatMode})
}

// Transform fills the gaps of the fitted columns of data with p.
func (s MostFrequent) Transform(p FillParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return applyFill(s.Kind()+" transform", p, data)
}

// RowKernel returns the fill of p for single rows laid out by l.
func (s MostFrequent) RowKernel(p FillParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return fillKernel(s.Kind()+" row", p, l)
}

// RowSource writes the fill of p as Go source, for generated plans.
func (s MostFrequent) RowSource(p FillParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return fillSource(s.Kind()+" row", p, l, w)
}

// Kind returns "impute.constant".
func (Constant) Kind() string { return "impute.constant" }

// Fit checks the constant against each chosen column and records it.
func (s Constant) Fit(train *tabprep.Frame) (FillParams, error) {
	return fitAnyStat(s.Kind(), train, s.Columns, Rule{Stat: StatConstant, Number: s.Number, Level: s.Level})
}

// Transform fills the gaps of the fitted columns of data with p. A
// categorical column gains the constant level if it lacks it.
func (s Constant) Transform(p FillParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return applyFill(s.Kind()+" transform", p, data)
}

// RowKernel returns the fill of p for single rows laid out by l.
func (s Constant) RowKernel(p FillParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return fillKernel(s.Kind()+" row", p, l)
}

// RowSource writes the fill of p as Go source, for generated plans.
func (s Constant) RowSource(p FillParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return fillSource(s.Kind()+" row", p, l, w)
}
