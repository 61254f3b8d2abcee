// Package generators produces labelled reference series from systems whose
// invariants are published: chaotic maps and flows, regular (periodic and
// quasi-periodic) signals, and the noises a device engineer meets. Every
// generator discards its transient and is deterministic for a given
// *rand.Rand (math/rand/v2); nothing reads a global generator.
//
// Two ways in: the concrete types (Logistic, Henon, Lorenz, FGN, ...) for
// library use, and the registry (Lookup, All) that maps a system name and
// "k=v" parameter settings onto them for the command line.
//
// Labels of deterministic systems are computed from their equations where
// the parameters can cross regimes: the largest Lyapunov exponent is
// integrated along an orbit with the tangent map (maps) or the variational
// equations (flows) and compared with a documented threshold
// (System.Lyapunov, System.Class). System.Class follows the orbit from a
// fixed start; System.ClassFrom labels one series, following the orbit from
// the start its generator draws, which matters where attractors coexist or
// a conservative system mixes chaotic and regular motion. Noises carry a
// fixed stochastic label and synthetic periodic waveforms a fixed regular
// label. Multi-dimensional maps and flows record the state variable chosen
// by their "obs" parameter (0, the default, is the classical observable).
package generators

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"strconv"
	"strings"
	"sync"
)

// Class is the label a reference series carries.
type Class string

// The three classes of DESIGN.md.
const (
	Chaotic    Class = "chaotic"
	Stochastic Class = "stochastic"
	Regular    Class = "regular"
)

// Time axes of System.TimeAxis.
const (
	// AxisIteration: the t column is the sample index 0, 1, ..., n−1
	// (maps and discrete-time processes; New returns dt = 1).
	AxisIteration = "iteration"
	// AxisTime: the t column is the system time k·dt of sample k (flows and
	// sampled continuous-time processes; dt comes from New).
	AxisTime = "time"
)

// Generator produces n samples of a series after discarding its transient.
// Implementations validate their parameters and return an error for values
// outside their documented domain.
type Generator interface {
	Generate(n int, rng *rand.Rand) ([]float64, error)
}

// Param documents one parameter of a registered system.
type Param struct {
	Name    string  // key used with --set name=value
	Default float64 // value used when the caller does not set it
	Min     float64 // smallest accepted value (inclusive)
	Max     float64 // largest accepted value (inclusive)
	Integer bool    // the value must be a whole number (e.g. a count)
	Doc     string  // meaning and unit
}

// Invariant is a published or analytic property of a system at its default
// parameters, with the source it comes from (see REFERENCES.md). Names follow
// the feature names of DESIGN.md where one exists (nl_div_rate, nl_gp_dim,
// sc_fluct_a1, sc_psd_beta, hv_deg_mean, ...); the Unit says whether a
// rate is per iteration, per time unit or per sample.
type Invariant struct {
	Name   string  // e.g. "nl_div_rate"
	Value  float64 // the published value; NaN when the invariant is a formula
	Unit   string  // e.g. "per iteration", "per time unit"
	Source string  // authors, journal, year; "(memory)" when recalled
}

// System is a registry entry: a named reference system with its parameters,
// label rule and invariants.
type System struct {
	Name  string
	Title string
	// Doc describes the system, its integration or synthesis method and its
	// label rule.
	Doc        string
	Params     []Param
	Invariants []Invariant
	// TimeAxis says what the t column of generated CSV holds: AxisIteration
	// for maps and discrete processes, AxisTime for flows and sampled
	// continuous processes. Times builds the column.
	TimeAxis string
	// DefaultClass is the label at the default parameters. For systems whose
	// label is computed from the equations, the package tests check that the
	// rule gives this class, so listing the systems costs no integration.
	DefaultClass Class

	// label returns the class for a full parameter set. Nil means the label
	// is computed from lyap: chaotic when λ1 > threshold, otherwise regular.
	label func(p map[string]float64) (Class, error)
	// lyap computes the Lyapunov spectrum from the equations (nil for
	// systems without equations: noises and synthetic waveforms).
	lyap func(p map[string]float64) (Spectrum, error)
	// threshold is the λ1 above which a computed label is chaotic, in the
	// unit of the spectrum.
	threshold float64
	// build returns the generator and the sample interval (in the unit of
	// TimeAxis) for a full parameter set.
	build func(p map[string]float64) (Generator, float64, error)

	// initial and lyapFrom make labels per series (ClassFrom); both are
	// optional and set together. initial draws the start of the orbit
	// from rng exactly as the generator built for p does (same draws in
	// the same order: the generator calls the same code), and lyapFrom
	// computes the label rule's spectrum (at least λ1) along the orbit
	// from that start, discarding the generator's transient. Systems
	// with lyap but without them fall back to the parameter-only label
	// of Class. registerMap and registerFlow set both.
	initial  func(p map[string]float64, rng *rand.Rand) []float64
	lyapFrom func(p map[string]float64, x0 []float64) (Spectrum, error)
}

