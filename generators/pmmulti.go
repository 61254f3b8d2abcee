package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// PMMulti is a carrier phase-modulated by two or three tones,
//
//	u_t = cos(2πt/P + φ_c + Σ_k β_k·sin(2πt/P_k + φ_k)),  k = 1..len(ModPeriods),
//
// carrier period P = Period, tone periods P_k = ModPeriods[k], indices β_k
// = Indices[k], phases φ uniform in [0, 2π) from the rng, observed as
// x_t = u_t (Gain = 0) or through the soft limiter x_t = tanh(g·u_t)/tanh(g)
// (Gain = g > 0). By the Jacobi–Anger expansion, applied to each tone,
//
//	u_t = Σ_{n_1..n_m} Π_k J_{n_k}(β_k) · cos(2πt(1/P + Σ_k n_k/P_k) + φ_c + Σ_k n_k φ_k),
//
// lines at the carrier and its combination sidebands f_c + Σ n_k f_k with
// amplitudes Π_k |J_{n_k}(β_k)| (Bessel functions of the first kind;
// analytic); the carrier line is Π_k J_0(β_k). With incommensurate
// periods the motion is quasi-periodic on a torus of dimension 1 + m
// (regular); the limiter, an odd function, adds the odd combination
// harmonics and keeps the lines on the same lattice. The band holding
// nearly all the power, 1/P + Σ_k (β_k + 1)/P_k (Carson's rule per tone,
// Carson, Proc. IRE 10 (1922) 57 (memory)), must lie below the Nyquist
// frequency; the limiter's harmonics may alias, which keeps the signal
// quasi-periodic.
type PMMulti struct {
	Period     float64   // carrier period (samples), ≥ 2
	ModPeriods []float64 // tone periods (samples), each ≥ 2; 2 or 3 tones
	Indices    []float64 // modulation indices β_k ≥ 0, one per tone
	Gain       float64   // limiter gain g ≥ 0 (0: no limiter)
}

func (s PMMulti) check() error {
	m := len(s.ModPeriods)
	if m < 2 || m > 3 || len(s.Indices) != m {
		return fmt.Errorf("pm-multi: %w: %d tone periods and %d indices, want the same number, 2 or 3", ErrParamRange, m, len(s.Indices))
	}
	if !(s.Period >= 2) || math.IsInf(s.Period, 0) || !(s.Gain >= 0) || math.IsInf(s.Gain, 0) {
		return fmt.Errorf("pm-multi: %w: period = %g, gain = %g, want a finite period ≥ 2 and a finite gain ≥ 0", ErrParamRange, s.Period, s.Gain)
	}
	top := 1 / s.Period
	for k, p := range s.ModPeriods {
		b := s.Indices[k]
		if !(p >= 2) || math.IsInf(p, 0) || !(b >= 0) || math.IsInf(b, 0) {
			return fmt.Errorf("pm-multi: %w: mod_period%d = %g, index%d = %g, want a finite period ≥ 2 and a finite index ≥ 0", ErrParamRange, k+1, p, k+1, b)
		}
		top += (b + 1) / p
	}
	if top >= 0.5 {
		return fmt.Errorf("pm-multi: %w: Carson band reaches %g cycles per sample (1/period + Σ (index_k+1)/mod_period_k), want below the Nyquist frequency ½", ErrParamRange, top)
	}
	return nil
}

// Generate returns n samples.
func (s PMMulti) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := s.check(); err != nil {
		return nil, err
	}
	pc := rng.Float64()
	ph := make([]float64, len(s.ModPeriods))
	for k := range ph {
		ph[k] = rng.Float64()
	}
	var norm float64
	if s.Gain > 0 {
		norm = 1 / math.Tanh(s.Gain)
	}
	out := make([]float64, n)
	for t := range out {
		a := 2 * math.Pi * turns(t, s.Period, pc)
		for k, p := range s.ModPeriods {
			a += s.Indices[k] * math.Sin(2*math.Pi*turns(t, p, ph[k]))
		}
		u := math.Cos(a)
		if s.Gain > 0 {
			u = math.Tanh(s.Gain*u) * norm
		}
		out[t] = u
	}
	return out, nil
}

// pmMultiFrom builds the generator for a full parameter set.
func pmMultiFrom(p map[string]float64) PMMulti {
	m := int(p["tones"])
	g := PMMulti{Period: p["period"], Gain: p["gain"]}
	for k := 1; k <= m; k++ {
		g.ModPeriods = append(g.ModPeriods, p[fmt.Sprintf("mod_period%d", k)])
		g.Indices = append(g.Indices, p[fmt.Sprintf("index%d", k)])
	}
	return g
}

func init() {
	registerSignal(&System{
		Name:  "pm-multi",
		Title: "carrier phase-modulated by 2-3 tones cos(2πt/period + Σ index_k sin(2πt/mod_period_k)), optional soft limiter",
		Doc: "Random carrier and tone phases. Lines at 1/period + Σ n_k/mod_period_k with amplitudes Π |J_{n_k}(index_k)| (Jacobi-Anger expansion per tone); quasi-periodic on a torus of dimension 1 + tones when the periods are incommensurate (the defaults use the golden mean, √2 and π). gain > 0 passes the signal through tanh(gain·x)/tanh(gain). The band 1/period + Σ (index_k+1)/mod_period_k must stay below ½ cycle per sample. Tones beyond the count tones are ignored. " +
			"Label: regular.",
		Params: []Param{
			{Name: "period", Default: 10, Min: 2, Max: 1e9, Doc: "carrier period (samples)"},
			{Name: "tones", Default: 2, Min: 2, Max: 3, Integer: true, Doc: "number of modulating tones"},
			{Name: "mod_period1", Default: 100 * GoldenMean, Min: 2, Max: 1e9, Doc: "period of tone 1 (samples)"},
			{Name: "mod_period2", Default: 70 * math.Sqrt2, Min: 2, Max: 1e9, Doc: "period of tone 2 (samples)"},
			{Name: "mod_period3", Default: 37 * math.Pi, Min: 2, Max: 1e9, Doc: "period of tone 3 (samples, used when tones = 3)"},
			{Name: "index1", Default: 2, Min: 0, Max: 10, Doc: "modulation index β_1 (radians)"},
			{Name: "index2", Default: 1, Min: 0, Max: 10, Doc: "modulation index β_2 (radians)"},
			{Name: "index3", Default: 0.5, Min: 0, Max: 10, Doc: "modulation index β_3 (radians, used when tones = 3)"},
			{Name: "gain", Default: 0, Min: 0, Max: 5, Doc: "soft-limiter gain g (0: none)"},
		},
		Invariants: []Invariant{
			{Name: "carrier_line", Value: math.J0(2) * math.J0(1), Unit: "amplitude J_0(index1)·J_0(index2), defaults", Source: "analytic: Jacobi-Anger expansion per tone"},
		},
	}, func(p map[string]float64) (Generator, error) {
		g := pmMultiFrom(p)
		return g, g.check()
	})
}
