package classifier

import (
	"encoding/binary"
	"fmt"
	"math"
	"slices"
	"sort"

	"github.com/tracesift/tracesift/internal/parallel"
)

// Novelty says how far a feature vector lies from everything the model was
// trained on, and which reference groups it resembles most.
//
// The measure: every feature is mapped through its training distribution
// function to a percentile u ∈ [0, 1] (so one extreme feature contributes
// at most 1, however extreme); the distance between two series is the mean
// of |u − u'| over the features both have; Distance is the mean distance to
// the K nearest training series. Percentile places Distance among the same
// distances of the training series themselves, each measured against the
// training series of the OTHER groups (reference systems' families, or
// labelled devices): how far a group the model has never seen typically
// lies from the rest. A trace of an unseen kind of noise therefore scores
// like a held-out training family, while a trace unlike any of them scores
// near 1. This is a k-nearest-neighbour novelty score on a
// rank-transformed feature space (Breunig et al., SIGMOD 2000, for
// distance-based outlier scores; the rank transform is common practice
// for mixed-scale features).
type Novelty struct {
	// Distance is the mean percentile distance to the K nearest training
	// series (0: identical percentiles; 1: opposite ends on every feature).
	Distance float64 `json:"distance"`
	// Percentile is the fraction of training series whose distance to the
	// other groups is below Distance.
	Percentile float64 `json:"percentile"`
	// Limit is the percentile above which the verdict is undetermined.
	Limit float64 `json:"limit"`
	// K is the number of nearest training series averaged.
	K int `json:"k"`
	// Nearest lists the groups of the K nearest training series with their
	// class and count, most frequent first.
	Nearest []NearGroup `json:"nearest"`
	// Features is the number of features compared.
	Features int `json:"features"`
}

// NearGroup is one group among a trace's nearest training series.
type NearGroup struct {
	Group string `json:"group"`
	Class string `json:"class"`
	Count int    `json:"count"`
}

// noveltyIndex is the part of a model that computes Novelty: per-feature
// percentile knots, the training rows coded as percentiles, their groups and
// classes, and the sorted reference distances.
type noveltyIndex struct {
	// knots[j] holds feature j's training quantiles at probabilities
	// 0, 1/q, …, 1 (q = noveltyKnots).
	knots [][]float64
	// codes holds rows·p percentile codes 0…noveltyScale, or noveltyMissing.
	codes  []uint8
	rows   int
	p      int
	group  []uint16 // index into groups
	groups []string
	class  []uint8
	// ref holds the training rows' distances to the other groups, sorted.
	ref []float32
}

const (
	noveltyKnots   = 64  // quantile knots per feature
	noveltyScale   = 254 // percentile codes 0…254
	noveltyMissing = 255 // code of a missing value
	// DefaultNoveltyK is the number of nearest training series averaged.
	DefaultNoveltyK = 10
	// DefaultNoveltyLimit is the percentile above which a trace is
	// undetermined as unlike the training set: beyond 99.5% of the held-out
	// distances of the training families themselves.
	DefaultNoveltyLimit = 0.995
)

// buildNovelty makes the index of ds (rows with NaN for missing values),
// its rows grouped by groups (nil: every row its own group). k is the
// neighbour count.
func buildNovelty(X [][]float64, y []int, groups []string, k int, workers int) *noveltyIndex {
	n, p := len(X), len(X[0])
	ix := &noveltyIndex{knots: make([][]float64, p), codes: make([]uint8, n*p), rows: n, p: p,
		group: make([]uint16, n), class: make([]uint8, n)}
	col := make([]float64, 0, n)
	for j := 0; j < p; j++ {
		col = col[:0]
		for _, row := range X {
			if v := row[j]; !math.IsNaN(v) {
				col = append(col, v)
			}
		}
		slices.Sort(col)
		kn := make([]float64, noveltyKnots+1)
		if len(col) > 0 {
			for q := range kn {
				kn[q] = quantileSorted(col, float64(q)/noveltyKnots)
			}
		}
		ix.knots[j] = kn
	}
	for i, row := range X {
		ix.encode(ix.codes[i*p:(i+1)*p], row)
		ix.class[i] = uint8(y[i])
	}
	grouped := len(groups) == len(X)
	var names []string
	if grouped {
		names = slices.Clone(groups)
		slices.Sort(names)
		names = slices.Compact(names)
		grouped = len(names) <= 65536
	}
	if grouped {
		ix.groups = names
		for i, g := range groups {
			gi, _ := slices.BinarySearch(ix.groups, g)
			ix.group[i] = uint16(gi)
		}
	} else {
		// No groups: each row is its own, so the reference distances are
		// plain leave-one-out distances.
		ix.groups = nil
		for i := range ix.group {
			ix.group[i] = uint16(i % 65536)
		}
	}
	ix.ref = make([]float32, n)
	parallel.For(n, workers, func(i int) {
		g := ix.group[i]
		skip := func(r int) bool { return r == i }
		if grouped {
			skip = func(r int) bool { return ix.group[r] == g }
		}
		d, _ := ix.nearest(ix.codes[i*p:(i+1)*p], k, skip)
		ix.ref[i] = float32(d)
	})
	slices.Sort(ix.ref)
	return ix
}

