package state

import (
	"encoding/json"
	"fmt"
	"math"
	"strconv"
)

// Float is a float64 that encodes to JSON bit for bit, NaN and infinities
// included. Step parameters use it for their float fields.
type Float float64

// Floats is a []float64 that encodes to JSON bit for bit, element by element
// as [Float] does.
type Floats []float64

const canonicalNaN = 0x7FF8000000000001 // math.NaN()'s bits

func appendFloat(b []byte, v float64) []byte {
	switch {
	case math.IsInf(v, 1):
		return append(b, `"+Inf"`...)
	case math.IsInf(v, -1):
		return append(b, `"-Inf"`...)
	case v != v:
		if bits := math.Float64bits(v); bits != canonicalNaN {
			return fmt.Appendf(b, `"NaN:%016x"`, bits)
		}
		return append(b, `"NaN"`...)
	}
	return strconv.AppendFloat(b, v, 'g', -1, 64)
}

func parseFloat(b []byte) (float64, error) {
	if len(b) > 0 && b[0] == '"' {
		var s string
		if err := json.Unmarshal(b, &s); err != nil {
			return 0, err
		}
		switch s {
		case "NaN":
			return math.NaN(), nil
		case "+Inf":
			return math.Inf(1), nil
		case "-Inf":
			return math.Inf(-1), nil
		}
		var bits uint64
		if _, err := fmt.Sscanf(s, "NaN:%016x", &bits); err == nil && len(s) == 20 {
			if v := math.Float64frombits(bits); v != v {
				return v, nil
			}
		}
		return 0, fmt.Errorf("state: %q is not a number; numbers are JSON numbers or \"NaN\", \"+Inf\", \"-Inf\"", s)
	}
	v, err := strconv.ParseFloat(string(b), 64)
	if err != nil {
		return 0, fmt.Errorf("state: %s is not a number", b)
	}
	return v, nil
}

// MarshalJSON encodes f as a JSON number, or "NaN", "+Inf", "-Inf".
func (f Float) MarshalJSON() ([]byte, error) { return appendFloat(nil, float64(f)), nil }

// UnmarshalJSON decodes what [Float.MarshalJSON] writes.
func (f *Float) UnmarshalJSON(b []byte) error {
	v, err := parseFloat(b)
	if err != nil {
		return err
	}
	*f = Float(v)
	return nil
}

// MarshalJSON encodes fs as a JSON array of what [Float.MarshalJSON] writes.
func (fs Floats) MarshalJSON() ([]byte, error) {
	if fs == nil {
		return []byte("null"), nil
	}
	b := make([]byte, 0, 2+len(fs)*20)
	b = append(b, '[')
	for i, v := range fs {
		if i > 0 {
			b = append(b, ',')
		}
		b = appendFloat(b, v)
	}
	return append(b, ']'), nil
}

// UnmarshalJSON decodes what [Floats.MarshalJSON] writes.
func (fs *Floats) UnmarshalJSON(b []byte) error {
	var raw []json.RawMessage
	if err := json.Unmarshal(b, &raw); err != nil {
		return fmt.Errorf("state: want an array of numbers: %w", err)
	}
	if raw == nil {
		*fs = nil
		return nil
	}
	out := make(Floats, len(raw))
	for i, r := range raw {
		v, err := parseFloat(r)
		if err != nil {
			return fmt.Errorf("element %d: %w", i, err)
		}
		out[i] = v
	}
	*fs = out
	return nil
}

var (
	_ json.Marshaler   = Float(0)
	_ json.Unmarshaler = (*Float)(nil)
	_ json.Marshaler   = Floats(nil)
	_ json.Unmarshaler = (*Floats)(nil)
)
