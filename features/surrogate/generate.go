package surrogate

import (
	"fmt"
	"math"
	"sync"
	"sync/atomic"
)

// Set is the output of Generate.
type Set struct {
	Method     Method      `json:"method"`
	Seed       uint64      `json:"seed"`
	Truncation *Truncation `json:"truncation,omitempty"` // nil when the whole series was used
	// Surrogates[i] is surrogate i, of the length of the series used.
	Surrogates [][]float64 `json:"surrogates"`
	// Iterations[i] is the number of IAAFT iterations of surrogate i
	// (nil for other methods).
	Iterations []int `json:"iterations,omitempty"`
	// SpectralError[i] is the relative RMS Fourier-amplitude error of
	// surrogate i against the data, DC excluded (AAFT and IAAFT; nil for
	// other methods; FT keeps the amplitudes to rounding error).
	SpectralError []float64 `json:"spectral_error,omitempty"`
	// NotConverged counts IAAFT surrogates stopped by MaxIter.
	NotConverged int      `json:"not_converged"`
	Warnings     []string `json:"warnings,omitempty"`
}

// Generate returns opts.Count surrogates of x made with opts.Method. x must
// hold at least 8 finite values, not all equal. With opts.EndMatch the
// surrogates are of the end-matched sub-series (reported in Truncation).
// Each surrogate i is drawn from a random stream keyed by (opts.Seed, i), so
// the result is bit-identical for a seed whatever opts.Workers is. Memory is
// Count·n float64s; Test does not keep surrogates and suits long series.
func Generate(x []float64, opts Options) (*Set, error) {
	p, trunc, warns, err := setup(x, opts)
	if err != nil {
		return nil, fmt.Errorf("surrogates: %w", err)
	}
	count := p.opt.Count
	set := &Set{Method: p.opt.Method, Seed: p.opt.Seed, Truncation: trunc, Warnings: warns,
		Surrogates: make([][]float64, count)}
	for i := range set.Surrogates {
		set.Surrogates[i] = make([]float64, p.n)
	}
	infos := make([]info, count)
	p.forEach(func(_ int, i int, s []float64, inf info) {
		copy(set.Surrogates[i], s)
		infos[i] = inf
	})
	switch p.opt.Method {
	case IAAFT:
		set.Iterations = make([]int, count)
		set.SpectralError = make([]float64, count)
		for i, inf := range infos {
			set.Iterations[i] = inf.iter
			set.SpectralError[i] = inf.specErr
			if !inf.converged {
				set.NotConverged++
			}
		}
		if set.NotConverged > 0 {
			set.Warnings = append(set.Warnings, fmt.Sprintf(
				"iaaft: %d of %d surrogates reached the iteration cap %d before converging", set.NotConverged, count, p.opt.MaxIter))
		}
	case AAFT:
		set.SpectralError = make([]float64, count)
		for i, inf := range infos {
			set.SpectralError[i] = inf.specErr
		}
	}
	return set, nil
}

// setup resolves the options, validates x, applies end matching and builds
// the shared data. It returns the warnings about the series.
func setup(x []float64, opts Options) (*prepared, *Truncation, []string, error) {
	opt, err := opts.resolve()
	if err != nil {
		return nil, nil, nil, err
	}
	if err := checkSeries(x); err != nil {
		return nil, nil, nil, err
	}
	var warns []string
	var trunc *Truncation
	used := x
	if opt.EndMatch {
		t, err := MatchEnds(x, opt.MinFraction)
		if err != nil {
			return nil, nil, nil, err
		}
		trunc = &t
		used = x[t.Start : t.Start+t.Len]
		if err := checkSeries(used); err != nil {
			return nil, nil, nil, fmt.Errorf("end-matched sub-series [%d, %d): %w", t.Start, t.Start+t.Len, err)
		}
		if t.CutStart > 0 || t.CutEnd > 0 {
			warns = append(warns, fmt.Sprintf(
				"end matching kept samples [%d, %d) of %d (cut %d at the start, %d at the end); mismatch %.3g → %.3g",
				t.Start, t.Start+t.Len, len(x), t.CutStart, t.CutEnd, t.MismatchBefore, t.Mismatch))
		}
	}
	p := newPrepared(used, opt)
	if opt.Method.usesFFT() {
		if needsBluestein(p.n) {
			warns = append(warns, fmt.Sprintf(
				"length %d has the prime factor %d: transforms use Bluestein's algorithm (several times slower than a length with small factors; EndMatch picks one)",
				p.n, largestPrimeFactor(p.n)))
		}
		if opt.LeakageWarn > 0 {
			if lk := endLeakage(used, p.coeff); lk > opt.LeakageWarn {
				advice := "use end matching"
				if opt.EndMatch {
					advice = "end matching could not remove it: the series may be non-stationary"
				}
				warns = append(warns, fmt.Sprintf(
					"end mismatch: the jump x[0] − x[n−1] = %.3g sd would carry %.3g times the power of the upper half of the spectrum; %s surrogates will hold spurious high frequencies (%s)",
					(used[0]-used[p.n-1])/math.Sqrt(variance(used)), lk, opt.Method, advice))
			}
		}
	}
	return p, trunc, warns, nil
}

// forEach makes surrogates 0..Count−1 on Workers goroutines and calls fn
// with the worker number, the index, the surrogate (a buffer reused by the
// worker: copy it to keep it) and its info. fn runs concurrently for
// different workers.
func (p *prepared) forEach(fn func(worker, i int, s []float64, inf info)) {
	count := p.opt.Count
	workers := max(1, min(p.opt.Workers, count))
	var next atomic.Int64
	var mu sync.Mutex
	done := 0
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Go(func() {
			ws := p.newWorkspace()
			dst := make([]float64, p.n)
			for {
				i := int(next.Add(1) - 1)
				if i >= count {
					return
				}
				inf := p.make(dst, surrogateRand(p.opt.Seed, i), ws)
				fn(w, i, dst, inf)
				if p.opt.Progress != nil {
					mu.Lock()
					done++
					p.opt.Progress(done, count)
					mu.Unlock()
				}
			}
		})
	}
	wg.Wait()
}
