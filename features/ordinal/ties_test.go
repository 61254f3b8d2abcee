package ordinal

import (
	"errors"
	"math"
	"slices"
	"testing"
)

// quantise returns the codes 0 … levels−1 of an ADC with levels codes over
// mean ± c·sd of x, rounding to the nearest code and clipping at the rails
// (the codes are an increasing image of the recorded values, which is all
// ordinal patterns see).
func quantise(x []float64, levels int, c float64) []float64 {
	var mean, ss float64
	for _, v := range x {
		mean += v
	}
	mean /= float64(len(x))
	for _, v := range x {
		ss += (v - mean) * (v - mean)
	}
	sd := math.Sqrt(ss / float64(len(x)))
	q := 2 * c * sd / float64(levels-1)
	out := make([]float64, len(x))
	for i, v := range x {
		out[i] = math.Max(0, math.Min(float64(levels-1), math.Round((v-mean+c*sd)/q)))
	}
	return out
}

// TestTiesSkipIIDQuantised: i.i.d. Gaussian noise recorded with 16 levels
// over ±3 sd. With TiesSkip the tie-free windows of an i.i.d. series are
// uniformly distributed over the d! orders (derived: exchangeability), so
// H_S ≈ 1 and C_JS ≈ 0 within the same finite-sample bounds as continuous
// noise (TestIIDEntropyAndComplexity; Bandt & Pompe, Phys. Rev. Lett. 88
// (2002) 174102; Rosso et al., Phys. Rev. Lett. 99 (2007) 154102). With
// TiesStable the same series loses far more entropy than the bias (Zunino
// et al., Phys. Lett. A 381 (2017) 1883: equal values mimic structure);
// measured deficit at d = 4: 0.014, sixty times the bound.
func TestTiesSkipIIDQuantised(t *testing.T) {
	x := quantise(white(1<<15, newRNG(21)), 16, 3)
	for d := MinOrder; d <= 5; d++ {
		dist, err := Patterns(x, Options{Order: d, Ties: TiesSkip})
		if err != nil {
			t.Fatal(err)
		}
		if dist.Skipped != dist.Ties || dist.Windows+dist.Skipped != len(x)-d+1 {
			t.Fatalf("d=%d: %d kept + %d skipped windows, %d tied", d, dist.Windows, dist.Skipped, dist.Ties)
		}
		e, c := dist.Entropy(), dist.Complexity()
		def := 1 - e.Entropy
		factor := 2.0
		if d == 3 {
			factor = 4 // relative sd of the deficit √(2/(d!−1)) = 0.63 at d = 3
		}
		if def < 0 || def > factor*e.BiasIID {
			t.Errorf("d=%d TiesSkip: 1 − H = %.5f, i.i.d. bias %.5f (%d windows kept)", d, def, e.BiasIID, dist.Windows)
		}
		pred := Q0(factorial(d)) * math.Log(float64(factorial(d))) * def * e.Entropy / 4
		if math.Abs(c.Complexity-pred) > 0.05*pred {
			t.Errorf("d=%d TiesSkip: C = %.5f, second-order prediction %.5f", d, c.Complexity, pred)
		}
		stable, err := Entropy(x, Options{Order: d})
		if err != nil {
			t.Fatal(err)
		}
		if 1-stable.Entropy < 4*factor*stable.BiasIID {
			t.Errorf("d=%d TiesStable: 1 − H = %.5f, expected the tie rule to bias it well beyond %.5f", d, 1-stable.Entropy, stable.BiasIID)
		}
		t.Logf("d=%d: TiesSkip H = %.5f (bias %.5f, %d of %d windows), C = %.5f; TiesStable H = %.5f",
			d, e.Entropy, e.BiasIID, dist.Windows, dist.Windows+dist.Skipped, c.Complexity, stable.Entropy)
	}
}

