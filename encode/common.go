package encode

import (
	"fmt"
	"math"
	"slices"

	"github.com/tabprep/tabprep"
)

// Sentinel errors of this package. Each wraps the root sentinel named in
// its comment, so errors.Is works with either.
var (
	// ErrUnseen: a level not seen in training, under a policy that makes it
	// an error. Wraps [tabprep.ErrValue].
	ErrUnseen = fmt.Errorf("encode: level not seen in training: %w", tabprep.ErrValue)
	// ErrTooManyLevels: a column has more levels than the cap allows. Wraps
	// [tabprep.ErrOption].
	ErrTooManyLevels = fmt.Errorf("encode: too many levels: %w", tabprep.ErrOption)
	// ErrAmbiguous: a number format that reads one way under the chosen
	// separators and another way under the swapped ones. Wraps
	// [tabprep.ErrValue].
	ErrAmbiguous = fmt.Errorf("encode: ambiguous number format: %w", tabprep.ErrValue)
	// ErrBadCell: a cell that does not parse, under a policy that makes it an
	// error. Wraps [tabprep.ErrValue].
	ErrBadCell = fmt.Errorf("encode: cell does not parse: %w", tabprep.ErrValue)
)

// levelStats are the train counts of the used levels of a categorical
// column, levels sorted in byte order so that fitted parameters do not
// depend on row order.
type levelStats struct {
	levels  []string
	counts  []int
	missing int
	rows    int
}

func countLevels(c *tabprep.Column) levelStats {
	per := make([]int, len(c.Levels()))
	st := levelStats{rows: c.Len()}
	for _, k := range c.Codes() {
		if k == tabprep.MissingCode {
			st.missing++
			continue
		}
		per[k]++
	}
	type lc struct {
		l string
		n int
	}
	var used []lc
	for k, n := range per {
		if n > 0 {
			used = append(used, lc{c.Levels()[k], n})
		}
	}
	slices.SortFunc(used, func(a, b lc) int {
		switch {
		case a.l < b.l:
			return -1
		case a.l > b.l:
			return 1
		}
		return 0
	})
	st.levels = make([]string, len(used))
	st.counts = make([]int, len(used))
	for i, u := range used {
		st.levels[i], st.counts[i] = u.l, u.n
	}
	return st
}

// indexOf maps each level to its position.
func indexOf(levels []string) map[string]int32 {
	m := make(map[string]int32, len(levels))
	for i, l := range levels {
		m[l] = int32(i)
	}
	return m
}

// remap returns, for each code of c, the position of its level in index, or
// -1 for a level index does not hold. The lookup is per level, not per row.
func remap(c *tabprep.Column, index map[string]int32) []int32 {
	out := make([]int32, len(c.Levels()))
	for k, l := range c.Levels() {
		if i, ok := index[l]; ok {
			out[k] = i
		} else {
			out[k] = -1
		}
	}
	return out
}

// firstRowOf returns the first row whose code is k, for error messages.
func firstRowOf(c *tabprep.Column, k int32) int {
	return slices.Index(c.Codes(), k)
}

// columnOf returns the named column of data, which must have kind k: the
// kind the step was fitted on.
func columnOf(op string, data *tabprep.Frame, name string, k tabprep.Kind) (*tabprep.Column, error) {
	c, err := data.Column(name)
	if err != nil {
		return nil, tabprep.Errorf(op, tabprep.ErrNoColumn, name, "fitted on this column, but the data lacks it; it has %q", data.Names())
	}
	if c.Kind() != k {
		return nil, tabprep.Errorf(op, tabprep.ErrKind, name, "is %v; this step was fitted on it as %v", c.Kind(), k)
	}
	return c, nil
}

// resolve starts a Fit: it refuses holdout rows, resolves the selection to
// columns of kind k, and checks that every column named in a per-column
// option (what names it) is selected.
func resolve[V any](op string, train *tabprep.Frame, sel tabprep.Selection, k tabprep.Kind, what string, perColumn map[string]V) ([]string, error) {
	if err := tabprep.RequireTrain(op, train); err != nil {
		return nil, err
	}
	names, err := sel.Resolve(op, train, k)
	if err != nil {
		return nil, err
	}
	for col := range perColumn {
		if !slices.Contains(names, col) {
			return nil, tabprep.Errorf(op, tabprep.ErrOption, col, "has %s but is not selected; select it or remove the entry", what)
		}
	}
	return names, nil
}

// encoded is what a step made of one source column.
type encoded struct {
	source string
	cols   []*tabprep.Column
}

// inPlace reports whether e replaces its source under the same name.
func (e encoded) inPlace() bool {
	return len(e.cols) == 1 && e.cols[0].Name() == e.source
}

