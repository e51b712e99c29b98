package pipeline

import (
	"fmt"
	"slices"
	"sync"

	"github.com/tabprep/tabprep"
)

// Plan is a fitted pipeline compiled for one row at a time, for serving: it
// reads an input row laid out by the input schema (values by column
// position) and writes the output row into a buffer the caller owns.
//
// The row lives in a register file of cells in which every column has a
// slot: a step touches only the slots of the columns it changes or adds, and
// the output is gathered from its slots at the end, so no step copies the
// row. Apply does not allocate, looks up no column name and uses no
// reflection; its output is bit-identical to [Fitted.Transform] of the same
// row. A Plan is safe for concurrent use by many goroutines.
type Plan struct {
	in         tabprep.Schema
	out        tabprep.Schema
	funcs      []tabprep.RowFunc
	outSlots   []int          // slot of each output column
	slots      int            // register file size
	entry      []entryCode    // one per categorical input column
	fields     map[string]int // input column name → position, for the helpers
	numericOut bool
	gen        func(dst []float64, src []tabprep.Cell) bool // from CompileWith, or nil
	scratch    sync.Pool                                    // *rowScratch
	structs    sync.Map                                     // reflect.Type → []int, for FromStruct
}

// levelTable maps a level string to its code with a small open-addressing
// hash table over a cheap hash of the string's length and its first, middle
// and last bytes, so that a lookup costs about what a hand-written switch does.
type levelTable struct {
	keys  []string
	codes []int32 // MissingCode marks an empty bucket
	mask  uint64
	shift uint // 64 − log2(len(codes)): the hash's top bits pick the bucket
}

func levelHash(s string) uint64 {
	n := len(s)
	h := uint64(n)<<24 | uint64(s[0])<<16 | uint64(s[n/2])<<8 | uint64(s[n-1])
	return h * 0x9E3779B97F4A7C15
}

func newLevelTable(levels []string) levelTable {
	size, bits := 8, uint(3)
	for size < 4*len(levels) {
		size, bits = size*2, bits+1
	}
	t := levelTable{keys: make([]string, size), codes: make([]int32, size), mask: uint64(size - 1), shift: 64 - bits}
	for i := range t.codes {
		t.codes[i] = tabprep.MissingCode
	}
	for code, l := range levels {
		i := levelHash(l) >> t.shift
		for t.codes[i] != tabprep.MissingCode {
			i = (i + 1) & t.mask
		}
		t.keys[i], t.codes[i] = l, int32(code)
	}
	return t
}

func (t *levelTable) code(s string) int32 {
	if s == "" {
		return tabprep.MissingCode
	}
	i := levelHash(s) >> t.shift
	for {
		c := t.codes[i]
		if c == tabprep.MissingCode {
			return tabprep.UnseenCode
		}
		if t.keys[i] == s {
			return c
		}
		i = (i + 1) & t.mask
	}
}

// entryCode codes one categorical input column as a row enters the plan.
type entryCode struct {
	pos   int
	table levelTable
}

type rowScratch struct {
	regs, src []tabprep.Cell
	cols      []*tabprep.Column
}

