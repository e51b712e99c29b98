package encode

import (
	"math"
	"slices"
	"sort"
	"strconv"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/quantile"
	"github.com/tabprep/tabprep/state"
)

// DefaultBins is the number of bins of [Bin] when Bins is zero.
const DefaultBins = 5

// BinMethod is how [Bin] places the cut points between bins.
type BinMethod string

// The binning methods.
const (
	// BinQuantile cuts at the train quantiles j/Bins, j = 1 … Bins−1, by
	// Hyndman & Fan (1996) type 7, so bins hold about equal numbers of
	// train rows. Ties can make cuts coincide; repeated cuts are merged, so
	// there may be fewer bins. The default.
	BinQuantile BinMethod = "quantile"
	// BinWidth cuts the train range [min, max] into Bins equal widths.
	BinWidth BinMethod = "width"
	// BinEdges uses the cut points given in [Bin.Edges].
	BinEdges BinMethod = "edges"
)

// Bin groups each selected numeric column into bins. With cut points
// c₁ < … < c_m, bin 0 is x < c₁, bin j is c_j ≤ x < c_{j+1}, and bin m is
// x ≥ c_m, so values outside the train range fall in the end bins. NaN stays
// missing.
//
// By default the output is a categorical column of the same name whose
// levels name the intervals, such as "(-inf,3)", "[3,7)" and "[7,+inf)"
// (numbers in Go's shortest 'g' format). With Codes the output is numeric:
// the bin index 0 … m.
type Bin struct {
	// Columns selects numeric columns; the zero value selects all.
	Columns tabprep.Selection `json:"columns"`
	// Method places the cuts; "" means BinQuantile.
	Method BinMethod `json:"method,omitempty"`
	// Bins is the number of bins of BinQuantile and BinWidth; 0 means
	// DefaultBins.
	Bins int `json:"bins,omitempty"`
	// Edges gives the cut points of each column for BinEdges: finite and
	// strictly increasing.
	Edges map[string][]float64 `json:"edges,omitempty"`
	// Codes writes bin indexes instead of interval levels.
	Codes bool `json:"codes,omitempty"`
}

// BinParams are the cut points of each column of a [Bin] step.
type BinParams struct {
	Columns []BinColumn `json:"columns"`
}

// BinColumn holds the cut points of one column.
type BinColumn struct {
	Name string       `json:"name"`
	Cuts state.Floats `json:"cuts"`
}

func init() { state.Register(Bin{}) }

// Kind returns "encode.bin".
func (Bin) Kind() string { return "encode.bin" }

// Outputs returns the names of the columns the step writes: the source
// names, replaced in place.
func (p BinParams) Outputs() []string {
	return sourceNames(p.Columns, func(c BinColumn) string { return c.Name })
}

// Levels returns the interval names of the bins of the column, in bin
// order.
func (c BinColumn) Levels() []string {
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	lo := "(-inf"
	out := make([]string, 0, len(c.Cuts)+1)
	for _, cut := range c.Cuts {
		out = append(out, lo+","+f(cut)+")")
		lo = "[" + f(cut)
	}
	return append(out, lo+",+inf)")
}

// Fit places the cut points of each selected column.
func (s Bin) Fit(train *tabprep.Frame) (BinParams, error) {
	const op = "encode.bin fit"
	names, err := resolve(op, train, s.Columns, tabprep.Numeric, "edges", s.Edges)
	if err != nil {
		return BinParams{}, err
	}
	if err := checkOption(op, "Method", s.Method, "", BinQuantile, BinWidth, BinEdges); err != nil {
		return BinParams{}, err
	}
	bins := s.Bins
	if bins == 0 {
		bins = DefaultBins
	}
	if bins < 1 {
		return BinParams{}, tabprep.Errorf(op, tabprep.ErrOption, "", "Bins %d: use 1 or more", s.Bins)
	}
	var p BinParams
	for _, name := range names {
		c, _ := train.Column(name)
		var cuts []float64
		if s.Method == BinEdges {
			e, ok := s.Edges[name]
			if !ok {
				return BinParams{}, tabprep.Errorf(op, tabprep.ErrOption, name, "method %q but no edges for this column; add it to Edges", BinEdges)
			}
			for i, v := range e {
				if math.IsNaN(v) || math.IsInf(v, 0) || i > 0 && v <= e[i-1] {
					return BinParams{}, tabprep.Errorf(op, tabprep.ErrOption, name, "edge %v at position %d: edges must be finite and strictly increasing", v, i)
				}
			}
			cuts = slices.Clone(e)
		} else {
			sorted := quantile.DropNaN(c.Float64s())
			if len(sorted) == 0 {
				return BinParams{}, tabprep.Errorf(op, tabprep.ErrAllMissing, name, "every train value is missing; there is no range to cut")
			}
			slices.Sort(sorted)
			cuts = make([]float64, 0, bins-1)
			lo, hi := sorted[0], sorted[len(sorted)-1]
			if math.IsInf(lo, 0) || math.IsInf(hi, 0) {
				return BinParams{}, tabprep.Errorf(op, tabprep.ErrValue, name, "train range [%v, %v] is not finite; drop or clip infinite values first", lo, hi)
			}
			for j := 1; j < bins; j++ {
				var v float64
				if s.Method == BinWidth {
					v = lo + (hi-lo)*float64(j)/float64(bins)
				} else {
					v = quantile.Sorted(sorted, float64(j)/float64(bins), quantile.Type7)
				}
				// A cut at the minimum would leave bin 0 empty, and equal
				// cuts an empty bin between them.
				if v > lo && (len(cuts) == 0 || v > cuts[len(cuts)-1]) {
					cuts = append(cuts, v)
				}
			}
		}
		p.Columns = append(p.Columns, BinColumn{Name: name, Cuts: cuts})
	}
	return p, nil
}

