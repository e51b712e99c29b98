package tabprep

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"iter"
	"math"
	"strconv"
	"strings"
)

const csvReadOp = "tabprep.csv read"

// CSVReader reads a CSV document as a sequence of frames of at most
// [CSVOptions.ChunkRows] rows each, so that input larger than memory can be
// processed chunk by chunk. Memory use is bounded by the chunk size (and the
// distinct levels of one chunk), not by the input size.
//
// Kinds are inferred from the first chunk alone, unless [CSVOptions.Kinds]
// fixes them, and stay fixed for the later chunks: a later cell that is not
// a number in a column the first chunk made numeric is an error that names
// the line and column and suggests the override. Each chunk has its own
// categorical levels, in order of first appearance in that chunk;
// [Concat] merges them. Line numbers in errors count from the start of the
// input, across chunks.
//
// A CSVReader is not safe for concurrent use.
type CSVReader struct {
	cfg   *csvConfig
	cr    *csv.Reader
	chunk int
	cols  []*csvColumn // data columns, in header order
	role  int          // field index of the role column, -1 if none
	width int          // fields per record
	names []string     // header fields, for ragged-row messages
	calls int          // chunks returned so far
	first [2]int       // first and last line of the first chunk
	err   error        // sticky: returned by every call after the first failure
}

// NewCSVReader reads the header of the CSV document in r and returns a
// reader of its rows; opts may be nil for the defaults. Errors in the
// header or the options are returned here; see [ReadCSV] for the rules and
// the errors.
func NewCSVReader(r io.Reader, opts *CSVOptions) (*CSVReader, error) {
	return newCSVReader(r, opts, 0)
}

// newCSVReader is NewCSVReader with chunk rows per frame; 0 means the
// options' ChunkRows.
func newCSVReader(r io.Reader, opts *CSVOptions, chunk int) (*CSVReader, error) {
	cfg, err := newCSVConfig(csvReadOp, opts)
	if err != nil {
		return nil, err
	}
	if chunk == 0 {
		chunk = cfg.chunkRows
	}
	br := bufio.NewReaderSize(r, 64<<10)
	if b, err := br.Peek(3); err == nil && string(b) == "\xef\xbb\xbf" {
		br.Discard(3) // cannot fail: the bytes are buffered
	}
	cr := csv.NewReader(br)
	cr.Comma = cfg.comma
	cr.FieldsPerRecord = -1 // ragged rows are reported by us, with the column
	cr.ReuseRecord = true
	d := &CSVReader{cfg: cfg, cr: cr, chunk: chunk, role: -1}
	if err := d.readHeader(); err != nil {
		return nil, err
	}
	return d, nil
}

func (d *CSVReader) readHeader() error {
	rec, err := d.cr.Read()
	if err == io.EOF {
		return Errorf(csvReadOp, ErrCSV, "", "no header: the input is empty; the first line must name the columns").AtLine(1)
	}
	if err != nil {
		return wrapCSVError(err)
	}
	line, _ := d.cr.FieldPos(0)
	d.width = len(rec)
	d.names = make([]string, len(rec))
	seen := make(map[string]int, len(rec))
	for i, name := range rec {
		d.names[i] = strings.Clone(name)
		if name == "" {
			return Errorf(csvReadOp, ErrName, "", "header field %d is empty; name every column", i+1).AtLine(line)
		}
		if j, dup := seen[name]; dup {
			return Errorf(csvReadOp, ErrName, name, "header names this column twice (fields %d and %d); names must be distinct", j+1, i+1).AtLine(line)
		}
		seen[name] = i
		if name == d.cfg.roleColumn {
			d.role = i
			continue
		}
		c := &csvColumn{name: d.names[i], field: i, kind: d.cfg.kinds[name], fixed: true}
		if c.kind == 0 {
			c.fixed = false
		}
		d.cols = append(d.cols, c)
	}
	if len(d.cols) == 0 {
		return Errorf(csvReadOp, ErrCSV, "", "header has no data columns; the first line must name the columns").AtLine(line)
	}
	for name := range d.cfg.kinds {
		if _, ok := seen[name]; !ok {
			return Errorf(csvReadOp, ErrNoColumn, name, "CSVOptions.Kinds names a column the header lacks; the header has %s", nameList(d.names)).AtLine(line)
		}
	}
	return nil
}

// wrapCSVError turns an error of encoding/csv into an *Error that names the
// line and says how to fix the input.
func wrapCSVError(err error) error {
	var pe *csv.ParseError
	if !errors.As(err, &pe) {
		return err // an I/O error of the underlying reader
	}
	advice := "check the quoting of this line"
	switch {
	case errors.Is(pe.Err, csv.ErrBareQuote):
		advice = "a field that holds a quote must be enclosed in quotes, each quote inside doubled"
	case errors.Is(pe.Err, csv.ErrQuote):
		advice = "a quoted field must end with a quote followed by a separator or the end of the line"
	}
	where := ""
	if pe.StartLine != pe.Line {
		where = fmt.Sprintf(" (in the record that starts on line %d)", pe.StartLine)
	}
	return Errorf(csvReadOp, ErrCSV, "", "%v at byte %d of the line%s; %s", pe.Err, pe.Column, where, advice).AtLine(pe.Line)
}

