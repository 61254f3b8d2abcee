package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Amplitude laws of PulseNoise.
const (
	// PulseAmpExponential: exponential amplitudes of mean 1 (E[A²] = 2).
	PulseAmpExponential = iota
	// PulseAmpLogNormal: log-normal amplitudes of mean 1 and log-standard
	// deviation AmpSD (E[A²] = e^{AmpSD²}).
	PulseAmpLogNormal
	pulseAmpLaws
)

// PulseNoise is burst-like current noise made of pulses of random height
// and shape arriving at the times t_k of a Poisson process of Rate pulses
// per sample,
//
//	x_i = Σ_k A_k·g_k(i − t_k) + σ_b·η_i,
//
// with independent amplitudes A_k (exponential or log-normal of mean 1,
// Amp), and each pulse's shape g_k drawn with equal probability from three
// kinds built on the width W = Width (samples):
//
//   - rectangular: 1 on [0, L), L uniform in [W/2, 3W/2] per pulse
//     (∫g = ∫g² = L);
//   - Gaussian: exp(−(t − c)²/2s²) centred at c = 6s, s = W/(2√(2 ln 2))
//     (full width at half maximum W; ∫g = s√(2π), ∫g² = s√π; cut at
//     |t − c| > 6s, which loses e^{−18} of the pulse);
//   - double exponential: (e^{−t/W} − e^{−t/(rW)})/g_max for t ≥ 0, rise
//     ratio r = Rise, normalised to peak 1 (g_max = r^{r/(1−r)}(1 − r)),
//     ∫g = W(1 − r)/g_max, ∫g² = W(1 + r − 4r/(1 + r))/(2g_max²);
//
// plus white Gaussian background η of standard deviation σ_b = Background
// times the standard deviation of the pulse part. By Campbell's theorem
// (Campbell, Proc. Camb. Phil. Soc. 15 (1909) 117 (memory); e.g. Rice,
// Bell Syst. Tech. J. 23 (1944) 282 (memory)), for independent marks
// E[x] = ν·E[A]·E[∫g] and Var x = ν·E[A²]·E[∫g²] + σ_b² (analytic; the
// expectations over the three shapes are their averages), the moments
// Moments returns. Sparse pulses (ν·W ≪ 1) give popcorn-like
// bursts; overlapping ones (ν·W ≫ 1) approach Gaussian coloured noise.
//
// All pulses start at their arrival time, so samples are built forward:
// the rectangular and Gaussian pulses are added over their support, the
// double exponentials through two exactly decaying states. Arrivals start
// 40W before the first sample (the tails left out are below e^{−40}), so
// the record is stationary from its first sample.
type PulseNoise struct {
	Rate       float64 // pulses per sample, > 0
	Width      float64 // pulse width W (samples), > 0
	Rise       float64 // rise/decay ratio r of the double exponential, 0 < r < 1
	Amp        int     // PulseAmpExponential or PulseAmpLogNormal
	AmpSD      float64 // log-standard deviation of log-normal amplitudes, ≥ 0
	Background float64 // white background sd relative to the pulse sd, ≥ 0
}

// pulseShapeIntegrals returns ∫g and ∫g² averaged over the three shapes.
func (g PulseNoise) pulseShapeIntegrals() (i1, i2 float64) {
	w, r := g.Width, g.Rise
	s := w * fwhmToSigma
	gmax := math.Pow(r, r/(1-r)) * (1 - r)
	i1 = (w + s*math.Sqrt(2*math.Pi) + w*(1-r)/gmax) / 3
	i2 = (w + s*math.Sqrt(math.Pi) + w*(1+r-4*r/(1+r))/(2*gmax*gmax)) / 3
	return i1, i2
}

// Moments returns the stationary mean and variance of g by Campbell's
// theorem (analytic; see PulseNoise).
func (g PulseNoise) Moments() (mean, variance float64) {
	i1, _ := g.pulseShapeIntegrals()
	return g.Rate * i1, g.pulseVariance() * (1 + g.Background*g.Background)
}

// pulseVariance is the variance of the pulse part, ν E[A²] E[∫g²].
func (g PulseNoise) pulseVariance() float64 {
	_, i2 := g.pulseShapeIntegrals()
	ea2 := 2.0
	if g.Amp == PulseAmpLogNormal {
		ea2 = math.Exp(g.AmpSD * g.AmpSD)
	}
	return g.Rate * ea2 * i2
}

func (g PulseNoise) check() error {
	if !(g.Rate > 0 && g.Width > 0) || math.IsInf(g.Rate+g.Width, 0) || !(g.Rise > 0 && g.Rise < 1) {
		return fmt.Errorf("pulse-noise: %w: rate = %g, width = %g, rise = %g, want rate, width > 0 finite and 0 < rise < 1", ErrParamRange, g.Rate, g.Width, g.Rise)
	}
	if g.Rate*g.Width > 1000 {
		return fmt.Errorf("pulse-noise: %w: rate·width = %g overlapping pulses, want ≤ 1000", ErrParamRange, g.Rate*g.Width)
	}
	if g.Amp < 0 || g.Amp >= pulseAmpLaws || !(g.AmpSD >= 0 && g.AmpSD <= 5) || !(g.Background >= 0) || math.IsInf(g.Background, 0) {
		return fmt.Errorf("pulse-noise: %w: amp = %d, amp_sd = %g, background = %g, want amp 0 or 1, 0 ≤ amp_sd ≤ 5, background ≥ 0 finite", ErrParamRange, g.Amp, g.AmpSD, g.Background)
	}
	return nil
}

