package surrogate

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"github.com/tracesift/tracesift/features/nonlinear"
)

// Defaults of DeterminismOptions.
const (
	// DefaultDeterminismLength caps the stretch of a trace the determinism
	// test uses: the middle DefaultDeterminismLength samples of a longer
	// trace (then end matched). 4096 samples hold enough delay vectors for
	// the simplex forecast of every reference system and keep the test at
	// 0.3 (Hénon map) to 1.1 (AR(1) noise, embedded in dimension 8)
	// CPU-seconds per trace with 39 surrogates (measured on one core, see
	// BenchmarkDeterminismHenon4096 and BenchmarkDeterminismAR4096).
	DefaultDeterminismLength = 4096
	// DeterminismMinLength is the shortest stretch the test accepts: the
	// automatic delay embedding needs 200 samples, and end matching may
	// keep only 90% of the stretch.
	DeterminismMinLength = 256
	// maxForecastDelay caps the forecast horizon, as the nl_fc_rho_tau
	// feature does.
	maxForecastDelay = 50
)

// Names of the determinism statistics: the quantities of the features of
// the same names, computed here on the Gaussianised tested stretch.
const (
	// StatPredSkill is the simplex forecast correlation one embedding
	// delay ahead.
	StatPredSkill = "nl_fc_rho_tau"
	// StatReversal is |skewness| of the increments over one embedding
	// delay.
	StatReversal = "nl_trev_tau"
)

// determinismEmbed caps the work of the embedding search as the feature
// extraction does: Cao's method on 300 reference points of at most 10^4
// samples, dimensions up to 8.
var determinismEmbed = nonlinear.EmbedOptions{MaxRef: 300, MaxPoints: 10000, MaxDim: 8}

// ErrDeterminismOption reports an invalid DeterminismOptions field.
var ErrDeterminismOption = errors.New("invalid determinism-test option")

// DeterminismOptions control Determinism. The zero value means: IAAFT
// surrogates, the least count with which the test can reject at α (39 at
// α = 0.05), seed 0, α = 0.05, GOMAXPROCS workers, the middle 4096 samples
// of longer traces, end matching on, delay and dimension chosen
// automatically.
type DeterminismOptions struct {
	// Count is the number of surrogates M; 0 means
	// DeterminismSurrogates(Alpha).
	Count int
	// Seed selects the surrogates' random streams (see Options.Seed).
	Seed uint64
	// Alpha is the level of the overall decision; 0 means 0.05.
	Alpha float64
	// Workers is the number of goroutines making surrogates; ≤ 0 means
	// runtime.GOMAXPROCS(0). The result does not depend on it.
	Workers int
	// MaxLength caps the stretch tested (the middle of a longer trace);
	// 0 means DefaultDeterminismLength, negative means the whole trace.
	MaxLength int
	// NoEndMatch tests the stretch as it is instead of its longest
	// sub-series (≥ 90%) whose two ends match (see MatchEnds).
	NoEndMatch bool
	// Delay and Dim fix the embedding; 0 chooses each on the tested
	// (Gaussianised) stretch (see nonlinear.Embed).
	Delay, Dim int
	// Progress, if set, is called after each surrogate (see
	// Options.Progress).
	Progress func(done, total int)
}

// DeterminismStat is the rank test of one determinism statistic. Numbers
// that could not be computed are NaN.
type DeterminismStat struct {
	// Name is StatPredSkill or StatReversal; Side is always Upper: the
	// trace is more predictable, or more time-asymmetric, than its
	// surrogates.
	Name string
	Side Side
	// Observed is the value on the tested stretch (Gaussianised); Mean
	// and SD (M−1) those of the surrogate values.
	Observed, Mean, SD float64
	// P = (1 + #{surrogates ≥ observed})/(M + 1); PHolm is Holm-adjusted
	// over the statistics.
	P, PHolm float64
	// Significant reports PHolm ≤ Alpha.
	Significant bool
	// Count is the number of surrogates the statistic was computed on,
	// Failed the number on which it failed.
	Count, Failed int
	// Values are the surrogate values in surrogate order.
	Values []float64
	// Error says why the statistic failed on the trace ("" if it did not).
	Error    string
	Warnings []string
}

