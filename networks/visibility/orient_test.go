package visibility

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// ratCrossSign is the exact reference: rational arithmetic on the float64
// values (every float64 is a rational; big.Rat is exact).
func ratCrossSign(y1, y2, y0, p1, p2 float64) int {
	r := func(v float64) *big.Rat { return new(big.Rat).SetFloat64(v) }
	a := new(big.Rat).Sub(r(y1), r(y0))
	a.Mul(a, r(p1))
	b := new(big.Rat).Sub(r(y2), r(y0))
	b.Mul(b, r(p2))
	return a.Cmp(b)
}

// TestCrossSignExact: the filtered predicate agrees with exact rational
// arithmetic on adversarial near-collinear, tied, huge and tiny inputs
// (exactness is what makes the sweep equal the visibility definition).
func TestCrossSignExact(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	scales := []float64{1, 1e-3, 1e6, 1e-150, 1e150, 1e-300, 1e300, 1e-310}
	for k := 0; k < 60000; k++ {
		sc := scales[k%len(scales)]
		y0 := rng.NormFloat64() * sc
		y1 := rng.NormFloat64() * sc
		p1 := float64(1 + rng.IntN(1000))
		p2 := float64(1 + rng.IntN(1000))
		var y2 float64
		switch k % 4 {
		case 0: // exactly or nearly collinear, nudged by a few ulps
			y2 = y0 + (y1-y0)*p1/p2
			for s := rng.IntN(7) - 3; s != 0; {
				if s > 0 {
					y2 = math.Nextafter(y2, math.Inf(1))
					s--
				} else {
					y2 = math.Nextafter(y2, math.Inf(-1))
					s++
				}
			}
		case 1: // ties
			y2 = y0
			if rng.IntN(2) == 0 {
				y1 = y0
			}
		case 2: // small integers (exact collinearity common)
			y0 = float64(rng.IntN(5))
			y1 = float64(rng.IntN(5))
			y2 = float64(rng.IntN(5))
		default:
			y2 = rng.NormFloat64() * sc
		}
		got := crossSign(y1, y2, y0, p1, p2)
		want := ratCrossSign(y1, y2, y0, p1, p2)
		if got != want {
			t.Fatalf("crossSign(%v, %v, %v, %v, %v) = %d, want %d (big.Rat)", y1, y2, y0, p1, p2, got, want)
		}
		if e := exactCrossSign(y1, y2, y0, p1, p2); e != want {
			t.Fatalf("exactCrossSign(%v, %v, %v, %v, %v) = %d, want %d", y1, y2, y0, p1, p2, e, want)
		}
		// Four-point form with a shifted second base: (y1−y0)p1 − (y2+s − (y0+s))p2
		// has the same sign when the shift is exact (s a small integer
		// power of two at these magnitudes is not always exact, so compare
		// with big.Rat directly).
		y3 := y0 * 0.5
		y4 := y2 + (y3 - y0)
		w4 := ratCross4Sign(y1, y0, p1, y4, y3, p2)
		if got := cross4Sign(y1, y0, p1, y4, y3, p2); got != w4 {
			t.Fatalf("cross4Sign(%v, %v, %v, %v, %v, %v) = %d, want %d", y1, y0, p1, y4, y3, p2, got, w4)
		}
	}
}

// ratCross4Sign is the exact rational sign of (y1−y0)·p1 − (y3−y2)·p2.
func ratCross4Sign(y1, y0, p1, y3, y2, p2 float64) int {
	r := func(v float64) *big.Rat { return new(big.Rat).SetFloat64(v) }
	a := new(big.Rat).Sub(r(y1), r(y0))
	a.Mul(a, r(p1))
	b := new(big.Rat).Sub(r(y3), r(y2))
	b.Mul(b, r(p2))
	return a.Cmp(b)
}
