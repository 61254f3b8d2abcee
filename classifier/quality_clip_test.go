package classifier

import (
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
)

// TestTurningPointRatio checks the bound of an unclipped extreme level at
// a smooth turning point against a finely sampled sine: the arcsine
// density near a quadratic maximum gives the extreme level (one full step
// wide) 1/(√2 − 1) = 2.414 times the count of its neighbour (analytic,
// see turningPointRatio), and edgeRatio returns 1 for a flat or thinning
// edge, 2.414 for the trend (c₁+c₂)/(c₃+c₄) = (√3 − 1)/(√5 − √3) = 1.452
// of the turning point, and rises monotonically in between.
func TestTurningPointRatio(t *testing.T) {
	const n = 1_000_000
	q := 0.05
	x := make([]float64, n)
	rng := rand.New(rand.NewPCG(3, 4))
	for i := range x {
		x[i] = math.Sin(2 * math.Pi * rng.Float64())
	}
	// Codes at 1 − q/2 − kq: the extreme level spans [1 − q, 1], one full
	// step, like its neighbours.
	var c0, c1 int
	for _, v := range x {
		switch k := math.Round((1 - q/2 - v) / q); k {
		case 0:
			c0++
		case 1:
			c1++
		}
	}
	// Analytic: P(x > 1 − u) = acos(1 − u)/π for the arcsine law, so the
	// ratio is acos(1 − q)/(acos(1 − 2q) − acos(1 − q)) → 1/(√2 − 1) as q → 0.
	want := math.Acos(1-q) / (math.Acos(1-2*q) - math.Acos(1-q))
	if got := float64(c0) / float64(c1); math.Abs(got-want) > 0.03*want || math.Abs(want-turningPointRatio) > 0.02*turningPointRatio {
		t.Errorf("sine: extreme/neighbour = %.3f, analytic %.3f, limit %.3f", got, want, turningPointRatio)
	}
	if r := edgeRatio(0.9, 1); r != 1 {
		t.Errorf("edgeRatio(0.9, 1) = %g, want 1 (thinning edge)", r)
	}
	tp := (math.Sqrt(3) - 1) / (math.Sqrt(5) - math.Sqrt(3))
	if r := edgeRatio(tp*1.0001, 1); math.Abs(r-turningPointRatio) > 1e-9 {
		t.Errorf("edgeRatio(%.4f) = %g, want %g", tp, r, turningPointRatio)
	}
	prev := 1.0
	for rho := 1.01; rho < tp; rho += 0.01 {
		r := edgeRatio(rho, 1)
		if r < prev || r > turningPointRatio {
			t.Fatalf("edgeRatio(%.2f) = %g after %g: not monotone within [1, %g]", rho, r, prev, turningPointRatio)
		}
		prev = r
	}
}

// clipSignals are the series of the clipping tests: noises with Gaussian
// tails, 1/f noise, the low-current imitation (telegraph traps on a 1/f
// floor with drift), a chaotic flow, a chaotic map with an arcsine density
// and a sine.
func clipSignals() []qualitySignal {
	return []qualitySignal{
		fromSystem("white", "white", nil),
		fromSystem("ar1", "ar1", map[string]float64{"phi": 0.95}),
		fromSystem("1/f", "powerlaw", map[string]float64{"beta": 1}),
		lowCurrent,
		fromSystem("lorenz", "lorenz", nil),
		fromSystem("logistic", "logistic", nil),
		sineSignal,
	}
}

// TestCoarseIsNotClipped: a converter whose range the signal uses only
// partly (30–100% of the full scale, anywhere in it) with 16 to 440 codes
// across the signal cuts nothing, and no trace may be called clipped. The
// previous rule (a share of more than 0.5% exactly at an extreme) fired on
// most of these: with ~20 levels the extreme level of a noise holds a few
// per cent, of a sine or the logistic map up to 15% (arcsine density).
func TestCoarseIsNotClipped(t *testing.T) {
	levels := []int{16, 17, 20, 24, 32, 64, 128, 440}
	total, alarms, coarse, oldRule := 0, 0, 0, 0
	for _, sig := range clipSignals() {
		for _, n := range []int{2000, 10000} {
			for li, L := range levels {
				for seed := range 6 {
					rng := rand.New(rand.NewPCG(uint64(seed), uint64(1000*n+li)))
					x := sig.gen(t, n, rng)
					lo, hi := slices.Min(x), slices.Max(x)
					span := 0.3 + 0.7*rng.Float64()
					full := (hi - lo) / span
					bottom := lo - rng.Float64()*(full-(hi-lo))
					codes := int(math.Round(float64(L-1)/span)) + 1
					y := quantiseRange(x, codes, bottom, bottom+full)
					total++
					if L <= 24 {
						coarse++
						if extremeShare(y) > 0.005 {
							oldRule++
						}
					}
					if w := QualityWarnings(y, 0); hasWarning(w, "clipped") {
						alarms++
						t.Errorf("%s, n=%d, %d levels over %.0f%% of the range (seed %d): %q", sig.name, n, L, 100*span, seed, w)
					}
				}
			}
		}
	}
	t.Logf("unclipped traces: %d, clipped warnings %d; the previous rule fired on %d of the %d with ≤ 24 levels", total, alarms, oldRule, coarse)
	if oldRule < coarse/4 {
		t.Errorf("the previous rule fired on only %d of %d traces with ≤ 24 levels: the test no longer holds coarse extreme levels", oldRule, coarse)
	}
}

