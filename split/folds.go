package split

import (
	"cmp"
	"fmt"
	"iter"
	"math"
	"slices"

	"github.com/tabprep/tabprep"
)

// Unused is the partition of the rows a time fold neither trains on nor
// holds out: rows after its holdout, in its buffer, or before its window.
// They are tagged holdout so no fit reads them.
const Unused = "unused"

// Fold is one fold of a cross-validation scheme.
type Fold struct {
	// Frame has every row of the input; this fold's holdout rows are
	// tagged [tabprep.Holdout] of [tabprep.DefaultPartition], so
	// Frame.Train() is what to fit on.
	Frame *tabprep.Frame
	// Report counts this fold's partitions.
	Report *Report
}

// Folding is a cross-validation scheme. Folds checks its options against f
// and returns the folds, numbered from 0, for use as
//
//	folds, err := split.RandomFolds{K: 5}.Folds(f)
//	...
//	for i, fold := range folds { ... }
//
// The sequence is not single-use: each pass computes the same folds again,
// one at a time, so only one fold's roles are held at once. As with
// [Strategy], rows already holdout in f take no part.
type Folding interface {
	Folds(f *tabprep.Frame) (iter.Seq2[int, Fold], error)
}

// foldSet is the folds of a scheme: fold i holds out hold(i) and sets
// unused(i) aside.
type foldSet struct {
	op, method, reportBy string
	f                    *tabprep.Frame
	rs                   rowset
	k                    int
	hold                 func(i int) []int
	unused               func(i int) []int // nil for schemes that set none aside
}

// blocks returns hold(i) = order[bounds[i]:bounds[i+1]].
func blocks(order, bounds []int) func(int) []int {
	return func(i int) []int { return order[bounds[i]:bounds[i+1]] }
}

func (s foldSet) seq() (iter.Seq2[int, Fold], error) {
	names := []string{tabprep.DefaultPartition}
	if s.unused != nil {
		names = append(names, Unused)
	}
	if err := freeNames(s.op, s.f, names); err != nil {
		return nil, err
	}
	return func(yield func(int, Fold) bool) {
		for i := range s.k {
			rows := [][]int{s.hold(i)}
			if s.unused != nil {
				rows = append(rows, s.unused(i))
			}
			out, rep, err := finish(s.op, s.f, s.rs, names[:len(rows)], plan{rows: rows}, fmt.Sprintf("%s, fold %d of %d", s.method, i+1, s.k), s.reportBy)
			if err != nil {
				// Every row index and name was checked in Folds.
				panic("split: fold could not be tagged: " + err.Error())
			}
			if !yield(i, Fold{Frame: out, Report: rep}) {
				return
			}
		}
	}, nil
}

// checkReport checks the report column before any fold is made, so the
// sequence cannot fail part way.
func checkReport(op string, f *tabprep.Frame, column string) error {
	if column == "" {
		return nil
	}
	c, err := f.Column(column)
	if err != nil {
		return tabprep.Errorf(op, tabprep.ErrNoColumn, column, "report column not in the frame; it has %q", f.Names())
	}
	if c.Kind() != tabprep.Categorical {
		return tabprep.Errorf(op, tabprep.ErrKind, column, "report column is %v; the report counts the classes of a categorical column", c.Kind())
	}
	return nil
}

// equalBounds splits n positions into k blocks whose sizes differ by at
// most one, the larger first.
func equalBounds(n, k int) []int {
	b := make([]int, k+1)
	for i := range k {
		b[i+1] = b[i] + n/k
		if i < n%k {
			b[i+1]++
		}
	}
	return b
}

// RandomFolds is k-fold cross-validation: the rows are shuffled (Fisher-
// Yates, from the package's PCG stream) and cut into K folds whose sizes
// differ by at most one row; each fold holds out one of them.
type RandomFolds struct {
	// K is the number of folds, at least 2 and at most the rows to split.
	K int
	// Seed picks the pseudo-random sequence; any value is fine.
	Seed uint64
	// ReportBy names a categorical column whose classes each fold's report
	// counts; "" for none.
	ReportBy string
}

