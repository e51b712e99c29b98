package tabprep_test

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
)

func demoFrame(t *testing.T) *tabprep.Frame {
	t.Helper()
	f, err := tabprep.NewFrame(
		tabprep.NewNumeric("age", []float64{3, math.NaN(), 7, 1}),
		tabprep.NewCategorical("species", []string{"cat", "dog", "", "cat"}),
	)
	require.NoError(t, err)
	return f
}

func TestNewFrameErrors(t *testing.T) {
	a := tabprep.NewNumeric("a", []float64{1, 2})
	tests := []struct {
		name string
		cols []*tabprep.Column
		want error
		msg  string
	}{
		{"duplicate", []*tabprep.Column{a, tabprep.NewNumeric("a", []float64{3, 4})}, tabprep.ErrName,
			`tabprep.frame: column "a": name used by columns 0 and 1; names must be distinct`},
		{"empty name", []*tabprep.Column{tabprep.NewNumeric("", nil)}, tabprep.ErrName,
			`tabprep.frame: column 0 has an empty name; give every column a name`},
		{"ragged", []*tabprep.Column{a, tabprep.NewNumeric("b", []float64{1})}, tabprep.ErrLength,
			`tabprep.frame: column "b": 1 rows, but column "a" has 2`},
		{"nil", []*tabprep.Column{nil}, tabprep.ErrName, `tabprep.frame: column 0 is nil`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := tabprep.NewFrame(tt.cols...)
			require.ErrorIs(t, err, tt.want)
			require.EqualError(t, err, tt.msg)
		})
	}
}

func TestRolesSurviveSelection(t *testing.T) {
	f := demoFrame(t)
	g, err := f.Tag(tabprep.Holdout("test"), []int{1, 3})
	require.NoError(t, err)
	require.Equal(t, 2, g.HoldoutCount())
	require.Equal(t, 0, f.HoldoutCount(), "Tag must not modify its receiver")
	tr := g.Train()
	require.Equal(t, 2, tr.NumRows())
	require.Equal(t, 0, tr.HoldoutCount())
	h := g.Select(tabprep.Holdout("test"))
	require.True(t, h.Col(0).IsMissing(0))
	require.Equal(t, 1.0, h.Col(0).Value(1))
	require.Equal(t, "cat", h.Col(1).Level(1))
	require.Equal(t, []string{"test"}, g.Partitions())
	err = tabprep.RequireTrain("x.fit", g)
	require.True(t, errors.Is(err, tabprep.ErrHoldout))
	require.EqualError(t, err, "x.fit: 2 of 4 rows are tagged holdout; fit only on train rows: pass frame.Train() (or frame.Select(tabprep.Train))")
}

func TestColumnAccessors(t *testing.T) {
	f := demoFrame(t)
	age, err := f.Column("age")
	require.NoError(t, err)
	require.Equal(t, tabprep.Numeric, age.Kind())
	require.Equal(t, 4, age.Len())
	require.True(t, age.IsMissing(1))
	require.Equal(t, 1, age.MissingCount())
	sp, err := f.ColumnOf("species", tabprep.Categorical)
	require.NoError(t, err)
	require.Equal(t, []string{"cat", "dog"}, sp.Levels())
	require.Equal(t, []int32{0, 1, tabprep.MissingCode, 0}, sp.Codes())
	require.Equal(t, "", sp.Level(2))
	require.Equal(t, 1, sp.MissingCount())

	_, err = f.Column("weight")
	require.ErrorIs(t, err, tabprep.ErrNoColumn)
	require.EqualError(t, err, `tabprep.frame: column "weight": not in frame; it has ["age" "species"]`)
	_, err = f.ColumnOf("age", tabprep.Categorical)
	require.ErrorIs(t, err, tabprep.ErrKind)
	require.EqualError(t, err, `tabprep.frame: column "age": is numeric, want categorical`)
}

func TestNewNumericCopies(t *testing.T) {
	v := []float64{1, 2}
	c := tabprep.NewNumeric("a", v)
	v[0] = 99
	require.Equal(t, 1.0, c.Value(0))
}

