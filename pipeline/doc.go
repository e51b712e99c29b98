// Package pipeline composes tabprep steps, fits them on train rows only,
// applies the fitted result to any rows, and saves and loads it as a state
// document.
//
// A [Pipeline] is a list of stages made with [Use]. [Pipeline.Fit] refuses a
// frame that holds holdout rows, then fits step i on the train rows as
// transformed by steps 0 to i−1, and returns a [Fitted] pipeline. A Fitted
// pipeline is immutable and safe for concurrent use by many goroutines.
//
// The package imports the built-in step packages, so [Load] can rebuild any
// built-in step without blank imports.
package pipeline
