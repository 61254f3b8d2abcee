package generators

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
)

// Recording is the measurement chain between a system's output and the
// recorded trace: what an instrument does to a signal before anyone
// analyses it. Apply runs the stages in this order, each one optional:
//
//  1. observation function g applied to the standardised clean series z
//     (a sensor's nonlinear transfer curve: polynomial, saturating,
//     exponential or rectifying);
//  2. instrument bandwidth: a first-order low-pass y_t = a·y_{t−1} +
//     (1 − a)·x_t, a = e^{−1/τ}, with time constant τ in input samples;
//  3. sampling: keep every Decimate-th sample;
//  4. additive measurement noise at SNR dB relative to the variance of the
//     signal after stages 1–3: white Gaussian, coloured (AR(1) with
//     coefficient φ), flicker (Gaussian 1/f^β, by spectral synthesis) or
//     heavy-tailed (Student t with ν degrees of freedom, scaled to the same
//     variance);
//  5. slow drift of total size Drift signal standard deviations over the
//     record: a linear ramp, or a smooth random excursion (a Brownian path
//     low-passed to a few wiggles per record);
//  6. an analog-to-digital converter with Levels codes (rounding to the
//     nearest code): the signal occupies a fraction Span of the full scale
//     when Span ≤ 1 (placed at random inside it), and when Clip > 0 the
//     full scale is narrower than the signal so that a fraction Clip of the
//     samples piles at each rail;
//  7. gain and offset (units and the DC operating point, e.g. amperes).
//
// The stages model the measurement, not the system: a series keeps its
// system's class label. DESIGN.md counts chaos seen through moderate noise
// as chaotic and regular motion with small noise as regular, so callers
// keep the SNR moderate (≥ 10 dB, common practice) and drifts slow. A
// monotone or smooth function of a deterministic orbit is still a
// deterministic observable (Takens, Lecture Notes in Math. 898 (1981) 366),
// a filtered chaotic signal is still chaotic (Badii et al., Phys. Rev. Lett.
// 60 (1988) 979), and a function of noise is noise.
//
// Apply works in units of the clean series: stage 1 standardises it to
// zero mean and unit variance, so the zero value returns the standardised
// series (Gain 0 is taken as 1).
type Recording struct {
	Observe      Observation `json:"observe,omitempty"`
	ObserveParam float64     `json:"observe_param,omitempty"`
	// LowPass is the time constant τ of the first-order low-pass in input
	// samples; 0 means no filter.
	LowPass float64 `json:"low_pass,omitempty"`
	// Decimate keeps every k-th sample; 0 or 1 keeps all. Apply returns
	// ⌊len(x)/k⌋ samples, so callers generate k times the length they want.
	Decimate int `json:"decimate,omitempty"`
	// Noise is the kind of additive measurement noise (NoiseNone: none);
	// SNR its signal-to-noise ratio in dB; NoiseParam the AR(1)
	// coefficient φ for NoiseColoured, the spectral exponent β for
	// NoiseFlicker, or the degrees of freedom ν > 2 for NoiseHeavy.
	Noise      NoiseKind `json:"noise,omitempty"`
	SNR        float64   `json:"snr_db,omitempty"`
	NoiseParam float64   `json:"noise_param,omitempty"`
	// Drift is the size of the slow drift in signal standard deviations
	// (0: none), of kind DriftKind.
	Drift     float64   `json:"drift,omitempty"`
	DriftKind DriftKind `json:"drift_kind,omitempty"`
	// Levels is the number of ADC codes (0: no quantisation; otherwise at
	// least 2). Span in (0, 1] is the fraction of the full scale the
	// signal's range occupies (0 means 1) and Position in [0, 1] where the
	// signal sits inside the spare range; Clip in [0, 0.2] is the fraction
	// of samples clipped at each rail (0: none; Span is then ignored).
	Levels   int     `json:"levels,omitempty"`
	Span     float64 `json:"span,omitempty"`
	Position float64 `json:"position,omitempty"`
	Clip     float64 `json:"clip,omitempty"`
	// Gain and Offset map the result to the recorded unit: y·Gain + Offset
	// (Gain 0 means 1).
	Gain   float64 `json:"gain,omitempty"`
	Offset float64 `json:"offset,omitempty"`
}

// Observation is the sensor's transfer curve g of stage 1 of Recording,
// applied to the standardised series z with parameter c.
type Observation string

