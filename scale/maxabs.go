package scale

import (
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

func init() { state.Register(MaxAbs{}) }

// MaxAbs divides each chosen numeric column by its largest absolute train
// value, so train values fall in [−1, 1], signs and zeros are kept, and
// sparse columns stay sparse:
//
//	y = x / max|x|
//
// A column whose train values are all zero is left as it is (divisor 1).
type MaxAbs struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
}

// MaxAbsParams is what [MaxAbs] learns: the largest absolute train value of
// each column.
type MaxAbsParams struct {
	Columns []string     `json:"columns"`
	MaxAbs  state.Floats `json:"max_abs"`
}

// Kind returns "scale.maxabs".
func (MaxAbs) Kind() string { return "scale.maxabs" }

// Fit learns the largest absolute value of each chosen column from train,
// skipping missing cells.
func (s MaxAbs) Fit(train *tabprep.Frame) (MaxAbsParams, error) {
	names, cols, err := fitColumns(opName(s.Kind(), "fit"), train, s.Columns)
	if err != nil {
		return MaxAbsParams{}, err
	}
	p := MaxAbsParams{Columns: names, MaxAbs: make(state.Floats, len(names))}
	for j, c := range cols {
		p.MaxAbs[j] = maxAbs(c.Float64s())
	}
	return p, nil
}

// maxAbs returns the largest |v| of x, skipping NaN; 0 if there is none.
func maxAbs(x []float64) float64 {
	m := 0.0
	for _, v := range x {
		if a := math.Abs(v); a > m {
			m = a
		}
	}
	return m
}

func (p MaxAbsParams) mapper(op string, inverse bool) (*mapper, error) {
	if err := checkWidths(op, p.Columns, len(p.MaxAbs)); err != nil {
		return nil, err
	}
	maps := make([]affine, len(p.Columns))
	for j := range maps {
		maps[j] = affine{scale: divisor(p.MaxAbs[j])}
	}
	return linear(op, p.Columns, maps, inverse), nil
}

// Transform returns data with each fitted column divided by its train
// maximum absolute value.
func (s MaxAbs) Transform(p MaxAbsParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return transform(s.Kind(), p, data)
}

// Inverse multiplies each fitted column back by its train maximum absolute
// value.
func (s MaxAbs) Inverse(p MaxAbsParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return invert(s.Kind(), p, data)
}

// RowKernel returns the max-abs scaling of one row, for rows laid out by l.
func (s MaxAbs) RowKernel(p MaxAbsParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return rowKernel(s.Kind(), p, l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s MaxAbs) RowSource(p MaxAbsParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return rowSource(s.Kind(), p, l, w)
}

var (
	_ tabprep.Step[MaxAbsParams]      = MaxAbs{}
	_ tabprep.Inverter[MaxAbsParams]  = MaxAbs{}
	_ tabprep.RowKernel[MaxAbsParams] = MaxAbs{}
)
