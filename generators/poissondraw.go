package generators

import (
	"math"
	"math/rand/v2"
)

// poissonDraw returns one Poisson(lambda) count, lambda ≥ 0 and finite.
//
// For lambda < 10 it multiplies uniforms until the product falls below
// e^{−λ} (Knuth, The Art of Computer Programming vol. 2, standard method;
// λ + 1 uniforms on average). For lambda ≥ 10 it uses the transformed
// rejection method with squeeze, PTRS (Hörmann, Insurance Math. Econom. 12
// (1993) 39; title, year and PTRS steps as in hpaulkeeler/posts PoissonLargeMean/funPoissonLargePTRS.m, journal recalled (memory)): a hat built from the transformation
// k = ⌊(2a/u_s + b)U + λ + 0.43⌋ of a uniform U, u_s = ½ − |U|, accepted
// quickly inside the squeeze (u_s ≥ 0.07, V ≤ v_r) and otherwise by
// comparing ln V + ln(1/α) − ln(a/u_s² + b) with ln P(k) = −λ + k ln λ −
// ln k!; about 1.1 uniform pairs per draw at any λ.
func poissonDraw(lambda float64, rng *rand.Rand) float64 {
	if lambda < 10 {
		limit := math.Exp(-lambda)
		k := 0.0
		p := rng.Float64()
		for p > limit {
			k++
			p *= rng.Float64()
		}
		return k
	}
	sl := math.Sqrt(lambda)
	logLambda := math.Log(lambda)
	b := 0.931 + 2.53*sl
	a := -0.059 + 0.02483*b
	invAlpha := 1.1239 + 1.1328/(b-3.4)
	vr := 0.9277 - 3.6224/(b-2)
	for {
		u := rng.Float64() - 0.5
		v := rng.Float64()
		us := 0.5 - math.Abs(u)
		k := math.Floor((2*a/us+b)*u + lambda + 0.43)
		if us >= 0.07 && v <= vr {
			return k
		}
		if k < 0 || (us < 0.013 && v > us) {
			continue
		}
		lg, _ := math.Lgamma(k + 1)
		if math.Log(v)+math.Log(invAlpha)-math.Log(a/(us*us)+b) <= -lambda+k*logLambda-lg {
			return k
		}
	}
}
