package nonlinear

import (
	"fmt"
	"math"
)

// CorrDimOptions configures CorrelationDimension. The zero value gives the
// documented defaults.
type CorrDimOptions struct {
	// Embedding: any of Dim, Delay, Theiler left at zero is chosen by Embed.
	Embed EmbedOptions
	// MaxPairs caps the number of distances computed. Default 10^7.
	// Up to max(√MaxPairs, MaxPairs/M) reference vectors are taken evenly
	// spaced, each paired with every s-th vector, s = ⌈refs·M/MaxPairs⌉
	// (M vectors in all); for short series every pair is used.
	MaxPairs int
	// MinPairs is the least number of pairs below the smallest radius of
	// the scaling region (its relative counting error is ≤ 1/√MinPairs).
	// Default 500.
	MinPairs int
	// MaxC is the largest correlation sum allowed in the scaling region,
	// keeping it clear of the attractor-size saturation. Default 0.2.
	MaxC float64
	// Decades is the width of the scaling region in decades of r.
	// Default 1; when the usable range is narrower, down to half of it.
	Decades float64
}

// CorrDimResult is the correlation dimension with its scaling region.
type CorrDimResult struct {
	// D2 is the least-squares slope of ln C(r) against ln r over the
	// scaling region (NaN when no usable region of ≥ Decades/2 exists).
	D2 float64
	// RMin, RMax bound the scaling region, in units of the standard
	// deviation of x; Decades = log10(RMax/RMin).
	RMin, RMax, Decades float64
	// R2 is the fit's coefficient of determination; SlopeSpread the standard
	// deviation of the local slopes inside the region.
	R2, SlopeSpread float64
	// Reason is set when D2 is NaN.
	Reason string
	// Radii (in SD units, increasing) and C are the correlation sum C(r) at
	// the radii where it was evaluated: eight per octave.
	Radii, C  []float64
	Pairs     int64 // distances computed
	Refs      int   // reference vectors
	Stride    int   // partner stride s
	Embedding Embedding
}

// Binning of distances: the top bits of the IEEE-754 representation of a
// positive float64 (exponent and corrBinBits mantissa bits) give bins of
// 2^corrBinBits per octave whose edges are exact floating-point numbers, so
// the cumulative count below an edge is the exact number of distances
// smaller than that edge, with no logarithm in the inner loop.
const (
	corrBinBits   = 3                // 8 bins per octave
	corrShift     = 52 - corrBinBits // bits to drop
	corrLowOctave = 40               // smallest edge 2^-40 (SD units)
	corrOctaves   = 50               // edges up to 2^10
	corrBins      = corrOctaves << corrBinBits
	corrBase      = (1023 - corrLowOctave) << corrBinBits
)

// CorrelationDimension estimates the correlation dimension D2 of the
// delay-embedded series by the method of Grassberger & Procaccia, Physica D
// 9 (1983) 189: the correlation sum C(r), the fraction of vector pairs
// closer than r (maximum norm) whose time indices differ by more than the
// Theiler window, scales as r^D2 for small r.
//
// Scaling region (documented criterion): among radii with at least MinPairs
// pairs below them and C(r) ≤ MaxC, the window of Decades decades of r
// whose local slopes d ln C / d ln r (central differences on the grid of
// eight radii per octave) have the smallest standard deviation — the
// flattest stretch of the local-slope curve. D2 is the least-squares slope
// over that window. When the usable range is narrower than Decades but at
// least half of it, the whole usable range is fitted.
//
// D2 is computed at the embedding dimension chosen by Embed (Cao's E1
// saturation), not as the saturation value over a sweep of dimensions; pass
// Embed.Dim to evaluate another dimension. The series needs at least 200
// samples.
func CorrelationDimension(x []float64, opts CorrDimOptions) (*CorrDimResult, error) {
	r, err := reconstruct(x, opts.Embed, corrDimWho)
	if err != nil {
		return nil, err
	}
	return r.CorrelationDimension(opts)
}

// corrDimWho names CorrelationDimension in error messages.
const corrDimWho = "nonlinear: correlation dimension"

