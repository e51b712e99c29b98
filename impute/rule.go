package impute

import (
	"math"
	"slices"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/moment"
	"github.com/tabprep/tabprep/internal/quantile"
	"github.com/tabprep/tabprep/state"
)

// Stat names how a fill value is learned from the train rows.
type Stat string

// The statistics a [Rule] can ask for.
const (
	// StatKeep leaves the column's gaps as they are; a rule by name can use
	// it to exempt one column from a rule by pattern or kind.
	StatKeep Stat = "keep"
	// StatMean is the arithmetic mean of the present values (numeric only).
	StatMean Stat = "mean"
	// StatMedian is the Hyndman & Fan type 7 median (numeric only).
	StatMedian Stat = "median"
	// StatQuantile is quantile P by Hyndman & Fan type Method (numeric only).
	StatQuantile Stat = "quantile"
	// StatMin is the smallest present value (numeric only).
	StatMin Stat = "min"
	// StatMax is the largest present value (numeric only).
	StatMax Stat = "max"
	// StatMode is the mode: the most frequent value or level; ties go to the
	// smallest number, or the level first in byte order.
	StatMode Stat = "mode"
	// StatConstant is Rule.Number for numeric columns and Rule.Level for
	// categorical ones.
	StatConstant Stat = "constant"
)

// Rule says how to fill one column. The zero Rule (empty Stat) is no rule:
// the decision falls to the next, more general, level of a [Fill].
type Rule struct {
	Stat Stat `json:"stat"`
	// P is the quantile, in [0, 1], for StatQuantile.
	P state.Float `json:"p,omitempty"`
	// Method is the Hyndman & Fan quantile type for StatQuantile: 7 (the
	// default when 0) or 6.
	Method int `json:"method,omitempty"`
	// Number is the StatConstant fill of a numeric column.
	Number *state.Float `json:"number,omitempty"`
	// Level is the StatConstant fill of a categorical column.
	Level *string `json:"level,omitempty"`
}

// ConstantNumber returns a rule that fills a numeric column with v.
func ConstantNumber(v float64) Rule {
	f := state.Float(v)
	return Rule{Stat: StatConstant, Number: &f}
}

// ConstantLevel returns a rule that fills a categorical column with level.
func ConstantLevel(level string) Rule {
	return Rule{Stat: StatConstant, Level: &level}
}

// Quantile returns a rule that fills with quantile p by Hyndman & Fan type
// m (6 or 7).
func Quantile(p float64, m int) Rule {
	return Rule{Stat: StatQuantile, P: state.Float(p), Method: m}
}

// ColumnFill is the fitted decision for one column.
type ColumnFill struct {
	Name string       `json:"name"`
	Kind tabprep.Kind `json:"kind"`
	// Stat is the statistic that gave the fill value.
	Stat Stat `json:"stat"`
	// From says which rule decided: "name", "pattern <glob>", "kind", or
	// "step" for a single-statistic step.
	From string `json:"from"`
	// Number is the fill of a numeric column.
	Number state.Float `json:"number"`
	// Level is the fill of a categorical column.
	Level string `json:"level,omitempty"`
	// Gaps is the number of missing cells in the train rows.
	Gaps int `json:"gaps"`
}

// fitRule learns the fill value of c under r.
func fitRule(op string, c *tabprep.Column, r Rule, from string) (ColumnFill, error) {
	out := ColumnFill{Name: c.Name(), Kind: c.Kind(), Stat: r.Stat, From: from, Gaps: c.MissingCount()}
	name := c.Name()
	switch r.Stat {
	case StatKeep:
		return out, nil
	case StatConstant:
		return constantFill(op, c, r, out)
	case StatMean, StatMedian, StatQuantile, StatMin, StatMax:
		if c.Kind() != tabprep.Numeric {
			return out, tabprep.Errorf(op, tabprep.ErrKind, name, "%s needs a numeric column, this one is categorical; use mode or constant", r.Stat)
		}
	case StatMode:
	case "":
		return out, tabprep.Errorf(op, tabprep.ErrOption, name, "rule has no stat; set Stat (e.g. %q)", StatMedian)
	default:
		return out, tabprep.Errorf(op, tabprep.ErrOption, name, "unknown stat %q; use mean, median, quantile, min, max, mode, constant or keep", r.Stat)
	}
	if out.Gaps == c.Len() {
		return out, tabprep.Errorf(op, tabprep.ErrAllMissing, name, "no value in the %d train rows to compute the %s from; give this column a constant rule or drop it (impute.DropSparse)", c.Len(), r.Stat)
	}
	if c.Kind() == tabprep.Categorical {
		out.Level = mostFrequentLevel(c)
		return out, nil
	}
	v, err := numericStat(op, c, r)
	out.Number = state.Float(v)
	return out, err
}

