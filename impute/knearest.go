package impute

import (
	"math"
	"sync"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/moment"
	"github.com/tabprep/tabprep/state"
)

// Neighbour weightings of [KNearest].
const (
	// WeightUniform averages the k donors' values.
	WeightUniform = "uniform"
	// WeightDistance weights each donor by 1/distance; if some donors are
	// at distance 0, only those are averaged.
	WeightDistance = "distance"
)

// KNearest fills a gap with the values of the k nearest train rows
// (donors) that have the column present.
//
// Distance is Euclidean over the chosen numeric columns, each scaled by its
// train mean and population standard deviation (a constant column by 1).
// A coordinate missing in either row is skipped and the sum re-weighted by
// the share of coordinates used: with m of the P columns present in both,
//
//	d² = (P/m) · Σ ((q_j − r_j)/s_j)²
//
// A train row sharing no present coordinate with the query is not a donor.
// Neighbours are exact: every train row is scanned and the k nearest kept
// in a bounded max-heap (O(n·P + n·log k) per query row, no sort); ties in
// distance go to the earlier train row. A query row with no donor at all
// (it shares no present column with any train row that has the value) gets
// the train mean of the column.
//
// The params hold every train row over the chosen columns: Rows × P
// float64 values, 8·Rows·P bytes in memory (800 kB for 20,000 rows of 5
// columns) and up to about 24 bytes per value in a state document.
type KNearest struct {
	// Columns chooses the numeric columns to fill and to measure distance
	// by; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// K is the number of donors, in [1, MaxK]; 0 means 5.
	K int `json:"k,omitempty"`
	// Weights is WeightUniform (the default when empty) or WeightDistance.
	Weights string `json:"weights,omitempty"`
}

// MaxK bounds the K of [KNearest].
const MaxK = 10_000

// KNearestParams holds the scaling and the train reference rows.
type KNearestParams struct {
	Columns []string     `json:"columns"`
	K       int          `json:"k"`
	Weights string       `json:"weights"`
	Center  state.Floats `json:"center"`
	Scale   state.Floats `json:"scale"`
	Rows    int          `json:"rows"`
	// Reference is the train rows, row by row over Columns, NaN where
	// missing.
	Reference state.Floats `json:"reference"`
}

func init() { state.Register(KNearest{}) }

// Kind returns "impute.knearest".
func (KNearest) Kind() string { return "impute.knearest" }

// Fit stores the train rows and the scaling of each column. Each chosen
// column needs at least K present train values.
func (s KNearest) Fit(train *tabprep.Frame) (KNearestParams, error) {
	const op = "impute.knearest fit"
	if err := tabprep.RequireTrain(op, train); err != nil {
		return KNearestParams{}, err
	}
	k := s.K
	if k == 0 {
		k = 5
	}
	if k < 0 || k > MaxK {
		return KNearestParams{}, tabprep.Errorf(op, tabprep.ErrOption, "", "K = %d; give K in [1, %d]", s.K, MaxK)
	}
	w := s.Weights
	if w == "" {
		w = WeightUniform
	}
	if w != WeightUniform && w != WeightDistance {
		return KNearestParams{}, tabprep.Errorf(op, tabprep.ErrOption, "", "Weights %q; use %q or %q", s.Weights, WeightUniform, WeightDistance)
	}
	cols, err := numericColumns(op, train, s.Columns)
	if err != nil {
		return KNearestParams{}, err
	}
	n, d := train.NumRows(), len(cols)
	p := KNearestParams{K: k, Weights: w, Rows: n, Center: make(state.Floats, d), Scale: make(state.Floats, d), Reference: make(state.Floats, n*d)}
	for j, c := range cols {
		p.Columns = append(p.Columns, c.Name())
		sum := moment.Of(c.Float64s())
		if sum.N == 0 {
			return KNearestParams{}, tabprep.Errorf(op, tabprep.ErrAllMissing, c.Name(), "no value in the %d train rows, so no row can be a donor; drop the column (impute.DropSparse) or fill it first", n)
		}
		if sum.N < k {
			return KNearestParams{}, tabprep.Errorf(op, tabprep.ErrValue, c.Name(), "%d present train values (of %d rows), fewer than K = %d; lower K", sum.N, n, k)
		}
		p.Center[j] = sum.Mean
		p.Scale[j] = 1
		if sd := sum.Std(false); sd > 0 {
			p.Scale[j] = sd
		}
		for i, v := range c.Float64s() {
			p.Reference[i*d+j] = v
		}
	}
	return p, nil
}

// Transform fills the gaps of the fitted columns of data from their nearest
// train rows.
func (s KNearest) Transform(p KNearestParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	const op = "impute.knearest transform"
	if err := p.check(op); err != nil {
		return nil, err
	}
	d := len(p.Columns)
	in := make([][]float64, d)
	out := make([][]float64, d)
	var changed []*tabprep.Column
	for j, name := range p.Columns {
		c, err := inputColumn(op, data, name, tabprep.Numeric)
		if err != nil {
			return nil, err
		}
		in[j] = c.Float64s()
		if c.MissingCount() > 0 {
			out[j] = append([]float64(nil), in[j]...)
			changed = append(changed, tabprep.AdoptNumeric(name, out[j]))
		}
	}
	if len(changed) == 0 {
		return data.With()
	}
	sc := newNeighbourScratch(p)
	q := make([]float64, d)
	for i := range data.NumRows() {
		gaps := false
		for j := range d {
			q[j] = in[j][i]
			gaps = gaps || q[j] != q[j]
		}
		if !gaps {
			continue
		}
		sc.distances(p, q)
		for j := range d {
			if q[j] != q[j] {
				out[j][i] = sc.fill(p, j)
			}
		}
	}
	return data.With(changed...)
}

