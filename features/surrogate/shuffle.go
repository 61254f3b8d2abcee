package surrogate

import "math/rand/v2"

// shuffle writes a uniformly random permutation of x into dst
// (Fisher–Yates). Null hypothesis: i.i.d. values. Theiler et al., Physica D
// 58 (1992) 77.
func shuffle(dst, x []float64, rng *rand.Rand) {
	copy(dst, x)
	rng.Shuffle(len(dst), func(i, j int) { dst[i], dst[j] = dst[j], dst[i] })
}
