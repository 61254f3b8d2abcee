package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// VarianceEnvelope selects the standard-deviation envelope of VaryingVariance.
type VarianceEnvelope int

// The envelopes; the numbers are the registry's "envelope" values.
const (
	// EnvelopeRandom: e_t is a unit-variance Ornstein–Uhlenbeck process of
	// relaxation time Tau samples (OU, exact update, stationary start).
	EnvelopeRandom VarianceEnvelope = iota
	// EnvelopeRamp: e_t runs linearly from −1 to 1 across the record, or
	// from 1 to −1 (a fair coin).
	EnvelopeRamp
	// EnvelopeSine: e_t = sin(2πt/Period + θ), θ uniform on [0, 2π).
	EnvelopeSine
	numEnvelopes
)

// VaryingVariance is heteroscedastic Gaussian noise
//
//	x_t = σ_t y_t,   σ_t = exp(Depth · e_t),
//
// where y is a unit-variance AR(1) with coefficient Phi (white for Phi = 0;
// AR1 scaled by √(1 − φ²)) and e_t a slow envelope (Envelope): the
// standard deviation wanders by a factor up to e^{±Depth}. The series is
// non-stationary for the deterministic envelopes; for the random one it
// is stationary with E[x²] = E[σ_t²] = exp(2 Depth²) (log-normal moment,
// analytic). Conditionally on the envelope, x_t/σ_t is exactly the AR(1).
type VaryingVariance struct {
	Envelope VarianceEnvelope
	Depth    float64 // log-sd amplitude, ≥ 0
	Tau      float64 // EnvelopeRandom: relaxation time (samples), > 0
	Period   float64 // EnvelopeSine: period (samples), > 0
	Phi      float64 // AR(1) colour of y, |Phi| < 1
}

// Path returns n samples of x and of the standard deviation σ_t. The
// envelope is drawn first, then y.
func (g VaryingVariance) Path(n int, rng *rand.Rand) (x, sd []float64, err error) {
	if err := checkN(n); err != nil {
		return nil, nil, err
	}
	if !(g.Depth >= 0 && math.Abs(g.Phi) < 1) || math.IsInf(g.Depth, 0) {
		return nil, nil, fmt.Errorf("varying-variance: depth = %g, phi = %g, want depth ≥ 0 finite and |phi| < 1", g.Depth, g.Phi)
	}
	switch g.Envelope {
	case EnvelopeRandom:
		sd, err = OU{Tau: g.Tau, S: 1, Dt: 1}.Generate(n, rng)
		if err != nil {
			return nil, nil, fmt.Errorf("varying-variance: envelope: %w", err)
		}
	case EnvelopeRamp:
		sd = make([]float64, n)
		dir := 1.0
		if rng.IntN(2) == 0 {
			dir = -1
		}
		for t := range sd {
			if n > 1 {
				sd[t] = dir * (2*float64(t)/float64(n-1) - 1)
			}
		}
	case EnvelopeSine:
		if !(g.Period > 0) || math.IsInf(g.Period, 0) {
			return nil, nil, fmt.Errorf("varying-variance: period = %g, want period > 0", g.Period)
		}
		sd = make([]float64, n)
		theta := 2 * math.Pi * rng.Float64()
		for t := range sd {
			sd[t] = math.Sin(2*math.Pi*float64(t)/g.Period + theta)
		}
	default:
		return nil, nil, fmt.Errorf("varying-variance: envelope %d, want 0..%d", int(g.Envelope), int(numEnvelopes)-1)
	}
	for t, e := range sd {
		sd[t] = math.Exp(g.Depth * e)
	}
	x, err = AR1{Phi: g.Phi}.Generate(n, rng)
	if err != nil {
		return nil, nil, fmt.Errorf("varying-variance: %w", err)
	}
	scale := math.Sqrt(1 - g.Phi*g.Phi)
	for t := range x {
		x[t] *= scale * sd[t]
	}
	return x, sd, nil
}

// Generate returns n samples.
func (g VaryingVariance) Generate(n int, rng *rand.Rand) ([]float64, error) {
	x, _, err := g.Path(n, rng)
	return x, err
}

func init() {
	registerNoise(&System{
		Name:  "varying-variance",
		Title: "Gaussian noise with a slowly varying standard deviation",
		Doc:   "x = exp(depth e_t) y_t with y a unit-variance AR(1) (phi; 0 white) and e_t a slow envelope: 0 random (unit OU, relaxation tau), 1 linear ramp across the record, 2 sine of the given period; heteroscedastic, non-stationary. Label: stochastic.",
		Params: []Param{
			{Name: "envelope", Default: 0, Min: 0, Max: float64(numEnvelopes - 1), Integer: true, Doc: "envelope: 0 random (OU), 1 ramp, 2 sine"},
			{Name: "depth", Default: 1, Min: 0, Max: 3, Doc: "log-sd amplitude (sd varies within e^±depth)"},
			{Name: "tau", Default: 1000, Min: 10, Max: 1e6, Doc: "random envelope relaxation time (samples)"},
			{Name: "period", Default: 2000, Min: 20, Max: 1e7, Doc: "sine envelope period (samples)"},
			{Name: "phi", Default: 0, Min: -0.9, Max: 0.99, Doc: "AR(1) colour φ of the carrier noise"},
		},
		Invariants: []Invariant{
			{Name: "variance", Value: math.Exp(2), Unit: "", Source: "log-normal moment (analytic): exp(2 depth²) for the random envelope"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return VaryingVariance{Envelope: VarianceEnvelope(p["envelope"]), Depth: p["depth"], Tau: p["tau"], Period: p["period"], Phi: p["phi"]}, nil
	})
}