func TestCategoricalCodesErrors(t *testing.T) {
	tests := []struct {
		name   string
		levels []string
		codes  []int32
		msg    string
	}{
		{"empty level", []string{"a", ""}, nil, `tabprep.column: column "c": empty level; the empty string means missing, use MissingCode for missing cells`},
		{"dup level", []string{"a", "a"}, nil, `tabprep.column: column "c": level "a" listed twice; levels must be distinct`},
		{"bad code", []string{"a"}, []int32{0, 1}, `tabprep.column: column "c": row 1: code 1 outside [0, 1) and not MissingCode`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := tabprep.NewCategoricalCodes("c", tt.levels, tt.codes)
			require.ErrorIs(t, err, tabprep.ErrValue)
			require.EqualError(t, err, tt.msg)
		})
	}
	c, err := tabprep.NewCategoricalCodes("c", []string{"x", "unused"}, []int32{0, -1})
	require.NoError(t, err)
	require.Equal(t, []string{"x", "unused"}, c.Levels(), "unused levels are kept")
}

func TestWithWithoutProject(t *testing.T) {
	f := demoFrame(t)
	f, err := f.Tag(tabprep.Holdout(""), []int{0})
	require.NoError(t, err)
	g, err := f.With(tabprep.NewNumeric("age", []float64{0, 0, 0, 0}), tabprep.NewNumeric("w", []float64{1, 2, 3, 4}))
	require.NoError(t, err)
	require.Equal(t, []string{"age", "species", "w"}, g.Names())
	require.Equal(t, []string{"age", "species"}, f.Names(), "With must not modify its receiver")
	require.Same(t, f.Col(1), g.Col(1), "unchanged columns are shared")
	require.Equal(t, tabprep.Holdout("holdout"), g.Role(0))

	_, err = f.With(tabprep.NewNumeric("x", []float64{1}))
	require.ErrorIs(t, err, tabprep.ErrLength)
	require.EqualError(t, err, `tabprep.frame: column "x": 1 rows, frame has 4`)

	h, err := g.Without("age")
	require.NoError(t, err)
	require.Equal(t, []string{"species", "w"}, h.Names())
	require.Equal(t, 1, h.HoldoutCount())
	_, err = g.Without("nope")
	require.ErrorIs(t, err, tabprep.ErrNoColumn)

	p, err := g.Project("w", "age")
	require.NoError(t, err)
	require.Equal(t, []string{"w", "age"}, p.Names())
	require.Equal(t, 1, p.HoldoutCount())
}

func TestTakeSliceRoles(t *testing.T) {
	f := demoFrame(t)
	f, err := f.WithRoles([]tabprep.Role{tabprep.Train, tabprep.Holdout("validation"), tabprep.Holdout("test"), tabprep.Train})
	require.NoError(t, err)
	g, err := f.Take([]int{2, 2, 0})
	require.NoError(t, err)
	require.Equal(t, []tabprep.Role{tabprep.Holdout("test"), tabprep.Holdout("test"), tabprep.Train}, g.Roles())
	_, err = f.Take([]int{4})
	require.ErrorIs(t, err, tabprep.ErrRow)
	require.EqualError(t, err, "tabprep.frame: row index 4 outside [0, 4)")
	s, err := f.Slice(1, 3)
	require.NoError(t, err)
	require.Equal(t, []string{"validation", "test"}, s.Partitions())
	_, err = f.Slice(3, 5)
	require.ErrorIs(t, err, tabprep.ErrRow)
	require.Equal(t, 2, f.HoldoutRows().NumRows())
	require.Equal(t, 1, f.Select(tabprep.Holdout("validation")).NumRows())

	_, err = f.WithRoles([]tabprep.Role{tabprep.Train})
	require.ErrorIs(t, err, tabprep.ErrLength)
	_, err = f.WithRoles([]tabprep.Role{{Partition: "x"}, {}, {}, {}})
	require.ErrorIs(t, err, tabprep.ErrRole)
	require.EqualError(t, err, `tabprep.role: row 0: train role with partition "x"; use tabprep.Holdout("x")`)
}

func TestParseRole(t *testing.T) {
	tests := []struct {
		in   string
		want tabprep.Role
		err  bool
	}{
		{"train", tabprep.Train, false},
		{"holdout", tabprep.Holdout(""), false},
		{"validation", tabprep.Holdout("validation"), false},
		{"", tabprep.Role{}, true},
		{" test", tabprep.Role{}, true},
	}
	for _, tt := range tests {
		got, err := tabprep.ParseRole(tt.in)
		if tt.err {
			require.ErrorIs(t, err, tabprep.ErrRole, tt.in)
			continue
		}
		require.NoError(t, err)
		require.Equal(t, tt.want, got)
		require.Equal(t, tt.in, got.String())
	}
}

