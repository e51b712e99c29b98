package demoplan_test

import (
	"math"
	"testing"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/examples/quickstart/demodata"
	"github.com/tabprep/tabprep/examples/quickstart/demodata/demoplan"
)

// FuzzMatchesInterpreted feeds arbitrary rows (any strings, any float64
// bits) through the generated and the interpreted plan and requires the
// same values bit for bit, or the same error.
func FuzzMatchesInterpreted(f *testing.F) {
	fitted, _, err := demodata.Serving()
	if err != nil {
		f.Fatal(err)
	}
	interp, err := fitted.Compile()
	if err != nil {
		f.Fatal(err)
	}
	gen, err := fitted.CompileWith(demoplan.Plan)
	if err != nil {
		f.Fatal(err)
	}
	f.Add("Hillcrest", "cat", "checkup", "sms", 2.0, math.NaN(), 6.4, 0.0)
	f.Add("", "ferret", "surgery", "", math.Inf(1), -0.0, 1e308, -1.0)
	f.Add("Old Town", "dog", "", "email", 0.0, 3.0, math.NaN(), 5.0)
	f.Fuzz(func(t *testing.T, clinic, species, visit, reminder string, days, age, dist, prior float64) {
		row := []tabprep.Cell{{Str: clinic}, {Str: species}, {Str: visit}, {Num: days}, {Num: age}, {Num: dist}, {Str: reminder}, {Num: prior}}
		want := make([]float64, interp.OutputWidth())
		got := make([]float64, len(want))
		werr := interp.ApplyFloats(want, row)
		gerr := gen.ApplyFloats(got, row)
		if (werr == nil) != (gerr == nil) || (werr != nil && werr.Error() != gerr.Error()) {
			t.Fatalf("interpreted error %v, generated error %v", werr, gerr)
		}
		if werr != nil {
			return
		}
		for j := range want {
			if math.Float64bits(want[j]) != math.Float64bits(got[j]) {
				t.Fatalf("column %d: interpreted %v, generated %v", j, want[j], got[j])
			}
		}
	})
}
