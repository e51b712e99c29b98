// Package demoplan is the demo pipeline's row plan generated as Go source
// (see pipeline.Fitted.WriteGo), fitted on the demo data as
// demodata.Serving fits it. Regenerate it with go generate after changing
// the data, the pipeline or a step's source form; a test fails while it is
// stale.
package demoplan

//go:generate go run ./gen
