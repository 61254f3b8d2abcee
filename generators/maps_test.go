package generators

import (
	"math"
	"sort"
	"testing"
)

// TestLogisticInvariantDensity: at r = 4 the iterates follow the arcsine law
// with CDF F(x) = (2/π)·asin(√x) (Ulam & von Neumann 1947, analytic). The
// Kolmogorov–Smirnov test assumes independent draws, and successive iterates
// are dependent (though uncorrelated), so only every 10th iterate is used:
// the map is conjugate to angle doubling, under which the dependence of
// x_{t+10} on x_t spreads over 2^10 = 1024 preimage branches, far below what
// 20 000 points can resolve. The critical value 1.95/√n is the asymptotic
// KS quantile at α = 0.001 (Kolmogorov's limit law, standard statistics
// texts).
func TestLogisticInvariantDensity(t *testing.T) {
	const thin, m = 10, 20000
	x, err := Logistic{R: 4}.Generate(thin*m, newRand(21))
	if err != nil {
		t.Fatal(err)
	}
	s := make([]float64, m)
	for i := range s {
		s[i] = x[thin*i]
	}
	sort.Float64s(s)
	var d float64
	for i, v := range s {
		f := 2 / math.Pi * math.Asin(math.Sqrt(v))
		d = math.Max(d, math.Max(f-float64(i)/m, float64(i+1)/m-f))
	}
	crit := 1.95 / math.Sqrt(m)
	t.Logf("KS D = %.5f, critical %.5f (α = 0.001), D·√n = %.3f", d, crit, d*math.Sqrt(m))
	if d > crit {
		t.Errorf("KS distance %.5f exceeds %.5f: iterates do not follow the arcsine law", d, crit)
	}
	// Power check: a uniform sample of the same size must be rejected.
	u := make([]float64, m)
	for i := range u {
		u[i] = (float64(i) + 0.5) / m
	}
	var du float64
	for i, v := range u {
		f := 2 / math.Pi * math.Asin(math.Sqrt(v))
		du = math.Max(du, math.Max(f-float64(i)/m, float64(i+1)/m-f))
	}
	if du <= crit {
		t.Errorf("the KS check cannot tell the uniform law from the arcsine law")
	}
}

// period returns the least p ≤ maxP with |x[i+p] − x[i]| ≤ tol over the
// whole series, or 0.
func period(x []float64, maxP int, tol float64) int {
	for p := 1; p <= maxP; p++ {
		ok := true
		for i := 0; i+p < len(x); i++ {
			if math.Abs(x[i+p]-x[i]) > tol {
				ok = false
				break
			}
		}
		if ok {
			return p
		}
	}
	return 0
}

// TestLogisticPeriodicWindows: r = 3.5 has an attracting period-4 orbit and
// r = 3.83 an attracting period-3 orbit (analytic / common knowledge of the
// map), reached to 1e−9 after the 1000-iteration transient; the label rule
// calls them regular and r = 4 chaotic (λ = ln 2, analytic).
func TestLogisticPeriodicWindows(t *testing.T) {
	s, err := Lookup("logistic")
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		r      float64
		period int
		class  Class
	}{
		{3.5, 4, Regular},
		{3.83, 3, Regular},
		{4, 0, Chaotic},
	} {
		x, err := Logistic{R: tc.r}.Generate(2000, newRand(22))
		if err != nil {
			t.Fatal(err)
		}
		if p := period(x, 64, 1e-9); p != tc.period {
			t.Errorf("r = %g: period %d, want %d", tc.r, p, tc.period)
		}
		c, err := s.Class(map[string]float64{"r": tc.r})
		if err != nil || c != tc.class {
			t.Errorf("r = %g: class %s (%v), want %s", tc.r, c, err, tc.class)
		}
	}
	// r = 4: λ = ln 2 (analytic, conjugacy to the tent map). The orbit
	// average over 10^5 iterations has standard error ≈ 0.003 (sd of
	// ln|4(1−2x)| ≈ 1 under the arcsine law); tolerance 0.02.
	if l := LogisticLyapunov(4, mapLyapIters); math.Abs(l-math.Ln2) > 0.02 {
		t.Errorf("logistic r = 4: λ = %.5f, want ln 2 = %.5f", l, math.Ln2)
	}
	p, _ := Lookup("logistic-periodic")
	if c, _ := p.Class(map[string]float64{"r": 4}); c != Chaotic {
		t.Errorf("logistic-periodic at r = 4: %s, want chaotic (same rule)", c)
	}
}

