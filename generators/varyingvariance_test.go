package generators

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// TestVaryingVariance: conditionally on the envelope, x_t/σ_t is the
// unit-variance AR(1) with coefficient φ, so for every envelope the
// standardised series is N(0, 1) (Kolmogorov–Smirnov at 0.1% on n = 10^5,
// valid for a correlated series only approximately, so it is applied at
// φ = 0) with lag-one autocorrelation φ (φ = 0.7: within five Bartlett
// standard errors), and the envelope has its documented shape: a ramp from
// e^{∓depth} to e^{±depth}, a sine of the given period. For the random
// envelope the log-sd is depth·u with u a unit OU, so E[x²] = E[σ²] =
// exp(2 depth²) (log-normal moment, analytic); estimated over R = 96
// series of n = 20000 at depth 0.5, τ = 200, within four replicate
// standard errors.
func TestVaryingVariance(t *testing.T) {
	const n = 100000
	for ei, env := range []VarianceEnvelope{EnvelopeRandom, EnvelopeRamp, EnvelopeSine} {
		for _, phi := range []float64{0, 0.7} {
			g := VaryingVariance{Envelope: env, Depth: 1.5, Tau: 5000, Period: 3000, Phi: phi}
			x, sd, err := g.Path(n, newRand(uint64(500+10*ei)+uint64(10*phi)))
			if err != nil {
				t.Fatal(err)
			}
			z := make([]float64, n)
			for i := range x {
				z[i] = x[i] / sd[i]
			}
			if phi == 0 {
				if d := ksDistance(z, distuv.UnitNormal.CDF); d > ksCritical(n) {
					t.Errorf("envelope %d: standardised KS D = %.5f > %.5f", env, d, ksCritical(n))
				}
			} else {
				r1 := autocorr(z, 1)
				if se := bartlettSE(phi, 1, n); math.Abs(r1-phi) > 5*se {
					t.Errorf("envelope %d: standardised lag-1 autocorrelation %.4f, want %g ± %.4f", env, r1, phi, 5*se)
				}
			}
			switch env {
			case EnvelopeRamp:
				a, b := math.Log(sd[0]), math.Log(sd[n-1])
				if math.Abs(math.Abs(a)-1.5) > 1e-12 || math.Abs(a+b) > 1e-12 {
					t.Errorf("ramp log-sd from %g to %g, want ∓1.5 to ±1.5", a, b)
				}
			case EnvelopeSine:
				for i := 0; i+3000 < n; i += 997 {
					if math.Abs(sd[i+3000]/sd[i]-1) > 1e-9 {
						t.Errorf("sine envelope not periodic at %d: %g vs %g", i, sd[i], sd[i+3000])
						break
					}
				}
			}
		}
	}
	const m, reps, depth = 20000, 96, 0.5
	rng := newRand(530)
	var ms []float64
	for r := 0; r < reps; r++ {
		x, err := VaryingVariance{Envelope: EnvelopeRandom, Depth: depth, Tau: 200}.Generate(m, rng)
		if err != nil {
			t.Fatal(err)
		}
		ms = append(ms, meanOf(x, func(v float64) float64 { return v * v }))
	}
	got, se := meanSE(ms)
	want := math.Exp(2 * depth * depth)
	t.Logf("random envelope: E[x²] = %.4f ± %.4f, exp(2 depth²) = %.4f", got, se, want)
	if math.Abs(got-want) > 4*se {
		t.Errorf("E[x²] = %.4f ± %.4f, want %.4f", got, se, want)
	}
	for _, g := range []VaryingVariance{{Envelope: 3, Depth: 1}, {Depth: -1, Tau: 10}, {Depth: 1, Tau: 10, Phi: 1}, {Envelope: EnvelopeSine, Depth: 1}, {Envelope: EnvelopeRandom, Depth: 1}} {
		if _, err := g.Generate(10, newRand(1)); err == nil {
			t.Errorf("%+v accepted", g)
		}
	}
}
