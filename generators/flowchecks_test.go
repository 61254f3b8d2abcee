package generators

import (
	"math"
	"testing"
)

// Checks shared by the tests of the regular flows.

// divergenceAverage returns the time average of div along the orbit of f
// from x0 that flowSpectrum follows under rule r (the same RK4 steps and
// angle wraps, so on a chaotic orbit too it is the same orbit: r.transient
// discarded, then span time units), by the trapezoid rule on the
// integration grid. By Liouville's formula the Lyapunov exponents sum to
// it (analytic: the volume of the tangent parallelepiped grows as
// exp ∫ div F dt).
func divergenceAverage(f field, x0 []float64, r flowRule, span float64, div func(v []float64) float64) float64 {
	v := append([]float64(nil), x0...)
	ig := newRK4(len(v))
	wr, _ := f.(wrapper)
	for i, warm := 0, int(math.Ceil(r.transient/r.h)); i < warm; i++ {
		ig.step(f.eval, v, r.h)
		if wr != nil {
			wr.wrap(v)
		}
	}
	steps := int(math.Round(span / r.h))
	per := int(math.Max(1, math.Round(r.renorm/r.h)))
	sum := div(v) / 2
	for i := 1; i <= steps; i++ {
		ig.step(f.eval, v, r.h)
		if wr != nil && i%per == 0 {
			wr.wrap(v)
		}
		sum += div(v)
	}
	sum -= div(v) / 2
	return sum / float64(steps)
}

// checkFieldJacobian compares the analytic Jacobian of f with central
// finite differences of f.eval at the given states (as TestJacobians does
// for the older systems).
func checkFieldJacobian(t *testing.T, name string, f field, states [][]float64) {
	t.Helper()
	const h = 1e-6
	d := f.dim()
	j := make([]float64, d*d)
	fp, fm := make([]float64, d), make([]float64, d)
	for _, v := range states {
		f.jacobian(j, v)
		for c := 0; c < d; c++ {
			vp := append([]float64(nil), v...)
			vm := append([]float64(nil), v...)
			vp[c] += h
			vm[c] -= h
			f.eval(fp, vp)
			f.eval(fm, vm)
			for r := 0; r < d; r++ {
				num := (fp[r] - fm[r]) / (2 * h)
				if math.Abs(num-j[r*d+c]) > 1e-5*(1+math.Abs(num)) {
					t.Errorf("%s: ∂F_%d/∂v_%d = %g, finite difference %g at %v", name, r, c, j[r*d+c], num, v)
				}
			}
		}
	}
}

// randomStates returns count states of dimension d with coordinates
// uniform in [lo, hi).
func randomStates(count, d int, lo, hi float64, seed uint64) [][]float64 {
	rng := newRand(seed)
	out := make([][]float64, count)
	for i := range out {
		out[i] = make([]float64, d)
		for k := range out[i] {
			out[i][k] = lo + (hi-lo)*rng.Float64()
		}
	}
	return out
}

// TestRegularFlowJacobians: the Jacobians of the regular flows' label
// rules match central differences of the integrated fields at random
// states (positive states for the population models).
func TestRegularFlowJacobians(t *testing.T) {
	tests := []struct {
		name   string
		f      field
		lo, hi float64
	}{
		{"forced-vdp", ForcedVanDerPol{Mu: 2, A: 1.5, Omega: 1.3}, -2, 2},
		{"brusselator", Brusselator{A: 1, B: 3}, 0.1, 4},
		{"fitzhugh-nagumo", FitzHughNagumo{A: 0.7, B: 0.8, Eps: 0.08, I: 0.5}, -2, 2},
		{"lotka-volterra", LotkaVolterra{Alpha: 1.1, Beta: 0.4, Gamma: 0.7, Delta: 0.9, Size: 1}, 0.1, 3},
		{"coupled-oscillators m=2", CoupledVanDerPol{M: 2, Mu: 0.7, Omega: []float64{1, 1.6}, Kappa: 0.3}, -2, 2},
		{"coupled-oscillators m=3", CoupledVanDerPol{M: 3, Mu: 1.5, Omega: []float64{1, 1.6, 2.2}, Kappa: 0.2}, -2, 2},
	}
	for i, tc := range tests {
		checkFieldJacobian(t, tc.name, tc.f, randomStates(20, tc.f.dim(), tc.lo, tc.hi, uint64(i)+30))
	}
}

// spectrumSum returns the sum of the exponents.
func spectrumSum(sp Spectrum) float64 {
	var s float64
	for _, l := range sp.Exponents {
		s += l
	}
	return s
}

// meanPeriod returns the mean period of an oscillating series sampled
// every dt: the time between its first and last upward crossings of the
// mean (linearly interpolated) divided by the number of cycles between
// them. It returns NaN with fewer than two crossings.
func meanPeriod(x []float64, dt float64) float64 {
	var m float64
	for _, v := range x {
		m += v
	}
	m /= float64(len(x))
	first, last, count := 0.0, 0.0, 0
	for i := 1; i < len(x); i++ {
		if x[i-1] < m && x[i] >= m {
			tc := (float64(i-1) + (m-x[i-1])/(x[i]-x[i-1])) * dt
			if count == 0 {
				first = tc
			}
			last = tc
			count++
		}
	}
	if count < 2 {
		return math.NaN()
	}
	return (last - first) / float64(count-1)
}

// extrema returns the smallest and largest value of x.
func extrema(x []float64) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, v := range x {
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	return lo, hi
}

// TestRegularClassFrom: the per-series label of the new equation systems
// draws its start exactly as Generate does (the two generators are in the
// same state afterwards) and gives the documented labels: regular at the
// defaults, chaotic in the forced van der Pol oscillator's chaotic window
// and the supercritical circle map.
func TestRegularClassFrom(t *testing.T) {
	tests := []struct {
		name string
		set  map[string]float64
		want Class
	}{
		{"forced-vdp", nil, Regular},
		{"forced-vdp", map[string]float64{"mu": 5, "a": 5, "omega": 2.47}, Chaotic},
		{"brusselator", nil, Regular},
		{"fitzhugh-nagumo", nil, Regular},
		{"lotka-volterra", nil, Regular},
		{"coupled-oscillators", nil, Regular},
		{"circle-map", nil, Regular},
		{"circle-map", map[string]float64{"omega": 0.48, "k": 2}, Chaotic},
	}
	for _, tc := range tests {
		s, err := Lookup(tc.name)
		if err != nil {
			t.Fatal(err)
		}
		p, err := s.Resolve(tc.set)
		if err != nil {
			t.Fatal(err)
		}
		if s.initial == nil {
			t.Fatalf("%s: no per-series label rule", tc.name)
		}
		r1, r2 := newRand(21), newRand(21)
		s.initial(p, r1)
		if _, err := s.Generate(10, tc.set, r2); err != nil {
			t.Fatal(err)
		}
		if r1.Uint64() != r2.Uint64() {
			t.Errorf("%s: initial and Generate draw different amounts from the generator", tc.name)
		}
		if c, err := s.ClassFrom(tc.set, newRand(22)); err != nil || c != tc.want {
			t.Errorf("%s %v: ClassFrom %s (%v), want %s", tc.name, tc.set, c, err, tc.want)
		}
	}
}
