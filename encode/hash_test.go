package encode_test

import (
	"encoding/binary"
	"fmt"
	"hash/fnv"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/encode"
	"github.com/tabprep/tabprep/pipeline"
)

// TestFNV1aAgainstStdlib checks the level hash against the standard
// library's hash/fnv New64a (the reference implementation of FNV-1a) over
// the same bytes: the seed little endian, then the level.
func TestFNV1aAgainstStdlib(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for _, level := range []string{"", "dog", "north clinic", "ünïcode", "a\x00b"} {
		seed := r.Uint64()
		h := fnv.New64a()
		var b [8]byte
		binary.LittleEndian.PutUint64(b[:], seed)
		h.Write(b[:])
		h.Write([]byte(level))
		require.Equal(t, h.Sum64(), encode.FNV1a(seed, level), "level %q", level)
	}
}

func TestHash(t *testing.T) {
	s := encode.Hash{Columns: tabprep.Names("species"), Buckets: 3, Seed: 99}
	p, err := s.Fit(clinicTrain())
	require.NoError(t, err)
	require.Equal(t, []string{"species#0", "species#1", "species#2"}, p.Outputs())
	out := roundTrip(t, pipeline.Use(s), clinicTrain(), clinicNew(t))
	require.Equal(t, []string{"clinic", "days_ahead", "no_show", "species#0", "species#1", "species#2"}, out.Names())
	// Each row has exactly one non-zero cell, ±1, and the unseen "ferret" is
	// hashed like any level.
	for i := 0; i < out.NumRows(); i++ {
		nonzero := 0
		for _, name := range p.Outputs() {
			if v := column(t, out, name)[i]; v != 0 {
				nonzero++
				require.Equal(t, 1.0, math.Abs(v))
			}
		}
		require.Equal(t, 1, nonzero, "row %d", i)
	}
	// The same level always lands in the same place: dog rows 1 and 3.
	for _, name := range p.Outputs() {
		require.Equal(t, column(t, out, name)[1], column(t, out, name)[3])
	}
}

// TestHashSpread is a property check: levels spread over the buckets about
// evenly and the signs about half and half. With 20,000 levels into 10
// buckets each count has standard deviation ≈ 42; the bounds are ±5 of them
// (common practice, no source).
func TestHashSpread(t *testing.T) {
	const n, buckets = 20000, 10
	levels := make([]string, n)
	for i := range levels {
		levels[i] = fmt.Sprintf("owner_%d", i)
	}
	f := tabprep.MustFrame(tabprep.NewCategorical("owner", levels))
	s := encode.Hash{Buckets: buckets, Seed: 5}
	p, err := s.Fit(f)
	require.NoError(t, err)
	out, err := s.Transform(p, f)
	require.NoError(t, err)
	pos := 0
	for _, name := range p.Outputs() {
		count := 0
		for _, v := range column(t, out, name) {
			if v != 0 {
				count++
			}
			if v > 0 {
				pos++
			}
		}
		require.InDelta(t, n/buckets, count, 5*42, name)
	}
	require.InDelta(t, n/2, pos, 5*71)
}

func TestHashErrors(t *testing.T) {
	_, err := encode.Hash{Columns: tabprep.Names("species")}.Fit(clinicTrain())
	require.ErrorIs(t, err, tabprep.ErrOption)
	require.EqualError(t, err, `encode.hash fit: column "species": Buckets 0: hashing into zero columns; set Buckets to 1 or more`)
	_, err = encode.Hash{Columns: tabprep.Names("pet_age"), Buckets: 2}.Fit(clinicTrain())
	require.ErrorIs(t, err, tabprep.ErrNoColumn)
	_, err = encode.Hash{}.Transform(encode.HashParams{Columns: []string{"species"}, Buckets: -1}, clinicTrain())
	require.ErrorIs(t, err, tabprep.ErrOption)
}

func TestHashRowKernel(t *testing.T) {
	for _, s := range []encode.Hash{{Buckets: 1}, {Buckets: 4, Seed: 9}, {Columns: tabprep.Names("species"), Buckets: 16}} {
		requireKernel(t, s)
	}
	_, err := kernelOf(encode.Hash{}, encode.HashParams{Columns: []string{"clinic"}}, clinicTrain().Schema())
	require.ErrorIs(t, err, tabprep.ErrOption)
}
