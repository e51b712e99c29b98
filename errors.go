package tabprep

import (
	"errors"
	"fmt"
	"strings"
)

// Sentinel errors. An *[Error] wraps one of them, so callers can write
// errors.Is(err, tabprep.ErrHoldout).
var (
	// ErrHoldout: a fit was given rows tagged holdout.
	ErrHoldout = errors.New("holdout rows in fit")
	// ErrNoColumn: a named column does not exist, or a selection matched none.
	ErrNoColumn = errors.New("no such column")
	// ErrKind: a column has the wrong kind for the operation.
	ErrKind = errors.New("wrong column kind")
	// ErrLength: columns or role lists of unequal length.
	ErrLength = errors.New("length mismatch")
	// ErrName: an empty or duplicate column name.
	ErrName = errors.New("bad column name")
	// ErrRow: a row index out of range.
	ErrRow = errors.New("row out of range")
	// ErrRole: a malformed role or partition name.
	ErrRole = errors.New("bad role")
	// ErrAllMissing: a column has no non-missing value where one is needed.
	ErrAllMissing = errors.New("no values")
	// ErrSchema: a frame does not match the schema an operation expects.
	ErrSchema = errors.New("schema mismatch")
	// ErrCSV: malformed CSV input.
	ErrCSV = errors.New("malformed CSV")
	// ErrValue: a value outside what an operation accepts (non-finite, out of
	// domain, out of range).
	ErrValue = errors.New("bad value")
	// ErrNotInvertible: an inverse was asked of a step that has none.
	ErrNotInvertible = errors.New("not invertible")
	// ErrOption: a step or function was given an invalid option.
	ErrOption = errors.New("bad option")
)

// Error is the error returned for a failure that depends on the data. It
// names where the failure is and what to do about it.
type Error struct {
	Op     string // package and operation, e.g. "scale.zscore fit"
	Column string // column name, "" if none
	Row    int    // 0-based row index, -1 if none
	Line   int    // 1-based CSV line, 0 if none
	Err    error  // one of the sentinel errors
	Msg    string // what happened and what to do
}

// Errorf returns an *Error for op and column that wraps sentinel, with a
// message built from format and args. Row is set to -1 (none).
func Errorf(op string, sentinel error, column, format string, args ...any) *Error {
	return &Error{Op: op, Column: column, Row: -1, Err: sentinel, Msg: fmt.Sprintf(format, args...)}
}

// AtRow returns a copy of e that names row i.
func (e *Error) AtRow(i int) *Error {
	c := *e
	c.Row = i
	return &c
}

// AtLine returns a copy of e that names CSV line n.
func (e *Error) AtLine(n int) *Error {
	c := *e
	c.Line = n
	return &c
}

// Error formats e as "op: line L: column "c": row R: message".
func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.Op)
	b.WriteString(": ")
	if e.Line > 0 {
		fmt.Fprintf(&b, "line %d: ", e.Line)
	}
	if e.Column != "" {
		fmt.Fprintf(&b, "column %q: ", e.Column)
	}
	if e.Row >= 0 {
		fmt.Fprintf(&b, "row %d: ", e.Row)
	}
	if e.Msg != "" {
		b.WriteString(e.Msg)
	} else if e.Err != nil {
		b.WriteString(e.Err.Error())
	}
	return b.String()
}

// Unwrap returns the sentinel error e wraps.
func (e *Error) Unwrap() error { return e.Err }

// RequireTrain returns nil if every row of f is a train row, and otherwise an
// error wrapping [ErrHoldout] that counts the holdout rows and says how to
// select the train rows. Every built-in Fit calls it first.
func RequireTrain(op string, f *Frame) error {
	if f == nil {
		return Errorf(op, ErrSchema, "", "nil frame")
	}
	if n := f.HoldoutCount(); n > 0 {
		return Errorf(op, ErrHoldout, "",
			"%d of %d rows are tagged holdout; fit only on train rows: pass frame.Train() (or frame.Select(tabprep.Train))",
			n, f.NumRows())
	}
	return nil
}
