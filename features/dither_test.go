package features

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/features/ordinal"
	"github.com/tracesift/tracesift/generators"
)

// adc records x with an ADC of levels codes over mean ± c·sd (rounding to
// the nearest code, clipping at the rails), returning code·q + mean − c·sd.
// mean and sd are those of the process when known (i.i.d. N(0, 1): 0 and 1)
// so that the code probabilities can be derived, else those of x.
func adc(x []float64, levels int, c, mean, sd float64) []float64 {
	q := 2 * c * sd / float64(levels-1)
	lo := mean - c*sd
	out := make([]float64, len(x))
	for i, v := range x {
		out[i] = lo + q*math.Max(0, math.Min(float64(levels-1), math.Round((v-lo)/q)))
	}
	return out
}

// meanSD returns the mean and the standard deviation (divisor n) of x.
func meanSD(x []float64) (mean, sd float64) {
	var ss float64
	for _, v := range x {
		mean += v
	}
	mean /= float64(len(x))
	for _, v := range x {
		ss += (v - mean) * (v - mean)
	}
	return mean, math.Sqrt(ss / float64(len(x)))
}

// adcOwn is adc over the sample mean and sd of x.
func adcOwn(x []float64, levels int, c float64) []float64 {
	mean, sd := meanSD(x)
	return adc(x, levels, c, mean, sd)
}

func gaussian(n int, seed uint64) []float64 {
	rng := rand.New(rand.NewPCG(seed, 0xd1))
	x := make([]float64, n)
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	return x
}

// telegraph is a two-level Markov chain switching with probability 0.05
// per sample.
func telegraph(n int, seed uint64) []float64 {
	rng := rand.New(rand.NewPCG(seed, 0xd2))
	x := make([]float64, n)
	up := false
	for i := range x {
		if rng.Float64() < 0.05 {
			up = !up
		}
		if up {
			x[i] = 1
		}
	}
	return x
}

// poisson returns n i.i.d. Poisson counts of mean mu (counting exponential
// arrivals in a unit interval).
func poisson(n int, mu float64, seed uint64) []float64 {
	rng := rand.New(rand.NewPCG(seed, 0xd3))
	x := make([]float64, n)
	for i := range x {
		k := 0
		for t := rng.ExpFloat64() / mu; t < 1; t += rng.ExpFloat64() / mu {
			k++
		}
		x[i] = float64(k)
	}
	return x
}

// waveform returns n samples of f(i).
func waveform(n int, f func(i int) float64) []float64 {
	x := make([]float64, n)
	for i := range x {
		x[i] = f(i)
	}
	return x
}

func lorenz02(t testing.TB, n int) []float64 {
	t.Helper()
	s, err := generators.Lookup("lorenz")
	if err != nil {
		t.Fatal(err)
	}
	x, err := s.Generate(n, map[string]float64{"dt": 0.02}, rand.New(rand.NewPCG(5, 99)))
	if err != nil {
		t.Fatal(err)
	}
	return x
}

