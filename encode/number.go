package encode

import (
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// ParseNumber replaces each selected categorical column by a numeric column
// of the same name, parsing each distinct level once. A number is an
// optional sign, digits with at most one decimal separator, and an optional
// exponent (e or E, optional sign, digits). The thousands separator, if set,
// may appear only in the integer part, between groups of exactly three
// digits after a first group of one to three ("1,234,567"). With Percent a
// trailing "%" divides the value by 100; with Trim spaces (as Unicode
// defines them, no-break spaces included) around the number, and before a
// percent sign, are ignored. The digits are then read by the standard
// library's strconv.ParseFloat, so the value is correctly rounded.
//
// A cell that does not parse becomes missing or is an error, by Bad; the
// fitted parameters count the bad train cells and list the first few, with
// their rows. At Fit, a train level that does not parse under the chosen
// separators but does under the swapped ones ("1.234,5" with Decimal ".") is
// an error wrapping [ErrAmbiguous], whatever Bad says: the column is then
// likely written in the other convention.
type ParseNumber struct {
	// Columns selects categorical columns; the zero value selects all.
	Columns tabprep.Selection `json:"columns"`
	// Decimal is the decimal separator, one character; "" means ".".
	Decimal string `json:"decimal,omitempty"`
	// Thousands is the digit-group separator, one character; "" means none.
	Thousands string `json:"thousands,omitempty"`
	// Percent accepts a trailing percent sign, dividing by 100.
	Percent bool `json:"percent,omitempty"`
	// Trim ignores surrounding spaces.
	Trim bool `json:"trim,omitempty"`
	// Bad is the policy for a cell that does not parse; "" means BadMissing.
	Bad OnBad `json:"bad,omitempty"`
}

// ParseNumberParams are the fitted reports of a [ParseNumber] step.
type ParseNumberParams struct {
	Columns []ParseReport `json:"columns"`
}

func init() { state.Register(ParseNumber{}) }

// Kind returns "encode.parsenumber".
func (ParseNumber) Kind() string { return "encode.parsenumber" }

// Outputs returns the names of the columns the step writes: the source
// names, replaced in place.
func (p ParseNumberParams) Outputs() []string {
	return sourceNames(p.Columns, func(c ParseReport) string { return c.Name })
}

// numberFormat is a checked set of separators.
type numberFormat struct {
	decimal, thousands string
	percent, trim      bool
}

func (s ParseNumber) format(op string) (numberFormat, error) {
	f := numberFormat{decimal: s.Decimal, thousands: s.Thousands, percent: s.Percent, trim: s.Trim}
	if f.decimal == "" {
		f.decimal = "."
	}
	if err := checkOption(op, "Bad", s.Bad, "", BadMissing, BadError); err != nil {
		return f, err
	}
	for _, sep := range []string{f.decimal, f.thousands} {
		if sep == "" {
			continue
		}
		r, size := utf8.DecodeRuneInString(sep)
		if size != len(sep) || r == utf8.RuneError || strings.ContainsRune("0123456789+-eE%", r) {
			return f, tabprep.Errorf(op, tabprep.ErrOption, "", "separator %q: use one character that is not a digit, sign, e, E or %%", sep)
		}
	}
	if f.decimal == f.thousands {
		return f, tabprep.Errorf(op, ErrAmbiguous, "", "decimal and thousands separators are both %q; a number such as \"1%s234\" would read two ways: choose different separators", f.decimal, f.decimal)
	}
	return f, nil
}

// swapped returns the other common convention: the separators exchanged, or
// with no thousands separator the other of "." and ",".
func (f numberFormat) swapped() numberFormat {
	g := f
	g.decimal, g.thousands = f.thousands, f.decimal
	if g.decimal == "" {
		g.decimal = ","
		if f.decimal == "," {
			g.decimal = "."
		}
	}
	return g
}

func allDigits(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] < '0' || s[i] > '9' {
			return false
		}
	}
	return true
}

