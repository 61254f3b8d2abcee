package ordinal

import "fmt"

// Codes returns the pattern of every window of x in time order, window i
// being (x_i, x_{i+τ}, …, x_{i+(d−1)τ}), as the Lehmer codes Patterns
// counts (same encoding, same tie rule); with TiesSkip a window holding
// equal values gets −1. It is the symbol sequence of the ordinal partition
// network (networks/ordinal); its histogram is Patterns' Counts. Cost
// O(n·d²), one int32 per window.
func Codes(x []float64, opts Options) ([]int32, error) {
	d, tau, err := opts.resolve()
	if err != nil {
		return nil, fmt.Errorf("ordinal codes: %w", err)
	}
	if err := checkSeries(x); err != nil {
		return nil, fmt.Errorf("ordinal codes: %w", err)
	}
	span := (d - 1) * tau
	if len(x) <= span {
		return nil, fmt.Errorf("ordinal codes: %w: %d samples, need at least (d−1)·τ+1 = %d for one window of order %d, delay %d", ErrTooShort, len(x), span+1, d, tau)
	}
	out := make([]int32, len(x)-span)
	skip := opts.Ties == TiesSkip
	for i := range out {
		win := x[i : i+span+1]
		code, tie := 0, 0
		for j := 0; j < d-1; j++ {
			v := win[j*tau]
			c := 0
			for k := j + 1; k < d; k++ {
				u := win[k*tau]
				c += b2i(u < v)
				tie |= b2i(u == v)
			}
			code = code*(d-j) + c
		}
		if skip && tie != 0 {
			code = -1
		}
		out[i] = int32(code)
	}
	return out, nil
}
