package split

import (
	"errors"
	"fmt"
	"math"

	"github.com/tabprep/tabprep"
)

// ErrTooFew is wrapped by the error returned when there are not enough rows,
// classes or groups for what was asked: an empty frame, a row count or K
// larger than the rows to split, fewer groups than folds, or ties on an
// ordering column that leave a partition empty.
var ErrTooFew = errors.New("too few rows or groups")

// Strategy divides the train rows of a frame into train and one or more
// holdout partitions. Apply returns a frame with the same columns (shared,
// not copied) in which the held-out rows are tagged with
// [tabprep.Holdout] of their partition, and a [Report] of the result. Rows
// already tagged holdout in the input keep their role and take no part in
// the split, so splits nest: a test split followed by a validation split of
// what is left.
type Strategy interface {
	Apply(f *tabprep.Frame) (*tabprep.Frame, *Report, error)
}

// part is one holdout partition a split is asked for: its name and its size,
// as a share of the rows to split or as a row count.
type part struct {
	name     string
	fraction float64
	rows     int
}

// divider decides which rows go to each holdout partition.
type divider interface {
	divide(op string, f *tabprep.Frame, rs rowset, parts []part) (plan, error)
}

// multiway is implemented by the strategies that can fill several holdout
// partitions in one pass, which [ThreeWay] needs to keep class shares exact.
type multiway interface {
	divider
	// sized reports whether the strategy's own size or partition fields
	// are set.
	sized() bool
	// describe returns the method for the report and the report column.
	describe() (method, reportBy string)
}

// plan is what a strategy decided: the rows of each holdout partition.
type plan struct {
	rows [][]int
	// classes, when set, already counts the rows of each class of the
	// report column per partition (train first), so the report needs no
	// second pass.
	classes *classTable
	notes   []string
}

// rowset is the rows a split divides: the train rows of its input.
type rowset struct {
	all  bool  // every row of the frame is train; rows is nil
	rows []int // the train rows, in order, when !all
	n    int   // number of rows to split
	kept int   // rows already holdout, left alone
}

func (rs rowset) row(j int) int {
	if rs.all {
		return j
	}
	return rs.rows[j]
}

// maxRows bounds the frame size, because split keeps row positions in int32
// scratch arrays to halve their memory traffic.
const maxRows = math.MaxInt32

// trainRows returns the rows a split of f divides.
func trainRows(op string, f *tabprep.Frame) (rowset, error) {
	if f == nil {
		return rowset{}, tabprep.Errorf(op, tabprep.ErrSchema, "", "nil frame")
	}
	n := f.NumRows()
	if n > maxRows {
		return rowset{}, tabprep.Errorf(op, tabprep.ErrValue, "", "%d rows; split handles at most %d rows per frame, split the data in chunks", n, maxRows)
	}
	h := f.HoldoutCount()
	if h == 0 {
		if n == 0 {
			return rowset{}, tabprep.Errorf(op, ErrTooFew, "", "the frame has no rows to split")
		}
		return rowset{all: true, n: n}, nil
	}
	rows := make([]int, 0, n-h)
	for i := range n {
		if !f.Role(i).Holdout {
			rows = append(rows, i)
		}
	}
	if len(rows) == 0 {
		return rowset{}, tabprep.Errorf(op, ErrTooFew, "", "all %d rows are already tagged holdout; there are no train rows to split", n)
	}
	return rowset{rows: rows, n: len(rows), kept: h}, nil
}

// freeNames checks that no row of f is already in one of the partitions a
// split is about to fill, so two splits never merge their holdout rows, and
// that the frame has room for them.
func freeNames(op string, f *tabprep.Frame, names []string) error {
	used := f.Partitions()
	for _, n := range names {
		for _, u := range used {
			if u == n {
				return tabprep.Errorf(op, tabprep.ErrRole, "", "rows are already tagged holdout partition %q; give this split another partition name", n)
			}
		}
		if n == "train" {
			return tabprep.Errorf(op, tabprep.ErrRole, "", "a holdout partition may not be named \"train\"")
		}
	}
	const maxParts = 255 // the root package's limit per frame
	if len(used)+len(names) > maxParts {
		return tabprep.Errorf(op, tabprep.ErrRole, "", "the frame already uses %d holdout partitions; at most %d fit in one frame", len(used), maxParts)
	}
	return nil
}

// partName returns name, or def if name is empty.
func partName(name, def string) string {
	if name == "" {
		return def
	}
	return name
}

// sizes resolves each part to a row count out of n rows, checking each and
// their sum: every partition, train included, must get at least one row.
func sizes(op string, parts []part, n int) ([]int, error) {
	out := make([]int, len(parts))
	total := 0
	for p, pt := range parts {
		h, err := pt.count(op, n)
		if err != nil {
			return nil, err
		}
		out[p] = h
		total += h
	}
	if len(parts) > 1 && total >= n {
		return nil, tabprep.Errorf(op, ErrTooFew, "", "the holdout partitions take %d of the %d rows to split, leaving no train row; make them smaller", total, n)
	}
	return out, nil
}

