package state_test

import (
	"bytes"
	"encoding/json"
	"errors"
	"math"
	"os"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// shift is a minimal step for testing the document mechanics: it subtracts
// the train mean of one column.
type shift struct {
	Column string `json:"column"`
}

type shiftParams struct {
	By state.Float `json:"by"`
}

func (shift) Kind() string { return "test.shift" }

func (s shift) Fit(train *tabprep.Frame) (shiftParams, error) {
	c, err := train.ColumnOf(s.Column, tabprep.Numeric)
	if err != nil {
		return shiftParams{}, err
	}
	sum := 0.0
	for _, v := range c.Float64s() {
		sum += v
	}
	return shiftParams{By: state.Float(sum / float64(c.Len()))}, nil
}

func (s shift) Transform(p shiftParams, data *tabprep.Frame) (*tabprep.Frame, error) {
	c, err := data.ColumnOf(s.Column, tabprep.Numeric)
	if err != nil {
		return nil, err
	}
	out := make([]float64, c.Len())
	for i, v := range c.Float64s() {
		out[i] = v - float64(p.By)
	}
	return data.With(tabprep.AdoptNumeric(s.Column, out))
}

func init() { state.Register(shift{}) }

func testDoc(t *testing.T) (*state.Document, *tabprep.Frame) {
	t.Helper()
	train := tabprep.MustFrame(
		tabprep.NewNumeric("x", []float64{1, 2, 4}),
		tabprep.NewCategorical("s", []string{"a", "", "b"}),
	)
	s := shift{Column: "x"}
	p, err := s.Fit(train)
	require.NoError(t, err)
	out, err := s.Transform(p, train)
	require.NoError(t, err)
	doc, err := state.NewDocument([]state.Fitted{state.Bind(s, p)}, train.Schema(), out.Schema(), state.FingerprintOf(train))
	require.NoError(t, err)
	return doc, train
}

func encodeDoc(t *testing.T, doc *state.Document) []byte {
	var buf bytes.Buffer
	require.NoError(t, state.Write(&buf, doc))
	return buf.Bytes()
}

func TestDocumentRoundTrip(t *testing.T) {
	doc, train := testDoc(t)
	b := encodeDoc(t, doc)
	got, err := state.Read(bytes.NewReader(b), state.ReadOptions{})
	require.NoError(t, err)
	require.Equal(t, state.FormatName, got.Format)
	require.Equal(t, state.FormatVersion, got.Version)
	require.Equal(t, tabprep.Version, got.Library)
	require.Equal(t, doc.Checksum, got.Checksum)
	require.Equal(t, train.Schema(), got.Input)
	require.Equal(t, 3, got.Training.Rows)
	steps, err := got.FittedSteps()
	require.NoError(t, err)
	require.Len(t, steps, 1)
	require.Equal(t, "test.shift", steps[0].Kind())
	require.Equal(t, shift{Column: "x"}, steps[0].Spec())
	require.Equal(t, shiftParams{By: state.Float(7.0 / 3)}, steps[0].Params())
	require.False(t, steps[0].Invertible())
	_, err = steps[0].Inverse(train)
	require.ErrorIs(t, err, tabprep.ErrNotInvertible)
	_, err = steps[0].RowKernel(tabprep.NewRowLayout(train.Schema()))
	require.Error(t, err)
	// Writing again gives the same bytes: the encoding is deterministic.
	require.Equal(t, b, encodeDoc(t, got))
}

func TestReadErrors(t *testing.T) {
	doc, _ := testDoc(t)
	good := string(encodeDoc(t, doc))
	edit := func(old, new string) string {
		require.Contains(t, good, old)
		return strings.Replace(good, old, new, 1)
	}
	tests := []struct {
		name string
		in   string
		opts state.ReadOptions
		want error
		msg  string
	}{
		{"not json", "hello", state.ReadOptions{}, state.ErrFormat, ""},
		{"other format", edit(`"format": "tabprep.state"`, `"format": "other"`), state.ReadOptions{}, state.ErrFormat,
			`state: not a tabprep state document: format is "other", want "tabprep.state"`},
		{"newer version", edit(`"version": 1`, `"version": 2`), state.ReadOptions{}, state.ErrVersion,
			`state: format version not supported: version 2; this library (tabprep ` + tabprep.Version + `) reads versions 1 to 1: upgrade tabprep to load it`},
		{"unknown field", edit(`"library"`, `"extra": 1, "library"`), state.ReadOptions{}, state.ErrFormat,
			`state: not a tabprep state document: json: unknown field "extra"`},
		{"edited value", edit(`"by": 2.3333333333333335`, `"by": 2.5`), state.ReadOptions{}, state.ErrChecksum, ""},
		{"too large", good, state.ReadOptions{MaxBytes: 100}, state.ErrTooLarge,
			`state: document too large: more than 100 bytes; raise ReadOptions.MaxBytes if the document is trusted`},
		{"bad schema", edit(`"name": "s"`, `"name": "x"`), state.ReadOptions{}, state.ErrFormat,
			`state: not a tabprep state document: input schema: tabprep.schema: column "x": name used twice`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := state.Read(strings.NewReader(tt.in), tt.opts)
			require.ErrorIs(t, err, tt.want)
			if tt.msg != "" {
				require.EqualError(t, err, tt.msg)
			}
		})
	}
}

