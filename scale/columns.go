package scale

import (
	"fmt"
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/par"
	"github.com/tabprep/tabprep/internal/quantile"
)

// DomainRule says what a transform does with a value outside its domain.
type DomainRule string

const (
	// DomainError (the zero value) makes a value outside the domain an
	// error naming the column, the row and the value.
	DomainError DomainRule = ""
	// DomainMissing makes a value outside the domain a missing cell.
	DomainMissing DomainRule = "missing"
)

func (r DomainRule) check(op string) error {
	if r != DomainError && r != DomainMissing {
		return tabprep.Errorf(op, tabprep.ErrOption, "", "OutOfDomain %q unknown; use scale.DomainError or scale.DomainMissing", string(r))
	}
	return nil
}

// fitColumns checks that train holds train rows only, resolves sel to its
// numeric columns and refuses a column with no value to learn from.
func fitColumns(op string, train *tabprep.Frame, sel tabprep.Selection) ([]string, []*tabprep.Column, error) {
	if err := tabprep.RequireTrain(op, train); err != nil {
		return nil, nil, err
	}
	names, err := sel.Resolve(op, train, tabprep.Numeric)
	if err != nil {
		return nil, nil, err
	}
	cols := make([]*tabprep.Column, len(names))
	for j, n := range names {
		c, err := train.Column(n)
		if err != nil {
			return nil, nil, err
		}
		if c.MissingCount() == c.Len() {
			return nil, nil, allMissing(op, n)
		}
		cols[j] = c
	}
	if err := finite(op, names, cols); err != nil {
		return nil, nil, err
	}
	return names, cols, nil
}

func allMissing(op, column string) *tabprep.Error {
	return tabprep.Errorf(op, tabprep.ErrAllMissing, column, "every train value is missing; fill the column first or leave it out of Columns")
}

// present returns the non-missing values of x (x itself if it has none
// missing).
func present(x []float64) []float64 {
	for _, v := range x {
		if v != v {
			return quantile.DropNaN(x)
		}
	}
	return x
}

// dataColumns returns the named numeric columns of data, for a transform or
// an inverse.
func dataColumns(op string, data *tabprep.Frame, names []string) ([]*tabprep.Column, error) {
	if data == nil {
		return nil, tabprep.Errorf(op, tabprep.ErrSchema, "", "nil frame")
	}
	cols := make([]*tabprep.Column, len(names))
	for j, n := range names {
		c, err := data.Column(n)
		if err != nil {
			return nil, tabprep.Errorf(op, tabprep.ErrNoColumn, n, "fitted on this column, which the data lacks; pass a frame with every fitted column")
		}
		if c.Kind() != tabprep.Numeric {
			return nil, tabprep.Errorf(op, tabprep.ErrKind, n, "is %v; the step was fitted on a numeric column", c.Kind())
		}
		cols[j] = c
	}
	return cols, nil
}

// checkWidths reports parameters whose per-column lists do not match the
// column list, as a decoded but hand-edited state could hold.
func checkWidths(op string, columns []string, lists ...int) error {
	for _, n := range lists {
		if n != len(columns) {
			return tabprep.Errorf(op, tabprep.ErrOption, "", "parameters list %d values for %d columns; refit the step", n, len(columns))
		}
	}
	return nil
}

// affine is the map y = (x − center)/scale + offset, then clipped to
// [lo, hi] if clip is set. Every linear rescaling in the package is one.
// The division is done as a multiplication by 1/scale, which is several
// times faster (a division unit is slow and not pipelined) and differs from
// the correctly rounded quotient by at most about an ulp; a step that
// needs the quotient itself (decimal scaling, where −986/10³ must be
// −0.986) sets divide.
type affine struct {
	center, scale, offset float64
	clip, divide          bool
	lo, hi                float64
}

func (a affine) at(x float64) float64 {
	var y float64
	if a.divide {
		y = (x-a.center)/a.scale + a.offset
	} else {
		y = (x-a.center)*(1/a.scale) + a.offset
	}
	if a.clip {
		y = min(max(y, a.lo), a.hi)
	}
	return y
}

// source writes a.at(x) as a Go statement that sets y, for generated plans.
func (a affine) source(w *tabprep.SourceWriter, x, y string) {
	var e string
	if a.divide {
		e = "(" + x + "-" + w.Float(a.center) + ")/" + w.Float(a.scale) + " + " + w.Float(a.offset)
	} else {
		e = "(" + x + "-" + w.Float(a.center) + ")*" + w.Float(1/a.scale) + " + " + w.Float(a.offset)
	}
	if a.clip {
		e = "min(max(" + e + ", " + w.Float(a.lo) + "), " + w.Float(a.hi) + ")"
	}
	w.Line("%s = %s", y, e)
}

func (a affine) inverse(y float64) float64 { return (y-a.offset)*a.scale + a.center }

