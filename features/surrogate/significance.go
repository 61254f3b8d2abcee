package surrogate

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/gonum/stat"
)

// Statistic is a named discriminating statistic. Func must be safe for
// concurrent calls and must not keep x after it returns; it may modify x
// (every call gets its own copy). An error or a non-finite value counts as
// a failure of that call; a panic is recovered and counted the same way.
type Statistic struct {
	Name string
	Func func(x []float64) (float64, error)
}

// TestOptions control Test. The zero value means the surrogate defaults
// (IAAFT, 99 surrogates, see Options), α = 0.05, two-sided.
type TestOptions struct {
	Options
	// Alpha is the significance level; 0 means 0.05.
	Alpha float64
	// Side is the alternative; "" means TwoSided.
	Side Side
}

// Result is the rank test of one statistic. Non-finite numbers (a z-score
// of a degenerate distribution, the fields of a statistic that failed on
// the data) are NaN in Go and null in JSON.
type Result struct {
	Stat     string  `json:"stat"`
	Observed float64 `json:"observed"` // value on the data (the series used)
	Mean     float64 `json:"mean"`     // mean of the surrogate values
	SD       float64 `json:"sd"`       // sample standard deviation (M−1) of the surrogate values
	Z        float64 `json:"z"`        // (observed − mean)/sd
	P        float64 `json:"p"`        // p of the chosen Side
	PUpper   float64 `json:"p_upper"`  // (1 + #{v ≥ observed})/(M + 1)
	PLower   float64 `json:"p_lower"`  // (1 + #{v ≤ observed})/(M + 1)
	PTwo     float64 `json:"p_two"`    // min(1, 2·min(p_upper, p_lower))
	PHolm    float64 `json:"p_holm"`   // Holm-adjusted P over the statistics tested (= P for one)
	Side     Side    `json:"side"`
	Alpha    float64 `json:"alpha"`
	// Significant reports PHolm ≤ Alpha.
	Significant bool   `json:"significant"`
	Method      Method `json:"method"`
	// Count is M, the number of surrogates on which the statistic was
	// computed; Failed the number on which it failed.
	Count  int `json:"count"`
	Failed int `json:"failed"`
	// Values are the M surrogate values in surrogate order (failures
	// left out).
	Values   []float64 `json:"values"`
	Error    string    `json:"error,omitempty"` // why the statistic failed on the data
	Warnings []string  `json:"warnings,omitempty"`
}

// IAAFTSummary sums up the IAAFT iterations of a test.
type IAAFTSummary struct {
	MeanIterations    float64 `json:"mean_iterations"`
	MaxIterations     int     `json:"max_iterations"`
	NotConverged      int     `json:"not_converged"` // stopped by the iteration cap
	MeanSpectralError float64 `json:"mean_spectral_error"`
	MaxSpectralError  float64 `json:"max_spectral_error"`
}

// Report is the outcome of Test.
type Report struct {
	Method         Method        `json:"method"`
	NullHypothesis string        `json:"null_hypothesis"`
	Count          int           `json:"count"` // surrogates made
	Seed           uint64        `json:"seed"`
	N              int           `json:"n"`    // length of the input
	Used           int           `json:"used"` // length tested (after end matching)
	Truncation     *Truncation   `json:"truncation,omitempty"`
	Alpha          float64       `json:"alpha"`
	Side           Side          `json:"side"`
	MinSurrogates  int           `json:"min_surrogates"` // least M for Alpha and Side
	IAAFT          *IAAFTSummary `json:"iaaft,omitempty"`
	Tests          []Result      `json:"tests"`
	Warnings       []string      `json:"warnings,omitempty"`
}

// ErrNoStatistic is returned by Test when no statistic is given.
var ErrNoStatistic = errors.New("no statistic to test")