// Compile returns the row plan of f. Every step must have a row kernel; a
// step that needs other rows to act on one (row-order imputation, row
// dropping) is refused with an error that names it.
func (f *Fitted) Compile() (*Plan, error) {
	p := &Plan{in: f.input.Clone(), fields: map[string]int{}}
	for i, c := range f.input.Columns {
		p.fields[c.Name] = i
		if c.Kind == tabprep.Categorical {
			p.entry = append(p.entry, entryCode{pos: i, table: newLevelTable(c.Levels)})
		}
	}
	layout := tabprep.NewRowLayout(p.in)
	for i, s := range f.steps {
		fn, err := s.RowKernel(layout)
		if err != nil {
			return nil, fmt.Errorf("pipeline: compile: step %d (%s) cannot act on one row: %w; transform such data in batches with Fitted.Transform", i, s.Kind(), err)
		}
		p.funcs = append(p.funcs, fn)
	}
	p.out = layout.Schema()
	if !slices.Equal(p.out.Names(), f.output.Names()) {
		return nil, fmt.Errorf("pipeline: compile: row kernels lay out %v but the batch transform gives %v; a step's row kernel disagrees with its Transform", p.out.Names(), f.output.Names())
	}
	p.slots = layout.Slots()
	p.outSlots = make([]int, layout.Len())
	p.numericOut = true
	for i, c := range p.out.Columns {
		p.outSlots[i] = layout.SlotAt(i)
		p.numericOut = p.numericOut && c.Kind == tabprep.Numeric
	}
	p.scratch.New = func() any {
		return &rowScratch{regs: make([]tabprep.Cell, p.slots), src: make([]tabprep.Cell, len(p.in.Columns))}
	}
	return p, nil
}

// Input returns the layout of the rows Apply reads.
func (p *Plan) Input() tabprep.Schema { return p.in.Clone() }

// Output returns the layout of the rows Apply writes.
func (p *Plan) Output() tabprep.Schema { return p.out.Clone() }

// InputWidth returns the number of cells of an input row.
func (p *Plan) InputWidth() int { return len(p.in.Columns) }

// OutputWidth returns the number of cells of an output row.
func (p *Plan) OutputWidth() int { return len(p.out.Columns) }

// Apply transforms one row. src holds one cell per input column, Num for a
// numeric column and Str for a categorical one (the Code fields of src are
// ignored and left alone); dst receives one cell per output column.
func (p *Plan) Apply(dst, src []tabprep.Cell) error {
	s := p.scratch.Get().(*rowScratch)
	defer p.scratch.Put(s)
	return p.apply(s.regs, dst, src)
}

// apply is Apply on the given registers.
func (p *Plan) apply(regs, dst, src []tabprep.Cell) error {
	if len(src) != len(p.in.Columns) || len(dst) != len(p.out.Columns) {
		return fmt.Errorf("pipeline: plan: row of %d cells into %d; the plan reads %d and writes %d",
			len(src), len(dst), len(p.in.Columns), len(p.out.Columns))
	}
	if err := p.run(regs, src); err != nil {
		return err
	}
	p.gather(dst, regs)
	return nil
}

// gather copies the output cells from regs to dst; numeric cells get Num
// alone, since a register's Str and Code mean nothing for them.
func (p *Plan) gather(dst, regs []tabprep.Cell) {
	for i, k := range p.outSlots {
		if p.out.Columns[i].Kind == tabprep.Numeric {
			dst[i] = tabprep.Cell{Num: regs[k].Num}
		} else {
			dst[i] = regs[k]
		}
	}
}

// run loads src into regs and runs every step's row function.
func (p *Plan) run(regs, src []tabprep.Cell) error {
	copy(regs, src)
	for k := range p.entry {
		e := &p.entry[k]
		regs[e.pos].Code = e.table.code(regs[e.pos].Str)
	}
	for _, fn := range p.funcs {
		if err := fn(regs); err != nil {
			return err
		}
	}
	return nil
}

// ApplyFloats is [Plan.Apply] for a pipeline whose output columns are all
// numeric, as a model's input is: it writes the output values into dst.
func (p *Plan) ApplyFloats(dst []float64, src []tabprep.Cell) error {
	if p.generated(dst, src) {
		return nil
	}
	s := p.scratch.Get().(*rowScratch)
	defer p.scratch.Put(s)
	return p.applyFloats(s.regs, dst, src)
}

// generated runs the generated code of CompileWith on a row and reports
// whether it finished it; false means the interpreted plan must run.
func (p *Plan) generated(dst []float64, src []tabprep.Cell) bool {
	return p.gen != nil && p.gen(dst, src)
}