// apply writes a.at(src[i]) to dst[i]: the hot loop of every linear step,
// kept free of calls and branches so that it runs at memory speed. It
// gives the same bits as at.
func (a affine) apply(dst, src []float64) {
	dst = dst[:len(src)]
	if a.clip || a.divide {
		for i, x := range src {
			dst[i] = a.at(x)
		}
		return
	}
	c, r, o := a.center, 1/a.scale, a.offset
	if o == 0 {
		for i, x := range src {
			dst[i] = (x - c) * r
		}
		return
	}
	for i, x := range src {
		dst[i] = (x-c)*r + o
	}
}

// divisor returns spread, or 1 when the spread is zero (a constant column)
// or not finite, so that no rescaling divides by zero.
func divisor(spread float64) float64 {
	if spread == 0 || math.IsNaN(spread) || math.IsInf(spread, 0) {
		return 1
	}
	return spread
}

// mapper applies one fitted function per column to frames and single rows.
// A function returns NaN for NaN; for any other value, a NaN result, or an
// infinite result from a finite value, means the value is outside the
// function's domain.
type mapper struct {
	op      string
	names   []string
	funcs   []func(float64) float64
	linear  []affine // when set, used instead of funcs for whole columns
	domain  string   // the accepted values, for errors
	lenient bool     // out-of-domain values become missing
	strict  bool     // the step has no OutOfDomain option to suggest
	// sources write each func as Go statements that set the variable y
	// from the variable x, for generated plans; nil if the funcs have none.
	sources []func(w *tabprep.SourceWriter, x, y string)
}

func outside(x, y float64) bool {
	return x == x && (y != y || (math.IsInf(y, 0) && !math.IsInf(x, 0)))
}

func (m *mapper) domainError(j int, x float64) *tabprep.Error {
	if m.strict {
		return tabprep.Errorf(m.op, tabprep.ErrValue, m.names[j], "value %v is outside the domain (%s); correct or remove it", x, m.domain)
	}
	return tabprep.Errorf(m.op, tabprep.ErrValue, m.names[j],
		"value %v is outside the domain (%s); correct or remove it, or set OutOfDomain to scale.DomainMissing to make such cells missing", x, m.domain)
}

// column maps src through function j into a new slice.
func (m *mapper) column(j int, src []float64) ([]float64, error) {
	dst := make([]float64, len(src))
	if m.linear != nil {
		m.linear[j].apply(dst, src)
		return dst, nil
	}
	f := m.funcs[j]
	for i, x := range src {
		y := f(x)
		if outside(x, y) {
			if !m.lenient {
				return nil, m.domainError(j, x).AtRow(i)
			}
			y = math.NaN()
		}
		dst[i] = y
	}
	return dst, nil
}

// frame returns data with each mapped column replaced.
func (m *mapper) frame(data *tabprep.Frame) (*tabprep.Frame, error) {
	cols, err := dataColumns(m.op, data, m.names)
	if err != nil {
		return nil, err
	}
	out := make([]*tabprep.Column, len(cols))
	err = par.Each(len(cols), data.NumRows(), func(j int) error {
		vals, err := m.column(j, cols[j].Float64s())
		if err != nil {
			return err
		}
		out[j] = tabprep.AdoptNumeric(m.names[j], vals)
		return nil
	})
	if err != nil {
		return nil, err
	}
	return data.With(out...)
}

// check maps every column of data and discards the result: a fit uses it
// to report train values outside the domain before any parameter is
// returned.
func (m *mapper) check(data *tabprep.Frame) error {
	_, err := m.frame(data)
	return err
}

// rowKernel returns a row function that copies src to dst by position and
// maps the fitted columns, for rows laid out by l.
func (m *mapper) rowKernel(l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	slots, err := m.slots(l)
	if err != nil {
		return nil, err
	}
	mm := *m
	if m.linear != nil {
		// The common affine case: the same arithmetic as affine.apply, so
		// the bits agree with the batch transform, with no call per cell.
		maps := m.linear
		recip := make([]float64, len(maps))
		plain := true // every map is (x − centre)·(1/scale), as z-scores are
		for j, a := range maps {
			recip[j] = 1 / a.scale
			plain = plain && !a.clip && !a.divide && a.offset == 0
		}
		if plain {
			centre := make([]float64, len(maps))
			for j, a := range maps {
				centre[j] = a.center
			}
			return func(regs []tabprep.Cell) error {
				for j, k := range slots {
					regs[k].Num = (regs[k].Num - centre[j]) * recip[j]
				}
				return nil
			}, nil
		}
		return func(regs []tabprep.Cell) error {
			for j, k := range slots {
				a := &maps[j]
				x := regs[k].Num
				switch {
				case a.clip || a.divide:
					regs[k].Num = a.at(x)
				case a.offset == 0:
					regs[k].Num = (x - a.center) * recip[j]
				default:
					regs[k].Num = (x-a.center)*recip[j] + a.offset
				}
			}
			return nil
		}, nil
	}
	funcs := m.funcs
	return func(regs []tabprep.Cell) error {
		for j, k := range slots {
			x := regs[k].Num
			y := funcs[j](x)
			if outside(x, y) {
				if !mm.lenient {
					return mm.domainError(j, x)
				}
				y = math.NaN()
			}
			regs[k].Num = y
		}
		return nil
	}, nil
}

