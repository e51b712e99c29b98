// Package quantile computes order statistics and sample quantiles of
// float64 data in linear expected time, by selection rather than sorting.
//
// Quantile definitions follow Hyndman & Fan (1996), "Sample quantiles in
// statistical packages", The American Statistician 50(4): type 7 (linear
// interpolation between order statistics at h = p(n−1)+1) is the default;
// type 6 (h = p(n+1)) is the one the NIST e-Handbook §7.2.5.2 uses.
package quantile

import (
	"math"
	"slices"
)

// Method is a Hyndman & Fan sample quantile definition.
type Method int

const (
	// Type7 interpolates at h = p(n−1)+1. Default.
	Type7 Method = 7
	// Type6 interpolates at h = p(n+1), clamped to [1, n].
	Type6 Method = 6
)

// Position returns the 1-based fractional order-statistic position h of
// quantile p for n values, clamped to [1, n].
func (m Method) Position(p float64, n int) float64 {
	var h float64
	switch m {
	case Type6:
		h = p * float64(n+1)
	default:
		h = p*float64(n-1) + 1
	}
	return math.Min(math.Max(h, 1), float64(n))
}

// DropNaN returns the non-NaN values of x in a new slice.
func DropNaN(x []float64) []float64 {
	out := make([]float64, 0, len(x))
	for _, v := range x {
		if v == v {
			out = append(out, v)
		}
	}
	return out
}

// Select reorders x so that x[k] is the value that would be at index k if x
// were sorted, every value before it is ≤ x[k] and every value after ≥. x
// must hold no NaN. It runs in expected linear time (quickselect with a
// median-of-three pivot, falling back to sorting small ranges).
func Select(x []float64, k int) {
	lo, hi := 0, len(x)-1
	for hi-lo > 16 {
		mid := lo + (hi-lo)/2
		// Median of three to x[mid].
		if x[mid] < x[lo] {
			x[mid], x[lo] = x[lo], x[mid]
		}
		if x[hi] < x[lo] {
			x[hi], x[lo] = x[lo], x[hi]
		}
		if x[hi] < x[mid] {
			x[hi], x[mid] = x[mid], x[hi]
		}
		pivot := x[mid]
		// Hoare partition; equal keys split evenly, so runs of ties stay
		// linear.
		i, j := lo, hi
		for i <= j {
			for x[i] < pivot {
				i++
			}
			for x[j] > pivot {
				j--
			}
			if i <= j {
				x[i], x[j] = x[j], x[i]
				i++
				j--
			}
		}
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return
		}
	}
	slices.Sort(x[lo : hi+1])
}

// Of returns quantile p ∈ [0, 1] of x by method m. x is scratch: it must
// hold no NaN, and its order is changed. It returns NaN for empty x.
func Of(x []float64, p float64, m Method) float64 {
	if len(x) == 0 {
		return math.NaN()
	}
	lo, frac := m.split(p, len(x))
	Select(x, lo)
	v := x[lo]
	if frac == 0 || lo+1 >= len(x) {
		return v
	}
	// After Select the next order statistic is the minimum of the rest.
	return v + frac*(slices.Min(x[lo+1:])-v)
}

// split returns the 0-based index of the order statistic below quantile p
// of n values and the fraction of the way to the next one.
func (m Method) split(p float64, n int) (int, float64) {
	h := m.Position(p, n)
	return int(math.Floor(h)) - 1, h - math.Floor(h)
}

// Sorted returns quantile p of sorted data by method m, in constant time.
// It returns NaN for empty sorted.
func Sorted(sorted []float64, p float64, m Method) float64 {
	if len(sorted) == 0 {
		return math.NaN()
	}
	lo, frac := m.split(p, len(sorted))
	v := sorted[lo]
	if frac == 0 || lo+1 >= len(sorted) {
		return v
	}
	return v + frac*(sorted[lo+1]-v)
}