// TestDetectGrid checks the detection rule of DetectGrid on series whose
// grid is known by construction: the step (2c/(levels−1) in the units of
// the recording, divided by the sd of the recorded series) is recovered to
// 10^−6 sd, the rails of a clipped series are reported, and genuinely
// discrete series are left alone with the documented reason.
func TestDetectGrid(t *testing.T) {
	const n = 5000
	white := gaussian(n, 1)
	tests := []struct {
		name     string
		x        []float64
		step     float64 // grid step in recorded units; 0: none expected
		dithered bool
		reason   string // substring of Grid.Reason when not dithered
		rails    bool   // piles expected at both rails
		period   int
	}{
		{"continuous noise", white, 0, false, "no repeated values", false, 0},
		{"noise, 8 levels", adc(white, 8, 3, 0, 1), 6.0 / 7, true, "", false, 0},
		{"noise, 16 levels", adc(white, 16, 3, 0, 1), 0.4, true, "", false, 0},
		{"noise, 4096 levels", adc(white, 4096, 3, 0, 1), 6.0 / 4095, true, "", false, 0},
		{"noise, 16 levels, 13% clipped", adc(white, 16, 1.5, 0, 1), 0.2, true, "", true, 0},
		{"Poisson counts, mean 10", poisson(n, 10, 2), 1, true, "", false, 0},
		{"two-level telegraph", telegraph(n, 3), 0, false, "fewer than 5 levels", false, 0},
		{"square wave", waveform(n, func(i int) float64 { return float64(i % 30 / 21) }), 0, false, "fewer than 5 levels", false, 0},
		{"sawtooth, period 25", waveform(n, func(i int) float64 { return float64(i % 25) }), 1, false, "exactly periodic", false, 25},
		{"sine of period 20, 16 levels", adcOwn(waveform(n, func(i int) float64 { return math.Sin(2*math.Pi*float64(i)/20 + 0.3) }), 16, 1.5), 0, false, "exactly periodic", false, 20},
		{"levels off a uniform grid", waveform(n, func(i int) float64 { return []float64{0, 1, 2.3, 3.1, 4.7, 6}[(i*i+i/7)%6] }), 0, false, "off a uniform grid", false, 0},
	}
	for _, tc := range tests {
		g, err := DetectGrid(tc.x)
		if err != nil {
			t.Fatal(err)
		}
		if g.Dithered != tc.dithered || !tc.dithered && !strings.Contains(g.Reason, tc.reason) {
			t.Errorf("%s: dithered %v (%q), want %v (%q)", tc.name, g.Dithered, g.Reason, tc.dithered, tc.reason)
		}
		if tc.step > 0 {
			if _, sd := meanSD(tc.x); math.Abs(g.Step-tc.step/sd) > 1e-6 {
				t.Errorf("%s: step %.9f sd, want %.9f", tc.name, g.Step, tc.step/sd)
			}
		}
		if rails := g.LowRail > 0 && g.HighRail > 0; rails != tc.rails {
			t.Errorf("%s: rails %d and %d", tc.name, g.LowRail, g.HighRail)
		}
		if g.Period != tc.period {
			t.Errorf("%s: period %d, want %d", tc.name, g.Period, tc.period)
		}
		t.Logf("%s: %+v", tc.name, g)
	}
}

// TestDitherPlacement checks dither directly: every sample stays inside its
// cell [z − q/2, z + q/2], no two samples are left equal, samples of
// different cells keep their order, and with Order = 1 a run entered from
// below and left above rises through its cell while a run entered and left
// from below peaks inside it.
func TestDitherPlacement(t *testing.T) {
	const q = 0.5
	// cells: run of 3 rising through level 1, a peak run of 3 at level 2,
	// then uniform samples.
	z := []float64{0, 0.5, 0.5, 0.5, 1, 1, 1, 0.5, 0, 0.5, 0, 1.5, 1.5, 0}
	for _, order := range []float64{0, 1} {
		y := dither(z, Grid{Step: q, Order: order}, rand.New(rand.NewPCG(1, 2)))
		for i := range z {
			if y[i] < z[i]-q/2 || y[i] > z[i]+q/2 {
				t.Errorf("order %g: sample %d at %g left its cell around %g", order, i, y[i], z[i])
			}
			for j := range i {
				if y[i] == y[j] {
					t.Errorf("order %g: samples %d and %d still equal", order, j, i)
				}
				if z[i] != z[j] && (z[i] < z[j]) != (y[i] < y[j]) {
					t.Errorf("order %g: samples %d and %d of different cells swapped", order, j, i)
				}
			}
		}
		if order == 1 {
			if !(y[1] < y[2] && y[2] < y[3]) {
				t.Errorf("rising run not in order: %v", y[1:4])
			}
			if !(y[5] > y[4] && y[5] > y[6]) {
				t.Errorf("peak run has no apex inside: %v", y[4:7])
			}
		}
	}
}