// Folds returns the K folds of f; see [Folding].
func (s RandomFolds) Folds(f *tabprep.Frame) (iter.Seq2[int, Fold], error) {
	const op = "split.randomfolds"
	rs, err := trainRows(op, f)
	if err != nil {
		return nil, err
	}
	if err := checkK(op, s.K, rs.n); err != nil {
		return nil, err
	}
	if err := checkReport(op, f, s.ReportBy); err != nil {
		return nil, err
	}
	order := make([]int, rs.n)
	for j := range order {
		order[j] = rs.row(j)
	}
	shuffle(newDraw(s.Seed), order)
	return foldSet{op: op, method: fmt.Sprintf("random %d-fold, seed %d", s.K, s.Seed), reportBy: s.ReportBy,
		f: f, rs: rs, k: s.K, hold: blocks(order, equalBounds(rs.n, s.K))}.seq()
}

// StratifiedFolds is stratified k-fold cross-validation: each class of a
// categorical column is shuffled on its own and dealt to the folds in turn,
// the deal carrying on from class to class, so every fold holds within one
// row of 1/K of every class and fold sizes differ by at most one row.
type StratifiedFolds struct {
	// Column is the categorical column whose classes are kept in
	// proportion.
	Column string
	// K is the number of folds, at least 2 and at most the rows to split.
	K int
	// Seed picks the pseudo-random sequence; any value is fine.
	Seed uint64
	// MissingAsClass makes missing cells of Column one more class; without
	// it a missing cell is an error.
	MissingAsClass bool
	// ReportBy names the categorical column the reports count; "" means
	// Column.
	ReportBy string
}

// Folds returns the K folds of f; see [Folding].
func (s StratifiedFolds) Folds(f *tabprep.Frame) (iter.Seq2[int, Fold], error) {
	const op = "split.stratifiedfolds"
	rs, err := trainRows(op, f)
	if err != nil {
		return nil, err
	}
	col, err := classColumn(op, f, rs, s.Column, s.MissingAsClass)
	if err != nil {
		return nil, err
	}
	if err := checkK(op, s.K, rs.n); err != nil {
		return nil, err
	}
	by := partName(s.ReportBy, s.Column)
	if err := checkReport(op, f, by); err != nil {
		return nil, err
	}
	st := countStrata(rs, col.Codes(), len(col.Levels())+1)
	// Group the rows by class (a counting sort), shuffle each class, deal.
	start := make([]int, len(st.count)+1)
	for c, m := range st.count {
		start[c+1] = start[c] + m
	}
	byClass := make([]int, rs.n)
	fill := slices.Clone(start[:len(st.count)])
	for j := range rs.n {
		i := rs.row(j)
		c := st.class(i)
		byClass[fill[c]] = i
		fill[c]++
	}
	d := newDraw(s.Seed)
	bounds := equalBounds(rs.n, s.K)
	order := make([]int, rs.n)
	next := slices.Clone(bounds[:s.K])
	deal := 0
	for c := range st.count {
		rows := byClass[start[c]:start[c+1]]
		shuffle(d, rows)
		for _, i := range rows {
			order[next[deal]] = i
			next[deal]++
			deal = (deal + 1) % s.K
		}
	}
	return foldSet{op: op, method: fmt.Sprintf("stratified %d-fold on %s, seed %d", s.K, s.Column, s.Seed), reportBy: by,
		f: f, rs: rs, k: s.K, hold: blocks(order, bounds)}.seq()
}

// GroupFolds is group k-fold cross-validation: all rows of a group (equal
// values of Column: a pet, an owner, a clinic) fall in one fold, so no
// group is on both sides of any fold. Groups are placed largest first,
// each in the fold with the fewest rows so far (the longest-processing-
// time rule of R. L. Graham, "Bounds on multiprocessing timing anomalies",
// SIAM J. Appl. Math. 17(2), 1969), groups of equal size in an order
// shuffled from the package's PCG stream, so folds come out near equal in
// rows.
type GroupFolds struct {
	// Column holds the group, numeric or categorical. A missing cell is an
	// error.
	Column string
	// K is the number of folds, at least 2 and at most the number of
	// groups.
	K int
	// Seed picks the pseudo-random sequence; any value is fine.
	Seed uint64
	// ReportBy names a categorical column whose classes each fold's report
	// counts; "" for none.
	ReportBy string
}

