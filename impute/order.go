package impute

import (
	"math"
	"slices"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// CarryForward fills each gap of numeric columns with the nearest present
// value above it in the frame being transformed (the previous row in row
// order). A leading gap, with no value above it, takes the edge fill
// learned at fit time.
//
// The fill reads the other rows of the frame it transforms, so the value a
// row gets depends on the rows before it in that frame: transform a batch
// in its time order, and a single row on its own gets the edge fill.
type CarryForward struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// Edge is the train statistic for gaps with no neighbour; the zero Rule
	// means the median. StatKeep leaves such gaps missing.
	Edge Rule `json:"edge,omitzero"`
}

// CarryBackward fills each gap of numeric columns with the nearest present
// value below it in the frame being transformed (the next row). A trailing
// gap takes the edge fill learned at fit time. Like [CarryForward], its
// output for a row depends on the other rows of the frame.
type CarryBackward struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// Edge is as in [CarryForward].
	Edge Rule `json:"edge,omitzero"`
}

// Interpolate fills each gap of numeric columns on the straight line
// between the nearest present values above and below it in the frame being
// transformed. By row order the weight of a gap at row i between present
// rows a < i < b is t = (i−a)/(b−a); with By set it is t = (z_i−z_a)/(z_b−z_a)
// over the numeric column z named By (a date as a number, say), which
// should then be sorted in row order. Where z is missing at i, a or b, or
// z_a = z_b, the row-order weight is used. The fill is x_a + t·(x_b − x_a).
//
// A leading gap takes the first present value of the frame and a trailing
// gap the last (flat extension); a column with no present value in the
// frame takes the edge fill learned at fit time.
type Interpolate struct {
	// Columns chooses the numeric columns; the zero value chooses all but By.
	Columns tabprep.Selection `json:"columns"`
	// By names the numeric column that measures the distance between rows;
	// empty means row order.
	By string `json:"by,omitempty"`
	// Edge is as in [CarryForward].
	Edge Rule `json:"edge,omitzero"`
}

// OrderParams is what a row-order fill learns: only the edge fill per
// column, and the name of the axis column of [Interpolate].
type OrderParams struct {
	Edges []ColumnFill `json:"edges"`
	By    string       `json:"by,omitempty"`
}

type orderMode int

const (
	forward orderMode = iota
	backward
	linear
)

func init() {
	state.Register(CarryForward{})
	state.Register(CarryBackward{})
	state.Register(Interpolate{})
}

// Kind returns "impute.carryforward".
func (CarryForward) Kind() string { return "impute.carryforward" }

// Fit learns the edge fill of each chosen column.
func (s CarryForward) Fit(train *tabprep.Frame) (OrderParams, error) {
	return fitOrder(s.Kind()+" fit", train, s.Columns, "", s.Edge)
}

// Transform fills the gaps of data from the rows above them.
func (s CarryForward) Transform(p OrderParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return applyOrder(s.Kind()+" transform", p, data, forward)
}

// Kind returns "impute.carrybackward".
func (CarryBackward) Kind() string { return "impute.carrybackward" }

// Fit learns the edge fill of each chosen column.
func (s CarryBackward) Fit(train *tabprep.Frame) (OrderParams, error) {
	return fitOrder(s.Kind()+" fit", train, s.Columns, "", s.Edge)
}

// Transform fills the gaps of data from the rows below them.
func (s CarryBackward) Transform(p OrderParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return applyOrder(s.Kind()+" transform", p, data, backward)
}

// Kind returns "impute.interpolate".
func (Interpolate) Kind() string { return "impute.interpolate" }

// Fit checks the axis column and learns the edge fill of each chosen
// column. By must be a numeric column of train and not one of the chosen.
func (s Interpolate) Fit(train *tabprep.Frame) (OrderParams, error) {
	return fitOrder(s.Kind()+" fit", train, s.Columns, s.By, s.Edge)
}

