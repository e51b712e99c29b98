package impute

import (
	"math"
	"math/rand/v2"
	"slices"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/moment"
	"github.com/tabprep/tabprep/state"
	"gonum.org/v1/gonum/mat"
)

// Chained fills numeric columns by chained equations: every chosen column
// is modelled from all the others by ridge regression, and the models are
// refitted round after round on the train rows as their gaps are filled
// (van Buuren & Groothuis-Oudshoorn 2011, J. Stat. Software 45(3), describe
// the scheme; this step uses the conditional mean, without draws).
//
// Fit starts from the train means in the gaps. In each round it visits the
// columns in an order drawn from Seed and, for column t, fits
//
//	β = (ZᵀZ + λ·n·I)⁻¹ Zᵀ(y − ȳ)
//
// on the n train rows where t is present, Z being the other columns scaled
// by their train standard deviation and centred over those rows, then
// refills the gaps of t with the prediction. It stops after Rounds rounds,
// or earlier once no filled value moved by more than Tolerance train
// standard deviations in a round. The last round's equations, written on
// the raw scale (intercept and one coefficient per column), are frozen.
//
// Transform starts a row's gaps from the train means and applies the
// frozen equations in the frozen order, as many passes as Fit ran rounds;
// only the cells that were missing change, and each row is filled on its
// own, so the result does not depend on the other rows. Every chosen
// column gets an equation, so gaps new to the data are filled too. The
// linear algebra is gonum's (Cholesky factorisation of the normal
// equations).
type Chained struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// Rounds is the largest number of rounds, at most MaxRounds; 0 means 10.
	Rounds int `json:"rounds,omitempty"`
	// Tolerance, if positive, stops the rounds early (in standard
	// deviations of the column).
	Tolerance float64 `json:"tolerance,omitempty"`
	// Ridge is λ, the penalty on the scaled coefficients relative to the
	// row count; 0 means 1e-6. It keeps collinear columns solvable, and
	// shrinks each scaled coefficient by a relative amount of about λ (so
	// an exact linear relation comes back to about six digits at the
	// default; lower it where that matters).
	Ridge float64 `json:"ridge,omitempty"`
	// Seed draws the order in which the columns are visited.
	Seed uint64 `json:"seed"`
}

// MaxRounds bounds the rounds of [Chained], so that params from an
// untrusted document cannot make a transform run without end.
const MaxRounds = 1000

// ChainedParams holds the frozen equations.
type ChainedParams struct {
	Columns []string     `json:"columns"`
	Center  state.Floats `json:"center"`
	// Rounds is the number of rounds Fit ran, and of passes Transform runs.
	Rounds int `json:"rounds"`
	// Order is the visiting order of the equations, by index into Columns.
	Order     []int      `json:"order"`
	Equations []Equation `json:"equations"`
}

// Equation predicts column Target as Intercept + Σ Coef[j]·x_j over the
// columns of [ChainedParams] (Coef of the target itself is 0).
type Equation struct {
	Target    string       `json:"target"`
	Intercept state.Float  `json:"intercept"`
	Coef      state.Floats `json:"coef"`
}

func init() { state.Register(Chained{}) }

// Kind returns "impute.chained".
func (Chained) Kind() string { return "impute.chained" }

