package tabprep

import (
	"fmt"
	"slices"
)

// Frame is an ordered set of equal-length, uniquely named columns and a
// [Role] per row. A Frame is immutable: every method that changes something
// returns a new Frame, which shares the columns it did not change.
type Frame struct {
	cols  []*Column
	index map[string]int
	rows  int
	roles roleTable
}

// NewFrame returns a frame of the given columns, every row train. Names must
// be non-empty and distinct, and the columns of equal length.
func NewFrame(cols ...*Column) (*Frame, error) {
	const op = "tabprep.frame"
	f := &Frame{cols: slices.Clone(cols), index: make(map[string]int, len(cols))}
	for i, c := range cols {
		if c == nil {
			return nil, Errorf(op, ErrName, "", "column %d is nil", i)
		}
		if c.name == "" {
			return nil, Errorf(op, ErrName, "", "column %d has an empty name; give every column a name", i)
		}
		if j, dup := f.index[c.name]; dup {
			return nil, Errorf(op, ErrName, c.name, "name used by columns %d and %d; names must be distinct", j, i)
		}
		f.index[c.name] = i
		if i == 0 {
			f.rows = c.Len()
		} else if c.Len() != f.rows {
			return nil, Errorf(op, ErrLength, c.name, "%d rows, but column %q has %d", c.Len(), cols[0].name, f.rows)
		}
	}
	return f, nil
}

// MustFrame is like [NewFrame] but panics on error. It is for frames
// written out in code, such as tests and examples.
func MustFrame(cols ...*Column) *Frame {
	f, err := NewFrame(cols...)
	if err != nil {
		panic(err)
	}
	return f
}

// NumRows returns the number of rows.
func (f *Frame) NumRows() int { return f.rows }

// NumCols returns the number of columns.
func (f *Frame) NumCols() int { return len(f.cols) }

// Names returns the column names in order.
func (f *Frame) Names() []string {
	names := make([]string, len(f.cols))
	for i, c := range f.cols {
		names[i] = c.name
	}
	return names
}

// Col returns column i. It panics if i is out of range.
func (f *Frame) Col(i int) *Column { return f.cols[i] }

// Columns returns the columns in order. The slice is a copy; the columns are
// shared and immutable.
func (f *Frame) Columns() []*Column { return slices.Clone(f.cols) }

// Has reports whether f has a column named name.
func (f *Frame) Has(name string) bool {
	_, ok := f.index[name]
	return ok
}

// Index returns the position of the named column, or -1.
func (f *Frame) Index(name string) int {
	if i, ok := f.index[name]; ok {
		return i
	}
	return -1
}

// Column returns the named column, or an error wrapping [ErrNoColumn].
func (f *Frame) Column(name string) (*Column, error) {
	if i, ok := f.index[name]; ok {
		return f.cols[i], nil
	}
	return nil, Errorf("tabprep.frame", ErrNoColumn, name, "not in frame; it has %s", nameList(f.Names()))
}

// ColumnOf returns the named column if it has kind k, or an error wrapping
// [ErrNoColumn] or [ErrKind].
func (f *Frame) ColumnOf(name string, k Kind) (*Column, error) {
	c, err := f.Column(name)
	if err != nil {
		return nil, err
	}
	if c.kind != k {
		return nil, Errorf("tabprep.frame", ErrKind, name, "is %v, want %v", c.kind, k)
	}
	return c, nil
}

func nameList(names []string) string {
	const show = 8
	if len(names) == 0 {
		return "no columns"
	}
	if len(names) > show {
		return fmt.Sprintf("%q and %d more", names[:show], len(names)-show)
	}
	return fmt.Sprintf("%q", names)
}

// Schema returns the names, kinds and levels of the columns.
func (f *Frame) Schema() Schema {
	s := Schema{Columns: make([]Field, len(f.cols))}
	for i, c := range f.cols {
		s.Columns[i] = Field{Name: c.name, Kind: c.kind}
		if c.kind == Categorical {
			s.Columns[i].Levels = slices.Clone(c.levels)
		}
	}
	return s
}

// Role returns the role of row i. It panics if i is out of range.
func (f *Frame) Role(i int) Role {
	if i < 0 || i >= f.rows {
		panic(fmt.Sprintf("tabprep: row %d out of range [0, %d)", i, f.rows))
	}
	return f.roles.role(i)
}

// Roles returns the role of every row.
func (f *Frame) Roles() []Role {
	out := make([]Role, f.rows)
	for i := range out {
		out[i] = f.roles.role(i)
	}
	return out
}

// HoldoutCount returns the number of rows tagged holdout.
func (f *Frame) HoldoutCount() int { return f.roles.holdouts() }

