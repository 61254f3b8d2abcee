package surrogate

import (
	"errors"
	"fmt"
	"strings"
)

// Method names a surrogate generator. The zero value means IAAFT. The string
// values are the names the command line uses.
type Method string

// The surrogate generators. Each constant's comment states the null
// hypothesis that its surrogates embody.
const (
	// Shuffle is a random permutation of the values. Null hypothesis: the
	// data are independent and identically distributed draws from some
	// distribution (no temporal structure at all). Keeps the values exactly.
	// Theiler et al., Physica D 58 (1992) 77 ("algorithm 0").
	Shuffle Method = "shuffle"

	// FT is Fourier phase randomisation: the Fourier amplitudes |X_k| are
	// kept and the phases replaced by independent uniform phases (the DC
	// term, and the Nyquist term for even n, stay as they are, real). Null
	// hypothesis: the data are a stationary linear Gaussian process. Keeps
	// the periodogram exactly; the values (marginal distribution) are not
	// kept. Theiler et al. (1992) ("algorithm 1").
	FT Method = "ft"

	// AAFT is the amplitude-adjusted Fourier transform surrogate: the data
	// are rescaled to a Gaussian of the same rank order, phase randomised,
	// and the data's own values put back in the rank order of the result.
	// Null hypothesis: the data are a static monotone (possibly nonlinear)
	// transform of a stationary linear Gaussian process. Keeps the values
	// exactly; the spectrum only approximately (it is biased towards white
	// for short or strongly non-Gaussian series). Theiler et al. (1992)
	// ("algorithm 2").
	AAFT Method = "aaft"

	// IAAFT is the iterated AAFT surrogate: starting from a shuffle,
	// alternately impose the data's Fourier amplitudes and then the data's
	// values (by rank order) until the rank order no longer changes, the
	// spectral error stops improving, or an iteration cap is reached. Null
	// hypothesis: as AAFT, a static monotone transform of a stationary
	// linear Gaussian process. Keeps the values exactly and the spectrum
	// closely (the final relative spectral error is reported). Schreiber &
	// Schmitz, Phys. Rev. Lett. 77 (1996) 635.
	IAAFT Method = "iaaft"

	// Gauss is Gaussianisation: the temporal rank order of the data is kept
	// exactly and the values are replaced by Gaussian ones (a sorted sample
	// of n independent N(0,1) draws per surrogate, or with
	// Options.GaussQuantiles the deterministic quantiles
	// Φ⁻¹((rank+0.5)/n)). It keeps the temporal order and removes fat tails
	// and any other feature of the marginal distribution. Null hypothesis:
	// the statistic depends on the series only through its temporal rank
	// order, so its value is not produced by the shape of the marginal
	// distribution (e.g. heavy tails). Rank-based transform, common
	// practice.
	Gauss Method = "gauss"
)

// ErrUnknownMethod is returned (wrapped) by ParseMethod and by the
// generators for a Method that is not one of the constants above.
var ErrUnknownMethod = errors.New("unknown surrogate method")

// Methods returns the generators in a fixed order.
func Methods() []Method { return []Method{Shuffle, FT, AAFT, IAAFT, Gauss} }

// ParseMethod returns the Method named s (case-insensitive; "" means IAAFT).
func ParseMethod(s string) (Method, error) {
	m := Method(strings.ToLower(strings.TrimSpace(s)))
	if m == "" {
		return IAAFT, nil
	}
	for _, k := range Methods() {
		if m == k {
			return k, nil
		}
	}
	return "", fmt.Errorf("%w %q (want one of shuffle, ft, aaft, iaaft, gauss)", ErrUnknownMethod, s)
}

// resolve returns the method with the zero value replaced by IAAFT.
func (m Method) resolve() (Method, error) {
	if m == "" {
		return IAAFT, nil
	}
	for _, k := range Methods() {
		if m == k {
			return k, nil
		}
	}
	return "", fmt.Errorf("%w %q", ErrUnknownMethod, string(m))
}

// usesFFT reports whether the method relies on the periodic continuation of
// the series (and so suffers from an end-point mismatch).
func (m Method) usesFFT() bool { return m == FT || m == AAFT || m == IAAFT }

// NullHypothesis returns a one-line statement of the null hypothesis that
// surrogates of method m embody.
func (m Method) NullHypothesis() string {
	switch m {
	case Shuffle:
		return "independent, identically distributed values (no temporal structure)"
	case FT:
		return "stationary linear Gaussian process (periodogram kept exactly)"
	case AAFT, IAAFT, "":
		return "static monotone transform of a stationary linear Gaussian process (values kept exactly, spectrum approximately)"
	case Gauss:
		return "the statistic depends only on the temporal rank order, not on the marginal distribution"
	}
	return "unknown method"
}
