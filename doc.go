// Package tabprep is the data model shared by every tabprep package: the
// [Frame] of typed columns with a [Role] per row, the [Schema], CSV input and
// output, the [Step] contract that every transformer implements, and the
// errors callers test for.
//
// # Conventions
//
// Columns are immutable. A transform returns a new [Frame] that shares every
// column it did not change, so a transform never modifies its input and costs
// nothing for the columns it leaves alone.
//
// A numeric column holds float64 values; NaN means missing. A categorical
// column is dictionary encoded: a list of distinct non-empty levels and one
// int32 code per row, with [MissingCode] for a missing cell. The empty string
// always means missing, never a level.
//
// Every row has a role: train, or holdout in a named partition such as
// "validation" or "test". Only train rows may be used to fit: [RequireTrain]
// reports a frame that holds holdout rows with an error that satisfies
// errors.Is(err, [ErrHoldout]). Roles survive row selection, concatenation,
// every transform and a CSV round trip.
//
// # CSV
//
// [ReadCSV] and [WriteCSV] read and write CSV with a header, kind inference
// per column (numeric when every non-missing cell parses), missing tokens
// and a role column, so a written frame reads back equal, roles included.
// [CSVReader] reads a file larger than memory in frames of a fixed number of
// rows; its column kinds come from the first chunk unless
// [CSVOptions.Kinds] fixes them.
//
// # Steps
//
// A step is a value that holds what the user chose (columns, options). Its
// Fit learns parameters P from train rows; its Transform applies P to any
// rows and is a pure function of (P, data). Optional capabilities are extra
// interfaces found by type assertion: [Inverter], [RowKernel] (for compiled
// serving plans, against a [RowLayout]), [RowSource] (the same kernel as Go
// source, for plans generated ahead of time, written with a
// [SourceWriter]), [Accumulating] (chunked fits), [OutOfFold] and
// [Supervised] (steps that learn from a target column).
//
// # Errors
//
// Failures that depend on data are returned as *[Error] values, which carry
// the column, the row or CSV line where there is one, and say what to do.
// Each wraps one of the sentinel errors below, for errors.Is. Functions panic
// only on a programming mistake visible in the code, and say so.
package tabprep

// Version is the library version recorded in saved state documents.
const Version = "0.1.0"
