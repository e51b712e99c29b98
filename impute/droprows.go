package impute

import (
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// DropRows removes every row that misses a value in any of the chosen
// columns. It is the one step of this package that changes the row count;
// the rows it keeps stay in order with their roles. [DropRows.Drop] also
// reports how many rows went.
//
// Dropping rows of a holdout or serving batch changes what a caller gets
// back, so prefer a fill where rows must not vanish.
type DropRows struct {
	// Columns chooses the columns of either kind; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
}

// DropParams is what DropRows learns: the columns it checks, frozen at fit
// time, and the report of the train rows.
type DropParams struct {
	Columns []string   `json:"columns"`
	Train   DropReport `json:"train"`
}

// DropReport counts the rows of one transform.
type DropReport struct {
	Rows    int `json:"rows"`
	Dropped int `json:"dropped"`
	// Gaps is the number of missing cells per checked column, in the order
	// of DropParams.Columns.
	Gaps []int `json:"gaps"`
}

func init() { state.Register(DropRows{}) }

// Kind returns "impute.droprows".
func (DropRows) Kind() string { return "impute.droprows" }

// Fit freezes the chosen columns and records how many train rows the step
// drops.
func (s DropRows) Fit(train *tabprep.Frame) (DropParams, error) {
	const op = "impute.droprows fit"
	if err := tabprep.RequireTrain(op, train); err != nil {
		return DropParams{}, err
	}
	names, err := s.Columns.ResolveAny(op, train)
	if err != nil {
		return DropParams{}, err
	}
	p := DropParams{Columns: names}
	if _, p.Train, err = s.Drop(p, train); err != nil {
		return DropParams{}, err
	}
	return p, nil
}

// Transform is [DropRows.Drop] without the report.
func (s DropRows) Transform(p DropParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	out, _, err := s.Drop(p, data)
	return out, err
}

// Drop returns the rows of data with a value in every checked column, in
// order, with their roles, and a report of what went.
func (DropRows) Drop(p DropParams, data *tabprep.Frame) (*tabprep.Frame, DropReport, error) {
	const op = "impute.droprows transform"
	rep := DropReport{Rows: data.NumRows(), Gaps: make([]int, len(p.Columns))}
	gap := make([]bool, data.NumRows())
	for j, name := range p.Columns {
		c, err := data.Column(name)
		if err != nil {
			return nil, DropReport{}, lacksColumn(op, name)
		}
		for i := range gap {
			if c.IsMissing(i) {
				gap[i] = true
				rep.Gaps[j]++
			}
		}
	}
	keep := make([]int, 0, len(gap))
	for i, g := range gap {
		if !g {
			keep = append(keep, i)
		}
	}
	rep.Dropped = len(gap) - len(keep)
	if rep.Dropped == 0 {
		out, err := data.With()
		return out, rep, err
	}
	out, err := data.Take(keep)
	return out, rep, err
}
