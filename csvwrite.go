package tabprep

import (
	"bufio"
	"io"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"
)

const csvWriteOp = "tabprep.csv write"

// CSVWriter writes frames as one CSV document, chunk by chunk: the header
// once, with the first frame, then the rows of each frame in turn. Every
// frame must have the columns of the first, with the same kinds, in the
// same order. Output is buffered; call [CSVWriter.Flush] at the end.
//
// Whether the role column is written is decided at the first frame: it is
// when that frame holds a holdout row or [CSVOptions.WriteRoles] is set. A
// later frame with holdout rows and no role column in the header is an
// error, so set WriteRoles when streaming frames that may hold them.
//
// A CSVWriter is not safe for concurrent use.
type CSVWriter struct {
	cfg     *csvConfig
	w       *bufio.Writer
	started bool
	names   []string
	kinds   []Kind
	roles   bool
	alone   bool   // whether a record is one field, so an empty field needs quotes
	na      []byte // the missing token as a field, quoted if need be
	numQ    bool   // whether a formatted number may need quotes (the separator is a digit, '.', 'e', ...)
	buf     []byte
	err     error // sticky I/O error
}

// NewCSVWriter returns a writer of CSV to w; opts may be nil for the
// defaults. It writes nothing until the first [CSVWriter.Write].
func NewCSVWriter(w io.Writer, opts *CSVOptions) (*CSVWriter, error) {
	cfg, err := newCSVConfig(csvWriteOp, opts)
	if err != nil {
		return nil, err
	}
	return &CSVWriter{
		cfg:  cfg,
		w:    bufio.NewWriterSize(w, 64<<10),
		numQ: strings.ContainsRune("0123456789.eE+-", cfg.comma),
	}, nil
}

// Write writes the rows of f, and the header before the first frame's rows.
// It checks all of f before writing any of it, and refuses what could not
// be read back the same (see [WriteCSV]); errors name the column and the
// row of f.
func (w *CSVWriter) Write(f *Frame) error {
	if w.err != nil {
		return w.err
	}
	if !w.started {
		if err := w.plan(f); err != nil {
			return err
		}
	} else if err := w.sameColumns(f); err != nil {
		return err
	}
	if f.HoldoutCount() > 0 && !w.roles {
		return Errorf(csvWriteOp, ErrSchema, "", "frame has %d holdout rows, but the header, written with the first frame, has no role column; set CSVOptions.WriteRoles to write roles from the first frame on", f.HoldoutCount())
	}
	cols := make([]csvOut, f.NumCols())
	for i, c := range f.cols {
		if err := cols[i].prepare(w, c); err != nil {
			return err
		}
	}
	var roles [][]byte // encoded field per role code
	if w.roles {
		roles = append(roles, w.field(nil, Train.String(), false))
		for _, p := range f.roles.parts {
			r := Holdout(p)
			if back, err := ParseRole(r.String()); err != nil || back != r {
				return Errorf(csvWriteOp, ErrRole, w.cfg.roleColumn, "partition %q would not read back as itself; rename it without surrounding spaces", p)
			}
			roles = append(roles, w.field(nil, r.String(), false))
		}
	}
	buf := w.buf[:0]
	if !w.started {
		buf = w.header(buf, f)
		w.started = true
	}
	for i := 0; i < f.rows; i++ {
		if w.roles {
			code := 0
			if f.roles.codes != nil {
				code = int(f.roles.codes[i])
			}
			buf = append(buf, roles[code]...)
			buf = utf8.AppendRune(buf, w.cfg.comma)
		}
		for j := range cols {
			if j > 0 {
				buf = utf8.AppendRune(buf, w.cfg.comma)
			}
			buf = cols[j].append(w, buf, i)
		}
		buf = append(buf, '\n')
		if len(buf) >= 32<<10 {
			if _, err := w.w.Write(buf); err != nil {
				w.err = err
				return err
			}
			buf = buf[:0]
		}
	}
	_, err := w.w.Write(buf)
	w.buf = buf[:0]
	w.err = err
	return err
}

// Flush writes any buffered output to the underlying writer.
func (w *CSVWriter) Flush() error {
	if w.err != nil {
		return w.err
	}
	w.err = w.w.Flush()
	return w.err
}

// plan fixes, from the first frame, the columns and whether roles are
// written; the header itself is written with the first rows, once the
// whole frame is known to be writable.
func (w *CSVWriter) plan(f *Frame) error {
	if f.NumCols() == 0 {
		return Errorf(csvWriteOp, ErrSchema, "", "frame has no columns; CSV needs at least one")
	}
	for _, c := range f.cols {
		if c.name == w.cfg.roleColumn {
			return Errorf(csvWriteOp, ErrName, c.name, "column has the role column's name, so it would be read back as roles; rename the column or set CSVOptions.RoleColumn to another name")
		}
	}
	w.names, w.kinds = f.Names(), make([]Kind, f.NumCols())
	for i, c := range f.cols {
		w.kinds[i] = c.kind
	}
	w.roles = w.cfg.writeRoles || f.HoldoutCount() > 0
	w.alone = f.NumCols() == 1 && !w.roles
	w.na = w.field(nil, w.cfg.writeNA, w.alone)
	return nil
}

