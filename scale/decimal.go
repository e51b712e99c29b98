package scale

import (
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

func init() { state.Register(DecimalScaling{}) }

// DecimalScaling divides each chosen numeric column by a power of ten, the
// smallest that brings every train value into (−1, 1):
//
//	y = x / 10^j,  j the smallest integer with max|x| / 10^j < 1
//
// after Han, Kamber & Pei, Data Mining: Concepts and Techniques (3rd ed.,
// 2012), §3.5.2 (values from −986 to 917 are divided by 10³). The exponent
// j is frozen in the parameters, so new values keep the train scale and may
// fall outside (−1, 1). Taken as defined, j is negative for a column whose
// values are all below 0.1 in magnitude (0.05 becomes 0.5), so the largest
// scaled train magnitude is always in [0.1, 1). A column of zeros has j = 0.
type DecimalScaling struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
}

// DecimalScalingParams is what [DecimalScaling] learns: the exponent j of
// each column.
type DecimalScalingParams struct {
	Columns  []string `json:"columns"`
	Exponent []int    `json:"exponent"`
}

// Kind returns "scale.decimal".
func (DecimalScaling) Kind() string { return "scale.decimal" }

// Fit learns the exponent of each chosen column from train, skipping
// missing cells.
func (s DecimalScaling) Fit(train *tabprep.Frame) (DecimalScalingParams, error) {
	names, cols, err := fitColumns(opName(s.Kind(), "fit"), train, s.Columns)
	if err != nil {
		return DecimalScalingParams{}, err
	}
	p := DecimalScalingParams{Columns: names, Exponent: make([]int, len(names))}
	for j, c := range cols {
		p.Exponent[j] = decimalExponent(maxAbs(c.Float64s()))
	}
	return p, nil
}

// decimalExponent returns the smallest integer j with m/10^j < 1, for a
// finite m ≥ 0; 0 for m = 0. The logarithm gives a first guess; the loops
// settle it by the same division the transform does, so the guarantee holds
// after rounding too.
func decimalExponent(m float64) int {
	if m == 0 {
		return 0
	}
	j := int(math.Floor(math.Log10(m))) + 1
	for m/math.Pow10(j) >= 1 {
		j++
	}
	for m/math.Pow10(j-1) < 1 {
		j--
	}
	return j
}

func (p DecimalScalingParams) mapper(op string, inverse bool) (*mapper, error) {
	if err := checkWidths(op, p.Columns, len(p.Exponent)); err != nil {
		return nil, err
	}
	maps := make([]affine, len(p.Columns))
	for j, e := range p.Exponent {
		if e < -300 || e > 300 {
			return nil, tabprep.Errorf(op, tabprep.ErrOption, p.Columns[j], "exponent %d outside [-300, 300]; refit the step", e)
		}
		maps[j] = affine{scale: math.Pow10(e), divide: true}
	}
	return linear(op, p.Columns, maps, inverse), nil
}

// Transform returns data with each fitted column divided by 10^j.
func (s DecimalScaling) Transform(p DecimalScalingParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return transform(s.Kind(), p, data)
}

// Inverse multiplies each fitted column back by 10^j.
func (s DecimalScaling) Inverse(p DecimalScalingParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return invert(s.Kind(), p, data)
}

// RowKernel returns the decimal scaling of one row, for rows laid out by l.
func (s DecimalScaling) RowKernel(p DecimalScalingParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return rowKernel(s.Kind(), p, l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s DecimalScaling) RowSource(p DecimalScalingParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return rowSource(s.Kind(), p, l, w)
}

var (
	_ tabprep.Step[DecimalScalingParams]      = DecimalScaling{}
	_ tabprep.Inverter[DecimalScalingParams]  = DecimalScaling{}
	_ tabprep.RowKernel[DecimalScalingParams] = DecimalScaling{}
)
