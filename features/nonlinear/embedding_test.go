package nonlinear

import (
	"math"
	"testing"
)

// Automatic embedding on reference systems.
func TestEmbedReferenceSystems(t *testing.T) {
	// Hénon observed through x: d = 2 (the map is two-dimensional and x
	// determines y = b·x_{t−1}; common practice), τ = 1 for maps.
	e, err := Embed(series(t, henon, 5000, 1), EmbedOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if e.Dim != 2 || e.Delay != 1 {
		t.Errorf("henon: d = %d, τ = %d (%s), want 2, 1", e.Dim, e.Delay, e.DelayMethod)
	}
	// Logistic map: one-dimensional, τ = 1; Cao's E1 may saturate at 1 or 2.
	e, err = Embed(series(t, logistic4, 5000, 1), EmbedOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if e.Dim > 2 || e.Delay != 1 {
		t.Errorf("logistic: d = %d, τ = %d, want ≤ 2, 1", e.Dim, e.Delay)
	}
	// Lorenz x at dt = 0.01: first AMI minimum ≈ 0.1–0.2 time units and
	// d = 3 (common practice / memory: Fraser & Swinney 1986 report the
	// first minimum near 0.16; d = 3 is the usual choice).
	for seed := uint64(1); seed <= 3; seed++ {
		e, err = Embed(series(t, lorenz, 20000, seed), EmbedOptions{})
		if err != nil {
			t.Fatal(err)
		}
		tu := float64(e.Delay) * lorenzDt
		t.Logf("lorenz seed %d: τ = %d samples = %.2f time units (%s), d = %d, E1 = %.3f", seed, e.Delay, tu, e.DelayMethod, e.Dim, e.Cao.E1[:5])
		if e.DelayMethod != MethodAMI || tu < 0.1 || tu > 0.2 {
			t.Errorf("lorenz seed %d: τ = %.2f time units by %s, want 0.1–0.2 by AMI", seed, tu, e.DelayMethod)
		}
		if e.Dim != 3 {
			t.Errorf("lorenz seed %d: d = %d, want 3", seed, e.Dim)
		}
	}
}

// AR(1) has a monotone AMI (−½ ln(1 − φ^{2τ}) for a Gaussian process,
// analytic), so the delay falls back to the autocorrelation 1/e time,
// ⌈−1/ln φ⌉ = 10 for φ = 0.9 (analytic ρ(k) = φ^k, ±1 for sampling error).
func TestEmbedFallbackToAutocorrelation(t *testing.T) {
	e, err := Embed(series(t, ar1, 20000, 1), EmbedOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if e.DelayMethod != MethodACF || math.Abs(float64(e.Delay-10)) > 1 {
		t.Errorf("ar1: τ = %d by %s, want 10 ± 1 by %s", e.Delay, e.DelayMethod, MethodACF)
	}
	if e.Theiler != 2*e.ACFTime {
		t.Errorf("Theiler window %d, want 2 × %d", e.Theiler, e.ACFTime)
	}
}

// Cao's E2 is ≈ 1 for every d for independent noise and departs from 1 for
// deterministic data (Cao, Physica D 110 (1997) 43). With 1000 reference
// points each E* has ≈ 2.5% sampling error, so ±0.1 on the ratio is about
// three standard deviations.
func TestCaoE2(t *testing.T) {
	c, err := Cao(series(t, white, 20000, 1), CaoOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if c.E2Deviation > 0.1 {
		t.Errorf("white noise: max |E2 − 1| = %.3f, want ≤ 0.1 (E2 = %.3f)", c.E2Deviation, c.E2)
	}
	c, err = Cao(series(t, henon, 5000, 1), CaoOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if c.E2Deviation < 0.5 {
		t.Errorf("henon: max |E2 − 1| = %.3f, want clearly > 0 (E2 = %.3f)", c.E2Deviation, c.E2)
	}
}

// False nearest neighbours (Kennel, Brown & Abarbanel, Phys. Rev. A 45
// (1992) 3403): the fraction drops to ~0 at d = 2 for Hénon and d = 3 for
// Lorenz (common practice / memory).
func TestFalseNeighbours(t *testing.T) {
	f, err := FalseNeighbours(series(t, henon, 5000, 1), FNNOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if f.Dim != 2 {
		t.Errorf("henon: FNN d = %d (%.3f), want 2", f.Dim, f.Fractions)
	}
	f, err = FalseNeighbours(series(t, lorenz, 20000, 1), FNNOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if f.Dim != 3 {
		t.Errorf("lorenz: FNN d = %d (%.3f), want 3", f.Dim, f.Fractions)
	}
	e, err := Embed(series(t, henon, 5000, 1), EmbedOptions{UseFNN: true})
	if err != nil || e.DimMethod != MethodFNN || e.Dim != 2 {
		t.Errorf("Embed with FNN: %+v, %v", e, err)
	}
}

// The AMI depends only on ranks: identical for any increasing affine map,
// and, with the odd default bin count, for negation (construction of
// binEquiprobable).
func TestAMIInvariance(t *testing.T) {
	x := series(t, lorenz, 5000, 1)
	ref, err := AverageMutualInformation(x, AMIOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for _, ab := range [][2]float64{{1e-3, 7}, {-2.5, 1}} {
		got, err := AverageMutualInformation(affine(x, ab[0], ab[1]), AMIOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if got.FirstMin != ref.FirstMin {
			t.Errorf("a=%g: first minimum %d, want %d", ab[0], got.FirstMin, ref.FirstMin)
		}
		for k := range ref.MI {
			if math.Abs(got.MI[k]-ref.MI[k]) > 1e-12 {
				t.Fatalf("a=%g: I(%d) = %.15g, want %.15g", ab[0], k, got.MI[k], ref.MI[k])
			}
		}
	}
}