// Generate returns n samples.
func (g PulseNoise) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := g.check(); err != nil {
		return nil, err
	}
	w, r := g.Width, g.Rise
	s := w * fwhmToSigma
	tr := r * w
	gmax := math.Pow(r, r/(1-r)) * (1 - r)
	decD, decR := math.Exp(-1/w), math.Exp(-1/tr)
	ampMu := -g.AmpSD * g.AmpSD / 2 // log-normal of mean 1
	// Gaussian pulses by the recurrence g(j+1) = g(j)·q(j), q(j+1) =
	// q(j)·e^{−1/s²}, with q(j) = exp(−(2(j − c) + 1)/(2s²)).
	gstep := math.Exp(-1 / (s * s))

	out := make([]float64, n)
	var stD, stR float64 // double-exponential states at the current sample
	t := -40*w - 12*s + rng.ExpFloat64()/g.Rate
	i := 0
	for ; t <= float64(n-1); t += rng.ExpFloat64() / g.Rate {
		// Bring the double-exponential states to the sample at or after t.
		j0 := max(0, int(math.Ceil(t)))
		for ; i < j0; i++ {
			out[i] += stD - stR
			stD *= decD
			stR *= decR
		}
		shape := rng.IntN(3)
		a := rng.ExpFloat64()
		if g.Amp == PulseAmpLogNormal {
			a = math.Exp(ampMu + g.AmpSD*rng.NormFloat64())
		}
		switch shape {
		case 0: // rectangular on [t, t + L)
			l := w * (0.5 + rng.Float64())
			for j := j0; j < n && float64(j) < t+l; j++ {
				out[j] += a
			}
		case 1: // Gaussian centred at t + 6s, cut at ±6s
			c := t + 6*s
			j := max(j0, int(math.Ceil(c-6*s)))
			end := min(n-1, int(math.Floor(c+6*s)))
			if j > end {
				break
			}
			d := float64(j) - c
			v := a * math.Exp(-d*d/(2*s*s))
			q := math.Exp(-(2*d + 1) / (2 * s * s))
			for ; j <= end; j++ {
				out[j] += v
				v *= q
				q *= gstep
			}
		default: // double exponential from t
			dt := float64(j0) - t
			stD += a / gmax * math.Exp(-dt/w)
			stR += a / gmax * math.Exp(-dt/tr)
		}
	}
	for ; i < n; i++ {
		out[i] += stD - stR
		stD *= decD
		stR *= decR
	}
	if g.Background > 0 {
		sb := g.Background * math.Sqrt(g.pulseVariance())
		for j := range out {
			out[j] += sb * rng.NormFloat64()
		}
	}
	return out, nil
}

func init() {
	// The registry defaults, for the invariants' values.
	mean, variance := PulseNoise{Rate: 0.05, Width: 5, Rise: 0.2, AmpSD: 0.5}.Moments()
	registerNoise(&System{
		Name:  "pulse-noise",
		Title: "Poisson pulses of random height and shape (popcorn/burst current noise)",
		Doc: "Pulses arrive as a Poisson process of rate pulses per sample; each has an exponential or log-normal height of mean 1 and a shape drawn per pulse from rectangular (random length in [width/2, 3·width/2]), Gaussian (full width width) and double exponential (decay width, rise rise·width, peak 1); an optional white background of background times the pulse part's standard deviation. Campbell's theorem gives the mean and variance. " +
			"Label: stochastic (arrival times, heights and shapes are independent random draws).",
		Params: []Param{
			{Name: "rate", Default: 0.05, Min: 1e-6, Max: 100, Doc: "pulse rate ν (pulses per sample); rate·width ≤ 1000"},
			{Name: "width", Default: 5, Min: 0.2, Max: 1e4, Doc: "pulse width W (samples)"},
			{Name: "rise", Default: 0.2, Min: 0.01, Max: 0.9, Doc: "rise time / decay time of the double-exponential pulses"},
			{Name: "amp", Default: 0, Min: 0, Max: 1, Integer: true, Doc: "amplitude law: 0 = exponential, 1 = log-normal (both of mean 1)"},
			{Name: "amp_sd", Default: 0.5, Min: 0, Max: 2, Doc: "log-standard deviation of log-normal amplitudes"},
			{Name: "background", Default: 0, Min: 0, Max: 2, Doc: "white background standard deviation relative to the pulse part's"},
		},
		Invariants: []Invariant{
			{Name: "mean", Value: mean, Unit: "", Source: "Campbell's theorem (analytic): ν E[A] E[∫g]"},
			{Name: "variance", Value: variance, Unit: "", Source: "Campbell's theorem (analytic): ν E[A²] E[∫g²] + σ_b²"},
		},
	}, func(p map[string]float64) (Generator, error) {
		g := pulseNoiseFrom(p)
		return g, g.check()
	})
}

// pulseNoiseFrom builds the generator for a full parameter set.
func pulseNoiseFrom(p map[string]float64) PulseNoise {
	return PulseNoise{Rate: p["rate"], Width: p["width"], Rise: p["rise"], Amp: int(p["amp"]), AmpSD: p["amp_sd"], Background: p["background"]}
}