// TestExtractQuantisedIsUnitInvariant: the dither is a function of the
// standardised series and the seed, so the whole vector of a quantised
// trace is bit-identical in any units (DESIGN.md's "amperes vs
// microamperes"), including the grid diagnostics.
func TestExtractQuantisedIsUnitInvariant(t *testing.T) {
	const n = 1200
	for _, tc := range []struct {
		name string
		x    []float64
	}{
		{"noise, 16 levels, clipped", adc(gaussian(n, 4), 16, 1.5, 0, 1)},
		{"Lorenz, 64 levels", adcOwn(lorenz02(t, n), 64, 3)},
		{"Poisson counts", poisson(n, 8, 5)},
	} {
		ref, err := Extract(tc.x, Options{Seed: 3})
		if err != nil {
			t.Fatal(err)
		}
		if !ref.Grid.Dithered {
			t.Fatalf("%s: not dithered: %+v", tc.name, ref.Grid)
		}
		for _, ab := range [][2]float64{{1e-6, 3e-5}, {2.5e3, -40}} {
			y := make([]float64, n)
			for i, v := range tc.x {
				y[i] = ab[0]*v + ab[1]
			}
			got, err := Extract(y, Options{Seed: 3})
			if err != nil {
				t.Fatal(err)
			}
			if got.Grid != ref.Grid {
				t.Errorf("%s, a=%g b=%g: grid %+v, was %+v", tc.name, ab[0], ab[1], got.Grid, ref.Grid)
			}
			for i, name := range ref.Names {
				if math.Float64bits(got.Values[i]) != math.Float64bits(ref.Values[i]) || got.Reasons[i] != ref.Reasons[i] {
					t.Errorf("%s, a=%g b=%g: %s = %v (%q), was %v (%q)", tc.name, ab[0], ab[1], name, got.Values[i], got.Reasons[i], ref.Values[i], ref.Reasons[i])
				}
			}
		}
	}
}

// TestQuantisedIIDReadsAsIID: i.i.d. N(0, 1) noise recorded with 16 levels
// over ±3 sd, and over ±1.5 sd (13% of the samples clipped at each rail),
// n = 20000. Dithered, the series is i.i.d. and continuous again, so the
// published i.i.d. values hold:
//   - permutation entropy 1 − H ∈ [0, 2·bias], bias = (d!−1)/(2W ln d!), and
//     complexity below Q0·ln(d!)·2·bias/4 (Bandt & Pompe, Phys. Rev. Lett. 88
//     (2002) 174102; Rosso et al., Phys. Rev. Lett. 99 (2007) 154102; bounds
//     as in features/ordinal's TestIIDEntropyAndComplexity);
//   - HVG mean degree 4 within 0.01 (a continuous i.i.d. series of this
//     length gives 3.998, measured; the undithered grid 3.42), λ = ln 3/2
//     within 0.01 (four times the spread over seeds, 0.0025) and mean
//     clustering 0.6479 within 0.005 (Luque et al., Phys. Rev. E 80 (2009)
//     046103; the clustering value derived in REFERENCES.md);
//   - sample entropy at the limit derived for uniformly dithered i.i.d.
//     data on this grid (features/nonlinear's gridSampEn: 2.1873 for ±3 sd,
//     2.1968 for ±1.5 sd, against 2.1851 continuous; Richman & Moorman, Am.
//     J. Physiol. 278 (2000) H2039) within 0.015 (four times the spread
//     over seeds);
//   - lag-1 autocorrelation of the increments −1/2 within 3/√n (derived for
//     any i.i.d. series).
func TestQuantisedIIDReadsAsIID(t *testing.T) {
	const n = 20000
	only := []string{"op_ent_d4", "op_jsc_d4", "hv_deg_mean", "hv_tail_exprate", "hv_clust_mean", "nl_sent_m2", "dx_acf_1"}
	for _, tc := range []struct {
		c      float64
		sampEn float64
	}{{3, 2.1873}, {1.5, 2.1968}} {
		x := adc(gaussian(n, 6), 16, tc.c, 0, 1)
		v, err := Extract(x, Options{Seed: 1, Only: only})
		if err != nil {
			t.Fatal(err)
		}
		if !v.Grid.Dithered || v.Grid.Order != 0 {
			t.Fatalf("±%g sd: grid %+v, want dithered uniformly", tc.c, v.Grid)
		}
		get := func(name string) float64 {
			f, ok := v.Get(name)
			if !ok {
				t.Fatalf("%s missing: %v", name, v.Missing()[name])
			}
			return f
		}
		const patterns = 24
		bias := float64(patterns-1) / (2 * float64(n-3) * math.Log(patterns))
		checks := []struct {
			name     string
			got, lo  float64
			hi       float64
			expected string
		}{
			{"op_ent_d4", get("op_ent_d4"), 1 - 2*bias, 1, "1"},
			{"op_jsc_d4", get("op_jsc_d4"), 0, ordinal.Q0(patterns) * math.Log(patterns) * 2 * bias / 4, "0"},
			{"hv_deg_mean", get("hv_deg_mean"), 3.99, 4.01, "4"},
			{"hv_tail_exprate", get("hv_tail_exprate"), math.Log(1.5) - 0.01, math.Log(1.5) + 0.01, "ln 3/2"},
			{"hv_clust_mean", get("hv_clust_mean"), 0.6479 - 0.005, 0.6479 + 0.005, "0.6479"},
			{"nl_sent_m2", get("nl_sent_m2"), tc.sampEn - 0.015, tc.sampEn + 0.015, fmt.Sprint(tc.sampEn)},
			{"dx_acf_1", get("dx_acf_1"), -0.5 - 3/math.Sqrt(n), -0.5 + 3/math.Sqrt(n), "−1/2"},
		}
		for _, c := range checks {
			if c.got < c.lo || c.got > c.hi {
				t.Errorf("±%g sd: %s = %.5f, want %s (in [%.5f, %.5f])", tc.c, c.name, c.got, c.expected, c.lo, c.hi)
			}
			t.Logf("±%g sd: %s = %.5f (want %s)", tc.c, c.name, c.got, c.expected)
		}
	}
}

