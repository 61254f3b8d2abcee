package benchmarks

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"

	"github.com/tracesift/tracesift/features/nonlinear"
	"github.com/tracesift/tracesift/features/ordinal"
	"github.com/tracesift/tracesift/features/scaling"
	"github.com/tracesift/tracesift/generators"
	"github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

// InvariantRow is the recovery of one published or analytic invariant of a
// reference system by one of the project's estimators.
type InvariantRow struct {
	// ID names the check, e.g. "nl_div_rate/lorenz" or "sc_fluct_a1/fgn@h=0.3".
	ID string `json:"id"`
	// System is the generators registry name; Params its full parameter
	// set (defaults with the check's overrides).
	System string             `json:"system"`
	Params map[string]float64 `json:"params"`
	// Invariant is the quantity, named like the feature it corresponds to.
	Invariant string `json:"invariant"`
	// Estimator names the project function that measured it and its
	// settings.
	Estimator string `json:"estimator"`
	// Value is the published or analytic value in the estimator's unit
	// (e.g. per sample step for a Lyapunov exponent); Published states it as
	// published (e.g. per time unit) when that differs; Unit is the unit of
	// Value.
	Value     Float  `json:"value"`
	Published string `json:"published"`
	Unit      string `json:"unit,omitempty"`
	// Source is where Value comes from, as REFERENCES.md cites it.
	Source string `json:"source"`
	// Check is "value" (|median − Value| within the tolerance) or "absent"
	// (the estimator must decline to report a value in every run, e.g. no
	// positive Lyapunov exponent for regular motion).
	Check string `json:"check"`
	// Tolerance is the allowed |median − Value| (absolute) or
	// |median − Value|/|Value| (relative), as ToleranceKind says;
	// ToleranceSource says which project test or derivation it comes from.
	Tolerance       Float  `json:"tolerance"`
	ToleranceKind   string `json:"tolerance_kind"`
	ToleranceSource string `json:"tolerance_source"`
	// Lengths are the series lengths measured (the first is the one the
	// tolerance is stated for) and Seeds the series per length.
	Lengths []int `json:"lengths"`
	Seeds   int   `json:"seeds"`
	// Estimate pools all runs; ByLength splits them by length.
	Estimate Spread           `json:"estimate"`
	ByLength []LengthEstimate `json:"by_length"`
	// Error is median − Value; RelError is Error/|Value| (null for Value
	// 0); Within says whether the check passed.
	Error    Float `json:"error"`
	RelError Float `json:"relative_error"`
	Within   bool  `json:"within"`
	// Note explains finite-size effects or known limits of the check.
	Note string `json:"note,omitempty"`
	// Runs are the individual estimates, length-major then seed (null when
	// the estimator reported no value); Declined gives the estimator's
	// reason for each null run, Failures the errors of runs that failed.
	Runs     []Float  `json:"runs"`
	Declined []string `json:"declined,omitempty"`
	Failures []string `json:"failures,omitempty"`
}

// LengthEstimate is the spread of the estimates at one length.
type LengthEstimate struct {
	N        int    `json:"n"`
	Estimate Spread `json:"estimate"`
}

// SkippedInvariant is a registry invariant the suite does not measure, with
// the reason.
type SkippedInvariant struct {
	System    string `json:"system"`
	Invariant string `json:"invariant"`
	Value     Float  `json:"value"`
	Source    string `json:"source"`
	Reason    string `json:"reason"`
}

// Check kinds of InvariantRow.Check.
const (
	CheckValue  = "value"
	CheckAbsent = "absent"
)

// measurement is one run of an estimator: the value (NaN when the
// estimator declined, with why), and an auxiliary number some tolerances
// need (the standard error of a fit).
type measurement struct {
	v, aux float64
	why    string
}

type invariantSpec struct {
	id, system string
	params     map[string]float64
	name       string
	estimator  string
	value      float64
	published  string
	unit       string
	source     string
	check      string
	relative   bool
	// tol returns the tolerance for the stated length n and the median of
	// the runs' auxiliary numbers.
	tol       func(n int, aux float64) float64
	tolSource string
	n         int
	measure   func(x []float64) (measurement, error)
	note      string
}

func fixedTol(t float64) func(int, float64) float64 { return func(int, float64) float64 { return t } }

