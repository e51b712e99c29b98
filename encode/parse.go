package encode

import (
	"math"

	"github.com/tabprep/tabprep"
)

// OnBad is the policy for a cell that does not parse.
type OnBad string

// The policies for a cell that does not parse.
const (
	// BadMissing makes the cell missing (NaN) and counts it in the fitted
	// report. The default.
	BadMissing OnBad = "missing"
	// BadError makes the fit or transform fail, naming the column, row and
	// cell.
	BadError OnBad = "error"
)

// MaxBadSamples is how many bad cells a [ParseReport] lists.
const MaxBadSamples = 5

// ParseReport is what a parsing step found in one train column: how many
// cells did not parse, and the first few of them.
type ParseReport struct {
	// Name is the column.
	Name string `json:"name"`
	// BadCells counts the train cells that did not parse.
	BadCells int `json:"bad_cells"`
	// Samples are the first MaxBadSamples of them, in row order.
	Samples []BadCell `json:"samples,omitempty"`
}

// BadCell is one cell that did not parse.
type BadCell struct {
	Row   int    `json:"row"`
	Value string `json:"value"`
}

// parseColumn parses each distinct level of c once with parse, which writes
// w values into dst and reports whether the level parsed. It returns one run
// of n values per output, NaN for missing and bad cells, and the report of
// the bad cells. Under BadError the first bad cell is an error.
func parseColumn(op string, c *tabprep.Column, w int, bad OnBad, what string, parse func(level string, dst []float64) bool) ([]float64, ParseReport, error) {
	rep := ParseReport{Name: c.Name()}
	levels := c.Levels()
	vals := make([]float64, len(levels)*w)
	ok := make([]bool, len(levels))
	for k, l := range levels {
		ok[k] = parse(l, vals[k*w:(k+1)*w])
	}
	n := c.Len()
	block := make([]float64, n*w)
	for row, k := range c.Codes() {
		if k != tabprep.MissingCode && ok[k] {
			for j := 0; j < w; j++ {
				block[j*n+row] = vals[int(k)*w+j]
			}
			continue
		}
		for j := 0; j < w; j++ {
			block[j*n+row] = math.NaN()
		}
		if k == tabprep.MissingCode {
			continue
		}
		if bad == BadError {
			return nil, rep, tabprep.Errorf(op, ErrBadCell, c.Name(), "%q is not %s; fix the cell, adjust the format options, or set Bad to %q", levels[k], what, BadMissing).AtRow(row)
		}
		rep.BadCells++
		if len(rep.Samples) < MaxBadSamples {
			rep.Samples = append(rep.Samples, BadCell{Row: row, Value: levels[k]})
		}
	}
	return block, rep, nil
}

// parseEach is the transform of a parsing step: run makes the output
// columns of each reported column of data, and the outputs are assembled.
func parseEach(op string, data *tabprep.Frame, reports []ParseReport, run func(c *tabprep.Column) ([]*tabprep.Column, error)) (*tabprep.Frame, error) {
	outs := make([]encoded, len(reports))
	for i, rc := range reports {
		c, err := columnOf(op, data, rc.Name, tabprep.Categorical)
		if err != nil {
			return nil, err
		}
		cols, err := run(c)
		if err != nil {
			return nil, err
		}
		outs[i] = encoded{source: rc.Name, cols: cols}
	}
	return assemble(op, data, outs)
}

// parseTable is the table of a parsing step's column for the levels of a
// layout: each level parsed once, as [parseColumn] does per level, and a
// level the layout does not list parsed in the row by unseen.
func parseTable(levels []string, width int, parse func(level string, dst []float64) bool, unseen func(level string, out []tabprep.Cell) bool) tableColumn {
	t := tableColumn{values: make([]float64, len(levels)*width), ok: make([]bool, len(levels)), missing: make([]float64, width), unseen: unseen}
	for k, lv := range levels {
		t.ok[k] = parse(lv, t.values[k*width:(k+1)*width])
	}
	for j := range t.missing {
		t.missing[j] = math.NaN()
	}
	return t
}
