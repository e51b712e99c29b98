package scale

import (
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

func init() {
	state.Register(Log{})
	state.Register(Log1p{})
}

// Log replaces each chosen numeric column by its natural logarithm, which
// pulls in a long right tail. Its domain is x > 0: zero and negative values
// are errors naming the column, row and value, at fit for train rows and at
// transform for new ones, unless OutOfDomain is [DomainMissing], which
// makes them missing cells. For data with zeros, see [Log1p]; for any sign,
// [YeoJohnson]. The inverse is exp, whose overflow (above about 709.78) is
// handled by the same rule.
type Log struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// OutOfDomain says what to do with a value ≤ 0.
	OutOfDomain DomainRule `json:"out_of_domain,omitempty"`
}

// Log1p replaces each chosen numeric column by ln(1 + x), computed without
// the loss of accuracy near 0 that ln(1 + x) would suffer. Counts and other
// data with zeros are the common use. Its domain is x > −1; other values
// are handled as for [Log]. The inverse is exp(y) − 1.
type Log1p struct {
	// Columns chooses the numeric columns; the zero value chooses all.
	Columns tabprep.Selection `json:"columns"`
	// OutOfDomain says what to do with a value ≤ −1.
	OutOfDomain DomainRule `json:"out_of_domain,omitempty"`
}

// LogParams is what [Log] and [Log1p] fix at fit: the columns and the rule
// for values out of domain. Nothing is learned from the values.
type LogParams struct {
	Columns     []string   `json:"columns"`
	OutOfDomain DomainRule `json:"out_of_domain,omitempty"`
}

// Kind returns "scale.log".
func (Log) Kind() string { return "scale.log" }

// Kind returns "scale.log1p".
func (Log1p) Kind() string { return "scale.log1p" }

// logFamily is what tells Log and Log1p apart.
type logFamily struct {
	forward, backward func(float64) float64
	domain, range_    string
	source            string // forward as a Go function name, for generated plans
}

var (
	natural = logFamily{math.Log, math.Exp, "log needs x > 0", "exp overflows above 709.78", "math.Log"}
	plusOne = logFamily{math.Log1p, math.Expm1, "log1p needs x > −1", "expm1 overflows above 709.78", "math.Log1p"}
)

func fitLog(kind string, fam logFamily, sel tabprep.Selection, rule DomainRule, train *tabprep.Frame) (LogParams, error) {
	op := opName(kind, "fit")
	if err := rule.check(op); err != nil {
		return LogParams{}, err
	}
	names, _, err := fitColumns(op, train, sel)
	if err != nil {
		return LogParams{}, err
	}
	p := LogParams{Columns: names, OutOfDomain: rule}
	m, err := p.mapperOf(fam, op, false)
	if err != nil {
		return LogParams{}, err
	}
	if err := m.check(train); err != nil {
		return LogParams{}, err
	}
	return p, nil
}

func (p LogParams) mapperOf(fam logFamily, op string, inverse bool) (*mapper, error) {
	if err := p.OutOfDomain.check(op); err != nil {
		return nil, err
	}
	m := &mapper{op: op, names: p.Columns, funcs: make([]func(float64) float64, len(p.Columns)),
		domain: fam.domain, lenient: p.OutOfDomain == DomainMissing}
	f := fam.forward
	if inverse {
		f, m.domain = fam.backward, fam.range_
	} else {
		m.sources = make([]func(w *tabprep.SourceWriter, x, y string), len(p.Columns))
		for j := range m.sources {
			m.sources[j] = func(w *tabprep.SourceWriter, x, y string) { w.Line("%s = %s(%s)", y, fam.source, x) }
		}
	}
	for j := range m.funcs {
		m.funcs[j] = f
	}
	return m, nil
}

// logOf and log1pOf bind LogParams to a family for the shared helpers.
type logOf LogParams
type log1pOf LogParams

func (p logOf) mapper(op string, inverse bool) (*mapper, error) {
	return LogParams(p).mapperOf(natural, op, inverse)
}

func (p log1pOf) mapper(op string, inverse bool) (*mapper, error) {
	return LogParams(p).mapperOf(plusOne, op, inverse)
}

// Fit checks the chosen columns of train: each must have a value, and every
// value must be in the domain (x > 0) unless OutOfDomain is DomainMissing.
func (s Log) Fit(train *tabprep.Frame) (LogParams, error) {
	return fitLog(s.Kind(), natural, s.Columns, s.OutOfDomain, train)
}

// Transform returns data with each fitted column replaced by its logarithm.
func (s Log) Transform(p LogParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return transform(s.Kind(), logOf(p), data)
}

// Inverse returns data with each fitted column replaced by its exponential.
func (s Log) Inverse(p LogParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return invert(s.Kind(), logOf(p), data)
}

// RowKernel returns the logarithm of one row, for rows laid out by l.
func (s Log) RowKernel(p LogParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return rowKernel(s.Kind(), logOf(p), l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s Log) RowSource(p LogParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return rowSource(s.Kind(), logOf(p), l, w)
}

// Fit checks the chosen columns of train: each must have a value, and every
// value must be in the domain (x > −1) unless OutOfDomain is DomainMissing.
func (s Log1p) Fit(train *tabprep.Frame) (LogParams, error) {
	return fitLog(s.Kind(), plusOne, s.Columns, s.OutOfDomain, train)
}

// Transform returns data with each fitted column replaced by ln(1 + x).
func (s Log1p) Transform(p LogParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return transform(s.Kind(), log1pOf(p), data)
}

// Inverse returns data with each fitted column replaced by exp(y) − 1.
func (s Log1p) Inverse(p LogParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	return invert(s.Kind(), log1pOf(p), data)
}

// RowKernel returns ln(1 + x) of one row, for rows laid out by l.
func (s Log1p) RowKernel(p LogParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return rowKernel(s.Kind(), log1pOf(p), l)
}

// RowSource writes the row kernel as Go source, for generated plans.
func (s Log1p) RowSource(p LogParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return rowSource(s.Kind(), log1pOf(p), l, w)
}

var (
	_ tabprep.Step[LogParams]      = Log{}
	_ tabprep.Inverter[LogParams]  = Log{}
	_ tabprep.RowKernel[LogParams] = Log{}
	_ tabprep.Step[LogParams]      = Log1p{}
	_ tabprep.Inverter[LogParams]  = Log1p{}
	_ tabprep.RowKernel[LogParams] = Log1p{}
)
