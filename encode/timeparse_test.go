package encode_test

import (
	"math"
	"testing"
	"time"
	_ "time/tzdata"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/internal/steptest"
	"github.com/tabprep/tabprep/pipeline"
)

func bookings() *tabprep.Frame {
	return tabprep.MustFrame(
		tabprep.NewCategorical("booked_on", []string{"2024-03-05 14:30", "2024-12-31 08:05", "", "someday", "2024-02-29 23:59"}),
		tabprep.NewNumeric("no_show", []float64{0, 1, 0, 1, 0}),
	)
}

// TestParseTimeParts checks each part against the standard library's time
// package (the reference), evaluated on the same instant with time.Date.
func TestParseTimeParts(t *testing.T) {
	s := encode.ParseTime{Columns: tabprep.Names("booked_on"), Layout: "2006-01-02 15:04",
		Parts: []encode.TimePart{encode.PartUnix, encode.PartYear, encode.PartMonth, encode.PartDay, encode.PartWeekday, encode.PartYearDay, encode.PartHour, encode.PartMinute, encode.PartSecond}}
	p, err := s.Fit(bookings())
	require.NoError(t, err)
	require.Equal(t, encode.ParseReport{Name: "booked_on", BadCells: 1, Samples: []encode.BadCell{{Row: 3, Value: "someday"}}}, p.Columns[0])
	require.Equal(t, "booked_on.unix", p.Outputs()[0])

	out := roundTrip(t, pipeline.Use(s), bookings(), bookings())
	ref := []time.Time{time.Date(2024, 3, 5, 14, 30, 0, 0, time.UTC), time.Date(2024, 12, 31, 8, 5, 0, 0, time.UTC), {}, {}, time.Date(2024, 2, 29, 23, 59, 0, 0, time.UTC)}
	for i, r := range ref {
		got := func(part string) float64 { return column(t, out, "booked_on."+part)[i] }
		if r.IsZero() {
			require.True(t, math.IsNaN(got("unix")) && math.IsNaN(got("hour")), "row %d is missing", i)
			continue
		}
		require.Equal(t, float64(r.Unix()), got("unix"))
		require.Equal(t, float64(r.Year()), got("year"))
		require.Equal(t, float64(r.Month()), got("month"))
		require.Equal(t, float64(r.Day()), got("day"))
		require.Equal(t, float64(r.Weekday()), got("weekday"))
		require.Equal(t, float64(r.YearDay()), got("yearday"))
		require.Equal(t, float64(r.Hour()), got("hour"))
		require.Equal(t, float64(r.Minute()), got("minute"))
		require.Equal(t, 0.0, got("second"))
	}
	require.Equal(t, 2.0, column(t, out, "booked_on.weekday")[0], "2024-03-05 is a Tuesday (time.Tuesday = 2)")
}

func TestParseTimeUnixInPlace(t *testing.T) {
	s := encode.ParseTime{Layout: time.RFC3339}
	f := tabprep.MustFrame(tabprep.NewCategorical("booked_on", []string{"2024-03-05T14:30:00.25+01:00", "1970-01-01T00:00:00Z"}))
	out := roundTrip(t, pipeline.Use(s), f, f)
	require.Equal(t, []string{"booked_on"}, out.Names())
	want := time.Date(2024, 3, 5, 13, 30, 0, 250e6, time.UTC)
	require.Equal(t, float64(want.Unix())+0.25, column(t, out, "booked_on")[0])
	require.Equal(t, 0.0, column(t, out, "booked_on")[1])
}