// CorrelationDimension is the package function CorrelationDimension on the
// reconstructed series, in its embedding (opts.Embed is not read).
func (r *Reconstruction) CorrelationDimension(opts CorrDimOptions) (*CorrDimResult, error) {
	const who = corrDimWho
	z, emb := r.z, r.emb
	d, tau, w := emb.Dim, emb.Delay, emb.Theiler
	M := len(z) - (d-1)*tau
	if M < 2*w+50 {
		return nil, fmt.Errorf("%s: %d vectors with Theiler window %d: %w", who, M, w, ErrTooShort)
	}
	maxPairs := orDefault(opts.MaxPairs, 10_000_000)
	minPairs := orDefault(opts.MinPairs, 500)
	maxC := orDefault(opts.MaxC, 0.2)
	decades := orDefault(opts.Decades, 1)
	res := &CorrDimResult{D2: math.NaN(), R2: math.NaN(), SlopeSpread: math.NaN(), Embedding: *emb}
	hist := make([]int64, corrBins)
	var total int64
	if int64(M)*int64(M-1)/2 <= int64(maxPairs) {
		// every pair i < j with j − i > w
		res.Refs, res.Stride = M, 1
		cs := newCorrSum(z, d, tau, M, 1, hist)
		for i := 0; i < M; i++ {
			total += cs.add(i, i+w+1, M)
		}
	} else {
		nref := min(M, max(int(math.Sqrt(float64(maxPairs))), maxPairs/M))
		stride := int((int64(nref)*int64(M) + int64(maxPairs) - 1) / int64(maxPairs))
		stride = max(1, stride)
		res.Refs, res.Stride = nref, stride
		cs := newCorrSum(z, d, tau, M, stride, hist)
		for _, i := range evenlySpaced(M, nref) {
			// partners j = k·stride outside [i−w, i+w]
			total += cs.add(i, 0, ceilDiv(max(0, i-w), stride))
			first := i + w + 1
			first += (stride - first%stride) % stride
			total += cs.add(i, first/stride, ceilDiv(M, stride))
		}
	}
	res.Pairs = total
	if total == 0 {
		return nil, fmt.Errorf("%s: no pairs outside the Theiler window: %w", who, ErrTooShort)
	}
	// C at the edges of bins 1..corrBins−1: C(edge k) = Σ_{b<k} hist[b] / total.
	var cum int64
	var lnr, lnc []float64
	var cnt []int64
	for k := 1; k < corrBins; k++ {
		cum += hist[k-1]
		if cum == 0 {
			continue
		}
		r := math.Float64frombits(uint64(k+corrBase) << corrShift)
		c := float64(cum) / float64(total)
		res.Radii = append(res.Radii, r)
		res.C = append(res.C, c)
		lnr = append(lnr, math.Log(r))
		lnc = append(lnc, math.Log(c))
		cnt = append(cnt, cum)
		if cum == total {
			break
		}
	}
	// usable range: count ≥ minPairs and C ≤ maxC
	lo, hi := -1, -1
	for k := range lnr {
		if cnt[k] >= int64(minPairs) && res.C[k] <= maxC {
			if lo < 0 {
				lo = k
			}
			hi = k
		}
	}
	per := float64(int(1) << corrBinBits) // grid points per octave
	width := int(math.Round(decades * math.Log2(10) * per))
	if lo < 0 || hi-lo < width/2 || hi-lo < 4 {
		res.Reason = fmt.Sprintf("usable range of r (≥ %d pairs, C ≤ %g) spans less than %.2g decades", minPairs, maxC, decades/2)
		return res, nil
	}
	// local slopes by central differences (one-sided at the ends)
	ls := make([]float64, len(lnr))
	for k := lo; k <= hi; k++ {
		a, b := max(lo, k-1), min(hi, k+1)
		ls[k] = (lnc[b] - lnc[a]) / (lnr[b] - lnr[a])
	}
	ba, bb := lo, hi
	if hi-lo > width {
		bestSD := math.Inf(1)
		for a := lo; a+width <= hi; a++ {
			var s, ss float64
			for k := a; k <= a+width; k++ {
				s += ls[k]
				ss += ls[k] * ls[k]
			}
			m := float64(width + 1)
			sd := math.Sqrt(math.Max(0, ss/m-(s/m)*(s/m)))
			if sd < bestSD {
				bestSD, ba, bb = sd, a, a+width
			}
		}
	}
	f := fitLine(lnr[ba:bb+1], lnc[ba:bb+1])
	var s, ss float64
	for k := ba; k <= bb; k++ {
		s += ls[k]
		ss += ls[k] * ls[k]
	}
	m := float64(bb - ba + 1)
	res.D2, res.R2 = f.Slope, f.R2
	res.SlopeSpread = math.Sqrt(math.Max(0, ss/m-(s/m)*(s/m)))
	res.RMin, res.RMax = res.Radii[ba], res.Radii[bb]
	res.Decades = math.Log10(res.RMax / res.RMin)
	return res, nil
}

// corrSum bins maximum-norm distances between delay vectors (dimension d,
// delay tau) of z for the correlation sum: from a reference vector i to the
// partner vectors j = k·stride, k = 0, 1, … (j < M). It works coordinate
// by coordinate over the partners' coordinates laid out in columns, which
// reads memory in sequence; the distance max_c |y_{j,c} − y_{i,c}| is exact
// in any order, so the histogram is that of a pair-by-pair loop.
type corrSum struct {
	z    []float64
	tau  int
	cols [][]float64 // cols[c][k] = z[k·stride + c·tau]
	dist []float64   // scratch
	hist []int64
}

func newCorrSum(z []float64, d, tau, M, stride int, hist []int64) *corrSum {
	np := ceilDiv(M, stride)
	cs := &corrSum{z: z, tau: tau, cols: make([][]float64, d), dist: make([]float64, np), hist: hist}
	for c := range cs.cols {
		if stride == 1 {
			cs.cols[c] = z[c*tau : c*tau+M]
			continue
		}
		col := make([]float64, np)
		for k := range col {
			col[k] = z[k*stride+c*tau]
		}
		cs.cols[c] = col
	}
	return cs
}

// add adds to the histogram the binned distances from vector i to the
// partners k0 ≤ k < k1 and returns how many it added.
func (cs *corrSum) add(i, k0, k1 int) int64 {
	if k0 >= k1 {
		return 0
	}
	dist := cs.dist[:k1-k0]
	q0 := cs.z[i]
	for k, v := range cs.cols[0][k0:k1] {
		dist[k] = math.Abs(v - q0)
	}
	for c := 1; c < len(cs.cols); c++ {
		qc := cs.z[i+c*cs.tau]
		col := cs.cols[c][k0:k1]
		for k, v := range col[:len(dist)] {
			// Both are ≥ +0 and not NaN: max is exact and branch-free.
			dist[k] = max(dist[k], math.Abs(v-qc))
		}
	}
	hist := cs.hist[:corrBins]
	for _, v := range dist {
		b := int(math.Float64bits(v)>>corrShift) - corrBase
		if b < 0 {
			b = 0
		} else if b >= corrBins {
			b = corrBins - 1
		}
		hist[b]++
	}
	return int64(len(dist))
}
