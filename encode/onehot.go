package encode

import (
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// DefaultMaxLevels is the cap on one-hot output columns per source column
// when [OneHot.MaxLevels] is zero.
const DefaultMaxLevels = 1000

// Unseen is the policy for a level that training never saw.
type Unseen string

// The policies for an unseen level.
const (
	// UnseenZeros writes 0 in every column of the source: the level is no
	// evidence for any known level. The default of [OneHot].
	UnseenZeros Unseen = "zeros"
	// UnseenError makes the transform fail, naming the column, row and level.
	UnseenError Unseen = "error"
	// UnseenOther writes 1 in the "other" column, which then always exists.
	UnseenOther Unseen = "other"
)

// MissingAs is the policy for a missing cell.
type MissingAs string

// The policies for a missing cell in [OneHot].
const (
	// MissingZeros writes 0 in every column of the source. The default.
	MissingZeros MissingAs = "zeros"
	// MissingColumn writes 1 in a column of its own, named "<column>#missing".
	MissingColumn MissingAs = "column"
)

// OneHot turns each selected categorical column into one 0/1 numeric column
// per level seen in train, named "<column>=<level>", in byte order of the
// levels. The source column is dropped and its outputs appended after the
// remaining columns.
//
// Levels seen in fewer than MinCount train rows, or in a smaller share of
// train rows than MinShare, are grouped into one column "<column>#other".
// The Reference level of a column gets no column of its own (its rows are
// all zeros), which removes the exact collinearity of a full set of
// indicators in a linear model.
type OneHot struct {
	// Columns selects categorical columns; the zero value selects all.
	Columns tabprep.Selection `json:"columns"`
	// Reference maps a column to the level left out; optional.
	Reference map[string]string `json:"reference,omitempty"`
	// MinCount groups levels with fewer train rows into "other".
	MinCount int `json:"min_count,omitempty"`
	// MinShare groups levels with a smaller share of train rows into "other".
	MinShare float64 `json:"min_share,omitempty"`
	// MaxLevels caps the output columns per source; 0 means DefaultMaxLevels.
	MaxLevels int `json:"max_levels,omitempty"`
	// Unseen is the policy for levels training never saw; "" means UnseenZeros.
	Unseen Unseen `json:"unseen,omitempty"`
	// Missing is the policy for missing cells; "" means MissingZeros.
	Missing MissingAs `json:"missing,omitempty"`
}

// OneHotParams are the fitted levels of each column of a [OneHot] step.
type OneHotParams struct {
	Columns []OneHotColumn `json:"columns"`
}

// OneHotColumn is what a [OneHot] step learned of one column.
type OneHotColumn struct {
	// Name is the source column.
	Name string `json:"name"`
	// Levels have a column each, in output order.
	Levels []string `json:"levels"`
	// Reference is the level left out, if any.
	Reference string `json:"reference,omitempty"`
	// Rare are the train levels grouped into the other column.
	Rare []string `json:"rare,omitempty"`
	// Other reports whether the "<column>#other" column exists.
	Other bool `json:"other"`
	// Missing reports whether the "<column>#missing" column exists.
	Missing bool `json:"missing"`
}

func init() { state.Register(OneHot{}) }

// Kind returns "encode.onehot".
func (OneHot) Kind() string { return "encode.onehot" }

// Names returns the output column names of the column, in order.
func (c OneHotColumn) Names() []string {
	out := make([]string, 0, len(c.Levels)+2)
	for _, l := range c.Levels {
		out = append(out, c.Name+"="+l)
	}
	if c.Other {
		out = append(out, c.Name+"#other")
	}
	if c.Missing {
		out = append(out, c.Name+"#missing")
	}
	return out
}

// Outputs returns the names of the columns the step writes, in order.
func (p OneHotParams) Outputs() []string {
	var out []string
	for _, c := range p.Columns {
		out = append(out, c.Names()...)
	}
	return out
}

func (s OneHot) options(op string) error {
	if err := checkOption(op, "Unseen", s.Unseen, "", UnseenZeros, UnseenError, UnseenOther); err != nil {
		return err
	}
	if err := checkOption(op, "Missing", s.Missing, "", MissingZeros, MissingColumn); err != nil {
		return err
	}
	if s.MinCount < 0 || s.MaxLevels < 0 || !(s.MinShare >= 0 && s.MinShare < 1) {
		return tabprep.Errorf(op, tabprep.ErrOption, "", "MinCount %d, MaxLevels %d, MinShare %v: counts must be ≥ 0 and the share in [0, 1)", s.MinCount, s.MaxLevels, s.MinShare)
	}
	return nil
}

// Fit learns the levels of each selected column from train.
func (s OneHot) Fit(train *tabprep.Frame) (OneHotParams, error) {
	const op = "encode.onehot fit"
	names, err := resolve(op, train, s.Columns, tabprep.Categorical, "a reference level", s.Reference)
	if err != nil {
		return OneHotParams{}, err
	}
	if err := s.options(op); err != nil {
		return OneHotParams{}, err
	}
	maxLevels := s.MaxLevels
	if maxLevels == 0 {
		maxLevels = DefaultMaxLevels
	}
	var p OneHotParams
	for _, name := range names {
		c, _ := train.Column(name)
		st := countLevels(c)
		ref, hasRef := s.Reference[name]
		oc := OneHotColumn{Name: name, Levels: []string{}, Reference: ref, Missing: s.Missing == MissingColumn}
		refFound := false
		for i, l := range st.levels {
			n := st.counts[i]
			if n < s.MinCount || float64(n) < s.MinShare*float64(st.rows) {
				oc.Rare = append(oc.Rare, l)
				continue
			}
			if hasRef && l == ref {
				refFound = true
				continue
			}
			oc.Levels = append(oc.Levels, l)
		}
		if hasRef && !refFound {
			return OneHotParams{}, tabprep.Errorf(op, tabprep.ErrOption, name,
				"reference level %q is not a level with its own column in train (absent or grouped as rare); choose one of %q", ref, oc.Levels)
		}
		oc.Other = len(oc.Rare) > 0 || s.Unseen == UnseenOther
		if n := len(oc.Names()); n > maxLevels {
			return OneHotParams{}, tabprep.Errorf(op, ErrTooManyLevels, name,
				"%d output columns, over the cap of %d; raise MaxLevels, group rare levels with MinCount or MinShare, or use encode.Hash", n, maxLevels)
		}
		p.Columns = append(p.Columns, oc)
	}
	return p, nil
}

// slots returns the output position of each known level within c's block
// (-1 for none) and the positions of the other and missing columns (-1 if
// absent).
func (c OneHotColumn) slots() (index map[string]int32, other, missing int32) {
	index = make(map[string]int32, len(c.Levels)+len(c.Rare)+1)
	for i, l := range c.Levels {
		index[l] = int32(i)
	}
	other, missing = -1, -1
	next := int32(len(c.Levels))
	if c.Other {
		other = next
		next++
	}
	if c.Missing {
		missing = next
	}
	for _, l := range c.Rare {
		index[l] = other
	}
	if c.Reference != "" {
		index[c.Reference] = -1
	}
	return index, other, missing
}

// unseenSlot is where an unseen level goes: a slot, -1 for zeros, or -2 for
// an error.
func (s OneHot) unseenSlot(other int32) int32 {
	switch s.Unseen {
	case UnseenError:
		return -2
	case UnseenOther:
		return other
	}
	return -1
}

// Transform writes the 0/1 columns of each fitted column. It does not
// modify data.
func (s OneHot) Transform(p OneHotParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	const op = "encode.onehot transform"
	n := data.NumRows()
	outs := make([]encoded, len(p.Columns))
	for ci, oc := range p.Columns {
		c, err := columnOf(op, data, oc.Name, tabprep.Categorical)
		if err != nil {
			return nil, err
		}
		index, other, missing := oc.slots()
		unseen := s.unseenSlot(other)
		slot := make([]int32, len(c.Levels()))
		for k, l := range c.Levels() {
			i, ok := index[l]
			if !ok {
				i = unseen
			}
			slot[k] = i
		}
		names := oc.Names()
		// One block for all outputs of the column: a single allocation that
		// the runtime hands out zeroed, so only the ones are written.
		block := make([]float64, n*len(names))
		for row, k := range c.Codes() {
			var j int32
			if k == tabprep.MissingCode {
				j = missing
			} else {
				j = slot[k]
			}
			if j >= 0 {
				block[int(j)*n+row] = 1
			} else if j == -2 {
				return nil, tabprep.Errorf(op, ErrUnseen, oc.Name,
					"level %q was not seen in training; the step's Unseen policy is %q: use %q or %q to accept it", c.Levels()[k], UnseenError, UnseenZeros, UnseenOther).AtRow(row)
			}
		}
		outs[ci] = encoded{source: oc.Name, cols: split(names, block, n)}
	}
	return assemble(op, data, outs)
}

// oneHotRow is the row form of one fitted column of a one-hot step.
type oneHotRow struct {
	source          string
	from, to, width int
	table           []int32 // by layout code: output offset, -1 none, -2 error
	missing, unseen int32
}

// rows records the step's columns in l and returns their row form.
func (s OneHot) rows(op string, p OneHotParams, l *tabprep.RowLayout) ([]oneHotRow, error) {
	sources := make([]string, len(p.Columns))
	fields := make([][]tabprep.Field, len(p.Columns))
	for i, oc := range p.Columns {
		sources[i] = oc.Name
		for _, name := range oc.Names() {
			fields[i] = append(fields[i], tabprep.Field{Name: name, Kind: tabprep.Numeric})
		}
	}
	at, levels, to, err := arrange(op, l, sources, tabprep.Categorical, fields)
	if err != nil {
		return nil, err
	}
	rows := make([]oneHotRow, len(p.Columns))
	for i, oc := range p.Columns {
		index, other, missing := oc.slots()
		unseen := s.unseenSlot(other)
		rows[i] = oneHotRow{source: sources[i], from: at[i], to: to[i], width: len(fields[i]), table: byCode(levels[i], index, unseen), missing: missing, unseen: unseen}
	}
	return rows, nil
}

// RowKernel returns a row function that writes the same cells as
// [OneHot.Transform], without allocating: each level's output position is
// looked up once per cell in a table built here.
func (s OneHot) RowKernel(p OneHotParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	const op = "encode.onehot row"
	plans, err := s.rows(op, p, l)
	if err != nil {
		return nil, err
	}
	fn := func(regs []tabprep.Cell) error {
		for i := range plans {
			pl := &plans[i]
			c := &regs[pl.from]
			j := pl.unseen
			switch {
			case c.Code >= 0:
				j = pl.table[c.Code]
			case c.Code == tabprep.MissingCode:
				j = pl.missing
			}
			if j == -2 {
				return tabprep.Errorf(op, ErrUnseen, pl.source, "level %q was not seen in training; the step's Unseen policy is %q", c.Str, UnseenError)
			}
			// The output slots are this kernel's own and numeric, so only
			// their numbers need writing.
			out := regs[pl.to : pl.to+pl.width]
			for k := range out {
				out[k].Num = 0
			}
			if j >= 0 {
				out[j].Num = 1
			}
		}
		return nil
	}
	return fn, nil
}

// RowSource writes what RowKernel does as Go source, for generated plans:
// every output starts at 0 and a switch on the level code sets the one.
func (s OneHot) RowSource(p OneHotParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	plans, err := s.rows("encode.onehot row", p, l)
	if err != nil {
		return err
	}
	for _, pl := range plans {
		zeroSource(w, pl.to, pl.width)
		set := func(j int32) {
			switch {
			case j == -2:
				w.GiveUp()
			case j >= 0:
				w.Line("%s = 1", w.Num(pl.to+int(j)))
			}
		}
		w.Line("switch %s {", w.Code(pl.from))
		for code, j := range pl.table {
			if j != pl.unseen {
				w.Line("case %d:", code)
				set(j)
			}
		}
		w.Line("case %d:", tabprep.MissingCode)
		set(pl.missing)
		w.Line("default:")
		set(pl.unseen)
		w.Line("}")
	}
	return nil
}

var (
	_ tabprep.RowKernel[OneHotParams] = OneHot{}
	_ tabprep.RowSource[OneHotParams] = OneHot{}
)
