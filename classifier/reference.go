package classifier

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"sort"
	"strings"
	"sync"
	"sync/atomic"

	"tracesift/features"
	"tracesift/generators"
)

// ReferenceOptions configures the reference training set. The zero value
// selects the defaults.
type ReferenceOptions struct {
	// PerClass is the number of series drawn for each class label a plan
	// entry carries by default (default 1000). The count is split evenly
	// among the systems of that class, so a class with few systems gets
	// more series from each.
	PerClass int
	// MinLength and MaxLength bound the series lengths, drawn log-uniformly
	// (defaults 512 and 20000).
	MinLength, MaxLength int
	// NoisyFraction is the fraction of series that get Gaussian
	// observational noise (default 0.6); their SNR in dB is drawn from
	// [MinSNR, MaxSNR] (defaults 10 and 40) as MinSNR + (MaxSNR − MinSNR)·u²
	// with u uniform, so that the hard, noisy end of the range is sampled
	// more densely than the easy one (half the noisy series lie below
	// MinSNR + 0.25·(MaxSNR − MinSNR), i.e. 17.5 dB).
	NoisyFraction  float64
	MinSNR, MaxSNR float64
	// Systems restricts the set to these systems (default: every system of
	// the plan). Exclude leaves systems out, e.g. to measure how the model
	// does on systems it has never seen.
	Systems, Exclude []string
	// Seed fixes the whole set: parameters, lengths, noise and the
	// initial conditions of every series.
	Seed uint64
	// Workers is the number of series generated and measured at once
	// (default GOMAXPROCS); it never changes the result.
	Workers int
	// Progress, if set, is called after each series with the number done
	// and the total.
	Progress func(done, total int)
}

func (o ReferenceOptions) withDefaults() ReferenceOptions {
	if o.PerClass <= 0 {
		o.PerClass = 1000
	}
	if o.MinLength <= 0 {
		o.MinLength = 512
	}
	if o.MaxLength <= 0 {
		o.MaxLength = 20000
	}
	if o.NoisyFraction == 0 {
		o.NoisyFraction = 0.6
	}
	if o.MinSNR == 0 {
		o.MinSNR = 10
	}
	if o.MaxSNR == 0 {
		o.MaxSNR = 40
	}
	if o.Workers <= 0 {
		o.Workers = runtime.GOMAXPROCS(0)
	}
	return o
}

// ReferenceSeries describes one series of the reference set: enough to
// regenerate it exactly.
type ReferenceSeries struct {
	System string             `json:"system"`
	Params map[string]float64 `json:"params"`
	N      int                `json:"n"`
	SNR    float64            `json:"snr_db"` // +Inf: no observational noise
	Seed   uint64             `json:"seed"`   // PCG seed of the series' own generator
	Class  string             `json:"class"`  // label from the system's rule
}

// Generate draws the series.
func (r ReferenceSeries) Generate() ([]float64, error) {
	sys, err := generators.Lookup(r.System)
	if err != nil {
		return nil, err
	}
	rng := rand.New(rand.NewPCG(r.Seed, seriesStream))
	return sys.GenerateNoisy(r.N, r.Params, r.SNR, rng)
}

const (
	planStream   = 0x706c616e // "plan"
	seriesStream = 0x73657273 // "sers"
)

// paramSampler draws one parameter set inside a system's training regime.
type paramSampler func(rng *rand.Rand) map[string]float64

// planEntry is a system of the reference plan with the regime its
// parameters are drawn from. The label of every draw comes from the
// system's own rule (for deterministic systems, the sign of the largest
// Lyapunov exponent computed from the equations), so a draw that lands in
// a periodic window is labelled regular.
type planEntry struct {
	system string
	class  generators.Class // class the entry is counted under for balancing
	params paramSampler
}

func uni(rng *rand.Rand, lo, hi float64) float64 { return lo + (hi-lo)*rng.Float64() }
func logUni(rng *rand.Rand, lo, hi float64) float64 {
	return math.Exp(uni(rng, math.Log(lo), math.Log(hi)))
}