// Folds returns the K folds of f; see [Folding].
func (s GroupFolds) Folds(f *tabprep.Frame) (iter.Seq2[int, Fold], error) {
	const op = "split.groupfolds"
	rs, err := trainRows(op, f)
	if err != nil {
		return nil, err
	}
	if s.K < 2 {
		return nil, tabprep.Errorf(op, tabprep.ErrOption, "", "K %d is below 2; use at least 2 folds", s.K)
	}
	if err := checkReport(op, f, s.ReportBy); err != nil {
		return nil, err
	}
	group, groups, err := groupIDs(op, f, rs, s.Column)
	if err != nil {
		return nil, err
	}
	if groups < s.K {
		return nil, tabprep.Errorf(op, ErrTooFew, s.Column, "%d groups, fewer than K %d; use at most %d folds or finer groups", groups, s.K, groups)
	}
	size := make([]int, groups)
	for _, g := range group {
		size[g]++
	}
	ids := make([]int, groups)
	for g := range ids {
		ids[g] = g
	}
	shuffle(newDraw(s.Seed), ids)
	slices.SortStableFunc(ids, func(a, b int) int { return cmp.Compare(size[b], size[a]) })
	foldOf := make([]int, groups)
	load := make([]int, s.K)
	for _, g := range ids {
		best := 0
		for k := range load {
			if load[k] < load[best] {
				best = k
			}
		}
		foldOf[g] = best
		load[best] += size[g]
	}
	bounds := make([]int, s.K+1)
	for k, l := range load {
		bounds[k+1] = bounds[k] + l
	}
	order := make([]int, rs.n)
	next := slices.Clone(bounds[:s.K])
	for j, g := range group {
		k := foldOf[g]
		order[next[k]] = rs.row(j)
		next[k]++
	}
	return foldSet{op: op, method: fmt.Sprintf("group %d-fold on %s, seed %d", s.K, s.Column, s.Seed), reportBy: s.ReportBy,
		f: f, rs: rs, k: s.K, hold: blocks(order, bounds)}.seq()
}

// groupIDs numbers the groups of column among the rows to split, in order
// of first appearance, and returns the group of each of those rows.
func groupIDs(op string, f *tabprep.Frame, rs rowset, column string) ([]int, int, error) {
	c, err := f.Column(column)
	if err != nil {
		return nil, 0, tabprep.Errorf(op, tabprep.ErrNoColumn, column, "group column not in the frame; it has %q", f.Names())
	}
	group := make([]int, rs.n)
	missing := func(i int) error {
		return tabprep.Errorf(op, tabprep.ErrValue, column, "missing group; every row needs a group").AtRow(i)
	}
	n := 0
	if c.Kind() == tabprep.Categorical {
		id := make([]int, len(c.Levels()))
		for k := range id {
			id[k] = -1
		}
		codes := c.Codes()
		for j := range rs.n {
			i := rs.row(j)
			k := codes[i]
			if k == tabprep.MissingCode {
				return nil, 0, missing(i)
			}
			if id[k] < 0 {
				id[k] = n
				n++
			}
			group[j] = id[k]
		}
		return group, n, nil
	}
	id := make(map[float64]int)
	vals := c.Float64s()
	for j := range rs.n {
		i := rs.row(j)
		v := vals[i]
		if math.IsNaN(v) {
			return nil, 0, missing(i)
		}
		if v == 0 {
			v = 0 // -0 and +0 are one group
		}
		g, ok := id[v]
		if !ok {
			g = n
			id[v] = g
			n++
		}
		group[j] = g
	}
	return group, n, nil
}