// Estimators, wrapped as the feature vector calls them (defaults unless
// stated).
func measureLyapunov(x []float64) (measurement, error) {
	r, err := nonlinear.Lyapunov(x, nonlinear.LyapunovOptions{})
	if err != nil {
		return measurement{}, err
	}
	if !r.Credible {
		return measurement{v: math.NaN(), why: r.Reason}, nil
	}
	return measurement{v: r.Lambda}, nil
}

func measureCorrDim(x []float64) (measurement, error) {
	r, err := nonlinear.CorrelationDimension(x, nonlinear.CorrDimOptions{})
	if err != nil {
		return measurement{}, err
	}
	return measurement{v: r.D2, why: r.Reason}, nil
}

func measureDFA(x []float64) (measurement, error) {
	r, err := scaling.DFA(x, scaling.DFAOptions{Order: 1})
	return measurement{v: r.Alpha, aux: r.AlphaErr}, err
}

func measureRS(x []float64) (measurement, error) {
	r, err := scaling.RescaledRange(x, scaling.RSOptions{})
	return measurement{v: r.H, aux: r.HErr}, err
}

func measureSpectral(x []float64) (measurement, error) {
	r, err := scaling.SpectralSlope(x, scaling.SlopeOptions{})
	return measurement{v: r.Beta, aux: r.BetaErr}, err
}

func measureLag1(x []float64) (measurement, error) {
	r, err := scaling.ACF(x, scaling.ACFOptions{MaxLag: 1})
	if err != nil {
		return measurement{}, err
	}
	return measurement{v: r[1]}, nil
}

func measureSampEn(x []float64) (measurement, error) {
	r, err := nonlinear.SampleEntropy(x, nonlinear.SampEnOptions{})
	if err != nil {
		return measurement{}, err
	}
	if !r.Defined {
		return measurement{v: math.NaN(), why: "no template matches of length m+1"}, nil
	}
	return measurement{v: r.Value}, nil
}

func measurePermEntropy(x []float64) (measurement, error) {
	r, err := ordinal.Entropy(x, ordinal.Options{Order: 4})
	return measurement{v: r.Entropy, aux: r.BiasIID}, err
}

func measureComplexity(x []float64) (measurement, error) {
	r, err := ordinal.Complexity(x, ordinal.Options{Order: 4})
	return measurement{v: r.Complexity}, err
}

func measureMissingTriples(x []float64) (measurement, error) {
	r, err := ordinal.Missing(x, ordinal.Options{Order: 3})
	return measurement{v: float64(r.Missing)}, err
}

func measureHVGMeanDegree(x []float64) (measurement, error) {
	g, err := visibility.Horizontal(x, visibility.Options{})
	if err != nil {
		return measurement{}, err
	}
	return measurement{v: networks.Degrees(g).Mean}, nil
}

func measureHVGLambda(x []float64) (measurement, error) {
	g, err := visibility.Horizontal(x, visibility.Options{})
	if err != nil {
		return measurement{}, err
	}
	t, err := networks.ExponentialTail(g, networks.TailOptions{})
	if errors.Is(err, networks.ErrTooFewPoints) {
		return measurement{v: math.NaN(), why: err.Error()}, nil
	}
	return measurement{v: t.Lambda, aux: t.StdErr}, err
}

func measureNVGGamma(x []float64) (measurement, error) {
	g, err := visibility.Natural(x, visibility.Options{})
	if err != nil {
		return measurement{}, err
	}
	p, err := networks.PowerLaw(g, networks.PowerLawOptions{})
	if errors.Is(err, networks.ErrTooFewPoints) {
		return measurement{v: math.NaN(), why: err.Error()}, nil
	}
	return measurement{v: p.Gamma, aux: p.StdErr}, err
}

// bartlettSE is the large-sample standard error of the lag-k sample
// autocorrelation of an AR(1) process with coefficient φ (Bartlett's
// formula, as the generators tests use it).
func bartlettSE(phi float64, k, n int) float64 {
	p2k := math.Pow(phi, 2*float64(k))
	v := ((1+phi*phi)*(1-p2k)/(1-phi*phi) - 2*float64(k)*p2k) / float64(n)
	return math.Sqrt(v)
}

// harmonic returns H_n = Σ_{k≤n} 1/k.
func harmonic(n int) float64 {
	var h float64
	for k := n; k >= 1; k-- {
		h += 1 / float64(k)
	}
	return h
}