// Observation functions.
const (
	ObserveIdentity Observation = ""        // g(z) = z
	ObservePoly     Observation = "poly"    // g(z) = z + c·z² (c ∈ [−1, 1]: a bent, possibly folded curve)
	ObserveTanh     Observation = "tanh"    // g(z) = tanh(c·z) (c > 0: saturation)
	ObserveExp      Observation = "exp"     // g(z) = exp(c·z) (c ∈ (0, 2]: skews towards large values, e.g. an exponential I–V curve)
	ObserveAbs      Observation = "abs"     // g(z) = |z + c| (rectification around −c)
	ObserveCubic    Observation = "cubic"   // g(z) = z + c·z³ (c ∈ [−0.3, 1]: symmetric compression or expansion)
	ObserveSquare   Observation = "square"  // g(z) = (z + c)² (square-law detector)
	ObserveLog      Observation = "log"     // g(z) = ln(z − min z + c) (c > 0: logarithmic amplifier)
	ObserveSigmoid  Observation = "sigmoid" // g(z) = 1/(1 + e^{−c·z}) (c > 0: logistic saturation)
)

// NoiseKind is the kind of additive measurement noise of Recording.
type NoiseKind string

// Measurement noise kinds.
const (
	NoiseNone     NoiseKind = ""
	NoiseWhite    NoiseKind = "white"    // i.i.d. Gaussian
	NoiseColoured NoiseKind = "coloured" // AR(1) Gaussian with coefficient φ
	NoiseHeavy    NoiseKind = "heavy"    // i.i.d. Student t with ν > 2 degrees of freedom
	NoiseFlicker  NoiseKind = "flicker"  // Gaussian 1/f^β noise, 0 < β ≤ 2 (the flicker floor of low-current recordings)
)

// DriftKind is the shape of the slow drift of Recording.
type DriftKind string

// Drift shapes.
const (
	DriftLinear DriftKind = ""       // linear ramp across the record
	DriftWander DriftKind = "wander" // smooth random excursion
)

// ErrRecording reports an invalid Recording.
var ErrRecording = errors.New("invalid recording chain")

// Validate checks the fields of r against their documented domains.
func (r Recording) Validate() error {
	bad := func(format string, a ...any) error {
		return fmt.Errorf("%w: %s", ErrRecording, fmt.Sprintf(format, a...))
	}
	c := r.ObserveParam
	switch r.Observe {
	case ObserveIdentity:
	case ObservePoly:
		if !(c >= -1 && c <= 1) {
			return bad("poly observation c = %g, want −1 ≤ c ≤ 1", c)
		}
	case ObserveTanh, ObserveSigmoid:
		if !(c > 0 && c <= 10) {
			return bad("%s observation c = %g, want 0 < c ≤ 10", r.Observe, c)
		}
	case ObserveExp:
		if !(c > 0 && c <= 2) {
			return bad("exp observation c = %g, want 0 < c ≤ 2", c)
		}
	case ObserveAbs, ObserveSquare:
		if !(c >= -3 && c <= 3) {
			return bad("%s observation c = %g, want −3 ≤ c ≤ 3", r.Observe, c)
		}
	case ObserveCubic:
		if !(c >= -0.3 && c <= 1) {
			return bad("cubic observation c = %g, want −0.3 ≤ c ≤ 1", c)
		}
	case ObserveLog:
		if !(c > 0 && c <= 10) {
			return bad("log observation c = %g, want 0 < c ≤ 10", c)
		}
	default:
		return bad("unknown observation %q", r.Observe)
	}
	if !(r.LowPass >= 0 && r.LowPass <= 1e6) {
		return bad("low-pass time constant %g, want 0 ≤ τ ≤ 10^6 samples", r.LowPass)
	}
	if r.Decimate < 0 {
		return bad("decimation %d, want ≥ 0", r.Decimate)
	}
	switch r.Noise {
	case NoiseNone:
	case NoiseWhite:
	case NoiseColoured:
		if !(math.Abs(r.NoiseParam) < 1) {
			return bad("coloured noise φ = %g, want |φ| < 1", r.NoiseParam)
		}
	case NoiseFlicker:
		if !(r.NoiseParam > 0 && r.NoiseParam <= 2) {
			return bad("flicker noise β = %g, want 0 < β ≤ 2", r.NoiseParam)
		}
	case NoiseHeavy:
		if !(r.NoiseParam > 2 && r.NoiseParam <= 1e6) {
			return bad("heavy-tailed noise ν = %g, want ν > 2 (finite variance)", r.NoiseParam)
		}
	default:
		return bad("unknown noise kind %q", r.Noise)
	}
	if r.Noise != NoiseNone && (math.IsNaN(r.SNR) || math.IsInf(r.SNR, 0)) {
		return bad("SNR %g dB, want a finite number with measurement noise", r.SNR)
	}
	if !(r.Drift >= 0 && r.Drift <= 100) {
		return bad("drift %g, want 0 ≤ drift ≤ 100 signal standard deviations", r.Drift)
	}
	if r.DriftKind != DriftLinear && r.DriftKind != DriftWander {
		return bad("unknown drift kind %q", r.DriftKind)
	}
	if r.Levels != 0 && (r.Levels < 2 || r.Levels > 1<<24) {
		return bad("%d ADC levels, want 0 (none) or 2 … 2^24", r.Levels)
	}
	if !(r.Span >= 0 && r.Span <= 1) || !(r.Position >= 0 && r.Position <= 1) {
		return bad("ADC span %g and position %g, want both in [0, 1]", r.Span, r.Position)
	}
	if !(r.Clip >= 0 && r.Clip <= 0.2) {
		return bad("clipped fraction %g per rail, want 0 ≤ clip ≤ 0.2", r.Clip)
	}
	if math.IsNaN(r.Gain) || math.IsInf(r.Gain, 0) || math.IsNaN(r.Offset) || math.IsInf(r.Offset, 0) {
		return bad("gain %g, offset %g, want finite numbers", r.Gain, r.Offset)
	}
	return nil
}