// TimeFolds is cross-validation for time-ordered rows: the latest rows are
// cut into K consecutive holdout blocks, and each fold trains only on rows
// before its block, less a buffer of Buffer rows just before the block. With
// Window 0 the train rows grow fold by fold (an expanding window); with
// Window > 0 each fold trains on at most the Window rows before its buffer
// (a sliding window). Rows after a fold's block, in its buffer and before
// its window are tagged [Unused]. Equal values of Column never straddle a
// block edge or the end of the train rows: edges move later to where the
// value changes, so every train row is earlier than every holdout row.
type TimeFolds struct {
	// K is the number of folds, at least 2.
	K int
	// Column orders the rows as in [Ordered]; "" means row order.
	Column string
	// Holdout is the number of rows per holdout block; 0 means
	// (rows - Buffer) / (K + 1), so the first fold trains on about as many
	// rows as it holds out.
	Holdout int
	// Buffer is the number of rows left out between each fold's train rows
	// and its holdout block, so features that look back in time do not
	// leak; 0 for none.
	Buffer int
	// Window, if positive, is the most train rows a fold uses: the latest
	// ones before its buffer.
	Window int
	// ReportBy names a categorical column whose classes each fold's report
	// counts; "" for none.
	ReportBy string
}

// Folds returns the K folds of f; see [Folding].
func (s TimeFolds) Folds(f *tabprep.Frame) (iter.Seq2[int, Fold], error) {
	const op = "split.timefolds"
	rs, err := trainRows(op, f)
	if err != nil {
		return nil, err
	}
	n := rs.n
	switch {
	case s.K < 2:
		return nil, tabprep.Errorf(op, tabprep.ErrOption, "", "K %d is below 2; use at least 2 folds", s.K)
	case s.Holdout < 0 || s.Buffer < 0 || s.Window < 0:
		return nil, tabprep.Errorf(op, tabprep.ErrOption, "", "Holdout %d, Buffer %d and Window %d must not be negative", s.Holdout, s.Buffer, s.Window)
	}
	h := s.Holdout
	if h == 0 {
		h = (n - s.Buffer) / (s.K + 1)
	}
	if h < 1 || n-s.K*h-s.Buffer < 1 {
		return nil, tabprep.Errorf(op, ErrTooFew, "", "%d rows cannot hold %d blocks of %d rows, a buffer of %d and a train row; use fewer or smaller folds (need at least %d rows)",
			n, s.K, max(h, 1), s.Buffer, s.K*max(h, 1)+s.Buffer+1)
	}
	if err := checkReport(op, f, s.ReportBy); err != nil {
		return nil, err
	}
	o, err := orderRows(op, f, rs, s.Column)
	if err != nil {
		return nil, err
	}
	// Block i is o.rows[edge[i]:edge[i+1]]; its train rows end at
	// trainEnd[i] and start at trainStart[i].
	edge := make([]int, s.K+1)
	edge[s.K] = n
	for i := range s.K {
		edge[i] = o.up(n - (s.K-i)*h)
	}
	trainStart, trainEnd := make([]int, s.K), make([]int, s.K)
	for i := range s.K {
		trainEnd[i] = o.down(max(edge[i]-s.Buffer, 0))
		if s.Window > 0 {
			trainStart[i] = max(trainEnd[i]-s.Window, 0)
		}
		if edge[i+1] <= edge[i] || trainEnd[i] <= trainStart[i] {
			return nil, tabprep.Errorf(op, ErrTooFew, s.Column, "fold %d has no train or holdout rows once equal values of %s are kept together; use fewer folds or a finer ordering column", i+1, s.Column)
		}
	}
	rows := o.rows
	unused := func(i int) []int {
		out := make([]int, 0, n-(trainEnd[i]-trainStart[i])-(edge[i+1]-edge[i]))
		out = append(out, rows[:trainStart[i]]...)
		out = append(out, rows[trainEnd[i]:edge[i]]...)
		return append(out, rows[edge[i+1]:]...)
	}
	method := "time folds by row order"
	if s.Column != "" {
		method = "time folds by " + s.Column
	}
	return foldSet{op: op, method: method, reportBy: s.ReportBy, f: f, rs: rs, k: s.K,
		hold: blocks(rows, edge), unused: unused}.seq()
}
