package nonlinear

import (
	"fmt"
	"math"
)

// LyapunovOptions configures Lyapunov. The zero value gives the documented
// defaults.
type LyapunovOptions struct {
	// Embedding: any of Dim, Delay, Theiler left at zero is chosen by Embed.
	Embed EmbedOptions
	// MaxSteps K is the length of the divergence curve in samples.
	// Default clamp(50·τ, 50, M/4), M being the number of delay vectors.
	MaxSteps int
	// MaxRef caps the reference points (evenly spaced); neighbours are
	// searched among all vectors. Default 2000.
	MaxRef int
	// MinR2 is the least r² of an accepted linear segment. Default 0.98.
	MinR2 float64
	// MinSteps is the least length (in samples) of an accepted segment.
	// Default max(5, 4τ): at least five points for maps, four delays (about
	// one characteristic time) for flows.
	MinSteps int
}

// LyapunovResult is the largest Lyapunov exponent with its divergence curve
// and fit diagnostics.
type LyapunovResult struct {
	// Lambda is the slope of the linear region of the divergence curve, in
	// nats per sample step; NaN when Credible is false.
	Lambda float64
	// Credible reports whether the curve has a linear region that passes
	// the criterion documented on Lyapunov; Reason says why not.
	Credible bool
	Reason   string
	// FitStart, FitEnd are the first and last step i of the fitted segment
	// (set only when Credible), R2 its coefficient of determination.
	FitStart, FitEnd int
	R2               float64
	// Curve[i] = ⟨ln d_j(i)⟩ for i = 0..MaxSteps, distances in units of the
	// standard deviation of x.
	Curve []float64
	// Plateau is the saturation level (mean of the last quarter of Curve);
	// Rise = Plateau − Curve[0]; Jump = Curve[1] − Curve[0];
	// WindowRise = Plateau − Curve[d·τ] (criteria 1–3 of Lyapunov).
	Plateau, Rise, Jump, WindowRise float64
	Refs                            int // reference points used
	Embedding                       Embedding
}

// Lyapunov estimates the largest Lyapunov exponent from a scalar series by
// the method of Rosenstein, Collins & De Luca, Physica D 65 (1993) 117:
// delay-embed x, pair each reference vector y_j with its nearest neighbour
// y_ĵ (Euclidean norm, |j − ĵ| > Theiler window, found with a k-d tree),
// follow both for i = 0..K steps and average the log separation,
// S(i) = ⟨ln ‖y_{j+i} − y_{ĵ+i}‖⟩_j. For chaos S rises linearly with slope
// λ1 (per sample) from the neighbour scale to the attractor size and then
// saturates.
//
// Linear-region selection and credibility (documented criterion): among the
// segments [a, b] of S inside its rising part (S(b) below Plateau − 0.1·Rise)
// with b − a ≥ MinSteps, r² ≥ MinR2 and every local slope over
// ℓ = max(2, 2τ) steps within ±25% of the fitted slope (so the
// bend into saturation and an initial alignment transient are left out),
// the longest is taken (ties: higher r²). The exponent is credible only when
//
//  1. the curve rises: Rise = Plateau − S(0) ≥ 1.5 nats (neighbours start
//     at least 4.5 times closer than the saturated separation);
//  2. there is no jump at the start: S(1) − S(0) ≤ 0.5·Rise;
//  3. the growth outlives the embedding window: Plateau − S(d·τ) ≥
//     0.25·Rise. For a stochastic process two neighbouring delay vectors
//     separate because independent innovations enter their d coordinates;
//     once the window of (d−1)·τ samples plus about one correlation time
//     (≤ τ when τ falls back to the autocorrelation time) has been renewed,
//     the separation is saturated (in a survey of every stochastic and
//     regular reference generator of this project, clean and at 20 dB SNR,
//     at most 6% of the rise came after the window). Exponential divergence
//     of a deterministic system keeps going for ln(size/neighbour
//     distance)/λ steps regardless of the window;
//  4. the fitted segment carries the rise: slope·(b − a) ≥ 0.5·Rise, i.e.
//     most of the growth is exponential (linear in i), not a concave
//     diffusion-like rise.
//
// Otherwise Lambda is NaN and Reason names the failed condition. The result
// is per sample step: multiply by the sampling rate for per-time-unit.
// The series needs at least 200 samples (Embed) and room for 4·K vectors.
func Lyapunov(x []float64, opts LyapunovOptions) (*LyapunovResult, error) {
	const who = "nonlinear: lyapunov"
	z, emb, err := standardEmbed(x, opts.Embed, who)
	if err != nil {
		return nil, err
	}
	d, tau, w := emb.Dim, emb.Delay, emb.Theiler
	m := len(z) - (d-1)*tau
	K := opts.MaxSteps
	if K <= 0 {
		K = max(50, 50*tau)
		K = min(K, m/4)
	}
	L := m - K // vectors that have K successors
	if K < 10 || L < 2*w+20 {
		return nil, fmt.Errorf("%s: %d samples leave %d vectors for a %d-step curve with Theiler window %d: %w",
			who, len(z), m, K, w, ErrTooShort)
	}
	maxRef := orDefault(opts.MaxRef, 2000)
	minR2 := orDefault(opts.MinR2, 0.98)
	minSteps := orDefault(opts.MinSteps, max(5, 4*tau))
	pts := delayVectors(z, d, tau, 0)
	tree := newKDTree(pts, d, L)
	refs := evenlySpaced(L, maxRef)
	sum := make([]float64, K+1)
	cnt := make([]int, K+1)
	for _, j := range refs {
		q := pts[j*d : (j+1)*d]
		nb, _ := tree.nearest(q, j, w, true)
		if nb < 0 {
			continue
		}
		for i := 0; i <= K; i++ {
			a := pts[(j+i)*d : (j+i+1)*d]
			b := pts[(nb+i)*d : (nb+i+1)*d]
			var s float64
			for c := range a {
				g := a[c] - b[c]
				s += g * g
			}
			if s > 0 {
				sum[i] += 0.5 * math.Log(s)
				cnt[i]++
			}
		}
	}
	res := &LyapunovResult{Lambda: math.NaN(), R2: math.NaN(), Curve: make([]float64, K+1), Refs: len(refs), Embedding: *emb}
	for i := range sum {
		if cnt[i] == 0 {
			return nil, fmt.Errorf("%s: no separation stays non-zero at step %d (the series repeats exactly): %w", who, i, ErrDegenerate)
		}
		res.Curve[i] = sum[i] / float64(cnt[i])
	}
	judgeDivergence(res, d*tau, max(2, 2*tau), minSteps, minR2)
	return res, nil
}

