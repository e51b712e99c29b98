// Package pipeline composes tabprep steps, fits them on train rows only,
// applies the fitted result to any rows, and saves and loads it as a state
// document.
//
// A [Pipeline] is a list of stages made with [Use]. [Pipeline.Fit] refuses a
// frame that holds holdout rows, then fits step i on the train rows as
// transformed by steps 0 to i−1, and returns a [Fitted] pipeline. A Fitted
// pipeline is immutable and safe for concurrent use by many goroutines.
// Target columns, those a [tabprep.Supervised] step learns from, reach only
// that step: they are not part of the fitted input or output.
//
// # Applying
//
//   - [Fitted.Transform] applies the steps to a frame; [Fitted.Inverse]
//     undoes a run of invertible steps.
//   - [Fitted.Compile] returns a [Plan] for one row at a time: no
//     allocation, no column-name lookup and no reflection per row, and the
//     same bits as Transform. [Plan.TransformInto] scores a batch into a
//     matrix the caller owns; a [Runner] gives a scoring loop its own
//     registers.
//   - [Fitted.WriteGo] writes the plan as Go source, with the fitted
//     numbers and levels as constants and switches, and
//     [Fitted.CompileWith] runs that code, compiled into the program, in
//     place of the interpreted plan: several times faster per row, with
//     the same bits and errors (a row the code cannot finish goes through
//     the interpreted plan).
//   - [Fitted.Stream] transforms CSV larger than memory, chunk by chunk.
//
// # Saving
//
// [Fitted.Save] writes a state document (see package state) and [Load]
// reads one back; Save → Load → Transform is bit-identical to the fitted
// pipeline in memory. The package imports the built-in step packages, so
// Load can rebuild any built-in step without blank imports.
package pipeline
