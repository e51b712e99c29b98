package state

import (
	"encoding/json"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
)

func TestFloatRoundTripBits(t *testing.T) {
	special := []float64{0, math.Copysign(0, -1), math.Inf(1), math.Inf(-1), math.NaN(),
		math.Float64frombits(0x7FF0000000000001), // signalling NaN payload
		math.Float64frombits(0xFFF8000000000000), // negative quiet NaN
		math.SmallestNonzeroFloat64, math.MaxFloat64, -math.MaxFloat64, 0.1, 1.0 / 3}
	rng := rand.New(rand.NewPCG(1, 1))
	vals := append([]float64(nil), special...)
	for range 5000 {
		vals = append(vals, math.Float64frombits(rng.Uint64()))
	}
	for _, v := range vals {
		b, err := json.Marshal(Float(v))
		require.NoError(t, err)
		var got Float
		require.NoError(t, json.Unmarshal(b, &got), string(b))
		require.Equal(t, math.Float64bits(v), math.Float64bits(float64(got)), "%s", b)
	}
	b, err := json.Marshal(Floats(vals))
	require.NoError(t, err)
	var got Floats
	require.NoError(t, json.Unmarshal(b, &got))
	require.Len(t, got, len(vals))
	for i, v := range vals {
		require.Equal(t, math.Float64bits(v), math.Float64bits(got[i]))
	}
}

func TestFloatEncoding(t *testing.T) {
	tests := []struct {
		v    float64
		want string
	}{
		{math.NaN(), `"NaN"`},
		{math.Inf(1), `"+Inf"`},
		{math.Inf(-1), `"-Inf"`},
		{0.1, `0.1`},
		{1e21, `1e+21`},
		{math.Float64frombits(0x7FF0000000000001), `"NaN:7ff0000000000001"`},
	}
	for _, tt := range tests {
		b, err := json.Marshal(Float(tt.v))
		require.NoError(t, err)
		require.Equal(t, tt.want, string(b))
	}
	var f Float
	for _, bad := range []string{`"nan"`, `"NaN:zz"`, `"NaN:0000000000000001"`, `true`, `"1.5"`} {
		require.Error(t, json.Unmarshal([]byte(bad), &f), bad)
	}
	var fs Floats
	require.NoError(t, json.Unmarshal([]byte(`null`), &fs))
	require.Nil(t, fs)
	require.Error(t, json.Unmarshal([]byte(`[1,"x"]`), &fs))
}

func FuzzFloat(f *testing.F) {
	for _, s := range []string{`1`, `"NaN"`, `"+Inf"`, `-0`, `1e308`, `"NaN:7ff0000000000001"`} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		var v Float
		if json.Unmarshal([]byte(s), &v) != nil {
			return
		}
		b, err := json.Marshal(v)
		require.NoError(t, err)
		var w Float
		require.NoError(t, json.Unmarshal(b, &w))
		require.Equal(t, math.Float64bits(float64(v)), math.Float64bits(float64(w)))
	})
}
