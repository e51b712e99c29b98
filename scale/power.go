package scale

import (
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/moment"
	"github.com/tabprep/tabprep/state"
)

func init() {
	state.Register(BoxCox{})
	state.Register(YeoJohnson{})
}

// Lambda is searched on [LambdaMin, LambdaMax]: wide enough for any data a
// power transform suits (common practice, no source), and bounded so that
// x^λ stays within float64 for ordinary magnitudes.
const (
	LambdaMin = -5.0
	LambdaMax = 5.0
)

// BoxCox applies the power transform of Box & Cox (1964), "An analysis of
// transformations", Journal of the Royal Statistical Society B 26(2),
// 211–252, to each chosen numeric column, which must be positive:
//
//	ψ(λ, x) = (x^λ − 1)/λ  for λ ≠ 0,   ln x  for λ = 0
//
// computed as expm1(λ·ln x)/λ, which stays accurate for λ near 0. λ is
// fitted per column by maximum likelihood on the train values: it
// maximises the profile log-likelihood of a normal model for ψ(λ, x),
//
//	ℓ(λ) = −(n/2)·ln σ̂²(λ) + (λ − 1)·Σ ln xᵢ
//
// with σ̂² the variance of ψ(λ, x) with denominator n, over [LambdaMin,
// LambdaMax] (a grid, then golden-section search; see the package tests
// for the NIST e-Handbook check). With ZScore set, the transformed
// values are then z-scored with their train mean and sample standard
// deviation, as [ZScore] does.
//
// Zero and negative values are outside the domain: at fit they are an
// error (or, with OutOfDomain set to [DomainMissing], left out of the fit),
// at transform as the package's domain rule says. A column whose train
// values are all equal gets λ = 1, a shift. The inverse is
// (1 + λ·y)^(1/λ), defined for 1 + λ·y > 0.
type BoxCox struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// ZScore z-scores the transformed values.
	ZScore bool `json:"zscore,omitempty"`
	// OutOfDomain says what to do with a value ≤ 0.
	OutOfDomain DomainRule `json:"out_of_domain,omitempty"`
}

// YeoJohnson applies the power transform of Yeo & Johnson (2000), "A new
// family of power transformations to improve normality or symmetry",
// Biometrika 87(4), 954–959, which accepts values of any sign:
//
//	ψ(λ, x) = ((x+1)^λ − 1)/λ               x ≥ 0, λ ≠ 0
//	          ln(x+1)                       x ≥ 0, λ = 0
//	          −((1−x)^(2−λ) − 1)/(2−λ)      x < 0, λ ≠ 2
//	          −ln(1−x)                      x < 0, λ = 2
//
// computed with expm1 and log1p. λ is fitted as for [BoxCox], with the
// log-Jacobian term (λ − 1)·Σ sign(xᵢ)·ln(|xᵢ|+1). Every finite value is in
// the domain; a result that overflows is handled by the package's domain
// rule, as is a value outside the range of ψ given to the inverse.
type YeoJohnson struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// ZScore z-scores the transformed values.
	ZScore bool `json:"zscore,omitempty"`
	// OutOfDomain says what to do with a value whose transform overflows.
	OutOfDomain DomainRule `json:"out_of_domain,omitempty"`
}

// PowerParams is what [BoxCox] and [YeoJohnson] learn: λ per column and,
// with ZScore, the train mean and standard deviation of the
// transformed values.
type PowerParams struct {
	Columns     []string     `json:"columns"`
	Lambda      state.Floats `json:"lambda"`
	ZScore      bool         `json:"zscore,omitempty"`
	Mean        state.Floats `json:"mean,omitempty"`
	Std         state.Floats `json:"std,omitempty"`
	OutOfDomain DomainRule   `json:"out_of_domain,omitempty"`
}

// Kind returns "scale.boxcox".
func (BoxCox) Kind() string { return "scale.boxcox" }

// Kind returns "scale.yeojohnson".
func (YeoJohnson) Kind() string { return "scale.yeojohnson" }

// powerFamily is what tells Box-Cox and Yeo-Johnson apart.
type powerFamily struct {
	forward, backward     func(lambda, x float64) float64
	jacobian              func(x float64) float64 // term of Σ in ℓ(λ)
	domain, inverseDomain string
	// source writes forward(l, x) as Go statements that set y, with the
	// same operations in the same order, for generated plans.
	source func(w *tabprep.SourceWriter, l float64, x, y string)
}