// ErrUnknownSystem is returned by Lookup for a name that is not registered.
var ErrUnknownSystem = errors.New("unknown system")

// ErrUnknownParam is returned when a parameter name is not one of the system's.
var ErrUnknownParam = errors.New("unknown parameter")

// ErrParamRange is returned when a parameter lies outside its documented
// range or is not a whole number where one is required.
var ErrParamRange = errors.New("parameter out of range")

// ErrDiverged is returned when an orbit escapes to infinity or an
// integration stops being finite for the requested parameters.
var ErrDiverged = errors.New("orbit diverged")

// ErrConstant is returned when a series that must vary is constant, e.g. an
// orbit that settled on a fixed point when observational noise is to be set
// relative to its variance.
var ErrConstant = errors.New("constant series")

// ErrNoEquations is returned by System.Lyapunov for systems that have no
// deterministic equations (noises, synthetic waveforms).
var ErrNoEquations = errors.New("system has no deterministic equations")

var registry = map[string]*System{}

func register(s *System) {
	if _, dup := registry[s.Name]; dup {
		panic("generators: duplicate system " + s.Name)
	}
	if s.label == nil && s.lyap == nil {
		panic("generators: system " + s.Name + " has no label rule")
	}
	if (s.initial == nil) != (s.lyapFrom == nil) || (s.initial != nil && s.lyap == nil) {
		panic("generators: system " + s.Name + " sets only part of the per-series label rule")
	}
	registry[s.Name] = s
}

// All returns every registered system sorted by name.
func All() []*System {
	out := make([]*System, 0, len(registry))
	for _, s := range registry {
		out = append(out, s)
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Name < out[j].Name })
	return out
}

// Names returns the registered system names, sorted.
func Names() []string {
	all := All()
	names := make([]string, len(all))
	for i, s := range all {
		names[i] = s.Name
	}
	return names
}

// Lookup returns the system registered under name. The error lists the
// valid names.
func Lookup(name string) (*System, error) {
	s, ok := registry[name]
	if !ok {
		return nil, fmt.Errorf("%w %q; valid systems: %s", ErrUnknownSystem, name, strings.Join(Names(), ", "))
	}
	return s, nil
}

// Defaults returns the system's default parameter set.
func (s *System) Defaults() map[string]float64 {
	p := make(map[string]float64, len(s.Params))
	for _, q := range s.Params {
		p[q.Name] = q.Default
	}
	return p
}

// Resolve merges overrides into the defaults and checks names and ranges.
// The error for an unknown name lists the valid ones.
func (s *System) Resolve(overrides map[string]float64) (map[string]float64, error) {
	p := s.Defaults()
	for k, v := range overrides {
		q, ok := s.param(k)
		if !ok {
			valid := make([]string, len(s.Params))
			for i, q := range s.Params {
				valid[i] = q.Name
			}
			if len(valid) == 0 {
				return nil, fmt.Errorf("%s: %w %q; it takes no parameters", s.Name, ErrUnknownParam, k)
			}
			return nil, fmt.Errorf("%s: %w %q; valid parameters: %s", s.Name, ErrUnknownParam, k, strings.Join(valid, ", "))
		}
		if math.IsNaN(v) || v < q.Min || v > q.Max {
			return nil, fmt.Errorf("%s: %w: %s = %g, want %g ≤ %s ≤ %g", s.Name, ErrParamRange, k, v, q.Min, k, q.Max)
		}
		if q.Integer && v != math.Trunc(v) {
			return nil, fmt.Errorf("%s: %w: %s = %g, want a whole number", s.Name, ErrParamRange, k, v)
		}
		p[k] = v
	}
	return p, nil
}

func (s *System) param(name string) (Param, bool) {
	for _, q := range s.Params {
		if q.Name == name {
			return q, true
		}
	}
	return Param{}, false
}

