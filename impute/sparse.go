package impute

import (
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// DropSparse drops every chosen column whose missing share in the train
// rows exceeds MaxShare. The list of dropped columns is frozen at fit time
// and applied to new data as it is, whatever their gaps.
type DropSparse struct {
	// Columns chooses the columns of either kind; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// MaxShare in [0, 1] is the largest missing share a column may have and
	// stay; 0 drops every column with a gap, 1 drops none.
	MaxShare float64 `json:"max_share"`
}

// SparseParams lists the missing share of every checked column and which
// ones go.
type SparseParams struct {
	Checked []ColumnShare `json:"checked"`
	Dropped []string      `json:"dropped"`
}

// ColumnShare is the missing share of a column in the train rows.
type ColumnShare struct {
	Name  string      `json:"name"`
	Share state.Float `json:"share"`
}

func init() { state.Register(DropSparse{}) }

// Kind returns "impute.dropsparse".
func (DropSparse) Kind() string { return "impute.dropsparse" }

// Fit measures the missing share of each chosen column and decides which go.
func (s DropSparse) Fit(train *tabprep.Frame) (SparseParams, error) {
	const op = "impute.dropsparse fit"
	if err := tabprep.RequireTrain(op, train); err != nil {
		return SparseParams{}, err
	}
	if !(s.MaxShare >= 0 && s.MaxShare <= 1) {
		return SparseParams{}, tabprep.Errorf(op, tabprep.ErrOption, "", "MaxShare %v outside [0, 1]", s.MaxShare)
	}
	if train.NumRows() == 0 {
		return SparseParams{}, tabprep.Errorf(op, tabprep.ErrAllMissing, "", "no train rows to measure missing shares on")
	}
	names, err := s.Columns.ResolveAny(op, train)
	if err != nil {
		return SparseParams{}, err
	}
	p := SparseParams{Checked: make([]ColumnShare, 0, len(names)), Dropped: []string{}}
	for _, c := range columnsOf(train, names) {
		share := float64(c.MissingCount()) / float64(train.NumRows())
		p.Checked = append(p.Checked, ColumnShare{Name: c.Name(), Share: state.Float(share)})
		if share > s.MaxShare {
			p.Dropped = append(p.Dropped, c.Name())
		}
	}
	return p, nil
}

// Transform drops the columns fitted to go.
func (s DropSparse) Transform(p SparseParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	for _, name := range p.Dropped {
		if !data.Has(name) {
			return nil, lacksColumn("impute.dropsparse transform", name)
		}
	}
	return data.Without(p.Dropped...)
}

// RowKernel returns the column filter of p for single rows laid out by l:
// the dropped columns leave the layout, and no cell moves.
func (s DropSparse) RowKernel(p SparseParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	if err := dropSparse(p, l); err != nil {
		return nil, err
	}
	return func([]tabprep.Cell) error { return nil }, nil
}

// RowSource records the column filter in l; it takes no code.
func (s DropSparse) RowSource(p SparseParams, l *tabprep.RowLayout, _ *tabprep.SourceWriter) error {
	return dropSparse(p, l)
}

func dropSparse(p SparseParams, l *tabprep.RowLayout) error {
	const op = "impute.dropsparse row"
	for _, name := range p.Dropped {
		if _, _, ok := l.Slot(name); !ok {
			return tabprep.Errorf(op, tabprep.ErrSchema, name, "fitted to drop this column but the row layout lacks it")
		}
		l.Remove(name)
	}
	return nil
}
