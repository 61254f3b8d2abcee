package groups

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"
)

// mwBrute returns P(U ≤ k) under H₀ by enumerating all C(n+m, n)
// arrangements of n a's and m b's (U = number of (a, b) pairs with the a
// after the b), the definition of the null distribution (Mann & Whitney
// 1947).
func mwBrute(n, m, k int) float64 {
	total, hit := 0, 0
	var rec func(i, j, u int)
	rec = func(i, j, u int) {
		if i == n && j == m {
			total++
			if u <= k {
				hit++
			}
			return
		}
		if i < n { // next value is an a: it beats the j b's placed so far
			rec(i+1, j, u+j)
		}
		if j < m {
			rec(i, j+1, u)
		}
	}
	rec(0, 0, 0)
	return float64(hit) / float64(total)
}

// TestMWExactEnumeration checks the exact lower tail against enumeration
// for every k.
func TestMWExactEnumeration(t *testing.T) {
	for _, c := range [][2]int{{1, 1}, {1, 6}, {3, 3}, {4, 5}, {6, 4}, {7, 7}, {5, 9}} {
		n, m := c[0], c[1]
		for k := -1; k <= n*m; k++ {
			got, want := mwLowerTail(n, m, k), mwBrute(n, m, k)
			if math.Abs(got-want) > 1e-14 { // enumeration: exact rational up to rounding
				t.Errorf("n=%d m=%d k=%d: %.17g, enumeration %.17g", n, m, k, got, want)
			}
		}
	}
}

// TestMWTextbook checks the worked example in the scipy.stats.mannwhitneyu
// documentation (SciPy 1.10, its reference [4]): ages of males
// {19, 22, 16, 29, 24} and females {20, 11, 17, 12}: U = 17, exact
// two-sided p = 0.1111 (= 14/126), normal approximation with continuity
// correction p = 0.11134688653314041.
func TestMWTextbook(t *testing.T) {
	males := []float64{19, 22, 16, 29, 24}
	females := []float64{20, 11, 17, 12}
	r, err := MannWhitney(males, females, MWOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if r.U != 17 || r.Method != MethodExact || math.Abs(r.P-14.0/126) > 1e-15 {
		t.Errorf("U = %v p = %.17g (%s), want 17, 14/126, exact", r.U, r.P, r.Method)
	}
	r, _ = MannWhitney(males, females, MWOptions{Method: MethodAsymptotic})
	if math.Abs(r.P-0.11134688653314041) > 1e-15 {
		t.Errorf("asymptotic p = %.17g, want 0.11134688653314041", r.P)
	}
}

// TestMWCriticalValue checks the two-sided 5 % critical value of U for
// n = m = 10, U ≤ 23, of the standard Mann–Whitney tables (e.g. Siegel &
// Castellan, Nonparametric Statistics (1988), table J; confirmed: numeracy-bank.net/?q=t/stt/mwu/3, n1 = n2 = 10: 23):
// 2·P(U ≤ 23) ≤ 0.05 < 2·P(U ≤ 24).
func TestMWCriticalValue(t *testing.T) {
	if p := 2 * mwLowerTail(10, 10, 23); p > 0.05 {
		t.Errorf("2P(U ≤ 23) = %v > 0.05", p)
	}
	if p := 2 * mwLowerTail(10, 10, 24); p <= 0.05 {
		t.Errorf("2P(U ≤ 24) = %v ≤ 0.05", p)
	}
}

// TestMWProperties: the null distribution is symmetric about nm/2, so
// P(U ≤ k) = 1 − P(U ≤ nm − k − 1) (Mann & Whitney 1947); U(a, b) +
// U(b, a) = nm; the test is invariant under a·x + b (a > 0) and any
// strictly increasing map, and a < 0 swaps U and nm − U, leaving p
// unchanged.
func TestMWProperties(t *testing.T) {
	n, m := 12, 9
	for k := 0; k < n*m; k++ {
		a, b := mwLowerTail(n, m, k), 1-mwLowerTail(n, m, n*m-k-1)
		if math.Abs(a-b) > 1e-13 {
			t.Errorf("k=%d: %v vs %v", k, a, b)
		}
	}
	rng := rand.New(rand.NewPCG(5, 6))
	x, y := normals(rng, 14, 0, 1), normals(rng, 19, 0.5, 2)
	for _, method := range []Method{MethodExact, MethodAsymptotic} {
		ref, _ := MannWhitney(x, y, MWOptions{Method: method})
		sw, _ := MannWhitney(y, x, MWOptions{Method: method})
		if ref.U+sw.U != 14*19 || ref.P != sw.P {
			t.Errorf("%s swap: U %v + %v, p %v vs %v", method, ref.U, sw.U, ref.P, sw.P)
		}
		for _, f := range []func(float64) float64{
			func(v float64) float64 { return 1e6*v - 7 },
			func(v float64) float64 { return -0.5 * v },
			math.Exp,
		} {
			tx, ty := make([]float64, len(x)), make([]float64, len(y))
			for i := range x {
				tx[i] = f(x[i])
			}
			for i := range y {
				ty[i] = f(y[i])
			}
			r, _ := MannWhitney(tx, ty, MWOptions{Method: method})
			if r.P != ref.P || (r.U != ref.U && r.U != 14*19-ref.U) {
				t.Errorf("%s transformed: U %v p %v, want U %v or %v, p %v", method, r.U, r.P, ref.U, 14*19-ref.U, ref.P)
			}
		}
	}
}

// TestMWTies: tied data use the tie-corrected normal approximation under
// MethodAuto; MethodExact refuses them; all values equal gives p = 1.
func TestMWTies(t *testing.T) {
	a, b := []float64{1, 2, 2, 3, 3, 3}, []float64{2, 3, 4, 4, 5}
	r, err := MannWhitney(a, b, MWOptions{})
	if err != nil || r.Method != MethodAsymptotic || !r.Ties {
		t.Errorf("ties: %+v %v", r, err)
	}
	if _, err := MannWhitney(a, b, MWOptions{Method: MethodExact}); !errors.Is(err, ErrTiesExact) {
		t.Errorf("exact with ties: %v", err)
	}
	r, err = MannWhitney([]float64{4, 4, 4}, []float64{4, 4}, MWOptions{})
	if err != nil || r.P != 1 || r.U != 3 {
		t.Errorf("all tied: %+v %v", r, err)
	}
	if _, err := MannWhitney([]float64{}, []float64{1}, MWOptions{}); !errors.Is(err, ErrEmpty) {
		t.Errorf("empty: %v", err)
	}
}
