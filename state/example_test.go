package state_test

import (
	"encoding/json"
	"fmt"
	"math"

	"github.com/tabprep/tabprep/state"
)

// Parameters keep NaN and the infinities, which plain JSON cannot hold, and
// every finite value bit for bit.
func ExampleFloats() {
	b, _ := json.Marshal(state.Floats{0.1, math.NaN(), math.Inf(-1), 1e300})
	fmt.Println(string(b))
	var back state.Floats
	_ = json.Unmarshal(b, &back)
	fmt.Println(back[0] == 0.1, math.IsNaN(back[1]), math.IsInf(back[2], -1))
	// Output:
	// [0.1,"NaN","-Inf",1e+300]
	// true true true
}

// Kinds lists the registered step kinds; the built-in ones register when
// their packages are imported, as the pipeline package does.
func ExampleKinds() {
	for _, k := range state.Kinds() {
		if k == "scale.zscore" || k == "impute.mean" {
			fmt.Println(k)
		}
	}
	// Output:
	// impute.mean
	// scale.zscore
}
