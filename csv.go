package tabprep

import (
	"io"
	"math"
	"strconv"
	"unicode/utf8"
)

// DefaultRoleColumn is the name of the CSV column that holds each row's
// [Role] unless [CSVOptions.RoleColumn] names another.
const DefaultRoleColumn = "_role"

// DefaultChunkRows is the number of rows per frame a [CSVReader] returns
// unless [CSVOptions.ChunkRows] sets another.
const DefaultChunkRows = 1 << 16

// DefaultMissing returns the cell texts read as missing unless
// [CSVOptions.Missing] lists others: the empty cell, "NA", "NaN" and "null".
// It returns a new slice on each call.
func DefaultMissing() []string { return []string{"", "NA", "NaN", "null"} }

// CSVOptions configures reading and writing CSV. The zero value, like a nil
// *CSVOptions, means every default.
//
// Reading: the first non-blank line is the header and names the columns.
// A column is numeric when every non-missing cell parses with
// strconv.ParseFloat, and categorical otherwise, unless Kinds says which.
// Cells are taken as they are: no space is trimmed, so " 1" is not a number.
// A column whose cells are all missing is numeric. A column named RoleColumn
// holds the rows' roles (see [ParseRole]) and is not read as data.
//
// Writing: numbers are written in the shortest form that parses back to the
// same float64 (strconv.FormatFloat with 'g' and precision -1), missing
// cells as Missing[0], and the role column, first, when some row is holdout
// or WriteRoles is set.
type CSVOptions struct {
	// Comma is the field separator; 0 means ','. It may not be '"', '\r',
	// '\n' or an invalid rune.
	Comma rune

	// Missing lists the cell texts that mean a missing cell; nil means
	// [DefaultMissing]. The empty cell is always missing, listed or not,
	// since a categorical level is never empty. The writer writes missing
	// cells as Missing[0] ("" when Missing is empty). A token that parses as
	// a finite number is refused, since a number must never read as missing.
	Missing []string

	// Kinds fixes the kind of the named columns instead of inferring it.
	// Give it when inference would guess wrong, such as a categorical column
	// of digit strings (postcodes, clinic numbers) or a column whose first
	// chunk is all missing.
	Kinds map[string]Kind

	// RoleColumn names the column that holds row roles; "" means
	// [DefaultRoleColumn].
	RoleColumn string

	// WriteRoles makes the writer write the role column even when every row
	// is train. A [CSVWriter] decides at its first frame, so set it when a
	// later frame may hold holdout rows.
	WriteRoles bool

	// ChunkRows is the most rows per frame a [CSVReader] returns; 0 means
	// [DefaultChunkRows]. [ReadCSV] ignores it.
	ChunkRows int
}

// csvConfig is CSVOptions checked and with defaults filled in.
type csvConfig struct {
	comma      rune
	missing    []string // every token but "", which is always missing
	writeNA    string   // what the writer writes for a missing cell
	kinds      map[string]Kind
	roleColumn string
	writeRoles bool
	chunkRows  int
}

func newCSVConfig(op string, o *CSVOptions) (*csvConfig, error) {
	if o == nil {
		o = &CSVOptions{}
	}
	c := &csvConfig{comma: o.Comma, kinds: o.Kinds, roleColumn: o.RoleColumn, writeRoles: o.WriteRoles, chunkRows: o.ChunkRows}
	if c.comma == 0 {
		c.comma = ','
	}
	if c.comma == '"' || c.comma == '\r' || c.comma == '\n' || !utf8.ValidRune(c.comma) || c.comma == utf8.RuneError {
		return nil, Errorf(op, ErrOption, "", "CSVOptions.Comma %q cannot separate fields; use ',', ';', '\\t' or another plain character", c.comma)
	}
	missing := o.Missing
	if missing == nil {
		missing = DefaultMissing()
	}
	if len(missing) > 0 {
		c.writeNA = missing[0]
	}
	for _, m := range missing {
		if v, err := strconv.ParseFloat(m, 64); err == nil && !math.IsInf(v, 0) && !math.IsNaN(v) {
			return nil, Errorf(op, ErrOption, "", "CSVOptions.Missing token %q is a number, so numbers would read as missing; choose a token that is not a number", m)
		}
		if m != "" {
			c.missing = append(c.missing, m)
		}
	}
	if c.roleColumn == "" {
		c.roleColumn = DefaultRoleColumn
	}
	if c.chunkRows < 0 {
		return nil, Errorf(op, ErrOption, "", "CSVOptions.ChunkRows %d is negative; use 0 for the default (%d) or a positive count", c.chunkRows, DefaultChunkRows)
	}
	if c.chunkRows == 0 {
		c.chunkRows = DefaultChunkRows
	}
	for name, k := range c.kinds {
		if k != Numeric && k != Categorical {
			return nil, Errorf(op, ErrOption, name, "CSVOptions.Kinds gives %v; use tabprep.Numeric or tabprep.Categorical", k)
		}
		if name == c.roleColumn {
			return nil, Errorf(op, ErrOption, name, "CSVOptions.Kinds names the role column, which holds roles, not data; remove it from Kinds or set CSVOptions.RoleColumn")
		}
	}
	return c, nil
}

// isMissing reports whether the cell text s means a missing cell.
func (c *csvConfig) isMissing(s string) bool {
	if s == "" {
		return true
	}
	for _, m := range c.missing {
		if s == m {
			return true
		}
	}
	return false
}

// ReadCSV reads a whole CSV document into one frame. opts may be nil for the
// defaults; see [CSVOptions] for the rules of the header, kind inference,
// missing cells and roles. A UTF-8 byte order mark at the start is skipped.
//
// Kinds are inferred from every row. Errors are *[Error] values that name
// the line and, where there is one, the column, and wrap [ErrCSV] (malformed
// input: no header, ragged rows, bad quoting), [ErrName] (empty or
// duplicate header names), [ErrValue] (a non-finite number, or text in a
// column given as numeric), [ErrRole] (a bad role), [ErrNoColumn] (Kinds
// names a column the header lacks) or [ErrOption].
//
// ReadCSV holds the whole input in memory once, as columns; use a
// [CSVReader] for input larger than memory.
func ReadCSV(r io.Reader, opts *CSVOptions) (*Frame, error) {
	cr, err := newCSVReader(r, opts, math.MaxInt)
	if err != nil {
		return nil, err
	}
	return cr.Next()
}

// WriteCSV writes f as CSV to w, header first; opts may be nil for the
// defaults. The output read back by [ReadCSV] with the same options, and
// with Kinds set for any column whose kind inference would not recover
// (such as a categorical column of digit strings), is [Equal] to f, roles
// included.
//
// WriteCSV refuses, before writing anything, a frame it could not write
// faithfully: an infinite number, a level equal to a missing token or
// holding "\r\n" (which CSV readers turn into "\n"), a column named like the
// role column, or a frame without columns.
func WriteCSV(w io.Writer, f *Frame, opts *CSVOptions) error {
	cw, err := NewCSVWriter(w, opts)
	if err != nil {
		return err
	}
	if err := cw.Write(f); err != nil {
		return err
	}
	return cw.Flush()
}