// henonOrbitLyapunov computes the Hénon exponents along a generated series
// with the textbook tangent map: the state is (x_t, y_t = b·x_{t−1}), the
// Jacobian [[−2a·x_t, 1], [b, 0]], and two tangent vectors are
// re-orthonormalised by Gram–Schmidt every iteration (Benettin et al.,
// Meccanica 15 (1980) 9). It uses only the series and the published
// equations, not the package's Lyapunov code.
func henonOrbitLyapunov(x []float64, a, b float64) (l1, l2 float64) {
	u := [2]float64{1, 0}
	v := [2]float64{0, 1}
	var s1, s2 float64
	for t := 1; t < len(x); t++ {
		j00, j01, j10, j11 := -2*a*x[t], 1.0, b, 0.0
		u = [2]float64{j00*u[0] + j01*u[1], j10*u[0] + j11*u[1]}
		v = [2]float64{j00*v[0] + j01*v[1], j10*v[0] + j11*v[1]}
		nu := math.Hypot(u[0], u[1])
		u[0], u[1] = u[0]/nu, u[1]/nu
		dot := u[0]*v[0] + u[1]*v[1]
		v[0], v[1] = v[0]-dot*u[0], v[1]-dot*u[1]
		nv := math.Hypot(v[0], v[1])
		v[0], v[1] = v[0]/nv, v[1]/nv
		s1 += math.Log(nu)
		s2 += math.Log(nv)
	}
	n := float64(len(x) - 1)
	return s1 / n, s2 / n
}

// TestHenon: the generated series obeys x_{t+1} = 1 − a·x_t² + b·x_{t−1}
// exactly (the published map), its largest exponent is 0.41922 per
// iteration (Sprott, Chaos and Time-Series Analysis (2003), appendix
// ; confirmed: tkf/LyapunovExponents.jl src/examples/henon_map.jl) within 0.01, and λ1 + λ2 = ln b = −1.20397 within 1e−3
// (analytic: the Jacobian determinant is −b).
func TestHenon(t *testing.T) {
	const a, b = 1.4, 0.3
	x, err := Henon{A: a, B: b}.Generate(200000, newRand(23))
	if err != nil {
		t.Fatal(err)
	}
	for i := 1; i+1 < 1000; i++ {
		if want := 1 - a*x[i]*x[i] + b*x[i-1]; math.Abs(x[i+1]-want) > 1e-12 {
			t.Fatalf("x[%d] = %v, recurrence gives %v", i+1, x[i+1], want)
		}
	}
	l1, l2 := henonOrbitLyapunov(x, a, b)
	t.Logf("Hénon along the generated orbit: λ1 = %.5f, λ2 = %.5f, sum = %.6f", l1, l2, l1+l2)
	if math.Abs(l1-0.41922) > 0.01 { // Sprott (2003), confirmed: tkf/LyapunovExponents.jl src/examples/henon_map.jl
		t.Errorf("λ1 = %.5f, want 0.41922 ± 0.01", l1)
	}
	if math.Abs(l1+l2-math.Log(b)) > 1e-3 { // analytic: ln|det J| = ln b
		t.Errorf("λ1 + λ2 = %.6f, want ln 0.3 = %.6f", l1+l2, math.Log(b))
	}
	s, _ := Lookup("henon")
	sp, err := s.Lyapunov(nil)
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("Hénon label-rule spectrum: %v", sp.Exponents)
	if math.Abs(sp.Exponents[0]-0.41922) > 0.01 { // Sprott (2003), confirmed: tkf/LyapunovExponents.jl src/examples/henon_map.jl
		t.Errorf("label-rule λ1 = %.5f, want 0.41922 ± 0.01", sp.Exponents[0])
	}
	if math.Abs(sp.Exponents[0]+sp.Exponents[1]-math.Log(b)) > 1e-3 { // analytic
		t.Errorf("label-rule λ1 + λ2 = %.6f, want %.6f", sp.Exponents[0]+sp.Exponents[1], math.Log(b))
	}
	// a = 1.0, b = 0.3 lies below the chaotic range: the orbit is periodic
	// (checked directly on the series) and the rule calls it regular.
	xr, err := Henon{A: 1, B: b}.Generate(2000, newRand(24))
	if err != nil {
		t.Fatal(err)
	}
	if p := period(xr, 64, 1e-9); p == 0 {
		t.Errorf("Hénon a = 1: no period ≤ 64 found")
	}
	if c, err := s.Class(map[string]float64{"a": 1}); err != nil || c != Regular {
		t.Errorf("Hénon a = 1: class %s (%v), want regular", c, err)
	}
}