// permBiasIID is the i.i.d. shortfall of the normalised permutation entropy
// below 1, (d!−1)/(2·W·ln d!) with W = n − d + 1 windows (the Miller–Madow
// bias as features/ordinal states it).
func permBiasIID(order, n int) float64 {
	f := 1
	for k := 2; k <= order; k++ {
		f *= k
	}
	w := float64(n - order + 1)
	return float64(f-1) / (2 * w * math.Log(float64(f)))
}

// Tolerance sources, quoted in every row.
const (
	tolLyapMaps  = "features/nonlinear rosenstein_test.go: 10% at n = 5000 (logistic r = 4, Hénon)"
	tolLyapMapsB = "as for the logistic and Hénon maps in features/nonlinear rosenstein_test.go: 10% at n = 5000 (no project test of this system)"
	tolLyapFlow  = "features/nonlinear rosenstein_test.go: 15% at n = 20000 (Lorenz, dt = 0.01)"
	tolLyapFlowB = "as for the Lorenz flow in features/nonlinear rosenstein_test.go: 15% at n = 20000 (no project test of this system)"
	tolD2        = "features/nonlinear grassberger_test.go: Hénon ± 0.1 at n = 10000, Lorenz ± 0.15 at n = 20000"
	tolDFA       = "features/scaling dfa_test.go: ± 0.05 at n = 2^14 (mean of 8 seeds; seed sd 0.02–0.035)"
	tolDFAB      = "as for Brownian motion in features/scaling dfa_test.go: ± 0.05 at n = 2^14 (no project test of fBm)"
	tolRS        = "features/scaling rescaled_range_test.go: ± 0.1 at n = 2^14 (Anis–Lloyd corrected; seed sd ≈ 0.03)"
	tolSpecWB    = "features/scaling spectral_slope_test.go: ± 0.05 for white and Brownian noise at n = 2^14"
	tolSpecFGN   = "features/scaling spectral_slope_test.go: ± 0.07 against 2H − 1 at n = 2^14 (band curvature ≤ 0.031 + 3 sd)"
	tolSpecFBM   = "bench choice, no project test: ± 0.07 as for fGn in features/scaling spectral_slope_test.go"
	tolSpecPL    = "bench choice, no project test of this estimator on it: ± 0.05 as generators noise_test.go allows for the periodogram slope of 1/f^β noise"
	tolSpecTS    = "bench choice, no project test: ± 0.15 (a sum of K Lorentzians is 1/f only approximately, McWhorter's band; seed spread ≈ 0.1 measured)"
	tolHVGMean   = "derived (networks/visibility hvg_test.go): the finite-n expectation 4 − 4H_n/n differs from 4 by 4H_n/n; plus 0.5/√n for the replicate spread"
	tolHVGSine   = "bench choice, no project test: ± 0.01 (the mean degree of an exactly periodic series converges as O(T/n))"
	tolHVGLambda = "networks/visibility hvg_test.go: 4 standard errors of the geometric maximum-likelihood fit (median StdErr of the runs)"
	tolNVG       = "networks/visibility nvg_test.go: ± 0.25 at n = 2^16 (finite-size excess of the KS-chosen tail)"
	tolPE        = "derived (features/ordinal ordinal_test.go): 1 − H must lie within 2× the i.i.d. plug-in bias (d!−1)/(2W ln d!) at the stated length"
	tolSC        = "derived (features/ordinal ordinal_test.go): C ≈ Q0·ln(d!)·(1 − H)·H/4, bounded with 1 − H ≤ 2× the i.i.d. bias"
	tolForbidden = "exact: the strictly decreasing triple is the only order-3 pattern the map cannot produce"
	tolSampEn    = "features/nonlinear sampen_test.go: ± 0.015 at n = 20000"
	tolACF       = "generators noise_test.go: 5 Bartlett standard errors of the lag-1 autocorrelation at the stated length"
	tolAbsent    = "features/nonlinear: Lyapunov reports no credible exponential divergence for regular motion (rosenstein.go criteria)"
)

// registryInvariant returns the registry's entry for a system's invariant.
func registryInvariant(system, name string) (*generators.System, generators.Invariant, error) {
	sys, err := generators.Lookup(system)
	if err != nil {
		return nil, generators.Invariant{}, err
	}
	for _, iv := range sys.Invariants {
		if iv.Name == name {
			return sys, iv, nil
		}
	}
	return nil, generators.Invariant{}, fmt.Errorf("%s has no registered invariant %s", system, name)
}

