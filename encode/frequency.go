package encode

import (
	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// Frequency replaces each selected categorical column by a numeric column of
// the same name holding each level's count in train or, with Share, its
// count divided by the number of train rows. A missing cell counts as a
// level of its own and gets the train count of missing cells; a level
// training never saw gets 0, the number of times train saw it.
type Frequency struct {
	// Columns selects categorical columns; the zero value selects all.
	Columns tabprep.Selection `json:"columns"`
	// Share writes shares of the train rows instead of counts.
	Share bool `json:"share,omitempty"`
}

// FrequencyParams are the train counts of each column of a [Frequency]
// step.
type FrequencyParams struct {
	Columns []FrequencyColumn `json:"columns"`
}

// FrequencyColumn holds the train counts of one column.
type FrequencyColumn struct {
	Name    string   `json:"name"`
	Levels  []string `json:"levels"`
	Counts  []int    `json:"counts"`
	Missing int      `json:"missing"`
	Rows    int      `json:"rows"`
}

func init() { state.Register(Frequency{}) }

// Kind returns "encode.frequency".
func (Frequency) Kind() string { return "encode.frequency" }

// Outputs returns the names of the columns the step writes: the source
// names, replaced in place.
func (p FrequencyParams) Outputs() []string {
	return sourceNames(p.Columns, func(c FrequencyColumn) string { return c.Name })
}

// Fit counts the levels of each selected column.
func (s Frequency) Fit(train *tabprep.Frame) (FrequencyParams, error) {
	const op = "encode.frequency fit"
	names, err := resolve[struct{}](op, train, s.Columns, tabprep.Categorical, "", nil)
	if err != nil {
		return FrequencyParams{}, err
	}
	var p FrequencyParams
	for _, name := range names {
		c, _ := train.Column(name)
		st := countLevels(c)
		p.Columns = append(p.Columns, FrequencyColumn{Name: name, Levels: st.levels, Counts: st.counts, Missing: st.missing, Rows: st.rows})
	}
	return p, nil
}

// Transform replaces each fitted column by its train counts or shares. It
// does not modify data.
func (s Frequency) Transform(p FrequencyParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	const op = "encode.frequency transform"
	outs := make([]encoded, len(p.Columns))
	for ci, fc := range p.Columns {
		c, err := columnOf(op, data, fc.Name, tabprep.Categorical)
		if err != nil {
			return nil, err
		}
		scale := 1.0
		if s.Share && fc.Rows > 0 {
			scale = 1 / float64(fc.Rows)
		}
		lv := remap(c, indexOf(fc.Levels))
		vals := make([]float64, c.Len())
		for row, k := range c.Codes() {
			n := 0
			switch {
			case k == tabprep.MissingCode:
				n = fc.Missing
			case lv[k] >= 0:
				n = fc.Counts[lv[k]]
			}
			vals[row] = float64(n) * scale
		}
		outs[ci] = encoded{source: fc.Name, cols: []*tabprep.Column{tabprep.AdoptNumeric(fc.Name, vals)}}
	}
	return assemble(op, data, outs)
}

// RowKernel returns a row function that writes the same cells as
// [Frequency.Transform], without allocating: the count or share of each
// level of the layout is looked up by its code in a table made here.
func (s Frequency) RowKernel(p FrequencyParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return s.table(p).kernel(l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s Frequency) RowSource(p FrequencyParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return s.table(p).source(l, w)
}

func (s Frequency) table(p FrequencyParams) tableStep {
	sources := sourceNames(p.Columns, func(c FrequencyColumn) string { return c.Name })
	fields := numericFields(sources, func(s string) []string { return []string{s} })
	return tableStep{op: "encode.frequency row", sources: sources, fields: fields, bad: BadMissing, build: func(i int, levels []string) tableColumn {
		fc := p.Columns[i]
		scale := 1.0
		if s.Share && fc.Rows > 0 {
			scale = 1 / float64(fc.Rows)
		}
		index := indexOf(fc.Levels)
		// The products are the ones Transform forms, so the values agree
		// bit for bit.
		value := func(level string) []float64 {
			n := 0
			if k, ok := index[level]; ok {
				n = fc.Counts[k]
			}
			return []float64{float64(n) * scale}
		}
		return constTable(levels, 1, value, []float64{float64(fc.Missing) * scale}, []float64{float64(0) * scale})
	}}
}

var (
	_ tabprep.RowKernel[FrequencyParams] = Frequency{}
	_ tabprep.RowSource[FrequencyParams] = Frequency{}
)
