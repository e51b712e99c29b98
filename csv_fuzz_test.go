package tabprep_test

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
)

// FuzzReadCSV checks that any input either fails with a *tabprep.Error that
// names its line, or reads to a frame that writes and reads back, one-shot
// and in chunks, to an equal frame.
func FuzzReadCSV(f *testing.F) {
	files, err := filepath.Glob("testdata/csv/*.csv")
	require.NoError(f, err)
	require.NotEmpty(f, files)
	for _, name := range files {
		data, err := os.ReadFile(name)
		require.NoError(f, err)
		f.Add(data, uint8(0))
		f.Add(data, uint8(1))
	}
	separators := []rune{',', ';', '\t', '|'}
	f.Fuzz(func(t *testing.T, data []byte, sep uint8) {
		if len(data) > 1<<14 {
			return // large inputs add time, not cases
		}
		opts := &tabprep.CSVOptions{Comma: separators[int(sep)%len(separators)]}
		fr, err := tabprep.ReadCSV(bytes.NewReader(data), opts)
		if err != nil {
			var te *tabprep.Error
			require.True(t, errors.As(err, &te), "%v is not a *tabprep.Error", err)
			if !errors.Is(err, tabprep.ErrOption) {
				require.Positive(t, te.Line, "%v names no line", err)
			}
			return
		}
		requireRoundTrip(t, fr, opts)
	})
}
