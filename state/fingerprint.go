package state

import (
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"math"

	"github.com/tabprep/tabprep"
)

// Fingerprint identifies the training rows a pipeline was fitted on, so a
// saved state can be traced to its data without storing the data.
type Fingerprint struct {
	Rows   int    `json:"rows"`
	SHA256 string `json:"sha256"`
}

// FingerprintOf returns the row count of f and the SHA-256 of its content:
// column by column, the name, the kind and every cell (a number's IEEE 754
// bits, little endian, every NaN as one canonical NaN; a level as its
// length and bytes, a missing level as length 2³²−1). Two frames that are
// [tabprep.Equal] have the same fingerprint.
func FingerprintOf(f *tabprep.Frame) Fingerprint {
	h := sha256.New()
	var buf [8]byte
	writeString := func(s string) {
		binary.LittleEndian.PutUint32(buf[:4], uint32(len(s)))
		h.Write(buf[:4])
		h.Write([]byte(s))
	}
	chunk := make([]byte, 0, 8*4096)
	for i := 0; i < f.NumCols(); i++ {
		c := f.Col(i)
		writeString(c.Name())
		h.Write([]byte{byte(c.Kind())})
		if c.Kind() == tabprep.Numeric {
			for _, v := range c.Float64s() {
				bits := math.Float64bits(v)
				if v != v {
					bits = canonicalNaN
				}
				chunk = binary.LittleEndian.AppendUint64(chunk, bits)
				if len(chunk) == cap(chunk) {
					h.Write(chunk)
					chunk = chunk[:0]
				}
			}
			h.Write(chunk)
			chunk = chunk[:0]
			continue
		}
		levels := c.Levels()
		for _, k := range c.Codes() {
			if k == tabprep.MissingCode {
				binary.LittleEndian.PutUint32(buf[:4], math.MaxUint32)
				h.Write(buf[:4])
				continue
			}
			writeString(levels[k])
		}
	}
	return Fingerprint{Rows: f.NumRows(), SHA256: hex.EncodeToString(h.Sum(nil))}
}
