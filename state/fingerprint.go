package state

import (
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"math"

	"github.com/tabprep/tabprep"
	"github.com/tabprep/tabprep/internal/par"
)

// Fingerprint identifies the training rows a pipeline was fitted on, so a
// saved state can be traced to its data without storing the data.
type Fingerprint struct {
	Rows   int    `json:"rows"`
	SHA256 string `json:"sha256"`
}

// FingerprintOf returns the row count of f and a SHA-256 of its content.
// Each column's cells are hashed on their own (a number as its IEEE 754
// bits, little endian, every NaN as one canonical NaN; a level as its
// length and bytes, a missing level as length 2³²−1), on all cores; the
// fingerprint is the SHA-256 of, column by column, the name, the kind and
// that column's digest. Two frames that are [tabprep.Equal] have the same
// fingerprint.
func FingerprintOf(f *tabprep.Frame) Fingerprint {
	digests := make([][sha256.Size]byte, f.NumCols())
	_ = par.Each(f.NumCols(), f.NumRows(), func(i int) error {
		digests[i] = columnDigest(f.Col(i))
		return nil
	})
	h := sha256.New()
	var buf [4]byte
	for i := range digests {
		c := f.Col(i)
		binary.LittleEndian.PutUint32(buf[:], uint32(len(c.Name())))
		h.Write(buf[:])
		h.Write([]byte(c.Name()))
		h.Write([]byte{byte(c.Kind())})
		h.Write(digests[i][:])
	}
	return Fingerprint{Rows: f.NumRows(), SHA256: hex.EncodeToString(h.Sum(nil))}
}

func columnDigest(c *tabprep.Column) [sha256.Size]byte {
	h := sha256.New()
	chunk := make([]byte, 0, 8*4096)
	flush := func() {
		h.Write(chunk)
		chunk = chunk[:0]
	}
	if c.Kind() == tabprep.Numeric {
		for _, v := range c.Float64s() {
			bits := math.Float64bits(v)
			if v != v {
				bits = canonicalNaN
			}
			chunk = binary.LittleEndian.AppendUint64(chunk, bits)
			if len(chunk) == cap(chunk) {
				flush()
			}
		}
	} else {
		levels := c.Levels()
		for _, k := range c.Codes() {
			if len(chunk)+4 > cap(chunk) {
				flush()
			}
			if k == tabprep.MissingCode {
				chunk = binary.LittleEndian.AppendUint32(chunk, math.MaxUint32)
				continue
			}
			chunk = binary.LittleEndian.AppendUint32(chunk, uint32(len(levels[k])))
			if len(chunk)+len(levels[k]) > cap(chunk) {
				flush()
				h.Write([]byte(levels[k]))
				continue
			}
			chunk = append(chunk, levels[k]...)
		}
	}
	flush()
	var out [sha256.Size]byte
	h.Sum(out[:0])
	return out
}
