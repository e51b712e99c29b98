package impute

import (
	"math"
	"slices"

	"github.com/tabprep/tabprep"
)

// FillParams is what every statistic fill learns: one decision per column,
// in frame order.
type FillParams struct {
	Columns []ColumnFill `json:"columns"`
}

// applyFill fills the gaps of data as p says. Columns without gaps are
// shared, not copied.
func applyFill(op string, p FillParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	var changed []*tabprep.Column
	for _, f := range p.Columns {
		c, err := inputColumn(op, data, f.Name, f.Kind)
		if err != nil {
			return nil, err
		}
		if f.Stat == StatKeep || c.MissingCount() == 0 {
			continue
		}
		if f.Kind == tabprep.Numeric {
			changed = append(changed, fillNumeric(c, float64(f.Number)))
			continue
		}
		nc, err := fillLevel(c, f.Level)
		if err != nil {
			return nil, err
		}
		changed = append(changed, nc)
	}
	return data.With(changed...)
}

// fillNumeric returns a copy of c with every NaN replaced by v.
func fillNumeric(c *tabprep.Column, v float64) *tabprep.Column {
	x := slices.Clone(c.Float64s())
	for i, y := range x {
		if y != y {
			x[i] = v
		}
	}
	return tabprep.AdoptNumeric(c.Name(), x)
}

// fillLevel returns a copy of c with every missing cell set to level, which
// is added to the levels if c lacks it.
func fillLevel(c *tabprep.Column, level string) (*tabprep.Column, error) {
	levels, code := withLevel(c.Levels(), level)
	codes := slices.Clone(c.Codes())
	for i, k := range codes {
		if k == tabprep.MissingCode {
			codes[i] = code
		}
	}
	return tabprep.AdoptCategorical(c.Name(), levels, codes)
}

// cellFill is one column fill of a row kernel, by position.
type cellFill struct {
	pos     int
	numeric bool
	num     float64
	level   string
}

// fillKernel is the row kernel of p: src is copied to dst by position and
// the gaps of the fitted columns are filled. The output layout is in, with
// a constant level added to a categorical column's levels if needed.
func fillKernel(op string, p FillParams, in tabprep.Schema) (tabprep.RowFunc, tabprep.Schema, error) {
	out := tabprep.Schema{Columns: slices.Clone(in.Columns)}
	var fills []cellFill
	for _, f := range p.Columns {
		pos := in.Index(f.Name)
		if pos < 0 {
			return nil, tabprep.Schema{}, tabprep.Errorf(op, tabprep.ErrSchema, f.Name, "fitted on this column but the row layout lacks it")
		}
		if in.Columns[pos].Kind != f.Kind {
			return nil, tabprep.Schema{}, tabprep.Errorf(op, tabprep.ErrSchema, f.Name, "is %v in the row layout, but was %v at fit time", in.Columns[pos].Kind, f.Kind)
		}
		if f.Stat == StatKeep {
			continue
		}
		if f.Kind == tabprep.Categorical {
			levels, _ := withLevel(in.Columns[pos].Levels, f.Level)
			out.Columns[pos].Levels = slices.Clone(levels)
		}
		fills = append(fills, cellFill{pos: pos, numeric: f.Kind == tabprep.Numeric, num: float64(f.Number), level: f.Level})
	}
	width := len(in.Columns)
	fn := func(dst, src []tabprep.Cell) error {
		if len(src) != width || len(dst) != width {
			return rowWidthError(op, width, len(src), len(dst))
		}
		copy(dst, src)
		for i := range fills {
			f := &fills[i]
			c := &dst[f.pos]
			if f.numeric {
				if math.IsNaN(c.Num) {
					c.Num = f.num
				}
			} else if c.Str == "" {
				c.Str = f.level
			}
		}
		return nil
	}
	return fn, out, nil
}

func rowWidthError(op string, want, src, dst int) error {
	return tabprep.Errorf(op, tabprep.ErrLength, "", "row of %d cells into %d, the layout has %d; size src and dst by the schemas", src, dst, want)
}

// fitSelected fits rule r on each of cols, decided by the step itself.
func fitSelected(op string, cols []*tabprep.Column, r Rule) (FillParams, error) {
	p := FillParams{Columns: make([]ColumnFill, 0, len(cols))}
	for _, c := range cols {
		f, err := fitRule(op, c, r, "step")
		if err != nil {
			return FillParams{}, err
		}
		p.Columns = append(p.Columns, f)
	}
	return p, nil
}

// fitNumericStat is the Fit of the single-statistic numeric steps.
func fitNumericStat(kind string, train *tabprep.Frame, sel tabprep.Selection, r Rule) (FillParams, error) {
	op := kind + " fit"
	if err := tabprep.RequireTrain(op, train); err != nil {
		return FillParams{}, err
	}
	cols, err := numericColumns(op, train, sel)
	if err != nil {
		return FillParams{}, err
	}
	return fitSelected(op, cols, r)
}

// fitAnyStat is the Fit of the single-statistic steps that take columns of
// either kind.
func fitAnyStat(kind string, train *tabprep.Frame, sel tabprep.Selection, r Rule) (FillParams, error) {
	op := kind + " fit"
	if err := tabprep.RequireTrain(op, train); err != nil {
		return FillParams{}, err
	}
	names, err := pickColumns(op, train, sel)
	if err != nil {
		return FillParams{}, err
	}
	return fitSelected(op, columnsOf(train, names), r)
}
