package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// FM is a frequency-modulated carrier,
//
//	x_t = cos(2πt/P + β·sin(2πt/P_m + φ_m) + φ_c),
//
// carrier period P = Period, modulation period P_m = ModPeriod, index β,
// phases φ_c, φ_m uniform in [0, 2π) from the rng. By the Jacobi–Anger
// expansion x_t = Σ_n J_n(β)·cos(2πt(1/P + n/P_m) + φ_c + nφ_m): lines at
// the carrier and its sidebands f_c + n·f_m with amplitudes |J_n(β)|
// (Bessel functions of the first kind; analytic). Periodic when P/P_m is
// rational, quasi-periodic (a 2-torus) otherwise. Carson's rule puts 98% of
// the power within f_c ± (β + 1)·f_m (Carson, Proc. IRE 10 (1922) 57
// (memory)); that band must lie below the Nyquist frequency.
type FM struct {
	Period    float64 // carrier period in samples, ≥ 2
	ModPeriod float64 // modulation period in samples, ≥ 2
	Index     float64 // modulation index β ≥ 0
}

// Generate returns n samples.
func (s FM) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := checkCarrier("fm", s.Period, s.ModPeriod); err != nil {
		return nil, err
	}
	if !(s.Index >= 0) || math.IsInf(s.Index, 0) {
		return nil, fmt.Errorf("fm: %w: index = %g, want a finite index ≥ 0", ErrParamRange, s.Index)
	}
	if top := 1/s.Period + (s.Index+1)/s.ModPeriod; top >= 0.5 {
		return nil, fmt.Errorf("fm: %w: Carson band reaches %g cycles per sample (1/period + (index+1)/mod_period), want below the Nyquist frequency ½", ErrParamRange, top)
	}
	pc, pm := rng.Float64(), rng.Float64()
	out := make([]float64, n)
	for t := range out {
		out[t] = math.Cos(2*math.Pi*turns(t, s.Period, pc) + s.Index*math.Sin(2*math.Pi*turns(t, s.ModPeriod, pm)))
	}
	return out, nil
}

// AM is an amplitude-modulated carrier,
//
//	x_t = (1 + m·cos(2πt/P_m + φ_m))·cos(2πt/P + φ_c),
//
// with depth m = Depth in [0, 1] and random phases. The product expands to
// the carrier plus two sidebands at f_c ± f_m, each of amplitude m/2
// relative to the carrier (analytic). Both sidebands must lie below the
// Nyquist frequency.
type AM struct {
	Period    float64 // carrier period in samples, ≥ 2
	ModPeriod float64 // modulation period in samples, ≥ 2
	Depth     float64 // modulation depth m, 0 ≤ m ≤ 1
}

// Generate returns n samples.
func (s AM) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := checkCarrier("am", s.Period, s.ModPeriod); err != nil {
		return nil, err
	}
	if !(s.Depth >= 0 && s.Depth <= 1) {
		return nil, fmt.Errorf("am: %w: depth = %g, want 0 ≤ depth ≤ 1", ErrParamRange, s.Depth)
	}
	if top := 1/s.Period + 1/s.ModPeriod; top >= 0.5 {
		return nil, fmt.Errorf("am: %w: upper sideband at %g cycles per sample (1/period + 1/mod_period), want below the Nyquist frequency ½", ErrParamRange, top)
	}
	pc, pm := rng.Float64(), rng.Float64()
	out := make([]float64, n)
	for t := range out {
		out[t] = (1 + s.Depth*math.Cos(2*math.Pi*turns(t, s.ModPeriod, pm))) * math.Cos(2*math.Pi*turns(t, s.Period, pc))
	}
	return out, nil
}

// checkCarrier validates the two periods of a modulated carrier.
func checkCarrier(name string, period, modPeriod float64) error {
	if !(period >= 2) || !(modPeriod >= 2) || math.IsInf(period+modPeriod, 0) {
		return fmt.Errorf("%s: %w: period = %g, mod_period = %g, want finite periods ≥ 2 samples", name, ErrParamRange, period, modPeriod)
	}
	return nil
}

func init() {
	carrier := func(mod float64) []Param {
		return []Param{
			{Name: "period", Default: 10, Min: 2, Max: 1e9, Doc: "carrier period (samples)"},
			{Name: "mod_period", Default: mod, Min: 2, Max: 1e9, Doc: "modulation period (samples)"},
		}
	}
	registerSignal(&System{
		Name:  "fm",
		Title: "frequency-modulated carrier cos(2πt/period + index sin(2πt/mod_period))",
		Doc:   "Random carrier and modulation phases. Lines at 1/period + n/mod_period with amplitudes |J_n(index)| (Jacobi-Anger expansion); quasi-periodic when period/mod_period is irrational (the default ratio is 10/(100 golden mean)). Carson's band 1/period + (index+1)/mod_period must stay below ½ cycle per sample. Label: regular.",
		Params: append(carrier(100*GoldenMean),
			Param{Name: "index", Default: 3, Min: 0, Max: 10, Doc: "modulation index β (peak phase deviation, radians)"}),
		Invariants: []Invariant{
			{Name: "carrier_line", Value: math.J0(3), Unit: "amplitude J_0(index), index = 3", Source: "analytic: Jacobi-Anger expansion"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return FM{Period: p["period"], ModPeriod: p["mod_period"], Index: p["index"]}, nil
	})
	registerSignal(&System{
		Name:  "am",
		Title: "amplitude-modulated carrier (1 + depth cos(2πt/mod_period)) cos(2πt/period)",
		Doc:   "Random carrier and modulation phases. Carrier line of amplitude 1 and two sidebands at 1/period ± 1/mod_period of amplitude depth/2; quasi-periodic when period/mod_period is irrational. The upper sideband must stay below ½ cycle per sample. Label: regular.",
		Params: append(carrier(100*GoldenMean),
			Param{Name: "depth", Default: 0.5, Min: 0, Max: 1, Doc: "modulation depth m"}),
		Invariants: []Invariant{
			{Name: "sideband_ratio", Value: 0.25, Unit: "sideband/carrier amplitude, depth = 0.5", Source: "analytic: product-to-sum expansion, m/2"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return AM{Period: p["period"], ModPeriod: p["mod_period"], Depth: p["depth"]}, nil
	})
}
