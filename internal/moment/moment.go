// Package moment computes means and variances of float64 data, skipping NaN
// (missing) values, accurately and in a form that merges across chunks.
//
// Of uses the corrected two-pass algorithm; Add and Merge use the updates of
// Welford (1962, Technometrics 4(3)) and Chan, Golub & LeVeque (1983, The
// American Statistician 37(3)), so a fit chunk by chunk agrees with a fit on
// all rows to rounding.
package moment

import "math"

// Summary is the count, mean and sum of squared deviations from the mean
// (M2) of the non-missing values seen.
type Summary struct {
	N    int
	Mean float64
	M2   float64
}

// Of returns the summary of the non-NaN values of x by the corrected
// two-pass algorithm: the mean first, then M2 = Σd² − (Σd)²/n with
// d = x − mean, whose second term cancels the rounding error of the mean
// (Chan, Golub & LeVeque 1983, eq. 1.7).
func Of(x []float64) Summary {
	var sum float64
	n := 0
	for _, v := range x {
		if v == v {
			sum += v
			n++
		}
	}
	if n == 0 {
		return Summary{}
	}
	mean := sum / float64(n)
	var s1, s2 float64
	for _, v := range x {
		if v == v {
			d := v - mean
			s1 += d
			s2 += d * d
		}
	}
	m2 := s2 - s1*s1/float64(n)
	if m2 < 0 {
		m2 = 0
	}
	// The correction also refines the mean.
	return Summary{N: n, Mean: mean + s1/float64(n), M2: m2}
}

// Add returns s with one more value (Welford's update); NaN is skipped.
func (s Summary) Add(v float64) Summary {
	if v != v {
		return s
	}
	s.N++
	d := v - s.Mean
	s.Mean += d / float64(s.N)
	s.M2 += d * (v - s.Mean)
	return s
}

// Merge returns the summary of the values of a and b together:
// δ = mean_b − mean_a, mean = mean_a + δ·n_b/n, M2 = M2_a + M2_b + δ²·n_a·n_b/n.
func Merge(a, b Summary) Summary {
	switch {
	case a.N == 0:
		return b
	case b.N == 0:
		return a
	}
	n := a.N + b.N
	d := b.Mean - a.Mean
	fa, fb, fn := float64(a.N), float64(b.N), float64(n)
	return Summary{
		N:    n,
		Mean: a.Mean + d*fb/fn,
		M2:   a.M2 + b.M2 + d*d*fa*fb/fn,
	}
}

// Var returns the variance: M2/(n−1) if sample, else M2/n. It is NaN when
// there are too few values (n < 2 for sample, n < 1 for population).
func (s Summary) Var(sample bool) float64 {
	den := s.N
	if sample {
		den--
	}
	if den < 1 {
		return math.NaN()
	}
	return s.M2 / float64(den)
}

// Std returns the square root of [Summary.Var].
func (s Summary) Std(sample bool) float64 { return math.Sqrt(s.Var(sample)) }
