package increments

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

func newRNG(seed uint64) *rand.Rand { return rand.New(rand.NewPCG(seed, 0x1c7)) }

// randomWalk returns the running sum of n i.i.d. N(0,1) steps.
func randomWalk(n int, rng *rand.Rand) []float64 {
	x := make([]float64, n)
	var s float64
	for i := range x {
		s += rng.NormFloat64()
		x[i] = s
	}
	return x
}

// studentWalk returns a walk whose steps are Student-t with ν = 3
// (generators.StudentT).
func studentWalk(t testing.TB, n int, rng *rand.Rand) []float64 {
	t.Helper()
	steps, err := generators.StudentT{Nu: 3}.Generate(n, rng)
	if err != nil {
		t.Fatal(err)
	}
	var s float64
	for i, v := range steps {
		s += v
		steps[i] = s
	}
	return steps
}

// TestGaussianRandomWalk checks Gaussian increments: skewness ≈ 0 and
// excess kurtosis ≈ 0 within 3 standard errors √(6/N), √(24/N) (standard
// results for i.i.d. Gaussian samples), the KS distance to the fitted
// Gaussian below the Lilliefors 1% critical value 1.031/√N (Lilliefors,
// J. Am. Stat. Assoc. 62 (1967) 399; 1.031/√N as in NikNakk/mothur source/calculators/geom.cpp), and the lag-1 increment
// autocorrelation ≈ 0 within 3/√N (standard error of a sample
// autocorrelation of i.i.d. data).
func TestGaussianRandomWalk(t *testing.T) {
	const n = 1 << 15
	for seed := uint64(1); seed <= 3; seed++ {
		r, err := Analyze(randomWalk(n, newRNG(seed)), Options{})
		if err != nil {
			t.Fatal(err)
		}
		sq := math.Sqrt(float64(r.N))
		if math.Abs(r.Skewness) > 3*r.SkewnessSE {
			t.Errorf("seed %d: skewness %.4f, want 0 ± %.4f", seed, r.Skewness, 3*r.SkewnessSE)
		}
		if math.Abs(r.ExcessKurtosis) > 3*r.KurtosisSE {
			t.Errorf("seed %d: excess kurtosis %.4f, want 0 ± %.4f", seed, r.ExcessKurtosis, 3*r.KurtosisSE)
		}
		if r.KS > 1.031/sq {
			t.Errorf("seed %d: KS %.5f above the Lilliefors 1%% value %.5f", seed, r.KS, 1.031/sq)
		}
		if math.Abs(r.Lag1) > 3/sq {
			t.Errorf("seed %d: lag-1 autocorrelation %.4f, want 0 ± %.4f", seed, r.Lag1, 3/sq)
		}
		if math.Abs(r.SD-1) > 0.03 || math.Abs(r.Mean) > 3/sq {
			t.Errorf("seed %d: increment mean %.4f, sd %.4f; want 0, 1", seed, r.Mean, r.SD)
		}
		t.Logf("seed %d: skew %.4f (SE %.4f), kurt %.4f (SE %.4f), KS %.5f (5%% crit %.5f), lag1 %.4f, max|z| %.2f",
			seed, r.Skewness, r.SkewnessSE, r.ExcessKurtosis, r.KurtosisSE, r.KS, r.KSCritical, r.Lag1, r.MaxAbsZ)
	}
}

// TestFatTails checks large excess kurtosis for Student-t (ν = 3)
// increments, whose fourth moment is infinite so the sample kurtosis is
// large and grows with N (standard result), and for random telegraph noise
// (generators.Telegraph, levels 0 and 1, symmetric mean dwell τ) plus
// Gaussian read-out noise of sd σ. Between two samples the state differs
// with probability p = (1 − e^{−2Δ/τ})/2 (two-state Markov chain with rate
// 1/τ each way, derived), so an increment is ±1 with probability p plus
// N(0, 2σ²): var = 2σ² + p and m4 = 3(2σ²)² + 6·2σ²·p + p (derived),
// excess kurtosis 76.5 at τ = 100Δ, σ = 0.025. About 650 switches in 2^16
// samples make the estimate uncertain by ≈ 4% (Poisson), so the tolerance
// is 15%.
func TestFatTails(t *testing.T) {
	const n = 1 << 16
	st, err := Analyze(studentWalk(t, n, newRNG(4)), Options{})
	if err != nil {
		t.Fatal(err)
	}
	if st.ExcessKurtosis < 3 || st.KS < 1.031/math.Sqrt(float64(st.N)) {
		t.Errorf("Student-t ν=3: excess kurtosis %.2f, KS %.4f; want fat tails", st.ExcessKurtosis, st.KS)
	}
	const tau, sigma = 100.0, 0.025
	rng := newRNG(5)
	x, err := generators.Telegraph{TauUp: tau, TauDown: tau, Dt: 1}.Generate(n, rng)
	if err != nil {
		t.Fatal(err)
	}
	for i := range x {
		x[i] += sigma * rng.NormFloat64()
	}
	tg, err := Analyze(x, Options{})
	if err != nil {
		t.Fatal(err)
	}
	p := (1 - math.Exp(-2/tau)) / 2
	s2 := 2 * sigma * sigma
	v := s2 + p
	want := (3*s2*s2+6*s2*p+p)/(v*v) - 3
	if math.Abs(tg.ExcessKurtosis-want) > 0.15*want {
		t.Errorf("telegraph: excess kurtosis %.2f, derived %.2f", tg.ExcessKurtosis, want)
	}
	t.Logf("Student-t ν=3: kurt %.2f, KS %.4f, max|z| %.1f; telegraph: kurt %.2f (derived %.2f), KS %.4f, max|z| %.1f",
		st.ExcessKurtosis, st.KS, st.MaxAbsZ, tg.ExcessKurtosis, want, tg.KS, tg.MaxAbsZ)
}