// Fit runs the rounds on the train rows and freezes the equations. A chosen
// column with no present train value is an error wrapping
// [tabprep.ErrAllMissing].
func (s Chained) Fit(train *tabprep.Frame) (ChainedParams, error) {
	const op = "impute.chained fit"
	if err := tabprep.RequireTrain(op, train); err != nil {
		return ChainedParams{}, err
	}
	rounds, ridge := s.Rounds, s.Ridge
	if rounds == 0 {
		rounds = 10
	}
	if ridge == 0 {
		ridge = 1e-6
	}
	if rounds < 0 || rounds > MaxRounds || !(ridge > 0) || math.IsInf(ridge, 0) || !(s.Tolerance >= 0) {
		return ChainedParams{}, tabprep.Errorf(op, tabprep.ErrOption, "", "Rounds %d, Ridge %v, Tolerance %v: want Rounds in [0, %d], Ridge > 0 finite, Tolerance ≥ 0", s.Rounds, s.Ridge, s.Tolerance, MaxRounds)
	}
	cols, err := numericColumns(op, train, s.Columns)
	if err != nil {
		return ChainedParams{}, err
	}
	n, d := train.NumRows(), len(cols)
	p := ChainedParams{Center: make(state.Floats, d), Equations: make([]Equation, d)}
	scale := make([]float64, d)
	x := make([][]float64, d) // current train values, gaps filled
	miss := make([][]bool, d) // train gaps
	for j, c := range cols {
		p.Columns = append(p.Columns, c.Name())
		sum := moment.Of(c.Float64s())
		if sum.N == 0 {
			return ChainedParams{}, tabprep.Errorf(op, tabprep.ErrAllMissing, c.Name(), "no value in the %d train rows to model; drop the column (impute.DropSparse) or leave it out of Columns", n)
		}
		p.Center[j] = sum.Mean
		scale[j] = 1
		if sd := sum.Std(false); sd > 0 {
			scale[j] = sd
		}
		x[j] = make([]float64, n)
		miss[j] = make([]bool, n)
		for i, v := range c.Float64s() {
			if v != v {
				v, miss[j][i] = sum.Mean, true
			}
			x[j][i] = v
		}
		p.Equations[j] = Equation{Target: c.Name()}
	}
	rng := rand.New(rand.NewPCG(s.Seed, s.Seed^0x9e3779b97f4a7c15))
	for r := 0; r < rounds; r++ {
		p.Order = rng.Perm(d)
		p.Rounds = r + 1
		moved := 0.0
		for _, t := range p.Order {
			eq, err := fitEquation(op, p.Columns[t], x, miss[t], t, scale, ridge)
			if err != nil {
				return ChainedParams{}, err
			}
			eq.Target = p.Columns[t]
			p.Equations[t] = eq
			for i, m := range miss[t] {
				if !m {
					continue
				}
				v := eq.predict(x, i)
				moved = math.Max(moved, math.Abs(v-x[t][i])/scale[t])
				x[t][i] = v
			}
		}
		if s.Tolerance > 0 && moved <= s.Tolerance {
			break
		}
	}
	return p, nil
}

// predict evaluates e on row i of the columns x.
func (e Equation) predict(x [][]float64, i int) float64 {
	v := float64(e.Intercept)
	for j, c := range e.Coef {
		if c != 0 {
			v += c * x[j][i]
		}
	}
	return v
}

// fitEquation fits the ridge regression of column t on the others over the
// rows where t is present.
func fitEquation(op, name string, x [][]float64, miss []bool, t int, scale []float64, ridge float64) (Equation, error) {
	d := len(x)
	var rows []int
	for i, m := range miss {
		if !m {
			rows = append(rows, i)
		}
	}
	n := len(rows)
	eq := Equation{Coef: make(state.Floats, d)}
	var ybar float64
	for _, i := range rows {
		ybar += x[t][i]
	}
	ybar /= float64(n)
	if d == 1 {
		eq.Intercept = state.Float(ybar)
		return eq, nil
	}
	preds := make([]int, 0, d-1)
	for j := range d {
		if j != t {
			preds = append(preds, j)
		}
	}
	means := make([]float64, len(preds))
	for k, j := range preds {
		for _, i := range rows {
			means[k] += x[j][i]
		}
		means[k] /= float64(n)
	}
	z := mat.NewDense(n, len(preds), nil)
	y := mat.NewVecDense(n, nil)
	for r, i := range rows {
		for k, j := range preds {
			z.Set(r, k, (x[j][i]-means[k])/scale[j])
		}
		y.SetVec(r, x[t][i]-ybar)
	}
	a := mat.NewSymDense(len(preds), nil)
	a.SymOuterK(1, z.T())
	for k := range preds {
		a.SetSym(k, k, a.At(k, k)+ridge*float64(n))
	}
	var b mat.VecDense
	b.MulVec(z.T(), y)
	var ch mat.Cholesky
	if !ch.Factorize(a) {
		return eq, tabprep.Errorf(op, tabprep.ErrValue, name, "normal equations of its model are not positive definite; raise Ridge")
	}
	var beta mat.VecDense
	if err := ch.SolveVecTo(&beta, &b); err != nil {
		return eq, tabprep.Errorf(op, tabprep.ErrValue, name, "solving its model: %v; raise Ridge", err)
	}
	icpt := ybar
	for k, j := range preds {
		c := beta.AtVec(k) / scale[j]
		eq.Coef[j] = c
		icpt -= c * means[k]
	}
	eq.Intercept = state.Float(icpt)
	return eq, nil
}

