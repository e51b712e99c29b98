package tabprep

import (
	"math"
	"slices"
)

// MissingCode is the code of a missing cell in a categorical column.
const MissingCode int32 = -1

// Column is one named, immutable column: numeric or categorical.
//
// A Column is never modified after it is built, so frames and transforms
// share columns freely. Slices returned by its accessors are views of its
// storage and must not be modified.
type Column struct {
	name   string
	kind   Kind
	nums   []float64 // Numeric
	codes  []int32   // Categorical
	levels []string  // Categorical
}

// NewNumeric returns a numeric column holding a copy of values. NaN means
// missing.
func NewNumeric(name string, values []float64) *Column {
	return AdoptNumeric(name, slices.Clone(values))
}

// AdoptNumeric returns a numeric column that takes ownership of values,
// without a copy. The caller must not modify values afterwards. Steps use it
// for the columns they compute.
func AdoptNumeric(name string, values []float64) *Column {
	if values == nil {
		values = []float64{}
	}
	return &Column{name: name, kind: Numeric, nums: values}
}

// NewCategorical returns a categorical column from one string per row. The
// empty string is a missing cell. Levels are numbered in order of first
// appearance.
func NewCategorical(name string, values []string) *Column {
	codes := make([]int32, len(values))
	var levels []string
	index := make(map[string]int32)
	for i, v := range values {
		if v == "" {
			codes[i] = MissingCode
			continue
		}
		c, ok := index[v]
		if !ok {
			c = int32(len(levels))
			index[v] = c
			levels = append(levels, v)
		}
		codes[i] = c
	}
	return &Column{name: name, kind: Categorical, codes: codes, levels: nonNil(levels)}
}

// NewCategoricalCodes returns a categorical column from a copy of levels and
// codes. Each code is an index into levels or [MissingCode]. Levels must be
// distinct and non-empty; levels no row uses are kept, so a schema can list
// levels a given batch happens not to contain.
func NewCategoricalCodes(name string, levels []string, codes []int32) (*Column, error) {
	return AdoptCategorical(name, slices.Clone(levels), slices.Clone(codes))
}

// AdoptCategorical is [NewCategoricalCodes] without the copies: the column
// takes ownership of levels and codes, which the caller must not modify
// afterwards.
func AdoptCategorical(name string, levels []string, codes []int32) (*Column, error) {
	const op = "tabprep.column"
	seen := make(map[string]struct{}, len(levels))
	for _, l := range levels {
		if l == "" {
			return nil, Errorf(op, ErrValue, name, "empty level; the empty string means missing, use MissingCode for missing cells")
		}
		if _, dup := seen[l]; dup {
			return nil, Errorf(op, ErrValue, name, "level %q listed twice; levels must be distinct", l)
		}
		seen[l] = struct{}{}
	}
	n := int32(len(levels))
	for i, c := range codes {
		if c != MissingCode && (c < 0 || c >= n) {
			return nil, Errorf(op, ErrValue, name, "code %d outside [0, %d) and not MissingCode", c, n).AtRow(i)
		}
	}
	if codes == nil {
		codes = []int32{}
	}
	return &Column{name: name, kind: Categorical, codes: codes, levels: nonNil(levels)}, nil
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

// Name returns the column name.
func (c *Column) Name() string { return c.name }

// Kind returns the column kind.
func (c *Column) Kind() Kind { return c.kind }

// Len returns the number of rows.
func (c *Column) Len() int {
	if c.kind == Numeric {
		return len(c.nums)
	}
	return len(c.codes)
}

// Renamed returns a column with the same data under another name. The data
// is shared, not copied.
func (c *Column) Renamed(name string) *Column {
	d := *c
	d.name = name
	return &d
}

// Float64s returns the values of a numeric column (nil for a categorical
// one). The slice is the column's storage: read it, do not modify it.
func (c *Column) Float64s() []float64 { return c.nums }

// Codes returns the codes of a categorical column (nil for a numeric one).
// The slice is the column's storage: read it, do not modify it.
func (c *Column) Codes() []int32 { return c.codes }

// Levels returns the levels of a categorical column (nil for a numeric one),
// indexed by code. The slice is the column's storage: do not modify it.
func (c *Column) Levels() []string { return c.levels }

// IsMissing reports whether row i is missing.
func (c *Column) IsMissing(i int) bool {
	if c.kind == Numeric {
		return math.IsNaN(c.nums[i])
	}
	return c.codes[i] == MissingCode
}

// Value returns row i of a numeric column; NaN if missing. It panics if c is
// categorical or i is out of range.
func (c *Column) Value(i int) float64 {
	if c.kind != Numeric {
		panic("tabprep: Value on categorical column " + c.name)
	}
	return c.nums[i]
}

// Level returns row i of a categorical column; "" if missing. It panics if c
// is numeric or i is out of range.
func (c *Column) Level(i int) string {
	if c.kind != Categorical {
		panic("tabprep: Level on numeric column " + c.name)
	}
	if k := c.codes[i]; k != MissingCode {
		return c.levels[k]
	}
	return ""
}

// MissingCount returns the number of missing cells.
func (c *Column) MissingCount() int {
	n := 0
	if c.kind == Numeric {
		for _, v := range c.nums {
			if v != v {
				n++
			}
		}
		return n
	}
	for _, k := range c.codes {
		if k == MissingCode {
			n++
		}
	}
	return n
}

// take returns the column restricted to rows, in that order. Indexes are
// trusted.
func (c *Column) take(rows []int) *Column {
	d := *c
	if c.kind == Numeric {
		d.nums = make([]float64, len(rows))
		for i, r := range rows {
			d.nums[i] = c.nums[r]
		}
		return &d
	}
	d.codes = make([]int32, len(rows))
	for i, r := range rows {
		d.codes[i] = c.codes[r]
	}
	return &d
}

// equalValues reports whether a and b hold the same cells: bit-equal numbers
// (any NaN equals any NaN) or the same level strings.
func equalValues(a, b *Column) bool {
	if a.kind != b.kind || a.Len() != b.Len() {
		return false
	}
	if a.kind == Numeric {
		for i, x := range a.nums {
			y := b.nums[i]
			if math.Float64bits(x) != math.Float64bits(y) && !(x != x && y != y) {
				return false
			}
		}
		return true
	}
	for i := range a.codes {
		if a.Level(i) != b.Level(i) {
			return false
		}
	}
	return true
}
