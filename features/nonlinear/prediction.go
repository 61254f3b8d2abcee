package nonlinear

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// PredictionOptions configures Prediction. The zero value gives the
// documented defaults.
type PredictionOptions struct {
	// Embedding: any of Dim, Delay left at zero is chosen by Embed (the
	// Theiler window only matters to the dimension search: library and
	// test sets are disjoint halves).
	Embed EmbedOptions
	// MaxHorizon h: forecasts are made 1..h samples ahead. Default 10.
	MaxHorizon int
	// MaxTest caps the test vectors, evenly spaced over the second half.
	// Default 1000.
	MaxTest int
	// MaxLibrary caps the library vectors: the last MaxLibrary vectors of
	// the first half are used. Default 50000.
	MaxLibrary int
}

// PredictionResult is the forecast skill at each horizon.
type PredictionResult struct {
	// Rho[h−1] is the Pearson correlation between forecasts and true
	// values h samples ahead, h = 1..MaxHorizon.
	Rho []float64
	// LinearRho[h−1] is the same correlation for the best global linear
	// (autoregressive) forecast from the same delay vectors, fitted by least
	// squares on the library and scored on the same test vectors. Simplex
	// skill above it points to nonlinear determinism; below it, to linear
	// correlated noise, where the few nearest neighbours only add variance
	// (Casdagli, J. R. Stat. Soc. B 54 (1992) 303: local versus global
	// models). Zero at a horizon where the fit is singular.
	LinearRho []float64
	// Rho1 = Rho[0]; Decay = Rho(1) − Rho(h); Slope is the least-squares
	// slope of Rho against h (negative when skill falls with horizon).
	Rho1, Decay, Slope float64
	Library, Test      int // vectors used
	Embedding          Embedding
}

// Prediction measures nonlinear forecast skill by the simplex method of
// Sugihara & May, Nature 344 (1990) 734. The series is delay-embedded (d,
// τ from Embed) and split in halves: the first half is the library, the
// second the test set. For each test vector y_t the d+1 nearest library
// vectors y_{t_k} (Euclidean, k-d tree) at distances δ_k forecast
//
//	x̂_{t+(d−1)τ+h} = Σ_k w_k x_{t_k+(d−1)τ+h} / Σ_k w_k,  w_k = exp(−δ_k/δ_1),
//
// and the skill at horizon h is the correlation ρ(h) between forecasts and
// truth over the test set. Deterministic chaos gives ρ(1) near 1 that falls
// with h; uncorrelated noise gives ρ ≈ 0 at all h; linear correlated noise
// gives the autocorrelation-like ρ(h). Horizons are in samples: for a flow
// sampled much faster than its decorrelation time ρ stays near 1 over 10
// samples. The series needs at least 200 samples.
func Prediction(x []float64, opts PredictionOptions) (*PredictionResult, error) {
	r, err := reconstruct(x, opts.Embed, predictionWho)
	if err != nil {
		return nil, err
	}
	return r.Prediction(opts)
}

// predictionWho names Prediction in error messages.
const predictionWho = "nonlinear: prediction"

