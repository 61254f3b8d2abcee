package features

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sync"

	"github.com/tracesift/tracesift/networks"
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
	// ErrWindow: Options.Window is too short to measure a window.
	ErrWindow = errors.New("window too short")
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
	// Window is the longest stretch measured at once, in samples. A longer
	// trace is cut into k = ⌈n/Window⌉ consecutive windows of equal length
	// (±1 sample; networks.Windows), each measured as a trace of its own
	// (standardised, checked for a grid), one after another, and the
	// vector holds each feature's median over the windows (see Vector).
	// This bounds the memory and makes the time linear in the length: the
	// natural visibility graph of a random walk grows faster than its
	// length (10^7 samples of Brownian motion pass the default edge
	// budget), and a 10^7-sample trace measured whole took 4.1 GB, most of
	// it in the delay vectors and k-d trees of the nonlinear family.
	// Zero means DefaultWindow; a negative Window measures the whole trace
	// at once whatever its length. A positive Window below 2·MinLength is
	// an error (ErrWindow): every window must hold MinLength samples.
	Window int
	// MaxEdges is the edge budget of each visibility graph
	// (visibility.Options.MaxEdges); zero means networks.DefaultMaxEdges.
	// A graph past it leaves its features missing, with a
	// *networks.EdgeBudgetError in Vector.Causes.
	MaxEdges int64
	// Extended also computes the extended families (recurrence and ordinal
	// partition networks; Extended lists them) and appends their features
	// to the vector after the schema's. They are outside the schema the
	// classifier reads; naming one of them in Only computes it too.
	Extended bool
	// Progress, when not nil, is called as the work advances with the
	// number of steps done and their total: one step per feature family
	// per window. Calls are serialised and done increases by one each time.
	Progress func(done, total int)
}

// DefaultWindow is the window length used when Options.Window is zero:
// 2^20 = 1048576 samples. Every trace up to this length is measured whole,
// exactly as before windowing existed (the training set's series are at
// most 2·10^4 samples long). Measured on Brownian motion with all families
// in parallel ('tracesift features', trace read from CSV included): 0.65 GB
// at the peak for 2^20 samples; 1.07 GB for 10^7 samples in 10 windows,
// against 4.1 GB for the same trace measured whole.
const DefaultWindow = 1 << 20

func (o Options) window() int {
	if o.Window == 0 {
		return DefaultWindow
	}
	return o.Window
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
	// dithered before the estimators ran (see DetectGrid); for a trace
	// measured in windows, the grid of the first window.
	Grid Grid `json:"grid"`
	// Windows is the number of windows the trace was measured in (1: the
	// whole trace at once; see Options.Window) and WindowLength the length
	// of the longest.
	Windows      int `json:"windows"`
	WindowLength int `json:"window_length"`
	// Spread, for a trace measured in more than one window, describes each
	// feature over the windows; nil otherwise. A feature is reported when
	// at least half of the windows measured it, as the median of their
	// values, and is missing otherwise (the reason says in how many
	// windows and why).
	Spread []Spread `json:"spread,omitempty"`
	// Causes holds the error behind each missing feature when an estimator
	// failed (nil otherwise), for errors.Is and errors.As: a caller can
	// tell, say, a visibility graph past its edge budget
	// (*networks.EdgeBudgetError) from a feature undefined for the trace.
	Causes []error `json:"-"`
}

