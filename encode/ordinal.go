package encode

import (
	"slices"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// Ordinal replaces each selected categorical column by a numeric column of
// the same name holding each level's position: 0, 1, 2, … in the order given
// in Order for that column (for ordered data such as small < medium <
// large), or by default in byte order of the train levels.
//
// A level training never saw gets UnseenCode, and a missing cell gets
// MissingCode; when either is nil, such a cell is an error naming the
// column, row and level. [Code] makes the pointer.
type Ordinal struct {
	// Columns selects categorical columns; the zero value selects all.
	Columns tabprep.Selection `json:"columns"`
	// Order gives a column's levels in code order. It must hold every level
	// of the column's train rows, and may hold levels train lacks.
	Order map[string][]string `json:"order,omitempty"`
	// UnseenCode is the code of an unseen level; nil makes it an error.
	UnseenCode *state.Float `json:"unseen_code,omitempty"`
	// MissingCode is the code of a missing cell (NaN keeps it missing); nil
	// makes it an error.
	MissingCode *state.Float `json:"missing_code,omitempty"`
}

// Code returns a pointer to v, for [Ordinal.UnseenCode] and
// [Ordinal.MissingCode].
func Code(v float64) *state.Float {
	f := state.Float(v)
	return &f
}

// OrdinalParams are the fitted codes of each column of an [Ordinal] step.
type OrdinalParams struct {
	Columns []OrdinalColumn `json:"columns"`
}

// OrdinalColumn holds a column's levels; a level's code is its position.
type OrdinalColumn struct {
	Name   string   `json:"name"`
	Levels []string `json:"levels"`
}

func init() { state.Register(Ordinal{}) }

// Kind returns "encode.ordinal".
func (Ordinal) Kind() string { return "encode.ordinal" }

// Outputs returns the names of the columns the step writes: the source
// names, replaced in place.
func (p OrdinalParams) Outputs() []string {
	return sourceNames(p.Columns, func(c OrdinalColumn) string { return c.Name })
}

// Fit fixes the code of each level of each selected column.
func (s Ordinal) Fit(train *tabprep.Frame) (OrdinalParams, error) {
	const op = "encode.ordinal fit"
	names, err := resolve(op, train, s.Columns, tabprep.Categorical, "an order", s.Order)
	if err != nil {
		return OrdinalParams{}, err
	}
	var p OrdinalParams
	for _, name := range names {
		c, _ := train.Column(name)
		st := countLevels(c)
		order, given := s.Order[name]
		if !given {
			p.Columns = append(p.Columns, OrdinalColumn{Name: name, Levels: st.levels})
			continue
		}
		index := make(map[string]bool, len(order))
		for _, l := range order {
			if l == "" || index[l] {
				return OrdinalParams{}, tabprep.Errorf(op, tabprep.ErrOption, name, "order lists %q empty or twice; list each level once", l)
			}
			index[l] = true
		}
		for _, l := range st.levels {
			if !index[l] {
				return OrdinalParams{}, tabprep.Errorf(op, tabprep.ErrOption, name,
					"train level %q is not in the given order %q; add it", l, order).AtRow(firstRowOf(c, int32(slices.Index(c.Levels(), l))))
			}
		}
		p.Columns = append(p.Columns, OrdinalColumn{Name: name, Levels: slices.Clone(order)})
	}
	return p, nil
}

// fallback returns the code of an unseen or missing cell, and false when
// such a cell is an error.
func (s Ordinal) fallback(code *state.Float) (float64, bool) {
	if code == nil {
		return 0, false
	}
	return float64(*code), true
}

// Transform replaces each fitted column by its codes. It does not modify
// data.
func (s Ordinal) Transform(p OrdinalParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	const op = "encode.ordinal transform"
	unseen, unseenOK := s.fallback(s.UnseenCode)
	missing, missingOK := s.fallback(s.MissingCode)
	outs := make([]encoded, len(p.Columns))
	for ci, oc := range p.Columns {
		c, err := columnOf(op, data, oc.Name, tabprep.Categorical)
		if err != nil {
			return nil, err
		}
		codeOf := remap(c, indexOf(oc.Levels))
		vals := make([]float64, c.Len())
		for row, k := range c.Codes() {
			switch {
			case k == tabprep.MissingCode:
				if !missingOK {
					return nil, tabprep.Errorf(op, tabprep.ErrValue, oc.Name, "missing cell and no MissingCode; set MissingCode (NaN keeps it missing) or fill the column first").AtRow(row)
				}
				vals[row] = missing
			case codeOf[k] < 0:
				if !unseenOK {
					return nil, tabprep.Errorf(op, ErrUnseen, oc.Name, "level %q was not seen in training and no UnseenCode is set; set one or add the level to Order", c.Levels()[k]).AtRow(row)
				}
				vals[row] = unseen
			default:
				vals[row] = float64(codeOf[k])
			}
		}
		outs[ci] = encoded{source: oc.Name, cols: []*tabprep.Column{tabprep.AdoptNumeric(oc.Name, vals)}}
	}
	return assemble(op, data, outs)
}

// ordinalNone marks, in an ordinal row table, a layout level training
// never saw.
const ordinalNone = -1

// rows records the step's columns in l and returns, for each, its slot and
// the code of each layout level.
func (s Ordinal) rows(op string, p OrdinalParams, l *tabprep.RowLayout) (at []int, tables [][]int32, err error) {
	sources := make([]string, len(p.Columns))
	fields := make([][]tabprep.Field, len(p.Columns))
	for i, oc := range p.Columns {
		sources[i] = oc.Name
		fields[i] = []tabprep.Field{{Name: oc.Name, Kind: tabprep.Numeric}}
	}
	at, levels, _, err := arrange(op, l, sources, tabprep.Categorical, fields)
	if err != nil {
		return nil, nil, err
	}
	tables = make([][]int32, len(p.Columns))
	for i, oc := range p.Columns {
		tables[i] = byCode(levels[i], indexOf(oc.Levels), ordinalNone)
	}
	return at, tables, nil
}

// RowKernel returns a row function that writes the same cells as
// [Ordinal.Transform], without allocating.
func (s Ordinal) RowKernel(p OrdinalParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	const op = "encode.ordinal row"
	unseen, unseenOK := s.fallback(s.UnseenCode)
	missing, missingOK := s.fallback(s.MissingCode)
	at, tables, err := s.rows(op, p, l)
	if err != nil {
		return nil, err
	}
	// The column turns numeric: only Num is written, since a numeric
	// cell's Str and Code mean nothing (see tabprep.RowFunc).
	fn := func(regs []tabprep.Cell) error {
		for i, table := range tables {
			c := &regs[at[i]]
			k := int32(ordinalNone)
			switch {
			case c.Code >= 0:
				k = table[c.Code]
			case c.Code == tabprep.MissingCode:
				if !missingOK {
					return tabprep.Errorf(op, tabprep.ErrValue, p.Columns[i].Name, "missing cell and no MissingCode; set MissingCode or fill the column first")
				}
				c.Num = missing
				continue
			}
			if k == ordinalNone {
				if !unseenOK {
					return tabprep.Errorf(op, ErrUnseen, p.Columns[i].Name, "level %q was not seen in training and no UnseenCode is set", c.Str)
				}
				c.Num = unseen
				continue
			}
			c.Num = float64(k)
		}
		return nil
	}
	return fn, nil
}

// RowSource writes what RowKernel does as Go source, for generated plans:
// a switch from level code to number.
func (s Ordinal) RowSource(p OrdinalParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	unseen, unseenOK := s.fallback(s.UnseenCode)
	missing, missingOK := s.fallback(s.MissingCode)
	at, tables, err := s.rows("encode.ordinal row", p, l)
	if err != nil {
		return err
	}
	set := func(n string, v float64, ok bool) {
		if !ok {
			w.GiveUp()
			return
		}
		w.Line("%s = %s", n, w.Float(v))
	}
	for i, table := range tables {
		n := w.Num(at[i])
		w.Line("switch %s {", w.Code(at[i]))
		for code, k := range table {
			if k != ordinalNone {
				w.Line("case %d:", code)
				set(n, float64(k), true)
			}
		}
		w.Line("case %d:", tabprep.MissingCode)
		set(n, missing, missingOK)
		w.Line("default:")
		set(n, unseen, unseenOK)
		w.Line("}")
	}
	return nil
}

var (
	_ tabprep.RowKernel[OrdinalParams] = Ordinal{}
	_ tabprep.RowSource[OrdinalParams] = Ordinal{}
)