// TestLag1AndDecay checks the lag-1 increment autocorrelation against the
// derived value −(1−φ)/2 for AR(1)/OU series (γ_Δ(1)/γ_Δ(0) with
// γ_Δ(0) = 2γ(0)(1−φ), γ_Δ(1) = −γ(0)(1−φ)²; −0.5 for white noise, φ = 0),
// and the decay time τ/Δ of an OU process (lag-k autocorrelation
// e^{−kΔ/τ}, Gillespie, Phys. Rev. E 54 (1996) 2084). n = 2^16: the sd of a
// lag-1 autocorrelation is below 1/√n ≈ 0.004, tolerance 0.02; the decay
// time at τ/Δ = 10 has sd ≈ 0.4 samples, tolerance 1.5.
func TestLag1AndDecay(t *testing.T) {
	const n = 1 << 16
	const tau = 10.0
	phi := math.Exp(-1 / tau)
	ou, err := generators.OU{Tau: tau, S: 3, Dt: 1}.Generate(n, newRNG(6))
	if err != nil {
		t.Fatal(err)
	}
	w, err := generators.White{Sigma: 2}.Generate(n, newRNG(7))
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name string
		x    []float64
		want float64
	}{{"white", w, -0.5}, {"ou", ou, -(1 - phi) / 2}} {
		r, err := Analyze(tc.x, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(r.Lag1-tc.want) > 0.02 {
			t.Errorf("%s: lag-1 increment autocorrelation %.4f, derived %.4f", tc.name, r.Lag1, tc.want)
		}
		t.Logf("%s: lag1 %.4f (derived %.4f), decay %.2f (found %v)", tc.name, r.Lag1, tc.want, r.DecayTime, r.DecayFound)
		if tc.name == "ou" && (!r.DecayFound || math.Abs(r.DecayTime-tau) > 1.5) {
			t.Errorf("ou: decay time %.2f (found %v), want %.0f", r.DecayTime, r.DecayFound, tau)
		}
	}
	// A random walk's ACF can stay above 1/e over a short lag range: the
	// decay time is then reported as a lower bound.
	r, err := Analyze(randomWalk(4096, newRNG(8)), Options{Decay: decayLags(20)})
	if err != nil {
		t.Fatal(err)
	}
	if r.DecayFound || r.DecayTime != 20 {
		t.Errorf("random walk, 20 lags: decay %.2f found %v; want lower bound 20", r.DecayTime, r.DecayFound)
	}
}

// TestInvariance checks x → a·x + b: every measure is unchanged for a > 0;
// for a < 0 the skewness changes sign and the rest is unchanged (analytic:
// z → −z for negation, and KS to the symmetric Φ is unchanged).
func TestInvariance(t *testing.T) {
	x := studentWalk(t, 5000, newRNG(9))
	ref, err := Analyze(x, Options{Lag: 2})
	if err != nil {
		t.Fatal(err)
	}
	for _, ab := range [][2]float64{{1e-6, 3}, {4e3, -20}, {-1, 0}, {-2e-3, 5}} {
		y := make([]float64, len(x))
		for i, v := range x {
			y[i] = ab[0]*v + ab[1]
		}
		r, err := Analyze(y, Options{Lag: 2})
		if err != nil {
			t.Fatal(err)
		}
		sign := 1.0
		if ab[0] < 0 {
			sign = -1
		}
		pairs := [][3]float64{
			{ref.Skewness * sign, r.Skewness, 0},
			{ref.ExcessKurtosis, r.ExcessKurtosis, 1},
			{ref.KS, r.KS, 2},
			{ref.Lag1, r.Lag1, 3},
			{ref.MaxAbsZ, r.MaxAbsZ, 4},
			{ref.DecayTime, r.DecayTime, 5},
		}
		for _, p := range pairs {
			if math.Abs(p[0]-p[1]) > 1e-8*math.Max(1, math.Abs(p[0])) {
				t.Errorf("a=%g b=%g: measure %d is %.15g, want %.15g", ab[0], ab[1], int(p[2]), p[1], p[0])
			}
		}
	}
}