// parse reads s in format f.
func (f numberFormat) parse(s string) (float64, bool) {
	if f.trim {
		s = strings.TrimSpace(s)
	}
	pct := false
	if f.percent {
		if t, cut := strings.CutSuffix(s, "%"); cut {
			pct = true
			s = t
			if f.trim {
				s = strings.TrimRightFunc(s, unicode.IsSpace)
			}
		}
	}
	text := s
	sign := ""
	if s != "" && (s[0] == '+' || s[0] == '-') {
		sign, s = s[:1], s[1:]
	}
	mant, exp := s, ""
	i := strings.IndexAny(s, "eE")
	if i >= 0 {
		mant, exp = s[:i], s[i+1:]
		e := exp
		if e != "" && (e[0] == '+' || e[0] == '-') {
			e = e[1:]
		}
		if e == "" || !allDigits(e) {
			return 0, false
		}
	}
	whole, frac, hasDec := strings.Cut(mant, f.decimal)
	if !allDigits(frac) || whole == "" && frac == "" {
		return 0, false
	}
	grouped := f.thousands != "" && strings.Contains(whole, f.thousands)
	if grouped {
		// Group by group with Cut rather than Split, which would allocate
		// the list of groups.
		rest := whole
		for n := 0; ; n++ {
			g, tail, more := strings.Cut(rest, f.thousands)
			if !allDigits(g) || n == 0 && (len(g) < 1 || len(g) > 3) || n > 0 && len(g) != 3 {
				return 0, false
			}
			if !more {
				break
			}
			rest = tail
		}
	} else if !allDigits(whole) {
		return 0, false
	}
	// A number in the standard form (decimal point, no groups) is handed
	// to strconv as it is, with no copy; any other is rewritten into it.
	if grouped || f.decimal != "." {
		var buf [64]byte
		b := append(buf[:0], sign...)
		if grouped {
			for g := range strings.SplitSeq(whole, f.thousands) {
				b = append(b, g...)
			}
		} else {
			b = append(b, whole...)
		}
		if hasDec {
			b = append(b, '.')
			b = append(b, frac...)
		}
		if i >= 0 {
			b = append(b, 'e')
			b = append(b, exp...)
		}
		text = string(b)
	}
	v, err := strconv.ParseFloat(text, 64)
	if err != nil {
		return 0, false
	}
	if pct {
		v /= 100
	}
	return v, true
}

// Fit parses the train cells of each selected column and reports the bad
// ones.
func (s ParseNumber) Fit(train *tabprep.Frame) (ParseNumberParams, error) {
	const op = "encode.parsenumber fit"
	names, err := resolve[struct{}](op, train, s.Columns, tabprep.Categorical, "", nil)
	if err != nil {
		return ParseNumberParams{}, err
	}
	f, err := s.format(op)
	if err != nil {
		return ParseNumberParams{}, err
	}
	alt := f.swapped()
	var p ParseNumberParams
	for _, name := range names {
		c, _ := train.Column(name)
		for k, l := range c.Levels() {
			if _, ok := f.parse(l); ok {
				continue
			}
			if _, ok := alt.parse(l); ok {
				return ParseNumberParams{}, tabprep.Errorf(op, ErrAmbiguous, name,
					"%q does not parse with decimal %q and thousands %q but does with decimal %q and thousands %q; set Decimal and Thousands to the column's convention",
					l, f.decimal, f.thousands, alt.decimal, alt.thousands).AtRow(firstRowOf(c, int32(k)))
			}
		}
		_, rep, err := parseColumn(op, c, 1, s.Bad, "a number in the chosen format", f.parseInto)
		if err != nil {
			return ParseNumberParams{}, err
		}
		p.Columns = append(p.Columns, rep)
	}
	return p, nil
}

func (f numberFormat) parseInto(level string, dst []float64) bool {
	v, ok := f.parse(level)
	dst[0] = v
	return ok
}

// Transform replaces each fitted column by its parsed values. It does not
// modify data.
func (s ParseNumber) Transform(p ParseNumberParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	const op = "encode.parsenumber transform"
	f, err := s.format(op)
	if err != nil {
		return nil, err
	}
	return parseEach(op, data, p.Columns, func(c *tabprep.Column) ([]*tabprep.Column, error) {
		vals, _, err := parseColumn(op, c, 1, s.Bad, "a number in the chosen format", f.parseInto)
		if err != nil {
			return nil, err
		}
		return []*tabprep.Column{tabprep.AdoptNumeric(c.Name(), vals)}, nil
	})
}

// RowKernel returns a row function that writes the same cells as
// [ParseNumber.Transform]. A level of the layout was parsed when the kernel
// was made and is looked up by its code; any other string is parsed in the
// row without allocating: strconv.ParseFloat reads a number in the
// standard form (decimal point, no digit groups) in place, and one written
// with other separators after it is rewritten on the stack; only such a
// rewritten number of over 32 bytes allocates its copy.
// A bad cell is missing, or under BadError an error wrapping [ErrBadCell].
func (s ParseNumber) RowKernel(p ParseNumberParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return s.table(p).kernel(l)
}

// RowSource writes the row kernel as Go source, for generated plans: the
// layout's levels become constants, and a text first met in the row is
// left to the interpreted plan to parse.
func (s ParseNumber) RowSource(p ParseNumberParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return s.table(p).source(l, w)
}

func (s ParseNumber) table(p ParseNumberParams) tableStep {
	const op = "encode.parsenumber row"
	f, err := s.format(op)
	if err != nil {
		return tableStep{err: err}
	}
	sources := sourceNames(p.Columns, func(c ParseReport) string { return c.Name })
	fields := numericFields(sources, func(s string) []string { return []string{s} })
	unseen := func(level string, out []tabprep.Cell) bool {
		v, ok := f.parse(level)
		out[0].Num = v
		return ok
	}
	return tableStep{op: op, sources: sources, fields: fields, bad: s.Bad, what: "a number in the chosen format", build: func(_ int, levels []string) tableColumn {
		return parseTable(levels, 1, f.parseInto, unseen)
	}}
}

var (
	_ tabprep.RowKernel[ParseNumberParams] = ParseNumber{}
	_ tabprep.RowSource[ParseNumberParams] = ParseNumber{}
)