// Prediction is the package function Prediction on the reconstructed
// series, in its embedding (opts.Embed is not read).
//
// The nearest library vectors are found by sorted projection while that
// pays (searchPlan), else by the k-d tree over the library, which also
// settles a test vector whose d+2 nearest distances are not all different
// (so that the set or the order of its neighbours depends on how ties are
// broken); the answers are those of the tree alone (see projection). (A
// search tree over all vectors, filtered to the library, cost twice as
// much, and the order-free k-nearest search of the library tree a quarter
// more than its own: measured.)
func (r *Reconstruction) Prediction(opts PredictionOptions) (*PredictionResult, error) {
	const who = predictionWho
	z, emb := r.z, r.emb
	H := orDefault(opts.MaxHorizon, 10)
	maxTest := orDefault(opts.MaxTest, 1000)
	maxLib := orDefault(opts.MaxLibrary, 50000)
	d, tau := emb.Dim, emb.Delay
	span := (d - 1) * tau // offset of the last coordinate
	n := len(z)
	half := n / 2
	// library vectors t with t+span+H < half; test vectors t ≥ half with t+span+H < n
	libEnd := half - span - H
	testN := n - half - span - H
	if libEnd < 2*(d+1) || testN < 10 {
		return nil, fmt.Errorf("%s: %d samples leave %d library and %d test vectors (d = %d, τ = %d, h = %d): %w",
			who, n, libEnd, testN, d, tau, H, ErrTooShort)
	}
	libStart := max(0, libEnd-maxLib)
	var proj *projection // on first use
	var tree *kdTree     // over the library, on first use
	k := d + 1
	plan := searchPlan{n: libEnd - libStart, noProj: libEnd-libStart <= k || r.projectionUseless(d), noFast: true}
	ids := make([]int, k)
	dists := make([]float64, k)
	top, topD := make([]int, k+1), make([]float64, k+1)
	q := make([]float64, d)
	w := make([]float64, k)
	tests := evenlySpaced(testN, maxTest)
	fc := make([][]float64, H) // forecasts per horizon
	tr := make([][]float64, H)
	for h := range fc {
		fc[h] = make([]float64, len(tests))
		tr[h] = make([]float64, len(tests))
	}
	for ti, off := range tests {
		t := half + off
		got, tie := k, true
		for c := range q {
			q[c] = z[t+c*tau]
		}
		if useProj, _ := plan.next(); useProj {
			if proj == nil {
				proj = r.projectionOf(z, d, tau)
			}
			var c int
			tie, c = proj.kNearestEuclid(t, d, libStart, libEnd, plan.limit(), ids, dists, top, topD)
			plan.record(c, tie)
		}
		if tie { // the tree answers, with indices relative to libStart
			if tree == nil {
				tree = newDelayTree(z[libStart:], d, tau, libEnd-libStart, kdLeafSize)
			}
			got = tree.kNearest(q, ids, dists)
			for j := range got {
				ids[j] += libStart
			}
		}
		var sw float64
		for j := 0; j < got; j++ {
			switch {
			case dists[0] == 0:
				w[j] = 0
				if dists[j] == 0 {
					w[j] = 1
				}
			default:
				w[j] = math.Exp(-dists[j] / dists[0])
			}
			sw += w[j]
		}
		for h := 1; h <= H; h++ {
			var s float64
			for j := 0; j < got; j++ {
				s += w[j] * z[ids[j]+span+h]
			}
			fc[h-1][ti] = s / sw
			tr[h-1][ti] = z[t+span+h]
		}
	}
	res := &PredictionResult{Rho: make([]float64, H), Library: libEnd - libStart, Test: len(tests), Embedding: *emb}
	res.LinearRho = linearForecastSkill(z, d, tau, libStart, libEnd, half, tests, tr)
	hs := make([]float64, H)
	for h := range fc {
		res.Rho[h] = pearson(tr[h], fc[h])
		if math.IsNaN(res.Rho[h]) { // constant forecasts or truths: no skill
			res.Rho[h] = 0
		}
		hs[h] = float64(h + 1)
	}
	res.Rho1 = res.Rho[0]
	res.Decay = res.Rho[0] - res.Rho[H-1]
	if H > 1 {
		res.Slope = fitLine(hs, res.Rho).Slope
	}
	return res, nil
}

// linearForecastSkill fits, for each horizon h = 1..len(truth), the least-
// squares linear forecast x_{t+span+h} ≈ β_0 + Σ_j β_j x_{t+jτ} over the
// library vectors t ∈ [libStart, libEnd) and returns its correlation with
// truth[h−1] over the test vectors half+tests[i]. The normal equations are
// (d+1)×(d+1) and shared by every horizon: one pass over the library.
func linearForecastSkill(z []float64, d, tau, libStart, libEnd, half int, tests []int, truth [][]float64) []float64 {
	H := len(truth)
	span := (d - 1) * tau
	p := d + 1
	gram := make([]float64, p*p)
	rhs := make([]float64, p*H)
	row := make([]float64, p)
	row[0] = 1
	for t := libStart; t < libEnd; t++ {
		for j := 0; j < d; j++ {
			row[j+1] = z[t+j*tau]
		}
		for a := 0; a < p; a++ {
			ra := row[a]
			for b := a; b < p; b++ {
				gram[a*p+b] += ra * row[b]
			}
			for h := 0; h < H; h++ {
				rhs[a*H+h] += ra * z[t+span+h+1]
			}
		}
	}
	for a := 0; a < p; a++ {
		for b := 0; b < a; b++ {
			gram[a*p+b] = gram[b*p+a]
		}
	}
	out := make([]float64, H)
	var chol mat.Cholesky
	if !chol.Factorize(mat.NewSymDense(p, gram)) {
		return out
	}
	var beta mat.Dense
	if err := chol.SolveTo(&beta, mat.NewDense(p, H, rhs)); err != nil {
		return out
	}
	fc := make([]float64, len(tests))
	for h := 0; h < H; h++ {
		for i, off := range tests {
			t := half + off
			s := beta.At(0, h)
			for j := 0; j < d; j++ {
				s += beta.At(j+1, h) * z[t+j*tau]
			}
			fc[i] = s
		}
		if r := pearson(truth[h], fc); !math.IsNaN(r) {
			out[h] = r
		}
	}
	return out
}
