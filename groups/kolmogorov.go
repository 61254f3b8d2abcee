package groups

import (
	"math"
)

// kolmogorovMaxK bounds the matrix of the Marsaglia–Tsang–Wang method:
// k = ⌊N·d⌋ + 1 ≤ kolmogorovMaxK keeps it at most 127 × 127 (about 4·10⁷
// flops for N = 10⁶); beyond, KolmogorovSF uses the corrected limit.
const kolmogorovMaxK = 64

// KolmogorovSF returns P(D_N ≥ d) for the one-sample Kolmogorov statistic
// D_N = sup |F_N − F| of N observations from a continuous F.
//
// In the right tail, d ≥ 1/2 or N·d² ≥ 4, it is 2·P(D⁺_N ≥ d) with the
// exact one-sided tail of Birnbaum & Tingey (below), which keeps the
// relative accuracy of tiny p-values. Otherwise, when k = ⌊N·d⌋ + 1 ≤ 64,
// it is 1 − P(D_N < d) with P(D_N < d) computed
// exactly by the method of Marsaglia, Tsang & Wang, J. Stat. Softw. 8(18)
// (2003) (checked: apache/commons-math KolmogorovSmirnovTest.java references): (N!/Nᴺ) times the central element of Hᴺ, H the
// (2k−1)×(2k−1) matrix of Durbin (1973) built from h = k − N·d, with the
// power taken by repeated squaring and the exponent carried separately to
// avoid overflow. Its absolute accuracy is about 1e-13 (the subtraction
// 1 − P(D_N < d) limits the relative accuracy of tiny p-values).
//
// Otherwise (N·d ≥ 64, so N > 64):
//
//   - for N·d² ≥ 2.2 (p below about 0.03) it returns 2·P(D⁺_N ≥ d), twice
//     the exact one-sided tail of Birnbaum & Tingey, Ann. Math. Stat. 22
//     (1951) 592, P(D⁺_N ≥ d) = d Σ_{j=0}^{⌊N(1−d)⌋} C(N,j)
//     (1−d−j/N)^{N−j} (d+j/N)^{j−1}, summed in logarithms; the neglected
//     probability that both one-sided statistics exceed d is below
//     2·exp(−8N·d²) < 10⁻⁷ relative to p;
//   - below that it returns the Smirnov limit with Stephens' small-sample
//     modification, KolmogorovLimitSF((√N + 0.12 + 0.11/√N)·d) (Stephens,
//     J. R. Stat. Soc. B 32 (1970) 115, memory), within about 10⁻³ of the
//     exact value there (p above about 0.03; checked against SciPy's
//     kstwo, which uses the Pelz–Good expansion in that region).
//
// N ≤ 0 or d ≤ 0 give 1, d ≥ 1 gives 0.
func KolmogorovSF(n int, d float64) float64 {
	switch {
	case math.IsNaN(d):
		return math.NaN()
	case n <= 0 || d <= 0:
		return 1
	case d >= 1:
		return 0
	}
	nd := float64(n) * d
	if nd <= 0.5 {
		return 1 // D_N ≥ 1/(2N) always
	}
	if d >= 1-1/float64(n) {
		return 2 * math.Pow(1-d, float64(n)) // exact in the extreme tail
	}
	if d >= 0.5 || nd*d >= 4 {
		// Right tail: exact for d ≥ 1/2 (the one-sided events are then
		// disjoint), relative error below 2·exp(−32) otherwise.
		return math.Min(1, 2*smirnovSF(n, d))
	}
	k := int(nd) + 1
	if k > kolmogorovMaxK {
		if nd*d >= 2.2 {
			return math.Min(1, 2*smirnovSF(n, d))
		}
		sn := math.Sqrt(float64(n))
		return KolmogorovLimitSF((sn + 0.12 + 0.11/sn) * d)
	}
	cdf := mtwCDF(n, d, k)
	return math.Max(0, math.Min(1, 1-cdf))
}

// smirnovSF returns the exact one-sided tail P(D⁺_n ≥ d), 0 < d < 1, by
// the Birnbaum–Tingey sum (see KolmogorovSF), each term in logarithms.
func smirnovSF(n int, d float64) float64 {
	fn := float64(n)
	lgn1, _ := math.Lgamma(fn + 1)
	jmax := int(math.Floor(fn * (1 - d)))
	logs := make([]float64, 0, jmax+1)
	top := math.Inf(-1)
	for j := 0; j <= jmax; j++ {
		fj := float64(j)
		a := 1 - d - fj/fn
		if a <= 0 {
			break // the term is 0 (0 raised to n − j > 0)
		}
		lgj, _ := math.Lgamma(fj + 1)
		lgnj, _ := math.Lgamma(fn - fj + 1)
		l := lgn1 - lgj - lgnj + (fn-fj)*math.Log(a) + (fj-1)*math.Log(d+fj/fn)
		logs = append(logs, l)
		top = math.Max(top, l)
	}
	s := 0.0
	for _, l := range logs {
		s += math.Exp(l - top)
	}
	return d * s * math.Exp(top)
}