// TestNormalizedAndHistogram checks that the normalised increments have
// mean 0 and sd 1 (by construction), that the histogram density integrates
// to the share of values in range, that the fitted Gaussian is the N(0,1)
// density, and that for Gaussian increments the density agrees with it
// within binomial error (each bin count has sd ≈ √count; 5 sd allowed).
func TestNormalizedAndHistogram(t *testing.T) {
	x := randomWalk(1<<15, newRNG(10))
	z, err := Normalized(x, Options{})
	if err != nil {
		t.Fatal(err)
	}
	var m, s2 float64
	for _, v := range z {
		m += v
		s2 += v * v
	}
	m /= float64(len(z))
	s2 /= float64(len(z))
	if math.Abs(m) > 1e-12 || math.Abs(s2-1) > 1e-12 {
		t.Errorf("normalised increments: mean %g, variance %g", m, s2)
	}
	h, err := Histogram(z, HistogramOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(h.Centers) < 10 || len(h.Centers) > 200 || len(h.Edges) != len(h.Centers)+1 {
		t.Fatalf("%d bins", len(h.Centers))
	}
	var integral float64
	for i, d := range h.Density {
		w := h.Edges[i+1] - h.Edges[i]
		integral += d * w
		g := math.Exp(-h.Centers[i]*h.Centers[i]/2) / math.Sqrt(2*math.Pi)
		if math.Abs(h.Gaussian[i]-g) > 1e-12 {
			t.Fatalf("Gaussian at %g: %g, want %g", h.Centers[i], h.Gaussian[i], g)
		}
		expect := g * w * float64(h.N)
		if expect > 50 && math.Abs(float64(h.Counts[i])-expect) > 5*math.Sqrt(expect)+0.02*expect {
			t.Errorf("bin at %.2f: %d values, Gaussian expects %.0f", h.Centers[i], h.Counts[i], expect)
		}
	}
	if math.Abs(integral-1) > 1e-12 || h.Outside != 0 {
		t.Errorf("density integrates to %g with %d outside", integral, h.Outside)
	}
	h2, err := Histogram(z, HistogramOptions{Bins: 20, Min: -2, Max: 2})
	if err != nil {
		t.Fatal(err)
	}
	in := 0
	for _, c := range h2.Counts {
		in += c
	}
	if in+h2.Outside != len(z) || h2.Outside == 0 {
		t.Errorf("explicit range: %d inside + %d outside ≠ %d", in, h2.Outside, len(z))
	}
	t.Logf("default bins: %d over [%.2f, %.2f]", len(h.Centers), h.Edges[0], h.Edges[len(h.Edges)-1])
}

// TestEdgeCases checks the errors for short, constant, ramp and non-finite
// input and for invalid options.
func TestEdgeCases(t *testing.T) {
	ramp := make([]float64, 1000)
	for i := range ramp {
		ramp[i] = 0.1*float64(i) + 7
	}
	constant := make([]float64, 100)
	nan := randomWalk(100, newRNG(1))
	nan[50] = math.Inf(-1)
	tests := []struct {
		name string
		x    []float64
		opts Options
		want error
	}{
		{"short", []float64{1, 2, 3}, Options{}, ErrTooShort},
		{"short for lag", randomWalk(20, newRNG(2)), Options{Lag: 10}, ErrTooShort},
		{"constant", constant, Options{}, ErrConstant},
		{"linear ramp", ramp, Options{}, ErrConstant},
		{"inf", nan, Options{}, ErrNonFinite},
		{"negative lag", randomWalk(100, newRNG(3)), Options{Lag: -1}, ErrBadOption},
	}
	for _, tc := range tests {
		_, err := Analyze(tc.x, tc.opts)
		_, err2 := Normalized(tc.x, tc.opts)
		if !errors.Is(err, tc.want) || !errors.Is(err2, tc.want) {
			t.Errorf("%s: errors %v / %v, want %v", tc.name, err, err2, tc.want)
		}
		t.Logf("%s: %v", tc.name, err)
	}
	if _, err := Histogram([]float64{1}, HistogramOptions{}); !errors.Is(err, ErrTooShort) {
		t.Errorf("histogram of one value: %v", err)
	}
	if _, err := Histogram([]float64{1, 1, 1}, HistogramOptions{}); !errors.Is(err, ErrConstant) {
		t.Errorf("histogram of constant values: %v", err)
	}
	if _, err := Histogram([]float64{1, 2}, HistogramOptions{Min: 3, Max: 1}); !errors.Is(err, ErrBadOption) {
		t.Errorf("histogram with bad range: %v", err)
	}
}
