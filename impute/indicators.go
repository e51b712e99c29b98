package impute

import (
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// IndicatorSuffix is what [IndicatorName] appends to a column name.
const IndicatorSuffix = "_missing"

// IndicatorName returns the name of the 0/1 column that marks the gaps of
// column: the name followed by "_missing", so "pet_age" gets
// "pet_age_missing".
func IndicatorName(column string) string { return column + IndicatorSuffix }

// Indicators adds a numeric 0/1 column per chosen column, 1 where the
// column misses a value, named by [IndicatorName] and appended after the
// existing columns in frame order. Which columns get one is decided at fit
// time: a column with no gap in train gets none unless All is set, so new
// data always gets the same columns.
type Indicators struct {
	// Columns chooses the columns of either kind; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// All gives an indicator to every chosen column, gaps in train or not.
	All bool `json:"all,omitempty"`
}

// IndicatorParams lists the indicators decided at fit time.
type IndicatorParams struct {
	Columns []Indicator `json:"columns"`
}

// Indicator is one indicator column and the column whose gaps it marks.
type Indicator struct {
	Source string `json:"source"`
	Name   string `json:"name"`
}

func init() { state.Register(Indicators{}) }

// Kind returns "impute.indicators".
func (Indicators) Kind() string { return "impute.indicators" }

// Fit decides which columns get an indicator. An indicator name that is
// already a column of train is an error naming it.
func (s Indicators) Fit(train *tabprep.Frame) (IndicatorParams, error) {
	const op = "impute.indicators fit"
	if err := tabprep.RequireTrain(op, train); err != nil {
		return IndicatorParams{}, err
	}
	names, err := s.Columns.ResolveAny(op, train)
	if err != nil {
		return IndicatorParams{}, err
	}
	p := IndicatorParams{Columns: []Indicator{}}
	for _, c := range columnsOf(train, names) {
		if !s.All && c.MissingCount() == 0 {
			continue
		}
		name := IndicatorName(c.Name())
		if train.Has(name) {
			return IndicatorParams{}, tabprep.Errorf(op, tabprep.ErrName, name, "already a column, so the indicator of %q cannot take its name; rename it first", c.Name())
		}
		p.Columns = append(p.Columns, Indicator{Source: c.Name(), Name: name})
	}
	return p, nil
}

// Transform appends the indicator columns to data.
func (s Indicators) Transform(p IndicatorParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	const op = "impute.indicators transform"
	add := make([]*tabprep.Column, len(p.Columns))
	for j, ind := range p.Columns {
		c, err := data.Column(ind.Source)
		if err != nil {
			return nil, lacksColumn(op, ind.Source)
		}
		if data.Has(ind.Name) {
			return nil, tabprep.Errorf(op, tabprep.ErrName, ind.Name, "already a column of the data; the indicator of %q needs the name", ind.Source)
		}
		v := make([]float64, data.NumRows())
		for i := range v {
			if c.IsMissing(i) {
				v[i] = 1
			}
		}
		add[j] = tabprep.AdoptNumeric(ind.Name, v)
	}
	return data.With(add...)
}

// RowKernel returns the indicators of p for single rows laid out by l;
// the indicator columns are appended.
func (s Indicators) RowKernel(p IndicatorParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	from, numeric, to, err := indicatorSlots(p, l)
	if err != nil {
		return nil, err
	}
	fn := func(regs []tabprep.Cell) error {
		for j, k := range from {
			c := &regs[k]
			miss := (numeric[j] && math.IsNaN(c.Num)) || (!numeric[j] && c.Code == tabprep.MissingCode)
			regs[to[j]] = tabprep.Cell{}
			if miss {
				regs[to[j]].Num = 1
			}
		}
		return nil
	}
	return fn, nil
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s Indicators) RowSource(p IndicatorParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	from, numeric, to, err := indicatorSlots(p, l)
	if err != nil {
		return err
	}
	for j, k := range from {
		out := w.Num(to[j])
		w.Line("%s = 0", out)
		if numeric[j] {
			w.Line("if %s != %s {", w.Num(k), w.Num(k))
		} else {
			w.Line("if %s == %d {", w.Code(k), tabprep.MissingCode)
		}
		w.Line("%s = 1", out)
		w.Line("}")
	}
	return nil
}

// indicatorSlots records the indicator columns of p in l and returns the
// slot of each source, whether it is numeric, and the slot of its
// indicator.
func indicatorSlots(p IndicatorParams, l *tabprep.RowLayout) (from []int, numeric []bool, to []int, err error) {
	const op = "impute.indicators row"
	from = make([]int, len(p.Columns))
	numeric = make([]bool, len(p.Columns))
	for j, ind := range p.Columns {
		k, f, ok := l.Slot(ind.Source)
		if !ok {
			return nil, nil, nil, tabprep.Errorf(op, tabprep.ErrSchema, ind.Source, "fitted on this column but the row layout lacks it")
		}
		from[j], numeric[j] = k, f.Kind == tabprep.Numeric
	}
	to = make([]int, len(p.Columns))
	for j, ind := range p.Columns {
		to[j] = l.Add(tabprep.Field{Name: ind.Name, Kind: tabprep.Numeric})
	}
	if err := l.Schema().Validate(); err != nil {
		return nil, nil, nil, err
	}
	return from, numeric, to, nil
}