// mtwCDF returns P(D_n < d) by Marsaglia, Tsang & Wang (2003), k = ⌊n·d⌋+1.
func mtwCDF(n int, d float64, k int) float64 {
	m := 2*k - 1
	h := float64(k) - float64(n)*d
	H := make([]float64, m*m)
	for i := 0; i < m; i++ {
		for j := 0; j < m; j++ {
			if i-j+1 >= 0 {
				H[i*m+j] = 1
			}
		}
	}
	for i := 0; i < m; i++ {
		H[i*m] -= math.Pow(h, float64(i+1))
		H[(m-1)*m+i] -= math.Pow(h, float64(m-i))
	}
	if 2*h-1 > 0 {
		H[(m-1)*m] += math.Pow(2*h-1, float64(m))
	}
	for i := 0; i < m; i++ {
		for j := 0; j < m; j++ {
			if i-j+1 > 0 {
				for g := 2; g <= i-j+1; g++ {
					H[i*m+j] /= float64(g)
				}
			}
		}
	}
	Q, eQ := mtwPower(H, m, n)
	s := Q[(k-1)*m+k-1]
	for i := 1; i <= n; i++ {
		s = s * float64(i) / float64(n)
		if s < 1e-140 {
			s *= 1e140
			eQ -= 140
		}
	}
	return s * math.Pow(10, float64(eQ))
}

// mtwPower returns A^p as a matrix V and a decimal exponent e with
// A^p = V·10^e, rescaling whenever the central element exceeds 1e140.
func mtwPower(A []float64, m, p int) ([]float64, int) {
	if p == 1 {
		return append([]float64(nil), A...), 0
	}
	V, eV := mtwPower(A, m, p/2)
	B := make([]float64, m*m)
	matMul(B, V, V, m)
	eB := 2 * eV
	if p%2 == 0 {
		V, eV = B, eB
	} else {
		matMul(V, A, B, m)
		eV = eB
	}
	if V[(m/2)*m+m/2] > 1e140 {
		for i := range V {
			V[i] *= 1e-140
		}
		eV += 140
	}
	return V, eV
}

// matMul sets C = A·B for m×m row-major matrices (C must not alias A or B).
func matMul(C, A, B []float64, m int) {
	clear(C)
	for i := 0; i < m; i++ {
		ci := C[i*m : (i+1)*m]
		for k := 0; k < m; k++ {
			a := A[i*m+k]
			if a == 0 {
				continue
			}
			bk := B[k*m : (k+1)*m]
			for j, b := range bk {
				ci[j] += a * b
			}
		}
	}
}

// KolmogorovLimitSF returns Q(x) = P(K > x) for the limiting Kolmogorov
// distribution of √N·D_N (Kolmogorov 1933; Smirnov 1948):
// Q(x) = 2 Σ_{k≥1} (−1)^{k−1} exp(−2k²x²). For x < 1.18 it is computed as
// 1 − K(x) with the theta-function form K(x) = (√(2π)/x) Σ_{k≥1}
// exp(−(2k−1)²π²/(8x²)), which converges fast there; both series are
// summed to double precision. x ≤ 0 gives 1.
func KolmogorovLimitSF(x float64) float64 {
	switch {
	case math.IsNaN(x):
		return math.NaN()
	case x <= 0:
		return 1
	case x < 1.18:
		w := math.Pi * math.Pi / (8 * x * x)
		s := 0.0
		for k := 1; k < 100; k++ {
			t := math.Exp(-float64((2*k-1)*(2*k-1)) * w)
			s += t
			if t < 1e-17*s {
				break
			}
		}
		return math.Max(0, 1-math.Sqrt(2*math.Pi)/x*s)
	}
	s := 0.0
	sign := 1.0
	for k := 1; k < 100; k++ {
		t := math.Exp(-2 * float64(k*k) * x * x)
		s += sign * t
		if t < 1e-17*math.Abs(s) {
			break
		}
		sign = -sign
	}
	return math.Min(1, 2*s)
}
