package main

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"net"
	"net/http"
	"path/filepath"
	"strings"
	"sync"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/examples/quickstart/demodata"
	"github.com/tabprep/tabprep/pipeline"
)

// fixture fits the demo pipeline on the demo data (the outcome left out, as
// a model's input has no outcome) and saves it, as an operator would before
// starting the service.
func fixture(t *testing.T) (*pipeline.Fitted, *tabprep.Frame, string) {
	t.Helper()
	data, err := tabprep.ReadCSV(bytes.NewReader(demodata.CSV), nil)
	require.NoError(t, err)
	data, err = data.Without("no_show", "booked_on")
	require.NoError(t, err)
	p := demodata.Pipeline()
	train, err := data.Slice(0, 1500)
	require.NoError(t, err)
	fitted, err := p.Fit(train)
	require.NoError(t, err)
	path := filepath.Join(t.TempDir(), "state.json")
	require.NoError(t, fitted.SaveFile(path))
	rest, err := data.Slice(1500, data.NumRows())
	require.NoError(t, err)
	return fitted, rest, path
}

// start loads the saved state as main does and serves it on a loopback
// port until the test ends.
func start(t *testing.T, path string, lim limits) string {
	t.Helper()
	fitted, err := pipeline.LoadFile(path)
	require.NoError(t, err)
	h, err := newHandler(fitted, lim)
	require.NoError(t, err)
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	require.NoError(t, err)
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan error, 1)
	go func() { done <- serve(ctx, ln, h) }()
	t.Cleanup(func() {
		cancel()
		require.NoError(t, <-done, "graceful shutdown")
	})
	return "http://" + ln.Addr().String()
}

func rowJSON(f *tabprep.Frame, i int) map[string]any {
	m := map[string]any{}
	for j := 0; j < f.NumCols(); j++ {
		c := f.Col(j)
		switch {
		case c.IsMissing(i):
			m[c.Name()] = nil
		case c.Kind() == tabprep.Numeric:
			m[c.Name()] = c.Value(i)
		default:
			m[c.Name()] = c.Level(i)
		}
	}
	return m
}

func post(t *testing.T, url string, body any) (int, map[string]json.RawMessage) {
	t.Helper()
	b, ok := body.([]byte)
	if !ok {
		var err error
		b, err = json.Marshal(body)
		require.NoError(t, err)
	}
	resp, err := http.Post(url+"/v1/transform", "application/json", bytes.NewReader(b))
	require.NoError(t, err)
	defer resp.Body.Close()
	raw, err := io.ReadAll(resp.Body)
	require.NoError(t, err)
	var out map[string]json.RawMessage
	require.NoError(t, json.Unmarshal(raw, &out), string(raw))
	return resp.StatusCode, out
}

func floats(t *testing.T, raw json.RawMessage) []float64 {
	var vals []*float64
	require.NoError(t, json.Unmarshal(raw, &vals))
	out := make([]float64, len(vals))
	for i, v := range vals {
		out[i] = math.NaN()
		if v != nil {
			out[i] = *v
		}
	}
	return out
}

// TestServiceMatchesBatch sends a bounded number of requests from several
// goroutines and checks every answer against the batch transform.
func TestServiceMatchesBatch(t *testing.T) {
	fitted, rest, path := fixture(t)
	url := start(t, path, limits{maxBody: 1 << 20, maxRows: 100})
	want, err := fitted.Transform(rest)
	require.NoError(t, err)

	const workers, perWorker = 8, 25
	var wg sync.WaitGroup
	errs := make(chan error, workers)
	for g := 0; g < workers; g++ {
		wg.Add(1)
		go func(g int) {
			defer wg.Done()
			for k := 0; k < perWorker; k++ {
				i := g*perWorker + k
				b, _ := json.Marshal(map[string]any{"row": rowJSON(rest, i)})
				resp, err := http.Post(url+"/v1/transform", "application/json", bytes.NewReader(b))
				if err != nil {
					errs <- err
					return
				}
				var ans struct {
					Columns []string   `json:"columns"`
					Values  []*float64 `json:"values"`
				}
				err = json.NewDecoder(resp.Body).Decode(&ans)
				resp.Body.Close()
				if err != nil || resp.StatusCode != http.StatusOK {
					errs <- fmt.Errorf("row %d: status %d, %v", i, resp.StatusCode, err)
					return
				}
				for j, v := range ans.Values {
					// encoding/json writes the shortest decimal that parses
					// back to the same float64, so the values are exact.
					if v == nil || *v != want.Col(j).Value(i) || ans.Columns[j] != want.Col(j).Name() {
						errs <- fmt.Errorf("row %d column %d: got %v, want %v", i, j, v, want.Col(j).Value(i))
						return
					}
				}
			}
		}(g)
	}
	wg.Wait()
	close(errs)
	for err := range errs {
		require.NoError(t, err)
	}

	// A batch answers the same values.
	rows := make([]map[string]any, 50)
	for i := range rows {
		rows[i] = rowJSON(rest, 200+i)
	}
	status, ans := post(t, url, map[string]any{"rows": rows})
	require.Equal(t, http.StatusOK, status)
	var batch [][]float64
	require.NoError(t, json.Unmarshal(ans["rows"], &batch))
	require.Len(t, batch, 50)
	for i, vals := range batch {
		for j, v := range vals {
			require.Equal(t, want.Col(j).Value(200+i), v)
		}
	}
}