func TestConcatMergesLevelsAndRoles(t *testing.T) {
	a := tabprep.MustFrame(tabprep.NewNumeric("x", []float64{1, 2}), tabprep.NewCategorical("s", []string{"cat", "dog"}))
	b := tabprep.MustFrame(tabprep.NewNumeric("x", []float64{3}), tabprep.NewCategorical("s", []string{"bird"}))
	b, err := b.Tag(tabprep.Holdout("test"), []int{0})
	require.NoError(t, err)
	c, err := tabprep.Concat(a, b)
	require.NoError(t, err)
	require.Equal(t, 3, c.NumRows())
	s, _ := c.Column("s")
	require.Equal(t, []string{"cat", "dog", "bird"}, s.Levels())
	require.Equal(t, "bird", s.Level(2))
	require.Equal(t, []tabprep.Role{tabprep.Train, tabprep.Train, tabprep.Holdout("test")}, c.Roles())

	bad := tabprep.MustFrame(tabprep.NewCategorical("x", []string{"a"}), tabprep.NewCategorical("s", []string{"b"}))
	_, err = tabprep.Concat(a, bad)
	require.ErrorIs(t, err, tabprep.ErrSchema)
	require.EqualError(t, err, `tabprep.concat: column "x": frame 1 column 0 is "x" (categorical), frame 0 has "x" (numeric)`)
}

func TestEqual(t *testing.T) {
	a := demoFrame(t)
	b := demoFrame(t)
	require.True(t, tabprep.Equal(a, b))
	// Same cells under a different dictionary order are equal.
	codes, err := tabprep.NewCategoricalCodes("species", []string{"dog", "cat"}, []int32{1, 0, -1, 1})
	require.NoError(t, err)
	c, err := a.With(codes)
	require.NoError(t, err)
	require.True(t, tabprep.Equal(a, c))
	d, _ := a.Tag(tabprep.Holdout(""), []int{0})
	require.False(t, tabprep.Equal(a, d))
	e, _ := a.With(tabprep.NewNumeric("age", []float64{3, math.NaN(), 7, 2}))
	require.False(t, tabprep.Equal(a, e))
}

func TestSchema(t *testing.T) {
	s := demoFrame(t).Schema()
	require.Equal(t, "[age:numeric species:categorical(2)]", s.String())
	require.NoError(t, s.Validate())
	require.Equal(t, 1, s.Index("species"))
	bad := tabprep.Schema{Columns: []tabprep.Field{{Name: "a", Kind: tabprep.Numeric}, {Name: "a", Kind: tabprep.Numeric}}}
	require.ErrorIs(t, bad.Validate(), tabprep.ErrName)

	// Conform reorders to the schema, drops extras, and refuses a missing
	// column or a changed kind.
	f := tabprep.MustFrame(
		tabprep.NewCategorical("species", []string{"cat"}),
		tabprep.NewNumeric("extra", []float64{1}),
		tabprep.NewNumeric("age", []float64{2}),
	)
	g, err := s.Conform("op", f)
	require.NoError(t, err)
	require.Equal(t, []string{"age", "species"}, g.Names())
	_, err = s.Conform("op", tabprep.MustFrame(tabprep.NewNumeric("age", []float64{1})))
	require.ErrorIs(t, err, tabprep.ErrSchema)
	require.EqualError(t, err, `op: column "species": input lacks this column; the fitted schema needs ["age" "species"]`)
	_, err = s.Conform("op", tabprep.MustFrame(tabprep.NewCategorical("age", []string{"x"}), tabprep.NewCategorical("species", []string{"x"})))
	require.EqualError(t, err, `op: column "age": is categorical, the fitted schema has numeric`)
}

func TestSelectionResolve(t *testing.T) {
	f := tabprep.MustFrame(
		tabprep.NewNumeric("dist_km", []float64{1}),
		tabprep.NewCategorical("species", []string{"cat"}),
		tabprep.NewNumeric("age", []float64{2}),
		tabprep.NewNumeric("dist_mi", []float64{3}),
	)
	tests := []resolveCase{
		{"all numeric", tabprep.Selection{}, []string{"dist_km", "age", "dist_mi"}, nil, ""},
		{"names in frame order", tabprep.Names("age", "dist_km"), []string{"dist_km", "age"}, nil, ""},
		{"pattern", tabprep.Matching("dist_*"), []string{"dist_km", "dist_mi"}, nil, ""},
		{"union", tabprep.Selection{Names: []string{"age"}, Pattern: "*_mi"}, []string{"age", "dist_mi"}, nil, ""},
		{"absent", tabprep.Names("weight"), nil, tabprep.ErrNoColumn,
			`s.fit: column "weight": selected by name but not in the frame; it has ["dist_km" "species" "age" "dist_mi"]`},
		{"wrong kind", tabprep.Names("species"), nil, tabprep.ErrKind,
			`s.fit: column "species": is categorical; this step takes numeric columns`},
		{"bad pattern", tabprep.Matching("["), nil, tabprep.ErrOption, `s.fit: bad column pattern "[": syntax error in pattern`},
		{"no match", tabprep.Matching("zz*"), nil, tabprep.ErrNoColumn,
			`s.fit: selection chooses nothing: no numeric column matches zz*; the frame has ["dist_km" "species" "age" "dist_mi"]`},
	}
	runResolve(t, tests, func(sel tabprep.Selection) ([]string, error) { return sel.Resolve("s.fit", f, tabprep.Numeric) })
}