func (p *Plan) applyFloats(regs []tabprep.Cell, dst []float64, src []tabprep.Cell) error {
	if !p.numericOut {
		return fmt.Errorf("pipeline: plan: the output has categorical columns; use Apply, or encode them in the pipeline")
	}
	if len(src) != len(p.in.Columns) || len(dst) != len(p.out.Columns) {
		return fmt.Errorf("pipeline: plan: row of %d cells into %d values; the plan reads %d and writes %d",
			len(src), len(dst), len(p.in.Columns), len(p.out.Columns))
	}
	if err := p.run(regs, src); err != nil {
		return err
	}
	p.gatherFloats(dst, regs)
	return nil
}

// gatherFloats copies the output values from regs to dst.
func (p *Plan) gatherFloats(dst []float64, regs []tabprep.Cell) {
	for i, k := range p.outSlots {
		dst[i] = regs[k].Num
	}
}

// Runner applies a plan with a register file of its own, saving the pool
// round trip that [Plan.Apply] makes per row: for a loop that scores many
// rows on one goroutine. A Runner is not safe for concurrent use; make one
// per goroutine (they are cheap), or pool them.
type Runner struct {
	plan *Plan
	regs []tabprep.Cell
}

// Runner returns a new runner of p.
func (p *Plan) Runner() *Runner {
	return &Runner{plan: p, regs: make([]tabprep.Cell, p.slots)}
}

// Apply is [Plan.Apply] on r's own registers.
func (r *Runner) Apply(dst, src []tabprep.Cell) error {
	return r.plan.apply(r.regs, dst, src)
}

// ApplyFloats is [Plan.ApplyFloats] on r's own registers.
func (r *Runner) ApplyFloats(dst []float64, src []tabprep.Cell) error {
	if r.plan.generated(dst, src) {
		return nil
	}
	return r.plan.applyFloats(r.regs, dst, src)
}

// TransformInto transforms every row of data into dst, row after row:
// row i's output values are dst[i*w : (i+1)*w] with w = [Plan.OutputWidth].
// The output must be all numeric, and dst must have exactly
// data.NumRows()·w values. data needs the input columns (others are
// ignored). Beyond dst, which the caller owns and may reuse, a call
// allocates nothing in the steady state, so batch scoring can run without
// garbage.
func (p *Plan) TransformInto(dst []float64, data *tabprep.Frame) error {
	if !p.numericOut {
		return fmt.Errorf("pipeline: plan: the output has categorical columns; use Apply, or encode them in the pipeline")
	}
	w := len(p.out.Columns)
	if len(dst) != data.NumRows()*w {
		return fmt.Errorf("pipeline: plan: dst has %d values; %d rows of %d output columns need %d", len(dst), data.NumRows(), w, data.NumRows()*w)
	}
	s := p.scratch.Get().(*rowScratch)
	defer p.scratch.Put(s)
	if cap(s.cols) < len(p.in.Columns) {
		s.cols = make([]*tabprep.Column, len(p.in.Columns))
	}
	cols := s.cols[:len(p.in.Columns)]
	for i, want := range p.in.Columns {
		j := data.Index(want.Name)
		if j < 0 || data.Col(j).Kind() != want.Kind {
			_, err := p.in.Conform("pipeline.plan", data)
			return err
		}
		cols[i] = data.Col(j)
	}
	src := s.src[:len(p.in.Columns)]
	for r := 0; r < data.NumRows(); r++ {
		for i, c := range cols {
			if p.in.Columns[i].Kind == tabprep.Numeric {
				src[i].Num = c.Float64s()[r]
			} else {
				src[i].Str = c.Level(r)
			}
		}
		out := dst[r*w : (r+1)*w]
		if p.generated(out, src) {
			continue
		}
		if err := p.run(s.regs, src); err != nil {
			return fmt.Errorf("pipeline: plan: row %d: %w", r, err)
		}
		p.gatherFloats(out, s.regs)
	}
	return nil
}
