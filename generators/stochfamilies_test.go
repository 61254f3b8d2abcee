package generators

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// stochasticFamilies are the registry entries of the noise families added
// for the stochastic training space.
var stochasticFamilies = []string{
	"stable", "levy-walk", "arfima", "ar-random", "regime-ar", "bursts", "stoch-vol",
	"cascade", "iid", "jump-diffusion", "noisy-oscillator", "level-shifts",
	"varying-variance", "poisson-counts",
}

// familySettings returns the parameter sets the range test visits: every
// corner of the documented box (all parameters at Min or Max), each
// parameter at Min, middle and Max with the others at their defaults, and
// 30 random points (log-uniform for ranges spanning more than two
// decades of positive values, integers rounded).
func familySettings(s *System, seed uint64) []map[string]float64 {
	var out []map[string]float64
	k := len(s.Params)
	for mask := 0; mask < 1<<k; mask++ {
		p := map[string]float64{}
		for i, q := range s.Params {
			p[q.Name] = q.Min
			if mask&(1<<i) != 0 {
				p[q.Name] = q.Max
			}
		}
		out = append(out, p)
	}
	for _, q := range s.Params {
		for _, f := range []float64{0, 0.5, 1} {
			v := q.Min + f*(q.Max-q.Min)
			if q.Integer {
				v = math.Round(v)
			}
			out = append(out, map[string]float64{q.Name: math.Min(q.Max, v)})
		}
	}
	rng := newRand(seed)
	for range 30 {
		p := map[string]float64{}
		for _, q := range s.Params {
			u := rng.Float64()
			v := q.Min + u*(q.Max-q.Min)
			if q.Min > 0 && q.Max/q.Min > 100 {
				v = q.Min * math.Pow(q.Max/q.Min, u)
			}
			if q.Integer {
				v = math.Round(v)
			}
			p[q.Name] = math.Min(q.Max, math.Max(q.Min, v))
		}
		out = append(out, p)
	}
	return out
}

// TestStochasticFamiliesRanges: every new noise family accepts every
// parameter value of its documented range (corners of the box, single
// parameters at their ends and middle, random points) and returns a
// finite, non-constant series of n = 2000 labelled stochastic; values just
// outside a range are rejected with ErrParamRange; lengths 1 and 2 work.
// Poisson counts with a small mean can be constant over 2000 samples only
// with negligible probability at the range's end (λ = 0.05: e^{−100}), so
// constancy is an error everywhere.
func TestStochasticFamiliesRanges(t *testing.T) {
	const n = 2000
	for si, name := range stochasticFamilies {
		s, err := Lookup(name)
		if err != nil {
			t.Fatal(err)
		}
		t.Run(name, func(t *testing.T) {
			if s.DefaultClass != Stochastic {
				t.Errorf("default class %s", s.DefaultClass)
			}
			rng := newRand(uint64(600 + si))
			for _, set := range familySettings(s, uint64(700+si)) {
				x, err := s.Generate(n, set, rng)
				if err != nil {
					t.Errorf("%v: %v", set, err)
					continue
				}
				for i, v := range x {
					if math.IsNaN(v) || math.IsInf(v, 0) {
						t.Fatalf("%v: non-finite value %v at %d", set, v, i)
					}
				}
				if !(variance(x) > 0) {
					t.Errorf("%v: constant series", set)
				}
				if c, err := s.Class(set); err != nil || c != Stochastic {
					t.Errorf("%v: class %s, %v", set, c, err)
				}
			}
			for _, q := range s.Params {
				step := math.Max(1, math.Abs(q.Max-q.Min)) * 1e-6
				if q.Integer {
					step = 1
				}
				for _, v := range []float64{q.Min - step, q.Max + step} {
					if _, err := s.Generate(10, map[string]float64{q.Name: v}, rng); !errors.Is(err, ErrParamRange) {
						t.Errorf("%s = %g: %v, want ErrParamRange", q.Name, v, err)
					}
				}
			}
			for _, m := range []int{1, 2} {
				if x, err := s.Generate(m, nil, rng); err != nil || len(x) != m {
					t.Errorf("n = %d: %d values, %v", m, len(x), err)
				}
			}
		})
	}
}

// BenchmarkStochasticFamilies generates 10^4 and 10^6 samples per
// operation at the registry defaults, reporting CPU time beside wall time
// (benchCPU); run with
// go test -bench StochasticFamilies -run ^$ ./generators.
func BenchmarkStochasticFamilies(b *testing.B) {
	for _, name := range stochasticFamilies {
		s, err := Lookup(name)
		if err != nil {
			b.Fatal(err)
		}
		g, _, err := s.New(nil)
		if err != nil {
			b.Fatal(err)
		}
		for _, n := range []int{10000, 1000000} {
			b.Run(fmt.Sprintf("%s/n=%d", name, n), func(b *testing.B) {
				rng := newRand(1)
				b.ReportAllocs()
				benchCPU(b, func() error {
					_, err := g.Generate(n, rng)
					return err
				})
			})
		}
	}
}