// Partitions returns the names of the holdout partitions some row is tagged
// with, in order of first use.
func (f *Frame) Partitions() []string {
	used := make([]bool, len(f.roles.parts))
	for _, c := range f.roles.codes {
		if c != 0 {
			used[c-1] = true
		}
	}
	var out []string
	for i, p := range f.roles.parts {
		if used[i] {
			out = append(out, p)
		}
	}
	return out
}

// WithRoles returns a frame with the same columns and the given role per row.
func (f *Frame) WithRoles(roles []Role) (*Frame, error) {
	if len(roles) != f.rows {
		return nil, Errorf("tabprep.frame", ErrLength, "", "%d roles for %d rows", len(roles), f.rows)
	}
	var t roleTable
	codes := make([]uint8, f.rows)
	for i, r := range roles {
		r, err := r.normal()
		if err != nil {
			return nil, err.(*Error).AtRow(i)
		}
		if codes[i], err = t.code(r); err != nil {
			return nil, err
		}
	}
	if len(t.parts) > 0 {
		t.codes = codes
	}
	g := *f
	g.roles = t
	return &g, nil
}

// Tag returns a frame in which the given rows have role r and the other rows
// keep theirs. Rows may come in any order; an index out of range is an error.
func (f *Frame) Tag(r Role, rows []int) (*Frame, error) {
	r, err := r.normal()
	if err != nil {
		return nil, err
	}
	t := roleTable{parts: slices.Clone(f.roles.parts)}
	code, err := t.code(r)
	if err != nil {
		return nil, err
	}
	t.codes = make([]uint8, f.rows)
	copy(t.codes, f.roles.codes)
	for _, i := range rows {
		if i < 0 || i >= f.rows {
			return nil, Errorf("tabprep.frame", ErrRow, "", "row index %d outside [0, %d)", i, f.rows)
		}
		t.codes[i] = code
	}
	if t.holdouts() == 0 {
		t = roleTable{}
	}
	g := *f
	g.roles = t
	return &g, nil
}

// Select returns the rows whose role is r, in order. Select(Train) is the
// same as [Frame.Train].
func (f *Frame) Select(r Role) *Frame {
	r, err := r.normal()
	if err != nil {
		return f.take(nil)
	}
	var rows []int
	for i := 0; i < f.rows; i++ {
		if f.roles.role(i) == r {
			rows = append(rows, i)
		}
	}
	return f.take(rows)
}

// Train returns the train rows, in order.
func (f *Frame) Train() *Frame {
	if f.roles.codes == nil {
		return f
	}
	return f.Select(Train)
}

// HoldoutRows returns every holdout row, whatever its partition, in order.
func (f *Frame) HoldoutRows() *Frame {
	var rows []int
	for i, c := range f.roles.codes {
		if c != 0 {
			rows = append(rows, i)
		}
	}
	return f.take(rows)
}

// Take returns the given rows in the given order, roles included. Indexes
// may repeat; one out of range is an error wrapping [ErrRow].
func (f *Frame) Take(rows []int) (*Frame, error) {
	for _, i := range rows {
		if i < 0 || i >= f.rows {
			return nil, Errorf("tabprep.frame", ErrRow, "", "row index %d outside [0, %d)", i, f.rows)
		}
	}
	return f.take(rows), nil
}

// Slice returns rows [from, to), sharing no storage with f.
func (f *Frame) Slice(from, to int) (*Frame, error) {
	if from < 0 || to > f.rows || from > to {
		return nil, Errorf("tabprep.frame", ErrRow, "", "slice [%d, %d) outside [0, %d]", from, to, f.rows)
	}
	rows := make([]int, to-from)
	for i := range rows {
		rows[i] = from + i
	}
	return f.take(rows), nil
}

func (f *Frame) take(rows []int) *Frame {
	g := &Frame{cols: make([]*Column, len(f.cols)), index: f.index, rows: len(rows), roles: f.roles.take(rows)}
	for i, c := range f.cols {
		g.cols[i] = c.take(rows)
	}
	return g
}

// With returns a frame in which each given column replaces the column of the
// same name, in its place, or is appended if no column has that name. The
// new columns must have f's row count and distinct names. Roles are kept.
func (f *Frame) With(cols ...*Column) (*Frame, error) {
	const op = "tabprep.frame"
	g := &Frame{cols: slices.Clone(f.cols), rows: f.rows, roles: f.roles, index: f.index}
	added := false
	seen := make(map[string]bool, len(cols))
	for _, c := range cols {
		if c == nil || c.name == "" {
			return nil, Errorf(op, ErrName, "", "nil column or empty name in With")
		}
		if seen[c.name] {
			return nil, Errorf(op, ErrName, c.name, "given twice to With")
		}
		seen[c.name] = true
		if c.Len() != f.rows {
			return nil, Errorf(op, ErrLength, c.name, "%d rows, frame has %d", c.Len(), f.rows)
		}
		if i, ok := f.index[c.name]; ok {
			g.cols[i] = c
			continue
		}
		if !added {
			g.index = make(map[string]int, len(f.cols)+len(cols))
			for k, v := range f.index {
				g.index[k] = v
			}
			added = true
		}
		g.index[c.name] = len(g.cols)
		g.cols = append(g.cols, c)
	}
	return g, nil
}

