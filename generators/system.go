// Package generators produces labelled reference series from systems whose
// invariants are published: chaotic maps and flows, regular (periodic and
// quasi-periodic) signals, and the noises a device engineer meets. Every
// generator discards its transient and is deterministic for a given
// *rand.Rand (math/rand/v2); nothing reads a global generator.
//
// Two ways in: the concrete types (Logistic, Henon, Lorenz, ...) for library
// use, and the registry (Lookup, All) that maps a system name and "k=v"
// parameter settings onto them for the command line.
package generators

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"strings"
)

// Class is the label a reference series carries.
type Class string

// The three classes of DESIGN.md.
const (
	Chaotic    Class = "chaotic"
	Stochastic Class = "stochastic"
	Regular    Class = "regular"
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
	Doc     string  // meaning and unit
}

// Invariant is a published or analytic property of a system at its default
// parameters, with the source it comes from (see REFERENCES.md).
type Invariant struct {
	Name   string  // e.g. "lyap_max"
	Value  float64 // the published value
	Unit   string  // e.g. "per iteration", "per time unit"
	Source string  // authors, journal, year; "(memory)" when recalled
}

// System is a registry entry: a named reference system with its parameters,
// label rule and invariants.
type System struct {
	Name       string
	Title      string
	Doc        string
	Params     []Param
	Invariants []Invariant
	// TimeAxis says what the t column of generated CSV holds:
	// "iteration" for maps and discrete processes, "time" for flows and
	// sampled continuous processes.
	TimeAxis string
	// label returns the class for a full parameter set.
	label func(p map[string]float64) Class
	// build returns the generator and the sample interval (in the unit of
	// TimeAxis) for a full parameter set.
	build func(p map[string]float64) (Generator, float64, error)
}

// ErrUnknownSystem is returned by Lookup for a name that is not registered.
var ErrUnknownSystem = errors.New("unknown system")

// ErrUnknownParam is returned when a parameter name is not one of the system's.
var ErrUnknownParam = errors.New("unknown parameter")

// ErrParamRange is returned when a parameter lies outside its documented range.
var ErrParamRange = errors.New("parameter out of range")

var registry = map[string]*System{}

func register(s *System) {
	if _, dup := registry[s.Name]; dup {
		panic("generators: duplicate system " + s.Name)
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

// Class returns the label of the system for the given overrides (nil means
// defaults). The logistic map, for example, is chaotic at r = 4 and regular
// at r = 3.5.
func (s *System) Class(overrides map[string]float64) (Class, error) {
	p, err := s.Resolve(overrides)
	if err != nil {
		return "", err
	}
	return s.label(p), nil
}

// New returns the generator for the given overrides (nil means defaults)
// and the interval between samples in the unit of TimeAxis.
func (s *System) New(overrides map[string]float64) (Generator, float64, error) {
	p, err := s.Resolve(overrides)
	if err != nil {
		return nil, 0, err
	}
	return s.build(p)
}

// Generate draws n samples with the given overrides (nil means defaults).
func (s *System) Generate(n int, overrides map[string]float64, rng *rand.Rand) ([]float64, error) {
	g, _, err := s.New(overrides)
	if err != nil {
		return nil, err
	}
	return g.Generate(n, rng)
}

func fixed(c Class) func(map[string]float64) Class {
	return func(map[string]float64) Class { return c }
}

// checkN rejects non-positive lengths.
func checkN(n int) error {
	if n <= 0 {
		return fmt.Errorf("generators: length n = %d, want n > 0", n)
	}
	return nil
}