// quantileSorted returns the q-quantile of sorted s by linear interpolation
// between order statistics (Hyndman & Fan type 7, common practice).
func quantileSorted(s []float64, q float64) float64 {
	h := q * float64(len(s)-1)
	lo := int(math.Floor(h))
	if lo >= len(s)-1 {
		return s[len(s)-1]
	}
	return s[lo] + (h-float64(lo))*(s[lo+1]-s[lo])
}

// percentile maps v through feature j's knots: the fraction of the
// training distribution below v, interpolated linearly between knots; a
// value equal to a run of equal knots maps to the middle of the run (mid
// rank), so a feature that is constant over part of the training set does
// not separate equal values.
func (ix *noveltyIndex) percentile(j int, v float64) float64 {
	kn := ix.knots[j]
	lo := sort.SearchFloat64s(kn, v) // first knot ≥ v
	hi := lo
	for hi < len(kn) && kn[hi] == v {
		hi++
	}
	q := float64(noveltyKnots)
	switch {
	case hi > lo: // v equals knots lo…hi−1
		return (float64(lo) + float64(hi-1)) / 2 / q
	case lo == 0:
		return 0
	case lo == len(kn):
		return 1
	}
	a, b := kn[lo-1], kn[lo]
	return (float64(lo-1) + (v-a)/(b-a)) / q
}

// encode writes the percentile codes of row into dst.
func (ix *noveltyIndex) encode(dst []uint8, row []float64) {
	for j, v := range row {
		if math.IsNaN(v) {
			dst[j] = noveltyMissing
			continue
		}
		dst[j] = uint8(math.Round(ix.percentile(j, v) * noveltyScale))
	}
}

// nearest returns the mean distance from the coded vector c to its k
// nearest training rows, and their row indices, skipping the rows for
// which skip (if not nil) is true.
func (ix *noveltyIndex) nearest(c []uint8, k int, skip func(r int) bool) (float64, []int) {
	p := ix.p
	bestD := make([]float64, 0, k+1)
	bestI := make([]int, 0, k+1)
	for r := 0; r < ix.rows; r++ {
		if skip != nil && skip(r) {
			continue
		}
		row := ix.codes[r*p : (r+1)*p]
		// The distance is sum/(cnt·scale) with cnt ≤ p compared features,
		// so once sum/(p·scale) reaches the k-th best distance the row
		// cannot enter the list: stop early (checked every 16 features).
		limit := math.Inf(1)
		if len(bestD) == k {
			limit = bestD[k-1] * float64(p) * noveltyScale
		}
		var sum, cnt int
		pruned := false
		for j, a := range c {
			b := row[j]
			if a == noveltyMissing || b == noveltyMissing {
				continue
			}
			d := int(a) - int(b)
			if d < 0 {
				d = -d
			}
			sum += d
			cnt++
			if j&15 == 15 && float64(sum) >= limit {
				pruned = true
				break
			}
		}
		if cnt == 0 || pruned {
			continue
		}
		d := float64(sum) / float64(cnt) / noveltyScale
		if len(bestD) == k && d >= bestD[k-1] {
			continue
		}
		pos := sort.SearchFloat64s(bestD, d)
		for pos < len(bestD) && bestD[pos] == d {
			pos++ // ties keep the earlier row first
		}
		bestD = slices.Insert(bestD, pos, d)
		bestI = slices.Insert(bestI, pos, r)
		if len(bestD) > k {
			bestD, bestI = bestD[:k], bestI[:k]
		}
	}
	if len(bestD) == 0 {
		return math.NaN(), nil
	}
	var s float64
	for _, d := range bestD {
		s += d
	}
	return s / float64(len(bestD)), bestI
}

// novelty scores the feature vector x (NaN for missing values) against
// the training rows for which skip (if not nil) is false.
func (ix *noveltyIndex) novelty(x []float64, classes []string, k int, limit float64, skip func(r int) bool) Novelty {
	c := make([]uint8, ix.p)
	ix.encode(c, x)
	d, near := ix.nearest(c, k, skip)
	nv := Novelty{Distance: d, Limit: limit, K: k}
	for _, v := range c {
		if v != noveltyMissing {
			nv.Features++
		}
	}
	if math.IsNaN(d) {
		nv.Percentile = 1
		return nv
	}
	below := sort.Search(len(ix.ref), func(i int) bool { return float64(ix.ref[i]) >= d })
	nv.Percentile = float64(below) / float64(len(ix.ref))
	count := map[[2]int]int{}
	var keys [][2]int
	for _, r := range near {
		key := [2]int{-1, int(ix.class[r])}
		if ix.groups != nil {
			key[0] = int(ix.group[r])
		}
		if count[key] == 0 {
			keys = append(keys, key)
		}
		count[key]++
	}
	slices.SortStableFunc(keys, func(a, b [2]int) int { return count[b] - count[a] })
	for _, key := range keys {
		name := ""
		if key[0] >= 0 {
			name = ix.groups[key[0]]
		}
		nv.Nearest = append(nv.Nearest, NearGroup{Group: name, Class: classes[key[1]], Count: count[key]})
	}
	return nv
}

