package split

import (
	"fmt"

	"github.com/tabprep/tabprep"
)

// Names of the partitions [ThreeWay] fills.
const (
	// Validation is the partition of rows for choosing among models.
	Validation = "validation"
	// Test is the partition of rows kept for the final check.
	Test = "test"
)

// ThreeWay divides rows into train, validation and test in one pass of one
// method, so a stratified three-way split keeps every class within one row
// of its share in all three partitions (two successive splits would round
// twice).
//
// By is a [Random], [Stratified], [Ordered] or [KeyHash] value with its
// options (Column, Seed, Salt, ReportBy) set and its size and partition
// fields left zero: ThreeWay supplies them. Fractions are shares of all
// the rows split. An [Ordered] method puts the test rows last and the
// validation rows just before them.
type ThreeWay struct {
	// By is the method and its options.
	By Strategy
	// Validation is the share of rows for the "validation" partition, in
	// (0, 1).
	Validation float64
	// Test is the share of rows for the "test" partition, in (0, 1).
	Test float64
}

// Apply splits the train rows of f; see [Strategy].
func (s ThreeWay) Apply(f *tabprep.Frame) (*tabprep.Frame, *Report, error) {
	const op = "split.threeway"
	m, ok := s.By.(multiway)
	if !ok {
		return nil, nil, tabprep.Errorf(op, tabprep.ErrOption, "", "By is %T; use split.Random, split.Stratified, split.Ordered or split.KeyHash", s.By)
	}
	if m.sized() {
		return nil, nil, tabprep.Errorf(op, tabprep.ErrOption, "", "By (%T) sets its own size or partition; leave them zero, ThreeWay sets them from Validation and Test", s.By)
	}
	for _, p := range []struct {
		name string
		x    float64
	}{{Validation, s.Validation}, {Test, s.Test}} {
		if err := checkFraction(op, p.name, p.x); err != nil {
			return nil, nil, err
		}
	}
	if sum := s.Validation + s.Test; sum >= 1 {
		return nil, nil, tabprep.Errorf(op, tabprep.ErrOption, "", "Validation %v and Test %v add up to %v; they must add up to less than 1 to leave train rows", s.Validation, s.Test, sum)
	}
	method, by := m.describe()
	parts := []part{{name: Validation, fraction: s.Validation}, {name: Test, fraction: s.Test}}
	return run(op, m, f, parts, fmt.Sprintf("three-way %s", method), by)
}
