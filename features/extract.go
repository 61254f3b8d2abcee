package features

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"sync"
)

// MinLength is the shortest series Extract accepts. Shorter series leave
// too few points for the fits of most families (DFA, spectral slope, the
// Lyapunov divergence curve); common practice.
const MinLength = 256

// Errors Extract returns for series it cannot measure at all.
var (
	ErrTooShort  = errors.New("series too short")
	ErrNonFinite = errors.New("series holds NaN or Inf")
	ErrConstant  = errors.New("series is constant")
	// ErrUnknownFeature names a feature that is not in the catalogue.
	ErrUnknownFeature = errors.New("unknown feature")
)

// Options configures Extract. The zero value selects the defaults.
type Options struct {
	// Seed drives every randomised estimator (sampled path lengths and
	// graph dimension, Louvain order, 0–1 test frequencies) and the dither
	// of a quantised series (see Extract). The default 0
	// is a valid seed: the same series and seed give bit-identical vectors.
	Seed uint64
	// Sequential computes the families one after another instead of in
	// parallel; results are identical either way.
	Sequential bool
	// Only, when not empty, restricts the work to these features (e.g. one
	// statistic for a surrogate test); the others are marked missing as
	// "not requested". Unknown names are an error.
	Only []string
}

// Vector is a trace's feature vector: Values[i] belongs to Names[i]; a
// missing feature holds NaN and a non-empty Reasons[i].
type Vector struct {
	Names   []string  `json:"names"`
	Values  []float64 `json:"values"`
	Reasons []string  `json:"reasons"`
	// N is the number of samples measured.
	N int `json:"n"`
	// Grid reports whether the series lay on a recorder's grid and was
	// dithered before the estimators ran (see DetectGrid).
	Grid Grid `json:"grid"`
}

// Get returns the value of a named feature and whether it is present.
func (v Vector) Get(name string) (float64, bool) {
	for i, n := range v.Names {
		if n == name {
			return v.Values[i], !math.IsNaN(v.Values[i])
		}
	}
	return math.NaN(), false
}

// Missing returns the names of the missing features with their reasons.
func (v Vector) Missing() map[string]string {
	m := map[string]string{}
	for i, r := range v.Reasons {
		if r != "" {
			m[v.Names[i]] = r
		}
	}
	return m
}

// family is one group of features computed together from the standardised
// series.
type family struct {
	name    Family
	entries []Entry
	// compute fills the family's features into s.
	compute func(z []float64, o Options, s *sink)
}

// families lists the feature families in catalogue order.
var families = []family{
	graphFamily,
	nonlinearFamily,
	scalingFamily,
	ordinalFamily,
	incrementsFamily,
}

// sink collects one family's values and missing reasons.
type sink struct {
	values  map[string]float64
	reasons map[string]string
	only    map[string]bool // nil: every feature is wanted
}

// wants reports whether any of the named features is requested; families
// skip the work behind features nobody asked for.
func (s *sink) wants(names ...string) bool {
	if s.only == nil {
		return true
	}
	for _, n := range names {
		if s.only[n] {
			return true
		}
	}
	return false
}

func (s *sink) set(name string, v float64) {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		s.miss("not finite", name)
		return
	}
	s.values[name] = v
}

// miss marks features missing with a reason.
func (s *sink) miss(reason string, names ...string) {
	for _, n := range names {
		s.reasons[n] = reason
	}
}

// measure runs fill when any of names is wanted; an error from fill marks
// them all missing with the error as the reason.
func (s *sink) measure(fill func() error, names ...string) {
	if !s.wants(names...) {
		return
	}
	if err := fill(); err != nil {
		s.missErr(err, names...)
	}
}

// missErr marks features missing because an estimator failed.
func (s *sink) missErr(err error, names ...string) {
	s.miss(err.Error(), names...)
}