// String summarises the novelty for people, e.g. "novelty percentile 0.62
// (distance 0.081 to the 10 nearest reference series: telegraph ×6, …)".
func (n Novelty) String() string {
	s := fmt.Sprintf("novelty percentile %.3f (mean percentile distance %.3f to the %d nearest training series", n.Percentile, n.Distance, n.K)
	for i, g := range n.Nearest {
		if i == 0 {
			s += ": "
		} else {
			s += ", "
		}
		if i == 3 {
			s += "…"
			break
		}
		if g.Group != "" {
			s += fmt.Sprintf("%s (%s) ×%d", g.Group, g.Class, g.Count)
		} else {
			s += fmt.Sprintf("%s ×%d", g.Class, g.Count)
		}
	}
	return s + ")"
}

// appendTo appends the index in the model file layout (see modelfile.go).
func (ix *noveltyIndex) appendTo(b []byte) []byte {
	b = binary.AppendUvarint(b, uint64(ix.rows))
	b = binary.AppendUvarint(b, uint64(ix.p))
	for _, kn := range ix.knots {
		for _, v := range kn {
			b = binary.LittleEndian.AppendUint64(b, math.Float64bits(v))
		}
	}
	b = append(b, ix.codes...)
	b = binary.AppendUvarint(b, uint64(len(ix.groups)))
	for _, g := range ix.groups {
		b = binary.AppendUvarint(b, uint64(len(g)))
		b = append(b, g...)
	}
	for i := 0; i < ix.rows; i++ {
		b = binary.AppendUvarint(b, uint64(ix.group[i]))
		b = append(b, ix.class[i])
	}
	for _, d := range ix.ref {
		b = binary.LittleEndian.AppendUint32(b, math.Float32bits(d))
	}
	return b
}

// novelty decodes a novelty index written by appendTo for p features and
// k classes.
func (r *byteReader) novelty(p, k int) (*noveltyIndex, error) {
	rows, err := r.uvarint()
	if err != nil {
		return nil, err
	}
	pp, err := r.uvarint()
	if err != nil {
		return nil, err
	}
	if pp != uint64(p) || rows == 0 || rows > uint64(len(r.b)) {
		return nil, corrupt("%d rows of %d features, model has %d features", rows, pp, p)
	}
	n := int(rows)
	ix := &noveltyIndex{rows: n, p: p, knots: make([][]float64, p), group: make([]uint16, n), class: make([]uint8, n)}
	for j := range ix.knots {
		raw, err := r.bytes(8 * (noveltyKnots + 1))
		if err != nil {
			return nil, err
		}
		kn := make([]float64, noveltyKnots+1)
		for q := range kn {
			kn[q] = math.Float64frombits(binary.LittleEndian.Uint64(raw[8*q:]))
			if math.IsNaN(kn[q]) || math.IsInf(kn[q], 0) || (q > 0 && kn[q] < kn[q-1]) {
				return nil, corrupt("feature %d: knots not finite and sorted", j)
			}
		}
		ix.knots[j] = kn
	}
	codes, err := r.bytes(uint64(n) * uint64(p))
	if err != nil {
		return nil, err
	}
	ix.codes = slices.Clone(codes)
	ng, err := r.uvarint()
	if err != nil {
		return nil, err
	}
	if ng > 65536 || ng > uint64(len(r.b)-r.off) {
		return nil, corrupt("%d groups", ng)
	}
	for g := 0; g < int(ng); g++ {
		l, err := r.uvarint()
		if err != nil {
			return nil, err
		}
		name, err := r.bytes(l)
		if err != nil {
			return nil, err
		}
		ix.groups = append(ix.groups, string(name))
	}
	for i := 0; i < n; i++ {
		g, err := r.uvarint()
		if err != nil {
			return nil, err
		}
		c, err := r.bytes(1)
		if err != nil {
			return nil, err
		}
		if (ng > 0 && g >= ng) || g > 65535 || int(c[0]) >= k {
			return nil, corrupt("row %d: group %d, class %d", i, g, c[0])
		}
		ix.group[i], ix.class[i] = uint16(g), c[0]
	}
	raw, err := r.bytes(4 * uint64(n))
	if err != nil {
		return nil, err
	}
	ix.ref = make([]float32, n)
	for i := range ix.ref {
		ix.ref[i] = math.Float32frombits(binary.LittleEndian.Uint32(raw[4*i:]))
		if math.IsNaN(float64(ix.ref[i])) || (i > 0 && ix.ref[i] < ix.ref[i-1]) {
			return nil, corrupt("reference distances not sorted")
		}
	}
	return ix, nil
}
