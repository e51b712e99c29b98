package encode

import (
	"time"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// TimePart is a number [ParseTime] takes from a time.
type TimePart string

// The parts of a time. Calendar parts are those of the time in its
// location: the zone the cell states, or else [ParseTime.Location].
const (
	// PartUnix is seconds since 1970-01-01 UTC, with the fraction.
	PartUnix TimePart = "unix"
	// PartYear is the year, such as 2024.
	PartYear TimePart = "year"
	// PartMonth is the month, 1 to 12.
	PartMonth TimePart = "month"
	// PartDay is the day of the month, 1 to 31.
	PartDay TimePart = "day"
	// PartWeekday is the day of the week, 0 (Sunday) to 6 (Saturday).
	PartWeekday TimePart = "weekday"
	// PartYearDay is the day of the year, 1 to 366.
	PartYearDay TimePart = "yearday"
	// PartHour is the hour, 0 to 23.
	PartHour TimePart = "hour"
	// PartMinute is the minute, 0 to 59.
	PartMinute TimePart = "minute"
	// PartSecond is the second, 0 to 59.
	PartSecond TimePart = "second"
)

var timeParts = []TimePart{PartUnix, PartYear, PartMonth, PartDay, PartWeekday, PartYearDay, PartHour, PartMinute, PartSecond}

func (p TimePart) of(t time.Time) float64 {
	switch p {
	case PartYear:
		return float64(t.Year())
	case PartMonth:
		return float64(t.Month())
	case PartDay:
		return float64(t.Day())
	case PartWeekday:
		return float64(t.Weekday())
	case PartYearDay:
		return float64(t.YearDay())
	case PartHour:
		return float64(t.Hour())
	case PartMinute:
		return float64(t.Minute())
	case PartSecond:
		return float64(t.Second())
	}
	return float64(t.Unix()) + float64(t.Nanosecond())/1e9
}

// ParseTime turns each selected categorical column of dates or times into
// numbers, parsing each distinct level once with the standard library's
// time.ParseInLocation and Layout, written with Go's reference time
// ("2006-01-02 15:04"). With no Parts the column is replaced in place by
// Unix seconds; with Parts it is dropped and one column per part appended,
// named "<column>.<part>", such as "booked_on.weekday".
//
// A cell that does not parse becomes missing or is an error, by Bad; the
// fitted parameters count the bad train cells and list the first few.
type ParseTime struct {
	// Columns selects categorical columns; the zero value selects all.
	Columns tabprep.Selection `json:"columns"`
	// Layout is the time layout, required.
	Layout string `json:"layout"`
	// Location is the IANA zone of times without one; "" means UTC.
	Location string `json:"location,omitempty"`
	// Parts are the numbers to take; none means Unix seconds in place.
	Parts []TimePart `json:"parts,omitempty"`
	// Bad is the policy for a cell that does not parse; "" means BadMissing.
	Bad OnBad `json:"bad,omitempty"`
}

// ParseTimeParams are the fitted reports of a [ParseTime] step.
type ParseTimeParams struct {
	Columns []ParseReport `json:"columns"`
	// Parts are the parts written, in order; empty for Unix seconds in
	// place.
	Parts []TimePart `json:"parts,omitempty"`
}

func init() { state.Register(ParseTime{}) }

// Kind returns "encode.parsetime".
func (ParseTime) Kind() string { return "encode.parsetime" }

func (p ParseTimeParams) names(source string) []string {
	if len(p.Parts) == 0 {
		return []string{source}
	}
	out := make([]string, len(p.Parts))
	for i, part := range p.Parts {
		out[i] = source + "." + string(part)
	}
	return out
}

// Outputs returns the names of the columns the step writes, in order.
func (p ParseTimeParams) Outputs() []string {
	var out []string
	for _, c := range p.Columns {
		out = append(out, p.names(c.Name)...)
	}
	return out
}

func (s ParseTime) setup(op string) (*time.Location, error) {
	if s.Layout == "" {
		return nil, tabprep.Errorf(op, tabprep.ErrOption, "", "no Layout; give one in Go's reference time, such as \"2006-01-02 15:04\"")
	}
	if err := checkOption(op, "Bad", s.Bad, "", BadMissing, BadError); err != nil {
		return nil, err
	}
	seen := make(map[TimePart]bool, len(s.Parts))
	for _, part := range s.Parts {
		if err := checkOption(op, "part", part, timeParts...); err != nil {
			return nil, err
		}
		if seen[part] {
			return nil, tabprep.Errorf(op, tabprep.ErrOption, "", "part %q listed twice", part)
		}
		seen[part] = true
	}
	if s.Location == "" {
		return time.UTC, nil
	}
	loc, err := time.LoadLocation(s.Location)
	if err != nil {
		return nil, tabprep.Errorf(op, tabprep.ErrOption, "", "location %q: %v; use an IANA zone name such as \"Europe/Berlin\"", s.Location, err)
	}
	return loc, nil
}

// parts returns the parts p writes, Unix seconds when it names none.
func (p ParseTimeParams) parts() []TimePart {
	if len(p.Parts) == 0 {
		return []TimePart{PartUnix}
	}
	return p.Parts
}

// parser returns the parse of one level into the values of parts.
func (s ParseTime) parser(loc *time.Location, parts []TimePart) func(level string, dst []float64) bool {
	return func(level string, dst []float64) bool {
		t, err := time.ParseInLocation(s.Layout, level, loc)
		if err != nil {
			return false
		}
		for j, part := range parts {
			dst[j] = part.of(t)
		}
		return true
	}
}

func (s ParseTime) run(op string, p *ParseTimeParams, loc *time.Location, c *tabprep.Column) ([]*tabprep.Column, ParseReport, error) {
	parts := p.parts()
	block, rep, err := parseColumn(op, c, len(parts), s.Bad, "a time in layout "+s.Layout, s.parser(loc, parts))
	if err != nil {
		return nil, rep, err
	}
	return split(p.names(c.Name()), block, c.Len()), rep, nil
}

// Fit parses the train cells of each selected column and reports the bad
// ones.
func (s ParseTime) Fit(train *tabprep.Frame) (ParseTimeParams, error) {
	const op = "encode.parsetime fit"
	names, err := resolve[struct{}](op, train, s.Columns, tabprep.Categorical, "", nil)
	if err != nil {
		return ParseTimeParams{}, err
	}
	loc, err := s.setup(op)
	if err != nil {
		return ParseTimeParams{}, err
	}
	p := ParseTimeParams{Parts: s.Parts}
	for _, name := range names {
		c, _ := train.Column(name)
		_, rep, err := s.run(op, &p, loc, c)
		if err != nil {
			return ParseTimeParams{}, err
		}
		p.Columns = append(p.Columns, rep)
	}
	return p, nil
}

// Transform writes the numbers of each fitted column. It does not modify
// data.
func (s ParseTime) Transform(p ParseTimeParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	const op = "encode.parsetime transform"
	loc, err := s.setup(op)
	if err != nil {
		return nil, err
	}
	return parseEach(op, data, p.Columns, func(c *tabprep.Column) ([]*tabprep.Column, error) {
		cols, _, err := s.run(op, &p, loc, c)
		return cols, err
	})
}

// RowKernel returns a row function that writes the same cells as
// [ParseTime.Transform]. A level of the layout was parsed when the kernel
// was made and is looked up by its code; any other string is parsed in the
// row by time.ParseInLocation. That allocates nothing for a time that
// parses and carries no zone, the zone "Z", Location's offset or a
// whole-hour offset (zones the standard library keeps made); it allocates
// for another offset, such as +05:45 (a new fixed zone), and for a string
// that does not parse (its error value). A bad cell is missing, or under
// BadError an error wrapping [ErrBadCell].
func (s ParseTime) RowKernel(p ParseTimeParams, l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	return s.table(p).kernel(l)
}

// RowSource writes the row kernel as Go source, for generated plans: the
// layout's levels become constants, and a text first met in the row is
// left to the interpreted plan to parse.
func (s ParseTime) RowSource(p ParseTimeParams, l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	return s.table(p).source(l, w)
}

func (s ParseTime) table(p ParseTimeParams) tableStep {
	const op = "encode.parsetime row"
	loc, err := s.setup(op)
	if err != nil {
		return tableStep{err: err}
	}
	parts := p.parts()
	sources := sourceNames(p.Columns, func(c ParseReport) string { return c.Name })
	unseen := func(level string, out []tabprep.Cell) bool {
		t, err := time.ParseInLocation(s.Layout, level, loc)
		if err != nil {
			return false
		}
		for j, part := range parts {
			out[j].Num = part.of(t)
		}
		return true
	}
	parse := s.parser(loc, parts)
	return tableStep{op: op, sources: sources, fields: numericFields(sources, p.names), bad: s.Bad, what: "a time in layout " + s.Layout, build: func(_ int, levels []string) tableColumn {
		return parseTable(levels, len(parts), parse, unseen)
	}}
}

var (
	_ tabprep.RowKernel[ParseTimeParams] = ParseTime{}
	_ tabprep.RowSource[ParseTimeParams] = ParseTime{}
)
