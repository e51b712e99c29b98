package pipeline_test

import (
	"io"
	"math/rand/v2"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/impute"
	"github.com/tabprep/tabprep/pipeline"
)

func TestWriteGoRefuses(t *testing.T) {
	train := randomFrame(rand.New(rand.NewPCG(3, 4)), 50)
	fit := func(stages ...pipeline.Stage) *pipeline.Fitted {
		f, err := pipeline.New(stages...).Fit(train)
		require.NoError(t, err)
		return f
	}
	encoded := fit(pipeline.Use(impute.Mean{}), pipeline.Use(encode.OneHot{}))
	for _, tc := range []struct {
		name   string
		fitted *pipeline.Fitted
		opt    pipeline.GoOptions
		want   string
	}{
		{"step without source", fit(pipeline.Use(center{Column: "pet_age"}), pipeline.Use(encode.OneHot{})), pipeline.GoOptions{Package: "p"},
			"pipeline: generate: step 0 (pipetest.center) has no Go source form: pipetest.center: step has no Go source form; serve it with Fitted.Compile"},
		{"categorical output", fit(pipeline.Use(impute.Mean{})), pipeline.GoOptions{Package: "p"},
			`pipeline: generate: output column "species" is categorical; generated plans write numbers only, so encode it in the pipeline`},
		{"package name", encoded, pipeline.GoOptions{Package: "my-plan"},
			`pipeline: generate: package name "my-plan" is not a Go identifier`},
		{"no package", encoded, pipeline.GoOptions{},
			`pipeline: generate: package name "" is not a Go identifier`},
		{"variable name", encoded, pipeline.GoOptions{Package: "p", Name: "plan"},
			`pipeline: generate: variable name "plan" is not an exported Go identifier`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			require.EqualError(t, tc.fitted.WriteGo(io.Discard, tc.opt), tc.want)
		})
	}
}

func TestCompileWithRefuses(t *testing.T) {
	train := randomFrame(rand.New(rand.NewPCG(5, 6)), 50)
	fitted, err := pipeline.New(pipeline.Use(impute.Mean{}), pipeline.Use(encode.OneHot{})).Fit(train)
	require.NoError(t, err)
	_, err = fitted.CompileWith(pipeline.Generated{})
	require.ErrorIs(t, err, tabprep.ErrSchema)
	require.Regexp(t, `^pipeline: compile: schema mismatch: the generated plan has digest "", but this fitted pipeline generates "sha256:[0-9a-f]{64}": it was generated from other steps or parameters; regenerate it with Fitted.WriteGo$`, err.Error())

	// The right digest without a function is refused too.
	var b strings.Builder
	require.NoError(t, fitted.WriteGo(&b, pipeline.GoOptions{Package: "p"}))
	digest := regexp.MustCompile(`sha256:[0-9a-f]{64}`).FindString(b.String())
	_, err = fitted.CompileWith(pipeline.Generated{Digest: digest})
	require.EqualError(t, err, "pipeline: compile: schema mismatch: the generated plan has no ApplyFloats function; pass the variable Fitted.WriteGo declares")
}