// Next returns the next frame of at most [CSVOptions.ChunkRows] rows, or
// io.EOF after the last. The first call always returns a frame, with no
// rows if the input has only a header, so the columns are known. After an
// error other than io.EOF every later call returns the same error.
func (d *CSVReader) Next() (*Frame, error) {
	if d.err != nil {
		return nil, d.err
	}
	f, err := d.next()
	if err != nil {
		d.err = err
		return nil, err
	}
	d.calls++
	return f, nil
}

// Chunks returns an iterator over the remaining frames. It yields each frame
// with a nil error, and stops after io.EOF, or after yielding a nil frame
// with the error that ended the reading. It is single-use: the frames come
// from the one underlying input.
func (d *CSVReader) Chunks() iter.Seq2[*Frame, error] {
	return func(yield func(*Frame, error) bool) {
		for {
			f, err := d.Next()
			if err == io.EOF {
				return
			}
			if !yield(f, err) || err != nil {
				return
			}
		}
	}
}

func (d *CSVReader) next() (*Frame, error) {
	var roles roleBuilder
	rows, firstLine, lastLine := 0, 0, 0
	for rows < d.chunk {
		rec, err := d.cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, wrapCSVError(err)
		}
		line, _ := d.cr.FieldPos(0)
		if rows == 0 {
			firstLine = line
		}
		lastLine = line
		if len(rec) != d.width {
			if len(rec) < d.width {
				return nil, Errorf(csvReadOp, ErrCSV, d.names[len(rec)], "row has %d fields, header has %d; give every row one field per header name", len(rec), d.width).AtLine(line)
			}
			return nil, Errorf(csvReadOp, ErrCSV, "", "row has %d fields, header has %d; give every row one field per header name (quote a field that holds the separator)", len(rec), d.width).AtLine(line)
		}
		for _, c := range d.cols {
			if err := c.add(d, rec[c.field]); err != nil {
				return nil, err
			}
		}
		if d.role >= 0 {
			if err := roles.add(rec[d.role]); err != nil {
				line, _ := d.cr.FieldPos(d.role)
				return nil, Errorf(csvReadOp, ErrRole, d.cfg.roleColumn, "%s", err.(*Error).Msg).AtLine(line)
			}
		}
		rows++
	}
	if rows == 0 && d.calls > 0 {
		return nil, io.EOF
	}
	if d.calls == 0 {
		d.first = [2]int{firstLine, lastLine}
	}
	cols := make([]*Column, len(d.cols))
	for i, c := range d.cols {
		col, err := c.finish(d)
		if err != nil {
			return nil, err
		}
		cols[i] = col
	}
	f, err := NewFrame(cols...)
	if err != nil {
		return nil, err // cannot happen: names and lengths are checked
	}
	if roles.table.holdouts() > 0 {
		f.roles = roles.table
	}
	return f, nil
}

// roleBuilder collects the role codes of one chunk.
type roleBuilder struct {
	table roleTable
	seen  map[string]uint8 // role text -> code, to parse each text once
}

func (b *roleBuilder) add(s string) error {
	code, ok := b.seen[s]
	if !ok {
		r, err := ParseRole(s)
		if err != nil {
			return err
		}
		if code, err = b.table.code(r); err != nil {
			return err
		}
		if b.seen == nil {
			b.seen = make(map[string]uint8)
		}
		b.seen[strings.Clone(s)] = code
	}
	b.table.codes = append(b.table.codes, code)
	return nil
}

// csvColumn builds one data column of a chunk. A column whose kind is not
// yet known keeps its parsed numbers and its raw text until a cell fails to
// parse, when it turns categorical, or the chunk ends, when it becomes
// numeric. The text is one byte arena of the cells, each followed by '\n'
// (which no number contains), so there is no string per cell.
type csvColumn struct {
	name  string
	field int  // index in the record
	kind  Kind // 0 while undecided
	fixed bool // kind set by CSVOptions.Kinds, not inferred

	nums blocks[float64] // numeric, and undecided

	text    []byte // undecided: each cell's text and '\n'; an empty cell is missing
	badLine int    // undecided: line of the first non-finite number, 0 if none
	badText string

	codes  blocks[int32] // categorical
	levels []string
	dict   map[string]int32
}