// Transform fills the gaps of data between their neighbours.
func (s Interpolate) Transform(p OrderParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return applyOrder(s.Kind()+" transform", p, data, linear)
}

func fitOrder(op string, train *tabprep.Frame, sel tabprep.Selection, by string, edge Rule) (OrderParams, error) {
	if err := tabprep.RequireTrain(op, train); err != nil {
		return OrderParams{}, err
	}
	if edge.Stat == "" {
		edge = Rule{Stat: StatMedian}
	}
	p := OrderParams{By: by}
	if by != "" {
		if _, err := train.ColumnOf(by, tabprep.Numeric); err != nil {
			e := err.(*tabprep.Error)
			return OrderParams{}, tabprep.Errorf(op, e.Err, by, "is the interpolation axis (By): %s", e.Msg)
		}
	}
	cols, err := numericColumns(op, train, sel)
	if err != nil {
		return OrderParams{}, err
	}
	for _, c := range cols {
		if c.Name() == by {
			if slices.Contains(sel.Names, by) {
				return OrderParams{}, tabprep.Errorf(op, tabprep.ErrOption, by, "is the interpolation axis (By) and cannot be filled by the same step")
			}
			continue
		}
		f, err := fitRule(op, c, edge, "edge")
		if err != nil {
			return OrderParams{}, err
		}
		p.Edges = append(p.Edges, f)
	}
	return p, nil
}

func applyOrder(op string, p OrderParams, data *tabprep.Frame, mode orderMode) (*tabprep.Frame, error) {
	var z []float64
	if p.By != "" {
		c, err := inputColumn(op, data, p.By, tabprep.Numeric)
		if err != nil {
			return nil, err
		}
		z = c.Float64s()
	}
	var changed []*tabprep.Column
	for _, f := range p.Edges {
		if f.Kind != tabprep.Numeric {
			return nil, badParams(op, "edge fill of %q is for a %v column", f.Name, f.Kind)
		}
		c, err := inputColumn(op, data, f.Name, tabprep.Numeric)
		if err != nil {
			return nil, err
		}
		if c.MissingCount() == 0 {
			continue
		}
		edge := float64(f.Number)
		if f.Stat == StatKeep {
			edge = math.NaN()
		}
		changed = append(changed, tabprep.AdoptNumeric(f.Name, fillInOrder(c.Float64s(), z, mode, edge)))
	}
	return data.With(changed...)
}

// fillInOrder returns a filled copy of x; see the step types for the rules.
func fillInOrder(x, z []float64, mode orderMode, edge float64) []float64 {
	out := make([]float64, len(x))
	copy(out, x)
	switch mode {
	case forward:
		last := edge
		for i, v := range out {
			if v == v {
				last = v
			} else {
				out[i] = last
			}
		}
		return out
	case backward:
		next := edge
		for i := len(out) - 1; i >= 0; i-- {
			if v := out[i]; v == v {
				next = v
			} else {
				out[i] = next
			}
		}
		return out
	}
	prev := -1 // last present row
	for i := 0; i <= len(out); i++ {
		if i < len(out) && math.IsNaN(out[i]) {
			continue
		}
		// Rows prev+1 .. i-1 are a gap between present rows prev and i.
		for g := prev + 1; g < i; g++ {
			switch {
			case prev < 0 && i == len(out):
				out[g] = edge
			case prev < 0:
				out[g] = x[i]
			case i == len(out):
				out[g] = x[prev]
			default:
				out[g] = x[prev] + weight(z, prev, g, i)*(x[i]-x[prev])
			}
		}
		prev = i
	}
	return out
}

// weight is the position of row g between present rows a and b: by the
// axis z when it gives one, else by row order.
func weight(z []float64, a, g, b int) float64 {
	if z != nil {
		za, zg, zb := z[a], z[g], z[b]
		if za == za && zg == zg && zb == zb && za != zb {
			return (zg - za) / (zb - za)
		}
	}
	return float64(g-a) / float64(b-a)
}
