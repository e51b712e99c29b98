// Package demodata holds the invented demo data of the quickstart:
// appointment bookings at a small chain of veterinary clinics, and whether
// the pet was brought in. Every row is made up by [Generate]; no real
// clinic, pet or owner is described.
package demodata

//go:generate go run ./gen

import (
	_ "embed"
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"strconv"
	"time"
)

// Seed and Rows are the arguments that produced [CSV].
const (
	Seed = 20261201
	Rows = 2000
)

// CSV is appointments.csv, the output of Generate(w, Seed, Rows).
//
//go:embed appointments.csv
var CSV []byte

// Header lists the columns of the demo data.
var Header = []string{
	"clinic", "species", "visit_type", "days_ahead", "pet_age", "distance_km",
	"reminder", "prior_no_shows", "booked_on", "no_show",
}

var (
	clinics = []string{"Northgate", "Riverside", "Hillcrest", "Old Town", "Lakeview"}
	species = []string{"dog", "cat", "rabbit", "bird", "reptile"}
	// shares of species, in the same order
	speciesShare = []float64{0.48, 0.34, 0.09, 0.06, 0.03}
	visits       = []string{"vaccination", "checkup", "dental", "surgery", "follow_up"}
	visitShare   = []float64{0.30, 0.35, 0.10, 0.08, 0.17}
	reminders    = []string{"sms", "email", "phone", "none"}
	reminderRisk = []float64{-0.5, -0.2, -0.8, 0.6} // log-odds shift per channel
)

func pick(rng *rand.Rand, shares []float64) int {
	u := rng.Float64()
	for i, s := range shares {
		if u < s {
			return i
		}
		u -= s
	}
	return len(shares) - 1
}

func round(v float64, digits int) float64 {
	p := math.Pow(10, float64(digits))
	return math.Round(v*p) / p
}

// Generate writes n rows of demo data as CSV, the same bytes for the same
// seed and n on every platform. Columns have gaps (pet_age, distance_km,
// reminder), days_ahead is strongly right-skewed, and about one visit in
// eight is a no-show, more often when booked far ahead, with no reminder, or
// after earlier no-shows.
func Generate(w io.Writer, seed uint64, n int) error {
	rng := rand.New(rand.NewPCG(seed, 0x7e7))
	cw := csv.NewWriter(w)
	if err := cw.Write(Header); err != nil {
		return err
	}
	start := time.Date(2025, time.January, 6, 0, 0, 0, 0, time.UTC)
	rec := make([]string, len(Header))
	for i := 0; i < n; i++ {
		clinic := rng.IntN(len(clinics))
		sp := pick(rng, speciesShare)
		visit := pick(rng, visitShare)
		// Lead time in days: log-normal, so most bookings are a few days
		// ahead and a few are months ahead.
		days := math.Round(math.Exp(1.6 + 0.9*rng.NormFloat64()))
		ageScale := 4.0
		if species[sp] == "dog" {
			ageScale = 6 // dogs come in older
		}
		age := round(math.Max(0.2, 1+rng.ExpFloat64()*ageScale), 1)
		dist := round(math.Exp(1.3+0.7*rng.NormFloat64()), 1)
		rem := pick(rng, []float64{0.45, 0.25, 0.1, 0.2})
		prior := 0
		for prior < 6 && rng.Float64() < 0.22 {
			prior++
		}
		booked := start.AddDate(0, 0, rng.IntN(365))
		// The no-show outcome: a logistic model of the risk factors.
		logit := -2.6 + 0.35*math.Log1p(days) + reminderRisk[rem] + 0.45*float64(prior) + 0.02*dist
		if visits[visit] == "surgery" {
			logit -= 0.9
		}
		noShow := 0
		if rng.Float64() < 1/(1+math.Exp(-logit)) {
			noShow = 1
		}

		rec[0] = clinics[clinic]
		rec[1] = species[sp]
		rec[2] = visits[visit]
		rec[3] = strconv.FormatFloat(days, 'f', -1, 64)
		rec[4] = strconv.FormatFloat(age, 'f', -1, 64)
		rec[5] = strconv.FormatFloat(dist, 'f', -1, 64)
		rec[6] = reminders[rem]
		rec[7] = strconv.Itoa(prior)
		rec[8] = booked.Format(time.DateOnly)
		rec[9] = strconv.Itoa(noShow)
		// Gaps, as intake forms have them.
		if rng.Float64() < 0.06 {
			rec[4] = ""
		}
		if rng.Float64() < 0.04 {
			rec[5] = "NA"
		}
		if rng.Float64() < 0.03 {
			rec[6] = ""
		}
		if err := cw.Write(rec); err != nil {
			return fmt.Errorf("demodata: row %d: %w", i, err)
		}
	}
	cw.Flush()
	return cw.Error()
}