// recordingParams names the parameters that change how an orbit is
// recorded, not the orbit: the sample interval and the observed
// coordinate. No label rule depends on them, so they are left out of the
// default check and of the label cache key.
var recordingParams = map[string]bool{"dt": true, "obs": true}

// isDefault reports whether p equals the default parameter set in every
// parameter a label rule can depend on.
func (s *System) isDefault(p map[string]float64) bool {
	for _, q := range s.Params {
		if !recordingParams[q.Name] && p[q.Name] != q.Default {
			return false
		}
	}
	return true
}

// Class returns the label of the system for the given overrides (nil means
// defaults). The logistic map, for example, is chaotic at r = 4 and regular
// at r = 3.5. The label depends on the parameters only: it follows the
// orbit from a fixed start, so in multistable or mixed phase spaces it
// holds for that orbit, not for every series (ClassFrom labels a series).
// The sample interval dt and the observed coordinate obs never change it.
// At the defaults it returns DefaultClass without computing;
// elsewhere a computed label is cached per parameter set, so repeated calls
// are cheap. The error wraps ErrDiverged when the orbit used by the rule
// escapes.
func (s *System) Class(overrides map[string]float64) (Class, error) {
	p, err := s.Resolve(overrides)
	if err != nil {
		return "", err
	}
	if s.DefaultClass != "" && s.isDefault(p) {
		return s.DefaultClass, nil
	}
	return s.computeClass(p)
}

// computeClass applies the label rule to a resolved parameter set, with a
// cache for the rules that integrate equations.
func (s *System) computeClass(p map[string]float64) (Class, error) {
	if s.label != nil {
		return s.label(p)
	}
	key := s.cacheKey(p)
	classCache.Lock()
	c, ok := classCache.m[key]
	classCache.Unlock()
	if ok {
		return c, nil
	}
	c, err := s.classify(s.lyap(p))
	if err != nil {
		return "", err
	}
	classCache.Lock()
	if len(classCache.m) >= classCacheMax {
		// Callers sampling parameters at random would grow the cache
		// without bound; start afresh (labels are deterministic, so this
		// only costs recomputation).
		clear(classCache.m)
	}
	classCache.m[key] = c
	classCache.Unlock()
	return c, nil
}

// classify applies the threshold of the label rule to a spectrum.
func (s *System) classify(sp Spectrum, err error) (Class, error) {
	if err != nil {
		return "", fmt.Errorf("%s: label rule: %w", s.Name, err)
	}
	if sp.Exponents[0] > s.threshold {
		return Chaotic, nil
	}
	return Regular, nil
}

// ClassFrom returns the label of the series that s.Generate(n, overrides,
// r2) returns when r2 is a generator in the same state as rng (for any n):
// it draws the initial condition exactly as Generate does and applies the
// label rule along the orbit from that start, after the same transient
// Generate discards (Benettin spectrum compared with ChaosThreshold). So
// a multistable system (coexisting chaotic and periodic attractors, or a
// conservative system with a chaotic sea and invariant tori) is labelled
// by the attractor or region its series actually visits. Systems with a
// fixed label return it without using rng; equation systems without a
// per-series rule return the parameter-only Class, also without using
// rng. Nothing is cached (the start differs per call); the cost is one
// Benettin integration, a few to a few tens of milliseconds. The error
// wraps ErrParamRange or ErrUnknownParam for bad overrides, ErrDiverged
// when the orbit escapes and ErrConstant when a system whose range
// includes fixed points reports one (quadratic-map).
func (s *System) ClassFrom(overrides map[string]float64, rng *rand.Rand) (Class, error) {
	p, err := s.Resolve(overrides)
	if err != nil {
		return "", err
	}
	if s.initial == nil {
		return s.computeClass(p)
	}
	x0 := s.initial(p, rng)
	return s.classify(s.lyapFrom(p, x0))
}

// classCacheMax bounds the number of cached computed labels.
const classCacheMax = 4096

var classCache = struct {
	sync.Mutex
	m map[string]Class
}{m: map[string]Class{}}

func (s *System) cacheKey(p map[string]float64) string {
	var b strings.Builder
	b.WriteString(s.Name)
	for _, q := range s.Params {
		if recordingParams[q.Name] {
			continue
		}
		b.WriteByte(' ')
		b.WriteString(strconv.FormatFloat(p[q.Name], 'g', -1, 64))
	}
	return b.String()
}

