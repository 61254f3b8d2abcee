package generators

import (
	"errors"
	"math"
	"testing"
)

// TestQuadraticMapHenon: the default coefficients are the Hénon map under
// x = 1.2u, y = 1.2v, so one step of the quadratic map is 1.2 times one
// Hénon step (checked to rounding at random points), its exponents are
// the Hénon ones, λ1 = 0.41922 per iteration (Sprott, Chaos and
// Time-Series Analysis (2003), appendix; confirmed: tkf/LyapunovExponents.jl src/examples/henon_map.jl) within 0.01, and
// λ1 + λ2 = ln 0.3 (analytic: det J = −0.3, tolerance 1e-9).
func TestQuadraticMapHenon(t *testing.T) {
	s, _ := Lookup("quadratic-map")
	p, _ := s.Resolve(nil)
	q := quadFromParams(p)
	h := Henon{A: 1.4, B: 0.3}
	rng := newRand(1)
	for i := 0; i < 100; i++ {
		u := []float64{2*rng.Float64() - 1, 0.6*rng.Float64() - 0.3}
		var hu, qx [2]float64
		h.next(hu[:], u)
		q.next(qx[:], []float64{1.2 * u[0], 1.2 * u[1]})
		for k := 0; k < 2; k++ {
			if math.Abs(qx[k]-1.2*hu[k]) > 1e-14 {
				t.Fatalf("at %v: quadratic map %v, 1.2·Hénon %v", u, qx, hu)
			}
		}
	}
	sp, err := s.Lyapunov(nil)
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("spectrum %v", sp.Exponents)
	if math.Abs(sp.Exponents[0]-0.41922) > 0.01 { // Sprott (2003), confirmed: tkf/LyapunovExponents.jl src/examples/henon_map.jl
		t.Errorf("λ1 = %.5f, want 0.41922", sp.Exponents[0])
	}
	if d := sp.Exponents[0] + sp.Exponents[1] - math.Log(0.3); math.Abs(d) > 1e-9 { // analytic
		t.Errorf("λ1 + λ2 − ln 0.3 = %g", d)
	}
}

// TestQuadraticMapErrors: an escaping set and a set whose orbit settles
// on a fixed point are reported by Generate, Class and ClassFrom alike.
// a1 = 1.2 with a3 = 1.2 (x' = 1.2 + 1.2x² + y) grows without bound from
// any start; x' = 0.5, y' = 0.5x reaches the fixed point (0.5, 0.25) in
// two steps.
func TestQuadraticMapErrors(t *testing.T) {
	s, _ := Lookup("quadratic-map")
	zero := map[string]float64{}
	for _, k := range quadKeys {
		zero[k] = 0
	}
	with := func(kv map[string]float64) map[string]float64 {
		p := map[string]float64{}
		for k, v := range zero {
			p[k] = v
		}
		for k, v := range kv {
			p[k] = v
		}
		return p
	}
	for _, tc := range []struct {
		set  map[string]float64
		want error
	}{
		{with(map[string]float64{"a1": 1.2, "a3": 1.2, "a5": 1}), ErrDiverged},
		{with(map[string]float64{"a1": 0.5, "a8": 0.5}), ErrConstant},
	} {
		if _, err := s.Generate(100, tc.set, newRand(1)); !errors.Is(err, tc.want) {
			t.Errorf("%v: Generate %v, want %v", tc.set, err, tc.want)
		}
		if _, err := s.Class(tc.set); !errors.Is(err, tc.want) {
			t.Errorf("%v: Class %v, want %v", tc.set, err, tc.want)
		}
		if _, err := s.ClassFrom(tc.set, newRand(1)); !errors.Is(err, tc.want) {
			t.Errorf("%v: ClassFrom %v, want %v", tc.set, err, tc.want)
		}
	}
}

// TestDrawQuadraticMap: draws are deterministic for a seed; every drawn
// set gives a varying series, and the label of series drawn with other
// seeds is the wanted one for most of them (the map may be multistable,
// so not necessarily all: the measured agreement is logged). Wanting
// another class or allowing no tries is an error.
func TestDrawQuadraticMap(t *testing.T) {
	s, _ := Lookup("quadratic-map")
	for _, want := range []Class{Chaotic, Regular} {
		a, err := DrawQuadraticMap(newRand(7), want, 2000)
		if err != nil {
			t.Fatal(err)
		}
		b, _ := DrawQuadraticMap(newRand(7), want, 2000)
		for k, v := range a {
			if b[k] != v {
				t.Fatalf("%s: same seed gave different sets", want)
			}
		}
		rng := newRand(8)
		var agree, tries int
		for k := 0; k < 3; k++ {
			p, err := DrawQuadraticMap(rng, want, 2000)
			if err != nil {
				t.Fatal(err)
			}
			for seed := uint64(1); seed <= 3; seed++ {
				tries++
				x, err := s.Generate(2000, p, newRand(seed))
				if err != nil {
					continue // this start escapes: the plan skips such a series
				}
				if variance(x) < 1e-12 {
					t.Errorf("%s set %v seed %d: constant series", want, p, seed)
				}
				if c, err := s.ClassFrom(p, newRand(seed)); err == nil && c == want {
					agree++
				}
			}
		}
		t.Logf("%s: %d of %d series from drawn sets carry the wanted label", want, agree, tries)
		if agree < tries*2/3 {
			t.Errorf("%s: only %d of %d series carry the wanted label", want, agree, tries)
		}
	}
	if _, err := DrawQuadraticMap(newRand(1), Stochastic, 10); !errors.Is(err, ErrParamRange) {
		t.Errorf("want stochastic: %v", err)
	}
	if _, err := DrawQuadraticMap(newRand(1), Chaotic, 0); !errors.Is(err, ErrNoDraw) {
		t.Errorf("no tries: %v", err)
	}
}