// TestParseTimeLocation: a layout without a zone is read in Location; the
// reference is time.Date in the same zone, from the standard library's
// embedded zone database (time/tzdata).
func TestParseTimeLocation(t *testing.T) {
	berlin, err := time.LoadLocation("Europe/Berlin")
	require.NoError(t, err)
	s := encode.ParseTime{Layout: "2006-01-02 15:04", Location: "Europe/Berlin", Parts: []encode.TimePart{encode.PartHour, encode.PartUnix}}
	f := tabprep.MustFrame(tabprep.NewCategorical("booked_on", []string{"2024-03-05 14:30", "2024-07-05 14:30"}))
	p, err := s.Fit(f)
	require.NoError(t, err)
	out, err := s.Transform(p, f)
	require.NoError(t, err)
	require.Equal(t, []float64{14, 14}, column(t, out, "booked_on.hour"))
	require.Equal(t, []float64{
		float64(time.Date(2024, 3, 5, 14, 30, 0, 0, berlin).Unix()),
		float64(time.Date(2024, 7, 5, 14, 30, 0, 0, berlin).Unix()),
	}, column(t, out, "booked_on.unix"))
	// Winter is UTC+1, summer UTC+2.
	require.Equal(t, float64(time.Date(2024, 3, 5, 13, 30, 0, 0, time.UTC).Unix()), column(t, out, "booked_on.unix")[0])
	require.Equal(t, float64(time.Date(2024, 7, 5, 12, 30, 0, 0, time.UTC).Unix()), column(t, out, "booked_on.unix")[1])
}

func TestParseTimeErrors(t *testing.T) {
	tests := []struct {
		name string
		step encode.ParseTime
		want error
		msg  string
	}{
		{"no layout", encode.ParseTime{}, tabprep.ErrOption, "no Layout"},
		{"bad part", encode.ParseTime{Layout: time.DateOnly, Parts: []encode.TimePart{"fortnight"}}, tabprep.ErrOption, `part "fortnight"`},
		{"part twice", encode.ParseTime{Layout: time.DateOnly, Parts: []encode.TimePart{encode.PartDay, encode.PartDay}}, tabprep.ErrOption, `part "day" listed twice`},
		{"bad zone", encode.ParseTime{Layout: time.DateOnly, Location: "Mars/Olympus"}, tabprep.ErrOption, `location "Mars/Olympus"`},
		{"bad cell", encode.ParseTime{Layout: "2006-01-02 15:04", Bad: encode.BadError}, encode.ErrBadCell, `column "booked_on": row 3: "someday" is not a time in layout 2006-01-02 15:04`},
		{"numeric", encode.ParseTime{Columns: tabprep.Names("no_show"), Layout: time.DateOnly}, tabprep.ErrKind, `column "no_show"`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := tt.step.Fit(bookings())
			require.ErrorIs(t, err, tt.want)
			require.ErrorContains(t, err, tt.msg)
		})
	}
}

