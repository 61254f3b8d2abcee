package surrogate

import (
	"fmt"
	"math"
	"strconv"
)

// Kinds of Agreement, the comparison of a class verdict with the
// determinism test.
const (
	// Agree: a chaotic verdict with the null rejected, or a stochastic
	// verdict with the null kept.
	Agree = "agree"
	// Disagree: a chaotic verdict with the null kept, or a stochastic
	// verdict with the null rejected.
	Disagree = "disagree"
	// NotInformative: a regular verdict, for which the test cannot tell
	// periodic motion from chaos or noise (see Agreement).
	NotInformative = "not informative"
	// Undetermined: the model gave no class; the text says what the test
	// found.
	Undetermined = "undetermined"
	// Inconclusive: the test could not decide (too few surrogates to
	// reject, or no statistic computable on the trace).
	Inconclusive = "inconclusive"
)

// Agreement is what the determinism test says about a class verdict.
type Agreement struct {
	// Kind is one of Agree, Disagree, NotInformative, Undetermined,
	// Inconclusive.
	Kind string
	// Text is one sentence for people.
	Text string
}

// P returns the p-value of the whole test: the smallest Holm-adjusted p
// over the statistics (NaN when none was computed). The null is rejected
// exactly when P ≤ Alpha.
func (r *DeterminismResult) P() float64 {
	p := math.NaN()
	for _, s := range r.Stats {
		if !math.IsNaN(s.PHolm) && (math.IsNaN(p) || s.PHolm < p) {
			p = s.PHolm
		}
	}
	return p
}

// Agreement compares the class verdict of a classifier ("chaotic",
// "stochastic", "regular" or "undetermined", the classes of DESIGN.md) with
// the outcome of the test. The test asks one question, whether the trace
// holds structure that a monotone transform of linear Gaussian noise cannot
// produce, so:
//
//   - chaotic: rejection supports the verdict; no rejection means the
//     structure the model saw is not significant against surrogates.
//   - stochastic: no rejection is consistent; rejection means nonlinear
//     structure, which nonlinear noise (telegraph, multiplicative,
//     threshold processes) has as well as determinism.
//   - regular: not informative. Periodic and quasi-periodic signals reject
//     the null when their sharp spectral lines make them more predictable
//     than their surrogates, and keep it when the surrogates of a pure line
//     spectrum are as periodic as the trace; neither outcome tells periodic
//     motion from chaos.
func (r *DeterminismResult) Agreement(class string) Agreement {
	p := r.P()
	ps := "p = " + strconv.FormatFloat(p, 'g', 3, 64)
	against := fmt.Sprintf("against %d IAAFT surrogates (%s)", r.Count, ps)
	if math.IsNaN(p) {
		return Agreement{Inconclusive, "the surrogate test could not compute its statistics on this trace"}
	}
	if !r.Rejected && r.Count < r.MinSurrogates {
		return Agreement{Inconclusive, fmt.Sprintf(
			"%d surrogates cannot reject at α = %g after Holm's adjustment (at least %d are needed): the surrogate test is inconclusive",
			r.Count, r.Alpha, r.MinSurrogates)}
	}
	switch class {
	case "chaotic":
		if r.Rejected {
			return Agreement{Agree, "nonlinear structure is significant " + against + ", as the chaotic verdict requires"}
		}
		return Agreement{Disagree, "the structure is not significant " + against +
			": a monotone transform of linear Gaussian noise explains the tested statistics; treat the chaotic verdict with caution"}
	case "stochastic":
		if r.Rejected {
			return Agreement{Disagree, "the linear-Gaussian null is rejected " + against +
				": nonlinear structure, from nonlinear noise (telegraph, multiplicative, threshold processes) or from determinism"}
		}
		return Agreement{Agree, "no structure beyond a monotone transform of linear Gaussian noise " + against + ", consistent with the stochastic verdict"}
	case "regular":
		if r.Rejected {
			return Agreement{NotInformative, "the null is rejected " + against +
				", as it is for most periodic signals (sharp spectral lines make them more predictable than their surrogates): this confirms structure, not chaos"}
		}
		return Agreement{NotInformative, "the null is not rejected " + against +
			"; surrogates of a line spectrum are themselves nearly periodic, so this says nothing against the regular verdict"}
	}
	if r.Rejected {
		return Agreement{Undetermined, "the model is undetermined; the surrogate test finds nonlinear structure " + against +
			" (determinism, nonlinear noise or periodicity)"}
	}
	return Agreement{Undetermined, "the model is undetermined; the structure is consistent with a monotone transform of linear Gaussian noise " + against}
}
