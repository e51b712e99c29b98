// Command gen writes appointments.csv, the quickstart's demo data, from the
// seeded generator in package demodata. Run it with go generate in the
// demodata directory.
package main

import (
	"bufio"
	"log"
	"os"

	"github.com/tabprep/tabprep/examples/quickstart/demodata"
)

func main() {
	out, err := os.Create("appointments.csv")
	if err != nil {
		log.Fatal(err)
	}
	w := bufio.NewWriter(out)
	if err := demodata.Generate(w, demodata.Seed, demodata.Rows); err != nil {
		log.Fatal(err)
	}
	if err := w.Flush(); err != nil {
		log.Fatal(err)
	}
	if err := out.Close(); err != nil {
		log.Fatal(err)
	}
}
