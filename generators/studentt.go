package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// StudentT is independent Student-t noise with Nu degrees of freedom,
// t = Z/√(V/ν) with Z ~ N(0, 1) and V ~ χ²_ν. Small ν gives heavy tails
// (ν = 1 is the Cauchy law, with no mean; ν ≤ 2 has no variance), a hard
// negative for detectors that mistake rare large excursions for structure.
type StudentT struct {
	Nu float64 // degrees of freedom, > 0
}

// Generate returns n independent draws.
func (s StudentT) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(s.Nu > 0) || math.IsInf(s.Nu, 0) {
		return nil, fmt.Errorf("student-t: nu = %g, want nu > 0", s.Nu)
	}
	out := make([]float64, n)
	for i := range out {
		z := rng.NormFloat64()
		v := 2 * gammaRand(s.Nu/2, rng) // χ²_ν = 2·Gamma(ν/2, 1)
		out[i] = z / math.Sqrt(v/s.Nu)
	}
	return out, nil
}

// gammaRand draws from the Gamma(shape, 1) law by Marsaglia & Tsang's
// squeeze method (ACM Trans. Math. Softw. 26 (2000) 363), with the
// U^{1/shape} boost for shape < 1. shape must be > 0.
func gammaRand(shape float64, rng *rand.Rand) float64 {
	if shape < 1 {
		u := rng.Float64()
		for u == 0 {
			u = rng.Float64()
		}
		return gammaRand(shape+1, rng) * math.Pow(u, 1/shape)
	}
	d := shape - 1.0/3
	c := 1 / math.Sqrt(9*d)
	for {
		x := rng.NormFloat64()
		v := 1 + c*x
		if v <= 0 {
			continue
		}
		v = v * v * v
		u := rng.Float64()
		if u < 1-0.0331*x*x*x*x {
			return d * v
		}
		if u > 0 && math.Log(u) < 0.5*x*x+d*(1-v+math.Log(v)) {
			return d * v
		}
	}
}

func init() {
	register(&System{
		Name:   "student-t",
		Title:  "heavy-tailed i.i.d. Student-t noise",
		Doc:    "Independent t draws with nu degrees of freedom (nu = 1: Cauchy). Label: stochastic.",
		Params: []Param{{Name: "nu", Default: 3, Min: 0.5, Max: 1000, Doc: "degrees of freedom ν"}},
		Invariants: []Invariant{
			{Name: "hv_deg_mean", Value: 4, Unit: "", Source: "Luque et al., Phys. Rev. E 80 (2009) 046103: any continuous i.i.d. series"},
			{Name: "hv_tail_exprate", Value: math.Log(1.5), Unit: "", Source: "Luque et al. (2009): any continuous i.i.d. series"},
			{Name: "op_ent_d4", Value: 1, Unit: "normalised", Source: "Bandt & Pompe, Phys. Rev. Lett. 88 (2002) 174102: i.i.d."},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return StudentT{Nu: p["nu"]}, 1, nil
		},
	})
}