// Test computes each statistic on x and on opts.Count surrogates of x and
// returns the rank test of each (see RankP), with mean, standard deviation
// and z-score of the surrogate distribution, and Holm's adjustment across
// the statistics (see Holm). With opts.EndMatch the data and the surrogates
// are the end-matched sub-series. Surrogates are made and evaluated on
// opts.Workers goroutines without being stored, so memory is
// O(Workers·n + Count·len(stats)); results are bit-identical for a seed
// whatever the worker count. A statistic that fails on the data is
// reported with Error set and not computed on the surrogates; failures on
// surrogates are counted and left out of M. Errors are for bad input or
// options only.
func Test(x []float64, stats []Statistic, opts TestOptions) (*Report, error) {
	if len(stats) == 0 {
		return nil, ErrNoStatistic
	}
	alpha := opts.Alpha
	if alpha == 0 {
		alpha = 0.05
	}
	side, err := opts.Side.resolve()
	if err != nil {
		return nil, fmt.Errorf("surrogate test: %w", err)
	}
	minM, err := MinSurrogates(alpha, side)
	if err != nil {
		return nil, fmt.Errorf("surrogate test: %w", err)
	}
	for i, s := range stats {
		if s.Func == nil {
			return nil, fmt.Errorf("surrogate test: statistic %d (%q) has no function", i, s.Name)
		}
	}
	p, trunc, warns, err := setup(x, opts.Options)
	if err != nil {
		return nil, fmt.Errorf("surrogate test: %w", err)
	}
	count := p.opt.Count
	rep := &Report{
		Method: p.opt.Method, NullHypothesis: p.opt.Method.NullHypothesis(), Count: count,
		Seed: p.opt.Seed, N: len(x), Used: p.n, Truncation: trunc, Alpha: alpha, Side: side,
		MinSurrogates: minM, Warnings: warns,
	}
	if count < minM {
		rep.Warnings = append(rep.Warnings, fmt.Sprintf(
			"%d surrogates cannot reach p ≤ %g %s: need at least %d", count, alpha, side, minM))
	}
	if p.opt.Method == Gauss && p.opt.GaussQuantiles && count > 1 {
		rep.Warnings = append(rep.Warnings,
			"gauss quantile surrogates are all identical: the rank test is degenerate")
	}

	// Observed values, on a private copy each.
	k := len(stats)
	obs := make([]float64, k)
	live := make([]bool, k)
	res := make([]Result, k)
	scratch := make([]float64, p.n)
	for j, s := range stats {
		res[j] = Result{Stat: s.Name, Method: p.opt.Method, Side: side, Alpha: alpha}
		v, err := evaluate(s.Func, p.x, scratch)
		if err != nil {
			res[j].Error = err.Error()
			obs[j] = math.NaN()
			continue
		}
		obs[j], live[j] = v, true
	}

	// Surrogate values: vals[j][i], ok[j][i].
	vals := make([][]float64, k)
	fails := make([][]string, k)
	for j := range vals {
		vals[j] = make([]float64, count)
		fails[j] = make([]string, count)
	}
	infos := make([]info, count)
	scratches := make([][]float64, max(1, p.opt.Workers))
	if slices.Contains(live, true) {
		p.forEach(func(w, i int, s []float64, inf info) {
			if scratches[w] == nil {
				scratches[w] = make([]float64, p.n)
			}
			infos[i] = inf
			for j, st := range stats {
				if !live[j] {
					continue
				}
				v, err := evaluate(st.Func, s, scratches[w])
				if err != nil {
					vals[j][i] = math.NaN()
					fails[j][i] = err.Error()
					continue
				}
				vals[j][i] = v
			}
		})
		if p.opt.Method == IAAFT {
			rep.IAAFT = summariseIAAFT(infos)
			if rep.IAAFT.NotConverged > 0 {
				rep.Warnings = append(rep.Warnings, fmt.Sprintf(
					"iaaft: %d of %d surrogates reached the iteration cap %d before converging",
					rep.IAAFT.NotConverged, count, p.opt.MaxIter))
			}
		}
	}

	ps := make([]float64, k)
	for j := range res {
		ps[j] = math.NaN()
		if !live[j] {
			setNaN(&res[j])
			res[j].Values = []float64{}
			continue
		}
		r := &res[j]
		r.Observed = obs[j]
		r.Values = make([]float64, 0, count)
		firstErr := ""
		for i, v := range vals[j] {
			if fails[j][i] != "" {
				r.Failed++
				if firstErr == "" {
					firstErr = fmt.Sprintf("surrogate %d: %s", i, fails[j][i])
				}
				continue
			}
			r.Values = append(r.Values, v)
		}
		r.Count = len(r.Values)
		if r.Failed > 0 {
			r.Warnings = append(r.Warnings, fmt.Sprintf(
				"failed on %d of %d surrogates (first: %s)", r.Failed, count, firstErr))
		}
		r.Mean, r.SD, r.Z = math.NaN(), math.NaN(), math.NaN()
		if r.Count > 0 {
			r.Mean = stat.Mean(r.Values, nil)
		}
		if r.Count > 1 {
			r.SD = stat.StdDev(r.Values, nil)
			r.Z = (r.Observed - r.Mean) / r.SD
		}
		if r.Count > 1 && r.SD == 0 {
			r.Z = math.NaN()
			r.Warnings = append(r.Warnings, "all surrogate values are equal: z-score undefined")
		}
		r.PUpper, r.PLower, r.PTwo = RankP(r.Observed, r.Values)
		r.P = pFor(side, r.PUpper, r.PLower, r.PTwo)
		if r.Count < minM && count >= minM {
			r.Warnings = append(r.Warnings, fmt.Sprintf(
				"only %d valid surrogate values: the smallest attainable p (%.3g) exceeds α = %g",
				r.Count, minP(side, r.Count), alpha))
		}
		ps[j] = r.P
	}
	holm := Holm(ps)
	tested := 0
	for j := range res {
		res[j].PHolm = holm[j]
		if !math.IsNaN(holm[j]) {
			tested++
			res[j].Significant = holm[j] <= alpha
		}
	}
	if tested > 1 {
		rep.Warnings = append(rep.Warnings, fmt.Sprintf(
			"%d statistics tested: judge significance by p_holm (Holm-adjusted), not by p", tested))
	}
	rep.Tests = res
	return rep, nil
}