// Transform fills the gaps of the fitted columns of data with the frozen
// equations.
func (s Chained) Transform(p ChainedParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	const op = "impute.chained transform"
	if err := p.check(op); err != nil {
		return nil, err
	}
	d := len(p.Columns)
	in := make([][]float64, d)
	gaps := false
	for j, name := range p.Columns {
		c, err := inputColumn(op, data, name, tabprep.Numeric)
		if err != nil {
			return nil, err
		}
		in[j] = c.Float64s()
		gaps = gaps || c.MissingCount() > 0
	}
	if !gaps {
		return data.With()
	}
	out := make([][]float64, d)
	var changed []*tabprep.Column
	for j := range in {
		if !slices.ContainsFunc(in[j], math.IsNaN) {
			out[j] = in[j] // read only: no cell of it is written
			continue
		}
		out[j] = make([]float64, len(in[j]))
		changed = append(changed, tabprep.AdoptNumeric(p.Columns[j], out[j]))
		for i, v := range in[j] {
			if v != v {
				v = p.Center[j]
			}
			out[j][i] = v
		}
	}
	for i := range data.NumRows() {
		for range p.Rounds {
			for _, t := range p.Order {
				if in[t][i] != in[t][i] {
					out[t][i] = p.Equations[t].predict(out, i)
				}
			}
		}
	}
	return data.With(changed...)
}

// RowKernel returns the fill of p for single rows laid out by l. It gives
// the same cells as Transform, since Transform fills each row on its own.
// RowSource writes the row kernel as Go source, for generated plans: a row
// with no gap in the fitted columns passes unchanged, and one with a gap is
// left to the interpreted plan.
func (s Chained) RowSource(p ChainedParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	const op = "impute.chained row"
	if err := p.check(op); err != nil {
		return err
	}
	return gapsGiveUp(op, p.Columns, l, w)
}

func (s Chained) RowKernel(p ChainedParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	const op = "impute.chained row"
	if err := p.check(op); err != nil {
		return nil, err
	}
	slots, err := numericPositions(op, l, p.Columns)
	if err != nil {
		return nil, err
	}
	fn := func(regs []tabprep.Cell) error {
		// gap[j] says whether column j was missing on entry; a fixed array
		// keeps the common case free of allocation.
		var buf [64]bool
		gap := buf[:0]
		if len(slots) > len(buf) {
			gap = make([]bool, 0, len(slots))
		}
		any := false
		for j, k := range slots {
			g := math.IsNaN(regs[k].Num)
			gap = append(gap, g)
			if g {
				regs[k].Num = p.Center[j]
				any = true
			}
		}
		if !any {
			return nil
		}
		for range p.Rounds {
			for _, t := range p.Order {
				if !gap[t] {
					continue
				}
				e := &p.Equations[t]
				v := float64(e.Intercept)
				for j, c := range e.Coef {
					if c != 0 {
						v += c * regs[slots[j]].Num
					}
				}
				regs[slots[t]].Num = v
			}
		}
		return nil
	}
	return fn, nil
}
