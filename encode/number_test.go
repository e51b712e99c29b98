package encode_test

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
)

// localeCases are numbers written in the conventions of several locales
// (from memory of common usage), each with its canonical form. The Go
// standard library's strconv.ParseFloat of the canonical form is the
// reference value. An empty canonical form means the cell must not parse.
var localeCases = []struct {
	locale, cell       string
	decimal, thousands string
	percent, trim      bool
	canonical          string
}{
	{"en-US", "1,234,567.89", ".", ",", false, false, "1234567.89"},
	{"en-US", "-0.5", ".", ",", false, false, "-0.5"},
	{"en-US", "+42", ".", ",", false, false, "42"},
	{"en-US", ".25", ".", ",", false, false, ".25"},
	{"en-US", "7.", ".", ",", false, false, "7."},
	{"en-US", "1.5e-3", ".", ",", false, false, "1.5e-3"},
	{"en-US", "2E+10", ".", ",", false, false, "2E+10"},
	{"en-US", "12.5%", ".", ",", true, false, "12.5"}, // then / 100
	{"de-DE", "1.234.567,89", ",", ".", false, false, "1234567.89"},
	{"de-DE", "-0,75", ",", ".", false, false, "-0.75"},
	{"de-DE", "3,5 %", ",", ".", true, true, "3.5"}, // then / 100
	{"fr-FR", "1\u202f234\u202f567,89", ",", "\u202f", false, false, "1234567.89"},
	{"fr-FR", "\u00a012\u00a0345,6 ", ",", "\u00a0", false, true, "12345.6"},
	{"de-CH", "1'234'567.89", ".", "'", false, false, "1234567.89"},
	{"plain", "  98.6\t", ".", "", false, true, "98.6"},
	{"plain", "0.1", ".", "", false, false, "0.1"},
	{"plain", "123456789012345678901234567890", ".", "", false, false, "123456789012345678901234567890"},
	// Cells that must not parse.
	{"en-IN lakh grouping is not accepted", "12,34,567.89", ".", ",", false, false, ""},
	{"bad grouping", "1,23.4", ".", ",", false, false, ""},
	{"group too long", "1234,567", ".", ",", false, false, ""},
	{"two decimals", "1.2.3", ".", "", false, false, ""},
	{"space without trim", " 5", ".", "", false, false, ""},
	{"percent not enabled", "5%", ".", "", false, false, ""},
	{"double sign", "--1", ".", "", false, false, ""},
	{"text", "n/a", ".", "", false, false, ""},
	{"nan word", "NaN", ".", "", false, false, ""},
	{"infinity word", "Inf", ".", "", false, false, ""},
	{"lone separator", ".", ".", "", false, false, ""},
	{"empty exponent", "1e", ".", "", false, false, ""},
	{"overflow", "1e400", ".", "", false, false, ""},
	{"thousands in fraction", "1.234,5", ".", ",", false, false, ""},
}

// TestParseNumberLocales checks parsing against the Go standard library's
// strconv.ParseFloat (the reference) on a table of locale formats.
func TestParseNumberLocales(t *testing.T) {
	for _, tc := range localeCases {
		t.Run(tc.locale+" "+tc.cell, func(t *testing.T) {
			s := encode.ParseNumber{Decimal: tc.decimal, Thousands: tc.thousands, Percent: tc.percent, Trim: tc.trim}
			got, ok, err := encode.ParseNumberText(s, tc.cell)
			require.NoError(t, err)
			if tc.canonical == "" {
				require.False(t, ok, "parsed to %v", got)
				return
			}
			require.True(t, ok)
			want, err := strconv.ParseFloat(tc.canonical, 64)
			require.NoError(t, err)
			if tc.percent {
				want /= 100
			}
			require.Equal(t, math.Float64bits(want), math.Float64bits(got))
		})
	}
}

func TestParseNumberStep(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewCategorical("distance_km", []string{"1.234,5", "12", "", "weit", "0,5", "weit", "?"}),
		tabprep.NewCategorical("reminder", []string{"sms", "call", "sms", "none", "sms", "call", "sms"}),
	)
	s := encode.ParseNumber{Columns: tabprep.Names("distance_km"), Decimal: ",", Thousands: "."}
	p, err := s.Fit(train)
	require.NoError(t, err)
	require.Equal(t, encode.ParseReport{Name: "distance_km", BadCells: 3, Samples: []encode.BadCell{{Row: 3, Value: "weit"}, {Row: 5, Value: "weit"}, {Row: 6, Value: "?"}}}, p.Columns[0])

	data := tabprep.MustFrame(
		tabprep.NewCategorical("distance_km", []string{"2,25", "", "x", "1.000"}),
		tabprep.NewCategorical("reminder", []string{"sms", "sms", "sms", "sms"}),
	)
	out := roundTrip(t, pipeline.Use(s), train, data)
	got := column(t, out, "distance_km")
	require.Equal(t, 2.25, got[0])
	require.True(t, math.IsNaN(got[1]) && math.IsNaN(got[2]))
	require.Equal(t, 1000.0, got[3])
	require.Equal(t, []string{"distance_km", "reminder"}, out.Names())

	strict := s
	strict.Bad = encode.BadError
	_, err = strict.Fit(train)
	require.ErrorIs(t, err, encode.ErrBadCell)
	require.EqualError(t, err, `encode.parsenumber fit: column "distance_km": row 3: "weit" is not a number in the chosen format; fix the cell, adjust the format options, or set Bad to "missing"`)
	_, err = strict.Transform(p, data)
	require.ErrorContains(t, err, `row 2: "x" is not a number`)
}

