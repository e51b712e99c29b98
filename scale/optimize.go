package scale

import "math"

// argmax returns the x in [lo, hi] at which f is largest, to within tol.
// A grid of cells points finds the highest hill, so a function with several
// local maxima on the interval is not trusted to a bracket that misses the
// best one; golden-section search (Kiefer 1953, "Sequential minimax search
// for a maximum", Proc. Amer. Math. Soc. 4(3)) then narrows the two grid
// cells beside the best grid point. f may return −Inf or NaN where it is
// undefined; both count as lowest.
func argmax(f func(float64) float64, lo, hi float64, cells int, tol float64) float64 {
	val := func(x float64) float64 {
		if v := f(x); v == v {
			return v
		}
		return math.Inf(-1)
	}
	step := (hi - lo) / float64(cells)
	best, bestV := lo, val(lo)
	for i := 1; i <= cells; i++ {
		x := lo + float64(i)*step
		if i == cells {
			x = hi
		}
		if v := val(x); v > bestV {
			best, bestV = x, v
		}
	}
	a, b := max(lo, best-step), min(hi, best+step)
	const invPhi = 0.6180339887498949 // (√5 − 1)/2
	c, d := b-invPhi*(b-a), a+invPhi*(b-a)
	fc, fd := val(c), val(d)
	for b-a > tol {
		if fc >= fd {
			b, d, fd = d, c, fc
			c = b - invPhi*(b-a)
			fc = val(c)
		} else {
			a, c, fc = c, d, fd
			d = a + invPhi*(b-a)
			fd = val(d)
		}
	}
	x := a + (b-a)/2
	if val(x) < bestV { // the hill is a grid point at an end of the cells
		return best
	}
	return x
}
