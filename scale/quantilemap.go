package scale

import (
	"math"
	"slices"

	"gonum.org/v1/gonum/stat/distuv"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/quantile"
	"github.com/tabprep/tabprep/state"
)

func init() { state.Register(Quantile{}) }

// Output names of the [Quantile] transform.
const (
	// OutputUniform maps to the uniform distribution on [0, 1] (default).
	OutputUniform = "uniform"
	// OutputNormal maps to the standard normal distribution.
	OutputNormal = "normal"
)

// DefaultPoints is the number of train quantiles [Quantile] keeps when
// Points is zero.
const DefaultPoints = 1000

// maxPoints bounds the state a quantile transform writes per column.
const maxPoints = 100_000

// normalTail is the smallest probability the normal output maps, so that
// the end points map to ±5.199 rather than ±Inf: values at or beyond the
// train extremes land there.
const normalTail = 1e-7

// Quantile maps each chosen numeric column through its train distribution
// function, to a uniform output on [0, 1] or, with Output set to
// [OutputNormal], to a standard normal one. Fit keeps m train quantiles
// q_k at the evenly spaced probabilities p_k = k/(m−1), k = 0…m−1, by
// Hyndman & Fan (1996) type 7, where m is Points (DefaultPoints when 0)
// or the number of train values if that is smaller. A value x between q_k
// and q_(k+1) maps by linear interpolation between p_k and p_(k+1); a run
// of equal quantiles (tied data) maps to the middle of its probabilities,
// so a constant column maps to 0.5. Values below the first or above the
// last quantile map to 0 or 1: the transform is defined for every number.
// The normal output is Φ⁻¹(p) with p clamped to [1e−7, 1 − 1e−7] (gonum
// distuv.UnitNormal), so it lies within ±5.199.
//
// The inverse interpolates back between the quantiles; it needs a uniform
// value in [0, 1] (any value for the normal output), is exact up to
// rounding for values inside the train range, and returns the train
// extremes for values that were clamped.
type Quantile struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// Points is the number of train quantiles kept, at least 2; 0 means
	// DefaultPoints.
	Points int `json:"points,omitempty"`
	// Output is OutputUniform ("" means the same) or OutputNormal.
	Output string `json:"output,omitempty"`
}

// QuantileParams is what [Quantile] learns: per column, the train quantiles
// at p_k = k/(m−1).
type QuantileParams struct {
	Columns   []string       `json:"columns"`
	Output    string         `json:"output"`
	Quantiles []state.Floats `json:"quantiles"`
}

// Kind returns "scale.quantile".
func (Quantile) Kind() string { return "scale.quantile" }

// Fit learns the train quantiles of each chosen column, skipping missing
// cells.
func (s Quantile) Fit(train *tabprep.Frame) (QuantileParams, error) {
	op := opName(s.Kind(), "fit")
	out := s.Output
	if out == "" {
		out = OutputUniform
	}
	if out != OutputUniform && out != OutputNormal {
		return QuantileParams{}, tabprep.Errorf(op, tabprep.ErrOption, "", "Output %q unknown; use scale.OutputUniform or scale.OutputNormal", s.Output)
	}
	points := s.Points
	if points == 0 {
		points = DefaultPoints
	}
	if points < 2 || points > maxPoints {
		return QuantileParams{}, tabprep.Errorf(op, tabprep.ErrOption, "", "Points %d outside [2, %d]", s.Points, maxPoints)
	}
	names, cols, err := fitColumns(op, train, s.Columns)
	if err != nil {
		return QuantileParams{}, err
	}
	p := QuantileParams{Columns: names, Output: out, Quantiles: make([]state.Floats, len(names))}
	for j, c := range cols {
		// Many quantiles of one column: one sort serves them all.
		sorted := quantile.DropNaN(c.Float64s())
		slices.Sort(sorted)
		m := max(2, min(points, len(sorted)))
		q := make(state.Floats, m)
		for k := range q {
			q[k] = quantile.Sorted(sorted, float64(k)/float64(m-1), quantile.Type7)
		}
		p.Quantiles[j] = q
	}
	return p, nil
}

// curve is one column's fitted quantiles.
type curve []float64

// prob returns the interpolated probability of x.
func (q curve) prob(x float64) float64 {
	last := float64(len(q) - 1)
	j, found := slices.BinarySearch(q, x) // first q[j] ≥ x
	switch {
	case found:
		i, _ := slices.BinarySearch(q[j:], math.Nextafter(x, math.Inf(1)))
		return (float64(j) + float64(j+i-1)) / 2 / last
	case j == 0:
		return 0
	case j == len(q):
		return 1
	}
	t := (x - q[j-1]) / (q[j] - q[j-1])
	return (float64(j-1) + t) / last
}

