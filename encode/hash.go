package encode

import (
	"strconv"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// Hash is feature hashing: each selected categorical column becomes Buckets
// numeric columns "<column>#0" … "<column>#<Buckets−1>", and a level adds
// +1 or −1 to one of them. Both the bucket and the sign come from one 64-bit
// hash of the level: FNV-1a (Fowler, Noll and Vo) over the eight bytes of
// Seed, little endian, and then the level's bytes, finished with the
// SplitMix64 mixer (Steele, Lea & Flood 2014, OOPSLA) so that every output
// bit depends on every input bit. The bucket is the hash modulo Buckets and
// the sign its top bit; the sign makes colliding levels cancel in
// expectation rather than pile up (Weinberger et al. 2009, ICML, "Feature
// hashing for large scale multitask learning").
//
// Any level, seen in training or not, is hashed the same way, so there is
// nothing to learn but the column list; a missing cell is all zeros. The
// source is dropped and the outputs appended.
type Hash struct {
	// Columns selects categorical columns; the zero value selects all.
	Columns tabprep.Selection `json:"columns"`
	// Buckets is the number of output columns per source; at least 1.
	Buckets int `json:"buckets"`
	// Seed changes which levels collide.
	Seed uint64 `json:"seed"`
}

// HashParams are the columns, buckets and seed of a fitted [Hash] step.
type HashParams struct {
	Columns []string `json:"columns"`
	Buckets int      `json:"buckets"`
	Seed    uint64   `json:"seed"`
}

func init() { state.Register(Hash{}) }

// Kind returns "encode.hash".
func (Hash) Kind() string { return "encode.hash" }

func (p HashParams) names(source string) []string {
	out := make([]string, p.Buckets)
	for i := range out {
		out[i] = source + "#" + strconv.Itoa(i)
	}
	return out
}

// Outputs returns the names of the columns the step writes, in order.
func (p HashParams) Outputs() []string {
	var out []string
	for _, c := range p.Columns {
		out = append(out, p.names(c)...)
	}
	return out
}

func (s Hash) check(op string, p HashParams) error {
	if p.Buckets < 1 {
		col := ""
		if len(p.Columns) > 0 {
			col = p.Columns[0]
		}
		return tabprep.Errorf(op, tabprep.ErrOption, col, "Buckets %d: hashing into zero columns; set Buckets to 1 or more", p.Buckets)
	}
	return nil
}

// Fit freezes the selected columns, the bucket count and the seed.
func (s Hash) Fit(train *tabprep.Frame) (HashParams, error) {
	const op = "encode.hash fit"
	names, err := resolve[struct{}](op, train, s.Columns, tabprep.Categorical, "", nil)
	if err != nil {
		return HashParams{}, err
	}
	p := HashParams{Columns: names, Buckets: s.Buckets, Seed: s.Seed}
	return p, s.check(op, p)
}

const (
	fnvOffset = 14695981039346656037
	fnvPrime  = 1099511628211
)

// fnv1a returns the 64-bit FNV-1a hash of the eight little-endian bytes of
// seed followed by the bytes of s.
func fnv1a(seed uint64, s string) uint64 {
	h := uint64(fnvOffset)
	for i := 0; i < 8; i++ {
		h ^= seed >> (8 * i) & 0xff
		h *= fnvPrime
	}
	for i := 0; i < len(s); i++ {
		h ^= uint64(s[i])
		h *= fnvPrime
	}
	return h
}

// mix64 is the SplitMix64 finaliser.
func mix64(z uint64) uint64 {
	z = (z ^ z>>30) * 0xbf58476d1ce4e5b9
	z = (z ^ z>>27) * 0x94d049bb133111eb
	return z ^ z>>31
}

// bucketOf returns the bucket and sign of level s.
func bucketOf(seed uint64, s string, buckets int) (int, float64) {
	h := mix64(fnv1a(seed, s))
	sign := 1.0
	if h>>63 == 1 {
		sign = -1
	}
	return int(h % uint64(buckets)), sign
}

// Transform writes the hashed columns. Each distinct level is hashed once.
func (s Hash) Transform(p HashParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	const op = "encode.hash transform"
	if err := s.check(op, p); err != nil {
		return nil, err
	}
	n := data.NumRows()
	outs := make([]encoded, len(p.Columns))
	for ci, name := range p.Columns {
		c, err := columnOf(op, data, name, tabprep.Categorical)
		if err != nil {
			return nil, err
		}
		bucket := make([]int, len(c.Levels()))
		sign := make([]float64, len(c.Levels()))
		for k, l := range c.Levels() {
			bucket[k], sign[k] = bucketOf(p.Seed, l, p.Buckets)
		}
		block := make([]float64, n*p.Buckets)
		for row, k := range c.Codes() {
			if k != tabprep.MissingCode {
				block[bucket[k]*n+row] = sign[k]
			}
		}
		outs[ci] = encoded{source: name, cols: split(p.names(name), block, n)}
	}
	return assemble(op, data, outs)
}

// RowKernel returns a row function that writes the same cells as
// [Hash.Transform], without allocating: the bucket and sign of each level
// of the layout are hashed here, and a level the layout does not list is
// hashed in the row (the hash reads the string's bytes in place).
func (s Hash) RowKernel(p HashParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	plans, err := s.rows(p, l)
	if err != nil {
		return nil, err
	}
	fn := func(regs []tabprep.Cell) error {
		for i := range plans {
			pl := &plans[i]
			c := &regs[pl.from]
			out := regs[pl.to : pl.to+p.Buckets]
			var b int
			var sign float64
			switch {
			case c.Code >= 0:
				b, sign = pl.bucket[c.Code], pl.sign[c.Code]
			case c.Code == tabprep.UnseenCode:
				b, sign = bucketOf(p.Seed, c.Str, p.Buckets)
			}
			// The source is dropped, so its slot is not among the outputs.
			for j := range out {
				out[j].Num = 0
			}
			out[b].Num = sign
		}
		return nil
	}
	return fn, nil
}

// RowSource writes the row kernel as Go source, for generated plans: the
// layout's levels have their buckets as constants, and a level first met in
// the row is left to the interpreted plan to hash.
func (s Hash) RowSource(p HashParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	plans, err := s.rows(p, l)
	if err != nil {
		return err
	}
	for _, pl := range plans {
		zeroSource(w, pl.to, p.Buckets)
		w.Line("switch %s {", w.Code(pl.from))
		for k, b := range pl.bucket {
			w.Line("case %d:", k)
			w.Line("%s = %s", w.Num(pl.to+b), w.Float(pl.sign[k]))
		}
		// A missing cell leaves every output 0.
		w.Line("case %d:", tabprep.MissingCode)
		w.Line("default:")
		w.GiveUp()
		w.Line("}")
	}
	return nil
}

// hashRow is one fitted column of a hash step, by register slot, with the
// bucket and sign of each layout level.
type hashRow struct {
	from, to int
	bucket   []int
	sign     []float64
}

func (s Hash) rows(p HashParams, l *tabprep.RowLayout) ([]hashRow, error) {
	const op = "encode.hash row"
	if err := s.check(op, p); err != nil {
		return nil, err
	}
	at, levels, to, err := arrange(op, l, p.Columns, tabprep.Categorical, numericFields(p.Columns, p.names))
	if err != nil {
		return nil, err
	}
	plans := make([]hashRow, len(p.Columns))
	for i := range plans {
		pl := hashRow{from: at[i], to: to[i], bucket: make([]int, len(levels[i])), sign: make([]float64, len(levels[i]))}
		for k, lv := range levels[i] {
			pl.bucket[k], pl.sign[k] = bucketOf(p.Seed, lv, p.Buckets)
		}
		plans[i] = pl
	}
	return plans, nil
}

var (
	_ tabprep.RowKernel[HashParams] = Hash{}
	_ tabprep.RowSource[HashParams] = Hash{}
)