// Lyapunov returns the Lyapunov spectrum of the system's equations at the
// given overrides (nil means defaults), computed along one orbit from a
// fixed start with the tangent map (maps) or the variational equations
// (flows) and QR re-orthonormalisation (Benettin et al., Meccanica 15
// (1980) 9). It is the quantity the label rule thresholds. Systems without
// equations return ErrNoEquations.
func (s *System) Lyapunov(overrides map[string]float64) (Spectrum, error) {
	if s.lyap == nil {
		return Spectrum{}, fmt.Errorf("%s: %w", s.Name, ErrNoEquations)
	}
	p, err := s.Resolve(overrides)
	if err != nil {
		return Spectrum{}, err
	}
	sp, err := s.lyap(p)
	if err != nil {
		return Spectrum{}, fmt.Errorf("%s: %w", s.Name, err)
	}
	return sp, nil
}

// ChaosThreshold returns the largest Lyapunov exponent above which the
// computed label is chaotic (unit of the Spectrum), and false for systems
// whose label is fixed.
func (s *System) ChaosThreshold() (float64, bool) {
	if s.label != nil {
		return 0, false
	}
	return s.threshold, true
}

// New returns the generator for the given overrides (nil means defaults)
// and the interval between samples in the unit of TimeAxis (1 for
// AxisIteration).
func (s *System) New(overrides map[string]float64) (Generator, float64, error) {
	p, err := s.Resolve(overrides)
	if err != nil {
		return nil, 0, err
	}
	return s.build(p)
}

// SampleInterval returns the interval between samples in the unit of
// TimeAxis for the given overrides: 1 for maps and discrete processes, dt
// for sampled continuous systems.
func (s *System) SampleInterval(overrides map[string]float64) (float64, error) {
	_, dt, err := s.New(overrides)
	return dt, err
}

// Generate draws n samples with the given overrides (nil means defaults).
func (s *System) Generate(n int, overrides map[string]float64, rng *rand.Rand) ([]float64, error) {
	g, _, err := s.New(overrides)
	if err != nil {
		return nil, err
	}
	// Generator errors already name the generator.
	return g.Generate(n, rng)
}

// GenerateNoisy draws n samples like Generate and adds independent Gaussian
// observational noise at snrDB decibels (AddNoise); +Inf adds none. The
// label of the result is still the system's Class: DESIGN.md counts chaos
// seen through moderate noise as chaotic and regular motion with small noise
// as regular, so callers who train on noisy series should keep the SNR
// moderate (10 dB or more is common practice).
func (s *System) GenerateNoisy(n int, overrides map[string]float64, snrDB float64, rng *rand.Rand) ([]float64, error) {
	x, err := s.Generate(n, overrides, rng)
	if err != nil {
		return nil, err
	}
	y, err := AddNoise(x, snrDB, rng)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", s.Name, err)
	}
	return y, nil
}

// Times returns the t column for n samples spaced dt apart: t_k = k·dt.
// With the dt of New this is the iteration index 0..n−1 for AxisIteration
// systems (dt = 1) and the system time for AxisTime systems.
func Times(n int, dt float64) []float64 {
	if n <= 0 {
		return nil
	}
	t := make([]float64, n)
	for k := range t {
		t[k] = float64(k) * dt
	}
	return t
}

func fixed(c Class) func(map[string]float64) (Class, error) {
	return func(map[string]float64) (Class, error) { return c, nil }
}

// obsParam is the parameter "obs" of a multi-dimensional map or flow:
// the index of the recorded state variable, whose names are listed in
// order. The default 0 is the coordinate the system was first observed
// through.
func obsParam(names ...string) Param {
	var b strings.Builder
	b.WriteString("observed state variable:")
	for i, n := range names {
		if i > 0 {
			b.WriteByte(',')
		}
		fmt.Fprintf(&b, " %d = %s", i, n)
	}
	return Param{Name: "obs", Default: 0, Min: 0, Max: float64(len(names) - 1), Integer: true, Doc: b.String()}
}

// checkObs rejects an observed coordinate outside the state of dimension d.
func checkObs(name string, obs, d int) error {
	if obs < 0 || obs >= d {
		return fmt.Errorf("%s: %w: obs = %d, want 0 ≤ obs < %d", name, ErrParamRange, obs, d)
	}
	return nil
}

// checkN rejects non-positive lengths.
func checkN(n int) error {
	if n <= 0 {
		return fmt.Errorf("generators: length n = %d, want n > 0", n)
	}
	return nil
}