// Without returns a frame without the named columns. A name f does not have
// is an error wrapping [ErrNoColumn].
func (f *Frame) Without(names ...string) (*Frame, error) {
	drop := make(map[string]bool, len(names))
	for _, n := range names {
		if !f.Has(n) {
			_, err := f.Column(n)
			return nil, err
		}
		drop[n] = true
	}
	keep := make([]*Column, 0, len(f.cols))
	for _, c := range f.cols {
		if !drop[c.name] {
			keep = append(keep, c)
		}
	}
	return f.reshape(keep), nil
}

// Project returns a frame of the named columns in the given order. A missing
// name is an error wrapping [ErrNoColumn].
func (f *Frame) Project(names ...string) (*Frame, error) {
	cols := make([]*Column, len(names))
	for i, n := range names {
		c, err := f.Column(n)
		if err != nil {
			return nil, err
		}
		cols[i] = c
	}
	g, err := NewFrame(cols...)
	if err != nil {
		return nil, err
	}
	g.rows, g.roles = f.rows, f.roles
	return g, nil
}

// reshape returns a frame of cols (already known to be valid and of f's
// length), keeping f's roles.
func (f *Frame) reshape(cols []*Column) *Frame {
	g := &Frame{cols: cols, index: make(map[string]int, len(cols)), rows: f.rows, roles: f.roles}
	for i, c := range cols {
		g.index[c.name] = i
	}
	return g
}

// Concat returns the rows of the frames one after another, roles included.
// Every frame must have the same column names and kinds in the same order.
// Categorical levels are merged: the result's levels are those of the first
// frame followed by new levels in order of appearance.
func Concat(frames ...*Frame) (*Frame, error) {
	const op = "tabprep.concat"
	if len(frames) == 0 {
		return NewFrame()
	}
	first := frames[0]
	total := 0
	for k, g := range frames {
		if g.NumCols() != first.NumCols() {
			return nil, Errorf(op, ErrSchema, "", "frame %d has %d columns, frame 0 has %d", k, g.NumCols(), first.NumCols())
		}
		for i, c := range g.cols {
			if c.name != first.cols[i].name || c.kind != first.cols[i].kind {
				return nil, Errorf(op, ErrSchema, c.name, "frame %d column %d is %q (%v), frame 0 has %q (%v)",
					k, i, c.name, c.kind, first.cols[i].name, first.cols[i].kind)
			}
		}
		total += g.rows
	}
	cols := make([]*Column, first.NumCols())
	for i, c0 := range first.cols {
		if c0.kind == Numeric {
			vals := make([]float64, 0, total)
			for _, g := range frames {
				vals = append(vals, g.cols[i].nums...)
			}
			cols[i] = AdoptNumeric(c0.name, vals)
			continue
		}
		levels := slices.Clone(c0.levels)
		index := make(map[string]int32, len(levels))
		for j, l := range levels {
			index[l] = int32(j)
		}
		codes := make([]int32, 0, total)
		for _, g := range frames {
			c := g.cols[i]
			remap := make([]int32, len(c.levels))
			for j, l := range c.levels {
				code, ok := index[l]
				if !ok {
					code = int32(len(levels))
					index[l] = code
					levels = append(levels, l)
				}
				remap[j] = code
			}
			for _, k := range c.codes {
				if k == MissingCode {
					codes = append(codes, MissingCode)
				} else {
					codes = append(codes, remap[k])
				}
			}
		}
		cols[i] = &Column{name: c0.name, kind: Categorical, codes: codes, levels: levels}
	}
	out, err := NewFrame(cols...)
	if err != nil {
		return nil, err
	}
	out.rows = total
	roles := make([]Role, 0, total)
	anyHoldout := false
	for _, g := range frames {
		for i := 0; i < g.rows; i++ {
			r := g.roles.role(i)
			anyHoldout = anyHoldout || r.Holdout
			roles = append(roles, r)
		}
	}
	if !anyHoldout {
		return out, nil
	}
	return out.WithRoles(roles)
}

// Equal reports whether a and b have the same column names and kinds in the
// same order, the same cells (numbers bit for bit, any NaN equal to any NaN;
// categorical cells by level string) and the same roles. Unused levels and
// level order do not matter.
func Equal(a, b *Frame) bool {
	if a.rows != b.rows || len(a.cols) != len(b.cols) {
		return false
	}
	for i, c := range a.cols {
		if c.name != b.cols[i].name || !equalValues(c, b.cols[i]) {
			return false
		}
	}
	for i := 0; i < a.rows; i++ {
		if a.roles.role(i) != b.roles.role(i) {
			return false
		}
	}
	return true
}