func (c *csvColumn) add(d *CSVReader, s string) error {
	missing := d.cfg.isMissing(s)
	switch c.kind {
	case Categorical:
		c.addLevel(s, missing)
		return nil
	case Numeric:
		if missing {
			c.nums.add(math.NaN())
			return nil
		}
		v, err := strconv.ParseFloat(s, 64)
		if err != nil && !isRangeError(err) {
			return c.notNumber(d, s)
		}
		if math.IsInf(v, 0) || math.IsNaN(v) {
			return nonFinite(d.cfg, c.name, s, d.fieldLine(c.field))
		}
		c.nums.add(v)
		return nil
	}
	if missing {
		c.nums.add(math.NaN())
		c.keepText("")
		return nil
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil && !isRangeError(err) {
		c.toCategorical()
		c.addLevel(s, false)
		return nil
	}
	if c.badLine == 0 && (math.IsInf(v, 0) || math.IsNaN(v)) {
		c.badLine, c.badText = d.fieldLine(c.field), strings.Clone(s)
	}
	c.nums.add(v)
	c.keepText(s)
	return nil
}

// keepText appends s and '\n' to the text arena, doubling its capacity when
// full: append's gentler growth for large slices would copy it many times.
func (c *csvColumn) keepText(s string) {
	if need := len(c.text) + len(s) + 1; need > cap(c.text) {
		t := make([]byte, len(c.text), max(2*cap(c.text), need, 4096))
		copy(t, c.text)
		c.text = t
	}
	c.text = append(c.text, s...)
	c.text = append(c.text, '\n')
}

func isRangeError(err error) bool {
	var ne *strconv.NumError
	return errors.As(err, &ne) && ne.Err == strconv.ErrRange
}

func (d *CSVReader) fieldLine(field int) int {
	line, _ := d.cr.FieldPos(field)
	return line
}

func nonFinite(cfg *csvConfig, column, s string, line int) error {
	return Errorf(csvReadOp, ErrValue, column, "%q is not a finite number; write a missing cell as one of the missing tokens %q, or list %q in CSVOptions.Missing",
		s, append([]string{""}, cfg.missing...), s).AtLine(line)
}

func (c *csvColumn) notNumber(d *CSVReader, s string) error {
	line := d.fieldLine(c.field)
	if c.fixed {
		return Errorf(csvReadOp, ErrValue, c.name, "%q is not a number, but CSVOptions.Kinds makes the column numeric; fix the cell or make the column tabprep.Categorical", s).AtLine(line)
	}
	return Errorf(csvReadOp, ErrValue, c.name, "%q is not a number, but the first chunk (lines %d to %d) made the column numeric; set CSVOptions.Kinds[%q] = tabprep.Categorical",
		s, d.first[0], d.first[1], c.name).AtLine(line)
}

func (c *csvColumn) addLevel(s string, missing bool) {
	if missing {
		c.codes.add(MissingCode)
		return
	}
	code, ok := c.dict[s]
	if !ok {
		if c.dict == nil {
			c.dict = make(map[string]int32)
		}
		code = int32(len(c.levels))
		s = strings.Clone(s) // s shares memory with the whole input line
		c.levels = append(c.levels, s)
		c.dict[s] = code
	}
	c.codes.add(code)
}

// toCategorical turns an undecided column categorical, coding the cells read
// so far from their kept text.
func (c *csvColumn) toCategorical() {
	c.kind = Categorical
	text := c.text
	for len(text) > 0 {
		end := bytes.IndexByte(text, '\n')
		cell := text[:end]
		text = text[end+1:]
		if len(cell) == 0 {
			c.codes.add(MissingCode)
			continue
		}
		code, ok := c.dict[string(cell)] // no allocation for the lookup
		if !ok {
			if c.dict == nil {
				c.dict = make(map[string]int32)
			}
			code = int32(len(c.levels))
			l := string(cell)
			c.levels = append(c.levels, l)
			c.dict[l] = code
		}
		c.codes.add(code)
	}
	c.nums, c.text = blocks[float64]{}, nil
	c.badLine, c.badText = 0, ""
}

// finish returns the column of the chunk read so far and resets c for the
// next chunk. An undecided column becomes numeric, for this chunk and every
// later one.
func (c *csvColumn) finish(d *CSVReader) (*Column, error) {
	if c.kind == 0 {
		if c.badLine > 0 {
			return nil, nonFinite(d.cfg, c.name, c.badText, c.badLine)
		}
		c.kind = Numeric
		c.text = nil
	}
	if c.kind == Numeric {
		return AdoptNumeric(c.name, c.nums.take()), nil
	}
	col := &Column{name: c.name, kind: Categorical, codes: c.codes.take(), levels: nonNil(c.levels)}
	c.levels, c.dict = nil, nil
	return col, nil
}

// blocks is a growing list of values kept in blocks of bounded size, so
// that a column of unknown length is copied once, when it is taken, rather
// than at every growth, and ends with no spare capacity.
type blocks[T any] struct {
	full [][]T
	n    int // values in full
	cur  []T
}

func (b *blocks[T]) add(v T) {
	if len(b.cur) == cap(b.cur) {
		b.grow()
	}
	b.cur = append(b.cur, v)
}

func (b *blocks[T]) grow() {
	size := 256
	if c := cap(b.cur); c > 0 {
		b.full = append(b.full, b.cur)
		b.n += len(b.cur)
		size = min(2*c, 1<<16)
	}
	b.cur = make([]T, 0, size)
}

// take returns every value added, never nil, and empties b.
func (b *blocks[T]) take() []T {
	out := b.cur
	if b.full != nil {
		out = make([]T, 0, b.n+len(b.cur))
		for _, blk := range b.full {
			out = append(out, blk...)
		}
		out = append(out, b.cur...)
	}
	*b = blocks[T]{}
	if out == nil {
		out = []T{}
	}
	return out
}
