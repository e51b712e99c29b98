// Command gen writes plan.go, the generated row plan of the demo pipeline.
// Run it with go generate in the demoplan directory.
package main

import (
	"bytes"
	"log"
	"os"

	"github.com/tabprep/tabprep/examples/quickstart/demodata"
	"github.com/tabprep/tabprep/pipeline"
)

func main() {
	fitted, _, err := demodata.Serving()
	if err != nil {
		log.Fatal(err)
	}
	var b bytes.Buffer
	if err := fitted.WriteGo(&b, pipeline.GoOptions{Package: "demoplan"}); err != nil {
		log.Fatal(err)
	}
	if err := os.WriteFile("plan.go", b.Bytes(), 0o644); err != nil {
		log.Fatal(err)
	}
}
