package classifier

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"gonum.org/v1/gonum/dsp/fourier"
	"gonum.org/v1/gonum/stat/distuv"
)

// Settings of the mains-line test (see MainsLines).
const (
	// MainsAlpha is the false-alarm probability of the mains test per
	// trace (all searched bins of all candidate lines together).
	MainsAlpha = 1e-3
	// mainsBand is the half-width in Hz of the band searched around each
	// nominal line: grid frequencies stay within ±0.2 Hz of nominal in
	// normal operation (European grid code; common practice), and a
	// recorder's clock error of 100 ppm moves 150 Hz by 0.015 Hz.
	mainsBand = 0.25
	// mainsFloorWidth is the width in Hz of the floor window on each side
	// of the band, at least mainsFloorBins bins.
	mainsFloorWidth = 2.5
	mainsFloorBins  = 32
	// mainsMaxSeconds and mainsMaxSamples cap the periodogram length: a
	// longer trace is cut into equal segments whose periodograms are
	// averaged. 64 s keeps the bin width at 1/64 Hz or more, about as
	// narrow as a grid's frequency wander over a minute allows a line to
	// be (common practice); 2^20 samples bound the memory.
	mainsMaxSeconds = 64
	mainsMaxSamples = 1 << 20
)

// mainsHarmonics: the candidate lines are h·F for the nominal mains
// frequencies F = 50 and 60 Hz and h = 1 … mainsHarmonics.
const mainsHarmonics = 3

// MainsLine is one spectral line found by MainsLines.
type MainsLine struct {
	// Mains is the nominal mains frequency (50 or 60 Hz), Harmonic the
	// multiple h of it searched, Freq the frequency of the strongest bin
	// in the band (Hz).
	Mains    float64
	Harmonic int
	Freq     float64
	// DB is the line's peak power above the local floor (the floor's mean,
	// estimated from its median), Threshold the level it had to pass, both
	// in dB.
	DB, Threshold float64
	// Amplitude is the sinusoid amplitude the excess power over the peak
	// bin and its two neighbours corresponds to, in units of x.
	Amplitude float64
}

// MainsResult is the outcome of MainsLines.
type MainsResult struct {
	// Lines are the detected lines, in the order searched (50 Hz and its
	// harmonics, then 60 Hz and its harmonics).
	Lines []MainsLine
	// Searched is the number of candidate lines inside the spectrum,
	// Bins the number of frequency bins searched (the Bonferroni count),
	// Segment and Segments the periodogram length and how many were
	// averaged, Resolution the bin width in Hz.
	Searched, Bins    int
	Segment, Segments int
	Resolution        float64
}