// Spread describes one feature over the windows of a long trace: the
// number of windows that measured it and the smallest and largest of their
// values (NaN when none did).
type Spread struct {
	Measured int     `json:"measured"`
	Min      float64 `json:"min"`
	Max      float64 `json:"max"`
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
	causes  map[string]error
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
	for _, n := range names {
		s.causes[n] = err
	}
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
//
// A trace longer than Options.Window (default DefaultWindow, 2^20 samples)
// is measured in consecutive windows, each as above, and the vector holds
// the per-feature medians over the windows with their range (Vector.Spread);
// shorter traces are measured whole.
func Extract(x []float64, opts Options) (Vector, error) {
	w := opts.window()
	if w > 0 && w < 2*MinLength {
		return Vector{}, fmt.Errorf("%w: %d samples, at least %d", ErrWindow, w, 2*MinLength)
	}
	ws := networks.Windows(len(x), w)
	if len(ws) > 1 {
		return extractWindows(x, ws, opts)
	}
	z, err := Standardise(x)
	if err != nil {
		return Vector{}, err
	}
	only, err := wantedSet(opts.Only)
	if err != nil {
		return Vector{}, err
	}
	fams := activeFamilies(opts, only)
	return measure(z, len(x), opts, fams, only, newStepper(opts.Progress, len(fams))), nil
}

// wantedSet checks the names of Options.Only and returns them as a set
// (nil: every feature is wanted).
func wantedSet(names []string) (map[string]bool, error) {
	if len(names) == 0 {
		return nil, nil
	}
	only := map[string]bool{}
	for _, n := range names {
		if _, ok := Lookup(n); !ok {
			return nil, fmt.Errorf("%w %q", ErrUnknownFeature, n)
		}
		only[n] = true
	}
	return only, nil
}

// stepper reports progress, one step at a time, to an Options.Progress
// callback; a nil stepper does nothing.
type stepper struct {
	mu          sync.Mutex
	done, total int
	report      func(done, total int)
}

func newStepper(report func(done, total int), total int) *stepper {
	if report == nil {
		return nil
	}
	return &stepper{total: total, report: report}
}

// step records k steps done.
func (p *stepper) step(k int) {
	if p == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	for range k {
		p.done++
		p.report(p.done, p.total)
	}
}

// measure computes the vector of the standardised series z (of n samples
// as given) over the families fams; see Extract.
func measure(z []float64, n int, opts Options, fams []family, only map[string]bool, progress *stepper) Vector {
	grid := detectGrid(z)
	if grid.Dithered {
		z = dither(z, grid, rand.New(rand.NewPCG(opts.Seed, ditherStream)))
	}
	sinks := make([]sink, len(fams))
	run := func(i int) {
		defer progress.step(1)
		sinks[i] = sink{values: map[string]float64{}, reasons: map[string]string{}, causes: map[string]error{}, only: only}
		if !sinks[i].wants(familyNames(fams[i])...) {
			return
		}
		defer func() {
			// An estimator panic is a bug, but one bad family must not
			// take the whole vector down: mark its features missing.
			if r := recover(); r != nil {
				sinks[i].miss(fmt.Sprintf("internal error: %v", r), familyNames(fams[i])...)
			}
		}()
		fams[i].compute(z, opts, &sinks[i])
	}
	if opts.Sequential {
		for i := range fams {
			run(i)
		}
	} else {
		var wg sync.WaitGroup
		for i := range fams {
			wg.Add(1)
			go func() { defer wg.Done(); run(i) }()
		}
		wg.Wait()
	}
	v := Vector{N: n, Grid: grid, Windows: 1, WindowLength: n}
	for i, f := range fams {
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
			v.Causes = append(v.Causes, sinks[i].causes[e.Name])
		}
	}
	return v
}

// windowSeedStream is the PCG stream that draws the seeds of the windows of
// a long trace.
const windowSeedStream = 0x77696e646f777321 // "windows!"

// extractWindows measures x window by window (see Options.Window). Window
// i is measured with the i-th draw of a PCG stream seeded with
// Options.Seed, so the randomised estimators draw afresh in every window.
func extractWindows(x []float64, ws []networks.Window, opts Options) (Vector, error) {
	if _, _, err := moments(x); err != nil {
		return Vector{}, err
	}
	only, err := wantedSet(opts.Only)
	if err != nil {
		return Vector{}, err
	}
	fams := activeFamilies(opts, only)
	progress := newStepper(opts.Progress, len(ws)*len(fams))
	seeds := rand.New(rand.NewPCG(opts.Seed, windowSeedStream))
	vs := make([]Vector, len(ws))
	for i, w := range ws {
		o := opts
		o.Seed = seeds.Uint64()
		z, err := Standardise(x[w.Start:w.End])
		if err != nil {
			// A window that cannot be measured at all (a flat stretch of
			// a trace that is not flat) leaves every feature missing in
			// it; the other windows speak for the trace.
			vs[i] = missingVector(fmt.Errorf("window %d of %d (samples %d–%d): %w", i+1, len(ws), w.Start, w.End-1, err), w.Len(), fams)
			progress.step(len(fams))
			continue
		}
		vs[i] = measure(z, w.Len(), o, fams, only, progress)
	}
	return combineWindows(vs, len(x)), nil
}