// DeterminismResult is the outcome of Determinism.
type DeterminismResult struct {
	Method         Method
	NullHypothesis string
	// Count is M, Seed the seed, Alpha the level.
	Count int
	Seed  uint64
	Alpha float64
	// MinSurrogates is the least M with which the smallest Holm-adjusted
	// p, k/(M+1) for k one-sided statistics, can reach Alpha.
	MinSurrogates int
	// N is the length of the trace; the stretch tested is x[Start :
	// Start+Len].
	N, Start, Len int
	// EndMatched reports that Start and Len come from end matching of the
	// middle stretch (on its Gaussianised values, so that only ranks
	// matter); Mismatch is the end mismatch of the Gaussianised tested
	// stretch (see Mismatch).
	EndMatched bool
	Mismatch   float64
	// Delay and Dim are the embedding (chosen once on the Gaussianised
	// stretch, used for the trace and every surrogate); Horizon is the
	// forecast horizon min(Delay, 50).
	Delay, Dim, Horizon int
	Stats               []DeterminismStat
	// Rejected reports that some statistic is significant after Holm's
	// adjustment: the structure of the trace is not explained by a static
	// monotone transform of a stationary linear Gaussian process.
	Rejected bool
	// IAAFT sums up the surrogates' iterations and spectral errors.
	IAAFT    *IAAFTSummary
	Warnings []string
}

// DeterminismSurrogates returns the least number of surrogates with which
// the determinism test can reject at level alpha: with k = 2 one-sided
// statistics the smallest rank p is 1/(M+1) and Holm multiplies it by k,
// so M = ⌈k/α − 1⌉ (39 at α = 0.05). Theiler et al., Physica D 58 (1992)
// 77; Holm, Scand. J. Statist. 6 (1979) 65. 0 for alpha outside (0, 1).
func DeterminismSurrogates(alpha float64) int {
	if !(alpha > 0 && alpha < 1) {
		return 0
	}
	m, err := MinSurrogates(alpha/float64(len(determinismStats)), Upper)
	if err != nil {
		return 0
	}
	return m
}

// determinismStats are the names of the statistics in the order tested.
var determinismStats = []string{StatPredSkill, StatReversal}