// referencePlan lists every reference system with its training regime.
// Sampling intervals of flows are drawn so that one characteristic
// oscillation spans roughly 8–120 samples: finer sampling makes chaos look
// smooth over short records, coarser sampling makes it look like noise.
var referencePlan = []planEntry{
	// Chaotic maps.
	{"logistic", generators.Chaotic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"r": uni(r, 3.6, 4)} }},
	{"tent", generators.Chaotic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"mu": uni(r, 1.4, 1.99999)} }},
	{"cubic", generators.Chaotic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"r": uni(r, 2.6, 3)} }},
	{"sine-map", generators.Chaotic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"r": uni(r, 0.87, 1)} }},
	{"gauss-map", generators.Chaotic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"alpha": uni(r, 5, 8), "beta": uni(r, -0.8, -0.3)}
	}},
	{"henon", generators.Chaotic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"a": uni(r, 1.05, 1.42), "b": uni(r, 0.1, 0.31)}
	}},
	{"lozi", generators.Chaotic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"a": uni(r, 1.4, 1.75), "b": uni(r, 0.2, 0.6)}
	}},
	{"ikeda", generators.Chaotic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"u": uni(r, 0.7, 0.9)} }},
	{"tinkerbell", generators.Chaotic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"a": uni(r, 0.8, 0.9), "b": uni(r, -0.6013, -0.58), "c": uni(r, 1.95, 2), "d": uni(r, 0.4, 0.5)}
	}},
	{"delayed-logistic", generators.Chaotic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"a": uni(r, 2.1, 2.27)} }},
	// Chaotic flows.
	{"lorenz", generators.Chaotic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"rho": uni(r, 26, 60), "dt": logUni(r, 0.005, 0.1)}
	}},
	{"rossler", generators.Chaotic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"c": uni(r, 5, 9), "dt": logUni(r, 0.05, 0.7)}
	}},
	{"hyper-rossler", generators.Chaotic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"dt": logUni(r, 0.05, 0.6)} }},
	{"chua", generators.Chaotic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"alpha": uni(r, 14.5, 16), "dt": logUni(r, 0.015, 0.2)}
	}},
	{"duffing", generators.Chaotic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"gamma": uni(r, 0.35, 0.6), "dt": logUni(r, 0.05, 0.6)}
	}},
	{"lorenz96", generators.Chaotic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"n": math.Round(uni(r, 6, 20)), "f": uni(r, 6, 16), "dt": logUni(r, 0.02, 0.15)}
	}},
	{"mackey-glass", generators.Chaotic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"tau": uni(r, 17, 30), "dt": logUni(r, 0.25, 3)}
	}},
	// Regular motion.
	{"logistic-periodic", generators.Regular, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"r": uni(r, 3.0, 3.56)}
	}},
	{"lorenz-periodic", generators.Regular, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"rho": uni(r, 330, 380), "dt": logUni(r, 0.005, 0.04)}
	}},
	{"rossler-periodic", generators.Regular, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"c": uni(r, 2.5, 4.2), "dt": logUni(r, 0.05, 0.7)}
	}},
	{"van-der-pol", generators.Regular, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"mu": uni(r, 0.2, 5), "dt": logUni(r, 0.025, 0.5)}
	}},
	{"sine", generators.Regular, func(r *rand.Rand) map[string]float64 {
		// The third harmonic must stay below Nyquist: period > 6 samples.
		return map[string]float64{"period": logUni(r, 7, 200), "h2": uni(r, -0.5, 0.5), "h3": uni(r, -0.3, 0.3)}
	}},
	{"two-tone", generators.Regular, func(r *rand.Rand) map[string]float64 {
		// The second tone's period, period/ratio, must exceed 2 samples.
		ratio := uni(r, 1.1, 3.3)
		return map[string]float64{"period": logUni(r, 2.5*ratio, 200), "ratio": ratio, "amp2": uni(r, 0.2, 1)}
	}},
	{"sawtooth", generators.Regular, func(r *rand.Rand) map[string]float64 { return map[string]float64{"period": logUni(r, 5, 200)} }},
	{"square", generators.Regular, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"period": logUni(r, 5, 200), "duty": uni(r, 0.1, 0.9)}
	}},
	{"noisy-sine", generators.Regular, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"period": logUni(r, 7, 200), "snr": uni(r, 15, 40)}
	}},
	// Noise.
	{"white", generators.Stochastic, func(*rand.Rand) map[string]float64 { return nil }},
	{"ar1", generators.Stochastic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"phi": uni(r, -0.9, 0.99)} }},
	{"arma21", generators.Stochastic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"r": uni(r, 0.5, 0.99), "period": logUni(r, 3, 100), "theta": uni(r, -1, 1)}
	}},
	{"bilinear", generators.Stochastic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"a": uni(r, -0.6, 0.6), "b": uni(r, -0.6, 0.6)}
	}},
	{"brownian", generators.Stochastic, func(*rand.Rand) map[string]float64 { return nil }},
	{"drift-walk", generators.Stochastic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"drift": uni(r, -0.5, 0.5)} }},
	{"fbm", generators.Stochastic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"h": uni(r, 0.1, 0.9)} }},
	{"fgn", generators.Stochastic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"h": uni(r, 0.05, 0.95)} }},
	{"garch", generators.Stochastic, func(r *rand.Rand) map[string]float64 {
		a := uni(r, 0.05, 0.3)
		return map[string]float64{"alpha": a, "beta": uni(r, 0.4, 0.97-a)}
	}},
	{"nlma", generators.Stochastic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"b": uni(r, -2, 2)} }},
	{"ou", generators.Stochastic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"tau": logUni(r, 1, 1000)} }},
	{"powerlaw", generators.Stochastic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"beta": uni(r, 0, 3)} }},
	{"shot-noise", generators.Stochastic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"rate": logUni(r, 0.01, 1), "tau": logUni(r, 0.5, 50)}
	}},
	{"student-t", generators.Stochastic, func(r *rand.Rand) map[string]float64 { return map[string]float64{"nu": logUni(r, 1, 30)} }},
	{"tar", generators.Stochastic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"phi_low": uni(r, -0.9, 0.95), "phi_high": uni(r, -0.9, 0.95), "threshold": uni(r, -1, 1)}
	}},
	{"telegraph", generators.Stochastic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"tau_up": logUni(r, 2, 500), "tau_down": logUni(r, 2, 500)}
	}},
	{"telegraph-sum", generators.Stochastic, func(r *rand.Rand) map[string]float64 {
		return map[string]float64{"k": math.Round(uni(r, 5, 50)), "tau_min": uni(r, 0.5, 5), "tau_max": logUni(r, 100, 1e5)}
	}},
}