func TestServiceErrors(t *testing.T) {
	_, rest, path := fixture(t)
	url := start(t, path, limits{maxBody: 4 << 10, maxRows: 10})
	good := rowJSON(rest, 0)
	withField := func(k string, v any) map[string]any {
		m := map[string]any{}
		for a, b := range good {
			m[a] = b
		}
		m[k] = v
		return m
	}
	tests := []struct {
		name   string
		body   any
		status int
		field  string
		msg    string
	}{
		{"wrong type", map[string]any{"row": withField("pet_age", "old")}, 400, "pet_age",
			`pipeline.plan: column "pet_age": got string, want a number (the column is numeric)`},
		{"unknown field", map[string]any{"row": withField("weight", 3)}, 400, "weight", ""},
		{"categorical number", map[string]any{"row": withField("species", 4)}, 400, "species", ""},
		{"both", map[string]any{"row": good, "rows": []any{good}}, 400, "", `give exactly one of "row" and "rows"`},
		{"neither", map[string]any{}, 400, "", `give exactly one of "row" and "rows"`},
		{"not json", []byte("{"), 400, "", ""},
		{"two objects", []byte(`{"row":{}} {}`), 400, "", "request has data after its JSON object; send one object"},
		{"unknown envelope field", []byte(`{"line":{}}`), 400, "", ""},
		{"too many rows", map[string]any{"rows": make([]map[string]any, 11)}, 413, "", "11 rows, at most 10 per request"},
		{"too large", []byte(`{"row":{"clinic":"` + strings.Repeat("x", 5000) + `"}}`), 413, "", "request body over 4096 bytes; send fewer rows per request"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			status, ans := post(t, url, tt.body)
			require.Equal(t, tt.status, status)
			var p problem
			b, _ := json.Marshal(ans)
			require.NoError(t, json.Unmarshal(b, &p))
			require.NotEmpty(t, p.Error)
			require.Equal(t, tt.field, p.Field)
			if tt.msg != "" {
				require.Equal(t, tt.msg, p.Error)
			}
		})
	}
	// A bad row in a batch is named by its index.
	status, ans := post(t, url, map[string]any{"rows": []any{good, withField("distance_km", true)}})
	require.Equal(t, 400, status)
	require.JSONEq(t, "1", string(ans["row"]))
	require.JSONEq(t, `"distance_km"`, string(ans["field"]))
}

func TestHealth(t *testing.T) {
	fitted, _, path := fixture(t)
	url := start(t, path, limits{maxBody: 1 << 20, maxRows: 10})
	resp, err := http.Get(url + "/healthz")
	require.NoError(t, err)
	defer resp.Body.Close()
	var h healthAnswer
	require.NoError(t, json.NewDecoder(resp.Body).Decode(&h))
	require.Equal(t, "ok", h.Status)
	require.Equal(t, fitted.NumSteps(), h.Steps)
	require.Equal(t, fitted.Input().Names(), h.Inputs)
	require.Equal(t, fitted.Training().SHA256, h.Training)
	resp2, err := http.Get(url + "/v1/transform")
	require.NoError(t, err)
	resp2.Body.Close()
	require.Equal(t, http.StatusMethodNotAllowed, resp2.StatusCode)
}