func constantFill(op string, c *tabprep.Column, r Rule, out ColumnFill) (ColumnFill, error) {
	name := c.Name()
	if c.Kind() == tabprep.Numeric {
		if r.Level != nil {
			return out, tabprep.Errorf(op, tabprep.ErrKind, name, "constant level %q given for a numeric column; give Number (impute.ConstantNumber)", *r.Level)
		}
		if r.Number == nil {
			return out, tabprep.Errorf(op, tabprep.ErrOption, name, "constant rule without Number; use impute.ConstantNumber")
		}
		if v := float64(*r.Number); math.IsNaN(v) || math.IsInf(v, 0) {
			return out, tabprep.Errorf(op, tabprep.ErrValue, name, "constant %v is not finite; a fill must be a number", v)
		}
		out.Number = *r.Number
		return out, nil
	}
	if r.Number != nil {
		return out, tabprep.Errorf(op, tabprep.ErrKind, name, "constant number %v given for a categorical column; give Level (impute.ConstantLevel)", float64(*r.Number))
	}
	if r.Level == nil || *r.Level == "" {
		return out, tabprep.Errorf(op, tabprep.ErrOption, name, "constant rule without a non-empty Level; use impute.ConstantLevel(\"unknown\")")
	}
	out.Level = *r.Level
	return out, nil
}

// numericStat computes r over the present values of c, which has at least
// one.
func numericStat(op string, c *tabprep.Column, r Rule) (float64, error) {
	x := c.Float64s()
	switch r.Stat {
	case StatMean:
		return moment.Of(x).Mean, nil
	case StatMedian:
		return quantile.Of(quantile.DropNaN(x), 0.5, quantile.Type7), nil
	case StatQuantile:
		p := float64(r.P)
		if !(p >= 0 && p <= 1) {
			return 0, tabprep.Errorf(op, tabprep.ErrOption, c.Name(), "quantile p = %v outside [0, 1]", p)
		}
		m := quantile.Method(r.Method)
		switch m {
		case 0:
			m = quantile.Type7
		case quantile.Type6, quantile.Type7:
		default:
			return 0, tabprep.Errorf(op, tabprep.ErrOption, c.Name(), "quantile method %d; use 7 (default) or 6", r.Method)
		}
		return quantile.Of(quantile.DropNaN(x), p, m), nil
	case StatMin, StatMax:
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, v := range x {
			if v == v {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
		if r.Stat == StatMin {
			return lo, nil
		}
		return hi, nil
	}
	return mostFrequentNumber(x), nil
}

// mostFrequentNumber returns the most frequent present value of x; ties go
// to the smallest. 0 and −0 count as one value.
func mostFrequentNumber(x []float64) float64 {
	counts := make(map[float64]int)
	for _, v := range x {
		if v == v {
			counts[v]++
		}
	}
	best, bestN := math.Inf(1), 0
	for v, n := range counts {
		if n > bestN || (n == bestN && v < best) {
			best, bestN = v, n
		}
	}
	return best
}

// mostFrequentLevel returns the most frequent level of c; ties go to the
// level first in byte order.
func mostFrequentLevel(c *tabprep.Column) string {
	levels := c.Levels()
	counts := make([]int, len(levels))
	for _, k := range c.Codes() {
		if k != tabprep.MissingCode {
			counts[k]++
		}
	}
	best := -1
	for k, n := range counts {
		if n == 0 {
			continue
		}
		if best < 0 || n > counts[best] || (n == counts[best] && levels[k] < levels[best]) {
			best = k
		}
	}
	return levels[best]
}

// withLevel returns levels with level appended if it is not there, and the
// code of level.
func withLevel(levels []string, level string) ([]string, int32) {
	if k := slices.Index(levels, level); k >= 0 {
		return levels, int32(k)
	}
	return append(slices.Clone(levels), level), int32(len(levels))
}
