package encode

import (
	"math"
	"math/rand/v2"
	"slices"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// DefaultFolds is the number of folds of [Target.FitOutOfFold] when
// [Target.Folds] is zero.
const DefaultFolds = 5

// Target is target encoding: each level of a selected categorical column
// becomes the mean of the target over the train rows with that level,
// shrunk towards the global mean by the weight of Micci-Barreca (2001), "A
// preprocessing scheme for high-cardinality categorical attributes in
// classification and prediction problems", ACM SIGKDD Explorations 3(1),
// 27–32, eq. (4) with the sigmoid weight of eq. (5):
//
//	S = λ(n)·ȳ_level + (1 − λ(n))·ȳ,    λ(n) = 1 / (1 + exp(−(n − k)/f))
//
// where n is the level's train count, ȳ_level its mean target and ȳ the mean
// over all train rows. k is the count at which a level's own mean gets half
// the weight, f how fast the weight moves from the global mean to the
// level's mean.
//
// A numeric target (a 0/1 target is numeric) gives one column that replaces
// the source in place. A categorical target gives one column per class,
// "<column>@<class>", holding the smoothed share of that class. A missing
// cell counts as a level of its own; a level training never saw gets ȳ.
// The target must have no gaps (NaN, infinite or missing).
//
// Fit and Transform alone give every row the full-train values, which leak
// each training row's own target into its value. [Target.FitOutOfFold], which
// a pipeline calls when it fits, gives the training rows out-of-fold values
// instead: rows are dealt at random (seeded by Seed) into Folds folds, and
// the rows of each fold get the values computed from the other folds only.
// The parameters keep the full-train statistics for new data.
type Target struct {
	// Columns selects categorical columns; the zero value selects all but
	// the target.
	Columns tabprep.Selection `json:"columns"`
	// Target names the target column, numeric or categorical.
	Target string `json:"target"`
	// K is the k of λ(n): the count at which a level's mean weighs half.
	K float64 `json:"k"`
	// F is the f of λ(n), which must be positive; 0 means 1.
	F float64 `json:"f,omitempty"`
	// Folds is the number of out-of-fold folds, at least 2; 0 means
	// DefaultFolds.
	Folds int `json:"folds,omitempty"`
	// Seed fixes the deal of rows into folds.
	Seed uint64 `json:"seed"`
}

// TargetParams are the full-train statistics of a [Target] step.
type TargetParams struct {
	// Target is the target column.
	Target string `json:"target"`
	// Classes are the classes of a categorical target, one output column
	// each; empty for a numeric target.
	Classes []string `json:"classes,omitempty"`
	// Prior is ȳ, one value per output column.
	Prior state.Floats `json:"prior"`
	// Columns are the encoded columns.
	Columns []TargetColumn `json:"columns"`
}

// TargetColumn holds the encoded values of one column.
type TargetColumn struct {
	// Name is the source column.
	Name string `json:"name"`
	// Levels are the train levels, Counts their train counts.
	Levels []string `json:"levels"`
	Counts []int    `json:"counts"`
	// Values are S per level and output column, level by level.
	Values state.Floats `json:"values"`
	// Missing is S of a missing cell, one per output column (ȳ if train
	// had no missing cell); MissingCount the train count.
	Missing      state.Floats `json:"missing"`
	MissingCount int          `json:"missing_count"`
}

func init() { state.Register(Target{}) }

// Kind returns "encode.target".
func (Target) Kind() string { return "encode.target" }

// Names returns the output column names of a source column.
func (p TargetParams) names(source string) []string {
	if len(p.Classes) == 0 {
		return []string{source}
	}
	out := make([]string, len(p.Classes))
	for i, c := range p.Classes {
		out[i] = source + "@" + c
	}
	return out
}

// Outputs returns the names of the columns the step writes, in order.
func (p TargetParams) Outputs() []string {
	var out []string
	for _, c := range p.Columns {
		out = append(out, p.names(c.Name)...)
	}
	return out
}

// Weight returns λ(n) = 1/(1+exp(−(n−k)/f)), the weight of a level's own
// mean (Micci-Barreca 2001, eq. 5).
func Weight(n, k, f float64) float64 {
	return 1 / (1 + math.Exp(-(n-k)/f))
}

// targetData is the target as one value per row and output column: the
// value of a numeric target, or 0/1 class indicators.
type targetData struct {
	width int       // output columns per source
	num   []float64 // numeric target
	class []int32   // class per row, categorical target
}

func (y targetData) add(sums []float64, row int) {
	if y.class == nil {
		sums[0] += y.num[row]
		return
	}
	sums[y.class[row]]++
}

// tally holds, per level (the last one is "missing"), the count and the
// target sums of one group of rows.
type tally struct {
	counts []float64
	sums   []float64
}

func newTally(levels, width int) tally {
	return tally{counts: make([]float64, levels+1), sums: make([]float64, (levels+1)*width)}
}

func (t tally) minus(o tally) tally {
	d := tally{counts: slices.Clone(t.counts), sums: slices.Clone(t.sums)}
	for i := range d.counts {
		d.counts[i] -= o.counts[i]
	}
	for i := range d.sums {
		d.sums[i] -= o.sums[i]
	}
	return d
}

// encodings returns S per level (the last "missing") and output column,
// and the prior ȳ, from t.
func (s Target) encodings(t tally, width int) (vals, prior []float64) {
	f := s.F
	if f == 0 {
		f = 1
	}
	prior = make([]float64, width)
	total := 0.0
	for l, n := range t.counts {
		total += n
		for j := 0; j < width; j++ {
			prior[j] += t.sums[l*width+j]
		}
	}
	for j := range prior {
		prior[j] /= total
	}
	vals = make([]float64, len(t.sums))
	for l, n := range t.counts {
		lambda := 0.0
		if n > 0 {
			lambda = Weight(n, s.K, f)
		}
		for j := 0; j < width; j++ {
			mean := 0.0
			if n > 0 {
				mean = t.sums[l*width+j] / n
			}
			vals[l*width+j] = lambda*mean + (1-lambda)*prior[j]
		}
	}
	return vals, prior
}

// prepared is what a fit needs: the selected columns with each row's level
// index (missing is the last index), and the target.
type prepared struct {
	names  []string
	stats  []levelStats
	index  [][]int32
	y      targetData
	params TargetParams
}

func (s Target) prepare(op string, train *tabprep.Frame) (prepared, error) {
	var pr prepared
	if err := tabprep.RequireTrain(op, train); err != nil {
		return pr, err
	}
	f := s.F
	if f == 0 {
		f = 1
	}
	if !(f > 0) || math.IsInf(f, 0) || math.IsNaN(s.K) || math.IsInf(s.K, 0) || s.Folds < 0 || s.Folds == 1 {
		return pr, tabprep.Errorf(op, tabprep.ErrOption, "", "K %v, F %v, Folds %d: K must be finite, F positive and finite, Folds 0 or at least 2", s.K, s.F, s.Folds)
	}
	yc, err := train.Column(s.Target)
	if err != nil {
		return pr, tabprep.Errorf(op, tabprep.ErrNoColumn, s.Target, "target column not in the frame; it has %q", train.Names())
	}
	pr.params.Target = s.Target
	switch yc.Kind() {
	case tabprep.Numeric:
		for i, v := range yc.Float64s() {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return pr, tabprep.Errorf(op, tabprep.ErrValue, s.Target, "target value %v; the target must have no gaps: drop or fill those rows before fitting", v).AtRow(i)
			}
		}
		pr.y = targetData{width: 1, num: yc.Float64s()}
	default:
		st := countLevels(yc)
		if st.missing > 0 {
			return pr, tabprep.Errorf(op, tabprep.ErrValue, s.Target, "missing target; the target must have no gaps: drop or fill those rows before fitting").AtRow(firstRowOf(yc, tabprep.MissingCode))
		}
		pr.params.Classes = st.levels
		classOf := remap(yc, indexOf(st.levels))
		cls := make([]int32, yc.Len())
		for i, k := range yc.Codes() {
			cls[i] = classOf[k]
		}
		pr.y = targetData{width: len(st.levels), class: cls}
	}
	if train.NumRows() == 0 {
		return pr, tabprep.Errorf(op, tabprep.ErrAllMissing, s.Target, "no train rows")
	}
	sel := s.Columns
	names, err := sel.Resolve(op, train, tabprep.Categorical)
	if err != nil {
		return pr, err
	}
	if slices.Contains(names, s.Target) {
		if slices.Contains(sel.Names, s.Target) {
			return pr, tabprep.Errorf(op, tabprep.ErrOption, s.Target, "is the target and also selected to encode; leave it out of Columns")
		}
		names = slices.DeleteFunc(names, func(n string) bool { return n == s.Target })
		if len(names) == 0 {
			return pr, tabprep.Errorf(op, tabprep.ErrNoColumn, "", "no categorical column to encode besides the target %q", s.Target)
		}
	}
	pr.names = names
	for _, name := range names {
		c, _ := train.Column(name)
		st := countLevels(c)
		lv := remap(c, indexOf(st.levels))
		idx := make([]int32, c.Len())
		for i, k := range c.Codes() {
			if k == tabprep.MissingCode {
				idx[i] = int32(len(st.levels))
			} else {
				idx[i] = lv[k]
			}
		}
		pr.stats = append(pr.stats, st)
		pr.index = append(pr.index, idx)
	}
	return pr, nil
}

