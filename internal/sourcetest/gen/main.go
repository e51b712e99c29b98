// Command gen writes the generated plans of package sourcetest, one file
// per case. Run it with go generate in the sourcetest directory.
package main

import (
	"bytes"
	"log"
	"os"

	"github.com/tabprep/tabprep/internal/sourcetest"
	"github.com/tabprep/tabprep/pipeline"
)

func main() {
	train, _, err := sourcetest.Data()
	if err != nil {
		log.Fatal(err)
	}
	for _, c := range sourcetest.Cases() {
		fitted, err := c.Fit(train)
		if err != nil {
			log.Fatalf("%s: %v", c.Name, err)
		}
		var b bytes.Buffer
		if err := fitted.WriteGo(&b, pipeline.GoOptions{Package: "sourcetest", Name: c.Name}); err != nil {
			log.Fatalf("%s: %v", c.Name, err)
		}
		if err := os.WriteFile(sourcetest.File(c), b.Bytes(), 0o644); err != nil {
			log.Fatal(err)
		}
	}
}