// TestTiesSkipKeepsForbiddenPatterns: the logistic map at r = 4 recorded
// with 16 and 64 levels over ±3 sd. A monotone quantiser never creates a
// strict order, so with TiesSkip every pattern the unquantised orbit never
// shows stays missing (exact), including the strictly decreasing triple
// (Amigó, Zambrano & Sanjuán, EPL 79 (2007) 50001), and the permutation
// entropy stays that of the map (measured: 0.714 and 0.748 against 0.738 at
// d = 4), far below noise. TiesStable lets tied windows fill forbidden
// patterns (measured: 6 of the 89 at d = 5 with 16 levels).
func TestTiesSkipKeepsForbiddenPatterns(t *testing.T) {
	const n = 20000
	x := logistic(t, n, 2)
	cont := map[int]MissingResult{}
	for d := 3; d <= 6; d++ {
		m, err := Missing(x, Options{Order: d})
		if err != nil {
			t.Fatal(err)
		}
		cont[d] = m
	}
	h0, err := Entropy(x, Options{Order: 4})
	if err != nil {
		t.Fatal(err)
	}
	for _, levels := range []int{16, 64} {
		xq := quantise(x, levels, 3)
		for d := 3; d <= 6; d++ {
			m, err := Missing(xq, Options{Order: d, Ties: TiesSkip})
			if err != nil {
				t.Fatal(err)
			}
			for _, c := range cont[d].Codes {
				if _, found := slices.BinarySearch(m.Codes, c); !found {
					t.Errorf("levels %d, d=%d: pattern %d, never seen in the orbit, appears in a tie-free window", levels, d, c)
				}
			}
			t.Logf("levels %d, d=%d: %d missing with TiesSkip (%d windows), %d in the unquantised orbit", levels, d, m.Missing, m.Windows, cont[d].Missing)
		}
		for _, rule := range []Ties{TiesStable, TiesSkip} {
			m, err := Missing(xq, Options{Order: 3, Ties: rule})
			if err != nil {
				t.Fatal(err)
			}
			if _, found := slices.BinarySearch(m.Codes, factorial(3)-1); !found {
				t.Errorf("levels %d, rule %d: the decreasing triple appears", levels, rule)
			}
		}
		h, err := Entropy(xq, Options{Order: 4, Ties: TiesSkip})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(h.Entropy-h0.Entropy) > 0.05 || h.Entropy > 0.8 {
			t.Errorf("levels %d: H = %.4f with TiesSkip, %.4f unquantised", levels, h.Entropy, h0.Entropy)
		}
		t.Logf("levels %d: H(d=4) = %.4f with TiesSkip, %.4f unquantised", levels, h.Entropy, h0.Entropy)
	}
	stable, err := Missing(quantise(x, 16, 3), Options{Order: 5})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("TiesStable, 16 levels, d=5: %d missing, %d in the orbit", stable.Missing, cont[5].Missing)
	if stable.Missing >= cont[5].Missing {
		t.Errorf("TiesStable, 16 levels: %d patterns missing, the orbit misses %d; expected tied windows to fill some", stable.Missing, cont[5].Missing)
	}
}

func TestTiesSkipErrors(t *testing.T) {
	// Every window of three consecutive samples holds a pair of equal values.
	x := []float64{0, 0, 1, 1, 2, 2, 3, 3, 4, 4}
	if _, err := Patterns(x, Options{Order: 3, Ties: TiesSkip}); !errors.Is(err, ErrAllTied) {
		t.Errorf("all windows tied: err %v, want ErrAllTied", err)
	}
	if _, err := Patterns(x, Options{Order: 3, Ties: Ties(7)}); !errors.Is(err, ErrBadOption) {
		t.Errorf("unknown tie rule: err %v, want ErrBadOption", err)
	}
	// One tie-free window out of three: (1, 3, 2) is kept, (3, 2, 2) and
	// (2, 2, 4) are skipped.
	d, err := Patterns([]float64{1, 3, 2, 2, 4}, Options{Order: 3, Ties: TiesSkip})
	if err != nil {
		t.Fatal(err)
	}
	if d.Windows != 1 || d.Skipped != 2 || d.Ties != 2 {
		t.Errorf("windows %d, skipped %d, ties %d; want 1, 2, 2", d.Windows, d.Skipped, d.Ties)
	}
}