func TestParseTimeRowKernel(t *testing.T) {
	// Unseen times parsed in the row, the seen bad level "someday" looked
	// up, and a missing cell; none of these allocates.
	fresh := tabprep.MustFrame(
		tabprep.NewCategorical("booked_on", []string{"2025-01-01 10:00", "someday", "", "2024-03-05 14:30", "2023-07-09 00:01"}),
		tabprep.NewNumeric("no_show", []float64{0, 1, 0, 1, 0}),
	)
	for _, s := range []encode.ParseTime{
		{Columns: tabprep.Names("booked_on"), Layout: "2006-01-02 15:04"},
		{Columns: tabprep.Names("booked_on"), Layout: "2006-01-02 15:04", Location: "Europe/Berlin",
			Parts: []encode.TimePart{encode.PartWeekday, encode.PartHour, encode.PartUnix}},
	} {
		steptest.RowsMatch(t, bookings(), fresh, pipeline.Use(s))
	}

	// A zone of "Z", none, or a whole-hour offset does not allocate; an
	// offset such as +05:45 does (the standard library makes a fixed zone),
	// and so does a string that does not parse (its error value). All give
	// the batch cells.
	s := encode.ParseTime{Layout: time.RFC3339}
	train := tabprep.MustFrame(tabprep.NewCategorical("booked_on", []string{"2024-03-05T14:30:00Z"}))
	p, err := s.Fit(train)
	require.NoError(t, err)
	run, out, err := steptest.Compile(s.RowKernel, p, train.Schema())
	require.NoError(t, err)
	zulu := tabprep.MustFrame(tabprep.NewCategorical("booked_on", []string{"2025-06-01T08:00:00Z", "2025-06-01T08:00:00.5Z"}))
	batch, err := s.Transform(p, zulu)
	require.NoError(t, err)
	steptest.MatchBatch(t, run, out, zulu, batch)
	other := tabprep.MustFrame(tabprep.NewCategorical("booked_on", []string{"2025-06-01T08:00:00+02:00", "soon", "2025-06-01T08:00:00+05:45"}))
	batch, err = s.Transform(p, other)
	require.NoError(t, err)
	dst := make([]tabprep.Cell, 1)
	for i, want := range column(t, batch, "booked_on") {
		src := steptest.Row(other, i)
		require.NoError(t, run(dst, src))
		require.Equal(t, math.Float64bits(want), math.Float64bits(dst[0].Num), "row %d", i)
		if !raceEnabled {
			// A whole-hour offset takes a zone the standard library keeps
			// made; +05:45 needs a new one (Go 1.26), and a bad string its
			// error value: the bound leaves room for either to change a
			// little.
			allocs := testing.AllocsPerRun(10, func() { _ = run(dst, src) })
			if i == 0 {
				require.Zero(t, allocs, "row %d", i)
			} else {
				require.Positive(t, allocs, "row %d", i)
				require.LessOrEqual(t, allocs, 4.0, "row %d", i)
			}
		}
	}

	s.Bad = encode.BadError
	_, batchErr := s.Transform(p, other)
	require.ErrorIs(t, batchErr, encode.ErrBadCell)
	run, _, err = steptest.Compile(s.RowKernel, p, train.Schema())
	require.NoError(t, err)
	require.NoError(t, run(dst, steptest.Row(other, 0)))
	err = run(dst, steptest.Row(other, 1))
	require.ErrorIs(t, err, encode.ErrBadCell)
	require.ErrorContains(t, err, `"soon"`)
}

// FuzzParseTime checks the time parser on any cell: the row kernel and the
// batch transform agree, bit for bit, and a cell either parses or is
// reported (as missing under Bad "missing").
func FuzzParseTime(f *testing.F) {
	for _, s := range []string{"2025-03-12 09:30", "2025-13-01 00:00", "", "2024-02-29 23:59", "x", "2025-03-12 9:30"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, cell string) {
		if len(cell) > 64 || cell == "" {
			return
		}
		s := encode.ParseTime{Columns: tabprep.Names("at"), Layout: "2006-01-02 15:04",
			Parts: []encode.TimePart{encode.PartUnix, encode.PartWeekday, encode.PartHour}, Bad: encode.BadMissing}
		train := tabprep.MustFrame(tabprep.NewCategorical("at", []string{"2025-03-12 09:30", "2025-03-13 17:05"}))
		p, err := s.Fit(train)
		require.NoError(t, err)
		data := tabprep.MustFrame(tabprep.NewCategorical("at", []string{cell}))
		batch, err := s.Transform(p, data)
		require.NoError(t, err)
		run, out, err := steptest.Compile(s.RowKernel, p, train.Schema())
		require.NoError(t, err)
		dst := make([]tabprep.Cell, len(out.Columns))
		require.NoError(t, run(dst, []tabprep.Cell{{Str: cell}}))
		for j := range dst {
			want := batch.Col(j).Value(0)
			require.True(t, math.Float64bits(want) == math.Float64bits(dst[j].Num) || math.IsNaN(want) && math.IsNaN(dst[j].Num),
				"cell %q column %s: batch %v, kernel %v", cell, out.Columns[j].Name, want, dst[j].Num)
		}
	})
}
