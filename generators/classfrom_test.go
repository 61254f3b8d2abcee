package generators

import (
	"errors"
	"math"
	"testing"
)

// mixedAtDefaults lists the systems whose defaults lie in a mixed phase
// space: the label of a series depends on its drawn start, so ClassFrom
// gives both labels there (checked in their own tests).
var mixedAtDefaults = map[string]bool{"standard-map": true, "nose-hoover": true, "henon-heiles": true}

// TestClassFromDrawsLikeGenerate: ClassFrom consumes exactly the draws
// Generate makes for its start (the same rng state afterwards), so the
// label belongs to the series a twin generator produces; systems with a
// fixed label, or without a per-series rule, leave rng untouched. At the
// defaults the per-series label equals DefaultClass for three seeds,
// except where the defaults lie in a mixed phase space.
func TestClassFromDrawsLikeGenerate(t *testing.T) {
	for _, s := range All() {
		t.Run(s.Name, func(t *testing.T) {
			for _, seed := range []uint64{1, 2, 3} {
				r1, r2 := newRand(seed), newRand(seed)
				c, err := s.ClassFrom(nil, r1)
				if err != nil {
					t.Fatalf("seed %d: %v", seed, err)
				}
				if _, err := s.Generate(200, nil, r2); err != nil {
					t.Fatalf("seed %d: %v", seed, err)
				}
				a := r1.Uint64()
				if s.initial == nil {
					if b := newRand(seed).Uint64(); a != b {
						t.Errorf("seed %d: ClassFrom used rng although the label does not depend on the start", seed)
					}
				} else if b := r2.Uint64(); a != b {
					t.Errorf("seed %d: ClassFrom and Generate consumed different draws", seed)
				}
				if !mixedAtDefaults[s.Name] && c != s.DefaultClass {
					t.Errorf("seed %d: ClassFrom = %s at the defaults, DefaultClass %s", seed, c, s.DefaultClass)
				}
			}
		})
	}
}

// TestClassFromLabels: the per-series rule (with the shorter spans chosen
// to keep a call within about 50 ms) separates chaotic parameters from
// periodic windows. The periodic values are those of the Class tests and
// the systems' own tests; each is checked for three drawn starts.
func TestClassFromLabels(t *testing.T) {
	tests := []struct {
		sys   string
		set   map[string]float64
		class Class
	}{
		{"logistic", map[string]float64{"r": 3.5}, Regular},
		{"logistic", map[string]float64{"r": 3.83}, Regular},
		{"henon", map[string]float64{"a": 1}, Regular},
		{"delayed-logistic", map[string]float64{"a": 2.1}, Regular},
		{"lorenz", map[string]float64{"rho": 350}, Regular},
		{"rossler", map[string]float64{"c": 2.5}, Regular},
		{"rossler", map[string]float64{"c": 3.5}, Regular},
		{"mackey-glass", map[string]float64{"tau": 10}, Regular},
		{"van-der-pol", map[string]float64{"mu": 4}, Regular},
		{"cml", map[string]float64{"r": 3.5, "eps": 0.1}, Regular},
		{"cml", map[string]float64{"r": 4, "eps": 0.15}, Regular},
		{"cml", map[string]float64{"n": 64}, Chaotic},
		{"henon-gen", map[string]float64{"a": 1.3}, Regular},
		{"henon-gen", map[string]float64{"d": 10}, Chaotic},
		{"holmes", map[string]float64{"a": 2.5}, Regular},
		{"standard-map", map[string]float64{"k": 6}, Chaotic},
		{"chen", map[string]float64{"a": 32}, Regular},
		{"chen", map[string]float64{"b": 3.6}, Regular},
		{"thomas", map[string]float64{"b": 0.25}, Regular},
		{"thomas", map[string]float64{"b": 0.15}, Regular},
		{"thomas", map[string]float64{"b": 0.1}, Chaotic},
		{"jerk", map[string]float64{"a": 2.1}, Regular},
		{"hindmarsh-rose", map[string]float64{"i": 2.7}, Regular},
		{"hindmarsh-rose", map[string]float64{"i": 3.4}, Regular},
		{"rucklidge", map[string]float64{"kappa": 1}, Regular},
		{"rucklidge", map[string]float64{"lambda": 3}, Regular},
		{"lorenz84", map[string]float64{"g": 1.2}, Regular},
		{"lorenz84", map[string]float64{"f": 6}, Regular},
	}
	for _, tc := range tests {
		s, err := Lookup(tc.sys)
		if err != nil {
			t.Fatal(err)
		}
		for seed := uint64(1); seed <= 3; seed++ {
			c, err := s.ClassFrom(tc.set, newRand(seed))
			if err != nil || c != tc.class {
				t.Errorf("%s %v seed %d: %s (%v), want %s", tc.sys, tc.set, seed, c, err, tc.class)
			}
		}
	}
}

