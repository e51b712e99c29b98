package tabprep_test

import (
	"bytes"
	"encoding/csv"
	"io"
	"math/rand/v2"
	"strconv"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
)

// benchCSV returns rows of appointment data, 5 columns (2 categorical, 3
// numeric, one with missing cells), as CSV.
func benchCSV(rows int) []byte {
	rng := rand.New(rand.NewPCG(5, 6))
	clinics := []string{"north", "river", "east annex", "hillside", "harbour"}
	species := []string{"dog", "cat", "rabbit", "bird"}
	var b bytes.Buffer
	b.WriteString("clinic,species,days_ahead,pet_age,distance_km\n")
	var line []byte
	for range rows {
		line = append(line[:0], clinics[rng.IntN(len(clinics))]...)
		line = append(line, ',')
		line = append(line, species[rng.IntN(len(species))]...)
		line = append(line, ',')
		line = strconv.AppendInt(line, int64(rng.IntN(90)), 10)
		line = append(line, ',')
		if rng.IntN(10) == 0 {
			line = append(line, "NA"...)
		} else {
			line = strconv.AppendFloat(line, rng.ExpFloat64()*5, 'f', 1, 64)
		}
		line = append(line, ',')
		line = strconv.AppendFloat(line, rng.ExpFloat64()*8, 'g', -1, 64)
		line = append(line, '\n')
		b.Write(line)
	}
	return b.Bytes()
}

// BenchmarkReadCSV compares building a frame with encoding/csv alone
// reading the same bytes into records it throws away, the baseline.
func BenchmarkReadCSV(b *testing.B) {
	for _, rows := range []int{10_000, 1_000_000} {
		data := benchCSV(rows)
		f, err := tabprep.ReadCSV(bytes.NewReader(data), nil)
		require.NoError(b, err)
		require.Equal(b, rows, f.NumRows())
		require.Equal(b, "[clinic:categorical(5) species:categorical(4) days_ahead:numeric pet_age:numeric distance_km:numeric]", f.Schema().String())
		b.Run("rows="+strconv.Itoa(rows), func(b *testing.B) {
			b.Run("baseline=encoding-csv", func(b *testing.B) {
				b.SetBytes(int64(len(data)))
				b.ReportAllocs()
				for b.Loop() {
					r := csv.NewReader(bytes.NewReader(data))
					r.ReuseRecord = true
					n := 0
					for {
						_, err := r.Read()
						if err == io.EOF {
							break
						}
						if err != nil {
							b.Fatal(err)
						}
						n++
					}
					if n != rows+1 {
						b.Fatal(n)
					}
				}
			})
			b.Run("ReadCSV", func(b *testing.B) {
				b.SetBytes(int64(len(data)))
				b.ReportAllocs()
				for b.Loop() {
					if _, err := tabprep.ReadCSV(bytes.NewReader(data), nil); err != nil {
						b.Fatal(err)
					}
				}
			})
			b.Run("CSVReader", func(b *testing.B) {
				b.SetBytes(int64(len(data)))
				b.ReportAllocs()
				for b.Loop() {
					r, err := tabprep.NewCSVReader(bytes.NewReader(data), nil)
					if err != nil {
						b.Fatal(err)
					}
					for _, err := range r.Chunks() {
						if err != nil {
							b.Fatal(err)
						}
					}
				}
			})
		})
	}
}

// BenchmarkWriteCSV compares writing a frame with encoding/csv writing the
// same cells already formatted as strings, the baseline.
func BenchmarkWriteCSV(b *testing.B) {
	const rows = 1_000_000
	data := benchCSV(rows)
	f, err := tabprep.ReadCSV(bytes.NewReader(data), nil)
	require.NoError(b, err)
	records, err := csv.NewReader(bytes.NewReader(data)).ReadAll()
	require.NoError(b, err)
	var out bytes.Buffer
	require.NoError(b, tabprep.WriteCSV(&out, f, &tabprep.CSVOptions{Missing: []string{"NA"}}))
	back, err := tabprep.ReadCSV(&out, nil)
	require.NoError(b, err)
	require.True(b, tabprep.Equal(f, back), "the written rows read back")
	b.Run("baseline=encoding-csv", func(b *testing.B) {
		b.SetBytes(int64(len(data)))
		b.ReportAllocs()
		for b.Loop() {
			w := csv.NewWriter(io.Discard)
			if err := w.WriteAll(records); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("WriteCSV", func(b *testing.B) {
		b.SetBytes(int64(len(data)))
		b.ReportAllocs()
		for b.Loop() {
			if err := tabprep.WriteCSV(io.Discard, f, nil); err != nil {
				b.Fatal(err)
			}
		}
	})
}
