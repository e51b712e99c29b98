package split

import (
	"fmt"

	"github.com/tabprep/tabprep"
)

// Ordered keeps the earliest rows as train and holds out the latest, for
// data ordered in time: a model is then checked on rows later than every
// row it was fitted on.
//
// Rows are ordered by Column, or by their position when Column is empty.
// Rows with equal values of Column never straddle the cut: the cut moves to
// the nearer place where the value changes (the later one when both are
// equally near), so the holdout may be a little larger or smaller than
// asked and the report says how large it is. Every train row then has a
// value below every holdout row's. It draws nothing at random.
type Ordered struct {
	// Column orders the rows: a numeric column by value, a categorical
	// column by its level strings (so ISO 8601 dates order by time); ""
	// means row order. A missing cell is an error.
	Column string
	// Fraction is the share of rows to hold out, in (0, 1).
	Fraction float64
	// Rows is a number of rows to hold out, used instead of Fraction.
	Rows int
	// Partition names the holdout partition; "" means
	// [tabprep.DefaultPartition].
	Partition string
	// ReportBy names a categorical column whose classes the report counts
	// per partition; "" for none.
	ReportBy string
}

// Apply splits the train rows of f; see [Strategy].
func (s Ordered) Apply(f *tabprep.Frame) (*tabprep.Frame, *Report, error) {
	return apply("split.ordered", s, f, part{partName(s.Partition, tabprep.DefaultPartition), s.Fraction, s.Rows}, s.method(), s.ReportBy)
}

func (s Ordered) method() string {
	if s.Column == "" {
		return "ordered split by row order"
	}
	return "ordered split by " + s.Column
}

func (s Ordered) sized() bool { return s.Fraction != 0 || s.Rows != 0 || s.Partition != "" }

func (s Ordered) describe() (string, string) { return s.method(), s.ReportBy }

// divide gives the last partition the latest rows, the one before it the
// rows just before those, and so on.
func (s Ordered) divide(op string, f *tabprep.Frame, rs rowset, parts []part) (plan, error) {
	want, err := sizes(op, parts, rs.n)
	if err != nil {
		return plan{}, err
	}
	o, err := orderRows(op, f, rs, s.Column)
	if err != nil {
		return plan{}, err
	}
	np := len(parts)
	cuts := make([]int, np+1) // partition p is o.rows[cuts[p]:cuts[p+1]]
	cuts[np] = rs.n
	target := rs.n
	for p := np - 1; p >= 0; p-- {
		target -= want[p]
		lo, hi := o.down(target), o.up(target)
		first, second := hi, lo
		if target-lo < hi-target {
			first, second = lo, hi
		}
		c := -1
		for _, cand := range []int{first, second} {
			if cand > 0 && cand < cuts[p+1] {
				c = cand
				break
			}
		}
		if c < 0 {
			return plan{}, tabprep.Errorf(op, ErrTooFew, s.Column, "equal values around row position %d leave partition %q or train empty; use another size or a finer ordering column", target, parts[p].name)
		}
		cuts[p] = c
	}
	pl := plan{rows: make([][]int, np)}
	for p := range np {
		pl.rows[p] = o.rows[cuts[p]:cuts[p+1]]
		if len(pl.rows[p]) != want[p] {
			pl.notes = append(pl.notes, fmt.Sprintf("partition %q has %d rows, not %d, so that equal values of %s stay on one side", parts[p].name, len(pl.rows[p]), want[p], s.Column))
		}
	}
	return pl, nil
}
