package tabprep_test

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
)

func TestSourceWriterFloat(t *testing.T) {
	w := tabprep.NewSourceWriter()
	for _, tc := range []struct {
		v    float64
		want string
	}{
		{math.NaN(), "math.NaN()"},
		{math.Inf(1), "math.Inf(1)"},
		{math.Inf(-1), "math.Inf(-1)"},
		{math.Copysign(0, -1), "math.Copysign(0, -1)"},
		{0, "0"},
		{0.1, "0.1"},
		{-1.5e-300, "-1.5e-300"},
		{5e-324, "5e-324"},
		{math.MaxFloat64, "1.7976931348623157e+308"},
		{1.0 / 3, "0.3333333333333333"},
	} {
		require.Equal(t, tc.want, w.Float(tc.v))
	}
}

// TestSourceWriterFloatExact is the property that every finite float64
// written as a literal reads back with the same bits. It relies on the Go
// specification (Constants, Conversions: a constant converts to the nearest
// float64, rounding to even) matching strconv.ParseFloat, which is
// correctly rounded too; from memory, not looked up.
func TestSourceWriterFloatExact(t *testing.T) {
	w := tabprep.NewSourceWriter()
	rng := rand.New(rand.NewPCG(11, 12))
	for range 100000 {
		v := math.Float64frombits(rng.Uint64())
		if math.IsNaN(v) || math.IsInf(v, 0) || v == 0 {
			continue
		}
		back, err := strconv.ParseFloat(w.Float(v), 64)
		require.NoError(t, err)
		require.Equal(t, math.Float64bits(v), math.Float64bits(back), "%v", v)
	}
}

func TestSourceWriterNames(t *testing.T) {
	w := tabprep.NewSourceWriter()
	require.Equal(t, "n12", w.Num(12))
	require.Equal(t, "n3", w.Num(3))
	require.Equal(t, "s3", w.Str(3))
	require.Equal(t, "c3", w.Code(3))
	w.Line("%s = %s", w.Num(3), w.Float(2))
	w.GiveUp()
	require.Equal(t, []string{"n3", "n12"}, w.Used("n"))
	require.Equal(t, []string{"s3"}, w.Used("s"))
	require.Equal(t, "\tn3 = 2\n\treturn false\n", w.String())
	require.Equal(t, `"Old \"Town\""`, w.Quote(`Old "Town"`))
}