func (w *CSVWriter) header(buf []byte, f *Frame) []byte {
	if w.roles {
		buf = w.field(buf, w.cfg.roleColumn, false)
	}
	for i, c := range f.cols {
		if i > 0 || w.roles {
			buf = utf8.AppendRune(buf, w.cfg.comma)
		}
		buf = w.field(buf, c.name, false)
	}
	return append(buf, '\n')
}

func (w *CSVWriter) sameColumns(f *Frame) error {
	if f.NumCols() != len(w.names) {
		return Errorf(csvWriteOp, ErrSchema, "", "frame has %d columns, the header has %d; write frames of one schema", f.NumCols(), len(w.names))
	}
	for i, c := range f.cols {
		if c.name != w.names[i] || c.kind != w.kinds[i] {
			return Errorf(csvWriteOp, ErrSchema, c.name, "column %d is %q (%v), the header has %q (%v); write frames of one schema",
				i, c.name, c.kind, w.names[i], w.kinds[i])
		}
	}
	return nil
}

// field appends s to dst as a CSV field, quoted when the reader would
// otherwise read it differently. alone says the field is a whole record,
// where an empty field would be a blank line, which readers skip.
func (w *CSVWriter) field(dst []byte, s string, alone bool) []byte {
	if !w.needsQuotes(s) && !(alone && s == "") {
		return append(dst, s...)
	}
	dst = append(dst, '"')
	if strings.Contains(s, "\r\n") {
		s = crlf.Replace(s)
	}
	for {
		i := strings.IndexByte(s, '"')
		if i < 0 {
			break
		}
		dst = append(dst, s[:i+1]...)
		dst = append(dst, '"')
		s = s[i+1:]
	}
	dst = append(dst, s...)
	return append(dst, '"')
}

// crlf escapes "\r\n" inside a quoted field as "\r\r\n": encoding/csv,
// which ReadCSV uses, turns a "\r\n" line ending into "\n", so that is what
// reads back as "\r\n". (A reader that keeps line endings as they are would
// see the extra "\r".)
var crlf = strings.NewReplacer("\r\n", "\r\r\n")

func (w *CSVWriter) needsQuotes(s string) bool {
	if s == "" {
		return false
	}
	// A leading space or tab is quoted for readers that trim it; a leading
	// byte order mark would be dropped at the start of the document.
	if s[0] == ' ' || s[0] == '\t' || strings.HasPrefix(s, "\ufeff") {
		return true
	}
	return strings.ContainsAny(s, "\"\r\n") || strings.ContainsRune(s, w.cfg.comma)
}

// csvOut writes the cells of one column of one frame.
type csvOut struct {
	col    *Column
	levels [][]byte // categorical: each level as a field; nil for unused levels
}

func (o *csvOut) prepare(w *CSVWriter, c *Column) error {
	o.col = c
	if c.kind == Numeric {
		for i, v := range c.nums {
			if math.IsInf(v, 0) {
				return Errorf(csvWriteOp, ErrValue, c.name, "%v cannot be written: CSV input refuses non-finite numbers; replace it (clip, or set it missing) first", v).AtRow(i)
			}
		}
		return nil
	}
	o.levels = make([][]byte, len(c.levels))
	for i, k := range c.codes {
		if k == MissingCode || o.levels[k] != nil {
			continue
		}
		l := c.levels[k]
		if w.cfg.isMissing(l) {
			return Errorf(csvWriteOp, ErrValue, c.name, "level %q is a missing token, so it would read back as missing; rename the level or set CSVOptions.Missing to tokens no level uses", l).AtRow(i)
		}
		o.levels[k] = w.field(nil, l, w.alone)
	}
	return nil
}

func (o *csvOut) append(w *CSVWriter, dst []byte, i int) []byte {
	if o.col.kind == Numeric {
		v := o.col.nums[i]
		if v != v {
			return append(dst, w.na...)
		}
		if !w.numQ {
			return strconv.AppendFloat(dst, v, 'g', -1, 64)
		}
		return w.field(dst, strconv.FormatFloat(v, 'g', -1, 64), w.alone)
	}
	k := o.col.codes[i]
	if k == MissingCode {
		return append(dst, w.na...)
	}
	return append(dst, o.levels[k]...)
}
