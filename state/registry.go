package state

import (
	"bytes"
	"encoding/json"
	"fmt"
	"slices"
	"strings"
	"sync"

	"github.com/tabprep/tabprep"
)

// Fitted is a step bound to the parameters it learned: what a pipeline holds
// and what a document stores for each step.
type Fitted interface {
	// Kind returns the step kind.
	Kind() string
	// Apply transforms data with the fitted parameters.
	Apply(data *tabprep.Frame) (*tabprep.Frame, error)
	// Spec returns the step value (what the user chose).
	Spec() any
	// Params returns the fitted parameters (what was learned).
	Params() any
	// Invertible reports whether the step implements [tabprep.Inverter].
	Invertible() bool
	// Inverse undoes Apply; it returns an error wrapping
	// [tabprep.ErrNotInvertible] if the step has no inverse.
	Inverse(data *tabprep.Frame) (*tabprep.Frame, error)
	// RowKernel returns the row function of the step for rows laid out by
	// l, which it updates to the step's output, or an error if the step
	// cannot act on one row.
	RowKernel(l *tabprep.RowLayout) (tabprep.RowFunc, error)
	// RowSource writes the step's row kernel as Go source to w, for rows
	// laid out by l, which it updates as RowKernel does; it returns an error
	// if the step has no source form.
	RowSource(l *tabprep.RowLayout, w *tabprep.SourceWriter) error
}

// Bound is the [Fitted] value of a step S with parameters P.
type Bound[S tabprep.Step[P], P any] struct {
	step   S
	params P
}

// Bind returns step s bound to parameters p.
func Bind[S tabprep.Step[P], P any](s S, p P) *Bound[S, P] {
	return &Bound[S, P]{step: s, params: p}
}

// Kind returns the step kind.
func (b *Bound[S, P]) Kind() string { return b.step.Kind() }

// Step returns the step value.
func (b *Bound[S, P]) Step() S { return b.step }

// Fitted returns the parameters.
func (b *Bound[S, P]) Fitted() P { return b.params }

// Spec returns the step value as any.
func (b *Bound[S, P]) Spec() any { return b.step }

// Params returns the parameters as any.
func (b *Bound[S, P]) Params() any { return b.params }

// Apply calls the step's Transform with the bound parameters.
func (b *Bound[S, P]) Apply(data *tabprep.Frame) (*tabprep.Frame, error) {
	return b.step.Transform(b.params, data)
}

// Invertible reports whether S implements [tabprep.Inverter].
func (b *Bound[S, P]) Invertible() bool {
	_, ok := any(b.step).(tabprep.Inverter[P])
	return ok
}

// Inverse calls the step's Inverse, if it has one.
func (b *Bound[S, P]) Inverse(data *tabprep.Frame) (*tabprep.Frame, error) {
	inv, ok := any(b.step).(tabprep.Inverter[P])
	if !ok {
		return nil, tabprep.Errorf(b.Kind(), tabprep.ErrNotInvertible, "", "step has no inverse transform")
	}
	return inv.Inverse(b.params, data)
}

// RowKernel calls the step's RowKernel, if it has one.
func (b *Bound[S, P]) RowKernel(l *tabprep.RowLayout) (tabprep.RowFunc, error) {
	rk, ok := any(b.step).(tabprep.RowKernel[P])
	if !ok {
		return nil, tabprep.Errorf(b.Kind(), tabprep.ErrOption, "", "step cannot act on a single row")
	}
	return rk.RowKernel(b.params, l)
}

// RowSource calls the step's RowSource, if it has one.
func (b *Bound[S, P]) RowSource(l *tabprep.RowLayout, w *tabprep.SourceWriter) error {
	rs, ok := any(b.step).(tabprep.RowSource[P])
	if !ok {
		return tabprep.Errorf(b.Kind(), tabprep.ErrOption, "", "step has no Go source form")
	}
	return rs.RowSource(b.params, l, w)
}

// decoder rebuilds a Fitted from its JSON spec and params.
type decoder func(spec, params []byte) (Fitted, error)

var (
	regMu    sync.RWMutex
	registry = map[string]decoder{}
)

// Register makes the step kind of s loadable from a document. The spec and
// params of a stored step are decoded into fresh values of S and P, strictly.
// Packages call Register in init.
//
// It panics if the kind is empty or already registered: both are mistakes
// in the program, not in the data.
func Register[S tabprep.Step[P], P any](s S) {
	kind := s.Kind()
	if kind == "" {
		panic("state: Register of a step with an empty kind")
	}
	regMu.Lock()
	defer regMu.Unlock()
	if _, dup := registry[kind]; dup {
		panic("state: Register called twice for kind " + kind)
	}
	registry[kind] = func(spec, params []byte) (Fitted, error) {
		var st S
		if err := strictUnmarshal(spec, &st); err != nil {
			return nil, fmt.Errorf("state: step %s: spec: %w", kind, err)
		}
		if got := st.Kind(); got != kind {
			return nil, fmt.Errorf("state: step %s: spec decodes to kind %s", kind, got)
		}
		var p P
		if err := strictUnmarshal(params, &p); err != nil {
			return nil, fmt.Errorf("state: step %s: params: %w", kind, err)
		}
		return Bind(st, p), nil
	}
}

// Kinds returns the registered step kinds, sorted.
func Kinds() []string {
	regMu.RLock()
	defer regMu.RUnlock()
	out := make([]string, 0, len(registry))
	for k := range registry {
		out = append(out, k)
	}
	slices.Sort(out)
	return out
}

// Decode rebuilds a fitted step from its kind, spec and params, as stored in
// a document.
func Decode(kind string, spec, params []byte) (Fitted, error) {
	regMu.RLock()
	dec, ok := registry[kind]
	regMu.RUnlock()
	if !ok {
		return nil, fmt.Errorf("%w: %q (forgotten import of the package that defines it?)", ErrUnknownKind, kind)
	}
	return dec(spec, params)
}

// strictUnmarshal decodes b into v, refusing unknown fields, trailing data
// and field names in another case than the one v's type uses (encoding/json
// alone matches names case-insensitively).
func strictUnmarshal(b []byte, v any) error {
	d := json.NewDecoder(bytes.NewReader(b))
	d.DisallowUnknownFields()
	if err := d.Decode(v); err != nil {
		return err
	}
	if d.More() {
		return fmt.Errorf("trailing data after the JSON value")
	}
	canon, err := json.Marshal(v)
	if err != nil {
		return err
	}
	var got, want any
	if json.Unmarshal(b, &got) != nil || json.Unmarshal(canon, &want) != nil {
		return nil // v's own encoding is not plain JSON; nothing to compare
	}
	return sameCase(got, want, "")
}

// sameCase reports a key of got that is missing from want while want has
// the same key in another case.
func sameCase(got, want any, at string) error {
	switch g := got.(type) {
	case map[string]any:
		w, ok := want.(map[string]any)
		if !ok {
			return nil
		}
		for k, gv := range g {
			if wv, ok := w[k]; ok {
				if err := sameCase(gv, wv, at+"."+k); err != nil {
					return err
				}
				continue
			}
			for wk := range w {
				if strings.EqualFold(k, wk) {
					return fmt.Errorf("field %q at %q: names are case-sensitive; write %q", k, "$"+at, wk)
				}
			}
		}
	case []any:
		w, ok := want.([]any)
		if !ok {
			return nil
		}
		for i := range min(len(g), len(w)) {
			if err := sameCase(g[i], w[i], fmt.Sprintf("%s[%d]", at, i)); err != nil {
				return err
			}
		}
	}
	return nil
}
