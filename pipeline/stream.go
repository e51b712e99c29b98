package pipeline

import (
	"context"
	"errors"
	"fmt"
	"io"
	"maps"

	"github.com/tabprep/tabprep"
)

// StreamOptions adjusts [Fitted.Stream]. The zero value is the default.
type StreamOptions struct {
	// Read configures the input CSV (nil for the defaults). Columns of the
	// input schema get their fitted kind unless Read.Kinds says otherwise,
	// so no chunk depends on inference. Read.ChunkRows sets the rows per
	// chunk, and so the memory a stream holds.
	Read *tabprep.CSVOptions
	// Write configures the output CSV (nil for the defaults). Roles are
	// written when the input has a role column or Write.WriteRoles is set.
	Write *tabprep.CSVOptions
	// Progress, if not nil, is called after each chunk is written.
	Progress func(Progress)
}

// Progress tells how far a stream has come.
type Progress struct {
	Rows  int64 // rows written
	Bytes int64 // bytes of input read
}

// Stream transforms CSV from r to w chunk by chunk, so the input may be far
// larger than memory: memory in use is bounded by the chunk size, not the
// input size. It stops at the first error, or when ctx is done, returning
// ctx's error; the output then ends after the last whole chunk written.
func (f *Fitted) Stream(ctx context.Context, r io.Reader, w io.Writer, opts StreamOptions) (Progress, error) {
	var prog Progress
	counter := &countingReader{r: r}
	read := tabprep.CSVOptions{}
	if opts.Read != nil {
		read = *opts.Read
	}
	kinds := make(map[string]tabprep.Kind, len(f.input.Columns))
	for _, c := range f.input.Columns {
		kinds[c.Name] = c.Kind
	}
	maps.Copy(kinds, read.Kinds)
	read.Kinds = kinds
	in, err := tabprep.NewCSVReader(counter, &read)
	if err != nil {
		return prog, err
	}
	write := tabprep.CSVOptions{}
	if opts.Write != nil {
		write = *opts.Write
	}
	write.WriteRoles = write.WriteRoles || in.HasRoleColumn()
	out, err := tabprep.NewCSVWriter(w, &write)
	if err != nil {
		return prog, err
	}
	for {
		if err := ctx.Err(); err != nil {
			return prog, errors.Join(err, out.Flush())
		}
		chunk, err := in.Next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return prog, errors.Join(err, out.Flush())
		}
		res, err := f.Transform(chunk)
		if err != nil {
			return prog, errors.Join(fmt.Errorf("pipeline: stream: rows %d to %d: %w", prog.Rows, prog.Rows+int64(chunk.NumRows())-1, err), out.Flush())
		}
		if err := out.Write(res); err != nil {
			return prog, err
		}
		prog.Rows += int64(chunk.NumRows())
		prog.Bytes = counter.n
		if opts.Progress != nil {
			opts.Progress(prog)
		}
	}
	prog.Bytes = counter.n
	return prog, out.Flush()
}

type countingReader struct {
	r io.Reader
	n int64
}

func (c *countingReader) Read(p []byte) (int, error) {
	n, err := c.r.Read(p)
	c.n += int64(n)
	return n, err
}