// TestQuantisedChaosKeepsSignatures: chaos recorded on a coarse grid stays
// chaos. The logistic map at r = 4 (16 and 64 levels over ±3 sd, of which
// its orbit occupies 8 and 30; n = 5000) is dithered uniformly — its
// consecutive samples are independent at the grid's scale — which reads as
// white measurement noise of variance q²/6 (SNR 16 and 28 dB): its
// permutation entropy stays well below the i.i.d. value 1 (Bandt & Pompe
// 2002; measured 0.86 and 0.81, unquantised 0.74), its complexity well
// above 0 (Rosso et al. 2007) and some forbidden order-5 patterns stay
// missing beyond the i.i.d. expectation (Amigó, Zambrano & Sanjuán, EPL 79
// (2007) 50001; measured excess 0.13 and 0.18 of the 120 patterns, 0.74
// unquantised, 0 for noise; features/ordinal checks that TiesSkip keeps all
// of them). The Lorenz flow sampled every 0.02 (16
// levels) creeps through the grid, so its runs are placed in order and its
// ordinal measures stay within 0.02 of the unquantised ones (measured 0.01).
func TestQuantisedChaosKeepsSignatures(t *testing.T) {
	const n = 5000
	only := []string{"op_ent_d4", "op_jsc_d4", "op_miss_d5"}
	logistic := series(t, "logistic", n, 7)
	for _, levels := range []int{16, 64} {
		v, err := Extract(adcOwn(logistic, levels, 3), Options{Only: only})
		if err != nil {
			t.Fatal(err)
		}
		h, _ := v.Get("op_ent_d4")
		c, _ := v.Get("op_jsc_d4")
		m, _ := v.Get("op_miss_d5")
		if !v.Grid.Dithered || h > 0.9 || c < 0.1 || !(m > 0) {
			t.Errorf("logistic, %d levels: H = %.4f, C = %.4f, forbidden excess %.4f, grid %+v", levels, h, c, m, v.Grid)
		}
		t.Logf("logistic, %d levels: H = %.4f, C = %.4f, forbidden excess %.4f", levels, h, c, m)
	}
	x := lorenz02(t, n)
	ref, err := Extract(x, Options{Only: only})
	if err != nil {
		t.Fatal(err)
	}
	v, err := Extract(adcOwn(x, 16, 3), Options{Only: only})
	if err != nil {
		t.Fatal(err)
	}
	if v.Grid.Order != 1 {
		t.Errorf("Lorenz, 16 levels: grid %+v, want runs placed in order", v.Grid)
	}
	for _, name := range []string{"op_ent_d4", "op_jsc_d4"} {
		want, _ := ref.Get(name)
		got, _ := v.Get(name)
		if math.Abs(got-want) > 0.02 {
			t.Errorf("Lorenz, 16 levels: %s = %.4f, unquantised %.4f", name, got, want)
		}
		t.Logf("Lorenz, 16 levels: %s = %.4f, unquantised %.4f", name, got, want)
	}
}

