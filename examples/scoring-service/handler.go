package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"net/http"
	"strings"
	"sync"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/pipeline"
)

type limits struct {
	maxBody int64
	maxRows int
}

// handler serves one compiled plan. It is safe for concurrent use: the
// plan is, and per-request buffers come from a pool.
type handler struct {
	fitted *pipeline.Fitted
	plan   *pipeline.Plan
	lim    limits
	names  []string
	bufs   sync.Pool // *buffers
	mux    *http.ServeMux
}

type buffers struct {
	src []tabprep.Cell
	out []float64
}

func newHandler(f *pipeline.Fitted, lim limits) (*handler, error) {
	plan, err := f.Compile()
	if err != nil {
		return nil, err
	}
	for _, c := range plan.Output().Columns {
		if c.Kind != tabprep.Numeric {
			return nil, fmt.Errorf("output column %q is categorical; a model needs numbers, so encode it in the pipeline", c.Name)
		}
	}
	h := &handler{fitted: f, plan: plan, lim: lim, names: f.OutputNames(), mux: http.NewServeMux()}
	h.bufs.New = func() any {
		return &buffers{src: make([]tabprep.Cell, plan.InputWidth()), out: make([]float64, plan.OutputWidth())}
	}
	h.mux.HandleFunc("GET /healthz", h.health)
	h.mux.HandleFunc("POST /v1/transform", h.transform)
	return h, nil
}

func (h *handler) ServeHTTP(w http.ResponseWriter, r *http.Request) { h.mux.ServeHTTP(w, r) }

type healthAnswer struct {
	Status   string   `json:"status"`
	Steps    int      `json:"steps"`
	Inputs   []string `json:"inputs"`
	Outputs  int      `json:"outputs"`
	Training string   `json:"training_sha256"`
}

func (h *handler) health(w http.ResponseWriter, _ *http.Request) {
	writeJSON(w, http.StatusOK, healthAnswer{
		Status: "ok", Steps: h.fitted.NumSteps(), Inputs: h.plan.Input().Names(),
		Outputs: h.plan.OutputWidth(), Training: h.fitted.Training().SHA256,
	})
}

// request is one row or a batch; exactly one of the two is given.
type request struct {
	Row  map[string]any   `json:"row"`
	Rows []map[string]any `json:"rows"`
}

type answer struct {
	Columns []string      `json:"columns"`
	Values  []jsonFloat   `json:"values,omitempty"`
	Rows    [][]jsonFloat `json:"rows,omitempty"`
}

// problem is the body of an error answer.
type problem struct {
	Error string `json:"error"`
	Field string `json:"field,omitempty"`
	Row   *int   `json:"row,omitempty"`
}

func (h *handler) transform(w http.ResponseWriter, r *http.Request) {
	body := http.MaxBytesReader(w, r.Body, h.lim.maxBody)
	dec := json.NewDecoder(body)
	dec.UseNumber()
	dec.DisallowUnknownFields()
	var req request
	if err := dec.Decode(&req); err != nil {
		var tooBig *http.MaxBytesError
		if errors.As(err, &tooBig) {
			writeJSON(w, http.StatusRequestEntityTooLarge, problem{Error: fmt.Sprintf("request body over %d bytes; send fewer rows per request", h.lim.maxBody)})
			return
		}
		writeJSON(w, http.StatusBadRequest, problem{Error: "request is not valid JSON of the form {\"row\": {...}} or {\"rows\": [...]}: " + err.Error()})
		return
	}
	if _, err := dec.Token(); err != io.EOF {
		writeJSON(w, http.StatusBadRequest, problem{Error: "request has data after its JSON object; send one object"})
		return
	}
	switch {
	case (req.Row == nil) == (req.Rows == nil):
		writeJSON(w, http.StatusBadRequest, problem{Error: `give exactly one of "row" and "rows"`})
		return
	case len(req.Rows) > h.lim.maxRows:
		writeJSON(w, http.StatusRequestEntityTooLarge, problem{Error: fmt.Sprintf("%d rows, at most %d per request", len(req.Rows), h.lim.maxRows)})
		return
	}
	b := h.bufs.Get().(*buffers)
	defer h.bufs.Put(b)
	if req.Row != nil {
		vals, p := h.one(b, req.Row, -1)
		if p != nil {
			writeJSON(w, http.StatusBadRequest, p)
			return
		}
		writeJSON(w, http.StatusOK, answer{Columns: h.names, Values: vals})
		return
	}
	out := answer{Columns: h.names, Rows: make([][]jsonFloat, len(req.Rows))}
	for i, row := range req.Rows {
		vals, p := h.one(b, row, i)
		if p != nil {
			writeJSON(w, http.StatusBadRequest, p)
			return
		}
		out.Rows[i] = vals
	}
	writeJSON(w, http.StatusOK, out)
}

// one transforms one row; i is its index in a batch, or -1.
func (h *handler) one(b *buffers, row map[string]any, i int) ([]jsonFloat, *problem) {
	fail := func(err error) *problem {
		p := &problem{Error: err.Error()}
		var te *tabprep.Error
		if errors.As(err, &te) {
			p.Field = te.Column
		}
		if i >= 0 {
			p.Row = &i
		}
		return p
	}
	if err := h.plan.FromMap(b.src, row); err != nil {
		return nil, fail(err)
	}
	if err := h.plan.ApplyFloats(b.out, b.src); err != nil {
		return nil, fail(err)
	}
	vals := make([]jsonFloat, len(b.out))
	for j, v := range b.out {
		vals[j] = jsonFloat(v)
	}
	return vals, nil
}

// jsonFloat encodes NaN (a missing output) as null, since JSON has no NaN.
type jsonFloat float64

func (f jsonFloat) MarshalJSON() ([]byte, error) {
	if math.IsNaN(float64(f)) || math.IsInf(float64(f), 0) {
		return []byte("null"), nil
	}
	return json.Marshal(float64(f))
}

func writeJSON(w http.ResponseWriter, status int, v any) {
	w.Header().Set("Content-Type", "application/json")
	w.WriteHeader(status)
	enc := json.NewEncoder(w)
	if err := enc.Encode(v); err != nil {
		// The status is sent; all that is left is to note the failure.
		fmt.Fprintln(w, strings.TrimSpace(err.Error()))
	}
}