// resolveCase is one selection and what resolving it must give.
type resolveCase struct {
	name string
	sel  tabprep.Selection
	want []string
	err  error
	msg  string
}

func runResolve(t *testing.T, tests []resolveCase, resolve func(tabprep.Selection) ([]string, error)) {
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			got, err := resolve(tt.sel)
			if tt.err != nil {
				require.ErrorIs(t, err, tt.err)
				require.EqualError(t, err, tt.msg)
				return
			}
			require.NoError(t, err)
			require.Equal(t, tt.want, got)
		})
	}
}

func TestSelectionResolveAny(t *testing.T) {
	f := tabprep.MustFrame(
		tabprep.NewNumeric("dist_km", []float64{1}),
		tabprep.NewCategorical("species", []string{"cat"}),
		tabprep.NewNumeric("age", []float64{2}),
	)
	tests := []resolveCase{
		{"all", tabprep.Selection{}, []string{"dist_km", "species", "age"}, nil, ""},
		{"either kind by name", tabprep.Names("age", "species"), []string{"species", "age"}, nil, ""},
		{"pattern", tabprep.Matching("s*"), []string{"species"}, nil, ""},
		{"absent", tabprep.Names("weight"), nil, tabprep.ErrNoColumn,
			`s.fit: column "weight": selected by name but not in the frame; it has ["dist_km" "species" "age"]`},
		{"bad pattern", tabprep.Matching("["), nil, tabprep.ErrOption, `s.fit: bad column pattern "[": syntax error in pattern`},
		{"no match", tabprep.Matching("zz*"), nil, tabprep.ErrNoColumn,
			`s.fit: selection chooses nothing: no column matches zz*; the frame has ["dist_km" "species" "age"]`},
	}
	runResolve(t, tests, func(sel tabprep.Selection) ([]string, error) { return sel.ResolveAny("s.fit", f) })
}

func TestKindJSON(t *testing.T) {
	b, err := tabprep.Numeric.MarshalJSON()
	require.NoError(t, err)
	require.Equal(t, `"numeric"`, string(b))
	var k tabprep.Kind
	require.NoError(t, k.UnmarshalJSON([]byte(`"categorical"`)))
	require.Equal(t, tabprep.Categorical, k)
	require.Error(t, k.UnmarshalJSON([]byte(`"text"`)))
	_, err = tabprep.Kind(9).MarshalJSON()
	require.Error(t, err)
}

// TestFrameProperties checks on random frames that row selection by role
// partitions the rows: train plus holdout rows cover every row once, in
// order, and roles are carried.
func TestFrameProperties(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for trial := 0; trial < 200; trial++ {
		n := rng.IntN(50)
		x := make([]float64, n)
		s := make([]string, n)
		roles := make([]tabprep.Role, n)
		for i := range x {
			x[i] = float64(i)
			s[i] = []string{"", "a", "b"}[rng.IntN(3)]
			roles[i] = []tabprep.Role{tabprep.Train, tabprep.Holdout("v"), tabprep.Holdout("t")}[rng.IntN(3)]
		}
		f, err := tabprep.MustFrame(tabprep.NewNumeric("i", x), tabprep.NewCategorical("s", s)).WithRoles(roles)
		require.NoError(t, err)
		tr, ho := f.Train(), f.HoldoutRows()
		require.Equal(t, n, tr.NumRows()+ho.NumRows())
		require.Equal(t, 0, tr.HoldoutCount())
		require.Equal(t, ho.NumRows(), ho.HoldoutCount())
		back, err := tabprep.Concat(tr, ho)
		require.NoError(t, err)
		seen := make([]bool, n)
		for i := 0; i < back.NumRows(); i++ {
			orig := int(back.Col(0).Value(i))
			require.False(t, seen[orig])
			seen[orig] = true
			require.Equal(t, roles[orig], back.Role(i))
			require.Equal(t, s[orig], back.Col(1).Level(i))
		}
	}
}