// Extract computes the feature vector of x. x is not modified. The series is
// standardised to zero mean and unit variance first, so the vector does not
// depend on the units of the trace.
//
// A series recorded on a coarse uniform grid (an ADC's codes, integer
// counts; DetectGrid states the rule) is then dithered: each sample is
// spread over its grid cell by a draw seeded with opts.Seed, uniformly for
// series whose consecutive samples are independent at the scale of the grid
// and in order along runs of equal samples for smooth series that creep
// through it (see dither). Without this, equal values would be read as
// structure by every estimator that compares samples (ordinal patterns,
// visibility graphs, template matches, nearest neighbours). Genuinely
// discrete series — fewer than five levels (two-level telegraph noise,
// square waves) or exactly periodic — are left as recorded, and so are
// unquantised traces, for which the test costs one pass. Vector.Grid reports
// what was found and done. The dither is a function of the standardised
// series and the seed only, so the vector stays bit-identical under a change
// of units.
func Extract(x []float64, opts Options) (Vector, error) {
	z, err := Standardise(x)
	if err != nil {
		return Vector{}, err
	}
	var only map[string]bool
	if len(opts.Only) > 0 {
		only = map[string]bool{}
		for _, n := range opts.Only {
			if _, ok := Lookup(n); !ok {
				return Vector{}, fmt.Errorf("%w %q", ErrUnknownFeature, n)
			}
			only[n] = true
		}
	}
	grid := detectGrid(z)
	if grid.Dithered {
		z = dither(z, grid, rand.New(rand.NewPCG(opts.Seed, ditherStream)))
	}
	sinks := make([]sink, len(families))
	run := func(i int) {
		sinks[i] = sink{values: map[string]float64{}, reasons: map[string]string{}, only: only}
		if !sinks[i].wants(familyNames(families[i])...) {
			return
		}
		defer func() {
			// An estimator panic is a bug, but one bad family must not
			// take the whole vector down: mark its features missing.
			if r := recover(); r != nil {
				sinks[i].miss(fmt.Sprintf("internal error: %v", r), familyNames(families[i])...)
			}
		}()
		families[i].compute(z, opts, &sinks[i])
	}
	if opts.Sequential {
		for i := range families {
			run(i)
		}
	} else {
		var wg sync.WaitGroup
		for i := range families {
			wg.Add(1)
			go func() { defer wg.Done(); run(i) }()
		}
		wg.Wait()
	}
	v := Vector{N: len(x), Grid: grid}
	for i, f := range families {
		for _, e := range f.entries {
			val, ok := sinks[i].values[e.Name]
			reason := sinks[i].reasons[e.Name]
			if !ok {
				val = math.NaN()
				if reason == "" {
					reason = "not computed"
					if only != nil && !only[e.Name] {
						reason = "not requested"
					}
				}
			}
			v.Names = append(v.Names, e.Name)
			v.Values = append(v.Values, val)
			v.Reasons = append(v.Reasons, reason)
		}
	}
	return v, nil
}

func familyNames(f family) []string {
	names := make([]string, len(f.entries))
	for k, e := range f.entries {
		names[k] = e.Name
	}
	return names
}

// Value computes one named feature of x: the statistic a surrogate test
// compares. A feature that is missing for x is an error carrying the
// reason.
func Value(name string, x []float64, opts Options) (float64, error) {
	opts.Only = []string{name}
	opts.Sequential = true
	v, err := Extract(x, opts)
	if err != nil {
		return math.NaN(), err
	}
	for i, n := range v.Names {
		if n == name {
			if v.Reasons[i] != "" {
				return math.NaN(), fmt.Errorf("%s: %s", name, v.Reasons[i])
			}
			return v.Values[i], nil
		}
	}
	return math.NaN(), fmt.Errorf("%w %q", ErrUnknownFeature, name)
}

// quantum is the grid Standardise rounds to, in standard deviations.
const quantum = 1.0 / (1 << 24)

// Standardise returns (x − mean)/sd rounded to a grid of 2^−24 ≈ 6·10^−8
// standard deviations, checking the series is long enough, finite and not
// constant. The rounding sits far below any recorder's resolution, and it
// is what makes the features exactly independent of units: a unit change
// x → a·x + b perturbs the standardised values by rounding errors of order
// 10^−13, which would otherwise create or break ties between equal samples
// (plateaus, periodic repeats, telegraph levels) and change visibility
// graphs, ordinal patterns and nearest neighbours. On the grid, equal stays
// equal and the standardised series is bit-identical in any units (except
// for the rare sample within 10^−13 of a grid midpoint).
func Standardise(x []float64) ([]float64, error) {
	if len(x) < MinLength {
		return nil, fmt.Errorf("%w: %d samples, at least %d needed", ErrTooShort, len(x), MinLength)
	}
	var mean float64
	for i, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("%w at sample %d", ErrNonFinite, i)
		}
		mean += v
	}
	mean /= float64(len(x))
	var ss float64
	for _, v := range x {
		ss += (v - mean) * (v - mean)
	}
	sd := math.Sqrt(ss / float64(len(x)))
	if !(sd > 0) || sd <= 1e-12*math.Abs(mean) {
		return nil, ErrConstant
	}
	z := make([]float64, len(x))
	for i, v := range x {
		z[i] = math.Round((v-mean)/sd/quantum) * quantum
	}
	return z, nil
}
