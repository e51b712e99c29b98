package tabprep

import (
	"fmt"
	"maps"
	"math"
	"slices"
	"strconv"
	"strings"
)

// RowSource is implemented by steps whose row kernel can also be written
// out as Go source, so that a fitted pipeline can be generated ahead of
// time into a plain Go function: an interpreted plan spends most of its
// time walking tables, which generated code turns into constants and
// switches the compiler can see.
//
// RowSource must record in l exactly what the step's RowKernel records, and
// the code it writes must give the same bits as the kernel. Where the
// kernel would return an error, or must work out at run time what the
// source does not hold (parse a text no training row had, say), the code
// gives up on the row with [SourceWriter.GiveUp]; the generated function's
// caller then runs the interpreted plan on that row, which gives its result
// or its error.
type RowSource[P any] interface {
	RowSource(p P, l *RowLayout, w *SourceWriter) error
}

// SourceWriter collects the Go statements of a generated row function. The
// function holds every slot of the register file in local variables: the
// number in [SourceWriter.Num] and, for a categorical cell, the level in
// [SourceWriter.Str] and its code in [SourceWriter.Code]. A step reads and
// writes the variables of the slots its layout gives it.
type SourceWriter struct {
	b       strings.Builder
	used    map[string]map[int]bool // by variable prefix, the slots referenced
	imports map[string]bool
	data    [][]float64
}

// NewSourceWriter returns an empty writer.
func NewSourceWriter() *SourceWriter {
	return &SourceWriter{used: map[string]map[int]bool{}, imports: map[string]bool{}}
}

func (w *SourceWriter) local(prefix string, slot int) string {
	if w.used[prefix] == nil {
		w.used[prefix] = map[int]bool{}
	}
	w.used[prefix][slot] = true
	return prefix + strconv.Itoa(slot)
}

// Num returns the variable holding the number of slot.
func (w *SourceWriter) Num(slot int) string { return w.local("n", slot) }

// Str returns the variable holding the level of the categorical cell in slot.
func (w *SourceWriter) Str(slot int) string { return w.local("s", slot) }

// Code returns the variable holding the level code (an int32) of the
// categorical cell in slot.
func (w *SourceWriter) Code(slot int) string { return w.local("c", slot) }

// Used returns the variables referenced so far, for the generator to
// declare: those starting with prefix ("n", "s" or "c"), by slot.
func (w *SourceWriter) Used(prefix string) []string {
	var names []string
	for _, k := range slices.Sorted(maps.Keys(w.used[prefix])) {
		names = append(names, prefix+strconv.Itoa(k))
	}
	return names
}

// Line writes one line of the function body, formatted as by fmt.Sprintf;
// the generator formats the file as gofmt does, so lines need no indent.
func (w *SourceWriter) Line(format string, args ...any) {
	w.b.WriteByte('\t')
	fmt.Fprintf(&w.b, format, args...)
	w.b.WriteByte('\n')
}

// GiveUp writes the statement that abandons the row, for a case the
// kernel reports as an error.
func (w *SourceWriter) GiveUp() { w.Line("return false") }

// Float returns a Go expression with exactly the bits of v when used as a
// float64.
func (w *SourceWriter) Float(v float64) string {
	switch {
	case math.IsNaN(v):
		return "math.NaN()"
	case math.IsInf(v, 1):
		return "math.Inf(1)"
	case math.IsInf(v, -1):
		return "math.Inf(-1)"
	case v == 0 && math.Signbit(v):
		return "math.Copysign(0, -1)"
	}
	// The shortest decimal that reads back as v: as an untyped constant it
	// converts to the nearest float64, which is v. Only use it where the
	// constant becomes a float64 at once (an operand or a value of one).
	return strconv.FormatFloat(v, 'g', -1, 64)
}

// Import records that the source uses the package with the given import
// path, and returns the name to refer to it by (the path's last element).
// The generated file always imports math.
func (w *SourceWriter) Import(path string) string {
	w.imports[path] = true
	return path[strings.LastIndexByte(path, '/')+1:]
}

// Imports returns the import paths recorded by Import, sorted.
func (w *SourceWriter) Imports() []string { return slices.Sorted(maps.Keys(w.imports)) }

// Data records a table of constants that the generated file declares once,
// as a package-level array, and returns the placeholder that stands for the
// array's name in the source (the generator replaces it; see
// [DataPlaceholder]). Use it for tables too long to write in every call.
func (w *SourceWriter) Data(values []float64) string {
	w.data = append(w.data, slices.Clone(values))
	return DataPlaceholder(len(w.data) - 1)
}

// DataTables returns the tables recorded by Data, in order.
func (w *SourceWriter) DataTables() [][]float64 { return w.data }

// DataPlaceholder returns the placeholder of table i of [SourceWriter.Data].
func DataPlaceholder(i int) string { return "⟦data" + strconv.Itoa(i) + "⟧" }

// Quote returns s as a Go string literal.
func (w *SourceWriter) Quote(s string) string { return strconv.Quote(s) }

// String returns the statements written so far.
func (w *SourceWriter) String() string { return w.b.String() }
