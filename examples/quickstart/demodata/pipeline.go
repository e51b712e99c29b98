package demodata

import (
	"bytes"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/impute"
	"github.com/tabprep/tabprep/pipeline"
	"github.com/tabprep/tabprep/scale"
)

// Pipeline returns the preprocessing of the demo data that the quickstart,
// the scoring service and the serving benchmarks share: fill gaps, turn the
// categories into numbers, and rescale the numeric columns.
func Pipeline() *pipeline.Pipeline {
	return pipeline.New(
		pipeline.Use(impute.Mean{Columns: tabprep.Names("pet_age", "distance_km")}),
		pipeline.Use(impute.MostFrequent{Columns: tabprep.Names("reminder")}),
		pipeline.Use(encode.OneHot{Columns: tabprep.Names("clinic", "species", "reminder")}),
		pipeline.Use(encode.Ordinal{
			Columns: tabprep.Names("visit_type"),
			// Ordered by how much of the clinic's time the visit takes.
			Order: map[string][]string{"visit_type": {"vaccination", "checkup", "follow_up", "dental", "surgery"}},
		}),
		pipeline.Use(scale.ZScore{Columns: tabprep.Names("days_ahead", "pet_age", "distance_km", "prior_no_shows")}),
	)
}

// Serving returns the demo data as a scoring service sees it, without the
// outcome (no_show) and the booking date, and Pipeline fitted on all of it:
// what the serving benchmarks and the generated row plan in package
// demoplan are built from.
func Serving() (*pipeline.Fitted, *tabprep.Frame, error) {
	data, err := tabprep.ReadCSV(bytes.NewReader(CSV), nil)
	if err != nil {
		return nil, nil, err
	}
	if data, err = data.Without("no_show", "booked_on"); err != nil {
		return nil, nil, err
	}
	fitted, err := Pipeline().Fit(data)
	if err != nil {
		return nil, nil, err
	}
	return fitted, data, nil
}