// assemble builds the output frame: a single output named like its source
// replaces it in place; otherwise the source is dropped and the outputs are
// appended after the remaining columns, in order. A new name that clashes
// with a kept column is an error, since replacing it would lose data.
func assemble(op string, data *tabprep.Frame, outs []encoded) (*tabprep.Frame, error) {
	var drop []string
	var cols []*tabprep.Column
	for _, e := range outs {
		if !e.inPlace() {
			drop = append(drop, e.source)
		}
		cols = append(cols, e.cols...)
	}
	base := data
	if len(drop) > 0 {
		var err error
		if base, err = data.Without(drop...); err != nil {
			return nil, err
		}
	}
	for _, e := range outs {
		if e.inPlace() {
			continue
		}
		for _, c := range e.cols {
			if base.Has(c.Name()) {
				return nil, tabprep.Errorf(op, tabprep.ErrName, c.Name(),
					"output of column %q clashes with a column of the data; rename that column", e.source)
			}
		}
	}
	return base.With(cols...)
}

// arrange records in l what an encoder does to a row, the way [assemble]
// lays out a frame: a source with one output of its own name is rewritten
// in its slot; any other source is dropped and its outputs are appended, in
// source order, in fresh consecutive slots. fields[i] are the output fields
// of sources[i]; each source must be in l with kind want. It returns, per
// source, the slot it is read from, its levels in the layout (codes index
// them), and the first slot of its outputs.
func arrange(op string, l *tabprep.RowLayout, sources []string, want tabprep.Kind, fields [][]tabprep.Field) (at []int, levels [][]string, to []int, err error) {
	at, to, levels = make([]int, len(sources)), make([]int, len(sources)), make([][]string, len(sources))
	for i, s := range sources {
		slot, f, ok := l.Slot(s)
		if !ok {
			return nil, nil, nil, tabprep.Errorf(op, tabprep.ErrNoColumn, s, "fitted on this column, but the row layout lacks it; it has %q", l.Schema().Names())
		}
		if f.Kind != want {
			return nil, nil, nil, tabprep.Errorf(op, tabprep.ErrKind, s, "is %v in the row layout, want %v", f.Kind, want)
		}
		at[i], levels[i] = slot, f.Levels
	}
	for i, s := range sources {
		if len(fields[i]) == 1 && fields[i][0].Name == s {
			to[i], _ = l.Set(s, fields[i][0])
		} else {
			l.Remove(s)
		}
	}
	for i, s := range sources {
		if len(fields[i]) == 1 && fields[i][0].Name == s {
			continue
		}
		for j, f := range fields[i] {
			slot := l.Add(f)
			if j == 0 {
				to[i] = slot
			}
		}
	}
	if err := l.Schema().Validate(); err != nil {
		return nil, nil, nil, tabprep.Errorf(op, tabprep.ErrName, "", "output row layout: %v; rename the clashing input column", err)
	}
	return at, levels, to, nil
}

// byCode returns, for each level of a layout, what index gives for it, or
// unseen for a level index lacks: a table a kernel reads with a cell's Code
// in place of a string lookup.
func byCode(levels []string, index map[string]int32, unseen int32) []int32 {
	t := make([]int32, len(levels))
	for k, lv := range levels {
		v, ok := index[lv]
		if !ok {
			v = unseen
		}
		t[k] = v
	}
	return t
}

// checkOption returns an option error unless v is one of allowed.
func checkOption[T ~string](op, field string, v T, allowed ...T) error {
	if slices.Contains(allowed, v) {
		return nil
	}
	return tabprep.Errorf(op, tabprep.ErrOption, "", "%s %q: use one of %q", field, v, allowed)
}

// split wraps consecutive runs of n values of block as numeric columns with
// the given names, without copying.
func split(names []string, block []float64, n int) []*tabprep.Column {
	cols := make([]*tabprep.Column, len(names))
	for j, name := range names {
		cols[j] = tabprep.AdoptNumeric(name, block[j*n:(j+1)*n:(j+1)*n])
	}
	return cols
}

// sourceNames returns the source column name of each fitted column: the
// outputs of a step that replaces its sources in place.
func sourceNames[T any](cols []T, name func(T) string) []string {
	out := make([]string, len(cols))
	for i, c := range cols {
		out[i] = name(c)
	}
	return out
}

// tableColumn is one source column of a [tableStep]: the width output
// values of each level of the layout, worked out when the kernel is made.
type tableColumn struct {
	// values holds width values per layout code; ok says per code whether
	// the level has values (false: a bad cell, by the step's OnBad).
	values []float64
	ok     []bool
	// missing are the values of a missing cell.
	missing []float64
	// unseen writes the values of a level the layout does not list into
	// out and reports whether it has values; it must not allocate.
	unseen func(level string, out []tabprep.Cell) bool
	// unseenValues are the values of every unseen level when they do not
	// depend on the level, or nil.
	unseenValues []float64
}

