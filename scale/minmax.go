package scale

import (
	"slices"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

func init() { state.Register(MinMax{}) }

// MinMax maps each chosen numeric column linearly from its train range
// [min, max] onto the target range [Low, High]:
//
//	y = Low + (x − min)·(High − Low)/(max − min)
//
// Low and High both zero (the zero value) mean the target [0, 1]; otherwise
// Low must be below High. New values outside the train range map outside
// the target unless Clamp is set, which clamps them to [Low, High].
//
// A column whose train values are all equal has no range: it is shifted,
// not scaled, so its train value maps to the midpoint (Low + High)/2 and a
// new value x to (x − min) + (Low + High)/2 (then clamped if Clamp is set);
// never NaN or an infinity.
//
// The inverse undoes the map exactly up to rounding, except that a value
// clipped by the transform comes back as the end of the train range.
type MinMax struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// Low and High are the target range; both zero mean [0, 1].
	Low  state.Float `json:"low,omitempty"`
	High state.Float `json:"high,omitempty"`
	// Clamp clamps transformed values to [Low, High].
	Clamp bool `json:"clamp,omitempty"`
}

// MinMaxParams is what [MinMax] learns: the train range of each column, and
// the target range and clipping frozen from the step.
type MinMaxParams struct {
	Columns []string     `json:"columns"`
	Min     state.Floats `json:"min"`
	Max     state.Floats `json:"max"`
	Low     state.Float  `json:"low"`
	High    state.Float  `json:"high"`
	Clamp   bool         `json:"clamp,omitempty"`
}

// Kind returns "scale.minmax".
func (MinMax) Kind() string { return "scale.minmax" }

func (s MinMax) target(op string) (float64, float64, error) {
	a, b := float64(s.Low), float64(s.High)
	if a == 0 && b == 0 {
		return 0, 1, nil
	}
	if !(a < b) {
		return 0, 0, tabprep.Errorf(op, tabprep.ErrOption, "", "target range [%v, %v] is empty; Low must be below High", a, b)
	}
	return a, b, nil
}

// Fit learns the minimum and maximum of each chosen column from train,
// skipping missing cells.
func (s MinMax) Fit(train *tabprep.Frame) (MinMaxParams, error) {
	op := opName(s.Kind(), "fit")
	a, b, err := s.target(op)
	if err != nil {
		return MinMaxParams{}, err
	}
	names, cols, err := fitColumns(op, train, s.Columns)
	if err != nil {
		return MinMaxParams{}, err
	}
	p := MinMaxParams{Columns: names, Min: make(state.Floats, len(names)), Max: make(state.Floats, len(names)),
		Low: state.Float(a), High: state.Float(b), Clamp: s.Clamp}
	for j, c := range cols {
		vals := present(c.Float64s())
		p.Min[j], p.Max[j] = slices.Min(vals), slices.Max(vals)
	}
	return p, nil
}

func (p MinMaxParams) mapper(op string, inverse bool) (*mapper, error) {
	if err := checkWidths(op, p.Columns, len(p.Min), len(p.Max)); err != nil {
		return nil, err
	}
	a, b := float64(p.Low), float64(p.High)
	if !(a < b) {
		return nil, tabprep.Errorf(op, tabprep.ErrOption, "", "target range [%v, %v] is empty; refit the step", a, b)
	}
	maps := make([]affine, len(p.Columns))
	for j := range maps {
		// Dividing keeps the train minimum and maximum on the ends of the
		// target [0, 1] exactly.
		m := affine{center: p.Min[j], scale: (p.Max[j] - p.Min[j]) / (b - a), offset: a, clip: p.Clamp, lo: a, hi: b, divide: true}
		if p.Max[j] == p.Min[j] {
			m.scale, m.offset = 1, a+(b-a)/2
		}
		m.scale = divisor(m.scale)
		maps[j] = m
	}
	return linear(op, p.Columns, maps, inverse), nil
}

// Transform returns data with each fitted column mapped onto the target
// range.
func (s MinMax) Transform(p MinMaxParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return transform(s.Kind(), p, data)
}

// Inverse maps values in the target range back to the train range.
func (s MinMax) Inverse(p MinMaxParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return invert(s.Kind(), p, data)
}

// RowKernel returns the min-max map of one row, for rows laid out by l.
func (s MinMax) RowKernel(p MinMaxParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return rowKernel(s.Kind(), p, l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s MinMax) RowSource(p MinMaxParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return rowSource(s.Kind(), p, l, w)
}

var (
	_ tabprep.Step[MinMaxParams]      = MinMax{}
	_ tabprep.Inverter[MinMaxParams]  = MinMax{}
	_ tabprep.RowKernel[MinMaxParams] = MinMax{}
)
