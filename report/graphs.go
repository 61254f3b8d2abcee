package report

import (
	"fmt"
	"math"

	"github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

// GraphPanel holds what the report draws of one visibility graph: the
// degree distribution with its tail fit (exponential for the HVG, power
// law for the NVG) and the local clustering.
type GraphPanel struct {
	Kind string // "hvg" or "nvg"
	// Offset and Nodes locate the stretch of the trace the graph was built
	// on (the middle GraphLength samples of a longer trace).
	Offset, Nodes int
	Edges         int64
	Degrees       networks.DegreeStats
	Clustering    networks.ClusteringStats
	// Tail is the exponential-tail fit (HVG) and PowerLaw the power-law fit
	// (NVG); nil when the fit failed (FitError says why) or does not apply.
	Tail     *networks.TailFit
	PowerLaw *networks.PowerLawFit
	FitError string
}

// buildGraphs builds both visibility graphs of the middle (at most) n
// samples of x and measures them. Failures come back as messages.
func buildGraphs(x []float64, n int) (hvg, nvg *GraphPanel, errs []string) {
	seg, off := middle(x, n)
	kinds := []networks.Kind{networks.KindHVG, networks.KindNVG}
	out := make([]*GraphPanel, len(kinds))
	msgs := make([]string, len(kinds))
	done := make(chan struct{}, len(kinds))
	for i, k := range kinds {
		go func() {
			defer func() { done <- struct{}{} }()
			p, err := measureGraph(seg, off, k)
			if err != nil {
				msgs[i] = fmt.Sprintf("%s: %v", k, err)
				return
			}
			out[i] = p
		}()
	}
	for range kinds {
		<-done
	}
	for _, m := range msgs {
		if m != "" {
			errs = append(errs, m)
		}
	}
	return out[0], out[1], errs
}

func measureGraph(seg []float64, off int, k networks.Kind) (*GraphPanel, error) {
	g, err := visibility.Build(seg, k, visibility.Options{})
	if err != nil {
		return nil, err
	}
	p := &GraphPanel{Kind: k.String(), Offset: off, Nodes: g.Len(), Edges: g.Edges(), Degrees: networks.Degrees(g)}
	_, p.Clustering = networks.Clustering(g)
	switch k {
	case networks.KindHVG:
		t, err := networks.ExponentialTail(g, networks.TailOptions{})
		if err != nil {
			p.FitError = err.Error()
		} else {
			p.Tail = &t
		}
	case networks.KindNVG:
		f, err := networks.PowerLaw(g, networks.PowerLawOptions{})
		if err != nil {
			p.FitError = err.Error()
		} else {
			p.PowerLaw = &f
		}
	}
	return p, nil
}

// iidHVG returns P(k) = (1/3)(2/3)^{k−2} for k ≥ 2, the degree distribution
// of the HVG of any i.i.d. series with a continuous distribution (Luque,
// Lacasa, Ballesteros & Luque, Phys. Rev. E 80 (2009) 046103).
func iidHVG(k int) float64 {
	if k < 2 {
		return 0
	}
	return math.Pow(2.0/3.0, float64(k-2)) / 3
}

// exponentialTail returns the fitted exponential tail of a degree
// distribution at k = kmin…kmax: P(k) = share·(1 − q)·q^{k−kmin}, q = e^{−λ},
// the geometric law of the tail (visibility.TailFit) scaled to the share of
// the nodes it holds.
func exponentialTail(kmin, kmax int, share, lambda float64) (ks, ps []float64) {
	q := math.Exp(-lambda)
	for k := kmin; k <= kmax; k++ {
		ks = append(ks, float64(k))
		ps = append(ps, share*(1-q)*math.Pow(q, float64(k-kmin)))
	}
	return ks, ps
}

// powerLawTail returns the fitted discrete power law of a degree
// distribution at 61 points spaced evenly in log k over [kmin, kmax]:
// P(k) = share·k^{−γ}/ζ(γ, kmin) (visibility.PowerLawFit) scaled to the
// share of the nodes its tail holds.
func powerLawTail(kmin, kmax int, share, gamma float64) (ks, ps []float64) {
	z := hurwitzZeta(gamma, float64(kmin))
	for i := 0; i <= 60; i++ {
		k := float64(kmin) * math.Pow(float64(kmax)/float64(kmin), float64(i)/60)
		ks = append(ks, k)
		ps = append(ps, share*math.Pow(k, -gamma)/z)
	}
	return ks, ps
}

// hurwitzZeta returns ζ(s, q) = Σ_{k≥0} (k + q)^{−s} for s > 1, q > 0:
// the first 64 terms summed, the rest by the Euler–Maclaurin formula
// (integral, half the first omitted term and two Bernoulli corrections;
// Abramowitz & Stegun 23.1.30 (memory)), accurate to ~1e-12 relative for
// the exponents a power-law fit returns.
func hurwitzZeta(s, q float64) float64 {
	const terms = 64
	var sum float64
	for k := 0; k < terms; k++ {
		sum += math.Pow(float64(k)+q, -s)
	}
	a := float64(terms) + q
	sum += math.Pow(a, 1-s) / (s - 1)
	sum += 0.5 * math.Pow(a, -s)
	sum += s / 12 * math.Pow(a, -s-1)
	sum -= s * (s + 1) * (s + 2) / 720 * math.Pow(a, -s-3)
	return sum
}
