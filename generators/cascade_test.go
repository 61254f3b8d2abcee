package generators

import (
	"math"
	"testing"
)

// TestCascadePartitionFunction: the p-model measure μ_i = W_i/2^J has the
// partition function Σ_i μ_i^q = (p^q + (1 − p)^q)^J exactly for every
// realisation (each cell's weight is a product of J factors p or 1 − p, and
// every split contributes both; Meneveau & Sreenivasan, Phys. Rev. Lett. 59
// (1987) 1424), so τ(q) = −log2(p^q + (1 − p)^q). Checked for q = 0..4
// (q = 1: mass conservation) at J = 16 to 10^{−10} relative (the rounding
// bound of a sum of 2^16 terms is 2^16·ε ≈ 1.5·10^{−11}).
func TestCascadePartitionFunction(t *testing.T) {
	const levels = 16
	for _, p := range []float64{0.5, 0.7, 0.9} {
		w, err := Cascade{P: p}.Weights(levels, newRand(430))
		if err != nil {
			t.Fatal(err)
		}
		for q := 0.0; q <= 4; q++ {
			var z float64
			for _, v := range w {
				z += math.Pow(v/(1<<levels), q)
			}
			want := math.Pow(math.Pow(p, q)+math.Pow(1-p, q), levels)
			if math.Abs(z/want-1) > 1e-10 {
				t.Errorf("p = %g, q = %g: Σμ^q = %.15g, want %.15g", p, q, z, want)
			}
		}
	}
}

// TestCascadeKurtosis: the sum X_b of x over a block of 2^j cells is
// N(0, S_b) given the cascade, S_b the block's weight, so E[X_b²] = 2^j and
// E[X_b⁴] = 3·mean_b S_b² = 3·2^{2j}(2(p² + (1 − p)²))^{J−j} (derived
// from the partition function at q = 2; Meneveau & Sreenivasan 1987):
// the kurtosis K(j) = 3(2(p² + (1 − p)²))^{J−j} falls with the scale j.
// Block moments averaged over R = 300 series of n = 2^12 at p = 0.7 are
// compared with these for j = 0, 3, 6, 9 within four replicate standard
// errors.
func TestCascadeKurtosis(t *testing.T) {
	const levels, reps, p = 12, 300, 0.7
	n := 1 << levels
	rng := newRand(431)
	scales := []int{0, 3, 6, 9}
	m2 := make([][]float64, len(scales))
	m4 := make([][]float64, len(scales))
	for r := 0; r < reps; r++ {
		x, err := Cascade{P: p}.Generate(n, rng)
		if err != nil {
			t.Fatal(err)
		}
		for si, j := range scales {
			size := 1 << j
			var s2, s4 float64
			for b := 0; b < n; b += size {
				var sum float64
				for _, v := range x[b : b+size] {
					sum += v
				}
				s2 += sum * sum
				s4 += sum * sum * sum * sum
			}
			blocks := float64(n / size)
			m2[si] = append(m2[si], s2/blocks)
			m4[si] = append(m4[si], s4/blocks)
		}
	}
	r := 2 * (p*p + (1-p)*(1-p))
	for si, j := range scales {
		want2 := math.Pow(2, float64(j))
		want4 := 3 * want2 * want2 * math.Pow(r, float64(levels-j))
		a2, se2 := meanSE(m2[si])
		a4, se4 := meanSE(m4[si])
		t.Logf("scale 2^%d: E X² = %.3f ± %.3f (want %g), kurtosis %.3f (want %.3f)", j, a2, se2, want2, a4/(a2*a2), want4/(want2*want2))
		if math.Abs(a2-want2) > 4*se2 || math.Abs(a4-want4) > 4*se4 {
			t.Errorf("scale 2^%d: E X² = %.4f ± %.4f want %g; E X⁴ = %.4f ± %.4f want %.4f", j, a2, se2, want2, a4, se4, want4)
		}
	}
	for _, p := range []float64{0.4, 1, math.NaN()} {
		if _, err := (Cascade{P: p}).Generate(10, rng); err == nil {
			t.Errorf("p = %g accepted", p)
		}
	}
}