// neighbourScratch is the per-transform working memory of [KNearest].
type neighbourScratch struct {
	inv  []float64 // 1/scale per column
	dist []float64 // squared distance to each train row, NaN if undefined
	heap []neighbour
}

type neighbour struct {
	d2  float64
	row int
}

// farther reports whether a ranks after b: larger distance, or equal
// distance and later row.
func (a neighbour) farther(b neighbour) bool {
	return a.d2 > b.d2 || (a.d2 == b.d2 && a.row > b.row)
}

func newNeighbourScratch(p KNearestParams) *neighbourScratch {
	sc := &neighbourScratch{inv: make([]float64, len(p.Columns)), dist: make([]float64, p.Rows), heap: make([]neighbour, 0, min(p.K, p.Rows))}
	for j, s := range p.Scale {
		sc.inv[j] = 1 / s
	}
	return sc
}

// distances fills sc.dist with the re-weighted squared distance of q to
// every train row.
func (sc *neighbourScratch) distances(p KNearestParams, q []float64) {
	d := len(q)
	ref := p.Reference
	for r := range sc.dist {
		row := ref[r*d : r*d+d]
		var sum float64
		m := 0
		for j, v := range row {
			diff := (q[j] - v) * sc.inv[j]
			if diff == diff {
				sum += diff * diff
				m++
			}
		}
		if m == 0 {
			sc.dist[r] = math.NaN()
			continue
		}
		sc.dist[r] = sum * float64(d) / float64(m)
	}
}

// fill returns the fill of column j from the k nearest donors, by the
// distances last computed.
func (sc *neighbourScratch) fill(p KNearestParams, j int) float64 {
	d := len(p.Columns)
	h := sc.heap[:0]
	for r, d2 := range sc.dist {
		if d2 != d2 || math.IsNaN(p.Reference[r*d+j]) {
			continue
		}
		nb := neighbour{d2, r}
		if len(h) < p.K {
			h = append(h, nb)
			siftUp(h, len(h)-1)
		} else if h[0].farther(nb) {
			h[0] = nb
			siftDown(h, 0)
		}
	}
	sc.heap = h
	if len(h) == 0 {
		return float64(p.Center[j])
	}
	if p.Weights == WeightDistance {
		var zeroSum float64
		zeros := 0
		for _, nb := range h {
			if nb.d2 == 0 {
				zeroSum += p.Reference[nb.row*d+j]
				zeros++
			}
		}
		if zeros > 0 {
			return zeroSum / float64(zeros)
		}
		var num, den float64
		for _, nb := range h {
			w := 1 / math.Sqrt(nb.d2)
			num += w * p.Reference[nb.row*d+j]
			den += w
		}
		return num / den
	}
	var sum float64
	for _, nb := range h {
		sum += p.Reference[nb.row*d+j]
	}
	return sum / float64(len(h))
}

// siftUp and siftDown keep h a max-heap by [neighbour.farther].
func siftUp(h []neighbour, i int) {
	for i > 0 {
		parent := (i - 1) / 2
		if !h[i].farther(h[parent]) {
			return
		}
		h[i], h[parent] = h[parent], h[i]
		i = parent
	}
}

func siftDown(h []neighbour, i int) {
	for {
		big, l, r := i, 2*i+1, 2*i+2
		if l < len(h) && h[l].farther(h[big]) {
			big = l
		}
		if r < len(h) && h[r].farther(h[big]) {
			big = r
		}
		if big == i {
			return
		}
		h[i], h[big] = h[big], h[i]
		i = big
	}
}

// RowKernel returns the fill of p for single rows laid out by l: the same
// exact neighbour search as Transform, by the same code, so the cells are
// bit-identical. A row's working memory (a distance per train row and the
// heap of k) comes from a pool the kernel keeps, so a row allocates nothing
// once the pool holds one per goroutine; the cost per row with a gap is
// that of Transform, O(Rows·P + Rows·log K).
// RowSource writes the row kernel as Go source, for generated plans: a row
// with no gap in the fitted columns passes unchanged, and one with a gap is
// left to the interpreted plan.
func (s KNearest) RowSource(p KNearestParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	const op = "impute.knearest row"
	if err := p.check(op); err != nil {
		return err
	}
	return gapsGiveUp(op, p.Columns, l, w)
}

func (s KNearest) RowKernel(p KNearestParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	const op = "impute.knearest row"
	if err := p.check(op); err != nil {
		return nil, err
	}
	slots, err := numericPositions(op, l, p.Columns)
	if err != nil {
		return nil, err
	}
	type scratch struct {
		sc *neighbourScratch
		q  []float64
	}
	pool := sync.Pool{New: func() any {
		return &scratch{sc: newNeighbourScratch(p), q: make([]float64, len(p.Columns))}
	}}
	fn := func(regs []tabprep.Cell) error {
		gaps := false
		for _, k := range slots {
			gaps = gaps || math.IsNaN(regs[k].Num)
		}
		if !gaps {
			return nil
		}
		w := pool.Get().(*scratch)
		defer pool.Put(w)
		for j, k := range slots {
			w.q[j] = regs[k].Num
		}
		w.sc.distances(p, w.q)
		for j, k := range slots {
			if w.q[j] != w.q[j] {
				regs[k].Num = w.sc.fill(p, j)
			}
		}
		return nil
	}
	return fn, nil
}
