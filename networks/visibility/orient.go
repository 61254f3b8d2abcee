package visibility

import (
	"math"
	"math/big"
)

// The natural-visibility test reduces to the sign of
//
//	D = (y1 − y0)·p1 − (y2 − y0)·p2
//
// with float64 samples y and integer index distances p < 2^31. crossSign
// returns that sign exactly: a floating-point filter with a forward error
// bound decides almost every case; the rest (ties, exactly collinear points,
// near-collinear triples) are settled by error-free transformations
// (TwoSum/TwoProduct with FMA) and an exact expansion sum (Shewchuk, Discrete
// Comput. Geom. 18 (1997) 305), and in the far-out ranges where those could
// overflow or underflow, by math/big at a precision that holds the exact
// value. Exactness makes the divide-and-conquer sweep (which compares each
// point only with the current record) identical to the definition "every c
// between lies strictly below the line".

// filterBound is the relative error bound of the floating-point D: each
// product carries at most two roundings and the final subtraction one, so
// |D̂ − D| ≤ (3ε + O(ε²))(|â| + |b̂|) with ε = 2^−53; 4ε covers the O(ε²) terms
// and the rounding of the bound itself.
const filterBound = 4 * 0x1p-53

// crossSign returns the exact sign of (y1−y0)·p1 − (y2−y0)·p2.
func crossSign(y1, y2, y0, p1, p2 float64) int {
	return cross4Sign(y1, y0, p1, y2, y0, p2)
}

// cross4Sign returns the exact sign of (y1−y0)·p1 − (y3−y2)·p2 for float64
// samples y and integer-valued p with |p| < 2^53.
func cross4Sign(y1, y0, p1, y3, y2, p2 float64) int {
	a := (y1 - y0) * p1
	b := (y3 - y2) * p2
	d := a - b
	s := math.Abs(a) + math.Abs(b)
	bound := filterBound * s
	if d > bound && s > 0x1p-900 {
		return 1
	}
	if d < -bound && s > 0x1p-900 {
		return -1
	}
	if a == 0 && b == 0 {
		// Each product is zero only if a difference is exactly zero (float
		// subtraction is exact at zero) or p is zero: D is exactly 0.
		return 0
	}
	return exactCross4Sign(y1, y0, p1, y3, y2, p2)
}

// twoSum returns s = fl(a+b) and the exact rounding error e, a + b = s + e.
func twoSum(a, b float64) (s, e float64) {
	s = a + b
	bb := s - a
	e = (a - (s - bb)) + (b - bb)
	return
}

// twoProd returns p = fl(a·b) and the exact error e = a·b − p (via FMA).
func twoProd(a, b float64) (p, e float64) {
	p = a * b
	e = math.FMA(a, b, -p)
	return
}

// safeMag reports whether v is zero or in the range where the error-free
// transformations above are exact (no overflow, no underflow of the error
// terms).
func safeMag(v float64) bool {
	a := math.Abs(v)
	return a == 0 || (a > 0x1p-900 && a < 0x1p+900)
}

// exactCrossSign computes the sign of (y1−y0)·p1 − (y2−y0)·p2 without error.
func exactCrossSign(y1, y2, y0, p1, p2 float64) int {
	return exactCross4Sign(y1, y0, p1, y2, y0, p2)
}

// exactCross4Sign computes the sign of (y1−y0)·p1 − (y3−y2)·p2 without error.
func exactCross4Sign(y1, y0, p1, y3, y2, p2 float64) int {
	if !safeMag(y1) || !safeMag(y0) || !safeMag(y3) || !safeMag(y2) {
		return bigCross4Sign(y1, y0, p1, y3, y2, p2)
	}
	d1, e1 := twoSum(y1, -y0)
	d2, e2 := twoSum(y3, -y2)
	var t [8]float64
	t[0], t[1] = twoProd(d1, p1)
	t[2], t[3] = twoProd(e1, p1)
	t[4], t[5] = twoProd(d2, -p2)
	t[6], t[7] = twoProd(e2, -p2)
	for _, v := range t {
		if !safeMag(v) {
			return bigCross4Sign(y1, y0, p1, y3, y2, p2)
		}
	}
	return expansionSign(t[:])
}

// expansionSign returns the sign of the exact sum of terms, by growing a
// nonoverlapping expansion (Shewchuk's Grow-Expansion); the sign of such an
// expansion is the sign of its largest nonzero component.
func expansionSign(terms []float64) int {
	var e [8]float64
	m := 0
	for _, q := range terms {
		for i := 0; i < m; i++ {
			q, e[i] = twoSum(q, e[i])
		}
		e[m] = q
		m++
	}
	for i := m - 1; i >= 0; i-- {
		switch {
		case e[i] > 0:
			return 1
		case e[i] < 0:
			return -1
		}
	}
	return 0
}

// bigPrec holds any difference of two float64 values (≤ 2^11 + 53 bits)
// times an integer below 2^53, and the difference of two such products.
const bigPrec = 2400

// bigCross4Sign is the exact fallback with math/big for magnitudes where the
// float64 expansions could overflow or underflow.
func bigCross4Sign(y1, y0, p1, y3, y2, p2 float64) int {
	nf := func(v float64) *big.Float { return new(big.Float).SetPrec(bigPrec).SetFloat64(v) }
	a := nf(y1)
	a.Sub(a, nf(y0))
	a.Mul(a, nf(p1))
	b := nf(y3)
	b.Sub(b, nf(y2))
	b.Mul(b, nf(p2))
	return a.Sub(a, b).Sign()
}