func TestParseNumberErrors(t *testing.T) {
	train := tabprep.MustFrame(
		tabprep.NewCategorical("distance_km", []string{"3.5", "1.234,5"}),
		tabprep.NewNumeric("pet_age", []float64{1, 2}),
	)
	tests := []struct {
		name string
		step encode.ParseNumber
		want error
		msg  string
	}{
		{"ambiguous under the chosen separators", encode.ParseNumber{Columns: tabprep.Names("distance_km"), Thousands: ","}, encode.ErrAmbiguous,
			`column "distance_km": row 1: "1.234,5" does not parse with decimal "." and thousands "," but does with decimal "," and thousands "."`},
		{"same separators", encode.ParseNumber{Decimal: ",", Thousands: ","}, encode.ErrAmbiguous, `decimal and thousands separators are both ","`},
		{"separator too long", encode.ParseNumber{Thousands: "::"}, tabprep.ErrOption, `separator "::"`},
		{"digit separator", encode.ParseNumber{Decimal: "0"}, tabprep.ErrOption, `separator "0"`},
		{"numeric column", encode.ParseNumber{Columns: tabprep.Names("pet_age")}, tabprep.ErrKind, `column "pet_age"`},
		{"unknown column", encode.ParseNumber{Columns: tabprep.Names("weight")}, tabprep.ErrNoColumn, `column "weight"`},
		{"bad policy", encode.ParseNumber{Bad: "skip"}, tabprep.ErrOption, `Bad "skip"`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := tt.step.Fit(train)
			require.ErrorIs(t, err, tt.want)
			require.ErrorContains(t, err, tt.msg)
		})
	}
	require.ErrorIs(t, encode.ErrAmbiguous, tabprep.ErrValue)
}

// FuzzParseNumber: whatever the cell, parsing returns without panic, and a
// cell that parses agrees with strconv.ParseFloat (the reference) on its
// canonical form: thousands separators removed, the decimal separator
// made ".", spaces and the percent sign handled as documented.
func FuzzParseNumber(f *testing.F) {
	for _, tc := range localeCases {
		f.Add(tc.cell, tc.decimal == ",")
	}
	f.Fuzz(func(t *testing.T, cell string, comma bool) {
		if len(cell) > 64 {
			return
		}
		s := encode.ParseNumber{Decimal: ".", Thousands: ",", Percent: true, Trim: true}
		if comma {
			s.Decimal, s.Thousands = ",", "."
		}
		got, ok, err := encode.ParseNumberText(s, cell)
		require.NoError(t, err)
		if !ok {
			return
		}
		c := strings.TrimSpace(cell)
		pct := strings.HasSuffix(c, "%")
		c = strings.TrimSpace(strings.TrimSuffix(c, "%"))
		c = strings.ReplaceAll(c, s.Thousands, "")
		c = strings.ReplaceAll(c, s.Decimal, ".")
		want, err := strconv.ParseFloat(c, 64)
		require.NoError(t, err, "canonical %q of %q", c, cell)
		if pct {
			want /= 100
		}
		require.Equal(t, math.Float64bits(want), math.Float64bits(got), "cell %q", cell)
	})
}

// TestParseNumberRoundTrip is a property check: a float formatted by
// strconv and then written with German separators parses back to itself.
func TestParseNumberRoundTrip(t *testing.T) {
	s := encode.ParseNumber{Decimal: ",", Thousands: "."}
	for _, v := range []float64{0, 1, -1, 1234567.125, 0.1, 1e-7, 987654321.5, math.MaxInt32} {
		txt := strconv.FormatFloat(v, 'f', -1, 64)
		whole, frac, _ := strings.Cut(txt, ".")
		sign := ""
		if strings.HasPrefix(whole, "-") {
			sign, whole = "-", whole[1:]
		}
		var groups []string
		for len(whole) > 3 {
			groups = append([]string{whole[len(whole)-3:]}, groups...)
			whole = whole[:len(whole)-3]
		}
		cell := sign + strings.Join(append([]string{whole}, groups...), ".")
		if frac != "" {
			cell += "," + frac
		}
		got, ok, err := encode.ParseNumberText(s, cell)
		require.NoError(t, err)
		require.True(t, ok, cell)
		require.Equal(t, v, got, cell)
	}
}