// source returns the Go source of the forward map of q (prob, then the
// normal quantile if normal), for generated plans: the same operations in
// the same order, on q declared once as a table of constants.
func (q curve) source(normal bool) func(w *tabprep.SourceWriter, x, y string) {
	return func(w *tabprep.SourceWriter, x, y string) {
		table, sl := w.Data(q), w.Import("slices")
		last := w.Float(float64(len(q) - 1))
		w.Line("if %s != %s {", x, x)
		w.Line("%s = %s", y, x)
		w.Line("} else {")
		w.Line("q := %s[:]", table)
		w.Line("j, found := %s.BinarySearch(q, %s)", sl, x)
		w.Line("switch {")
		w.Line("case found:")
		w.Line("i, _ := %s.BinarySearch(q[j:], math.Nextafter(%s, math.Inf(1)))", sl, x)
		w.Line("%s = (float64(j) + float64(j+i-1)) / 2 / %s", y, last)
		w.Line("case j == 0:")
		w.Line("%s = 0", y)
		w.Line("case j == len(q):")
		w.Line("%s = 1", y)
		w.Line("default:")
		w.Line("t := (%s - q[j-1]) / (q[j] - q[j-1])", x)
		w.Line("%s = (float64(j-1) + t) / %s", y, last)
		w.Line("}")
		if normal {
			w.Line("%s = %s.UnitNormal.Quantile(min(max(%s, %s), %s))", y, w.Import("gonum.org/v1/gonum/stat/distuv"), y, w.Float(normalTail), w.Float(1-normalTail))
		}
		w.Line("}")
	}
}

// value returns the value at probability u ∈ [0, 1], NaN outside.
func (q curve) value(u float64) float64 {
	if !(u >= 0 && u <= 1) {
		return math.NaN()
	}
	h := u * float64(len(q)-1)
	k := int(h)
	if k >= len(q)-1 {
		return q[len(q)-1]
	}
	return q[k] + (h-float64(k))*(q[k+1]-q[k])
}

var (
	zLow  = distuv.UnitNormal.Quantile(normalTail)
	zHigh = distuv.UnitNormal.Quantile(1 - normalTail)
)

func (p QuantileParams) mapper(op string, inverse bool) (*mapper, error) {
	if err := checkWidths(op, p.Columns, len(p.Quantiles)); err != nil {
		return nil, err
	}
	if p.Output != OutputUniform && p.Output != OutputNormal {
		return nil, tabprep.Errorf(op, tabprep.ErrOption, "", "output %q unknown; refit the step", p.Output)
	}
	normal := p.Output == OutputNormal
	m := &mapper{op: op, names: p.Columns, funcs: make([]func(float64) float64, len(p.Columns)),
		domain: "the inverse of a uniform output needs 0 ≤ u ≤ 1", strict: true}
	for j, qs := range p.Quantiles {
		q := curve(qs)
		if len(q) < 2 || !slices.IsSorted(q) || math.IsNaN(q[0]) || math.IsInf(q[0], 0) || math.IsInf(q[len(q)-1], 0) {
			return nil, tabprep.Errorf(op, tabprep.ErrOption, p.Columns[j], "quantiles are not an ascending list of at least 2 finite numbers; refit the step")
		}
		if !inverse {
			m.sources = append(m.sources, q.source(normal))
		}
		switch {
		case !inverse && !normal:
			m.funcs[j] = func(x float64) float64 {
				if x != x {
					return x
				}
				return q.prob(x)
			}
		case !inverse:
			m.funcs[j] = func(x float64) float64 {
				if x != x {
					return x
				}
				return distuv.UnitNormal.Quantile(min(max(q.prob(x), normalTail), 1-normalTail))
			}
		case !normal:
			m.funcs[j] = func(u float64) float64 {
				if u != u {
					return u
				}
				return q.value(u)
			}
		default:
			m.funcs[j] = func(z float64) float64 {
				switch {
				case z != z:
					return z
				case z <= zLow:
					return q[0]
				case z >= zHigh:
					return q[len(q)-1]
				}
				return q.value(distuv.UnitNormal.CDF(z))
			}
		}
	}
	return m, nil
}

// Transform returns data with each fitted column mapped through its train
// distribution function.
func (s Quantile) Transform(p QuantileParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return transform(s.Kind(), p, data)
}

// Inverse maps uniform or normal values back through the train quantiles.
func (s Quantile) Inverse(p QuantileParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return invert(s.Kind(), p, data)
}

// RowKernel returns the quantile transform of one row, for rows laid out by
// in.
func (s Quantile) RowKernel(p QuantileParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return rowKernel(s.Kind(), p, l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s Quantile) RowSource(p QuantileParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return rowSource(s.Kind(), p, l, w)
}

var (
	_ tabprep.Step[QuantileParams]      = Quantile{}
	_ tabprep.Inverter[QuantileParams]  = Quantile{}
	_ tabprep.RowKernel[QuantileParams] = Quantile{}
)
