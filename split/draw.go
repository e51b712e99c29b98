package split

import (
	"math/bits"
	"math/rand/v2"
)

// streamTag is the second word of every PCG state this package makes, so a
// Seed value alone picks the sequence. It spells "tabprep!" in ASCII.
const streamTag = 0x7461627072657021

// draw is the package's only source of randomness: the PCG generator of
// math/rand/v2 (O'Neill's PCG with the DXSM output function, a specified
// algorithm) and the bounded-integer reduction below, written here rather
// than taken from rand.Rand so that no change to math/rand/v2's methods can
// change a split.
type draw struct{ src *rand.PCG }

func newDraw(stream uint64) draw { return draw{rand.NewPCG(stream, streamTag)} }

// below returns a uniform integer in [0, n) for n > 0, by Lemire's
// multiply-and-reject method (D. Lemire, "Fast Random Integer Generation in
// an Interval", ACM TOMACS 29(1), 2019).
func (d draw) below(n uint64) uint64 {
	hi, lo := bits.Mul64(d.src.Uint64(), n)
	if lo < n {
		thresh := -n % n
		for lo < thresh {
			hi, lo = bits.Mul64(d.src.Uint64(), n)
		}
	}
	return hi
}

// shuffle permutes s uniformly by the Fisher-Yates method (Knuth, TAOCP
// vol. 2, Algorithm P), walking down from the last element.
func shuffle[T int | int32](d draw, s []T) {
	for i := len(s) - 1; i > 0; i-- {
		j := d.below(uint64(i + 1))
		s[i], s[j] = s[j], s[i]
	}
}

// bitset is a fixed-size set of small integers.
type bitset []uint64

func newBitset(n int) bitset    { return make(bitset, (n+63)/64) }
func (b bitset) has(i int) bool { return b[i>>6]&(1<<(uint(i)&63)) != 0 }
func (b bitset) add(i int)      { b[i>>6] |= 1 << (uint(i) & 63) }

// choose marks a uniform random k-subset of [0, n) in b, by Floyd's
// algorithm (J. Bentley with R. Floyd, "Programming Pearls: A sample of
// brilliance", CACM 30(9), 1987): k draws and no scratch beyond the set.
func choose(d draw, b bitset, n, k int) {
	for j := n - k; j < n; j++ {
		t := int(d.below(uint64(j + 1)))
		if b.has(t) {
			t = j
		}
		b.add(t)
	}
}