// invariantSpecs lists every check of the suite. Values and sources of
// registry invariants come from generators.System.Invariants, so the suite
// follows the registry; the others (H sweeps, NVG exponent, complexity,
// forbidden patterns) cite REFERENCES.md directly.
func invariantSpecs() ([]invariantSpec, error) {
	var specs []invariantSpec
	var firstErr error
	fromRegistry := func(s invariantSpec) {
		sys, iv, err := registryInvariant(s.system, s.name)
		if err != nil {
			if firstErr == nil {
				firstErr = err
			}
			return
		}
		s.value = iv.Value
		s.source = iv.Source
		s.unit = iv.Unit
		s.published = strings.TrimSpace(strconvG(iv.Value) + " " + iv.Unit)
		if iv.Unit == "per time unit" {
			// The estimator measures per sample step: λ·dt.
			dt, err := sys.SampleInterval(s.params)
			if err != nil {
				if firstErr == nil {
					firstErr = err
				}
				return
			}
			s.value = iv.Value * dt
			s.unit = "per sample"
			s.published = fmt.Sprintf("%s per time unit × dt = %s", strconvG(iv.Value), strconvG(dt))
		}
		specs = append(specs, s)
	}
	direct := func(s invariantSpec) {
		s.published = strconvG(s.value)
		specs = append(specs, s)
	}
	lyapEst := "nonlinear.Lyapunov (Rosenstein; automatic embedding, defaults)"
	for _, c := range []struct {
		system  string
		n       int
		rel     float64
		tolSrc  string
		flowDoc string
	}{
		{"logistic", 5000, 0.10, tolLyapMaps, ""},
		{"henon", 5000, 0.10, tolLyapMaps, ""},
		{"cubic", 5000, 0.10, tolLyapMapsB, ""},
		{"tent", 5000, 0.10, tolLyapMapsB, ""},
		{"lorenz", 20000, 0.15, tolLyapFlow, ""},
		{"rossler", 20000, 0.15, tolLyapFlowB, "the Rössler exponent is small (≈0.007 per sample at dt = 0.1), so the divergence curve is long and shallow; the estimate rises slowly with n"},
	} {
		fromRegistry(invariantSpec{id: "nl_div_rate/" + c.system, system: c.system, name: "nl_div_rate", estimator: lyapEst,
			check: CheckValue, relative: true, tol: fixedTol(c.rel), tolSource: c.tolSrc, n: c.n, measure: measureLyapunov, note: c.flowDoc})
	}
	fromRegistry(invariantSpec{id: "nl_div_rate/van-der-pol", system: "van-der-pol", name: "nl_div_rate", estimator: lyapEst,
		check: CheckAbsent, tolSource: tolAbsent, n: 20000, measure: measureLyapunov,
		note: "λ1 = 0 on the limit cycle: the estimator must find no exponential divergence to fit"})

	d2Est := "nonlinear.CorrelationDimension (Grassberger–Procaccia; defaults)"
	fromRegistry(invariantSpec{id: "nl_gp_dim/henon", system: "henon", name: "nl_gp_dim", estimator: d2Est, check: CheckValue,
		tol: fixedTol(0.1), tolSource: tolD2, n: 10000, measure: measureCorrDim,
		note: "the published uncertainty is ± 0.01; the tolerance is the project test's"})
	fromRegistry(invariantSpec{id: "nl_gp_dim/lorenz", system: "lorenz", name: "nl_gp_dim", estimator: d2Est, check: CheckValue,
		tol: fixedTol(0.15), tolSource: tolD2, n: 20000, measure: measureCorrDim,
		note: "the published uncertainty is ± 0.01; the tolerance is the project test's"})

	const n14 = 1 << 14
	dfaEst := "scaling.DFA (order 1, 20 log-spaced windows from the default minimum to n/4)"
	fromRegistry(invariantSpec{id: "sc_fluct_a1/white", system: "white", name: "sc_fluct_a1", estimator: dfaEst, check: CheckValue,
		tol: fixedTol(0.05), tolSource: tolDFA, n: n14, measure: measureDFA})
	fromRegistry(invariantSpec{id: "sc_fluct_a1/brownian", system: "brownian", name: "sc_fluct_a1", estimator: dfaEst, check: CheckValue,
		tol: fixedTol(0.05), tolSource: tolDFA, n: n14, measure: measureDFA})
	for _, h := range []float64{0.3, 0.5, 0.7, 0.9} {
		s := invariantSpec{id: fmt.Sprintf("sc_fluct_a1/fgn@h=%g", h), system: "fgn", params: map[string]float64{"h": h}, name: "sc_fluct_a1",
			estimator: dfaEst, check: CheckValue, tol: fixedTol(0.05), tolSource: tolDFA, n: n14, measure: measureDFA}
		if h == 0.7 {
			fromRegistry(s)
			continue
		}
		s.value, s.source = h, "Peng et al., Phys. Rev. E 49 (1994) 1685: α = H for fGn"
		direct(s)
	}
	fromRegistry(invariantSpec{id: "sc_fluct_a1/fbm", system: "fbm", name: "sc_fluct_a1", estimator: dfaEst, check: CheckValue,
		tol: fixedTol(0.05), tolSource: tolDFAB, n: n14, measure: measureDFA})

	rsEst := "scaling.RescaledRange (Anis–Lloyd correction, blocks 50..n/4)"
	for _, h := range []float64{0.3, 0.5, 0.7, 0.9} {
		direct(invariantSpec{id: fmt.Sprintf("sc_range_h/fgn@h=%g", h), system: "fgn", params: map[string]float64{"h": h}, name: "sc_range_h",
			estimator: rsEst, value: h, source: "Hurst (1951); Anis & Lloyd, Biometrika 63 (1976) 111 (confirmed: neuropsychology/NeuroKit neurokit2/complexity/fractal_hurst.py): H with small-sample correction",
			check: CheckValue, tol: fixedTol(0.1), tolSource: tolRS, n: n14, measure: measureRS,
			note: "R/S is known to underestimate strongly persistent noise"})
	}

	specEst := "scaling.SpectralSlope (Welch, Hann, band 2/segment..0.25 cycles/sample)"
	fromRegistry(invariantSpec{id: "sc_psd_beta/white", system: "white", name: "sc_psd_beta", estimator: specEst, check: CheckValue,
		tol: fixedTol(0.05), tolSource: tolSpecWB, n: n14, measure: measureSpectral})
	fromRegistry(invariantSpec{id: "sc_psd_beta/brownian", system: "brownian", name: "sc_psd_beta", estimator: specEst, check: CheckValue,
		tol: fixedTol(0.05), tolSource: tolSpecWB, n: n14, measure: measureSpectral})
	for _, h := range []float64{0.3, 0.5, 0.7, 0.9} {
		s := invariantSpec{id: fmt.Sprintf("sc_psd_beta/fgn@h=%g", h), system: "fgn", params: map[string]float64{"h": h}, name: "sc_psd_beta",
			estimator: specEst, check: CheckValue, tol: fixedTol(0.07), tolSource: tolSpecFGN, n: n14, measure: measureSpectral}
		if h == 0.7 {
			fromRegistry(s)
			continue
		}
		s.value, s.source = 2*h-1, "standard result: fGn spectrum ~ f^-(2H-1)"
		direct(s)
	}
	fromRegistry(invariantSpec{id: "sc_psd_beta/fbm", system: "fbm", name: "sc_psd_beta", estimator: specEst, check: CheckValue,
		tol: fixedTol(0.07), tolSource: tolSpecFBM, n: n14, measure: measureSpectral})
	fromRegistry(invariantSpec{id: "sc_psd_beta/powerlaw", system: "powerlaw", name: "sc_psd_beta", estimator: specEst, check: CheckValue,
		tol: fixedTol(0.05), tolSource: tolSpecPL, n: n14, measure: measureSpectral})
	fromRegistry(invariantSpec{id: "sc_psd_beta/telegraph-sum", system: "telegraph-sum", name: "sc_psd_beta", estimator: specEst, check: CheckValue,
		tol: fixedTol(0.15), tolSource: tolSpecTS, n: n14, measure: measureSpectral})

	const nHVG = 100000
	hvgMeanTol := func(n int, _ float64) float64 {
		return 4*harmonic(n)/float64(n) + 0.5/math.Sqrt(float64(n))
	}
	hvgEst := "visibility.Horizontal + networks.Degrees (mean degree)"
	for _, sys := range []string{"white", "student-t", "stable", "iid"} {
		fromRegistry(invariantSpec{id: "hv_deg_mean/" + sys, system: sys, name: "hv_deg_mean", estimator: hvgEst, check: CheckValue,
			tol: hvgMeanTol, tolSource: tolHVGMean, n: nHVG, measure: measureHVGMeanDegree})
	}
	fromRegistry(invariantSpec{id: "hv_deg_mean/sine", system: "sine", name: "hv_deg_mean", estimator: hvgEst, check: CheckValue,
		tol: fixedTol(0.01), tolSource: tolHVGSine, n: nHVG, measure: measureHVGMeanDegree,
		note: "the formula holds for an exactly periodic series; sin(2πt/T + φ) evaluated in floating point repeats only up to rounding, and the horizontal criterion resolves those ties, which raises ⟨k⟩ towards 4"})
	lambdaEst := "visibility.Horizontal + networks.ExponentialTail (geometric MLE, KS-chosen k_min)"
	for _, sys := range []string{"white", "student-t"} {
		fromRegistry(invariantSpec{id: "hv_tail_exprate/" + sys, system: sys, name: "hv_tail_exprate", estimator: lambdaEst, check: CheckValue,
			tol: func(_ int, se float64) float64 { return 4 * se }, tolSource: tolHVGLambda, n: nHVG, measure: measureHVGLambda})
	}

	nvgEst := "visibility.Natural + networks.PowerLaw (discrete MLE, KS-chosen k_min)"
	for _, h := range []float64{0.5, 0.7} {
		direct(invariantSpec{id: fmt.Sprintf("nv_tail_powexp/fbm@h=%g", h), system: "fbm", params: map[string]float64{"h": h}, name: "nv_tail_powexp",
			estimator: nvgEst, value: 3 - 2*h, source: "Lacasa et al., EPL 86 (2009) 30001 (memory): γ = 3 − 2H",
			check: CheckValue, tol: fixedTol(0.25), tolSource: tolNVG, n: 1 << 16, measure: measureNVGGamma,
			note: "finite size: at n = 2^16 the KS-chosen tail reaches the degree cutoff (the visibility tests measured 2.17 at 2^16, 2.00 at 2^18 for H = 0.5); H = 0.3 is left out because our fBm NVGs show no power law there"})
	}

	const n15 = 1 << 15
	peEst := "ordinal.Entropy (order 4, delay 1, as the op_ent_d4 feature)"
	for _, sys := range []string{"white", "student-t", "stable", "iid"} {
		fromRegistry(invariantSpec{id: "op_ent_d4/" + sys, system: sys, name: "op_ent_d4", estimator: peEst, check: CheckValue,
			tol: func(n int, _ float64) float64 { return 2 * permBiasIID(4, n) }, tolSource: tolPE, n: n15, measure: measurePermEntropy})
	}
	direct(invariantSpec{id: "op_jsc_d4/white", system: "white", name: "op_jsc_d4",
		estimator: "ordinal.Complexity (order 4, delay 1, as the op_jsc_d4 feature)", value: 0,
		source: "Rosso et al., Phys. Rev. Lett. 99 (2007) 154102: i.i.d. ⇒ 0", check: CheckValue,
		tol: func(n int, _ float64) float64 {
			return ordinal.Q0(24) * math.Log(24) * 2 * permBiasIID(4, n) / 4
		}, tolSource: tolSC, n: n15, measure: measureComplexity})
	direct(invariantSpec{id: "perm_missing_d3/logistic", system: "logistic", name: "perm_missing_d3",
		estimator: "ordinal.Missing (order 3, delay 1)", value: 1,
		source: "Amigó, Zambrano & Sanjuán, EPL 79 (2007) 50001: x_t > x_{t+1} > x_{t+2} never occurs at r = 4", check: CheckValue,
		tol: fixedTol(0), tolSource: tolForbidden, n: 5000, measure: measureMissingTriples})

	fromRegistry(invariantSpec{id: "nl_sent_m2/white", system: "white", name: "nl_sent_m2",
		estimator: "nonlinear.SampleEntropy (m = 2, r = 0.2 sd)", check: CheckValue,
		tol: fixedTol(0.015), tolSource: tolSampEn, n: 20000, measure: measureSampEn})

	const nACF = 200000
	for _, sys := range []string{"ar1", "ou", "telegraph"} {
		fromRegistry(invariantSpec{id: "lag1_autocorrelation/" + sys, system: sys, name: "lag1_autocorrelation",
			estimator: "scaling.ACF (FFT, biased estimator), lag 1", check: CheckValue,
			tolSource: tolACF, n: nACF, measure: measureLag1})
		s := &specs[len(specs)-1]
		phi := s.value
		s.tol = func(n int, _ float64) float64 { return 5 * bartlettSE(phi, 1, n) }
	}
	if firstErr != nil {
		return nil, firstErr
	}
	for i := range specs {
		if specs[i].params == nil {
			specs[i].params = map[string]float64{}
		}
	}
	return specs, nil
}

