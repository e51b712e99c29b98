package tabprep

import "slices"

// RowLayout is what a row kernel compiles against: the columns a row has at
// its point in a compiled plan, and for each the slot of the plan's register
// file that holds its value. A column a step leaves alone keeps its slot, so
// a compiled plan moves no cell it does not change; only the output is
// gathered at the end.
//
// A kernel reads the slots of the columns it uses with [RowLayout.Slot] and
// then says what its step does to the columns, in the order its Transform
// does it: [RowLayout.Set] for a column it rewrites (same slot: read a
// slot's value before writing it), [RowLayout.Add] for a new column
// appended at the end (a fresh slot), [RowLayout.Remove] for a column it
// drops. The layout then matches the schema of the step's batch output.
type RowLayout struct {
	fields []Field
	slots  []int
	next   int // the number of slots in use
}

// NewRowLayout returns the layout of rows of schema s, column i in slot i.
func NewRowLayout(s Schema) *RowLayout {
	l := &RowLayout{fields: slices.Clone(s.Columns), slots: make([]int, len(s.Columns)), next: len(s.Columns)}
	for i := range l.slots {
		l.slots[i] = i
	}
	return l
}

// Schema returns the columns of the layout, in order.
func (l *RowLayout) Schema() Schema { return Schema{Columns: l.fields}.Clone() }

// Len returns the number of columns.
func (l *RowLayout) Len() int { return len(l.fields) }

// Slots returns the number of slots a register file for this layout needs.
func (l *RowLayout) Slots() int { return l.next }

// SlotAt returns the slot of column i.
func (l *RowLayout) SlotAt(i int) int { return l.slots[i] }

// Slot returns the slot and the description of the named column, or false
// if the layout has no such column.
func (l *RowLayout) Slot(name string) (int, Field, bool) {
	for i, f := range l.fields {
		if f.Name == name {
			return l.slots[i], f, true
		}
	}
	return 0, Field{}, false
}

// Set records that the named column is rewritten in place, now described by
// f (its name must stay the same; its kind and levels may change), and
// returns its slot. It reports false if there is no such column.
func (l *RowLayout) Set(name string, f Field) (int, bool) {
	for i, g := range l.fields {
		if g.Name == name {
			f.Name = name
			l.fields[i] = f
			return l.slots[i], true
		}
	}
	return 0, false
}

// Add appends a new column and returns its fresh slot.
func (l *RowLayout) Add(f Field) int {
	l.fields = append(l.fields, f)
	l.slots = append(l.slots, l.next)
	l.next++
	return l.next - 1
}

// Remove drops the named column, if present. Its slot is not reused.
func (l *RowLayout) Remove(name string) {
	for i, f := range l.fields {
		if f.Name == name {
			l.fields = slices.Delete(l.fields, i, i+1)
			l.slots = slices.Delete(l.slots, i, i+1)
			return
		}
	}
}