// missingVector is a vector with every feature missing because of err.
func missingVector(err error, n int, fams []family) Vector {
	var names []string
	for _, f := range fams {
		names = append(names, familyNames(f)...)
	}
	v := Vector{Names: names, Values: make([]float64, len(names)), Reasons: make([]string, len(names)), Causes: make([]error, len(names)), N: n, Windows: 1, WindowLength: n}
	for i := range names {
		v.Values[i] = math.NaN()
		v.Reasons[i] = err.Error()
		v.Causes[i] = err
	}
	return v
}

// combineWindows merges the vectors of the windows of a trace of n
// samples: a feature measured in at least half of the windows takes the
// median of their values; otherwise it is missing, with the reason of the
// first window that missed it (and in how many it was missing, unless
// every window gave the same reason).
func combineWindows(vs []Vector, n int) Vector {
	first := vs[0]
	out := Vector{
		Names: first.Names, N: n, Grid: first.Grid, Windows: len(vs),
		Values: make([]float64, len(first.Names)), Reasons: make([]string, len(first.Names)),
		Causes: make([]error, len(first.Names)), Spread: make([]Spread, len(first.Names)),
	}
	for _, v := range vs {
		out.WindowLength = max(out.WindowLength, v.WindowLength)
	}
	vals := make([]float64, 0, len(vs))
	for j := range out.Names {
		vals = vals[:0]
		missedAt := -1
		same := true
		for k, v := range vs {
			if v.Reasons[j] == "" {
				vals = append(vals, v.Values[j])
				continue
			}
			if missedAt < 0 {
				missedAt = k
			} else if v.Reasons[j] != vs[missedAt].Reasons[j] {
				same = false
			}
		}
		sp := Spread{Measured: len(vals), Min: math.NaN(), Max: math.NaN()}
		if len(vals) > 0 {
			sp.Min, sp.Max = slices.Min(vals), slices.Max(vals)
		}
		out.Spread[j] = sp
		if 2*len(vals) >= len(vs) {
			out.Values[j] = median(vals)
			continue
		}
		out.Values[j] = math.NaN()
		out.Causes[j] = vs[missedAt].Causes[j]
		out.Reasons[j] = vs[missedAt].Reasons[j]
		if len(vals) > 0 || !same {
			out.Reasons[j] = fmt.Sprintf("missing in %d of %d windows; in window %d: %s", len(vs)-len(vals), len(vs), missedAt+1, vs[missedAt].Reasons[j])
		}
	}
	return out
}

// median returns the median of vals (not empty; reordered in place), the
// mean of the middle two for an even count.
func median(vals []float64) float64 {
	slices.Sort(vals)
	h := len(vals) / 2
	if len(vals)%2 == 1 {
		return vals[h]
	}
	return (vals[h-1] + vals[h]) / 2
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
	mean, sd, err := moments(x)
	if err != nil {
		return nil, err
	}
	z := make([]float64, len(x))
	for i, v := range x {
		z[i] = math.Round((v-mean)/sd/quantum) * quantum
	}
	return z, nil
}

// moments returns the mean and the (population) standard deviation of x
// after Standardise's checks: long enough, finite, not constant.
func moments(x []float64) (mean, sd float64, err error) {
	if len(x) < MinLength {
		return 0, 0, fmt.Errorf("%w: %d samples, at least %d needed", ErrTooShort, len(x), MinLength)
	}
	for i, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return 0, 0, fmt.Errorf("%w at sample %d", ErrNonFinite, i)
		}
		mean += v
	}
	mean /= float64(len(x))
	var ss float64
	for _, v := range x {
		ss += (v - mean) * (v - mean)
	}
	sd = math.Sqrt(ss / float64(len(x)))
	if !(sd > 0) || sd <= 1e-12*math.Abs(mean) {
		return 0, 0, ErrConstant
	}
	return mean, sd, nil
}