// Determinism tests whether x holds structure that a static monotone
// transform of a stationary linear Gaussian process cannot produce, the
// null hypothesis of IAAFT surrogates (Schreiber & Schmitz, Phys. Rev.
// Lett. 77 (1996) 635; Theiler et al., Physica D 58 (1992) 77).
//
// The stretch tested is the middle opts.MaxLength samples of x (all of it
// when shorter), then, unless opts.NoEndMatch, its longest sub-series
// (≥ 90%) whose Gaussianised ends match (see MatchEnds). The stretch is
// Gaussianised (see Gaussianise: each value replaced by the normal
// quantile of its rank), which leaves the null hypothesis unchanged (a
// monotone transform of a linear Gaussian process stays one) but removes
// the marginal distribution from the problem: IAAFT surrogates of a strongly skewed
// series are measurably whiter than it, which made the untransformed
// statistics reject a lognormal AR(1) process in 10 (forecast) and 8
// (asymmetry) of 100 series at a per-statistic level of 1/40 (2.5
// expected; measured at n = 2000, M = 39), against 3 and 3 after
// Gaussianisation; and the test becomes invariant to any increasing
// transform of the trace. Two statistics are then computed on the
// Gaussianised stretch and on M IAAFT surrogates of it:
//
//   - nl_fc_rho_tau: the correlation between simplex forecasts one
//     embedding delay τ ahead (at most 50 samples) and the truth
//     (Sugihara & May, Nature 344 (1990) 734). Determinism makes the trace
//     more predictable than surrogates with its spectrum and values:
//     one-sided, upper.
//   - nl_trev_tau: |⟨Δ³⟩|/⟨Δ²⟩^{3/2} with Δ_t = x_{t+τ} − x_t, the
//     time-reversal asymmetry of the increments over one delay. Every
//     surrogate is time-reversible, so the signed statistic has a null
//     distribution symmetric about 0 and its sign depends only on the sign
//     convention of the measured quantity (x → −x flips it): testing |·|
//     one-sided (upper) covers both directions with half the surrogates a
//     two-sided test needs.
//
// The delay τ and the dimension d are chosen once, on the Gaussianised
// stretch (nonlinear.Embed: first AMI minimum, Cao's method), and the same
// (d, τ) is used for the trace and for every surrogate, so that the
// statistics of trace and surrogates are the same function. The rank
// p-values are p = (1 + #{surrogates ≥ observed})/(M + 1) (see RankP),
// adjusted by Holm across the two, and the null is rejected when either
// adjusted p ≤ α, which keeps the false-rejection rate at most α.
//
// x must hold at least DeterminismMinLength finite values, not all equal.
// Surrogate i is drawn from a random stream keyed by (opts.Seed, i), so the
// result is bit-identical for a seed whatever opts.Workers is. Errors are
// for bad input or options only; a statistic that fails on the trace is
// reported in its Error field.
func Determinism(x []float64, opts DeterminismOptions) (*DeterminismResult, error) {
	alpha := opts.Alpha
	if alpha == 0 {
		alpha = 0.05
	}
	if !(alpha > 0 && alpha < 1) {
		return nil, fmt.Errorf("determinism test: %w: alpha %g not in (0, 1)", ErrDeterminismOption, alpha)
	}
	minM := DeterminismSurrogates(alpha)
	count := opts.Count
	switch {
	case count == 0:
		count = minM
	case count < 0:
		return nil, fmt.Errorf("determinism test: %w: count %d < 0", ErrDeterminismOption, count)
	}
	if opts.Delay < 0 || opts.Dim < 0 {
		return nil, fmt.Errorf("determinism test: %w: delay %d, dimension %d", ErrDeterminismOption, opts.Delay, opts.Dim)
	}
	maxLen := opts.MaxLength
	switch {
	case maxLen == 0:
		maxLen = DefaultDeterminismLength
	case maxLen < 0:
		maxLen = len(x)
	case maxLen < DeterminismMinLength:
		return nil, fmt.Errorf("determinism test: %w: max length %d < %d", ErrDeterminismOption, maxLen, DeterminismMinLength)
	}
	if len(x) < DeterminismMinLength {
		return nil, fmt.Errorf("determinism test: %w: %d samples, need at least %d", ErrTooShort, len(x), DeterminismMinLength)
	}
	if err := checkSeries(x); err != nil {
		return nil, fmt.Errorf("determinism test: %w", err)
	}

	res := &DeterminismResult{Method: IAAFT, NullHypothesis: IAAFT.NullHypothesis(), Count: count, Seed: opts.Seed,
		Alpha: alpha, MinSurrogates: minM, N: len(x)}
	start, seg := 0, x
	if len(x) > maxLen {
		start = (len(x) - maxLen) / 2
		seg = x[start : start+maxLen]
	}
	g, err := Gaussianise(seg)
	if err != nil {
		return nil, fmt.Errorf("determinism test: %w", err)
	}
	if !opts.NoEndMatch {
		// Match the ends of the Gaussianised stretch, the series the
		// transforms see, so that the choice depends on ranks only.
		t, err := MatchEnds(g, DefaultMinFraction)
		if err != nil {
			return nil, fmt.Errorf("determinism test: %w", err)
		}
		start += t.Start
		seg = seg[t.Start : t.Start+t.Len]
		if g, err = Gaussianise(seg); err != nil {
			return nil, fmt.Errorf("determinism test: %w", err)
		}
		res.EndMatched = true
	}
	res.Start, res.Len = start, len(seg)
	if err := checkSeries(seg); err != nil {
		return nil, fmt.Errorf("determinism test: samples [%d, %d): %w", start, start+len(seg), err)
	}
	res.Mismatch = Mismatch(g)
	if lk := EndLeakage(g); lk > DefaultLeakageWarn {
		advice := "end matching could not remove it: the trace may be non-stationary"
		if opts.NoEndMatch {
			advice = "end matching would reduce it"
		}
		res.Warnings = append(res.Warnings, fmt.Sprintf(
			"end mismatch: the jump between the ends of the tested stretch would carry %.3g times the power of the upper half of its spectrum; surrogates will hold spurious high frequencies (%s)", lk, advice))
	}

	emb, err := nonlinear.Embed(g, nonlinear.EmbedOptions{Delay: opts.Delay, Dim: opts.Dim,
		MaxRef: determinismEmbed.MaxRef, MaxPoints: determinismEmbed.MaxPoints, MaxDim: determinismEmbed.MaxDim})
	if err != nil {
		return nil, fmt.Errorf("determinism test: samples [%d, %d): %w", start, start+len(seg), err)
	}
	res.Delay, res.Dim = emb.Delay, emb.Dim
	res.Horizon = min(emb.Delay, maxForecastDelay)
	stats := determinismStatistics(emb.Fixed(), res.Horizon)

	rep, err := Test(g, stats, TestOptions{
		Options: Options{Method: IAAFT, Count: count, Seed: opts.Seed, Workers: opts.Workers, Progress: opts.Progress,
			LeakageWarn: -1},
		Alpha: alpha,
		Side:  Upper,
	})
	if err != nil {
		return nil, fmt.Errorf("determinism test: %w", err)
	}
	res.IAAFT = rep.IAAFT
	if count < minM {
		res.Warnings = append(res.Warnings, fmt.Sprintf(
			"%d surrogates cannot reach α = %g after Holm's adjustment over %d statistics: the smallest adjusted p is %d/%d; use at least %d",
			count, alpha, len(stats), len(stats), count+1, minM))
	}
	// Keep the runner's warnings about the series, not those about its own
	// (per-statistic) surrogate minimum or the Holm reminder: the decision
	// here is already made on the adjusted p-values.
	for _, w := range rep.Warnings {
		if !isRunnerNote(w) {
			res.Warnings = append(res.Warnings, w)
		}
	}
	for _, r := range rep.Tests {
		s := DeterminismStat{Name: r.Stat, Side: Upper, Observed: r.Observed, Mean: r.Mean, SD: r.SD,
			P: r.P, PHolm: r.PHolm, Significant: r.Significant, Count: r.Count, Failed: r.Failed,
			Values: r.Values, Error: r.Error, Warnings: r.Warnings}
		res.Rejected = res.Rejected || s.Significant
		res.Stats = append(res.Stats, s)
	}
	return res, nil
}