// distances holds numbers as text, with a bad train cell ("n/a").
func distances(cells ...string) *tabprep.Frame {
	return tabprep.MustFrame(
		tabprep.NewCategorical("distance_km", cells),
		tabprep.NewNumeric("no_show", make([]float64, len(cells))),
	)
}

func TestParseNumberRowKernel(t *testing.T) {
	train := distances("1,234.5", "12", "", "n/a", "3.5%", "0.75")
	// Unseen strings, good and bad, parsed in the row; seen ones, good and
	// bad, looked up; a missing cell.
	fresh := distances("7.25", " 2,500 ", "x", "", "12", "n/a", "-1e3", "1,23")
	s := encode.ParseNumber{Columns: tabprep.Names("distance_km"), Thousands: ",", Percent: true, Trim: true}
	steptest.RowsMatch(t, train, fresh, pipeline.Use(s))

	t.Run("bad cell error", func(t *testing.T) {
		s := encode.ParseNumber{Bad: encode.BadError, Columns: tabprep.Names("distance_km")}
		good := distances("1.5", "12", "")
		p, err := s.Fit(good)
		require.NoError(t, err)
		_, batchErr := s.Transform(p, distances("x"))
		require.ErrorIs(t, batchErr, encode.ErrBadCell)
		fn, err := kernelOf(s, p, good.Schema())
		require.NoError(t, err)
		err = fn([]tabprep.Cell{{Str: "x"}, {Num: 0}})
		require.ErrorIs(t, err, encode.ErrBadCell)
		require.ErrorContains(t, err, `"x"`)
		require.NoError(t, fn([]tabprep.Cell{{Str: "2.5"}, {Num: 0}}))
	})
	t.Run("options", func(t *testing.T) {
		_, err := kernelOf(encode.ParseNumber{Decimal: "9"}, encode.ParseNumberParams{}, train.Schema())
		require.ErrorIs(t, err, tabprep.ErrOption)
	})
}

// TestParseNumberRowKernelLong checks the documented allocation bounds: an
// unseen number in the standard form of any length does not allocate, nor
// does a rewritten one of up to 32 bytes; a longer rewritten one gives the
// batch value.
func TestParseNumberRowKernelLong(t *testing.T) {
	s := encode.ParseNumber{Columns: tabprep.Names("distance_km"), Thousands: ","}
	train := distances("1.5")
	p, err := s.Fit(train)
	require.NoError(t, err)
	run, out, err := steptest.Compile(s.RowKernel, p, train.Schema())
	require.NoError(t, err)
	standard := "0." + strings.Repeat("3", 60)
	short := "1,234,567," + strings.Repeat("9", 3) + "." + strings.Repeat("1", 18)
	long := "1,234,567." + strings.Repeat("7", 40)
	require.LessOrEqual(t, len(short)-3, 32)
	cells := distances(standard, short, long)
	batch, err := s.Transform(p, cells)
	require.NoError(t, err)
	dst := make([]tabprep.Cell, len(out.Columns))
	for i := range cells.NumRows() {
		src := steptest.Row(cells, i)
		require.NoError(t, run(dst, src))
		require.Equal(t, math.Float64bits(column(t, batch, "distance_km")[i]), math.Float64bits(dst[0].Num), "row %d", i)
	}
	zeroAlloc, err := s.Transform(p, distances(standard, short))
	require.NoError(t, err)
	steptest.MatchBatch(t, run, out, distances(standard, short), zeroAlloc)
}

// FuzzParseNumberRowKernel checks that the row kernel, parsing a string the
// layout does not list, gives the cell of the batch transform bit for bit.
func FuzzParseNumberRowKernel(f *testing.F) {
	for _, tc := range localeCases {
		f.Add(tc.cell, tc.decimal == ",")
	}
	f.Fuzz(func(t *testing.T, cell string, comma bool) {
		if len(cell) > 64 || cell == "" {
			return
		}
		s := encode.ParseNumber{Columns: tabprep.Names("distance_km"), Thousands: ",", Percent: true, Trim: true}
		if comma {
			s.Decimal, s.Thousands = ",", "."
		}
		train := distances("1")
		p, err := s.Fit(train)
		require.NoError(t, err)
		run, out, err := steptest.Compile(s.RowKernel, p, train.Schema())
		require.NoError(t, err)
		batch, err := s.Transform(p, distances(cell))
		require.NoError(t, err)
		dst := make([]tabprep.Cell, len(out.Columns))
		require.NoError(t, run(dst, []tabprep.Cell{{Str: cell}, {}}))
		want := column(t, batch, "distance_km")[0]
		require.True(t, math.Float64bits(want) == math.Float64bits(dst[0].Num) || math.IsNaN(want) && math.IsNaN(dst[0].Num), "cell %q: batch %v, kernel %v", cell, want, dst[0].Num)
	})
}