// rowSource writes what rowKernel does as Go source, for generated plans;
// affine maps and funcs with a Go name have one.
func (m *mapper) rowSource(l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	if m.linear == nil && m.sources == nil {
		return tabprep.Errorf(m.op, tabprep.ErrOption, "", "the step's maps have no Go source form; use the interpreted plan")
	}
	slots, err := m.slots(l)
	if err != nil {
		return err
	}
	if m.linear == nil {
		// What rowKernel does with funcs: a value outside the domain is
		// missing when lenient, and otherwise an error, which the generated
		// code leaves to the interpreted plan.
		for j, k := range slots {
			n := w.Num(k)
			w.Line("{")
			w.Line("var y float64")
			m.sources[j](w, n, "y")
			w.Line("if %s == %s && (y != y || (math.IsInf(y, 0) && !math.IsInf(%s, 0))) {", n, n, n)
			if m.lenient {
				w.Line("y = math.NaN()")
			} else {
				w.GiveUp()
			}
			w.Line("}")
			w.Line("%s = y", n)
			w.Line("}")
		}
		return nil
	}
	// The same expressions as rowKernel's, in the same order, so the bits
	// agree.
	for j, k := range slots {
		a := m.linear[j]
		n := w.Num(k)
		if a.clip || a.divide || a.offset != 0 {
			a.source(w, n, n) // a.at, which the kernel's other forms agree with
		} else {
			w.Line("%s = (%s - %s) * %s", n, n, w.Float(a.center), w.Float(1/a.scale))
		}
	}
	return nil
}

// slots returns the register slot of each of m's columns in l, which the
// step rewrites in place.
func (m *mapper) slots(l *tabprep.RowLayout) ([]int, error) {
	slots := make([]int, len(m.names))
	for j, n := range m.names {
		k, f, ok := l.Slot(n)
		if !ok {
			return nil, tabprep.Errorf(m.op, tabprep.ErrSchema, n, "fitted on this column, which the row layout lacks")
		}
		if f.Kind != tabprep.Numeric {
			return nil, tabprep.Errorf(m.op, tabprep.ErrKind, n, "is %v in the row layout; the step was fitted on a numeric column", f.Kind)
		}
		slots[j] = k
	}
	return slots, nil
}

// linear returns the mapper of one affine map per column, or of their
// inverses.
func linear(op string, names []string, maps []affine, inverse bool) *mapper {
	if !inverse {
		return &mapper{op: op, names: names, linear: maps}
	}
	funcs := make([]func(float64) float64, len(maps))
	for j, a := range maps {
		funcs[j] = a.inverse
	}
	return &mapper{op: op, names: names, funcs: funcs, domain: "values whose inverse is finite", strict: true}
}

// columnwise is implemented by the parameters of every step that maps each
// column on its own; the steps' Transform, Inverse and RowKernel methods are
// the functions below.
type columnwise interface {
	mapper(op string, inverse bool) (*mapper, error)
}

func transform(kind string, p columnwise, data *tabprep.Frame) (*tabprep.Frame, error) {
	m, err := p.mapper(opName(kind, "transform"), false)
	if err != nil {
		return nil, err
	}
	return m.frame(data)
}

func invert(kind string, p columnwise, data *tabprep.Frame) (*tabprep.Frame, error) {
	m, err := p.mapper(opName(kind, "inverse"), true)
	if err != nil {
		return nil, err
	}
	return m.frame(data)
}

func rowSource(kind string, p columnwise, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	m, err := p.mapper(opName(kind, "row"), false)
	if err != nil {
		return err
	}
	return m.rowSource(l, w)
}

func rowKernel(kind string, p columnwise, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	m, err := p.mapper(opName(kind, "row"), false)
	if err != nil {
		return nil, err
	}
	return m.rowKernel(l)
}

// finite reports the first infinite value of the chosen train columns: no
// fit learns from one.
func finite(op string, names []string, cols []*tabprep.Column) error {
	for j, c := range cols {
		for i, v := range c.Float64s() {
			if math.IsInf(v, 0) {
				return notFinite(op, names[j], v).AtRow(i)
			}
		}
	}
	return nil
}

func notFinite(op, column string, v float64) *tabprep.Error {
	return tabprep.Errorf(op, tabprep.ErrValue, column, "train value %v is not finite; make it missing (NaN) or drop the row before fitting", v)
}

func opName(kind, what string) string { return fmt.Sprintf("%s %s", kind, what) }
