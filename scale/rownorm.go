package scale

import (
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

func init() { state.Register(RowNorm{}) }

// Norms of [RowNorm].
const (
	// NormL2 is the Euclidean norm √Σx² (default).
	NormL2 = "l2"
	// NormL1 is the sum of absolute values Σ|x|.
	NormL1 = "l1"
	// NormMax is the largest absolute value max|x|.
	NormMax = "max"
)

// RowNorm divides each row's values in the chosen numeric columns by that
// row's norm over those columns, so every row has norm 1 there. Norm is
// NormL2 ("" means the same), NormL1 or NormMax. Missing cells are left out
// of the norm and stay missing. A row whose norm is zero (all its chosen
// values zero or missing) is left as it is. The L2 norm is computed scaled
// by the row's largest magnitude, so it neither overflows nor underflows.
//
// Nothing is learned from the train values, and the row's own norm is
// lost, so RowNorm has no inverse.
type RowNorm struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// Norm is NormL2 (default), NormL1 or NormMax.
	Norm string `json:"norm,omitempty"`
}

// RowNormParams is what [RowNorm] fixes at fit: the columns and the norm.
type RowNormParams struct {
	Columns []string `json:"columns"`
	Norm    string   `json:"norm"`
}

// Kind returns "scale.rownorm".
func (RowNorm) Kind() string { return "scale.rownorm" }

func checkNorm(op, norm string) error {
	switch norm {
	case NormL1, NormL2, NormMax:
		return nil
	}
	return tabprep.Errorf(op, tabprep.ErrOption, "", "norm %q unknown; use scale.NormL1, scale.NormL2 or scale.NormMax", norm)
}

// Fit resolves the columns and checks the norm.
func (s RowNorm) Fit(train *tabprep.Frame) (RowNormParams, error) {
	op := opName(s.Kind(), "fit")
	norm := s.Norm
	if norm == "" {
		norm = NormL2
	}
	if err := checkNorm(op, norm); err != nil {
		return RowNormParams{}, err
	}
	names, _, err := fitColumns(op, train, s.Columns)
	if err != nil {
		return RowNormParams{}, err
	}
	return RowNormParams{Columns: names, Norm: norm}, nil
}

// rowNorm returns the norm of the non-missing values of x; it reads but
// does not keep x.
func rowNorm(norm string, x []float64) float64 {
	var big float64
	for _, v := range x {
		if a := math.Abs(v); a > big { // NaN never compares greater
			big = a
		}
	}
	if norm == NormMax || big == 0 || math.IsInf(big, 0) {
		return big
	}
	var s float64
	for _, v := range x {
		if v == v {
			if norm == NormL1 {
				s += math.Abs(v)
			} else {
				s += (v / big) * (v / big)
			}
		}
	}
	if norm == NormL1 {
		return s
	}
	return big * math.Sqrt(s)
}

// normalise divides x in place by its norm, unless that is zero.
func normalise(norm string, x []float64) {
	if n := rowNorm(norm, x); n != 0 {
		for i := range x {
			x[i] /= n
		}
	}
}

// Transform returns data with the fitted columns of each row divided by the
// row's norm.
func (s RowNorm) Transform(p RowNormParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	op := opName(s.Kind(), "transform")
	if err := checkNorm(op, p.Norm); err != nil {
		return nil, err
	}
	cols, err := dataColumns(op, data, p.Columns)
	if err != nil {
		return nil, err
	}
	out := make([][]float64, len(cols))
	for j, c := range cols {
		out[j] = make([]float64, c.Len())
	}
	row := make([]float64, len(cols))
	for i := range data.NumRows() {
		for j, c := range cols {
			row[j] = c.Float64s()[i]
		}
		normalise(p.Norm, row)
		for j := range cols {
			out[j][i] = row[j]
		}
	}
	adopted := make([]*tabprep.Column, len(cols))
	for j, n := range p.Columns {
		adopted[j] = tabprep.AdoptNumeric(n, out[j])
	}
	return data.With(adopted...)
}

// RowKernel returns the normalisation of one row, for rows laid out by l.
// It needs no allocation per row for up to 64 chosen columns.
func (s RowNorm) RowKernel(p RowNormParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	slots, err := s.slots(p, l)
	if err != nil {
		return nil, err
	}
	norm := p.Norm
	fn := func(regs []tabprep.Cell) error {
		var buf [64]float64
		x := buf[:0]
		if len(slots) > len(buf) {
			x = make([]float64, 0, len(slots))
		}
		for _, k := range slots {
			x = append(x, regs[k].Num)
		}
		normalise(norm, x)
		for j, k := range slots {
			regs[k].Num = x[j]
		}
		return nil
	}
	return fn, nil
}

// RowSource writes the row kernel as Go source, for generated plans: what
// rowNorm and normalise do, unrolled over the columns.
func (s RowNorm) RowSource(p RowNormParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	slots, err := s.slots(p, l)
	if err != nil {
		return err
	}
	w.Line("{")
	w.Line("var big float64")
	for _, k := range slots {
		w.Line("if a := math.Abs(%s); a > big {", w.Num(k))
		w.Line("big = a")
		w.Line("}")
	}
	w.Line("norm := big")
	if p.Norm != NormMax {
		w.Line("if big != 0 && !math.IsInf(big, 0) {")
		w.Line("var s float64")
		for _, k := range slots {
			n := w.Num(k)
			w.Line("if %s == %s {", n, n)
			if p.Norm == NormL1 {
				w.Line("s += math.Abs(%s)", n)
			} else {
				w.Line("s += (%s / big) * (%s / big)", n, n)
			}
			w.Line("}")
		}
		if p.Norm == NormL1 {
			w.Line("norm = s")
		} else {
			w.Line("norm = big * math.Sqrt(s)")
		}
		w.Line("}")
	}
	w.Line("if norm != 0 {")
	for _, k := range slots {
		w.Line("%s /= norm", w.Num(k))
	}
	w.Line("}")
	w.Line("}")
	return nil
}

func (s RowNorm) slots(p RowNormParams, l *tabprep.RowLayout) ([]int, error) {
	op := opName(s.Kind(), "row")
	if err := checkNorm(op, p.Norm); err != nil {
		return nil, err
	}
	return (&mapper{op: op, names: p.Columns}).slots(l)
}

var (
	_ tabprep.Step[RowNormParams]      = RowNorm{}
	_ tabprep.RowKernel[RowNormParams] = RowNorm{}
	_ tabprep.RowSource[RowNormParams] = RowNorm{}
)
