package pipeline

import (
	"fmt"
	"io"
	"os"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// Fitted is a fitted pipeline. It is immutable and safe for concurrent use.
type Fitted struct {
	input    tabprep.Schema
	output   tabprep.Schema
	steps    []state.Fitted
	training state.Fingerprint
}

// Transform applies every fitted step in order. data must have every column
// of the input schema with the same kind; its columns are taken in the
// input schema's order and any others are ignored. Rows, their order and
// their roles are kept (unless a step is documented to drop rows).
func (f *Fitted) Transform(data *tabprep.Frame) (*tabprep.Frame, error) {
	cur, err := f.input.Conform("pipeline.transform", data)
	if err != nil {
		return nil, err
	}
	for i, s := range f.steps {
		if cur, err = s.Apply(cur); err != nil {
			return nil, fmt.Errorf("pipeline: step %d (%s): %w", i, s.Kind(), err)
		}
	}
	return cur, nil
}

// Inverse undoes the steps from the last back to step from, which must all
// be invertible. Inverse(0, Transform(x)) is x up to rounding. It is an
// error wrapping [tabprep.ErrNotInvertible] if one of them is not.
func (f *Fitted) Inverse(from int, data *tabprep.Frame) (*tabprep.Frame, error) {
	if from < 0 || from > len(f.steps) {
		return nil, fmt.Errorf("pipeline: inverse from step %d: the pipeline has steps 0 to %d", from, len(f.steps)-1)
	}
	for i := from; i < len(f.steps); i++ {
		if !f.steps[i].Invertible() {
			return nil, fmt.Errorf("pipeline: step %d (%s): %w; invert only from a step after it", i, f.steps[i].Kind(), tabprep.ErrNotInvertible)
		}
	}
	cur := data
	for i := len(f.steps) - 1; i >= from; i-- {
		var err error
		if cur, err = f.steps[i].Inverse(cur); err != nil {
			return nil, fmt.Errorf("pipeline: inverting step %d (%s): %w", i, f.steps[i].Kind(), err)
		}
	}
	return cur, nil
}

// Input returns the schema of the train frame the pipeline was fitted on.
func (f *Fitted) Input() tabprep.Schema { return f.input.Clone() }

// Output returns the schema of the transformed train frame.
func (f *Fitted) Output() tabprep.Schema { return f.output.Clone() }

// OutputNames returns the output column names in order.
func (f *Fitted) OutputNames() []string { return f.output.Names() }

// Training returns the fingerprint of the train rows.
func (f *Fitted) Training() state.Fingerprint { return f.training }

// NumSteps returns the number of steps.
func (f *Fitted) NumSteps() int { return len(f.steps) }

// Step returns fitted step i: its kind, spec and learned parameters. It
// panics if i is out of range.
func (f *Fitted) Step(i int) state.Fitted { return f.steps[i] }

// Document returns the state document of f.
func (f *Fitted) Document() (*state.Document, error) {
	return state.NewDocument(f.steps, f.input, f.output, f.training)
}

// Save writes f as a state document.
func (f *Fitted) Save(w io.Writer) error {
	doc, err := f.Document()
	if err != nil {
		return err
	}
	return state.Write(w, doc)
}

// SaveFile writes f as a state document to the named file.
func (f *Fitted) SaveFile(path string) error {
	out, err := os.Create(path)
	if err != nil {
		return fmt.Errorf("pipeline: %w", err)
	}
	if err := f.Save(out); err != nil {
		out.Close()
		return err
	}
	return out.Close()
}

// Load reads a state document written by [Fitted.Save] and rebuilds the
// fitted pipeline. Decoding is strict; see [state.Read].
func Load(r io.Reader) (*Fitted, error) {
	return LoadWith(r, state.ReadOptions{})
}

// LoadWith is [Load] with read options such as a size limit.
func LoadWith(r io.Reader, opts state.ReadOptions) (*Fitted, error) {
	doc, err := state.Read(r, opts)
	if err != nil {
		return nil, err
	}
	return FromDocument(doc)
}

// LoadFile reads a state document from the named file.
func LoadFile(path string) (*Fitted, error) {
	in, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("pipeline: %w", err)
	}
	defer in.Close()
	return Load(in)
}

// FromDocument rebuilds a fitted pipeline from a checked document.
func FromDocument(doc *state.Document) (*Fitted, error) {
	steps, err := doc.FittedSteps()
	if err != nil {
		return nil, err
	}
	return &Fitted{input: doc.Input, output: doc.Output, steps: steps, training: doc.Training}, nil
}
