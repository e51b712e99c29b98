package impute

import (
	"math"
	"slices"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/par"
)

// FillParams is what every statistic fill learns: one decision per column,
// in frame order.
type FillParams struct {
	Columns []ColumnFill `json:"columns"`
}

// applyFill fills the gaps of data as p says. Columns without gaps are
// shared, not copied.
// Columns are filled on all cores; each writes only its own result.
func applyFill(op string, p FillParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	out := make([]*tabprep.Column, len(p.Columns))
	err := par.Each(len(p.Columns), data.NumRows(), func(j int) error {
		f := p.Columns[j]
		c, err := inputColumn(op, data, f.Name, f.Kind)
		if err != nil {
			return err
		}
		if f.Stat == StatKeep {
			return nil
		}
		if f.Kind == tabprep.Numeric {
			out[j] = fillNumeric(c, float64(f.Number))
			return nil
		}
		if c.MissingCount() == 0 {
			return nil
		}
		out[j], err = fillLevel(c, f.Level)
		return err
	})
	if err != nil {
		return nil, err
	}
	changed := slices.DeleteFunc(out, func(c *tabprep.Column) bool { return c == nil })
	return data.With(changed...)
}

// fillNumeric returns a copy of c with every NaN replaced by v, or nil if
// c has no NaN. It reads c once up to its first gap, and copies only then.
func fillNumeric(c *tabprep.Column, v float64) *tabprep.Column {
	src := c.Float64s()
	first := slices.IndexFunc(src, func(y float64) bool { return y != y })
	if first < 0 {
		return nil
	}
	x := make([]float64, len(src))
	copy(x, src[:first])
	for i := first; i < len(src); i++ {
		y := src[i]
		if y != y {
			y = v
		}
		x[i] = y
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

// cellFill is one column fill of a row kernel, by register slot.
type cellFill struct {
	slot    int
	numeric bool
	num     float64
	level   string
	code    int32 // the level's code in the output layout
}

// fillKernel is the row kernel of p: the gaps of the fitted columns are
// filled in their slots. A constant level is added to a categorical
// column's levels in the layout if it lacks it, as Transform does.
func fillKernel(op string, p FillParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	fills, err := cellFills(op, p, l)
	if err != nil {
		return nil, err
	}
	fn := func(regs []tabprep.Cell) error {
		for i := range fills {
			f := &fills[i]
			c := &regs[f.slot]
			if f.numeric {
				if math.IsNaN(c.Num) {
					c.Num = f.num
				}
			} else if c.Code == tabprep.MissingCode {
				c.Str, c.Code = f.level, f.code
			}
		}
		return nil
	}
	return fn, nil
}

// fillSource writes the fill of p as Go source: what fillKernel does.
func fillSource(op string, p FillParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	fills, err := cellFills(op, p, l)
	if err != nil {
		return err
	}
	for _, f := range fills {
		if f.numeric {
			n := w.Num(f.slot)
			w.Line("if %s != %s {", n, n)
			w.Line("%s = %s", n, w.Float(f.num))
		} else {
			w.Line("if %s == %d {", w.Code(f.slot), tabprep.MissingCode)
			w.Line("%s, %s = %s, %d", w.Str(f.slot), w.Code(f.slot), w.Quote(f.level), f.code)
		}
		w.Line("}")
	}
	return nil
}

// cellFills records the fill of p in l and returns it by slot.
func cellFills(op string, p FillParams, l *tabprep.RowLayout) ([]cellFill, error) {
	var fills []cellFill
	for _, f := range p.Columns {
		slot, field, ok := l.Slot(f.Name)
		if !ok {
			return nil, tabprep.Errorf(op, tabprep.ErrSchema, f.Name, "fitted on this column but the row layout lacks it")
		}
		if field.Kind != f.Kind {
			return nil, tabprep.Errorf(op, tabprep.ErrSchema, f.Name, "is %v in the row layout, but was %v at fit time", field.Kind, f.Kind)
		}
		if f.Stat == StatKeep {
			continue
		}
		cf := cellFill{slot: slot, numeric: f.Kind == tabprep.Numeric, num: float64(f.Number), level: f.Level}
		if f.Kind == tabprep.Categorical {
			field.Levels, cf.code = withLevel(field.Levels, f.Level)
			field.Levels = slices.Clone(field.Levels)
			l.Set(f.Name, field)
		}
		fills = append(fills, cf)
	}
	return fills, nil
}

// fitSelected fits rule r on each of cols, decided by the step itself.
func fitSelected(op string, cols []*tabprep.Column, r Rule) (FillParams, error) {
	p := FillParams{Columns: make([]ColumnFill, len(cols))}
	rows := 0
	if len(cols) > 0 {
		rows = cols[0].Len()
	}
	// Columns are fitted on all cores; each writes only its own decision.
	err := par.Each(len(cols), rows, func(j int) error {
		var err error
		p.Columns[j], err = fitRule(op, cols[j], r, "step")
		return err
	})
	if err != nil {
		return FillParams{}, err
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
	names, err := sel.ResolveAny(op, train)
	if err != nil {
		return FillParams{}, err
	}
	return fitSelected(op, columnsOf(train, names), r)
}