var boxCoxFamily = powerFamily{
	forward: func(l, x float64) float64 {
		switch {
		case !(x > 0):
			return math.NaN() // NaN for NaN too
		case l == 0:
			return math.Log(x)
		}
		return math.Expm1(l*math.Log(x)) / l
	},
	backward: func(l, y float64) float64 {
		if l == 0 {
			return math.Exp(y)
		}
		if t := l * y; t > -1 {
			return math.Exp(math.Log1p(t) / l)
		}
		return math.NaN()
	},
	jacobian:      math.Log,
	domain:        "Box-Cox needs x > 0",
	inverseDomain: "the Box-Cox inverse needs 1 + λ·y > 0",
	source: func(w *tabprep.SourceWriter, l float64, x, y string) {
		w.Line("if !(%s > 0) {", x)
		w.Line("%s = math.NaN()", y)
		w.Line("} else {")
		if l == 0 {
			w.Line("%s = math.Log(%s)", y, x)
		} else {
			w.Line("%s = math.Expm1(%s*math.Log(%s)) / %s", y, w.Float(l), x, w.Float(l))
		}
		w.Line("}")
	},
}

var yeoJohnsonFamily = powerFamily{
	forward: func(l, x float64) float64 {
		switch {
		case x != x:
			return x
		case x >= 0:
			if l == 0 {
				return math.Log1p(x)
			}
			return math.Expm1(l*math.Log1p(x)) / l
		}
		m := 2 - l
		if m == 0 {
			return -math.Log1p(-x)
		}
		return -math.Expm1(m*math.Log1p(-x)) / m
	},
	backward: func(l, y float64) float64 {
		switch {
		case y != y:
			return y
		case y >= 0:
			if l == 0 {
				return math.Expm1(y)
			}
			if t := l * y; t > -1 {
				return math.Expm1(math.Log1p(t) / l)
			}
			return math.NaN()
		}
		m := 2 - l
		if m == 0 {
			return -math.Expm1(-y)
		}
		if t := -m * y; t > -1 {
			return -math.Expm1(math.Log1p(t) / m)
		}
		return math.NaN()
	},
	jacobian:      func(x float64) float64 { return math.Copysign(math.Log1p(math.Abs(x)), x) },
	domain:        "the Yeo-Johnson transform overflows float64",
	inverseDomain: "the Yeo-Johnson inverse needs 1 + λ·y > 0 for y ≥ 0 and 1 − (2−λ)·y > 0 for y < 0",
	source: func(w *tabprep.SourceWriter, l float64, x, y string) {
		w.Line("switch {")
		w.Line("case %s != %s:", x, x)
		w.Line("%s = %s", y, x)
		w.Line("case %s >= 0:", x)
		if l == 0 {
			w.Line("%s = math.Log1p(%s)", y, x)
		} else {
			w.Line("%s = math.Expm1(%s*math.Log1p(%s)) / %s", y, w.Float(l), x, w.Float(l))
		}
		w.Line("default:")
		if m := 2 - l; m == 0 {
			w.Line("%s = -math.Log1p(-%s)", y, x)
		} else {
			w.Line("%s = -math.Expm1(%s*math.Log1p(-%s)) / %s", y, w.Float(m), x, w.Float(m))
		}
		w.Line("}")
	},
}

// Fit learns λ, and with ZScore the mean and standard deviation of
// the transformed values, for each chosen column of train.
func (s BoxCox) Fit(train *tabprep.Frame) (PowerParams, error) {
	return fitPower(s.Kind(), boxCoxFamily, s.Columns, s.ZScore, s.OutOfDomain, train)
}

// Transform returns data with each fitted column transformed.
func (s BoxCox) Transform(p PowerParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return transform(s.Kind(), boxCoxOf(p), data)
}

// Inverse maps transformed values back to the original scale.
func (s BoxCox) Inverse(p PowerParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return invert(s.Kind(), boxCoxOf(p), data)
}