// classesOver returns the labels ClassFrom gives for seeds 1..n.
func classesOver(t *testing.T, name string, set map[string]float64, n int) map[Class]int {
	t.Helper()
	s, err := Lookup(name)
	if err != nil {
		t.Fatal(err)
	}
	got := map[Class]int{}
	for seed := uint64(1); seed <= uint64(n); seed++ {
		c, err := s.ClassFrom(set, newRand(seed))
		if err != nil {
			t.Fatalf("%s %v seed %d: %v", name, set, seed, err)
		}
		got[c]++
	}
	return got
}

// TestClassFromMultistable: where attractors coexist (or, in the
// conservative systems, a chaotic sea and invariant tori), the drawn start
// decides the label, so ClassFrom gives both labels over a few seeds while
// the parameter-only Class gives one. The parameter values were found by
// scanning starts (measured fractions in the comments, 12 seeds).
func TestClassFromMultistable(t *testing.T) {
	tests := []struct {
		sys string
		set map[string]float64
		n   int
	}{
		{"standard-map", nil, 12},                         // 8 of 12 chaotic at k = 1.5
		{"standard-map", map[string]float64{"k": 1}, 12},  // 3 of 12 chaotic
		{"nose-hoover", nil, 12},                          // sea above y0 ≈ 4.3, tori below
		{"chen", map[string]float64{"c": 20}, 6},          // chaotic attractor and a small limit cycle
		{"rucklidge", map[string]float64{"lambda": 4}, 6}, // chaos beside a periodic orbit
		{"lorenz84", map[string]float64{"f": 7.5}, 6},     // chaos beside a periodic circulation
		{"cml", map[string]float64{"eps": 0.3}, 6},        // long-lived patterns beside turbulence
	}
	for _, tc := range tests {
		got := classesOver(t, tc.sys, tc.set, tc.n)
		t.Logf("%s %v: %v", tc.sys, tc.set, got)
		if got[Chaotic] == 0 || got[Regular] == 0 {
			t.Errorf("%s %v: labels %v over %d starts, want both", tc.sys, tc.set, got, tc.n)
		}
	}
}

// TestDuffingCoexistence: at δ = 0.15, ω = 1, γ = 0.3 the double-well
// oscillator has a chaotic attractor (λ1 ≈ 0.18 per time unit) beside an
// attracting orbit of the forcing period (found by scanning starts; the
// chaotic λ1 holds over 8000 time units, so it is not a chaotic
// transient). The per-series rule labels the orbit from (1.2, 0) chaotic
// and the orbit from (0, 0.8) regular, and the series from (0, 0.8)
// repeats after one forcing period 2π/ω (sampled 20 times a period) to
// 1e-6. The generator's start box lies in the chaotic basin here.
func TestDuffingCoexistence(t *testing.T) {
	s, _ := Lookup("duffing")
	set := map[string]float64{"delta": 0.15, "omega": 1, "gamma": 0.3}
	p, _ := s.Resolve(set)
	for _, tc := range []struct {
		x0    []float64
		class Class
	}{
		{[]float64{1.2, 0, 0}, Chaotic},
		{[]float64{0, 0.8, 0}, Regular},
	} {
		sp, err := s.lyapFrom(p, tc.x0)
		c, _ := s.classify(sp, err)
		t.Logf("from %v: λ1 = %.4f, %s", tc.x0, sp.Exponents[0], c)
		if c != tc.class {
			t.Errorf("from %v: %s, want %s", tc.x0, c, tc.class)
		}
		m := Duffing{Delta: 0.15, Alpha: -1, Beta: 1, Gamma: 0.3, Omega: 1, Dt: 2 * math.Pi / 20}
		x, err := sampleFlow("duffing", m, append([]float64(nil), tc.x0...), 400, m.Dt, duffingStep, duffingTransient, 0)
		if err != nil {
			t.Fatal(err)
		}
		periodic := period(x, 20, 1e-6) == 20
		if periodic != (tc.class == Regular) {
			t.Errorf("from %v: series periodic with the forcing = %v, label %s", tc.x0, periodic, c)
		}
	}
}

