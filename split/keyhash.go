package split

import (
	"fmt"
	"math"
	"strconv"

	"github.com/tabprep/tabprep"
)

// KeyHash decides each row's side from a hash of its key and a salt, so a
// key lands on the same side however the data grows, shrinks or is
// reordered, and every row of one key (a pet, an owner) is on one side.
//
// The hash is 64-bit FNV-1a (Fowler, Noll and Vo; IETF draft
// draft-eastlake-fnv) over the bytes of Salt, one zero byte, and the key's
// text, followed by the SplitMix64 finaliser (Steele, Lea and Flood, "Fast
// splittable pseudorandom number generators", OOPSLA 2014) to spread FNV's
// weak low bits. The top 53 bits give a number u in [0, 1), and the row is
// held out when u < Fraction. A categorical key's text is its level; a
// numeric key's is its shortest decimal form (strconv 'g', so 42 and "42"
// hash alike). Anyone can recompute a row's side from this description.
//
// The realised share is near Fraction but not exact; the report gives it.
type KeyHash struct {
	// Column holds the key, numeric or categorical. A missing key is an
	// error.
	Column string
	// Fraction is the share of keys to hold out, in (0, 1).
	Fraction float64
	// Salt changes which keys are held out; keep it fixed to keep a split.
	Salt string
	// Partition names the holdout partition; "" means
	// [tabprep.DefaultPartition].
	Partition string
	// ReportBy names a categorical column whose classes the report counts
	// per partition; "" for none.
	ReportBy string
}

// Apply splits the train rows of f; see [Strategy].
func (s KeyHash) Apply(f *tabprep.Frame) (*tabprep.Frame, *Report, error) {
	return apply("split.keyhash", s, f, part{name: partName(s.Partition, tabprep.DefaultPartition), fraction: s.Fraction}, s.method(), s.ReportBy)
}

func (s KeyHash) method() string {
	return fmt.Sprintf("key hash split on %s, salt %q", s.Column, s.Salt)
}

func (s KeyHash) sized() bool { return s.Fraction != 0 || s.Partition != "" }

func (s KeyHash) describe() (string, string) { return s.method(), s.ReportBy }

// divide sends a row to the first partition p whose cumulative share
// exceeds the row's hash value u.
func (s KeyHash) divide(op string, f *tabprep.Frame, rs rowset, parts []part) (plan, error) {
	bounds := make([]float64, len(parts))
	sum := 0.0
	for p, pt := range parts {
		if err := checkFraction(op, pt.name, pt.fraction); err != nil {
			return plan{}, err
		}
		sum += pt.fraction
		bounds[p] = sum
	}
	if sum >= 1 {
		return plan{}, tabprep.Errorf(op, tabprep.ErrOption, "", "holdout fractions add up to %v; they must add up to less than 1", sum)
	}
	col, err := f.Column(s.Column)
	if err != nil {
		return plan{}, tabprep.Errorf(op, tabprep.ErrNoColumn, s.Column, "key column not in the frame; it has %q", f.Names())
	}
	side := func(u float64) int {
		for p, b := range bounds {
			if u < b {
				return p
			}
		}
		return -1
	}
	pl := plan{rows: make([][]int, len(parts))}
	if col.Kind() == tabprep.Categorical {
		// One hash per level, not per row.
		levelSide := make([]int, len(col.Levels()))
		for k, l := range col.Levels() {
			levelSide[k] = side(KeyShare(s.Salt, l))
		}
		codes := col.Codes()
		for j := range rs.n {
			i := rs.row(j)
			if codes[i] == tabprep.MissingCode {
				return plan{}, tabprep.Errorf(op, tabprep.ErrValue, s.Column, "missing key; every row needs a key to be placed").AtRow(i)
			}
			if p := levelSide[codes[i]]; p >= 0 {
				pl.rows[p] = append(pl.rows[p], i)
			}
		}
	} else {
		vals := col.Float64s()
		var buf []byte
		for j := range rs.n {
			i := rs.row(j)
			if math.IsNaN(vals[i]) {
				return plan{}, tabprep.Errorf(op, tabprep.ErrValue, s.Column, "missing key; every row needs a key to be placed").AtRow(i)
			}
			buf = strconv.AppendFloat(buf[:0], vals[i], 'g', -1, 64)
			if p := side(keyShare(s.Salt, buf)); p >= 0 {
				pl.rows[p] = append(pl.rows[p], i)
			}
		}
	}
	held := 0
	for p, rows := range pl.rows {
		held += len(rows)
		if len(rows) == 0 {
			return plan{}, tabprep.Errorf(op, ErrTooFew, s.Column, "no key of the %d rows hashed into partition %q; use more rows, a larger Fraction or another Salt", rs.n, parts[p].name)
		}
		pl.notes = append(pl.notes, fmt.Sprintf("partition %q: asked %s, realised %s", parts[p].name, percent(parts[p].fraction), percent(float64(len(rows))/float64(rs.n))))
	}
	if held == rs.n {
		return plan{}, tabprep.Errorf(op, ErrTooFew, s.Column, "every key of the %d rows hashed into a holdout partition; use more rows or another Salt", rs.n)
	}
	return pl, nil
}

// KeyShare returns the number in [0, 1) that [KeyHash] compares with its
// Fraction for a key with the given text under salt. It lets other systems
// check or reproduce a split.
func KeyShare(salt, key string) float64 { return keyShare(salt, []byte(key)) }

func keyShare(salt string, key []byte) float64 {
	const (
		offset = 14695981039346656037
		prime  = 1099511628211
	)
	h := uint64(offset)
	for i := 0; i < len(salt); i++ {
		h = (h ^ uint64(salt[i])) * prime
	}
	h *= prime // the zero byte between salt and key: h ^ 0 == h
	for _, c := range key {
		h = (h ^ uint64(c)) * prime
	}
	// SplitMix64 finaliser.
	h ^= h >> 30
	h *= 0xbf58476d1ce4e5b9
	h ^= h >> 27
	h *= 0x94d049bb133111eb
	h ^= h >> 31
	return float64(h>>11) * 0x1p-53
}
