package nonlinear

import (
	"fmt"
	"math"
	"math/rand/v2"
	"reflect"
	"testing"
)

// The sorted-projection searches, and the tie-reporting search of the
// shared search tree (built over more coordinates and more vectors than
// asked for), must give the k-d tree's answers exactly whenever they report
// no tie (reference: the k-d tree of the asked dimension, which the
// nonlinear features were computed with before either existed), and
// report a tie only when brute force finds two vectors at the nearest
// distance. Quantised series make ties common.
func TestProjectionMatchesTree(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	for _, quant := range []bool{false, true} {
		for _, d := range []int{1, 2, 4, 8} {
			for _, tau := range []int{1, 5} {
				n := 1500
				z := make([]float64, n)
				for i := range z {
					z[i] = rng.NormFloat64()
					if quant {
						z[i] = math.Round(z[i] * 3)
					}
				}
				p := newProjection(z, d+1, tau)
				shared := (*Reconstruction)(nil).searchTree(z, d+2, tau)
				m := n - d*tau
				w := 3
				for _, euclid := range []bool{false, true} {
					tree := newDelayTree(z, d, tau, m, kdLeafSize)
					ties := 0
					for i := 0; i < m; i += 11 {
						q := delayVectors(z[i:], d, tau, 1)
						wantJ, wantD := tree.nearest(q, i, w, euclid)
						for _, how := range []string{"projection", "projection limited", "shared tree"} {
							var j int
							var dist float64
							var tie bool
							limit := n
							if how == "projection limited" {
								limit = 40 // gives up often: a tie, never a wrong answer
							}
							switch {
							case how == "shared tree":
								j, dist, tie = shared.nearestTie(q, i, w, m, euclid)
							case euclid:
								j, dist, tie, _ = p.nearestEuclid(i, d, m, w, limit)
							default:
								j, dist, tie, _ = p.nearestMax(i, d, m, w, limit)
							}
							if tie && limit < n {
								continue
							}
							if tie {
								ties++
								if atBest := bruteCount(z, d, tau, m, i, w, dist, euclid); atBest < 2 {
									t.Fatalf("%s quant=%v d=%d τ=%d euclid=%v i=%d: tie reported, %d vector(s) at the nearest distance", how, quant, d, tau, euclid, i, atBest)
								}
								continue
							}
							if j != wantJ || dist != wantD {
								t.Fatalf("%s quant=%v d=%d τ=%d euclid=%v i=%d: (%d, %v), tree (%d, %v)", how, quant, d, tau, euclid, i, j, dist, wantJ, wantD)
							}
						}
					}
					if quant && d <= 2 && ties == 0 {
						t.Errorf("quant d=%d τ=%d euclid=%v: no tie among coarse values (the tie path went untested)", d, tau, euclid)
					}
				}
				// k nearest in a library range, as Prediction asks.
				from, to := 100, n/2
				lib := newDelayTree(z[from:], d, tau, to-from, kdLeafSize)
				k := d + 1
				ids, dists := make([]int, k), make([]float64, k)
				wantIDs, wantD := make([]int, k), make([]float64, k)
				top, topD := make([]int, k+1), make([]float64, k+1)
				for tq := n / 2; tq < m; tq += 13 {
					q := delayVectors(z[tq:], d, tau, 1)
					lib.kNearest(q, wantIDs, wantD)
					for a := range wantIDs {
						wantIDs[a] += from
					}
					for _, how := range []string{"projection", "projection limited"} {
						limit := n
						if how == "projection limited" {
							limit = 40
						}
						tie, _ := p.kNearestEuclid(tq, d, from, to, limit, ids, dists, top, topD)
						if tie {
							continue
						}
						if !reflect.DeepEqual(ids, wantIDs) || !reflect.DeepEqual(dists, wantD) {
							t.Fatalf("%s quant=%v d=%d τ=%d t=%d: k nearest %v %v, tree %v %v", how, quant, d, tau, tq, ids, dists, wantIDs, wantD)
						}
					}
				}
			}
		}
	}
}

// bruteCount counts the vectors j < m, |j − i| > w, at distance exactly
// dist > 0 from vector i, with the distance computed as the tree does.
func bruteCount(z []float64, d, tau, m, i, w int, dist float64, euclid bool) int {
	cnt := 0
	for j := 0; j < m; j++ {
		if j-i <= w && i-j <= w {
			continue
		}
		var s float64
		for c := 0; c < d; c++ {
			g := z[j+c*tau] - z[i+c*tau]
			if euclid {
				s += g * g
			} else {
				s = math.Max(s, math.Abs(g))
			}
		}
		if euclid {
			s = math.Sqrt(s)
		}
		if s == dist {
			cnt++
		}
	}
	return cnt
}

// The estimators on a Reconstruction must return exactly what the package
// functions return with the same embedding given (reference: the package
// functions, each standardising and embedding on its own).
func TestReconstructionMatchesFunctions(t *testing.T) {
	for _, c := range []struct {
		name string
		x    []float64
	}{
		{"lorenz", series(t, lorenz, 6000, 1)},
		{"henon", series(t, henon, 4000, 2)},
		{"white", series(t, white, 4000, 3)},
	} {
		rec, err := Reconstruct(c.x, EmbedOptions{MaxRef: 300, MaxDim: 8})
		if err != nil {
			t.Fatal(err)
		}
		fixed := rec.Embedding().Fixed()
		ly, err1 := rec.Lyapunov(LyapunovOptions{MaxRef: 500})
		lyF, err2 := Lyapunov(c.x, LyapunovOptions{Embed: fixed, MaxRef: 500})
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		ly.Embedding, lyF.Embedding = Embedding{}, Embedding{}
		if !sameResult(ly, lyF) {
			t.Errorf("%s: Lyapunov through the reconstruction differs", c.name)
		}
		cd, err1 := rec.CorrelationDimension(CorrDimOptions{MaxPairs: 200000})
		cdF, err2 := CorrelationDimension(c.x, CorrDimOptions{Embed: fixed, MaxPairs: 200000})
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		cd.Embedding, cdF.Embedding = Embedding{}, Embedding{}
		if !sameResult(cd, cdF) {
			t.Errorf("%s: correlation dimension through the reconstruction differs", c.name)
		}
		pr, err1 := rec.Prediction(PredictionOptions{MaxHorizon: 12})
		prF, err2 := Prediction(c.x, PredictionOptions{Embed: fixed, MaxHorizon: 12})
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		pr.Embedding, prF.Embedding = Embedding{}, Embedding{}
		if !sameResult(pr, prF) {
			t.Errorf("%s: prediction through the reconstruction differs", c.name)
		}
	}
}

// sameResult compares two results field by field, NaN equal to NaN: %v
// prints every float64 in its shortest exact form.
func sameResult(a, b any) bool {
	return fmt.Sprintf("%+v", a) == fmt.Sprintf("%+v", b)
}
