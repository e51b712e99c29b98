package split

import (
	"fmt"

	"github.com/tabprep/tabprep"
)

// Stratified holds out a random set of rows in which every class of a
// categorical column keeps its share of the rows, to the row.
//
// Each class's quota of holdout rows is its share of the total, rounded by
// the largest-remainder method, so every class is within one row of its
// exact share in every partition and the holdout has exactly the size asked
// for. A class with a single row is kept in train and named in the report's
// notes. Within each class the rows are chosen uniformly at random by
// Floyd's algorithm from the package's PCG stream, one draw per held-out row.
type Stratified struct {
	// Column is the categorical column whose classes are kept in
	// proportion.
	Column string
	// Fraction is the share of rows to hold out, in (0, 1).
	Fraction float64
	// Rows is an exact number of rows to hold out, used instead of Fraction.
	Rows int
	// Partition names the holdout partition; "" means
	// [tabprep.DefaultPartition].
	Partition string
	// Seed picks the pseudo-random sequence; any value is fine.
	Seed uint64
	// MissingAsClass makes missing cells of Column one more class; without
	// it a missing cell is an error.
	MissingAsClass bool
	// ReportBy names the categorical column the report counts; "" means
	// Column.
	ReportBy string
}

// Apply splits the train rows of f; see [Strategy].
func (s Stratified) Apply(f *tabprep.Frame) (*tabprep.Frame, *Report, error) {
	m, by := s.describe()
	return apply("split.stratified", s, f, part{partName(s.Partition, tabprep.DefaultPartition), s.Fraction, s.Rows}, m, by)
}

func (s Stratified) sized() bool { return s.Fraction != 0 || s.Rows != 0 || s.Partition != "" }

func (s Stratified) describe() (string, string) {
	return fmt.Sprintf("stratified split on %s, seed %d", s.Column, s.Seed), partName(s.ReportBy, s.Column)
}

func (s Stratified) divide(op string, f *tabprep.Frame, rs rowset, parts []part) (plan, error) {
	col, err := classColumn(op, f, rs, s.Column, s.MissingAsClass)
	if err != nil {
		return plan{}, err
	}
	want, err := sizes(op, parts, rs.n)
	if err != nil {
		return plan{}, err
	}
	levels := col.Levels()
	st := countStrata(rs, col.Codes(), len(levels)+1)
	got := apportion(st.count, rs.n, want)
	pl := plan{rows: sample(newDraw(s.Seed), rs, st, got)}
	for c, m := range st.count {
		if m == 1 {
			name := "(missing)"
			if c < len(levels) {
				name = fmt.Sprintf("%q", levels[c])
			}
			pl.notes = append(pl.notes, fmt.Sprintf("class %s has 1 row; kept in train", name))
		}
	}
	if s.ReportBy == "" || s.ReportBy == s.Column {
		t := &classTable{levels: levels, missing: len(levels), counts: make([][]int, len(st.count))}
		for c, m := range st.count {
			row := make([]int, len(want)+1)
			row[0] = m
			for p, k := range got[c] {
				row[p+1] = k
				row[0] -= k
			}
			t.counts[c] = row
		}
		pl.classes = t
	}
	return pl, nil
}
