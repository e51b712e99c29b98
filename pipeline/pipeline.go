package pipeline

import (
	"fmt"

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
}

// stage adapts a tabprep.Step of any parameter type to Stage.
type stage[S tabprep.Step[P], P any] struct{ step S }

// Use wraps a step as a pipeline stage. The parameter type is inferred from
// the step's methods: pipeline.Use(scale.ZScore{}) needs no type argument.
func Use[S tabprep.Step[P], P any](s S) Stage { return stage[S, P]{step: s} }

func (s stage[S, P]) Kind() string { return s.step.Kind() }

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
func (p *Pipeline) Fit(train *tabprep.Frame) (*Fitted, error) {
	if err := tabprep.RequireTrain("pipeline.fit", train); err != nil {
		return nil, err
	}
	f := &Fitted{
		input:    train.Schema(),
		steps:    make([]state.Fitted, len(p.stages)),
		training: state.FingerprintOf(train),
	}
	cur := train
	for i, s := range p.stages {
		fs, out, err := s.fit(cur)
		if err != nil {
			return nil, fmt.Errorf("pipeline: fitting step %d (%s): %w", i, s.Kind(), err)
		}
		f.steps[i] = fs
		cur = out
	}
	f.output = cur.Schema()
	return f, nil
}
