package generators

import (
	"fmt"
	"math"
	"testing"
)

// lvOrbit returns the prey and predator series of one orbit: Generate
// with obs 0 and obs 1 from generators in the same state draw the same
// start, so the two series are the two coordinates of one orbit.
func lvOrbit(t *testing.T, m LotkaVolterra, n int, seed uint64) (x, y []float64) {
	t.Helper()
	m.Obs = 0
	x, err := m.Generate(n, newRand(seed))
	if err != nil {
		t.Fatal(err)
	}
	m.Obs = 1
	y, err = m.Generate(n, newRand(seed))
	if err != nil {
		t.Fatal(err)
	}
	return x, y
}

// TestLotkaVolterraConserved: V = δx − γ ln x + βy − α ln y is a
// constant of the motion (analytic), so along 10^4 samples of the
// integrated orbit it must stay put: its drift, relative to the orbit's
// height V − V* above the centre's value, stays below 1e−8 (RK4 at
// h = 0.01: the global error per unit time is of order h⁴ = 1e−8 times
// the field's derivatives; 1e−9 to 6e−9 is measured) for small and large
// orbits and uneven rates.
func TestLotkaVolterraConserved(t *testing.T) {
	for _, m := range []LotkaVolterra{
		{Alpha: 1, Beta: 1, Gamma: 1, Delta: 1, Size: 1, Dt: 0.1},
		{Alpha: 1, Beta: 1, Gamma: 1, Delta: 1, Size: 0.05, Dt: 0.1},
		{Alpha: 1, Beta: 1, Gamma: 1, Delta: 1, Size: 2.5, Dt: 0.1},
		{Alpha: 2.5, Beta: 0.3, Gamma: 0.4, Delta: 1.7, Size: 1.5, Dt: 0.2},
	} {
		t.Run(fmt.Sprintf("%+v", m), func(t *testing.T) {
			x, y := lvOrbit(t, m, 10000, 7)
			vStar := m.Conserved(m.Gamma/m.Delta, m.Alpha/m.Beta)
			v0 := m.Conserved(x[0], y[0])
			var drift float64
			for i := range x {
				drift = math.Max(drift, math.Abs(m.Conserved(x[i], y[i])-v0))
			}
			rel := drift / (v0 - vStar)
			t.Logf("V − V* = %.6g, largest drift %.3g (relative %.3g)", v0-vStar, drift, rel)
			if !(rel < 1e-8) {
				t.Errorf("V drifts by %.3g of V − V* = %.4g over 10^4 samples", rel, v0-vStar)
			}
		})
	}
}

// TestLotkaVolterraCentre: near the centre the motion is the linearised
// rotation with period 2π/√(αγ) (analytic: the Jacobian at (γ/δ, α/β)
// has eigenvalues ±i√(αγ)); small orbits (size 0.05) match it within
// 0.1 %. Over whole periods the time averages of x and y are the centre's
// coordinates γ/δ and α/β (analytic: integrate d ln y/dt = δx − γ and
// d ln x/dt = α − βy over a period) — checked over 40 periods of a large
// orbit to 1e−3 (the incomplete last period bounds the error).
func TestLotkaVolterraCentre(t *testing.T) {
	m := LotkaVolterra{Alpha: 1.5, Beta: 0.8, Gamma: 0.6, Delta: 1.2, Size: 0.05, Dt: 0.05}
	x, _ := lvOrbit(t, m, 40000, 8)
	want := 2 * math.Pi / math.Sqrt(m.Alpha*m.Gamma)
	if p := meanPeriod(x, m.Dt); math.Abs(p/want-1) > 1e-3 {
		t.Errorf("small orbit: period %.5f, want 2π/√(αγ) = %.5f", p, want)
	}
	m.Size = 2
	x, y := lvOrbit(t, m, 40000, 9)
	p := meanPeriod(x, m.Dt)
	whole := int(math.Floor(float64(len(x))*m.Dt/p) * p / m.Dt)
	var mx, my float64
	for i := 0; i < whole; i++ {
		mx += x[i]
		my += y[i]
	}
	mx /= float64(whole)
	my /= float64(whole)
	t.Logf("large orbit: period %.4f, %d samples in whole periods, means %.6f, %.6f", p, whole, mx, my)
	if math.Abs(mx/(m.Gamma/m.Delta)-1) > 1e-3 || math.Abs(my/(m.Alpha/m.Beta)-1) > 1e-3 {
		t.Errorf("time averages %.6f, %.6f, want the centre (%.6f, %.6f)", mx, my, m.Gamma/m.Delta, m.Alpha/m.Beta)
	}
}

// TestLotkaVolterraLabel: every orbit of the centre is periodic, both
// exponents are zero (analytic), and the rule's finite-time λ1 — about
// ln(T)/T from the linear drift between neighbouring orbits — stays below
// the threshold at the corners of the parameter ranges.
func TestLotkaVolterraLabel(t *testing.T) {
	s, _ := Lookup("lotka-volterra")
	for _, set := range []map[string]float64{
		nil,
		{"size": 2.5},
		{"size": 2.5, "alpha": 5, "gamma": 0.1},
		{"size": 2.5, "alpha": 0.1, "gamma": 5},
		{"size": 2.5, "beta": 0.1, "delta": 5},
	} {
		sp, err := s.Lyapunov(set)
		if err != nil {
			t.Fatal(err)
		}
		c, err := s.Class(set)
		t.Logf("%v: λ1 = %.4f", set, sp.Exponents[0])
		if err != nil || c != Regular || math.Abs(sp.Exponents[0]) > 0.015 {
			t.Errorf("%v: class %s (%v), λ1 = %.4f, want regular with |λ1| ≤ 0.015", set, c, err, sp.Exponents[0])
		}
	}
}