// MainsLines looks for narrow spectral lines at 50 and 60 Hz and their
// second and third harmonics in x sampled every interval seconds.
//
// The series is cut into K = ⌈n / min(2^20, 64 s·fs)⌉ equal segments of L
// samples (L 5-smooth, fs = 1/interval); the periodograms P_k =
// |Σ_t x_t e^{−2πikt/L}|² of the segments, each less its least-squares
// line, are averaged. In a band of ±0.25 Hz around each candidate the
// largest ordinate is compared with the median of the ordinates beside the
// band (2.5 Hz, at least 32 bins, on each side), after dividing out a
// power law fitted to the log-ordinates of that window so that a sloping
// floor (1/f noise) is flat. Under the null of a spectrum smooth over the
// window the ordinates of one periodogram are independent exponential
// variables with a common mean (Brillinger, Time Series: Data Analysis
// and Theory (1981) Thm 5.2.6; Percival & Walden, Spectral Analysis for
// Physical Applications (1993) §6.6 (memory)), and the chance that one
// exceeds c times the r-th smallest of m others is exactly
// Π_{i=1}^{r} (m−i+1)/(m−i+1+c) (Rényi's representation of exponential
// order statistics, Acta Math. Acad. Sci. Hung. 4 (1953) 191 (memory)).
// c is set so that this equals MainsAlpha over the number of bins searched
// (Bonferroni), which accounts for the scatter of the floor estimate. An
// average of K > 1 periodograms has Gamma(K, 1/K) ordinates, and the
// threshold integrates the Gamma tail over the normal law of the sample
// median (lineThreshold).
//
// A sinusoid of amplitude A on a white floor of variance σ² raises its
// bin by A²L/(4σ²) times the floor's mean (on a bin centre; by 0.41 of
// that midway between bins), so at a fixed threshold the smallest
// amplitude found falls as 1/√L. Lines whose band and floor window do not
// fit below the Nyquist frequency are not searched (no search for
// aliases). Cost O(n log L).
func MainsLines(x []float64, interval float64) MainsResult {
	var res MainsResult
	n := len(x)
	fs := 1 / interval
	if !(fs > 0) || math.IsInf(fs, 0) || n < 64 {
		return res
	}
	limit := int(math.Max(64, math.Min(mainsMaxSamples, mainsMaxSeconds*fs)))
	k := (n + limit - 1) / limit
	seg := smooth5Below(n / k)
	df := fs / float64(seg)
	half := seg / 2
	band := math.Max(mainsBand, df)
	width := math.Max(mainsFloorWidth, mainsFloorBins*df)

	// Candidate lines whose band and floor fit inside (0, fs/2).
	type cand struct {
		mains   float64
		h       int
		lo, hi  int // band bins, inclusive
		flo, fh int // floor window, inclusive
	}
	var cands []cand
	for _, f0 := range []float64{50, 60} {
		for h := 1; h <= mainsHarmonics; h++ {
			f := f0 * float64(h)
			c := cand{mains: f0, h: h,
				lo: int(math.Ceil((f - band) / df)), hi: int(math.Floor((f + band) / df)),
				flo: int(math.Ceil((f - band - width) / df)), fh: int(math.Floor((f + band + width) / df))}
			if c.flo < 1 || c.fh >= half {
				continue
			}
			cands = append(cands, c)
		}
	}
	res.Searched = len(cands)
	res.Segment, res.Segments, res.Resolution = seg, k, df
	if len(cands) == 0 {
		return res
	}
	inBand := func(b int) bool {
		for _, c := range cands {
			if b >= c.lo && b <= c.hi {
				return true
			}
		}
		return false
	}

	power := make([]float64, half+1)
	fft := fourier.NewFFT(seg)
	buf := make([]float64, seg)
	coef := make([]complex128, half+1)
	for s := range k {
		detrend(buf, x[s*seg:(s+1)*seg])
		coef = fft.Coefficients(coef, buf)
		for b, c := range coef {
			power[b] += real(c)*real(c) + imag(c)*imag(c)
		}
	}
	for b := range power {
		power[b] /= float64(k)
	}

	for _, c := range cands {
		res.Bins += c.hi - c.lo + 1
	}
	alpha := MainsAlpha / float64(res.Bins)
	floor := make([]float64, 0, 2*(cands[0].fh-cands[0].flo))
	thresholds := map[int]struct{ c, median float64 }{} // by floor size m
	for _, c := range cands {
		// Flatten a sloping floor (1/f noise) by the power law fitted to
		// the log-periodogram of the window before taking its median.
		centre := float64(c.lo+c.hi) / 2
		var sx, sy, sxx, sxy, cnt float64
		for b := c.flo; b <= c.fh; b++ {
			if inBand(b) {
				continue
			}
			lx, ly := math.Log(float64(b)/centre), math.Log(math.Max(power[b], math.SmallestNonzeroFloat64))
			sx, sy, sxx, sxy, cnt = sx+lx, sy+ly, sxx+lx*lx, sxy+lx*ly, cnt+1
		}
		slope := 0.0
		if d := cnt*sxx - sx*sx; d > 0 {
			slope = (cnt*sxy - sx*sy) / d
		}
		trend := func(b int) float64 { return math.Pow(float64(b)/centre, slope) }
		floor = floor[:0]
		for b := c.flo; b <= c.fh; b++ {
			if !inBand(b) {
				floor = append(floor, power[b]/trend(b))
			}
		}
		if len(floor)%2 == 0 {
			floor = floor[:len(floor)-1] // an odd count has a middle order statistic
		}
		m := len(floor)
		if m < 2*mainsFloorBins-1 {
			continue
		}
		slices.Sort(floor)
		r := (m + 1) / 2
		med := floor[r-1]
		if !(med > 0) {
			continue
		}
		th, ok := thresholds[m]
		if !ok {
			th.c, th.median = lineThreshold(k, m, r, alpha)
			thresholds[m] = th
		}
		thr, unitMedian := th.c, th.median
		peak, at := 0.0, c.lo
		for b := c.lo; b <= c.hi; b++ {
			if v := power[b] / trend(b); v > peak {
				peak, at = v, b
			}
		}
		if peak <= thr*med {
			continue
		}
		mean := med / unitMedian
		excess := power[at] + power[at-1] + power[at+1] - mean*(trend(at)+trend(at-1)+trend(at+1))
		res.Lines = append(res.Lines, MainsLine{
			Mains: c.mains, Harmonic: c.h, Freq: float64(at) * df,
			DB:        10 * math.Log10(peak/mean),
			Threshold: 10 * math.Log10(thr*unitMedian),
			Amplitude: 2 * math.Sqrt(math.Max(excess, 0)) / float64(seg),
		})
	}
	return res
}

