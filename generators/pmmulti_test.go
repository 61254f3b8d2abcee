package generators

import (
	"fmt"
	"math"
	"testing"
)

// pmCoincidence returns the sum of Π_k |J_{n_k}(β_k)| over the index
// vectors n (|n_k| ≤ 15) other than m whose line f_c + Σ n_k f_k, or its
// mirror −(f_c + Σ n_k f_k), falls on the DFT bin of the line of interest
// f_c + Σ m_k f_k (frequencies in bins of an N-sample record, all whole
// numbers), plus the line's own mirror if it falls there: the most those
// lines can add to or take from its measured amplitude (each cosine of
// amplitude A projects at most A onto a bin; triangle inequality).
func pmCoincidence(fc int, f []int, beta []float64, m []int, n int) float64 {
	const r = 15
	jn := make([][]float64, len(f))
	for k := range f {
		jn[k] = make([]float64, 2*r+1)
		for v := -r; v <= r; v++ {
			jn[k][v+r] = math.Abs(math.Jn(v, beta[k]))
		}
	}
	mod := func(a int) int { return ((a % n) + n) % n }
	target := fc
	for k := range f {
		target += m[k] * f[k]
	}
	idx := make([]int, len(f))
	var total float64
	var walk func(k int)
	walk = func(k int) {
		if k < len(f) {
			for v := -r; v <= r; v++ {
				idx[k] = v
				walk(k + 1)
			}
			return
		}
		line, amp, same := fc, 1.0, true
		for i := range f {
			line += idx[i] * f[i]
			amp *= jn[i][idx[i]+r]
			same = same && idx[i] == m[i]
		}
		if (!same && mod(line) == mod(target)) || mod(-line) == mod(target) {
			total += amp
		}
	}
	walk(0)
	return total
}

// TestPMMultiBesselLines: the line at f_c + Σ n_k f_k has amplitude
// Π_k |J_{n_k}(β_k)| (Jacobi–Anger expansion per tone, analytic; math.Jn
// from the Go standard library). The carrier and tone frequencies are
// whole numbers of cycles in N = 3200 samples (P = 8, 400 cycles; tones of
// 83, 63 and 19 cycles), so the plain DFT projection is exact; lines of
// other index vectors landing on the same bin can change the amplitude by
// at most pmCoincidence (enumerated, |n_k| ≤ 15; beyond that J_n(β ≤ 2) <
// 10^−13), which is added to the tolerance of 10^−9. The tone bins were
// chosen by a search over small whole numbers so that this bound stays
// below 3·10^−10 for the lines checked (with 21, 13 and 5 cycles it
// reaches 0.42: 21 − 2·13 + 5 = 0).
func TestPMMultiBesselLines(t *testing.T) {
	const n = 3200
	fc := 400
	for _, tc := range []struct {
		f    []int
		beta []float64
	}{
		{[]int{83, 63}, []float64{1.2, 0.7}},
		{[]int{83, 63, 19}, []float64{2, 0.5, 1}},
		{[]int{83, 63, 19}, []float64{0.3, 1.5, 0.9}},
	} {
		g := PMMulti{Period: float64(n) / float64(fc), Indices: tc.beta}
		for _, f := range tc.f {
			g.ModPeriods = append(g.ModPeriods, float64(n)/float64(f))
		}
		t.Run(fmt.Sprint(tc.beta), func(t *testing.T) {
			x, err := g.Generate(n, newRand(12))
			if err != nil {
				t.Fatal(err)
			}
			for _, m := range [][]int{{0, 0, 0}, {1, 0, 0}, {0, -1, 0}, {1, 1, 0}, {-2, 0, 1}, {0, 2, -1}} {
				m = m[:len(tc.f)]
				f := float64(fc)
				want := 1.0
				for k := range m {
					f += float64(m[k] * tc.f[k])
					want *= math.Abs(math.Jn(m[k], tc.beta[k])) // analytic: Jacobi–Anger
				}
				tol := 1e-9 + pmCoincidence(fc, tc.f, tc.beta, m, n)
				got := lineAmplitude(x, f/n)
				if math.Abs(got-want) > tol {
					t.Errorf("line %v: amplitude %.10f, want %.10f ± %.2g", m, got, want, tol)
				}
			}
		})
	}
}

