package surrogate

import (
	"fmt"
	"math"
)

// TimeAsymmetry returns the normalised third moment of the increments,
//
//	⟨(x_{t+1} − x_t)³⟩ / ⟨(x_{t+1} − x_t)²⟩^{3/2},
//
// a time-reversal asymmetry statistic: its expectation is 0 for any
// time-reversible process, which includes every stationary linear Gaussian
// process and any static transform of one, and it is typically non-zero
// for dissipative chaos (Hénon, logistic). It is unchanged by a·x + b with
// a > 0 and changes sign for a < 0 (and under time reversal). Theiler et
// al., Physica D 58 (1992) 77; Schreiber & Schmitz, Physica D 142 (2000)
// 346 (memory). x needs ≥ 3 finite values with non-zero increments.
func TimeAsymmetry(x []float64) (float64, error) {
	if len(x) < 3 {
		return math.NaN(), fmt.Errorf("time asymmetry: %w: %d points, need 3", ErrTooShort, len(x))
	}
	var s2, s3 float64
	for t := 1; t < len(x); t++ {
		d := x[t] - x[t-1]
		d2 := d * d
		s2 += d2
		s3 += d2 * d
	}
	m := float64(len(x) - 1)
	if s2 == 0 {
		return math.NaN(), fmt.Errorf("time asymmetry: %w", ErrConstant)
	}
	v := (s3 / m) / math.Pow(s2/m, 1.5)
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return math.NaN(), fmt.Errorf("time asymmetry: %w", ErrNonFinite)
	}
	return v, nil
}

// TimeAsymmetryStat is TimeAsymmetry as a Statistic named
// "time_asymmetry".
var TimeAsymmetryStat = Statistic{Name: "time_asymmetry", Func: TimeAsymmetry}
