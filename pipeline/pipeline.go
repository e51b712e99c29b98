package pipeline

import (
	"fmt"
	"slices"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/state"
)

// Stage is one step of a pipeline before fitting. Make one with [Use].
type Stage interface {
	// Kind returns the step kind.
	Kind() string
	// fit learns the step's parameters from train and returns the fitted
	// step and train transformed as the next stage must see it.
	fit(train *tabprep.Frame) (state.Fitted, *tabprep.Frame, error)
	// targets returns the target columns the step learns from, if any.
	targets() []string
}

// stage adapts a tabprep.Step of any parameter type to Stage.
type stage[S tabprep.Step[P], P any] struct{ step S }

// Use wraps a step as a pipeline stage. The parameter type is inferred from
// the step's methods: pipeline.Use(scale.ZScore{}) needs no type argument.
func Use[S tabprep.Step[P], P any](s S) Stage { return stage[S, P]{step: s} }

func (s stage[S, P]) Kind() string { return s.step.Kind() }

func (s stage[S, P]) targets() []string {
	if sv, ok := any(s.step).(tabprep.Supervised); ok {
		return sv.Targets()
	}
	return nil
}

func (s stage[S, P]) fit(train *tabprep.Frame) (state.Fitted, *tabprep.Frame, error) {
	if oof, ok := any(s.step).(tabprep.OutOfFold[P]); ok {
		p, out, err := oof.FitOutOfFold(train)
		if err != nil {
			return nil, nil, err
		}
		return state.Bind(s.step, p), out, nil
	}
	p, err := s.step.Fit(train)
	if err != nil {
		return nil, nil, err
	}
	out, err := s.step.Transform(p, train)
	if err != nil {
		return nil, nil, err
	}
	return state.Bind(s.step, p), out, nil
}

// Pipeline is an ordered list of stages, not yet fitted.
type Pipeline struct {
	stages []Stage
}

// New returns a pipeline of the given stages, applied in order. It panics if
// a stage is nil.
func New(stages ...Stage) *Pipeline {
	for i, s := range stages {
		if s == nil {
			panic(fmt.Sprintf("pipeline: stage %d is nil", i))
		}
	}
	return &Pipeline{stages: append([]Stage(nil), stages...)}
}

// Fit fits every stage in order on train, which must hold train rows only:
// a frame with holdout rows is refused with an error wrapping
// [tabprep.ErrHoldout]. Step i is fitted on the output of steps 0 to i−1;
// a step with out-of-fold values for its training rows (such as target
// encoding) passes those values on, not its in-fold transform.
//
// Target columns, those named by a [tabprep.Supervised] step, are given to
// the steps that ask for them and to no other: they are not part of the
// fitted input schema or the output, so rows to transform need not have them.
func (p *Pipeline) Fit(train *tabprep.Frame) (*Fitted, error) {
	if err := tabprep.RequireTrain("pipeline.fit", train); err != nil {
		return nil, err
	}
	targets, err := p.targets(train)
	if err != nil {
		return nil, err
	}
	cur := train
	if len(targets) > 0 {
		if cur, err = train.Without(names(targets)...); err != nil {
			return nil, err
		}
	}
	f := &Fitted{
		input:    cur.Schema(),
		steps:    make([]state.Fitted, len(p.stages)),
		training: state.FingerprintOf(train),
	}
	for i, s := range p.stages {
		in := cur
		wanted := s.targets()
		if len(wanted) > 0 {
			cols := make([]*tabprep.Column, len(wanted))
			for j, n := range wanted {
				cols[j] = targets[n]
			}
			if in, err = cur.With(cols...); err != nil {
				return nil, fmt.Errorf("pipeline: fitting step %d (%s): %w", i, s.Kind(), err)
			}
		}
		fs, out, err := s.fit(in)
		if err != nil {
			return nil, fmt.Errorf("pipeline: fitting step %d (%s): %w", i, s.Kind(), err)
		}
		for _, n := range wanted {
			if out.Has(n) {
				if out, err = out.Without(n); err != nil {
					return nil, err
				}
			}
		}
		f.steps[i] = fs
		cur = out
	}
	f.output = cur.Schema()
	return f, nil
}

// targets returns the target columns the supervised stages name, by name.
func (p *Pipeline) targets(train *tabprep.Frame) (map[string]*tabprep.Column, error) {
	out := map[string]*tabprep.Column{}
	for i, s := range p.stages {
		for _, n := range s.targets() {
			c, err := train.Column(n)
			if err != nil {
				return nil, fmt.Errorf("pipeline: step %d (%s) learns from target column %q, which train lacks: %w", i, s.Kind(), n, err)
			}
			out[n] = c
		}
	}
	return out, nil
}

func names(m map[string]*tabprep.Column) []string {
	out := make([]string, 0, len(m))
	for n := range m {
		out = append(out, n)
	}
	slices.Sort(out)
	return out
}
