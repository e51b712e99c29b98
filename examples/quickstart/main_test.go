package main

import (
	"bytes"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/require"
)

// TestRun runs the quickstart end to end and checks the parts of its report
// a reader relies on.
func TestRun(t *testing.T) {
	var out bytes.Buffer
	require.NoError(t, run(&out, filepath.Join(t.TempDir(), "state.json")))
	text := out.String()
	require.Contains(t, text, "Read 2000 bookings")
	require.Contains(t, text, "train      1600  80.0%")
	require.Contains(t, text, "errors.Is(err, tabprep.ErrHoldout) = true")
	require.Contains(t, text, "identical to the in-memory pipeline: true")
	require.Contains(t, text, "400 rows × 20 columns")
}
