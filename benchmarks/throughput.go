package benchmarks

import (
	"fmt"
	"math"
	"runtime"
	"time"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/networks/visibility"
)

// ThroughputResult is the measured speed of the main operations against
// the series length. Every figure depends on the machine and on its load
// while the suite ran: MachineDependent is always true, and the section is
// the one part of a Result that differs between runs with the same seed.
type ThroughputResult struct {
	MachineDependent bool `json:"machine_dependent"`
	// Input describes the timed series.
	Input string `json:"input"`
	// Method says how each figure was measured.
	Method     string            `json:"method"`
	Sizes      []int             `json:"sizes"`
	Operations []OperationTiming `json:"operations"`
	Machine    Machine           `json:"machine"`
}

// Machine identifies where the timings were taken.
type Machine struct {
	GOOS       string `json:"goos"`
	GOARCH     string `json:"goarch"`
	CPUs       int    `json:"cpus"`
	GOMAXPROCS int    `json:"gomaxprocs"`
	GoVersion  string `json:"go_version"`
}

// OperationTiming is one operation timed at every size, with the growth
// exponent p of time ~ n^p fitted by least squares on log–log axes.
type OperationTiming struct {
	Name string `json:"name"`
	// Call is the project function timed.
	Call     string        `json:"call"`
	Points   []TimingPoint `json:"points"`
	Exponent Float         `json:"exponent"`
	R2       Float         `json:"r2"`
	// Failures lists sizes where the call failed.
	Failures []string `json:"failures,omitempty"`
}

// TimingPoint is the median time of one call at one size.
type TimingPoint struct {
	N                int   `json:"n"`
	Seconds          Float `json:"seconds"`
	SamplesPerSecond Float `json:"samples_per_second"`
	// Batches is the number of timed batches (median taken over them) and
	// Calls the number of calls in each batch.
	Batches int `json:"batches"`
	Calls   int `json:"calls"`
}

// minBatch is the shortest timed batch: fast calls are repeated until a
// batch lasts this long, so the clock's resolution does not matter.
const minBatch = 50 * time.Millisecond

// throughputInput is the timed series: 1/f noise, the spectrum of most
// device-current fluctuations.
const throughputSystem = "powerlaw"

// runThroughput times the operations at every size, one call at a time.
func runThroughput(m *classifier.Model, o Options) *ThroughputResult {
	slow := o.SlowCall
	res := &ThroughputResult{
		MachineDependent: true,
		Input:            fmt.Sprintf("1/f noise (generators %q, β = 1, seed %d)", throughputSystem, o.Seed),
		Method: fmt.Sprintf("wall time (time.Now) around real calls on one prepared series per size; a call faster than %v is repeated until a batch lasts that long; "+
			"the median over %d batches is reported, or a single call when one takes over %gs; nothing else runs meanwhile", minBatch, o.ThroughputRepeats, slow),
		Sizes: o.ThroughputSizes,
		Machine: Machine{GOOS: runtime.GOOS, GOARCH: runtime.GOARCH, CPUs: runtime.NumCPU(),
			GOMAXPROCS: runtime.GOMAXPROCS(0), GoVersion: runtime.Version()},
	}
	type op struct {
		name, call string
		f          func(x []float64) error
	}
	ops := []op{
		{"hvg", "visibility.Horizontal", func(x []float64) error { _, err := visibility.Horizontal(x, visibility.Options{}); return err }},
		{"nvg", "visibility.Natural", func(x []float64) error { _, err := visibility.Natural(x, visibility.Options{}); return err }},
		{"features", "features.Extract (all families, default options)", func(x []float64) error {
			_, err := features.Extract(x, features.Options{Seed: o.Seed})
			return err
		}},
	}
	if m != nil {
		ops = append(ops, op{"classify", "classifier.Screen (quality checks, windowed features, forest)", func(x []float64) error {
			_, err := classifier.Screen(m, x, classifier.ScreenOptions{Features: features.Options{Seed: o.Seed}})
			return err
		}})
	}
	res.Operations = make([]OperationTiming, len(ops))
	for i, p := range ops {
		res.Operations[i] = OperationTiming{Name: p.name, Call: p.call}
	}
	total := len(ops) * len(o.ThroughputSizes)
	done := 0
	for _, n := range o.ThroughputSizes {
		x, err := generate(throughputSystem, map[string]float64{"beta": 1}, n, seedFor(o.Seed, 6, uint64(n)))
		for i, p := range ops {
			ot := &res.Operations[i]
			if err == nil {
				pt, err2 := timeCall(func() error { return p.f(x) }, o.ThroughputRepeats, slow)
				if err2 != nil {
					ot.Failures = append(ot.Failures, fmt.Sprintf("n=%d: %v", n, err2))
				} else {
					pt.N = n
					pt.SamplesPerSecond = Float(float64(n) / float64(pt.Seconds))
					ot.Points = append(ot.Points, pt)
				}
			} else {
				ot.Failures = append(ot.Failures, fmt.Sprintf("n=%d: generating the input: %v", n, err))
			}
			done++
			if o.Progress != nil {
				o.Progress("throughput", done, total)
			}
		}
	}
	for i := range res.Operations {
		ot := &res.Operations[i]
		var ns, ts []float64
		for _, pt := range ot.Points {
			ns = append(ns, float64(pt.N))
			ts = append(ts, float64(pt.Seconds))
		}
		p, r2 := logLogFit(ns, ts)
		ot.Exponent, ot.R2 = Float(p), Float(r2)
	}
	return res
}

// timeCall measures f: one warm-up call, then batches of calls.
func timeCall(f func() error, batches int, slow float64) (TimingPoint, error) {
	t0 := time.Now()
	if err := f(); err != nil {
		return TimingPoint{}, err
	}
	first := time.Since(t0)
	if first.Seconds() > slow {
		return TimingPoint{Seconds: Float(first.Seconds()), Batches: 1, Calls: 1}, nil
	}
	calls := 1
	if first < minBatch {
		calls = int(math.Ceil(float64(minBatch) / float64(max(first, time.Microsecond))))
	}
	per := make([]float64, batches)
	for b := range per {
		t := time.Now()
		for c := 0; c < calls; c++ {
			if err := f(); err != nil {
				return TimingPoint{}, err
			}
		}
		per[b] = time.Since(t).Seconds() / float64(calls)
	}
	return TimingPoint{Seconds: Float(median(per)), Batches: batches, Calls: calls}, nil
}