// TestMapInvariants checks the analytic exponents of the other maps with
// their label-rule spectra (10^5 iterations).
func TestMapInvariants(t *testing.T) {
	tests := []struct {
		name string
		set  map[string]float64
		idx  int     // 0: λ1; -1: λ1 + λ2
		want float64 // analytic value
		tol  float64
		why  string
	}{
		// |slope| = μ everywhere, so every orbit average is ln μ exactly.
		{"tent", nil, 0, math.Log(1.9999), 1e-9, "analytic: λ = ln mu"},
		// Orbit average of ln|3 − 3x²| over 10^5 iterations: standard
		// error ≈ 0.005 (sd ≈ 1.5 under the Chebyshev density); tolerance 0.02.
		{"cubic", nil, 0, math.Log(3), 0.02, "analytic: conjugacy to angle tripling"},
		{"lozi", nil, -1, math.Log(0.5), 1e-9, "analytic: ln|det J| = ln b"},
		{"ikeda", nil, -1, 2 * math.Log(0.9), 1e-9, "analytic: ln|det J| = 2 ln u"},
	}
	for _, tc := range tests {
		s, err := Lookup(tc.name)
		if err != nil {
			t.Fatal(err)
		}
		sp, err := s.Lyapunov(tc.set)
		if err != nil {
			t.Fatal(err)
		}
		got := sp.Exponents[0]
		if tc.idx == -1 {
			got += sp.Exponents[1]
		}
		t.Logf("%s: spectrum %v, checked %.6f vs %.6f (%s)", tc.name, sp.Exponents, got, tc.want, tc.why)
		if math.Abs(got-tc.want) > tc.tol {
			t.Errorf("%s: %.6f, want %.6f ± %g (%s)", tc.name, got, tc.want, tc.tol, tc.why)
		}
	}
	// The delayed logistic map is quasi-periodic (an invariant circle) at
	// A = 2.1, just past its Neimark–Sacker bifurcation at A = 2 (analytic:
	// the fixed point's multipliers cross the unit circle as a complex pair
	// at A = 2): λ1 ≈ 0 and the rule calls it regular.
	s, _ := Lookup("delayed-logistic")
	if c, err := s.Class(map[string]float64{"a": 2.1}); err != nil || c != Regular {
		t.Errorf("delayed logistic A = 2.1: %s (%v), want regular", c, err)
	}
}

// TestTentNoCollapse: at the default μ = 1.9999 a long float orbit stays
// spread over the attractor instead of collapsing onto 0 as μ = 2 would.
func TestTentNoCollapse(t *testing.T) {
	x, err := Tent{Mu: 1.9999}.Generate(100000, newRand(25))
	if err != nil {
		t.Fatal(err)
	}
	var zeros int
	for _, v := range x[len(x)-1000:] {
		if v == 0 {
			zeros++
		}
	}
	if zeros > 0 || variance(x[len(x)-1000:]) < 0.05 {
		t.Errorf("tent orbit collapsed: %d zeros, variance %g", zeros, variance(x[len(x)-1000:]))
	}
	if _, err := (Tent{Mu: 2}).Generate(10, newRand(1)); err == nil {
		t.Error("mu = 2 accepted")
	}
}