// isRunnerNote recognises the notes of Test that Determinism replaces by
// its own: the per-statistic surrogate minimum and the Holm reminder.
func isRunnerNote(w string) bool {
	return strings.Contains(w, "cannot reach p ≤") || strings.Contains(w, "judge significance by p_holm")
}

// determinismStatistics returns the two statistics for a fixed embedding
// and forecast horizon h ≤ MaxHorizon.
func determinismStatistics(emb nonlinear.EmbedOptions, h int) []Statistic {
	return []Statistic{
		{Name: StatPredSkill, Func: func(y []float64) (float64, error) {
			r, err := nonlinear.Prediction(y, nonlinear.PredictionOptions{Embed: emb, MaxHorizon: h})
			if err != nil {
				return math.NaN(), err
			}
			return r.Rho[h-1], nil
		}},
		{Name: StatReversal, Func: func(y []float64) (float64, error) {
			r, err := nonlinear.Asymmetry(y, nonlinear.AsymmetryOptions{Lag: emb.Delay})
			if err != nil {
				return math.NaN(), err
			}
			return r.Abs, nil
		}},
	}
}

// DeterminismStatNames returns the names of the statistics of Determinism
// in the order they are reported.
func DeterminismStatNames() []string { return append([]string(nil), determinismStats...) }