// tallyRows counts the rows of one column into per-fold tallies (fold nil:
// one tally of all rows).
func (pr prepared) tallyRows(col int, fold []int, folds int) []tally {
	levels := len(pr.stats[col].levels)
	w := pr.y.width
	ts := make([]tally, folds)
	for i := range ts {
		ts[i] = newTally(levels, w)
	}
	for row, l := range pr.index[col] {
		g := 0
		if fold != nil {
			g = fold[row]
		}
		ts[g].counts[l]++
		pr.y.add(ts[g].sums[int(l)*w:int(l+1)*w], row)
	}
	return ts
}

func (pr *prepared) fill(s Target, col int, all tally) {
	st := pr.stats[col]
	w := pr.y.width
	vals, prior := s.encodings(all, w)
	L := len(st.levels)
	tc := TargetColumn{Name: pr.names[col], Levels: st.levels, Counts: st.counts,
		Values: vals[:L*w], Missing: vals[L*w:], MissingCount: st.missing}
	if st.missing == 0 {
		tc.Missing = slices.Clone(prior)
	}
	pr.params.Prior = prior
	pr.params.Columns = append(pr.params.Columns, tc)
}

// Fit learns the full-train encoding of each selected column.
func (s Target) Fit(train *tabprep.Frame) (TargetParams, error) {
	pr, err := s.prepare("encode.target fit", train)
	if err != nil {
		return TargetParams{}, err
	}
	for col := range pr.names {
		pr.fill(s, col, pr.tallyRows(col, nil, 1)[0])
	}
	return pr.params, nil
}

