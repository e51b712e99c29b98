package split

import (
	"fmt"

	"github.com/tabprep/tabprep"
)

// Random holds out a uniformly random set of rows of a given size.
//
// Every set of that size is equally likely. The rows are chosen by Floyd's
// sampling algorithm driven by the package's PCG stream, so the same Seed
// on the same rows gives the same split on every platform and Go version.
type Random struct {
	// Fraction is the share of rows to hold out, in (0, 1); the count is
	// Fraction times the rows to split, rounded half away from zero.
	Fraction float64
	// Rows is an exact number of rows to hold out, used instead of Fraction.
	Rows int
	// Partition names the holdout partition; "" means
	// [tabprep.DefaultPartition].
	Partition string
	// Seed picks the pseudo-random sequence; any value is fine.
	Seed uint64
	// ReportBy names a categorical column whose classes the report counts
	// per partition; "" for none.
	ReportBy string
}

// Apply splits the train rows of f; see [Strategy].
func (s Random) Apply(f *tabprep.Frame) (*tabprep.Frame, *Report, error) {
	return apply("split.random", s, f, part{partName(s.Partition, tabprep.DefaultPartition), s.Fraction, s.Rows}, s.method(), s.ReportBy)
}

func (s Random) method() string { return fmt.Sprintf("random split, seed %d", s.Seed) }

func (s Random) sized() bool { return s.Fraction != 0 || s.Rows != 0 || s.Partition != "" }

func (s Random) describe() (string, string) { return s.method(), s.ReportBy }

func (s Random) divide(op string, _ *tabprep.Frame, rs rowset, parts []part) (plan, error) {
	want, err := sizes(op, parts, rs.n)
	if err != nil {
		return plan{}, err
	}
	st := countStrata(rs, nil, 1)
	return plan{rows: sample(newDraw(s.Seed), rs, st, [][]int{want})}, nil
}