// Apply records x through the chain (see Recording) and returns a new
// series; x is not modified. Random stages (noise, wandering drift) draw
// from rng, so the same x, r and generator state give the same trace. The
// error wraps ErrRecording for an invalid chain and ErrConstant when x (or
// the signal before the noise) does not vary.
func (r Recording) Apply(x []float64, rng *rand.Rand) ([]float64, error) {
	if err := r.Validate(); err != nil {
		return nil, err
	}
	k := max(r.Decimate, 1)
	if len(x) < k {
		return nil, fmt.Errorf("%w: %d samples cannot be decimated by %d", ErrRecording, len(x), k)
	}
	mean, sd := recMeanSD(x)
	if !(sd > 0) {
		return nil, fmt.Errorf("recording: %w", ErrConstant)
	}
	y := make([]float64, len(x))
	for i, v := range x {
		y[i] = (v - mean) / sd
	}
	r.observe(y)
	if r.LowPass > 0 {
		a := math.Exp(-1 / r.LowPass)
		acc := y[0]
		for i, v := range y {
			acc = a*acc + (1-a)*v
			y[i] = acc
		}
	}
	if k > 1 {
		m := len(y) / k
		for i := 0; i < m; i++ {
			y[i] = y[i*k]
		}
		y = y[:m]
	}
	_, sd = recMeanSD(y)
	if !(sd > 0) || math.IsInf(sd, 0) || math.IsNaN(sd) {
		return nil, fmt.Errorf("recording: the observed signal %w", ErrConstant)
	}
	if r.Noise != NoiseNone {
		if err := r.addNoise(y, sd*math.Pow(10, -r.SNR/20), rng); err != nil {
			return nil, err
		}
	}
	if r.Drift > 0 {
		r.addDrift(y, r.Drift*sd, rng)
	}
	if r.Levels > 0 {
		r.quantise(y)
	}
	gain := r.Gain
	if gain == 0 {
		gain = 1
	}
	for i := range y {
		y[i] = y[i]*gain + r.Offset
	}
	return y, nil
}

// observe applies the observation function to the standardised series z
// in place.
func (r Recording) observe(z []float64) {
	c := r.ObserveParam
	var g func(float64) float64
	switch r.Observe {
	case ObservePoly:
		g = func(v float64) float64 { return v + c*v*v }
	case ObserveTanh:
		g = func(v float64) float64 { return math.Tanh(c * v) }
	case ObserveExp:
		g = func(v float64) float64 { return math.Exp(c * v) }
	case ObserveAbs:
		g = func(v float64) float64 { return math.Abs(v + c) }
	case ObserveCubic:
		g = func(v float64) float64 { return v + c*v*v*v }
	case ObserveSquare:
		g = func(v float64) float64 { return (v + c) * (v + c) }
	case ObserveSigmoid:
		g = func(v float64) float64 { return 1 / (1 + math.Exp(-c*v)) }
	case ObserveLog:
		lo := slices.Min(z)
		g = func(v float64) float64 { return math.Log(v - lo + c) }
	default:
		return
	}
	for i, v := range z {
		z[i] = g(v)
	}
}