func TestFittedStepsErrors(t *testing.T) {
	doc, _ := testDoc(t)
	d := *doc
	d.Steps = []state.Record{{Kind: "test.nope", Spec: json.RawMessage(`{}`), Params: json.RawMessage(`{}`)}}
	_, err := d.FittedSteps()
	require.ErrorIs(t, err, state.ErrUnknownKind)
	require.EqualError(t, err, `state: step 0: state: unknown step kind: "test.nope" (forgotten import of the package that defines it?)`)

	d.Steps = []state.Record{{Kind: "test.shift", Spec: json.RawMessage(`{"column":"x","extra":true}`), Params: json.RawMessage(`{"by":1}`)}}
	_, err = d.FittedSteps()
	require.EqualError(t, err, `state: step 0: state: step test.shift: spec: json: unknown field "extra"`)

	d.Steps = []state.Record{{Kind: "test.shift", Spec: json.RawMessage(`{"Column":"x"}`), Params: json.RawMessage(`{"by":1}`)}}
	_, err = d.FittedSteps()
	require.EqualError(t, err, `state: step 0: state: step test.shift: spec: field "Column" at "$": names are case-sensitive; write "column"`)

	d.Steps = []state.Record{{Kind: "test.shift", Spec: json.RawMessage(`{"column":"x"}`), Params: json.RawMessage(`{"by":"NaN"}`)}}
	steps, err := d.FittedSteps()
	require.NoError(t, err)
	require.True(t, math.IsNaN(float64(steps[0].Params().(shiftParams).By)))
}

func TestRegisterPanics(t *testing.T) {
	require.PanicsWithValue(t, "state: Register called twice for kind test.shift", func() { state.Register(shift{}) })
	require.Panics(t, func() { state.Register(noKind{}) })
	require.Contains(t, state.Kinds(), "test.shift")
}

type noKind struct{ shift }

func (noKind) Kind() string { return "" }

func TestFingerprint(t *testing.T) {
	a := tabprep.MustFrame(tabprep.NewNumeric("x", []float64{1, math.NaN()}), tabprep.NewCategorical("s", []string{"a", ""}))
	nan2 := math.Float64frombits(0x7FF8000000000002)
	b := tabprep.MustFrame(tabprep.NewNumeric("x", []float64{1, nan2}), tabprep.NewCategorical("s", []string{"a", ""}))
	require.Equal(t, state.FingerprintOf(a), state.FingerprintOf(b), "NaN payloads do not matter")
	c := tabprep.MustFrame(tabprep.NewNumeric("x", []float64{1, 2}), tabprep.NewCategorical("s", []string{"a", ""}))
	require.NotEqual(t, state.FingerprintOf(a).SHA256, state.FingerprintOf(c).SHA256)
	// Level boundaries are length-prefixed: "ab","" differs from "a","b".
	d := tabprep.MustFrame(tabprep.NewCategorical("s", []string{"ab", ""}))
	e := tabprep.MustFrame(tabprep.NewCategorical("s", []string{"a", "b"}))
	require.NotEqual(t, state.FingerprintOf(d).SHA256, state.FingerprintOf(e).SHA256)
	require.Equal(t, 2, state.FingerprintOf(a).Rows)
	// SHA-256 of the empty input (FIPS 180-4 test value), as the fingerprint
	// of a frame with no columns.
	require.Equal(t, "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855", state.FingerprintOf(tabprep.MustFrame()).SHA256)
}

func TestChecksumCoversSteps(t *testing.T) {
	doc, _ := testDoc(t)
	d := *doc
	d.Steps = append([]state.Record(nil), doc.Steps...)
	d.Steps[0].Params = json.RawMessage(`{"by":0}`)
	_, err := state.Read(bytes.NewReader(encodeDoc(t, &d)), state.ReadOptions{})
	require.True(t, errors.Is(err, state.ErrChecksum))
}

// FuzzRead feeds the document reader any bytes: it must return a document
// or an error, never panic, and a document it accepts must write back to
// one it reads the same.
func FuzzRead(f *testing.F) {
	golden, err := os.ReadFile("testdata/v1/vet-no-show.state.json")
	if err != nil {
		f.Fatal(err)
	}
	f.Add(golden)
	f.Add([]byte(`{"format":"tabprep.state","version":1}`))
	f.Add([]byte(`{"format":"tabprep.state","version":2}`))
	f.Fuzz(func(t *testing.T, b []byte) {
		doc, err := state.Read(bytes.NewReader(b), state.ReadOptions{MaxBytes: 1 << 20})
		if err != nil {
			return
		}
		_, _ = doc.FittedSteps()
		var buf bytes.Buffer
		require.NoError(t, state.Write(&buf, doc))
		again, err := state.Read(&buf, state.ReadOptions{})
		require.NoError(t, err)
		require.Equal(t, doc.Checksum, again.Checksum)
	})
}
