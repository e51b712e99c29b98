package impute

import (
	"path"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// Fill carries a whole rule set: for each column of the train frame, a rule
// by its name overrides the first rule whose pattern matches its name, which
// overrides the rule for its kind. A column that no rule reaches is left as
// it is and not listed in the params; [StatKeep] lists it and leaves it.
type Fill struct {
	// Numeric is the rule for numeric columns; the zero Rule is none.
	Numeric Rule `json:"numeric,omitzero"`
	// Categorical is the rule for categorical columns; the zero Rule is none.
	Categorical Rule `json:"categorical,omitzero"`
	// Patterns are tried in order; the first whose glob (see [path.Match])
	// matches the name decides.
	Patterns []PatternRule `json:"patterns,omitempty"`
	// Columns are rules by exact column name; each name must exist in train.
	Columns []ColumnRule `json:"columns,omitempty"`
}

// PatternRule is a rule for the columns whose names match a glob.
type PatternRule struct {
	Pattern string `json:"pattern"`
	Rule    Rule   `json:"rule"`
}

// ColumnRule is a rule for one column by name.
type ColumnRule struct {
	Name string `json:"name"`
	Rule Rule   `json:"rule"`
}

func init() { state.Register(Fill{}) }

// Kind returns "impute.fill".
func (Fill) Kind() string { return "impute.fill" }

// Fit decides the rule of every column and learns its fill value. A rule
// naming a column train lacks, a malformed pattern, a name given twice, a
// statistic of the wrong kind for its column and a statistic of a column
// with no train value are errors that name the column.
func (s Fill) Fit(train *tabprep.Frame) (FillParams, error) {
	const op = "impute.fill fit"
	if err := tabprep.RequireTrain(op, train); err != nil {
		return FillParams{}, err
	}
	byName := make(map[string]Rule, len(s.Columns))
	for _, r := range s.Columns {
		if !train.Has(r.Name) {
			return FillParams{}, tabprep.Errorf(op, tabprep.ErrNoColumn, r.Name, "has a rule but is not in the train frame; remove the rule or fix the name")
		}
		if _, dup := byName[r.Name]; dup {
			return FillParams{}, tabprep.Errorf(op, tabprep.ErrOption, r.Name, "has two rules by name; keep one")
		}
		byName[r.Name] = r.Rule
	}
	for _, pr := range s.Patterns {
		if _, err := path.Match(pr.Pattern, ""); err != nil {
			return FillParams{}, tabprep.Errorf(op, tabprep.ErrOption, "", "bad column pattern %q: %v", pr.Pattern, err)
		}
	}
	var p FillParams
	for i := range train.NumCols() {
		c := train.Col(i)
		r, from := s.ruleFor(c, byName)
		if r.Stat == "" {
			continue
		}
		f, err := fitRule(op, c, r, from)
		if err != nil {
			return FillParams{}, err
		}
		p.Columns = append(p.Columns, f)
	}
	return p, nil
}

// ruleFor returns the rule that decides for c and where it came from.
func (s Fill) ruleFor(c *tabprep.Column, byName map[string]Rule) (Rule, string) {
	if r, ok := byName[c.Name()]; ok && r.Stat != "" {
		return r, "name"
	}
	for _, pr := range s.Patterns {
		if ok, _ := path.Match(pr.Pattern, c.Name()); ok && pr.Rule.Stat != "" {
			return pr.Rule, "pattern " + pr.Pattern
		}
	}
	if c.Kind() == tabprep.Numeric {
		return s.Numeric, "kind"
	}
	return s.Categorical, "kind"
}

// Transform fills the gaps of the fitted columns of data with p.
func (s Fill) Transform(p FillParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return applyFill("impute.fill transform", p, data)
}

// RowKernel returns the fill of p for single rows laid out by l.
func (s Fill) RowKernel(p FillParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return fillKernel("impute.fill row", p, l)
}

// RowSource writes the fill of p as Go source, for generated plans.
func (s Fill) RowSource(p FillParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return fillSource("impute.fill row", p, l, w)
}