// addNoise adds measurement noise of standard deviation s to y.
func (r Recording) addNoise(y []float64, s float64, rng *rand.Rand) error {
	switch r.Noise {
	case NoiseFlicker:
		e, err := PowerLaw{Beta: r.NoiseParam}.Generate(len(y), rng)
		if err != nil {
			return fmt.Errorf("recording: %w", err)
		}
		_, es := recMeanSD(e)
		for i := range y {
			y[i] += s * e[i] / es
		}
	case NoiseWhite:
		for i := range y {
			y[i] += s * rng.NormFloat64()
		}
	case NoiseColoured:
		phi := r.NoiseParam
		inn := s * math.Sqrt(1-phi*phi) // stationary sd s
		e := s * rng.NormFloat64()
		for i := range y {
			y[i] += e
			e = phi*e + inn*rng.NormFloat64()
		}
	case NoiseHeavy:
		// Student t: N(0,1)/√(χ²_ν/ν), variance ν/(ν−2), rescaled to s².
		nu := r.NoiseParam
		scale := s * math.Sqrt((nu-2)/nu)
		for i := range y {
			y[i] += scale * rng.NormFloat64() / math.Sqrt(2*gammaRand(nu/2, rng)/nu)
		}
	}
	return nil
}

// addDrift adds a slow drift of total size d (peak to peak) to y.
func (r Recording) addDrift(y []float64, d float64, rng *rand.Rand) {
	n := len(y)
	if n < 2 {
		return
	}
	if r.DriftKind == DriftLinear {
		sign := 1.0
		if rng.Float64() < 0.5 {
			sign = -1
		}
		for i := range y {
			y[i] += sign * d * (float64(i)/float64(n-1) - 0.5)
		}
		return
	}
	// A Brownian path on 8 coarse knots, joined by cosine interpolation:
	// two to four slow wiggles across the record, rescaled to peak-to-peak d.
	const knots = 8
	w := make([]float64, knots+1)
	for j := 1; j <= knots; j++ {
		w[j] = w[j-1] + rng.NormFloat64()
	}
	lo, hi := slices.Min(w), slices.Max(w)
	if !(hi > lo) {
		return
	}
	for i := range y {
		u := float64(i) / float64(n-1) * knots
		j := min(int(u), knots-1)
		f := (1 - math.Cos(math.Pi*(u-float64(j)))) / 2
		v := w[j] + f*(w[j+1]-w[j])
		y[i] += d * ((v-lo)/(hi-lo) - 0.5)
	}
}

// quantise rounds y in place to the codes of the ADC described by r.
func (r Recording) quantise(y []float64) {
	var lo, hi float64
	if r.Clip > 0 {
		s := slices.Clone(y)
		slices.Sort(s)
		n := len(s)
		i := int(math.Floor(r.Clip * float64(n)))
		lo, hi = s[min(i, n-1)], s[max(n-1-i, 0)]
		if !(hi > lo) {
			lo, hi = s[0], s[n-1]
		}
	} else {
		lo, hi = slices.Min(y), slices.Max(y)
		span := r.Span
		if span == 0 {
			span = 1
		}
		full := (hi - lo) / span
		spare := full - (hi - lo)
		lo -= r.Position * spare
		hi = lo + full
	}
	if !(hi > lo) {
		return
	}
	step := (hi - lo) / float64(r.Levels-1)
	top := float64(r.Levels - 1)
	for i, v := range y {
		c := math.Round((v - lo) / step)
		c = math.Max(0, math.Min(top, c))
		y[i] = lo + c*step
	}
}

// meanSD returns the mean and population standard deviation of x.
func recMeanSD(x []float64) (mean, sd float64) {
	for _, v := range x {
		mean += v
	}
	mean /= float64(len(x))
	var ss float64
	for _, v := range x {
		ss += (v - mean) * (v - mean)
	}
	return mean, math.Sqrt(ss / float64(len(x)))
}

// String describes the chain in a few words, e.g. "tanh(1.2) sensor,
// coloured noise 18 dB, 64-level ADC (2% clipped)"; "clean" when every
// stage is off.
func (r Recording) String() string {
	var parts []string
	if r.Observe != ObserveIdentity {
		parts = append(parts, fmt.Sprintf("%s(%.3g) sensor", r.Observe, r.ObserveParam))
	}
	if r.LowPass > 0 {
		parts = append(parts, fmt.Sprintf("low-pass τ=%.3g", r.LowPass))
	}
	if r.Decimate > 1 {
		parts = append(parts, fmt.Sprintf("every %dth sample", r.Decimate))
	}
	if r.Noise != NoiseNone {
		parts = append(parts, fmt.Sprintf("%s noise %.3g dB", r.Noise, r.SNR))
	}
	if r.Drift > 0 {
		kind := "linear"
		if r.DriftKind == DriftWander {
			kind = "wandering"
		}
		parts = append(parts, fmt.Sprintf("%s drift %.2g sd", kind, r.Drift))
	}
	if r.Levels > 0 {
		s := fmt.Sprintf("%d-level ADC", r.Levels)
		if r.Clip > 0 {
			s += fmt.Sprintf(" (%.3g%% clipped per rail)", 100*r.Clip)
		}
		parts = append(parts, s)
	}
	if len(parts) == 0 {
		return "clean"
	}
	return strings.Join(parts, ", ")
}