// skipReasons says why registry invariants without a check are left out.
var skipReasons = map[string]string{
	"lyap_sum":                 "needs the whole Lyapunov spectrum, which no series estimator of the project measures (checked against the equations in the generators tests)",
	"invariant_density":        "a density, not a number: checked by a Kolmogorov–Smirnov test in the generators tests",
	"stationary_density":       "a density, not a number: checked by a Kolmogorov–Smirnov test against the Boltzmann law in the generators tests",
	"mean":                     "a moment of the generator, not a feature: checked in the generators tests",
	"variance":                 "a moment of the generator, not a feature: checked in the generators tests",
	"nl_div_rate":              "the series estimator is checked here on the systems listed above; the exponents of the other systems are checked against their own equations (Benettin's tangent-space method) in the generators tests",
	"lag1_autocorrelation":     "long-memory and jump processes need a tolerance the suite's Bartlett rule does not give; checked against the generator's analytic autocovariance in the generators tests",
	"sc_fluct_a1":              "checked against the analytic autocovariance (Hosking 1981) in the generators tests; the suite checks DFA on fGn, white noise and Brownian motion",
	"sc_psd_beta":              "checked against the analytic spectrum in the generators tests; the suite checks the spectral slope on fGn, fBm, white noise and Brownian motion",
	"sideband_ratio":           "a property of the waveform's construction (AM sidebands m/2), checked in the generators tests",
	"carrier_line":             "a property of the waveform's construction (Bessel sidebands of FM and multi-tone PM), checked in the generators tests",
	"rotation_number":          "a property of the map's orbit, not a feature: checked in the generators tests",
	"regime1_fraction":         "a property of the generator's hidden regime path, not a feature: checked in the generators tests",
	"tau_q2":                   "a multifractal scaling exponent of the cascade's construction, checked in the generators tests",
	"change_points_per_sample": "a property of the generator's hidden change points, not a feature: checked in the generators tests",
	"self_similarity":          "a scaling property of the walk's increments, checked through the characteristic function in the generators tests",
	"tail_exponent":            "a property of the stable law (tail P(|X| > x) ~ x^−α), checked through the characteristic function and KS tests in the generators tests",
	"kurtosis":                 "a moment of the generator, not a feature: checked in the generators tests",
	"peak_frequency":           "the resonance of the oscillator's transfer function, checked against the analytic spectrum in the generators tests",
	"energy":                   "a conserved quantity of the equations, not a feature: checked along recorded orbits in the generators tests",
}

