package impute

import (
	"strings"

	"github.com/tabprep/tabprep"
)

// numericColumns resolves sel over the numeric columns of f: the zero
// Selection chooses every numeric column.
func numericColumns(op string, f *tabprep.Frame, sel tabprep.Selection) ([]*tabprep.Column, error) {
	names, err := sel.Resolve(op, f, tabprep.Numeric)
	if err != nil {
		return nil, err
	}
	return columnsOf(f, names), nil
}

// columnsOf returns the named columns of f, which are known to exist.
func columnsOf(f *tabprep.Frame, names []string) []*tabprep.Column {
	out := make([]*tabprep.Column, len(names))
	for i, n := range names {
		out[i] = f.Col(f.Index(n))
	}
	return out
}

// inputColumn returns the named column of data for a transform, checking
// that it still has the kind it had at fit time.
func inputColumn(op string, data *tabprep.Frame, name string, kind tabprep.Kind) (*tabprep.Column, error) {
	c, err := data.Column(name)
	if err != nil {
		return nil, lacksColumn(op, name)
	}
	if c.Kind() != kind {
		return nil, tabprep.Errorf(op, tabprep.ErrSchema, name, "is %v, but was %v at fit time", c.Kind(), kind)
	}
	return c, nil
}

// lacksColumn is the error of a transform whose data lacks a fitted column.
func lacksColumn(op, name string) error {
	return tabprep.Errorf(op, tabprep.ErrSchema, name, "fitted on this column but the data lacks it; pass data with the train columns")
}

// numericPositions returns the position in the row layout in of each named
// column, which must be numeric.
func numericPositions(op string, l *tabprep.RowLayout, names []string) ([]int, error) {
	slots := make([]int, len(names))
	for j, name := range names {
		k, f, ok := l.Slot(name)
		if !ok {
			return nil, tabprep.Errorf(op, tabprep.ErrSchema, name, "fitted on this column but the row layout lacks it")
		}
		if f.Kind != tabprep.Numeric {
			return nil, tabprep.Errorf(op, tabprep.ErrSchema, name, "is %v in the row layout, but was numeric at fit time", f.Kind)
		}
		slots[j] = k
	}
	return slots, nil
}

// gapsGiveUp writes the source that leaves a row with a gap in any of the
// numeric columns to the interpreted plan.
func gapsGiveUp(op string, columns []string, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	slots, err := numericPositions(op, l, columns)
	if err != nil || len(slots) == 0 {
		return err
	}
	var cond []string
	for _, k := range slots {
		cond = append(cond, w.Num(k)+" != "+w.Num(k))
	}
	w.Line("if %s {", strings.Join(cond, " || "))
	w.GiveUp()
	w.Line("}")
	return nil
}