// count resolves p to a row count out of n rows.
func (p part) count(op string, n int) (int, error) {
	switch {
	case p.fraction != 0 && p.rows != 0:
		return 0, tabprep.Errorf(op, tabprep.ErrOption, "", "partition %q has both Fraction %v and Rows %d; set one", p.name, p.fraction, p.rows)
	case p.rows < 0:
		return 0, tabprep.Errorf(op, tabprep.ErrOption, "", "partition %q: Rows %d is negative; give a count in [1, %d]", p.name, p.rows, n-1)
	case p.rows > 0:
		if p.rows >= n {
			return 0, tabprep.Errorf(op, ErrTooFew, "", "partition %q: Rows %d is not below the %d rows to split; give a count in [1, %d]", p.name, p.rows, n, n-1)
		}
		return p.rows, nil
	case p.fraction == 0:
		return 0, tabprep.Errorf(op, tabprep.ErrOption, "", "partition %q has no size; set Fraction in (0, 1) or Rows", p.name)
	}
	if err := checkFraction(op, p.name, p.fraction); err != nil {
		return 0, err
	}
	h := int(math.Round(p.fraction * float64(n)))
	if h < 1 || h >= n {
		return 0, tabprep.Errorf(op, ErrTooFew, "", "partition %q: Fraction %v of %d rows rounds to %d rows; it must leave at least one row on each side, so use a fraction in [%.3g, %.3g] or give Rows",
			p.name, p.fraction, n, h, 0.5/float64(n), 1-0.5/float64(n))
	}
	return h, nil
}

func checkFraction(op, name string, f float64) error {
	if !(f > 0 && f < 1) {
		return tabprep.Errorf(op, tabprep.ErrOption, "", "partition %q: Fraction %v is outside (0, 1); give the share of rows to hold out, such as 0.2", name, f)
	}
	return nil
}

// checkK checks a fold count against the rows to split.
func checkK(op string, k, n int) error {
	if k < 2 {
		return tabprep.Errorf(op, tabprep.ErrOption, "", "K %d is below 2; use at least 2 folds", k)
	}
	if k > n {
		return tabprep.Errorf(op, ErrTooFew, "", "K %d is more than the %d rows to split; use at most %d folds", k, n, n)
	}
	return nil
}

// classColumn returns the categorical column name. A missing cell among
// the rows to split is an error naming its row unless missingAsClass is set,
// in which case missing cells form one more class.
func classColumn(op string, f *tabprep.Frame, rs rowset, name string, missingAsClass bool) (*tabprep.Column, error) {
	if name == "" {
		return nil, tabprep.Errorf(op, tabprep.ErrOption, "", "no column named; set Column to a categorical column")
	}
	c, err := f.Column(name)
	if err != nil {
		return nil, tabprep.Errorf(op, tabprep.ErrNoColumn, name, "not in the frame; it has %q", f.Names())
	}
	if c.Kind() != tabprep.Categorical {
		return nil, tabprep.Errorf(op, tabprep.ErrKind, name, "is %v; classes come from a categorical column (bin a numeric column first)", c.Kind())
	}
	if missingAsClass {
		return c, nil
	}
	codes := c.Codes()
	for j := range rs.n {
		if i := rs.row(j); codes[i] == tabprep.MissingCode {
			return nil, tabprep.Errorf(op, tabprep.ErrValue, name, "missing class; fill it, or set MissingAsClass to treat missing cells as one more class").AtRow(i)
		}
	}
	return c, nil
}

// classOf maps a code to a class number, missing cells last.
func classOf(code int32, missing int) int {
	if code == tabprep.MissingCode {
		return missing
	}
	return int(code)
}

// apply runs a two-way strategy: one holdout partition of the given size.
func apply(op string, m divider, f *tabprep.Frame, pt part, method, reportBy string) (*tabprep.Frame, *Report, error) {
	return run(op, m, f, []part{pt}, method, reportBy)
}

// run resolves the rows, lets m decide, tags the result and reports it.
func run(op string, m divider, f *tabprep.Frame, parts []part, method, reportBy string) (*tabprep.Frame, *Report, error) {
	rs, err := trainRows(op, f)
	if err != nil {
		return nil, nil, err
	}
	names := make([]string, len(parts))
	for p := range parts {
		names[p] = parts[p].name
	}
	if err := freeNames(op, f, names); err != nil {
		return nil, nil, err
	}
	pl, err := m.divide(op, f, rs, parts)
	if err != nil {
		return nil, nil, err
	}
	return finish(op, f, rs, names, pl, method, reportBy)
}

// finish tags the planned rows and builds the report.
func finish(op string, f *tabprep.Frame, rs rowset, names []string, pl plan, method, reportBy string) (*tabprep.Frame, *Report, error) {
	out := f
	for p, rows := range pl.rows {
		var err error
		if out, err = out.Tag(tabprep.Holdout(names[p]), rows); err != nil {
			return nil, nil, err
		}
	}
	r, err := newReport(op, f, rs, names, pl, method, reportBy)
	if err != nil {
		return nil, nil, err
	}
	return out, r, nil
}

func percent(x float64) string { return fmt.Sprintf("%.1f%%", 100*x) }