// ReferenceSystems returns the names of the systems in the reference plan.
func ReferenceSystems() []string {
	out := make([]string, len(referencePlan))
	for i, e := range referencePlan {
		out[i] = e.system
	}
	return out
}

// ReferencePlan draws the deterministic list of series of the reference
// set: for each system, the parameters, length, noise level and seed of
// each of its series, and its label from the system's rule.
func ReferencePlan(opts ReferenceOptions) ([]ReferenceSeries, error) {
	o := opts.withDefaults()
	if o.MinLength < features.MinLength || o.MaxLength < o.MinLength {
		return nil, fmt.Errorf("%w: lengths %d..%d (the shortest measurable series is %d)", ErrConfig, o.MinLength, o.MaxLength, features.MinLength)
	}
	if o.MinSNR > o.MaxSNR || o.NoisyFraction < 0 || o.NoisyFraction > 1 {
		return nil, fmt.Errorf("%w: SNR range %g..%g dB, noisy fraction %g", ErrConfig, o.MinSNR, o.MaxSNR, o.NoisyFraction)
	}
	entries, err := selectPlan(o.Systems, o.Exclude)
	if err != nil {
		return nil, err
	}
	perClass := map[generators.Class]int{}
	for _, e := range entries {
		perClass[e.class]++
	}
	rng := rand.New(rand.NewPCG(o.Seed, planStream))
	var out []ReferenceSeries
	for _, e := range entries {
		sys, err := generators.Lookup(e.system)
		if err != nil {
			return nil, err
		}
		count := int(math.Ceil(float64(o.PerClass) / float64(perClass[e.class])))
		for k := 0; k < count; k++ {
			p := e.params(rng)
			n := int(math.Round(logUni(rng, float64(o.MinLength), float64(o.MaxLength))))
			snr := math.Inf(1)
			if rng.Float64() < o.NoisyFraction {
				u := rng.Float64()
				snr = o.MinSNR + (o.MaxSNR-o.MinSNR)*u*u
			}
			seed := rng.Uint64()
			cl, err := sys.Class(p)
			if err != nil {
				// An orbit that escapes for this draw: skip the draw,
				// deterministically, rather than guess a label.
				if errors.Is(err, generators.ErrDiverged) {
					continue
				}
				return nil, fmt.Errorf("%s %v: %w", e.system, p, err)
			}
			out = append(out, ReferenceSeries{System: e.system, Params: p, N: n, SNR: snr, Seed: seed, Class: string(cl)})
		}
	}
	return out, nil
}

