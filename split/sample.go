package split

import (
	"cmp"
	"slices"
)

// apportion returns, for each class with count[c] rows out of n, how many
// of its rows go to each holdout partition of total size want[p].
//
// Each class's quota in partition p is want[p]*count[c]/n. Partitions are
// filled one after another by largest-remainder rounding (Hamilton's method
// of apportionment), in integer arithmetic so the result is the same on
// every platform: every class first gets the floor of its quota, and the
// rows still owed go one each to the classes with the largest remainders,
// ties to the lower class number. A class may get a row only if what is left
// of it can still give each later partition, train included, its quota
// rounded down or up; so every class is within one row of its quota in every
// partition, train included. A class with one row is kept whole in train.
// The totals equal want in a two-way split; with more partitions a total can
// miss by a row when these limits bind.
func apportion(count []int, n int, want []int) [][]int {
	nc := len(count)
	got := make([][]int, nc)
	left := slices.Clone(count) // rows of each class not yet given out
	for c := range got {
		got[c] = make([]int, len(want))
	}
	type cand struct{ class, rem int }
	cands := make([]cand, 0, nc)
	restAfter := n // rows of all classes the partitions after p share
	for p, h := range want {
		restAfter -= h
		owed := h
		cands = cands[:0]
		for c, m := range count {
			if m <= 1 {
				continue
			}
			q, rem := h*m/n, h*m%n
			lo, hi := q, q
			if rem > 0 {
				hi++
			}
			// What stays must be within one row of the later quotas.
			rq, rrem := restAfter*m/n, restAfter*m%n
			rhi := rq
			if rrem > 0 {
				rhi++
			}
			lo = max(lo, left[c]-rhi)
			hi = min(hi, left[c]-rq)
			lo = max(lo, 0)
			hi = min(hi, left[c])
			if hi < lo {
				hi = lo
			}
			got[c][p] = lo
			owed -= lo
			if hi > lo {
				cands = append(cands, cand{c, rem})
			}
		}
		slices.SortStableFunc(cands, func(a, b cand) int { return cmp.Compare(b.rem, a.rem) })
		for _, k := range cands {
			if owed <= 0 {
				break
			}
			got[k.class][p]++
			owed--
		}
		for c := range got {
			left[c] -= got[c][p]
		}
	}
	return got
}

// strata is the rows to split grouped into classes.
type strata struct {
	codes   []int32 // class code per frame row; nil for a single class
	missing int     // class number of a missing code
	count   []int   // rows per class among the rows to split
}

func (s strata) class(i int) int {
	if s.codes == nil {
		return 0
	}
	return classOf(s.codes[i], s.missing)
}

// countStrata counts the rows to split per class of codes (nil: one class).
func countStrata(rs rowset, codes []int32, classes int) strata {
	s := strata{codes: codes, missing: classes - 1, count: make([]int, max(classes, 1))}
	if codes == nil {
		s.count[0] = rs.n
		return s
	}
	if rs.all {
		for _, k := range codes {
			s.count[classOf(k, s.missing)]++
		}
		return s
	}
	for _, i := range rs.rows {
		s.count[classOf(codes[i], s.missing)]++
	}
	return s
}

// sample picks got[c][p] rows of each class c for each holdout partition
// p, uniformly at random, and returns the rows of each partition in row
// order.
//
// It does not shuffle the rows. For each class it marks, by Floyd's
// algorithm, which ranks (positions among the class's rows in row order)
// are held out; then, for more than one partition, which of those held-out
// ranks go on to the second partition, and so on. One pass over the rows
// then reads the marks. The cost is one draw per held-out row, a bit per
// row of scratch and one sequential pass, against one draw and a random
// memory access per row for a full shuffle.
func sample(d draw, rs rowset, s strata, got [][]int) [][]int {
	np := len(got[0])
	nc := len(s.count)
	// need[c][l] is the number of ranks level l picks for class c: the rows
	// going to partition l or a later one. Level l picks among the ranks
	// level l-1 picked (level 0 among all the class's rows).
	need := make([][]int, nc)
	off := make([][]int, nc) // word offset of each (class, level) bitset
	words := 0
	for c := range nc {
		need[c] = make([]int, np)
		off[c] = make([]int, np)
		acc := 0
		for p := np - 1; p >= 0; p-- {
			acc += got[c][p]
			need[c][p] = acc
		}
		pool := s.count[c]
		for l := range np {
			off[c][l] = words
			words += (pool + 63) / 64
			pool = need[c][l]
		}
	}
	marks := newBitset(words * 64)
	for c := range nc {
		pool := s.count[c]
		for l := range np {
			choose(d, marks[off[c][l]:], pool, need[c][l])
			pool = need[c][l]
		}
	}
	out := make([][]int, np)
	for p := range out {
		total := 0
		for c := range nc {
			total += got[c][p]
		}
		out[p] = make([]int, 0, total)
	}
	rank := make([]int, nc*np) // rank[c*np+l]: ranks level l of class c has seen
	if np == 1 && s.codes == nil && rs.all {
		// The common shape, a random two-way split, without the lookups.
		m := marks
		for i := range rs.n {
			if m.has(i) {
				out[0] = append(out[0], i)
			}
		}
		return out
	}
	for j := range rs.n {
		i := rs.row(j)
		c := s.class(i)
		base := c * np
		r := rank[base]
		rank[base]++
		if !marks.has(off[c][0]*64 + r) {
			continue
		}
		p := 0
		for l := 1; l < np; l++ {
			r = rank[base+l]
			rank[base+l]++
			if !marks.has(off[c][l]*64 + r) {
				break
			}
			p = l
		}
		out[p] = append(out[p], i)
	}
	return out
}
