package tabprep

import (
	"fmt"
	"slices"
)

// Schema describes the columns of a frame: names, kinds and, for
// categorical columns, levels.
type Schema struct {
	Columns []Field `json:"columns"`
}

// Field describes one column.
type Field struct {
	Name   string   `json:"name"`
	Kind   Kind     `json:"kind"`
	Levels []string `json:"levels,omitempty"`
}

// Clone returns a deep copy of s, so the copy's level lists can be handed
// out without exposing s's.
func (s Schema) Clone() Schema {
	out := Schema{Columns: make([]Field, len(s.Columns))}
	for i, c := range s.Columns {
		out.Columns[i] = c
		out.Columns[i].Levels = slices.Clone(c.Levels)
	}
	return out
}

// Names returns the column names in order.
func (s Schema) Names() []string {
	out := make([]string, len(s.Columns))
	for i, c := range s.Columns {
		out[i] = c.Name
	}
	return out
}

// Index returns the position of the named column, or -1.
func (s Schema) Index(name string) int {
	return slices.IndexFunc(s.Columns, func(f Field) bool { return f.Name == name })
}

// Validate reports an empty or duplicate name, an unknown kind, or levels
// that are empty, repeated or given to a numeric column.
func (s Schema) Validate() error {
	const op = "tabprep.schema"
	seen := make(map[string]bool, len(s.Columns))
	for i, c := range s.Columns {
		if c.Name == "" {
			return Errorf(op, ErrName, "", "column %d has an empty name", i)
		}
		if seen[c.Name] {
			return Errorf(op, ErrName, c.Name, "name used twice")
		}
		seen[c.Name] = true
		switch c.Kind {
		case Numeric:
			if len(c.Levels) > 0 {
				return Errorf(op, ErrSchema, c.Name, "numeric column lists levels")
			}
		case Categorical:
			lv := make(map[string]bool, len(c.Levels))
			for _, l := range c.Levels {
				if l == "" || lv[l] {
					return Errorf(op, ErrSchema, c.Name, "level %q is empty or repeated", l)
				}
				lv[l] = true
			}
		default:
			return Errorf(op, ErrSchema, c.Name, "unknown kind %v", c.Kind)
		}
	}
	return nil
}

// Conform checks that f has every column of s with the same kind and
// returns f's columns in the order of s, dropping any others. Levels are not
// compared: new data may hold levels the schema has not seen.
func (s Schema) Conform(op string, f *Frame) (*Frame, error) {
	cols := make([]*Column, len(s.Columns))
	for i, want := range s.Columns {
		c, err := f.Column(want.Name)
		if err != nil {
			return nil, Errorf(op, ErrSchema, want.Name, "input lacks this column; the fitted schema needs %s", nameList(s.Names()))
		}
		if c.kind != want.Kind {
			return nil, Errorf(op, ErrSchema, want.Name, "is %v, the fitted schema has %v", c.kind, want.Kind)
		}
		cols[i] = c
	}
	if len(cols) == f.NumCols() && slices.Equal(s.Names(), f.Names()) {
		return f, nil
	}
	return f.reshape(cols), nil
}

// String returns a one-line summary such as "[age:numeric species:categorical(3)]".
func (s Schema) String() string {
	b := []byte{'['}
	for i, c := range s.Columns {
		if i > 0 {
			b = append(b, ' ')
		}
		b = fmt.Appendf(b, "%s:%v", c.Name, c.Kind)
		if c.Kind == Categorical {
			b = fmt.Appendf(b, "(%d)", len(c.Levels))
		}
	}
	return string(append(b, ']'))
}