// lineThreshold returns the factor c over the floor's r-th order
// statistic (of m) that an ordinate passes with probability alpha under
// the null, and the median of a unit-mean ordinate, for an average of k
// periodograms (see MainsLines).
func lineThreshold(k, m, r int, alpha float64) (c, unitMedian float64) {
	if k == 1 {
		// log P(c) = Σ_{i=1}^{r} log((m−i+1)/(m−i+1+c)) falls with c.
		logP := func(c float64) float64 {
			var s float64
			for i := 1; i <= r; i++ {
				j := float64(m - i + 1)
				s -= math.Log1p(c / j)
			}
			return s
		}
		target := math.Log(alpha)
		lo, hi := 0.0, 1.0
		for logP(hi) > target {
			hi *= 2
		}
		for range 60 {
			mid := (lo + hi) / 2
			if logP(mid) > target {
				lo = mid
			} else {
				hi = mid
			}
		}
		return (lo + hi) / 2, math.Ln2
	}
	// An average of k periodograms: ordinates Gamma(k, 1/k) times the
	// floor. The floor's sample median ξ̂ scatters about the Gamma median ξ
	// with variance 1/(4m f(ξ)²) (the asymptotic law of a sample quantile,
	// e.g. Cramér, Mathematical Methods of Statistics (1946) §28.5
	// (memory)); P(c) = E[S(c·ξ̂)] is integrated over that normal law of
	// ln ξ̂ by the trapezoid rule on ±6 s.d.
	g := distuv.Gamma{Alpha: float64(k), Beta: float64(k)}
	xi := g.Quantile(0.5)
	sdLog := 1 / (2 * math.Sqrt(float64(m)) * g.Prob(xi) * xi)
	const nodes = 48
	logP := func(c float64) float64 {
		var s, wsum float64
		for i := 0; i <= nodes; i++ {
			z := -6 + 12*float64(i)/nodes
			w := math.Exp(-z * z / 2)
			s += w * g.Survival(c*xi*math.Exp(sdLog*z))
			wsum += w
		}
		return math.Log(s / wsum)
	}
	target := math.Log(alpha)
	lo, hi := 1.0, 2.0
	for logP(hi) > target {
		hi *= 2
	}
	for range 40 {
		mid := (lo + hi) / 2
		if logP(mid) > target {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2, xi
}

// mainsWarnings renders the lines MainsLines finds as one warning per
// mains frequency.
func mainsWarnings(x []float64, interval float64) []string {
	res := MainsLines(x, interval)
	if len(res.Lines) == 0 {
		return nil
	}
	sd := stdDev(x)
	var out []string
	for _, f0 := range []float64{50, 60} {
		var found []MainsLine
		for _, l := range res.Lines {
			if l.Mains == f0 {
				found = append(found, l)
			}
		}
		if len(found) == 0 {
			continue
		}
		best := found[0]
		var names []string
		for _, l := range found {
			names = append(names, fmt.Sprintf("%g Hz", f0*float64(l.Harmonic)))
			if l.DB > best.DB {
				best = l
			}
		}
		msg := fmt.Sprintf("periodic interference at %s (mains %g Hz?): the strongest line stands %.0f dB above the local spectral floor (threshold %.0f dB), amplitude about %.2g%% of the trace's s.d.",
			strings.Join(names, ", "), f0, best.DB, best.Threshold, 100*best.Amplitude/sd)
		out = append(out, msg)
	}
	return out
}