// skippedInvariants lists the registry invariants no spec covers.
func skippedInvariants(specs []invariantSpec) []SkippedInvariant {
	covered := map[[2]string]bool{}
	for _, s := range specs {
		covered[[2]string{s.system, s.name}] = true
	}
	var out []SkippedInvariant
	for _, sys := range generators.All() {
		for _, iv := range sys.Invariants {
			if covered[[2]string{sys.Name, iv.Name}] {
				continue
			}
			why, ok := skipReasons[iv.Name]
			if !ok {
				why = "no check of this invariant in the suite yet"
			}
			out = append(out, SkippedInvariant{System: sys.Name, Invariant: iv.Name, Value: Float(iv.Value), Source: iv.Source, Reason: why})
		}
	}
	return out
}

// InvariantIDs returns the IDs of the invariant checks, in report order.
func InvariantIDs() []string {
	specs, err := invariantSpecs()
	if err != nil {
		return nil
	}
	ids := make([]string, len(specs))
	for i, s := range specs {
		ids[i] = s.id
	}
	return ids
}

// runInvariants measures every selected check at every length and seed.
func runInvariants(o Options) ([]InvariantRow, []SkippedInvariant, error) {
	specs, err := invariantSpecs()
	if err != nil {
		return nil, nil, err
	}
	skipped := skippedInvariants(specs)
	if len(o.Invariants) > 0 {
		specs = slices.DeleteFunc(specs, func(s invariantSpec) bool { return !slices.Contains(o.Invariants, s.id) })
	}
	type job struct{ spec, length, seed int }
	lengths := make([][]int, len(specs))
	var jobs []job
	for i, s := range specs {
		for _, f := range o.LengthFactors {
			n := max(256, int(math.Round(float64(s.n)*f)))
			if !slices.Contains(lengths[i], n) {
				lengths[i] = append(lengths[i], n)
			}
		}
		for li := range lengths[i] {
			for r := 0; r < o.Seeds; r++ {
				jobs = append(jobs, job{i, li, r})
			}
		}
	}
	results := make([]measurement, len(jobs))
	errs := make([]error, len(jobs))
	forEach(len(jobs), o.Workers, "invariants", o.Progress, func(k int) {
		j := jobs[k]
		s := specs[j.spec]
		n := lengths[j.spec][j.length]
		sys, err := generators.Lookup(s.system)
		if err == nil {
			rng := rand.New(rand.NewPCG(seedFor(o.Seed, 1, uint64(j.spec), uint64(n), uint64(j.seed)), seedFor(o.Seed, 2)))
			var x []float64
			if x, err = sys.Generate(n, s.params, rng); err == nil {
				results[k], err = s.measure(x)
			}
		}
		if err != nil {
			errs[k] = fmt.Errorf("%s n=%d seed %d: %w", s.id, n, j.seed, err)
			results[k] = measurement{v: math.NaN(), aux: math.NaN()}
		}
	})

	rows := make([]InvariantRow, len(specs))
	k := 0
	for i, s := range specs {
		sys, _ := generators.Lookup(s.system)
		params, err := sys.Resolve(s.params)
		if err != nil {
			return nil, nil, fmt.Errorf("%s: %w", s.id, err)
		}
		row := InvariantRow{
			ID: s.id, System: s.system, Params: params, Invariant: s.name, Estimator: s.estimator,
			Value: Float(s.value), Published: s.published, Unit: s.unit, Source: s.source, Check: s.check,
			ToleranceSource: s.tolSource, Lengths: lengths[i], Seeds: o.Seeds, Note: s.note,
		}
		var all, aux []float64
		declined := 0
		for li, n := range lengths[i] {
			var vals []float64
			for r := 0; r < o.Seeds; r++ {
				m, err := results[k], errs[k]
				k++
				vals = append(vals, m.v)
				row.Runs = append(row.Runs, Float(m.v))
				if err != nil {
					row.Failures = append(row.Failures, err.Error())
					continue
				}
				if math.IsNaN(m.v) {
					declined++
					row.Declined = append(row.Declined, fmt.Sprintf("n=%d seed %d: %s", n, r, m.why))
				}
				if !math.IsNaN(m.aux) && li == 0 {
					aux = append(aux, m.aux)
				}
			}
			all = append(all, vals...)
			row.ByLength = append(row.ByLength, LengthEstimate{N: n, Estimate: spreadOf(vals)})
		}
		row.Estimate = spreadOf(all)
		med := float64(row.Estimate.Median)
		row.Error = Float(med - s.value)
		row.RelError = Float(math.NaN())
		if s.value != 0 {
			row.RelError = Float((med - s.value) / math.Abs(s.value))
		}
		switch s.check {
		case CheckAbsent:
			row.Tolerance = Float(math.NaN())
			row.ToleranceKind = "no credible value in any run"
			row.Error, row.RelError = Float(math.NaN()), Float(math.NaN())
			row.Within = len(row.Failures) == 0 && declined == len(all)
		default:
			tol := s.tol(lengths[i][0], median(aux))
			row.Tolerance = Float(tol)
			row.ToleranceKind = "absolute"
			dev := math.Abs(med - s.value)
			if s.relative {
				row.ToleranceKind = "relative"
				dev /= math.Abs(s.value)
			}
			row.Within = !math.IsNaN(med) && dev <= tol+1e-12*math.Abs(s.value)
		}
		rows[i] = row
	}
	return rows, skipped, nil
}
