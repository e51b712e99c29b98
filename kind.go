package tabprep

import (
	"encoding/json"
	"fmt"
)

// Kind is the kind of a column's values.
type Kind uint8

const (
	// Numeric columns hold float64 values; NaN means missing.
	Numeric Kind = iota + 1
	// Categorical columns hold levels (non-empty strings), dictionary encoded.
	Categorical
)

// String returns "numeric" or "categorical".
func (k Kind) String() string {
	switch k {
	case Numeric:
		return "numeric"
	case Categorical:
		return "categorical"
	}
	return fmt.Sprintf("Kind(%d)", uint8(k))
}

// ParseKind parses the names [Kind.String] returns.
func ParseKind(s string) (Kind, error) {
	switch s {
	case "numeric":
		return Numeric, nil
	case "categorical":
		return Categorical, nil
	}
	return 0, fmt.Errorf("tabprep: unknown column kind %q; use \"numeric\" or \"categorical\"", s)
}

// MarshalJSON encodes k as its name.
func (k Kind) MarshalJSON() ([]byte, error) {
	if k != Numeric && k != Categorical {
		return nil, fmt.Errorf("tabprep: cannot encode %v", k)
	}
	return json.Marshal(k.String())
}

// UnmarshalJSON decodes a name written by [Kind.MarshalJSON].
func (k *Kind) UnmarshalJSON(b []byte) error {
	var s string
	if err := json.Unmarshal(b, &s); err != nil {
		return fmt.Errorf("tabprep: column kind must be a string: %w", err)
	}
	v, err := ParseKind(s)
	if err != nil {
		return err
	}
	*k = v
	return nil
}

var (
	_ json.Marshaler   = Kind(0)
	_ json.Unmarshaler = (*Kind)(nil)
)