// RowKernel returns the transform of one row, for rows laid out by l.
func (s BoxCox) RowKernel(p PowerParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return rowKernel(s.Kind(), boxCoxOf(p), l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s BoxCox) RowSource(p PowerParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return rowSource(s.Kind(), boxCoxOf(p), l, w)
}

// Fit learns λ, and with ZScore the mean and standard deviation of
// the transformed values, for each chosen column of train.
func (s YeoJohnson) Fit(train *tabprep.Frame) (PowerParams, error) {
	return fitPower(s.Kind(), yeoJohnsonFamily, s.Columns, s.ZScore, s.OutOfDomain, train)
}

// Transform returns data with each fitted column transformed.
func (s YeoJohnson) Transform(p PowerParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return transform(s.Kind(), yeoJohnsonOf(p), data)
}

// Inverse maps transformed values back to the original scale.
func (s YeoJohnson) Inverse(p PowerParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return invert(s.Kind(), yeoJohnsonOf(p), data)
}

// RowKernel returns the transform of one row, for rows laid out by l.
func (s YeoJohnson) RowKernel(p PowerParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return rowKernel(s.Kind(), yeoJohnsonOf(p), l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s YeoJohnson) RowSource(p PowerParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return rowSource(s.Kind(), yeoJohnsonOf(p), l, w)
}

// boxCoxOf and yeoJohnsonOf bind PowerParams to a family for the shared
// helpers.
type boxCoxOf PowerParams
type yeoJohnsonOf PowerParams

func (p boxCoxOf) mapper(op string, inverse bool) (*mapper, error) {
	return PowerParams(p).mapperOf(boxCoxFamily, op, inverse)
}

func (p yeoJohnsonOf) mapper(op string, inverse bool) (*mapper, error) {
	return PowerParams(p).mapperOf(yeoJohnsonFamily, op, inverse)
}

func fitPower(kind string, fam powerFamily, sel tabprep.Selection, zscore bool, rule DomainRule, train *tabprep.Frame) (PowerParams, error) {
	op := opName(kind, "fit")
	if err := rule.check(op); err != nil {
		return PowerParams{}, err
	}
	names, cols, err := fitColumns(op, train, sel)
	if err != nil {
		return PowerParams{}, err
	}
	k := len(names)
	p := PowerParams{Columns: names, Lambda: make(state.Floats, k), ZScore: zscore, OutOfDomain: rule}
	if zscore {
		p.Mean, p.Std = make(state.Floats, k), make(state.Floats, k)
	}
	for j, c := range cols {
		x := make([]float64, 0, c.Len())
		for i, v := range c.Float64s() {
			switch {
			case v != v:
			case fam.forward(1, v) != fam.forward(1, v): // outside the domain
				if rule != DomainMissing {
					return PowerParams{}, tabprep.Errorf(op, tabprep.ErrValue, names[j],
						"value %v is outside the domain (%s); shift the column to positive values, or use scale.YeoJohnson, which takes any sign", v, fam.domain).AtRow(i)
				}
			default:
				x = append(x, v)
			}
		}
		if len(x) == 0 {
			return PowerParams{}, allMissing(op, names[j])
		}
		p.Lambda[j] = fitLambda(fam, x)
		if zscore {
			y := make([]float64, len(x))
			for i, v := range x {
				y[i] = fam.forward(p.Lambda[j], v)
			}
			p.Mean[j], p.Std[j] = spreadOf(y).meanStd(false)
		}
	}
	m, err := p.mapperOf(fam, op, false)
	if err != nil {
		return PowerParams{}, err
	}
	if err := m.check(train); err != nil {
		return PowerParams{}, err
	}
	return p, nil
}

// fitLambda returns the maximum-likelihood λ of x (no NaN, all in the
// domain) on [LambdaMin, LambdaMax], or 1 if the values are all equal.
func fitLambda(fam powerFamily, x []float64) float64 {
	if spreadOf(x).flat {
		return 1
	}
	var jac float64
	for _, v := range x {
		jac += fam.jacobian(v)
	}
	n := float64(len(x))
	y := make([]float64, len(x))
	loglik := func(l float64) float64 {
		for i, v := range x {
			y[i] = fam.forward(l, v)
		}
		s := moment.Of(y)
		if s.N != len(y) { // a transformed value overflowed to NaN
			return math.Inf(-1)
		}
		return -n/2*math.Log(s.M2/n) + (l-1)*jac
	}
	return argmax(loglik, LambdaMin, LambdaMax, 40, 1e-10)
}

func (p PowerParams) mapperOf(fam powerFamily, op string, inverse bool) (*mapper, error) {
	if err := checkWidths(op, p.Columns, len(p.Lambda)); err != nil {
		return nil, err
	}
	if p.ZScore {
		if err := checkWidths(op, p.Columns, len(p.Mean), len(p.Std)); err != nil {
			return nil, err
		}
	}
	if err := p.OutOfDomain.check(op); err != nil {
		return nil, err
	}
	m := &mapper{op: op, names: p.Columns, funcs: make([]func(float64) float64, len(p.Columns)),
		domain: fam.domain, lenient: p.OutOfDomain == DomainMissing}
	if !inverse {
		m.sources = make([]func(w *tabprep.SourceWriter, x, y string), len(p.Columns))
	}
	for j := range m.funcs {
		l := p.Lambda[j]
		if math.IsNaN(l) || math.IsInf(l, 0) {
			return nil, tabprep.Errorf(op, tabprep.ErrOption, p.Columns[j], "lambda %v is not finite; refit the step", l)
		}
		z := affine{scale: 1}
		if p.ZScore {
			z = affine{center: p.Mean[j], scale: divisor(p.Std[j])}
		}
		if inverse {
			m.domain = fam.inverseDomain
			m.funcs[j] = func(y float64) float64 { return fam.backward(l, z.inverse(y)) }
		} else {
			m.funcs[j] = func(x float64) float64 { return z.at(fam.forward(l, x)) }
			m.sources[j] = func(w *tabprep.SourceWriter, x, y string) {
				fam.source(w, l, x, y)
				z.source(w, y, y)
			}
		}
	}
	return m, nil
}

var (
	_ tabprep.Step[PowerParams]      = BoxCox{}
	_ tabprep.Inverter[PowerParams]  = BoxCox{}
	_ tabprep.RowKernel[PowerParams] = BoxCox{}
	_ tabprep.Step[PowerParams]      = YeoJohnson{}
	_ tabprep.Inverter[PowerParams]  = YeoJohnson{}
	_ tabprep.RowKernel[PowerParams] = YeoJohnson{}
)
