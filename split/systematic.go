package split

import (
	"fmt"

	"github.com/tabprep/tabprep"
)

// Systematic holds out every Every-th row, starting at row Offset: the rows
// at positions Offset, Offset+Every, Offset+2*Every, ... among the rows to
// split. It is not random: it spreads the holdout evenly over the rows, so
// each stretch of the file is represented. Its holdout share is about
// 1/Every.
type Systematic struct {
	// Every is the step between held-out rows, at least 2 and at most the
	// number of rows to split.
	Every int
	// Offset is the position of the first held-out row, in [0, Every).
	Offset int
	// Partition names the holdout partition; "" means
	// [tabprep.DefaultPartition].
	Partition string
	// ReportBy names a categorical column whose classes the report counts
	// per partition; "" for none.
	ReportBy string
}

// Apply splits the train rows of f; see [Strategy].
func (s Systematic) Apply(f *tabprep.Frame) (*tabprep.Frame, *Report, error) {
	return apply("split.systematic", s, f, part{name: partName(s.Partition, tabprep.DefaultPartition)},
		fmt.Sprintf("systematic split, every %d from %d", s.Every, s.Offset), s.ReportBy)
}

func (s Systematic) divide(op string, _ *tabprep.Frame, rs rowset, _ []part) (plan, error) {
	switch {
	case s.Every < 2:
		return plan{}, tabprep.Errorf(op, tabprep.ErrOption, "", "Every %d is below 2; hold out every k-th row with k of at least 2", s.Every)
	case s.Every > rs.n:
		return plan{}, tabprep.Errorf(op, ErrTooFew, "", "Every %d is more than the %d rows to split; use at most %d", s.Every, rs.n, rs.n)
	case s.Offset < 0 || s.Offset >= s.Every:
		return plan{}, tabprep.Errorf(op, tabprep.ErrOption, "", "Offset %d is outside [0, %d); start within the first Every rows", s.Offset, s.Every)
	}
	rows := make([]int, 0, rs.n/s.Every+1)
	for j := s.Offset; j < rs.n; j += s.Every {
		rows = append(rows, rs.row(j))
	}
	return plan{rows: [][]int{rows}}, nil
}