// FitOutOfFold returns the full-train parameters and train with each
// training row encoded from the folds it is not in. It implements
// [tabprep.OutOfFold].
func (s Target) FitOutOfFold(train *tabprep.Frame) (TargetParams, *tabprep.Frame, error) {
	const op = "encode.target fit"
	pr, err := s.prepare(op, train)
	if err != nil {
		return TargetParams{}, nil, err
	}
	k := s.Folds
	if k == 0 {
		k = DefaultFolds
	}
	n := train.NumRows()
	if n < k {
		return TargetParams{}, nil, tabprep.Errorf(op, tabprep.ErrOption, "", "%d train rows for %d folds; use fewer folds", n, k)
	}
	// A seeded random permutation dealt round robin: fold sizes differ by
	// at most one.
	fold := make([]int, n)
	r := rand.New(rand.NewPCG(s.Seed, 0x7461726765740000))
	for i, row := range r.Perm(n) {
		fold[row] = i % k
	}
	w := pr.y.width
	outs := make([]encoded, len(pr.names))
	for col, name := range pr.names {
		per := pr.tallyRows(col, fold, k)
		all := newTally(len(pr.stats[col].levels), w)
		for _, t := range per {
			for i, c := range t.counts {
				all.counts[i] += c
			}
			for i, v := range t.sums {
				all.sums[i] += v
			}
		}
		pr.fill(s, col, all)
		blocks := make([]float64, n*w)
		for g := range k {
			vals, _ := s.encodings(all.minus(per[g]), w)
			for row, l := range pr.index[col] {
				if fold[row] != g {
					continue
				}
				for j := 0; j < w; j++ {
					blocks[j*n+row] = vals[int(l)*w+j]
				}
			}
		}
		outs[col] = encoded{source: name, cols: split(pr.params.names(name), blocks, n)}
	}
	out, err := assemble(op, train, outs)
	if err != nil {
		return TargetParams{}, nil, err
	}
	return pr.params, out, nil
}

