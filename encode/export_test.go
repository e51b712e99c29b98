package encode

// FNV1a exposes the level hash before mixing, for the test against the
// standard library's hash/fnv.
var FNV1a = fnv1a

// ParseNumberText parses one cell as a [ParseNumber] step with the given
// options would.
func ParseNumberText(s ParseNumber, cell string) (float64, bool, error) {
	f, err := s.format("test")
	if err != nil {
		return 0, false, err
	}
	v, ok := f.parse(cell)
	return v, ok, nil
}
