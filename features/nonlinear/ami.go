package nonlinear

import (
	"fmt"
	"math"
	"slices"
	"sort"
)

// AMIOptions configures AverageMutualInformation. The zero value gives the
// documented defaults.
type AMIOptions struct {
	// MaxLag is the largest lag evaluated. Default min(200, n/20), at least 1.
	MaxLag int
	// Bins is the number of equiprobable bins per axis. Default: the odd
	// number nearest below clamp(⌊√(n/10)⌋, 5, 31): about ten points per
	// cell of a B×B histogram, at most 31 bins (a coarse partition blurs
	// the shallow first minimum of flows; a finer one raises the bias,
	// ≈ (B−1)²/(2N) nats, and the cost).
	// An odd count makes the estimate exactly symmetric under x → −x.
	Bins int
	// MaxPairs caps the number of (x_t, x_{t+τ}) pairs used per lag: the
	// first MaxPairs are used. Default 50000.
	MaxPairs int
}

// AMIResult is the average mutual information curve and its first minimum.
type AMIResult struct {
	// MI[τ] is I(x_t; x_{t+τ}) in nats for τ = 0..MaxLag (MI[0] is the
	// entropy of the binned series).
	MI []float64
	// FirstMin is the first lag τ ≥ 1 at which MI has a genuine local
	// minimum (see AverageMutualInformation), or 0 when there is none up to
	// MaxLag.
	FirstMin int
	Bins     int // bins per axis used
	Pairs    int // pairs per lag used (at lag MaxLag)
}

// AverageMutualInformation returns the average mutual information
// I(τ) = Σ_ij p_ij(τ) ln(p_ij(τ)/(p_i p_j)) between x_t and x_{t+τ} for
// τ = 0..MaxLag, estimated with a fixed partition into equiprobable bins
// (quantiles of x; tied values share a bin), and its first minimum, the
// delay recommended by Fraser & Swinney, Phys. Rev. A 33 (1986) 1134.
//
// A local minimum at τ (I(τ) < I(τ−1), I(τ) ≤ I(τ+1)) counts only when it
// lies above the independence floor: I(τ) > 4·bias, bias = (B−1)²/(2N)
// being the expected value of the binned estimator for independent data
// (Miller–Madow bias; common practice). Near the floor the curve only
// fluctuates, so a curve that decays to it without a dip (linear Gaussian
// processes, whose I(τ) = −½ln(1−ρ(τ)²) is monotone; white noise) has no
// first minimum, and Embed falls back to the autocorrelation time.
//
// The estimate depends only on the ranks of x, so it is unchanged by
// a·x + b for any a > 0, and with an odd number of bins also for a < 0.
// x needs at least 20 samples and MaxLag < n/2.
func AverageMutualInformation(x []float64, opts AMIOptions) (*AMIResult, error) {
	const who = "nonlinear: average mutual information"
	z, err := standardize(x, 20, who)
	if err != nil {
		return nil, err
	}
	n := len(z)
	maxLag := orDefault(opts.MaxLag, defaultMaxLag(n))
	if maxLag >= n/2 {
		return nil, fmt.Errorf("%s: max lag %d needs at least %d samples, have %d: %w", who, maxLag, 2*maxLag+2, n, ErrTooShort)
	}
	bins := opts.Bins
	if bins <= 0 {
		bins = max(5, min(31, int(math.Sqrt(float64(n)/10))))
		if bins%2 == 0 {
			bins--
		}
	}
	if bins < 2 || bins > 255 {
		return nil, fmt.Errorf("%s: %d bins, want 2..255", who, bins)
	}
	maxPairs := orDefault(opts.MaxPairs, 50000)
	b := binEquiprobable(z, bins)
	res := &AMIResult{MI: make([]float64, maxLag+1), Bins: bins}
	// Integer counts: the same values as float64 counting (far below
	// 2^53), without a floating-point add per pair.
	counts := make([]int32, bins*bins)
	joint := make([]float64, bins*bins)
	pa := make([]float64, bins)
	pb := make([]float64, bins)
	for lag := 0; lag <= maxLag; lag++ {
		np := min(n-lag, maxPairs)
		clear(counts)
		for t, u := range b[lag : lag+np] {
			counts[int(b[t])*bins+int(u)]++
		}
		for k, c := range counts {
			joint[k] = float64(c)
		}
		clear(pa)
		clear(pb)
		for i := 0; i < bins; i++ {
			for j := 0; j < bins; j++ {
				c := joint[i*bins+j]
				pa[i] += c
				pb[j] += c
			}
		}
		inv := 1 / float64(np)
		var mi float64
		for i := 0; i < bins; i++ {
			for j := 0; j < bins; j++ {
				c := joint[i*bins+j]
				if c > 0 {
					mi += c * inv * math.Log(c*float64(np)/(pa[i]*pb[j]))
				}
			}
		}
		res.MI[lag] = mi
		res.Pairs = np
	}
	bias := float64((bins-1)*(bins-1)) / (2 * float64(res.Pairs))
	res.FirstMin = firstGenuineMin(res.MI, bias)
	return res, nil
}

// firstGenuineMin implements the first-minimum rule documented on
// AverageMutualInformation.
func firstGenuineMin(mi []float64, bias float64) int {
	for t := 1; t+1 < len(mi); t++ {
		if mi[t] < mi[t-1] && mi[t] <= mi[t+1] && mi[t] > 4*bias {
			return t
		}
	}
	return 0
}

// binEquiprobable assigns each value of z to one of bins equiprobable bins
// by its mid-rank q = (#{z_j < v} + #{z_j ≤ v})/2: bin ⌊bins·q/n⌋, except
// that a value falling exactly on a bin boundary goes to the bin nearer the
// middle. Equal values share a bin, and for odd bins negating z maps bin k
// to bins−1−k exactly, so the mutual information is the same for x and −x.
func binEquiprobable(z []float64, bins int) []uint8 {
	s := slices.Clone(z)
	slices.Sort(s)
	n := len(s)
	out := make([]uint8, n)
	for i, v := range z {
		lo := sort.SearchFloat64s(s, v)                                       // #{< v}
		hi := lo + sort.Search(n-lo, func(k int) bool { return s[lo+k] > v }) // #{≤ v}
		num := int64(bins) * int64(lo+hi)                                     // bins·q·2
		den := 2 * int64(n)
		b := int(num / den)
		if num%den == 0 && b > 0 && 2*b > bins {
			b-- // on a boundary in the upper half: go down, toward the middle
		}
		out[i] = uint8(min(b, bins-1))
	}
	return out
}
