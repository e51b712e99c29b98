package tabprep

import "path"

// Selection chooses the columns a step acts on. It is resolved against the
// train frame at fit time, and the resolved names are frozen into the step's
// parameters, so new data with extra columns does not change what a fitted
// step does.
//
// The zero Selection chooses every column of the kind the step works on.
// Names chooses exactly those columns, which must exist and have that kind.
// Pattern, a [path.Match] glob such as "dist_*", chooses every column of
// that kind whose name matches. Names and Pattern together choose the union,
// in frame order.
type Selection struct {
	Names   []string `json:"names,omitempty"`
	Pattern string   `json:"pattern,omitempty"`
}

// Names returns a Selection of the named columns.
func Names(names ...string) Selection { return Selection{Names: names} }

// Matching returns a Selection of the columns whose names match the glob
// pattern (see [path.Match]).
func Matching(pattern string) Selection { return Selection{Pattern: pattern} }

// Resolve returns the names of the columns of f that s chooses, in frame
// order, all of kind k. It is an error if a named column is absent or of
// another kind, if the pattern is malformed, or if nothing is chosen.
func (s Selection) Resolve(op string, f *Frame, k Kind) ([]string, error) {
	return s.resolve(op, f, &k)
}

// ResolveAny is [Selection.Resolve] for a step that takes columns of
// either kind: the zero Selection chooses every column.
func (s Selection) ResolveAny(op string, f *Frame) ([]string, error) {
	return s.resolve(op, f, nil)
}

// resolve resolves s over the columns of kind *k, or of any kind if k is
// nil.
func (s Selection) resolve(op string, f *Frame, k *Kind) ([]string, error) {
	want := make(map[string]bool, len(s.Names))
	for _, n := range s.Names {
		c, err := f.Column(n)
		if err != nil {
			return nil, Errorf(op, ErrNoColumn, n, "selected by name but not in the frame; it has %s", nameList(f.Names()))
		}
		if k != nil && c.kind != *k {
			return nil, Errorf(op, ErrKind, n, "is %v; this step takes %v columns", c.kind, *k)
		}
		want[n] = true
	}
	if s.Pattern != "" {
		if _, err := path.Match(s.Pattern, ""); err != nil {
			return nil, Errorf(op, ErrOption, "", "bad column pattern %q: %v", s.Pattern, err)
		}
	}
	all := len(s.Names) == 0 && s.Pattern == ""
	var out []string
	for _, c := range f.cols {
		if k != nil && c.kind != *k {
			continue
		}
		if all || want[c.name] {
			out = append(out, c.name)
			continue
		}
		if s.Pattern != "" {
			if ok, _ := path.Match(s.Pattern, c.name); ok {
				out = append(out, c.name)
			}
		}
	}
	if len(out) == 0 {
		what := "column"
		if k != nil {
			what = k.String() + " column"
		}
		what = "no " + what
		if s.Pattern != "" {
			what += " matches " + s.Pattern
		}
		return nil, Errorf(op, ErrNoColumn, "", "selection chooses nothing: %s; the frame has %s", what, nameList(f.Names()))
	}
	return out, nil
}
