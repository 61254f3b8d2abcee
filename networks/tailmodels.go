package networks

import (
	"fmt"
	"math"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

// Names of the degree-tail models.
const (
	ModelPowerLaw    = "power_law"
	ModelExponential = "exponential"
	ModelLogNormal   = "log_normal"
)

// TailModelsOptions controls TailModels. The zero value means the defaults.
type TailModelsOptions struct {
	// KMin is the lower end of the tail all three models describe; zero
	// means the power law's Kolmogorov–Smirnov choice (PowerLaw with
	// PowerLaw's options), as Clauset, Shalizi & Newman do.
	KMin     int
	PowerLaw PowerLawOptions
	// Alpha is the significance level at which a comparison decides;
	// zero means 0.1 (Clauset, Shalizi & Newman 2009, section 5).
	Alpha float64
}

// TailModel is one model fitted to the degree tail k ≥ k_min by maximum
// likelihood: its parameters and log-likelihood.
type TailModel struct {
	Name string `json:"name"`
	// Power law: P(k) = k^{−Alpha}/ζ(Alpha, k_min). Exponential (discrete):
	// P(k) = (1 − e^{−Lambda}) e^{−Lambda(k − k_min)}. Log-normal,
	// discretised: P(k) ∝ F(k + 1) − F(k), F the log-normal distribution
	// function with parameters Mu, Sigma (Clauset et al. 2009, table 2.1).
	Alpha  float64 `json:"alpha,omitempty"`
	Lambda float64 `json:"lambda,omitempty"`
	Mu     float64 `json:"mu,omitempty"`
	Sigma  float64 `json:"sigma,omitempty"`
	LogLik float64 `json:"log_lik"`
}

// TailComparison is Vuong's likelihood-ratio test of model A against B on
// the same tail: R = Σ_i ln(p_A(k_i)/p_B(k_i)), positive when A fits
// better; P is the two-sided p-value erfc(|R|/(σ√(2n))), σ the standard
// deviation of the pointwise log ratios (Vuong, Econometrica 57 (1989)
// 307; Clauset et al. 2009, eq. 5.6) — except when the fitted log-normal
// is a power law over the whole tail (its limit μ → −∞), where the two
// models are nested and P is Wilks' P(χ²₁ > 2|R|). Favours names A or B when P < Alpha,
// and is empty when the data cannot tell them apart.
type TailComparison struct {
	A       string  `json:"a"`
	B       string  `json:"b"`
	R       float64 `json:"r"`
	P       float64 `json:"p"`
	Favours string  `json:"favours,omitempty"`
}

// TailModels compares models of the degree tail.
type TailModels struct {
	KMin  int   `json:"k_min"`
	NTail int64 `json:"n_tail"`
	// Mode is the most frequent degree of the whole distribution.
	Mode        int              `json:"mode"`
	Models      []TailModel      `json:"models"`
	Comparisons []TailComparison `json:"comparisons"`
	// Winner is the model that fits better than both others (R > 0 in its
	// two comparisons; the highest likelihood if the comparisons go round
	// in a circle) and P the larger p-value of its two comparisons: the
	// evidence for it is only as strong as its weakest win. Winner holds
	// whether or not P is below Alpha; Decided says whether it is.
	Winner  string  `json:"winner"`
	P       float64 `json:"p"`
	Decided bool    `json:"decided"`
	// Warnings: a power law described a tail that begins below the peak of
	// the distribution, and similar cautions.
	Warnings []string `json:"warnings,omitempty"`
}

// MarshalJSON writes the comparison with NaN as null.
func (t TailModels) MarshalJSON() ([]byte, error) { return jsonsafe.Marshal(t, jsonsafe.Options{}) }

// TailModelsOf fits a power law, an exponential and a log-normal to the
// degree tail of g by maximum likelihood and compares them pairwise with
// Vuong's test (Clauset, Shalizi & Newman, SIAM Review 51 (2009) 661). A
// power law needs the tail to fall from its start: when the mode of the
// degree distribution lies well above k_min (at least 3 past it and twice
// it), P(k) still rises there and a warning says so. ErrTooFewPoints when
// the tail holds fewer than 10 nodes or a single degree.
func TailModelsOf(g *Graph, opts TailModelsOptions) (TailModels, error) {
	hist := degreeHistogram(g)
	kmin := opts.KMin
	if kmin <= 0 {
		pl, err := powerLawFromHist(hist, opts.PowerLaw)
		if err != nil {
			return TailModels{}, fmt.Errorf("tail models: %w", err)
		}
		kmin = pl.KMin
	}
	return tailModelsFromHist(hist, kmin, opts.Alpha)
}

func tailModelsFromHist(hist []int64, kmin int, alpha float64) (TailModels, error) {
	if alpha <= 0 {
		alpha = 0.1
	}
	kmin = max(kmin, 1)
	tm := TailModels{KMin: kmin, P: math.NaN()}
	var sumK, sumLog float64
	distinct := 0
	for k, c := range hist {
		if c > hist[tm.Mode] {
			tm.Mode = k
		}
		if k >= kmin && c > 0 {
			tm.NTail += c
			sumK += float64(k) * float64(c)
			sumLog += math.Log(float64(k)) * float64(c)
			distinct++
		}
	}
	if tm.NTail < 10 || distinct < 2 {
		return tm, fmt.Errorf("tail models: %d nodes and %d distinct degrees at k ≥ %d: %w", tm.NTail, distinct, kmin, ErrTooFewPoints)
	}
	n := float64(tm.NTail)
	// Power law: the same MLE as PowerLaw.
	alphaPL := fitGamma(float64(kmin), n, sumLog)
	zeta := hurwitzZeta(alphaPL, float64(kmin))
	lpPL := func(k int) float64 { return -alphaPL*math.Log(float64(k)) - math.Log(zeta) }
	// Exponential: λ = ln(1 + 1/(⟨k⟩ − k_min)), the geometric MLE.
	lambda := math.Log1p(1 / (sumK/n - float64(kmin)))
	lpExp := func(k int) float64 { return math.Log(-math.Expm1(-lambda)) - lambda*float64(k-kmin) }
	// Log-normal: numerical MLE from the moments of ln k.
	mu, sigma := lognormalFit(hist, kmin, sumLog/n)
	lpLN := func(k int) float64 { return lognormalLogP(k, kmin, mu, sigma) }
	type model struct {
		m  TailModel
		lp func(int) float64
	}
	models := []model{
		{TailModel{Name: ModelPowerLaw, Alpha: alphaPL}, lpPL},
		{TailModel{Name: ModelExponential, Lambda: lambda}, lpExp},
		{TailModel{Name: ModelLogNormal, Mu: mu, Sigma: sigma}, lpLN},
	}
	for i := range models {
		var ll float64
		for k := kmin; k < len(hist); k++ {
			if hist[k] > 0 {
				ll += float64(hist[k]) * models[i].lp(k)
			}
		}
		models[i].m.LogLik = ll
		tm.Models = append(tm.Models, models[i].m)
	}
	wins := make([]int, len(models))
	worst := make([]float64, len(models))
	for a := 0; a < len(models); a++ {
		for b := a + 1; b < len(models); b++ {
			var r, s2 float64
			for k := kmin; k < len(hist); k++ {
				if hist[k] > 0 {
					l := models[a].lp(k) - models[b].lp(k)
					r += float64(hist[k]) * l
				}
			}
			mean := r / n
			for k := kmin; k < len(hist); k++ {
				if hist[k] > 0 {
					l := models[a].lp(k) - models[b].lp(k) - mean
					s2 += float64(hist[k]) * l * l
				}
			}
			sd := math.Sqrt(s2 / n)
			p := 1.0
			switch {
			case models[a].m.Name == ModelPowerLaw && models[b].m.Name == ModelLogNormal && lognormalIsPowerLaw(mu, sigma, kmin, len(hist)-1):
				// The log-normal has run to its power-law limit (μ → −∞):
				// the models are nested there, and Vuong's statistic, whose
				// σ shrinks with the difference, says nothing. Wilks' test
				// instead: 2|R| against χ² with one degree of freedom
				// (Clauset et al. 2009, section 5 on nested models).
				p = math.Erfc(math.Sqrt(math.Abs(r)))
			case sd > 0:
				p = math.Erfc(math.Abs(r) / (sd * math.Sqrt(2*n)))
			case r != 0:
				p = 0
			}
			c := TailComparison{A: models[a].m.Name, B: models[b].m.Name, R: r, P: p}
			win := a
			if r < 0 {
				win = b
			}
			if r != 0 {
				wins[win]++
				worst[win] = max(worst[win], p)
			}
			if p < alpha && r != 0 {
				c.Favours = models[win].m.Name
			}
			tm.Comparisons = append(tm.Comparisons, c)
		}
	}
	best := -1
	for i := range models {
		if wins[i] == len(models)-1 {
			best = i
		}
	}
	if best < 0 { // intransitive: the highest likelihood
		best = 0
		for i := range models {
			if models[i].m.LogLik > models[best].m.LogLik {
				best = i
			}
		}
		for a := range tm.Comparisons {
			c := tm.Comparisons[a]
			if c.A == models[best].m.Name || c.B == models[best].m.Name {
				worst[best] = max(worst[best], c.P)
			}
		}
	}
	tm.Winner, tm.P = models[best].m.Name, worst[best]
	tm.Decided = tm.P < alpha
	if tm.Mode >= 2*kmin && tm.Mode-kmin >= 3 {
		tm.Warnings = append(tm.Warnings, fmt.Sprintf("the degree distribution peaks at k = %d, well above k_min = %d: P(k) still rises at the start of the tail, which no power law can follow; read the exponent with care", tm.Mode, kmin))
	}
	return tm, nil
}

// lognormalIsPowerLaw reports whether the log-normal (μ, σ) is a power
// law over the tail [kmin, kmax] to within the data's reach: its log-log
// slope −1 − (ln k − μ)/σ² changes by less than 0.1 across the tail.
func lognormalIsPowerLaw(mu, sigma float64, kmin, kmax int) bool {
	return (math.Log(float64(kmax))-math.Log(float64(kmin)))/(sigma*sigma) < 0.1
}

// lognormalLogP is ln P(k) of the log-normal discretised to the integers
// k ≥ kmin: ln[(F(k+1) − F(k)) / (1 − F(kmin))], computed with the upper
// tail Q = 1 − F so that far tails keep their precision.
func lognormalLogP(k, kmin int, mu, sigma float64) float64 {
	lq := func(v int) float64 { return logHalfErfc((math.Log(float64(v)) - mu) / (sigma * math.Sqrt2)) }
	a, b := lq(k), lq(k+1)
	if !(b < a) {
		return math.Inf(-1)
	}
	return a + math.Log1p(-math.Exp(b-a)) - lq(kmin)
}

// logHalfErfc returns ln(erfc(z)/2) without underflow: math.Erfc up to
// z = 26 (erfc(26) ≈ 10^−296 is still a normal float64), the asymptotic
// series erfc(z) ≈ e^{−z²}/(z√π)·(1 − 1/(2z²) + 3/(4z⁴) − 15/(8z⁶)) beyond,
// whose next term is below 10^−10 relative there (Abramowitz & Stegun
// 7.1.23).
func logHalfErfc(z float64) float64 {
	if z < 26 {
		return math.Log(0.5 * math.Erfc(z))
	}
	z2 := z * z
	return -z2 - math.Log(z*math.Sqrt(math.Pi)) + math.Log(1-1/(2*z2)+3/(4*z2*z2)-15/(8*z2*z2*z2)) - math.Ln2
}

// lognormalFit maximises the discretised log-normal likelihood of the
// tail by Nelder–Mead from the moments of ln k, with σ parametrised as e^s
// so it stays positive.
func lognormalFit(hist []int64, kmin int, meanLog float64) (mu, sigma float64) {
	var n, s2 float64
	for k := kmin; k < len(hist); k++ {
		if c := float64(hist[k]); c > 0 {
			d := math.Log(float64(k)) - meanLog
			s2 += c * d * d
			n += c
		}
	}
	s0 := math.Max(math.Sqrt(s2/n), 0.05)
	nll := func(p []float64) float64 {
		m, s := p[0], math.Exp(p[1])
		var ll float64
		for k := kmin; k < len(hist); k++ {
			if hist[k] > 0 {
				ll += float64(hist[k]) * lognormalLogP(k, kmin, m, s)
			}
		}
		if math.IsInf(ll, 0) || math.IsNaN(ll) {
			return math.MaxFloat64
		}
		return -ll
	}
	p := nelderMead2(nll, [2]float64{meanLog, math.Log(s0)}, [2]float64{0.1, 0.1}, 400)
	return p[0], math.Exp(p[1])
}

// nelderMead2 minimises f over the plane by the Nelder–Mead simplex
// method (Nelder & Mead, Comput. J. 7 (1965) 308) with the standard
// coefficients (reflection 1, expansion 2, contraction ½, shrink ½), from
// x0 with initial steps step, for at most iters iterations or until the
// simplex's values agree to 1e-12 relative.
func nelderMead2(f func([]float64) float64, x0, step [2]float64, iters int) [2]float64 {
	type vertex struct {
		x [2]float64
		v float64
	}
	eval := func(x [2]float64) vertex { return vertex{x, f(x[:])} }
	s := [3]vertex{eval(x0), eval([2]float64{x0[0] + step[0], x0[1]}), eval([2]float64{x0[0], x0[1] + step[1]})}
	along := func(a, b [2]float64, t float64) [2]float64 {
		return [2]float64{a[0] + t*(b[0]-a[0]), a[1] + t*(b[1]-a[1])}
	}
	for it := 0; it < iters; it++ {
		// Order: s[0] best, s[2] worst (insertion sort, stable).
		for i := 1; i < 3; i++ {
			for j := i; j > 0 && s[j].v < s[j-1].v; j-- {
				s[j], s[j-1] = s[j-1], s[j]
			}
		}
		if math.Abs(s[2].v-s[0].v) <= 1e-12*(math.Abs(s[0].v)+1e-300) {
			break
		}
		c := [2]float64{(s[0].x[0] + s[1].x[0]) / 2, (s[0].x[1] + s[1].x[1]) / 2}
		r := eval(along(c, s[2].x, -1))
		switch {
		case r.v < s[0].v:
			if e := eval(along(c, s[2].x, -2)); e.v < r.v {
				s[2] = e
			} else {
				s[2] = r
			}
		case r.v < s[1].v:
			s[2] = r
		default:
			if k := eval(along(c, s[2].x, 0.5)); k.v < s[2].v {
				s[2] = k
			} else {
				for i := 1; i < 3; i++ {
					s[i] = eval(along(s[0].x, s[i].x, 0.5))
				}
			}
		}
	}
	best := s[0]
	for _, v := range s[1:] {
		if v.v < best.v {
			best = v
		}
	}
	return best.x
}