// slopeTol is the straightness tolerance of a candidate linear segment:
// every local slope over ℓ = max(2, 2τ) steps inside it lies within
// ±slopeTol of the fitted slope.
const slopeTol = 0.25

// judgeDivergence selects the linear region of res.Curve and applies the
// credibility criterion documented on Lyapunov.
func judgeDivergence(res *LyapunovResult, window, ell, minSteps int, minR2 float64) {
	S := res.Curve
	K := len(S) - 1
	var plateau float64
	q := K - K/4
	for _, v := range S[q:] {
		plateau += v
	}
	plateau /= float64(K + 1 - q)
	res.Plateau = plateau
	res.Rise = plateau - S[0]
	res.Jump = S[1] - S[0]
	res.WindowRise = plateau - S[min(window, K)]
	if res.Rise < 1.5 {
		res.Reason = fmt.Sprintf("no divergence: the curve rises %.2f nats from its start to its plateau, need ≥ 1.5", res.Rise)
		return
	}
	if res.Jump > 0.5*res.Rise {
		res.Reason = fmt.Sprintf("jump at the first step: %.2f of the %.2f-nat rise happens in one step (noise-like)", res.Jump, res.Rise)
		return
	}
	if res.WindowRise < 0.25*res.Rise {
		res.Reason = fmt.Sprintf("the curve is within %.2f nats of its plateau after the embedding window (%d steps) of a %.2f-nat rise (noise-like)", res.WindowRise, window, res.Rise)
		return
	}
	// Rising part: up to the first step where S reaches plateau − 0.1·rise.
	top := K
	for i, v := range S {
		if v >= plateau-0.1*res.Rise {
			top = i
			break
		}
	}
	if top < minSteps {
		res.Reason = fmt.Sprintf("the curve saturates after %d steps, before any %d-step linear region", top, minSteps)
		return
	}
	// Local slopes over ℓ steps, for the straightness test.
	ell = min(ell, minSteps)
	ls := make([]float64, max(0, top-ell+1))
	for i := range ls {
		ls[i] = (S[i+ell] - S[i]) / float64(ell)
	}
	// Segment ends live on a grid of g steps so the O(top²) search stays
	// below ~10^5 fits for long curves.
	g := max(1, top/400)
	pf := newPrefixFitter(S)
	bestLen, bestR2 := -1, -1.0
	var best lineFit
	var ba, bb int
	for a := 0; a+minSteps <= top; a += g {
		lo, hi := math.Inf(1), math.Inf(-1)
		for i := a; i < a+minSteps-ell+1 && i < len(ls); i++ {
			lo, hi = min(lo, ls[i]), max(hi, ls[i])
		}
		for b := a + minSteps; b <= top; b++ {
			if i := b - ell; i >= a && i < len(ls) {
				lo, hi = min(lo, ls[i]), max(hi, ls[i])
			}
			if (b-a)%g != 0 && b != top {
				continue
			}
			f := pf.fit(a, b)
			if !(f.Slope > 0) || f.R2 < minR2 || lo < (1-slopeTol)*f.Slope || hi > (1+slopeTol)*f.Slope {
				continue
			}
			if b-a > bestLen || (b-a == bestLen && f.R2 > bestR2) {
				bestLen, bestR2, best, ba, bb = b-a, f.R2, f, a, b
			}
		}
	}
	if bestLen < 0 {
		res.Reason = fmt.Sprintf("no straight segment of ≥ %d steps (r² ≥ %.2f, local slopes within ±%.0f%%) in the rising part (steps 0..%d)", minSteps, minR2, 100*slopeTol, top)
		return
	}
	if carried := best.Slope * float64(bb-ba); carried < 0.5*res.Rise {
		res.Reason = fmt.Sprintf("the best linear segment (steps %d..%d, slope %.4g) carries %.2f of the %.2f-nat rise, need half", ba, bb, best.Slope, carried, res.Rise)
		return
	}
	res.Lambda, res.Credible, res.FitStart, res.FitEnd, res.R2 = best.Slope, true, ba, bb, best.R2
}