// TestClassFromErrors: bad overrides are refused before any draw; the
// fall-back for an equation system without a per-series rule is its
// parameter-only label.
func TestClassFromErrors(t *testing.T) {
	s, _ := Lookup("lorenz")
	if _, err := s.ClassFrom(map[string]float64{"rho": 1000}, newRand(1)); !errors.Is(err, ErrParamRange) {
		t.Errorf("rho = 1000: %v, want ErrParamRange", err)
	}
	if _, err := s.ClassFrom(map[string]float64{"obs": 3}, newRand(1)); !errors.Is(err, ErrParamRange) {
		t.Errorf("obs = 3: %v, want ErrParamRange", err)
	}
	if _, err := s.ClassFrom(map[string]float64{"nope": 1}, newRand(1)); !errors.Is(err, ErrUnknownParam) {
		t.Errorf("unknown: %v, want ErrUnknownParam", err)
	}
	// A copy of the Rössler entry without the per-series rule falls back
	// to Class and leaves rng untouched.
	r, _ := Lookup("rossler")
	bare := *r
	bare.initial, bare.lyapFrom = nil, nil
	rng := newRand(5)
	c, err := bare.ClassFrom(map[string]float64{"c": 3.5}, rng)
	if err != nil || c != Regular {
		t.Errorf("fall-back: %s (%v), want regular", c, err)
	}
	if rng.Uint64() != newRand(5).Uint64() {
		t.Error("fall-back used rng")
	}
}

// TestObservedCoordinate: obs records another state variable of the same
// orbit. For the Hénon map y_t = b·x_{t−1} (the equations), for the
// delayed logistic map y_t = x_{t−1}, and for the Lorenz flow with the same
// seed the three coordinates come from one trajectory, so
// dx/dt = σ(y − x) holds between them (central difference, O(dt²)).
func TestObservedCoordinate(t *testing.T) {
	h, _ := Lookup("henon")
	x, _ := h.Generate(500, nil, newRand(3))
	y, err := h.Generate(500, map[string]float64{"obs": 1}, newRand(3))
	if err != nil {
		t.Fatal(err)
	}
	for i := 1; i < len(x); i++ {
		if math.Abs(y[i]-0.3*x[i-1]) > 1e-15 {
			t.Fatalf("henon: y[%d] = %v, b·x[%d] = %v", i, y[i], i-1, 0.3*x[i-1])
		}
	}
	d, _ := Lookup("delayed-logistic")
	x, _ = d.Generate(500, nil, newRand(3))
	y, _ = d.Generate(500, map[string]float64{"obs": 1}, newRand(3))
	for i := 1; i < len(x); i++ {
		if y[i] != x[i-1] {
			t.Fatalf("delayed-logistic: y[%d] = %v, x[%d] = %v", i, y[i], i-1, x[i-1])
		}
	}
	l, _ := Lookup("lorenz")
	set := func(obs float64) map[string]float64 { return map[string]float64{"obs": obs, "dt": 0.001} }
	lx, _ := l.Generate(2000, set(0), newRand(4))
	ly, _ := l.Generate(2000, set(1), newRand(4))
	for i := 1; i+1 < len(lx); i++ {
		dxdt := (lx[i+1] - lx[i-1]) / 0.002
		if want := 10 * (ly[i] - lx[i]); math.Abs(dxdt-want) > 1e-3*(1+math.Abs(want)) {
			t.Fatalf("lorenz: dx/dt = %v at %d, σ(y − x) = %v", dxdt, i, want)
		}
	}
	// Every multi-dimensional map and flow documents obs.
	for _, s := range All() {
		if q, ok := s.param("obs"); ok && (q.Doc == "" || !q.Integer || q.Default != 0) {
			t.Errorf("%s: obs parameter %+v", s.Name, q)
		}
	}
}
