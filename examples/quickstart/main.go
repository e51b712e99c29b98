// Command quickstart runs the main job of tabprep on invented demo data:
// appointment bookings at a small chain of veterinary clinics, and whether
// the pet was brought in. It splits the rows into train and a test holdout,
// fits a preprocessing pipeline on the train rows only, saves the fitted
// state to a file, loads it back, transforms the holdout, and reports what
// happened. On the way it shows the error a user gets for fitting on
// holdout rows.
//
//	go run ./examples/quickstart
package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"log"
	"os"
	"path/filepath"
	"strings"
	"text/tabwriter"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/examples/quickstart/demodata"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/split"
)

func main() {
	statePath := flag.String("state", filepath.Join(os.TempDir(), "tabprep-quickstart-state.json"), "where to save the fitted state")
	flag.Parse()
	if err := run(os.Stdout, *statePath); err != nil {
		log.Fatalf("quickstart: %v", err)
	}
}

// Load reads the embedded demo data. The outcome no_show is read as a
// category so the split can keep its share in both parts; booked_on is a
// date, kept for reference and not transformed.
func Load() (*tabprep.Frame, error) {
	f, err := tabprep.ReadCSV(bytes.NewReader(demodata.CSV), &tabprep.CSVOptions{
		Kinds: map[string]tabprep.Kind{"no_show": tabprep.Categorical},
	})
	if err != nil {
		return nil, err
	}
	return f.Without("booked_on")
}

func run(w io.Writer, statePath string) error {
	all, err := Load()
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "Read %d bookings with %d columns: %s\n\n", all.NumRows(), all.NumCols(), strings.Join(all.Names(), ", "))

	// 1. Split: hold out 20% for test, keeping the no-show share in both.
	tagged, report, err := split.Stratified{Column: "no_show", Fraction: 0.2, Partition: "test", Seed: 7}.Apply(all)
	if err != nil {
		return err
	}
	fmt.Fprintln(w, "== Split")
	fmt.Fprintln(w, report)

	// 2. Fitting on the whole frame is refused: the holdout would leak
	// into the fitted statistics.
	_, err = demodata.Pipeline().Fit(tagged)
	fmt.Fprintln(w, "== Fitting on all rows, on purpose")
	fmt.Fprintf(w, "refused (errors.Is(err, tabprep.ErrHoldout) = %v):\n  %v\n\n", errors.Is(err, tabprep.ErrHoldout), err)

	// 3. Fit on the train rows only.
	fitted, err := demodata.Pipeline().Fit(tagged.Train())
	if err != nil {
		return err
	}
	fmt.Fprintln(w, "== What each step learned from the train rows")
	for i := 0; i < fitted.NumSteps(); i++ {
		s := fitted.Step(i)
		params, err := json.Marshal(s.Params())
		if err != nil {
			return err
		}
		fmt.Fprintf(w, "%d. %-20s %s\n", i+1, s.Kind(), shorten(string(params), 110))
	}
	fmt.Fprintln(w)

	// 4. Save the fitted state, and load it back as a service would.
	if err := fitted.SaveFile(statePath); err != nil {
		return err
	}
	loaded, err := pipeline.LoadFile(statePath)
	if err != nil {
		return err
	}
	info, err := os.Stat(statePath)
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "== Saved the fitted state to %s (%d bytes) and loaded it back\n", statePath, info.Size())
	fmt.Fprintf(w, "training fingerprint: %d rows, sha256 %s…\n\n", loaded.Training().Rows, loaded.Training().SHA256[:16])

	// 5. Transform the holdout with the loaded state; it must agree bit for
	// bit with the pipeline in memory.
	test := tagged.HoldoutRows()
	out, err := loaded.Transform(test)
	if err != nil {
		return err
	}
	same, err := fitted.Transform(test)
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "== Test rows transformed by the loaded state: %d rows × %d columns (identical to the in-memory pipeline: %v)\n",
		out.NumRows(), out.NumCols(), tabprep.Equal(out, same))
	return printRows(w, out, 3)
}

func shorten(s string, n int) string {
	if len(s) <= n {
		return s
	}
	return s[:n-1] + "…"
}

// printRows prints the first n rows of f, one column of the table per row
// and one line per output column, since the output is wider than a screen.
func printRows(w io.Writer, f *tabprep.Frame, n int) error {
	n = min(n, f.NumRows())
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprint(tw, "column")
	for i := 0; i < n; i++ {
		fmt.Fprintf(tw, "\trow %d", i+1)
	}
	fmt.Fprintln(tw)
	for j := 0; j < f.NumCols(); j++ {
		c := f.Col(j)
		fmt.Fprint(tw, c.Name())
		for i := 0; i < n; i++ {
			if c.Kind() == tabprep.Numeric {
				fmt.Fprintf(tw, "\t%.3f", c.Value(i))
			} else {
				fmt.Fprintf(tw, "\t%s", c.Level(i))
			}
		}
		fmt.Fprintln(tw)
	}
	return tw.Flush()
}
