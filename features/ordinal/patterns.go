package ordinal

import "fmt"

// Distribution is the empirical distribution of ordinal patterns of a
// series for one order d and delay τ.
//
// A window is (x_i, x_{i+τ}, …, x_{i+(d−1)τ}); its pattern is the
// permutation of ranks, encoded as its Lehmer code
// code = Σ_{j=0}^{d−2} c_j·(d−1−j)!, c_j = #{k > j : x_{i+kτ} < x_{i+jτ}},
// an integer in [0, d!). Code 0 is the strictly increasing window, d!−1 the
// strictly decreasing one.
//
// Ties: with TiesStable (the default) equal values are ranked by order of
// appearance (the earlier counts as the smaller), so every window gets
// exactly one pattern; with TiesSkip a window holding equal values is not
// counted (see Ties).
type Distribution struct {
	Order   int   // embedding order d
	Delay   int   // embedding delay τ
	Counts  []int // occurrences of each pattern, indexed by Lehmer code; len d!
	Windows int   // number of windows counted: n − (d−1)·τ, less Skipped
	// Ties is the number of windows holding at least one pair of equal
	// values. A large share (quantised read-outs, clipped traces) biases
	// the distribution towards the patterns the tie rule favours
	// (TiesStable) or leaves few windows (TiesSkip).
	Ties int
	// Skipped is the number of windows left out by TiesSkip (equal to Ties
	// then, 0 with TiesStable).
	Skipped int
	// TieRule is the rule the distribution was counted with.
	TieRule Ties
}

// Patterns returns the ordinal-pattern distribution of x (Bandt & Pompe,
// Phys. Rev. Lett. 88 (2002) 174102). Each window is encoded in O(d²)
// comparisons without allocation; the cost is O(n·d²).
//
// The caller must supply at least (d−1)·τ + 1 finite samples that are not
// all equal, and with TiesSkip at least one window without equal values
// (else ErrAllTied).
func Patterns(x []float64, opts Options) (*Distribution, error) {
	d, tau, err := opts.resolve()
	if err != nil {
		return nil, fmt.Errorf("ordinal patterns: %w", err)
	}
	if err := checkSeries(x); err != nil {
		return nil, fmt.Errorf("ordinal patterns: %w", err)
	}
	span := (d - 1) * tau
	if len(x) <= span {
		return nil, fmt.Errorf("ordinal patterns: %w: %d samples, need at least (d−1)·τ+1 = %d for one window of order %d, delay %d", ErrTooShort, len(x), span+1, d, tau)
	}
	w := len(x) - span
	counts := make([]int, factorial(d))
	ties := 0
	skip := opts.Ties == TiesSkip
	for i := 0; i < w; i++ {
		win := x[i : i+span+1]
		code := 0
		tie := 0
		for j := 0; j < d-1; j++ {
			v := win[j*tau]
			c := 0
			for k := j + 1; k < d; k++ {
				u := win[k*tau]
				c += b2i(u < v) // branch-free: random data defeats prediction
				tie |= b2i(u == v)
			}
			code = code*(d-j) + c
		}
		ties += tie
		if skip && tie != 0 {
			continue
		}
		counts[code]++
	}
	dist := &Distribution{Order: d, Delay: tau, Counts: counts, Windows: w, Ties: ties, TieRule: opts.Ties}
	if skip {
		dist.Windows -= ties
		dist.Skipped = ties
		if dist.Windows == 0 {
			return nil, fmt.Errorf("ordinal patterns: %w (%d windows of order %d, delay %d)", ErrAllTied, w, d, tau)
		}
	}
	return dist, nil
}

// Probabilities returns the relative frequency of each pattern, indexed by
// Lehmer code (they sum to 1).
func (d *Distribution) Probabilities() []float64 {
	p := make([]float64, len(d.Counts))
	for i, c := range d.Counts {
		p[i] = float64(c) / float64(d.Windows)
	}
	return p
}

// Pattern returns the ranks (0 = smallest) of the d samples of a window
// whose Lehmer code is code, e.g. Pattern(0, 3) = [0 1 2] (increasing) and
// Pattern(5, 3) = [2 1 0] (decreasing). It errors for an order outside
// [MinOrder, MaxOrder] or a code outside [0, d!).
func Pattern(code, order int) ([]int, error) {
	if order < MinOrder || order > MaxOrder {
		return nil, fmt.Errorf("ordinal pattern: %w: order %d, want %d ≤ d ≤ %d", ErrBadOption, order, MinOrder, MaxOrder)
	}
	if code < 0 || code >= factorial(order) {
		return nil, fmt.Errorf("ordinal pattern: %w: code %d, want 0 ≤ code < %d", ErrBadOption, code, factorial(order))
	}
	digits := make([]int, order)
	for j := order - 1; j >= 0; j-- {
		base := order - j // digit j has base d − j
		digits[j] = code % base
		code /= base
	}
	avail := make([]int, order)
	for i := range avail {
		avail[i] = i
	}
	ranks := make([]int, order)
	for j, c := range digits {
		ranks[j] = avail[c]
		avail = append(avail[:c], avail[c+1:]...)
	}
	return ranks, nil
}

// b2i converts a comparison result to 0 or 1 (compiled to a flag move).
func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
}