// Transform replaces each fitted column by its bins. It does not modify
// data.
func (s Bin) Transform(p BinParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	const op = "encode.bin transform"
	outs := make([]encoded, len(p.Columns))
	for ci, bc := range p.Columns {
		c, err := columnOf(op, data, bc.Name, tabprep.Numeric)
		if err != nil {
			return nil, err
		}
		cuts := []float64(bc.Cuts)
		x := c.Float64s()
		var col *tabprep.Column
		if s.Codes {
			vals := make([]float64, len(x))
			for i, v := range x {
				if v != v {
					vals[i] = v
				} else {
					vals[i] = float64(binOf(cuts, v))
				}
			}
			col = tabprep.AdoptNumeric(bc.Name, vals)
		} else {
			codes := make([]int32, len(x))
			for i, v := range x {
				if v != v {
					codes[i] = tabprep.MissingCode
				} else {
					codes[i] = int32(binOf(cuts, v))
				}
			}
			if col, err = tabprep.AdoptCategorical(bc.Name, bc.Levels(), codes); err != nil {
				return nil, err
			}
		}
		outs[ci] = encoded{source: bc.Name, cols: []*tabprep.Column{col}}
	}
	return assemble(op, data, outs)
}

// binOf returns the number of cuts ≤ v.
func binOf(cuts []float64, v float64) int {
	return sort.Search(len(cuts), func(i int) bool { return cuts[i] > v })
}

// RowKernel returns a row function that writes the same cells as
// [Bin.Transform], without allocating: a bin index with Codes, or else the
// bin's interval level and its code in the output layout.
func (s Bin) RowKernel(p BinParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	at, levels, err := s.rows(p, l)
	if err != nil {
		return nil, err
	}
	fn := func(regs []tabprep.Cell) error {
		for i, bc := range p.Columns {
			c := &regs[at[i]]
			v := c.Num
			switch {
			case s.Codes:
				if v == v {
					c.Num = float64(binOf(bc.Cuts, v))
				}
			case v != v:
				c.Str, c.Code = "", tabprep.MissingCode
			default:
				b := binOf(bc.Cuts, v)
				c.Str, c.Code = levels[i][b], int32(b)
			}
		}
		return nil
	}
	return fn, nil
}

// RowSource writes the row kernel as Go source, for generated plans: a
// chain of comparisons with the cuts, which gives what binOf's search does
// because the cuts ascend.
func (s Bin) RowSource(p BinParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	at, levels, err := s.rows(p, l)
	if err != nil {
		return err
	}
	for i, bc := range p.Columns {
		if !slices.IsSorted(bc.Cuts) {
			return tabprep.Errorf("encode.bin row", tabprep.ErrOption, bc.Name, "cuts do not ascend; refit the step")
		}
		k := at[i]
		n := w.Num(k)
		set := func(b int) {
			if s.Codes {
				w.Line("%s = %d", n, b)
			} else {
				w.Line("%s, %s = %s, %d", w.Str(k), w.Code(k), w.Quote(levels[i][b]), b)
			}
		}
		if s.Codes {
			w.Line("if %s == %s {", n, n)
		} else {
			w.Line("if %s != %s {", n, n)
			w.Line("%s, %s = \"\", %d", w.Str(k), w.Code(k), tabprep.MissingCode)
			w.Line("} else {")
		}
		w.Line("switch {")
		for b, cut := range bc.Cuts {
			w.Line("case %s < %s:", n, w.Float(cut))
			set(b)
		}
		w.Line("default:")
		set(len(bc.Cuts))
		w.Line("}")
		w.Line("}")
	}
	return nil
}

// rows records the step's columns in l and returns their slots and, unless
// the step writes codes, the interval levels of each.
func (s Bin) rows(p BinParams, l *tabprep.RowLayout) (at []int, levels [][]string, err error) {
	const op = "encode.bin row"
	sources := sourceNames(p.Columns, func(c BinColumn) string { return c.Name })
	fields := make([][]tabprep.Field, len(p.Columns))
	levels = make([][]string, len(p.Columns))
	for i, bc := range p.Columns {
		f := tabprep.Field{Name: bc.Name, Kind: tabprep.Numeric}
		if !s.Codes {
			levels[i] = bc.Levels()
			f = tabprep.Field{Name: bc.Name, Kind: tabprep.Categorical, Levels: levels[i]}
		}
		fields[i] = []tabprep.Field{f}
	}
	at, _, _, err = arrange(op, l, sources, tabprep.Numeric, fields)
	if err != nil {
		return nil, nil, err
	}
	return at, levels, nil
}

var (
	_ tabprep.RowKernel[BinParams] = Bin{}
	_ tabprep.RowSource[BinParams] = Bin{}
)