// tableStep is the row form of a step that makes width numeric outputs of
// each categorical source cell by a table per layout code, as a batch
// transform does per level: fields[i] are the outputs of sources[i], laid
// out by [arrange], and build returns the table of source i for its layout
// levels. A cell without values is NaN in every output, or under BadError
// an error wrapping [ErrBadCell] that says it is not what.
type tableStep struct {
	err     error // the step's parameters or options are unusable
	op      string
	sources []string
	fields  [][]tabprep.Field
	bad     OnBad
	what    string
	build   func(i int, levels []string) tableColumn
}

// tablePlan is one source column of a tableStep, by register slot.
type tablePlan struct {
	tableColumn
	from, to, width int
}

func (t tableStep) plans(l *tabprep.RowLayout) ([]tablePlan, error) {
	if t.err != nil {
		return nil, t.err
	}
	at, levels, to, err := arrange(t.op, l, t.sources, tabprep.Categorical, t.fields)
	if err != nil {
		return nil, err
	}
	plans := make([]tablePlan, len(t.sources))
	for i := range t.sources {
		plans[i] = tablePlan{tableColumn: t.build(i, levels[i]), from: at[i], to: to[i], width: len(t.fields[i])}
	}
	return plans, nil
}

// kernel returns the row kernel of the step for rows laid out by l.
func (t tableStep) kernel(l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	plans, err := t.plans(l)
	if err != nil {
		return nil, err
	}
	fn := func(regs []tabprep.Cell) error {
		for i := range plans {
			pl := &plans[i]
			// Read the source before writing: an output of its own name
			// shares its slot.
			c := regs[pl.from]
			out := regs[pl.to : pl.to+pl.width]
			ok := true
			switch {
			case c.Code >= 0:
				if ok = pl.ok[c.Code]; ok {
					for j, v := range pl.values[int(c.Code)*pl.width : int(c.Code+1)*pl.width] {
						out[j].Num = v
					}
				}
			case c.Code == tabprep.MissingCode:
				for j, v := range pl.missing {
					out[j].Num = v
				}
			default:
				ok = pl.unseen(c.Str, out)
			}
			if ok {
				continue
			}
			if t.bad == BadError {
				return tabprep.Errorf(t.op, ErrBadCell, t.sources[i], "%q is not %s; fix the cell, adjust the format options, or set Bad to %q", c.Str, t.what, BadMissing)
			}
			for j := range out {
				out[j].Num = math.NaN()
			}
		}
		return nil
	}
	return fn, nil
}

// source writes what kernel does as Go source, for generated plans: a
// switch on the level code sets the outputs to constants. A level first met
// in the row is left to the interpreted plan unless its values are fixed.
func (t tableStep) source(l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	plans, err := t.plans(l)
	if err != nil {
		return err
	}
	for _, pl := range plans {
		set := func(values []float64) {
			for j, v := range values {
				w.Line("%s = %s", w.Num(pl.to+j), w.Float(v))
			}
		}
		bad := func() {
			if t.bad == BadError {
				w.GiveUp()
				return
			}
			for j := range pl.width {
				w.Line("%s = math.NaN()", w.Num(pl.to+j))
			}
		}
		w.Line("switch %s {", w.Code(pl.from))
		for k, ok := range pl.ok {
			w.Line("case %d:", k)
			if ok {
				set(pl.values[k*pl.width : (k+1)*pl.width])
			} else {
				bad()
			}
		}
		w.Line("case %d:", tabprep.MissingCode)
		set(pl.missing)
		w.Line("default:")
		if pl.unseenValues != nil {
			set(pl.unseenValues)
		} else {
			w.GiveUp()
		}
		w.Line("}")
	}
	return nil
}

// zeroSource writes the statements that set the n numeric slots from slot
// to to 0, for a step's source form.
func zeroSource(w *tabprep.SourceWriter, to, n int) {
	for j := range n {
		w.Line("%s = 0", w.Num(to+j))
	}
}

// numericFields returns, per source, numeric output fields named by names.
func numericFields(sources []string, names func(source string) []string) [][]tabprep.Field {
	fields := make([][]tabprep.Field, len(sources))
	for i, s := range sources {
		for _, name := range names(s) {
			fields[i] = append(fields[i], tabprep.Field{Name: name, Kind: tabprep.Numeric})
		}
	}
	return fields
}

// constTable is the table of a column whose every layout level maps
// through value: the values of level k are value(levels[k]), and an unseen
// level gets unseen.
func constTable(levels []string, width int, value func(level string) []float64, missing, unseen []float64) tableColumn {
	t := tableColumn{values: make([]float64, len(levels)*width), ok: make([]bool, len(levels)), missing: missing}
	for k, lv := range levels {
		copy(t.values[k*width:], value(lv))
		t.ok[k] = true
	}
	t.unseen = func(_ string, out []tabprep.Cell) bool {
		for j, v := range unseen {
			out[j].Num = v
		}
		return true
	}
	t.unseenValues = unseen
	return t
}
