package split

import (
	"cmp"
	"math"
	"slices"

	"github.com/tabprep/tabprep"
)

// ordering is the rows to split sorted by an ordering column.
type ordering struct {
	rows []int     // the rows to split, earliest first
	keys []float64 // keys[j] orders rows[j]; nil when ordered by row position
}

// orderRows sorts the rows to split by column, stably so equal keys keep
// row order; "" means row order. A numeric column orders by value; a
// categorical column by its level strings, so ISO 8601 dates such as
// "2024-03-01" order by time. A missing cell is an error naming its row.
func orderRows(op string, f *tabprep.Frame, rs rowset, column string) (ordering, error) {
	rows := rs.rows
	if rs.all {
		rows = make([]int, rs.n)
		for i := range rows {
			rows[i] = i
		}
	} else {
		rows = slices.Clone(rows)
	}
	if column == "" {
		return ordering{rows: rows}, nil
	}
	c, err := f.Column(column)
	if err != nil {
		return ordering{}, tabprep.Errorf(op, tabprep.ErrNoColumn, column, "ordering column not in the frame; it has %q", f.Names())
	}
	key := make([]float64, f.NumRows())
	if c.Kind() == tabprep.Numeric {
		copy(key, c.Float64s())
	} else {
		levels := c.Levels()
		byName := make([]int, len(levels))
		for i := range byName {
			byName[i] = i
		}
		slices.SortFunc(byName, func(a, b int) int { return cmp.Compare(levels[a], levels[b]) })
		rank := make([]float64, len(levels))
		for r, code := range byName {
			rank[code] = float64(r)
		}
		for i, k := range c.Codes() {
			key[i] = math.NaN()
			if k != tabprep.MissingCode {
				key[i] = rank[k]
			}
		}
	}
	for _, i := range rows {
		if math.IsNaN(key[i]) {
			return ordering{}, tabprep.Errorf(op, tabprep.ErrValue, column, "missing value in the ordering column; fill it or drop the row before splitting").AtRow(i)
		}
	}
	slices.SortStableFunc(rows, func(a, b int) int { return cmp.Compare(key[a], key[b]) })
	o := ordering{rows: rows, keys: make([]float64, len(rows))}
	for j, i := range rows {
		o.keys[j] = key[i]
	}
	return o, nil
}

// cut reports whether a cut before position j separates unequal keys.
func (o ordering) cut(j int) bool {
	return o.keys == nil || j <= 0 || j >= len(o.rows) || o.keys[j-1] != o.keys[j]
}

// down returns the nearest valid cut at or before j.
func (o ordering) down(j int) int {
	for !o.cut(j) {
		j--
	}
	return j
}

// up returns the nearest valid cut at or after j.
func (o ordering) up(j int) int {
	for !o.cut(j) {
		j++
	}
	return j
}
