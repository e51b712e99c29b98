package pipeline

import (
	"encoding/json"
	"math"
	"reflect"
	"strings"

	"github.com/tabprep/tabprep"
)

const bindOp = "pipeline.plan"

// FromMap fills dst, which must have [Plan.InputWidth] cells, from a map of
// input column name to value, as a decoded JSON request gives. Numeric
// columns take any Go number or json.Number; categorical columns take a
// string; nil or an absent key is a missing cell. A key that is not an input
// column, or a value of the wrong type, is an error naming the field.
//
// FromMap is a convenience for the edge of a service: it looks names up in a
// map, which [Plan.Apply] itself never does.
func (p *Plan) FromMap(dst []tabprep.Cell, m map[string]any) error {
	if len(dst) != len(p.in.Columns) {
		return tabprep.Errorf(bindOp, tabprep.ErrLength, "", "%d cells for %d input columns", len(dst), len(p.in.Columns))
	}
	for k := range m {
		if _, ok := p.fields[k]; !ok {
			return tabprep.Errorf(bindOp, tabprep.ErrNoColumn, k, "not an input column; the input columns are %s", strings.Join(p.in.Names(), ", "))
		}
	}
	for i, c := range p.in.Columns {
		cell, err := toCell(c, m[c.Name])
		if err != nil {
			return err
		}
		dst[i] = cell
	}
	return nil
}

func toCell(c tabprep.Field, v any) (tabprep.Cell, error) {
	if v == nil {
		return missingCell(c.Kind), nil
	}
	if c.Kind == tabprep.Categorical {
		s, ok := v.(string)
		if !ok {
			return tabprep.Cell{}, tabprep.Errorf(bindOp, tabprep.ErrKind, c.Name, "got %T, want a string (the column is categorical)", v)
		}
		return tabprep.Cell{Str: s}, nil
	}
	var x float64
	switch n := v.(type) {
	case float64:
		x = n
	case float32:
		x = float64(n)
	case int:
		x = float64(n)
	case int8:
		x = float64(n)
	case int16:
		x = float64(n)
	case int32:
		x = float64(n)
	case int64:
		x = float64(n)
	case uint:
		x = float64(n)
	case uint8:
		x = float64(n)
	case uint16:
		x = float64(n)
	case uint32:
		x = float64(n)
	case uint64:
		x = float64(n)
	case json.Number:
		f, err := n.Float64()
		if err != nil {
			return tabprep.Cell{}, tabprep.Errorf(bindOp, tabprep.ErrValue, c.Name, "%q is not a number", string(n))
		}
		x = f
	default:
		return tabprep.Cell{}, tabprep.Errorf(bindOp, tabprep.ErrKind, c.Name, "got %T, want a number (the column is numeric)", v)
	}
	if math.IsInf(x, 0) {
		return tabprep.Cell{}, tabprep.Errorf(bindOp, tabprep.ErrValue, c.Name, "%v is not finite", x)
	}
	return tabprep.Cell{Num: x}, nil
}

func missingCell(k tabprep.Kind) tabprep.Cell {
	if k == tabprep.Numeric {
		return tabprep.Cell{Num: math.NaN()}
	}
	return tabprep.Cell{Code: tabprep.MissingCode}
}

// FromStruct fills dst from a struct (or pointer to one) whose fields carry
// the input columns: a field named by its tag `tabprep:"name"`, or else by
// its Go name, matches the column of that name. Numeric columns take number
// fields (a nil pointer field is missing), categorical columns string
// fields. Every input column must have a field. The field layout of each
// struct type is worked out once and cached.
func (p *Plan) FromStruct(dst []tabprep.Cell, v any) error {
	if len(dst) != len(p.in.Columns) {
		return tabprep.Errorf(bindOp, tabprep.ErrLength, "", "%d cells for %d input columns", len(dst), len(p.in.Columns))
	}
	rv := reflect.ValueOf(v)
	for rv.Kind() == reflect.Pointer && !rv.IsNil() {
		rv = rv.Elem()
	}
	if rv.Kind() != reflect.Struct {
		return tabprep.Errorf(bindOp, tabprep.ErrKind, "", "FromStruct takes a struct, got %T", v)
	}
	idx, err := p.fieldIndex(rv.Type())
	if err != nil {
		return err
	}
	for i, c := range p.in.Columns {
		f := rv.Field(idx[i])
		for f.Kind() == reflect.Pointer {
			if f.IsNil() {
				break
			}
			f = f.Elem()
		}
		var val any
		if !(f.Kind() == reflect.Pointer && f.IsNil()) {
			val = f.Interface()
		}
		cell, err := toCell(c, val)
		if err != nil {
			return err
		}
		dst[i] = cell
	}
	return nil
}

func (p *Plan) fieldIndex(t reflect.Type) ([]int, error) {
	if idx, ok := p.structs.Load(t); ok {
		return idx.([]int), nil
	}
	byName := map[string]int{}
	for i := 0; i < t.NumField(); i++ {
		f := t.Field(i)
		if !f.IsExported() {
			continue
		}
		name := f.Name
		if tag, ok := f.Tag.Lookup("tabprep"); ok && tag != "" {
			name = tag
		}
		byName[name] = i
	}
	idx := make([]int, len(p.in.Columns))
	for i, c := range p.in.Columns {
		j, ok := byName[c.Name]
		if !ok {
			return nil, tabprep.Errorf(bindOp, tabprep.ErrNoColumn, c.Name, "struct %v has no field for this input column; add one, tagged `tabprep:%q` if its Go name differs", t, c.Name)
		}
		idx[i] = j
	}
	p.structs.Store(t, idx)
	return idx, nil
}
