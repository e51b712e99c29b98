package split

import (
	"fmt"
	"io"
	"strings"
	"unicode/utf8"

	"github.com/tabprep/tabprep"
)

// Report describes one split: how many rows each partition got and, for a
// chosen categorical column, how many rows of each class.
type Report struct {
	// Method says which strategy made the split and how, in words.
	Method string
	// Rows is the number of rows the split divided.
	Rows int
	// Kept is the number of rows that were already holdout and were left
	// as they were.
	Kept int
	// Partitions counts the rows of each partition: train first, then the
	// holdout partitions in the order the strategy fills them.
	Partitions []Count
	// Column is the categorical column whose classes are counted, or "".
	Column string
	// Classes counts the rows of each class of Column present among the
	// divided rows, in level order with missing cells last.
	Classes []ClassCount
	// Notes records what the split did that a reader might not expect,
	// such as a one-row class kept in train.
	Notes []string
}

// Count is the number of rows in one partition.
type Count struct {
	Partition string // "train" or the holdout partition name
	Rows      int
}

// ClassCount is the number of rows of one class in each partition.
type ClassCount struct {
	Level   string // the class; "" for missing cells
	Missing bool   // the class of missing cells
	Rows    []int  // rows per partition, in the order of Report.Partitions
}

// Share returns the realised share of the divided rows that went to the
// named partition ("train" or a holdout name), or 0 if there is none.
func (r *Report) Share(partition string) float64 {
	for _, c := range r.Partitions {
		if c.Partition == partition && r.Rows > 0 {
			return float64(c.Rows) / float64(r.Rows)
		}
	}
	return 0
}

// classTable is a class by partition count matrix with its labels.
type classTable struct {
	levels  []string
	missing int // class number of missing cells
	counts  [][]int
}

// newReport counts the partitions of a plan and the classes of reportBy.
func newReport(op string, f *tabprep.Frame, rs rowset, names []string, pl plan, method, reportBy string) (*Report, error) {
	r := &Report{Method: method, Rows: rs.n, Kept: rs.kept, Column: reportBy, Notes: pl.notes}
	held := 0
	r.Partitions = make([]Count, 1, len(names)+1)
	for p, rows := range pl.rows {
		r.Partitions = append(r.Partitions, Count{Partition: names[p], Rows: len(rows)})
		held += len(rows)
	}
	r.Partitions[0] = Count{Partition: "train", Rows: rs.n - held}
	if reportBy == "" {
		return r, nil
	}
	t := pl.classes
	if t == nil {
		var err error
		if t, err = countClasses(op, f, rs, pl, reportBy); err != nil {
			return nil, err
		}
	}
	for c, row := range t.counts {
		total := 0
		for _, k := range row {
			total += k
		}
		if total == 0 {
			continue
		}
		cc := ClassCount{Rows: row, Missing: c == t.missing}
		if !cc.Missing {
			cc.Level = t.levels[c]
		}
		r.Classes = append(r.Classes, cc)
	}
	return r, nil
}

// countClasses counts the rows of each class of column per partition of pl.
func countClasses(op string, f *tabprep.Frame, rs rowset, pl plan, column string) (*classTable, error) {
	c, err := f.Column(column)
	if err != nil {
		return nil, tabprep.Errorf(op, tabprep.ErrNoColumn, column, "report column not in the frame; it has %q", f.Names())
	}
	if c.Kind() != tabprep.Categorical {
		return nil, tabprep.Errorf(op, tabprep.ErrKind, column, "report column is %v; the report counts the classes of a categorical column", c.Kind())
	}
	const notSplit = 0xff
	part := make([]uint8, f.NumRows())
	if !rs.all {
		for i := range part {
			part[i] = notSplit
		}
		for _, i := range rs.rows {
			part[i] = 0
		}
	}
	for p, rows := range pl.rows {
		for _, i := range rows {
			part[i] = uint8(p + 1)
		}
	}
	t := &classTable{levels: c.Levels(), missing: len(c.Levels()), counts: make([][]int, len(c.Levels())+1)}
	for k := range t.counts {
		t.counts[k] = make([]int, len(pl.rows)+1)
	}
	for i, k := range c.Codes() {
		if p := part[i]; p != notSplit {
			t.counts[classOf(k, t.missing)][p]++
		}
	}
	return t, nil
}

// String returns the report as a small aligned text table.
func (r *Report) String() string {
	var b strings.Builder
	r.WriteTo(&b)
	return b.String()
}

// WriteTo writes the report as a small aligned text table: a line naming
// the method, the rows and share of each partition, and, when a column was
// chosen, each class's count and its share of each partition's rows.
func (r *Report) WriteTo(w io.Writer) (int64, error) {
	var b strings.Builder
	fmt.Fprintf(&b, "%s: %d rows", r.Method, r.Rows)
	if r.Kept > 0 {
		fmt.Fprintf(&b, " (%d rows already holdout kept as they were)", r.Kept)
	}
	b.WriteString("\n")
	tab := [][]string{{"partition", "rows", "share"}}
	for _, c := range r.Partitions {
		tab = append(tab, []string{c.Partition, fmt.Sprint(c.Rows), percent(r.Share(c.Partition))})
	}
	writeTable(&b, tab)
	if r.Column != "" {
		b.WriteString("\n")
		head := []string{r.Column}
		for _, c := range r.Partitions {
			head = append(head, c.Partition, "")
		}
		tab = [][]string{head}
		for _, cc := range r.Classes {
			name := cc.Level
			if cc.Missing {
				name = "(missing)"
			}
			row := []string{name}
			for p, k := range cc.Rows {
				share := 0.0
				if n := r.Partitions[p].Rows; n > 0 {
					share = float64(k) / float64(n)
				}
				row = append(row, fmt.Sprint(k), percent(share))
			}
			tab = append(tab, row)
		}
		writeTable(&b, tab)
	}
	for _, n := range r.Notes {
		fmt.Fprintf(&b, "note: %s\n", n)
	}
	k, err := io.WriteString(w, b.String())
	return int64(k), err
}

// writeTable writes rows of cells with the first column left-aligned and
// the others right-aligned, two spaces apart. An empty header cell lets the
// header before it span two columns.
func writeTable(b *strings.Builder, rows [][]string) {
	width := make([]int, len(rows[0]))
	for _, row := range rows[1:] {
		for j, cell := range row {
			width[j] = max(width[j], utf8.RuneCountInString(cell))
		}
	}
	head := rows[0]
	for j := 0; j < len(head); j++ {
		w := utf8.RuneCountInString(head[j])
		if j+1 < len(head) && head[j+1] == "" && j > 0 {
			// A spanning header: widen the pair if it does not fit.
			if span := width[j] + 2 + width[j+1]; w > span {
				width[j] += w - span
			}
			j++
			continue
		}
		width[j] = max(width[j], w)
	}
	for i, row := range rows {
		var line strings.Builder
		for j := 0; j < len(row); j++ {
			cell := row[j]
			w := width[j]
			if i == 0 && j > 0 && j+1 < len(row) && row[j+1] == "" {
				w += 2 + width[j+1]
				j++
			}
			pad := strings.Repeat(" ", max(w-utf8.RuneCountInString(cell), 0))
			if j > 0 {
				line.WriteString("  ")
			}
			if j == 0 {
				line.WriteString(cell + pad)
			} else {
				line.WriteString(pad + cell)
			}
		}
		b.WriteString(strings.TrimRight(line.String(), " "))
		b.WriteString("\n")
	}
}

var _ io.WriterTo = (*Report)(nil)