// evaluate calls f on a copy of x in scratch, turning errors, non-finite
// values and panics into an error.
func evaluate(f func([]float64) (float64, error), x, scratch []float64) (v float64, err error) {
	copy(scratch, x)
	defer func() {
		if r := recover(); r != nil {
			v, err = math.NaN(), fmt.Errorf("panic: %v", r)
		}
	}()
	v, err = f(scratch)
	if err != nil {
		return math.NaN(), err
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return math.NaN(), fmt.Errorf("non-finite value %g", v)
	}
	return v, nil
}

func setNaN(r *Result) {
	nan := math.NaN()
	r.Observed, r.Mean, r.SD, r.Z = nan, nan, nan, nan
	r.P, r.PUpper, r.PLower, r.PTwo, r.PHolm = nan, nan, nan, nan, nan
}

func summariseIAAFT(infos []info) *IAAFTSummary {
	s := &IAAFTSummary{}
	for _, inf := range infos {
		s.MeanIterations += float64(inf.iter)
		s.MaxIterations = max(s.MaxIterations, inf.iter)
		s.MeanSpectralError += inf.specErr
		s.MaxSpectralError = math.Max(s.MaxSpectralError, inf.specErr)
		if !inf.converged {
			s.NotConverged++
		}
	}
	if len(infos) > 0 {
		s.MeanIterations /= float64(len(infos))
		s.MeanSpectralError /= float64(len(infos))
	}
	return s
}

// minP is the smallest p a rank test with m surrogates can give.
func minP(side Side, m int) float64 {
	if side == TwoSided {
		return math.Min(1, 2/float64(m+1))
	}
	return 1 / float64(m+1)
}