func selectPlan(include, exclude []string) ([]planEntry, error) {
	known := map[string]bool{}
	for _, e := range referencePlan {
		known[e.system] = true
	}
	for _, n := range append(append([]string{}, include...), exclude...) {
		if !known[n] {
			return nil, fmt.Errorf("%w: %q is not a reference system; valid: %s", ErrConfig, n, strings.Join(ReferenceSystems(), ", "))
		}
	}
	in := map[string]bool{}
	for _, n := range include {
		in[n] = true
	}
	out := map[string]bool{}
	for _, n := range exclude {
		out[n] = true
	}
	var sel []planEntry
	for _, e := range referencePlan {
		if (len(include) == 0 || in[e.system]) && !out[e.system] {
			sel = append(sel, e)
		}
	}
	if len(sel) == 0 {
		return nil, fmt.Errorf("%w: no reference systems selected", ErrConfig)
	}
	return sel, nil
}

// BuildReference generates every series of the plan, extracts its feature
// vector and returns the labelled dataset, with Groups holding the system
// names. Series are processed in parallel and placed by index, so the
// dataset is identical for any number of workers.
func BuildReference(opts ReferenceOptions, fopts features.Options) (Dataset, []ReferenceSeries, error) {
	o := opts.withDefaults()
	plan, err := ReferencePlan(o)
	if err != nil {
		return Dataset{}, nil, err
	}
	names := features.Names()
	ds := Dataset{
		Features: names,
		X:        make([][]float64, len(plan)),
		Y:        make([]string, len(plan)),
		Groups:   make([]string, len(plan)),
	}
	errs := make([]error, len(plan))
	var next, done atomic.Int64
	var wg sync.WaitGroup
	fo := fopts
	fo.Sequential = true // parallel across series instead
	for w := 0; w < o.Workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				i := int(next.Add(1) - 1)
				if i >= len(plan) {
					return
				}
				s := plan[i]
				x, err := s.Generate()
				if err == nil {
					var v features.Vector
					v, err = features.Extract(x, fo)
					ds.X[i] = v.Values
				}
				if err != nil {
					errs[i] = fmt.Errorf("reference series %d (%s, n=%d): %w", i, s.System, s.N, err)
				}
				ds.Y[i] = s.Class
				ds.Groups[i] = s.System
				d := int(done.Add(1))
				if o.Progress != nil {
					o.Progress(d, len(plan))
				}
			}
		}()
	}
	wg.Wait()
	// A series whose orbit escaped or settled on a fixed point for its draw is
	// dropped (deterministically: the same seed drops the same series);
	// any other failure is a bug and stops the build.
	kept := ds.Subset(nil)
	var keptPlan []ReferenceSeries
	for i, err := range errs {
		if err != nil {
			if errors.Is(err, generators.ErrDiverged) || errors.Is(err, generators.ErrConstant) || errors.Is(err, features.ErrConstant) {
				continue
			}
			return Dataset{}, nil, err
		}
		kept.X = append(kept.X, ds.X[i])
		kept.Y = append(kept.Y, ds.Y[i])
		kept.Groups = append(kept.Groups, ds.Groups[i])
		keptPlan = append(keptPlan, plan[i])
	}
	kept.Description = describeReference(o, keptPlan)
	if dropped := len(plan) - len(keptPlan); dropped > 0 {
		kept.Description += fmt.Sprintf("; %d draws dropped (orbit escaped or constant)", dropped)
	}
	return kept, keptPlan, nil
}

func describeReference(o ReferenceOptions, plan []ReferenceSeries) string {
	count := map[string]int{}
	systems := map[string]bool{}
	for _, s := range plan {
		count[s.Class]++
		systems[s.System] = true
	}
	classes := make([]string, 0, len(count))
	for c := range count {
		classes = append(classes, c)
	}
	sort.Strings(classes)
	var parts []string
	for _, c := range classes {
		parts = append(parts, fmt.Sprintf("%d %s", count[c], c))
	}
	return fmt.Sprintf("reference set (seed %d): %d series from %d systems (%s); lengths %d–%d log-uniform; %.0f%% with observational noise at %g–%g dB SNR, denser at the noisy end",
		o.Seed, len(plan), len(systems), strings.Join(parts, ", "), o.MinLength, o.MaxLength, 100*o.NoisyFraction, o.MinSNR, o.MaxSNR)
}
