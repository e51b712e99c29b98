package sourcetest_test

import (
	"fmt"
	"strings"

	"github.com/tabprep/tabprep/internal/sourcetest"
)

// The cases and the step kinds their generated plans cover.
func ExampleCases() {
	for _, c := range sourcetest.Cases()[:3] {
		var kinds []string
		for _, st := range c.Stages {
			kinds = append(kinds, st.Kind())
		}
		fmt.Printf("%s: %s\n", c.Name, strings.Join(kinds, ", "))
	}
	// Output:
	// ImputeStats: impute.mean, impute.median, impute.min, impute.max, impute.mostfrequent, encode.onehot
	// ImputeRules: impute.constant, impute.fill, encode.onehot
	// ImputeStructure: impute.indicators, impute.dropsparse, encode.onehot
}