// TestPMMultiReducesToFM: with every index but the first at 0, the signal
// is the single-tone FM carrier cos(2πt/P + β sin(2πt/P_1 + φ_1) + φ_c)
// (analytic); both generators draw the carrier and first tone phases
// first, and adding 0·sin is exact, so the samples agree to the bit.
func TestPMMultiReducesToFM(t *testing.T) {
	pm, err := PMMulti{Period: 11.3, ModPeriods: []float64{97.1, 51.7, 33.3}, Indices: []float64{2.5, 0, 0}}.Generate(2000, newRand(5))
	if err != nil {
		t.Fatal(err)
	}
	fm, err := FM{Period: 11.3, ModPeriod: 97.1, Index: 2.5}.Generate(2000, newRand(5))
	if err != nil {
		t.Fatal(err)
	}
	for i := range pm {
		if pm[i] != fm[i] {
			t.Fatalf("sample %d: pm-multi %v, fm %v", i, pm[i], fm[i])
		}
	}
}

// TestPMMultiLimiter: the soft limiter tanh(g u)/tanh(g) is odd and
// monotone, so the output stays in [−1, 1] and reaches close to ±1 where
// u does; as a memoryless function of the phases it adds only
// combination lines of the carrier and tone frequencies (analytic), so
// the signal stays quasi-periodic. With the carrier and tones on bins
// that are multiples of 3 in N = 3600 samples (450, 63 and 39 cycles),
// every line, harmonic, alias and mirror falls on such a bin, and bins
// 1 mod 3 are empty (DFT orthogonality, to 10^−9).
func TestPMMultiLimiter(t *testing.T) {
	const n = 3600
	g := PMMulti{Period: 8, ModPeriods: []float64{n / 63.0, n / 39.0}, Indices: []float64{1, 0.8}, Gain: 3}
	x, err := g.Generate(n, newRand(3))
	if err != nil {
		t.Fatal(err)
	}
	lo, hi := extrema(x)
	if lo < -1-1e-12 || hi > 1+1e-12 || hi < 0.99 || lo > -0.99 {
		t.Errorf("limited signal spans [%g, %g], want within and close to [−1, 1]", lo, hi)
	}
	for _, f := range []float64{451, 514, 412, 1351, 1000} {
		if a := lineAmplitude(x, f/n); a > 1e-9 {
			t.Errorf("amplitude %.3g at %g cycles per record, off the line lattice", a, f)
		}
	}
	if a := lineAmplitude(x, 3*450.0/n); a < 1e-3 {
		t.Errorf("third carrier harmonic %.3g, want the limiter's distortion", a)
	}
}

func TestPMMultiRejects(t *testing.T) {
	for _, g := range []PMMulti{
		{Period: 10, ModPeriods: []float64{100}, Indices: []float64{1}},
		{Period: 10, ModPeriods: []float64{100, 50}, Indices: []float64{1}},
		{Period: 2.5, ModPeriods: []float64{100, 50}, Indices: []float64{5, 5}}, // Carson band above Nyquist
		{Period: 10, ModPeriods: []float64{100, 50}, Indices: []float64{1, -1}},
		{Period: 10, ModPeriods: []float64{100, 50}, Indices: []float64{1, 1}, Gain: -1},
	} {
		if _, err := g.Generate(10, newRand(1)); err == nil {
			t.Errorf("%+v: no error", g)
		}
	}
}

// TestPMMultiRegistryCarrier: at the registry defaults (incommensurate
// periods 10, 100φ and 70√2) the carrier line of a 2^16-sample record,
// measured through the Blackman–Harris window at exactly 1/10 cycle per
// sample, is the invariant J_0(2)·J_0(1) (analytic). No other line with
// |n_1|, |n_2| ≤ 40 lies within four bins of the carrier (enumerated), and
// beyond that J_n(2) < 10^−40; the window's leakage from lines further
// away is below 10^−4 of their amplitude, so the tolerance is 2·10^−3.
func TestPMMultiRegistryCarrier(t *testing.T) {
	s, err := Lookup("pm-multi")
	if err != nil {
		t.Fatal(err)
	}
	x, err := s.Generate(1<<16, nil, newRand(8))
	if err != nil {
		t.Fatal(err)
	}
	want := s.Invariants[0].Value
	if math.Abs(want-math.J0(2)*math.J0(1)) > 1e-15 {
		t.Fatalf("invariant %g, J_0(2)·J_0(1) = %g", want, math.J0(2)*math.J0(1))
	}
	if got := windowedAmplitude(x, 0.1); math.Abs(got-math.Abs(want)) > 2e-3 {
		t.Errorf("carrier line %.5f, want |J_0(2)·J_0(1)| = %.5f", got, math.Abs(want))
	}
}