// Transform encodes each fitted column with the full-train values. The
// target column is not read, so new data need not have it.
func (s Target) Transform(p TargetParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	const op = "encode.target transform"
	n := data.NumRows()
	w := len(p.Prior)
	outs := make([]encoded, len(p.Columns))
	for ci, tc := range p.Columns {
		c, err := columnOf(op, data, tc.Name, tabprep.Categorical)
		if err != nil {
			return nil, err
		}
		if len(tc.Values) != len(tc.Levels)*w || len(tc.Missing) != w {
			return nil, tabprep.Errorf(op, tabprep.ErrSchema, tc.Name, "parameters hold %d values for %d levels and %d outputs; fit again", len(tc.Values), len(tc.Levels), w)
		}
		lv := remap(c, indexOf(tc.Levels))
		block := make([]float64, n*w)
		for row, k := range c.Codes() {
			var v []float64
			switch {
			case k == tabprep.MissingCode:
				v = tc.Missing
			case lv[k] < 0:
				v = p.Prior
			default:
				v = tc.Values[int(lv[k])*w : int(lv[k]+1)*w]
			}
			for j, x := range v {
				block[j*n+row] = x
			}
		}
		outs[ci] = encoded{source: tc.Name, cols: split(p.names(tc.Name), block, n)}
	}
	return assemble(op, data, outs)
}

// Targets returns the target column, which a pipeline hands this step at
// fit and keeps out of its input and output (see [tabprep.Supervised]).
func (s Target) Targets() []string { return []string{s.Target} }

var _ tabprep.Supervised = Target{}

// RowKernel returns a row function that writes the same cells as
// [Target.Transform], the full-train values, without allocating. The
// target column is not read: a pipeline keeps it out of the row layout
// (see [tabprep.Supervised]).
func (s Target) RowKernel(p TargetParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return s.table(p).kernel(l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s Target) RowSource(p TargetParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return s.table(p).source(l, w)
}

func (s Target) table(p TargetParams) tableStep {
	const op = "encode.target row"
	w := len(p.Prior)
	for _, tc := range p.Columns {
		if len(tc.Values) != len(tc.Levels)*w || len(tc.Missing) != w {
			return tableStep{err: tabprep.Errorf(op, tabprep.ErrSchema, tc.Name, "parameters hold %d values for %d levels and %d outputs; fit again", len(tc.Values), len(tc.Levels), w)}
		}
	}
	sources := sourceNames(p.Columns, func(c TargetColumn) string { return c.Name })
	fields := numericFields(sources, p.names)
	return tableStep{op: op, sources: sources, fields: fields, bad: BadMissing, build: func(i int, levels []string) tableColumn {
		tc := p.Columns[i]
		index := indexOf(tc.Levels)
		value := func(level string) []float64 {
			if k, ok := index[level]; ok {
				return tc.Values[int(k)*w : int(k+1)*w]
			}
			return p.Prior
		}
		return constTable(levels, w, value, tc.Missing, p.Prior)
	}}
}

var (
	_ tabprep.RowKernel[TargetParams] = Target{}
	_ tabprep.RowSource[TargetParams] = Target{}
)
