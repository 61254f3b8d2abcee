package scaling

import (
	"fmt"
	"math"
)

// SlopeOptions configures SpectralSlope. The zero value selects the
// defaults.
type SlopeOptions struct {
	// Welch configures the periodogram (default segment DefaultSegment(n)).
	Welch WelchOptions
	// FMin is the lowest frequency of the fitted band in cycles per
	// sample. 0 means 2/Segment: the DC bin and the first bin, which the
	// mean removal and the Hann main lobe contaminate, are left out.
	FMin float64
	// FMax is the highest frequency of the fitted band in cycles per
	// sample, at most 0.5. 0 means 0.25 (half the Nyquist frequency), which
	// keeps the fit away from the aliasing and discretisation bend near
	// Nyquist.
	FMax float64
	// BinsPerDecade is the number of logarithmic frequency bins per decade
	// whose averages enter the fit. 0 means 10.
	BinsPerDecade int
}

// SlopeResult is the outcome of SpectralSlope with the diagnostics of the
// fit.
type SlopeResult struct {
	Beta      float64 // spectral exponent: S(f) ~ f^(−β)
	BetaErr   float64 // standard error of the fitted slope
	Intercept float64 // intercept of the ln S against ln f fit
	R2        float64 // coefficient of determination of the fit

	FMin, FMax float64 // fitted band in cycles per sample (lowest, highest frequency used)
	Points     int     // number of logarithmic bins in the fit
	Bins       int     // number of periodogram frequencies in the band
	Segment    int     // Welch segment length
	Segments   int     // number of Welch segments averaged

	// Freq and Power are the binned points of the fit: the geometric means
	// of frequency and of power over each non-empty logarithmic bin.
	Freq, Power []float64
}

// SpectralSlope returns the exponent β of S(f) ~ f^(−β), the negated slope
// of ln S against ln f over the band [FMin, FMax] of the Welch periodogram of
// x. The periodogram frequencies in the band are grouped into bins of equal
// width in ln f (BinsPerDecade per decade); each non-empty bin contributes
// one point, the mean of ln f and the mean of ln S over its frequencies, so
// every decade weighs the same in the fit and the many high frequencies do
// not dominate. Averaging logarithms keeps a pure power law exactly on a
// line. β = 0 for white noise, 2H − 1 for fractional Gaussian noise, 2H + 1
// for fractional Brownian motion, 2 for Brownian motion (standard results).
//
// The caller must supply at least 256 finite, not all equal samples (or the
// explicit segment length), and a band holding at least 3 bins. β is
// invariant under x → a·x + b for any a ≠ 0.
func SpectralSlope(x []float64, opts SlopeOptions) (SlopeResult, error) {
	if _, err := opts.binsPerDecade(); err != nil {
		return SlopeResult{}, err
	}
	sp, err := Welch(x, opts.Welch)
	if err != nil {
		return SlopeResult{}, fmt.Errorf("spectral slope: %w", err)
	}
	return SpectrumSlope(sp, opts)
}

// binsPerDecade resolves and checks BinsPerDecade.
func (opts SlopeOptions) binsPerDecade() (int, error) {
	bpd := opts.BinsPerDecade
	if bpd == 0 {
		bpd = 10
	}
	if bpd < 1 {
		return 0, fmt.Errorf("spectral slope: %w: %d bins per decade, want ≥ 1", ErrBadOption, bpd)
	}
	return bpd, nil
}

// SpectrumSlope is SpectralSlope on a Welch spectrum already computed
// (opts.Welch is not read), so that one spectrum serves several measures
// of the same series; SpectralSlope(x, opts) equals
// SpectrumSlope(Welch(x, opts.Welch), opts) exactly.
func SpectrumSlope(sp Spectrum, opts SlopeOptions) (SlopeResult, error) {
	bpd, err := opts.binsPerDecade()
	if err != nil {
		return SlopeResult{}, err
	}
	l := sp.Segment
	fmin, fmax := opts.FMin, opts.FMax
	if fmin == 0 {
		fmin = 2 / float64(l)
	}
	if fmax == 0 {
		fmax = 0.25
	}
	if !(fmin > 0 && fmax <= 0.5 && fmin < fmax) {
		return SlopeResult{}, fmt.Errorf("spectral slope: %w: band [%g, %g], want 0 < fmin < fmax ≤ 0.5", ErrBadOption, fmin, fmax)
	}
	kLo := int(math.Ceil(fmin*float64(l) - 1e-9))
	kHi := int(math.Floor(fmax*float64(l) + 1e-9))
	if kLo < 1 {
		kLo = 1
	}
	if kHi > l/2 {
		kHi = l / 2
	}
	var lf, lp []float64
	lnLo := math.Log(float64(kLo) / float64(l))
	width := math.Ln10 / float64(bpd)
	bin := -1
	var sf, sp2 float64
	var cnt int
	flush := func() {
		if cnt > 0 {
			lf = append(lf, sf/float64(cnt))
			lp = append(lp, sp2/float64(cnt))
		}
		sf, sp2, cnt = 0, 0, 0
	}
	for k := kLo; k <= kHi; k++ {
		p := sp.Power[k]
		if !(p > 0) {
			return SlopeResult{}, fmt.Errorf("spectral slope: %w: zero power at f = %g", ErrDegenerate, sp.Freq[k])
		}
		f := math.Log(sp.Freq[k])
		b := int(math.Floor((f-lnLo)/width + 1e-9))
		if b != bin {
			flush()
			bin = b
		}
		sf += f
		sp2 += math.Log(p)
		cnt++
	}
	flush()
	if len(lf) < 3 {
		return SlopeResult{}, fmt.Errorf("spectral slope: %w: only %d frequency bins in the band [%g, %g] with segment %d", ErrTooShort, len(lf), fmin, fmax, l)
	}
	fit := fitLine(lf, lp)
	fr := make([]float64, len(lf))
	pw := make([]float64, len(lf))
	for i := range lf {
		fr[i] = math.Exp(lf[i])
		pw[i] = math.Exp(lp[i])
	}
	return SlopeResult{
		Beta:      -fit.Slope,
		BetaErr:   fit.SlopeErr,
		Intercept: fit.Intercept,
		R2:        fit.R2,
		FMin:      sp.Freq[kLo],
		FMax:      sp.Freq[kHi],
		Points:    len(lf),
		Bins:      kHi - kLo + 1,
		Segment:   l,
		Segments:  sp.Segments,
		Freq:      fr,
		Power:     pw,
	}, nil
}
