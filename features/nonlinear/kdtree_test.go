package nonlinear

import (
	"math"
	"math/rand/v2"
	"slices"
	"sort"
	"testing"
)

// randomPoints returns n points of dimension d; quantised to a coarse grid
// when quant is set, so that ties and identical points occur.
func randomPoints(rng *rand.Rand, n, d int, quant bool) []float64 {
	p := make([]float64, n*d)
	for i := range p {
		p[i] = rng.NormFloat64()
		if quant {
			p[i] = math.Round(p[i]*4) / 4
		}
	}
	return p
}

func dist(a, b []float64, euclid bool) float64 {
	var s float64
	for c := range a {
		g := math.Abs(a[c] - b[c])
		if euclid {
			s += g * g
		} else {
			s = math.Max(s, g)
		}
	}
	if euclid {
		return math.Sqrt(s)
	}
	return s
}

// The tree answers must equal brute force exactly (reference: exhaustive
// search over all points).
func TestKDTreeNearestMatchesBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, d := range []int{1, 2, 3, 5, 8} {
		for _, quant := range []bool{false, true} {
			n := 700
			pts := randomPoints(rng, n, d, quant)
			tree := newKDTree(pts, d, n)
			for _, euclid := range []bool{false, true} {
				for q := 0; q < n; q += 7 {
					w := q % 5
					_, got := tree.nearest(pts[q*d:(q+1)*d], q, w, euclid)
					want := math.Inf(1)
					for j := 0; j < n; j++ {
						if j-q <= w && q-j <= w {
							continue
						}
						if dj := dist(pts[q*d:(q+1)*d], pts[j*d:(j+1)*d], euclid); dj > 0 {
							want = math.Min(want, dj) // nearest distinct point
						}
					}
					if math.Abs(got-want) > 1e-12*math.Max(1, want) {
						t.Fatalf("d=%d quant=%v euclid=%v q=%d: nearest %g, brute force %g", d, quant, euclid, q, got, want)
					}
				}
			}
		}
	}
}

func TestKDTreeKNearestMatchesBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, d := range []int{1, 3, 6} {
		n := 500
		pts := randomPoints(rng, n, d, false)
		tree := newKDTree(pts, d, n)
		k := d + 1
		ids, ds := make([]int, k), make([]float64, k)
		for q := 0; q < 50; q++ {
			query := randomPoints(rng, 1, d, false)
			got := tree.kNearest(query, ids, ds)
			all := make([]float64, n)
			for j := range all {
				all[j] = dist(query, pts[j*d:(j+1)*d], true)
			}
			sort.Float64s(all)
			if got != k {
				t.Fatalf("found %d of %d", got, k)
			}
			for i := 0; i < k; i++ {
				if math.Abs(ds[i]-all[i]) > 1e-12 || math.Abs(dist(query, pts[ids[i]*d:(ids[i]+1)*d], true)-ds[i]) > 1e-12 {
					t.Fatalf("d=%d neighbour %d: %g, brute force %g", d, i, ds[i], all[i])
				}
			}
		}
	}
}

// Range counts must be exact (reference: exhaustive count with the same
// math.Abs(p−q) ≤ r test), including on quantised data where many
// distances equal r exactly.
func TestKDTreeCountsExact(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for _, d := range []int{1, 2, 3, 4} {
		for _, quant := range []bool{false, true} {
			n := 600
			pts := randomPoints(rng, n, d, quant)
			tree := newKDTree(pts, d, n)
			for _, r := range []float64{0, 0.1, 0.25, 0.5, 2} {
				var wantPairs int64
				for i := 0; i < n; i++ {
					cnt := 0
					for j := 0; j < n; j++ {
						if dist(pts[i*d:(i+1)*d], pts[j*d:(j+1)*d], false) <= r {
							cnt++
							if j > i {
								wantPairs++
							}
						}
					}
					if got := tree.countWithin(pts[i*d:(i+1)*d], r); got != cnt {
						t.Fatalf("d=%d quant=%v r=%g point %d: count %d, brute force %d", d, quant, r, i, got, cnt)
					}
				}
				if got := tree.pairsWithin(r); got != wantPairs {
					t.Fatalf("d=%d quant=%v r=%g: pairs %d, brute force %d", d, quant, r, got, wantPairs)
				}
			}
		}
	}
}

// newDelayTree must build exactly the tree that newKDTreeLeaf builds over
// the materialised delay vectors — same nodes, point order, boxes and
// coordinates — so that every query, ties included, answers identically
// (reference: the row-swapping builder, which the nonlinear features were
// computed with before the delay-vector builder existed). Quantised and
// flat stretches exercise equal keys in the median selection.
func TestDelayTreeEqualsRowTree(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for _, kind := range []string{"gauss", "quantised", "plateaus"} {
		for _, dim := range []int{1, 2, 3, 5, 9} {
			for _, delay := range []int{1, 3, 17} {
				n := 3000
				z := make([]float64, n)
				for i := range z {
					switch kind {
					case "gauss":
						z[i] = rng.NormFloat64()
					case "quantised":
						z[i] = float64(rng.IntN(5))
					default:
						z[i] = float64(i / 40 % 3)
					}
				}
				count := n - (dim-1)*delay - rng.IntN(50)
				for _, leaf := range []int{1, 10} {
					want := newKDTreeLeaf(delayVectors(z, dim, delay, count), dim, count, leaf)
					got := newDelayTree(z, dim, delay, count, leaf)
					if !slices.Equal(got.ids, want.ids) || !slices.Equal(got.nodes, want.nodes) ||
						!slices.Equal(got.box, want.box) || !slices.Equal(got.data, want.data) {
						t.Fatalf("%s dim=%d delay=%d leaf=%d: delay-vector tree differs from the row tree", kind, dim, delay, leaf)
					}
				}
			}
		}
	}
}
