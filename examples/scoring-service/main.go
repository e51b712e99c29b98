// Command scoring-service serves a saved tabprep pipeline over HTTP: it
// loads a state file at start, compiles it to a row plan, and answers each
// POST of one row or a batch of rows with the output vectors and their
// column names, ready for a model.
//
//	go run ./examples/scoring-service -state state.json -addr 127.0.0.1:8080
//
// Endpoints:
//
//	GET  /healthz        liveness, and what the loaded state expects
//	POST /v1/transform   {"row": {...}} or {"rows": [{...}, ...]}
//
// A row is a JSON object of input column to value: a number for a numeric
// column, a string for a categorical one, null or absent for a missing cell.
// A bad request gets status 400 and a JSON error that names the bad field
// and row.
package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"log"
	"net"
	"net/http"
	"os"
	"os/signal"
	"syscall"
	"time"

	"github.com/tabprep/tabprep/pipeline"
)

func main() {
	addr := flag.String("addr", "127.0.0.1:8080", "address to listen on")
	statePath := flag.String("state", "state.json", "saved pipeline state to serve")
	maxBody := flag.Int64("max-body", 1<<20, "largest request body in bytes")
	maxRows := flag.Int("max-rows", 1000, "most rows in one batch request")
	flag.Parse()

	fitted, err := pipeline.LoadFile(*statePath)
	if err != nil {
		log.Fatalf("scoring-service: %v", err)
	}
	h, err := newHandler(fitted, limits{maxBody: *maxBody, maxRows: *maxRows})
	if err != nil {
		log.Fatalf("scoring-service: %v", err)
	}
	ln, err := net.Listen("tcp", *addr)
	if err != nil {
		log.Fatalf("scoring-service: %v", err)
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	log.Printf("scoring-service: serving %s (%d steps, %d outputs) on http://%s", *statePath, fitted.NumSteps(), len(fitted.OutputNames()), ln.Addr())
	if err := serve(ctx, ln, h); err != nil {
		log.Fatalf("scoring-service: %v", err)
	}
	log.Printf("scoring-service: stopped")
}

// serve runs an HTTP server on ln until ctx is done, then shuts it down
// gracefully: it stops accepting, and waits up to 10 seconds for requests in
// flight to finish.
func serve(ctx context.Context, ln net.Listener, h http.Handler) error {
	srv := &http.Server{
		Handler:           h,
		ReadHeaderTimeout: 5 * time.Second,
		ReadTimeout:       30 * time.Second,
		WriteTimeout:      30 * time.Second,
		IdleTimeout:       2 * time.Minute,
	}
	done := make(chan error, 1)
	go func() { done <- srv.Serve(ln) }()
	select {
	case err := <-done:
		return err
	case <-ctx.Done():
	}
	shutdown, cancel := context.WithTimeout(context.Background(), 10*time.Second)
	defer cancel()
	if err := srv.Shutdown(shutdown); err != nil {
		return fmt.Errorf("shutdown: %w", err)
	}
	if err := <-done; !errors.Is(err, http.ErrServerClosed) {
		return err
	}
	return nil
}
