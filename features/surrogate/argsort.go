package surrogate

import "math"

// radixBits is the digit width of the LSD radix argsort: 11 bits gives six
// passes over a 64-bit key with 2048 buckets, cheap enough to clear for
// series of a few hundred points and cache-friendly for long ones.
const (
	radixBits    = 11
	radixBuckets = 1 << radixBits
	radixPasses  = (64 + radixBits - 1) / radixBits
)

// sorter holds the buffers of a stable argsort of float64 values, reused
// between calls. Not safe for concurrent use.
type sorter struct {
	keys, keys2 []uint64
	idx, idx2   []int32
	counts      [radixPasses][radixBuckets]int32
}

func newSorter(n int) *sorter {
	return &sorter{
		keys: make([]uint64, n), keys2: make([]uint64, n),
		idx: make([]int32, n), idx2: make([]int32, n),
	}
}

// floatKey maps a finite float64 to a uint64 with the same order
// (negative numbers have all bits flipped, others the sign bit set). −0 and
// +0 map to adjacent keys, which only matters for ties.
func floatKey(v float64) uint64 {
	b := math.Float64bits(v)
	if b>>63 != 0 {
		return ^b
	}
	return b | 1<<63
}

// argsort returns the indices that sort v ascending, ties in index order
// (a stable LSD radix sort on the order-preserving bit pattern, O(n)). The
// returned slice is owned by s and valid until the next call. v must be
// finite and len(v) must equal the length s was made for.
func (s *sorter) argsort(v []float64) []int32 {
	n := len(v)
	for p := range s.counts {
		clear(s.counts[p][:])
	}
	for i, x := range v {
		k := floatKey(x)
		s.keys[i] = k
		s.idx[i] = int32(i)
		for p := 0; p < radixPasses; p++ {
			s.counts[p][(k>>(p*radixBits))&(radixBuckets-1)]++
		}
	}
	keys, keys2, idx, idx2 := s.keys, s.keys2, s.idx, s.idx2
	for p := 0; p < radixPasses; p++ {
		c := &s.counts[p]
		shift := p * radixBits
		// A pass in which every key has the same digit changes nothing.
		if c[(keys[0]>>shift)&(radixBuckets-1)] == int32(n) {
			continue
		}
		var sum int32
		for b := range c {
			cnt := c[b]
			c[b] = sum
			sum += cnt
		}
		for i, k := range keys {
			d := (k >> shift) & (radixBuckets - 1)
			j := c[d]
			c[d]++
			keys2[j] = k
			idx2[j] = idx[i]
		}
		keys, keys2 = keys2, keys
		idx, idx2 = idx2, idx
	}
	// Keep the buffers' ownership straight for the next call.
	s.keys, s.keys2, s.idx, s.idx2 = keys, keys2, idx, idx2
	return idx
}

// resort reorders perm, a permutation of 0..len(v)−1 that sorted an earlier
// version of v, so that it sorts v ascending, by insertion sort on the
// values in perm order (vals is scratch of len(v)). Between IAAFT iterations
// the order changes little, so this costs O(n + inversions). It gives up
// and returns false once more than budget element moves were needed,
// leaving perm a permutation but unsorted.
func resort(perm []int32, vals, v []float64, budget int) bool {
	for j, i := range perm {
		vals[j] = v[i]
	}
	moves := 0
	for j := 1; j < len(vals); j++ {
		x := vals[j]
		if vals[j-1] <= x {
			continue
		}
		pi := perm[j]
		k := j
		for k > 0 && vals[k-1] > x {
			vals[k] = vals[k-1]
			perm[k] = perm[k-1]
			k--
		}
		vals[k] = x
		perm[k] = pi
		moves += j - k
		if moves > budget {
			return false
		}
	}
	return true
}