// TestDiscreteSeriesLeftAsRecorded: a two-level telegraph series, a square
// wave, a sawtooth of integer period and a quantised sine of integer period
// are not dithered, so every estimator sees the recorded values: the
// ordinal features equal those computed directly from the standardised
// series, bit for bit.
func TestDiscreteSeriesLeftAsRecorded(t *testing.T) {
	const n = 3000
	for _, tc := range []struct {
		name string
		x    []float64
	}{
		{"telegraph", telegraph(n, 8)},
		{"square wave", waveform(n, func(i int) float64 { return float64(i % 30 / 21) })},
		{"sawtooth", waveform(n, func(i int) float64 { return float64(i % 25) })},
		{"sine, 16 levels", adcOwn(waveform(n, func(i int) float64 { return math.Sin(2*math.Pi*float64(i)/20 + 0.3) }), 16, 1.5)},
	} {
		v, err := Extract(tc.x, Options{Only: []string{"op_ent_d4", "op_jsc_d4"}})
		if err != nil {
			t.Fatal(err)
		}
		if v.Grid.Dithered {
			t.Errorf("%s dithered: %+v", tc.name, v.Grid)
		}
		z, err := Standardise(tc.x)
		if err != nil {
			t.Fatal(err)
		}
		r, err := ordinal.Complexity(z, ordinal.Options{Order: 4})
		if err != nil {
			t.Fatal(err)
		}
		h, _ := v.Get("op_ent_d4")
		c, _ := v.Get("op_jsc_d4")
		if h != r.Entropy || c != r.Complexity {
			t.Errorf("%s: H = %v, C = %v from Extract, %v and %v from the recorded series", tc.name, h, c, r.Entropy, r.Complexity)
		}
	}
}

// TestDitherIsSeeded: the same seed gives the same dither, another seed
// another one (Options.Seed drives it; nothing reads a global generator).
func TestDitherIsSeeded(t *testing.T) {
	x := adc(gaussian(1000, 9), 16, 3, 0, 1)
	z, err := Standardise(x)
	if err != nil {
		t.Fatal(err)
	}
	g := detectGrid(z)
	a := dither(z, g, rand.New(rand.NewPCG(1, ditherStream)))
	b := dither(z, g, rand.New(rand.NewPCG(1, ditherStream)))
	c := dither(z, g, rand.New(rand.NewPCG(2, ditherStream)))
	if !slices.Equal(a, b) || slices.Equal(a, c) {
		t.Error("dither is not a function of the seed alone")
	}
}

// BenchmarkDetectGrid measures the grid test on an unquantised trace (the
// one-pass quick test, all that Extract adds for it) and on a quantised one
// (sort, grid check, period search and dither).
func BenchmarkDetectGrid(b *testing.B) {
	const n = 100000
	white := gaussian(n, 10)
	for _, tc := range []struct {
		name string
		x    []float64
	}{{"continuous", white}, {"16 levels", adc(white, 16, 3, 0, 1)}} {
		z, err := Standardise(tc.x)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("%s/n=%d", tc.name, n), func(b *testing.B) {
			for b.Loop() {
				if g := detectGrid(z); g.Dithered {
					dither(z, g, rand.New(rand.NewPCG(1, ditherStream)))
				}
			}
		})
	}
}