// TestClippedIsDetected: noise clipped at one rail (a converter whose rail
// sits at the (1 − p) quantile of the signal, the other end of its range
// partly unused) is reported at the stated limits (clipLimits) for
// Gaussian white noise, AR(1), 1/f noise and the low-current imitation.
// The pile at the rail holds the clipped share p plus the rail's own cell,
// against a neighbour that holds a cell of the tail: the ratio grows with
// p and with the number of codes (analytic for a Gaussian: p/(φ(z_p)·q)
// plus one half). The limits are clipStated, shown by
// RecordingWarningLimits.
func TestClippedIsDetected(t *testing.T) {
	signals := clipSignals()[:4]
	const n, seeds = 10000, 20
	for _, lim := range clipStated {
		found, total := 0, 0
		for _, sig := range signals {
			hit := 0
			for seed := range seeds {
				rng := rand.New(rand.NewPCG(uint64(seed), uint64(lim.codes)))
				x := sig.gen(t, n, rng)
				high := seed%2 == 0
				if !high {
					for i := range x {
						x[i] = -x[i]
					}
				}
				s := slices.Clone(x)
				slices.Sort(s)
				rail := s[n-1-int(lim.share*float64(n))]
				bottom := s[0] - 0.5*(rail-s[0])*rng.Float64()
				y := quantiseRange(x, lim.codes, bottom, rail)
				side := "maximum"
				if !high {
					for i := range y {
						y[i] = -y[i]
					}
					side = "minimum"
				}
				w := QualityWarnings(y, 0)
				for _, m := range w {
					if strings.HasPrefix(m, "clipped") {
						if !strings.Contains(m, side) {
							t.Errorf("%s clipped at the %s: %q", sig.name, side, m)
						}
						hit++
						break
					}
				}
			}
			t.Logf("%3d codes, %4.1f%% clipped: %-11s %2d/%d", lim.codes, 100*lim.share, sig.name, hit, seeds)
			found += hit
			total += seeds
		}
		if float64(found) < 0.9*float64(total) {
			t.Errorf("%d codes, %.1f%% clipped at a rail: reported on %d of %d traces, the stated limit says ≥ 90%%", lim.codes, 100*lim.share, found, total)
		}
	}
}

// TestClippedBothRailsAndAnalog: the generators' converter clipping 2% at
// each rail with 64 codes, and an unquantised signal saturated at its
// 98th percentile (an analog stage: equal values pile at the rail, none
// beside it), are both reported; an 8-level converter is quantised, not
// clipped (a genuinely discrete-looking series is left alone below five
// levels, and eight levels of noise pile nothing).
func TestClippedBothRailsAndAnalog(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	x := whiteNoise(10000, rng)
	y := slices.Clone(x)
	// Same converter as generators.Recording{Levels: 64, Clip: 0.02}: full
	// scale between the 2% and 98% quantiles.
	s := slices.Clone(x)
	slices.Sort(s)
	y = quantiseRange(y, 64, s[200], s[len(s)-1-200])
	w := QualityWarnings(y, 0)
	var lo, hi bool
	for _, m := range w {
		lo = lo || strings.HasPrefix(m, "clipped") && strings.Contains(m, "minimum")
		hi = hi || strings.HasPrefix(m, "clipped") && strings.Contains(m, "maximum")
	}
	if !lo || !hi {
		t.Errorf("64 codes, 2%% clipped at each rail: %q", w)
	}
	a := slices.Clone(x)
	top := s[len(s)-1-200]
	for i, v := range a {
		a[i] = math.Min(v, top)
	}
	if w := QualityWarnings(a, 0); !hasWarning(w, "clipped: 2.0% of samples sit at the maximum") {
		t.Errorf("analog saturation at the 98th percentile: %q", w)
	}
	e := make([]float64, len(x))
	for i, v := range x {
		e[i] = math.Round(2 * v)
	}
	if w := QualityWarnings(e, 0); hasWarning(w, "clipped") || !hasWarning(w, "quantised") {
		t.Errorf("8-level noise: %q", w)
	}
}
