package benchmarks

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features/ordinal"
	"github.com/tracesift/tracesift/generators"
	"github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

// DegreeResult holds HVG degree distributions of an i.i.d. series, two
// chaotic maps and a correlated noise, with their exponential tail rates
// against the i.i.d. value λ = ln(3/2) (Luque et al., Phys. Rev. E 80 (2009)
// 046103): chaotic series give λ < ln(3/2), correlated stochastic ones
// λ > ln(3/2) (Lacasa & Toral, Phys. Rev. E 82 (2010) 036120).
type DegreeResult struct {
	Length int `json:"length"`
	// Reference is the i.i.d. law drawn as the reference line.
	Reference string `json:"reference"`
	Source    string `json:"source"`
	// LambdaIID is ln(3/2).
	LambdaIID Float          `json:"lambda_iid"`
	Series    []DegreeSeries `json:"series"`
}

// DegreeSeries is one series' HVG degree distribution and tail fit.
type DegreeSeries struct {
	Label      string             `json:"label"`
	System     string             `json:"system"`
	Params     map[string]float64 `json:"params"`
	Class      string             `json:"class"`
	MeanDegree Float              `json:"mean_degree"`
	// Lambda ± LambdaErr is the geometric maximum-likelihood tail rate
	// (networks.ExponentialTail) over k ≥ KMin.
	Lambda    Float `json:"lambda"`
	LambdaErr Float `json:"lambda_err"`
	KMin      int   `json:"k_min"`
	// Expect is the side of ln(3/2) the literature puts λ on ("equal",
	// "below", "above"); Consistent says whether λ lies there by more than
	// (or, for "equal", within) 4 standard errors.
	Expect     string `json:"expect"`
	Consistent bool   `json:"consistent"`
	// K and P are the degree distribution P(k) for the degrees that occur.
	K []int   `json:"k"`
	P []Float `json:"p"`
}

// PlaneResult places every reference system in the complexity–entropy
// plane (Rosso et al., Phys. Rev. Lett. 99 (2007) 154102), with the plane's
// boundaries (ordinal.BoundaryCurves).
type PlaneResult struct {
	Order  int    `json:"order"`
	Length int    `json:"length"`
	Source string `json:"source"`
	// Lower and Upper are the boundary curves as (entropy, complexity)
	// pairs.
	Lower  [][2]Float   `json:"lower"`
	Upper  [][2]Float   `json:"upper"`
	Points []PlanePoint `json:"points"`
	// Failures lists systems that could not be placed.
	Failures []string `json:"failures,omitempty"`
}

// PlanePoint is one reference system at its default parameters.
type PlanePoint struct {
	System     string `json:"system"`
	Class      string `json:"class"`
	Entropy    Float  `json:"entropy"`
	Complexity Float  `json:"complexity"`
	// MinComplexity and MaxComplexity bound the complexity at this entropy.
	MinComplexity Float `json:"min_complexity"`
	MaxComplexity Float `json:"max_complexity"`
}

func generate(system string, params map[string]float64, n int, seed uint64) ([]float64, error) {
	sys, err := generators.Lookup(system)
	if err != nil {
		return nil, err
	}
	// Some systems have starts that escape (the hyperchaotic Rössler flow's
	// attractor coexists with escape to infinity): such a draw is redrawn
	// from the next derived seed, deterministically, as the reference plan
	// skips it; a system whose every start escapes still fails.
	for try := uint64(0); ; try++ {
		x, err := sys.Generate(n, params, rand.New(rand.NewPCG(seed, seedFor(seed, 3+try))))
		if err == nil || !errors.Is(err, generators.ErrDiverged) || try == maxRedraws {
			return x, err
		}
	}
}

// maxRedraws bounds the redraws of escaping starts in generate.
const maxRedraws = 8

// runDegrees measures the HVG degree distributions.
func runDegrees(o Options) (*DegreeResult, error) {
	ln32 := math.Log(1.5)
	res := &DegreeResult{
		Length:    o.DegreeLength,
		Reference: "P(k) = (1/3)(2/3)^(k−2), k ≥ 2: exponential tail rate λ = ln(3/2) ≈ 0.405",
		Source:    "Luque et al., Phys. Rev. E 80 (2009) 046103; Lacasa & Toral, Phys. Rev. E 82 (2010) 036120",
		LambdaIID: Float(ln32),
	}
	cases := []struct {
		label, system, expect string
	}{
		{"white noise (i.i.d.)", "white", "equal"},
		{"logistic r = 4", "logistic", "below"},
		{"Hénon a = 1.4, b = 0.3", "henon", "below"},
		{"AR(1) φ = 0.9", "ar1", "above"},
	}
	res.Series = make([]DegreeSeries, len(cases))
	errs := make([]error, len(cases))
	forEach(len(cases), o.Workers, "hvg degrees", o.Progress, func(i int) {
		c := cases[i]
		sys, err := generators.Lookup(c.system)
		if err != nil {
			errs[i] = err
			return
		}
		x, err := generate(c.system, nil, o.DegreeLength, seedFor(o.Seed, 4, uint64(i)))
		if err != nil {
			errs[i] = err
			return
		}
		g, err := visibility.Horizontal(x, visibility.Options{})
		if err != nil {
			errs[i] = err
			return
		}
		ds := networks.Degrees(g)
		tf, err := networks.ExponentialTail(g, networks.TailOptions{})
		if err != nil {
			errs[i] = fmt.Errorf("%s: %w", c.system, err)
			return
		}
		d := DegreeSeries{
			Label: c.label, System: c.system, Params: sys.Defaults(), Class: string(sys.DefaultClass),
			MeanDegree: Float(ds.Mean), Lambda: Float(tf.Lambda), LambdaErr: Float(tf.StdErr), KMin: tf.KMin, Expect: c.expect,
		}
		switch c.expect {
		case "equal":
			d.Consistent = math.Abs(tf.Lambda-ln32) <= 4*tf.StdErr
		case "below":
			d.Consistent = tf.Lambda+4*tf.StdErr < ln32
		case "above":
			d.Consistent = tf.Lambda-4*tf.StdErr > ln32
		}
		for _, dc := range ds.Distribution {
			d.K = append(d.K, dc.K)
			d.P = append(d.P, Float(dc.P))
		}
		res.Series[i] = d
	})
	for _, err := range errs {
		if err != nil {
			return nil, fmt.Errorf("HVG degree distributions: %w", err)
		}
	}
	return res, nil
}

// runPlane places every reference system in the complexity–entropy plane.
func runPlane(o Options) (*PlaneResult, error) {
	lower, upper, err := ordinal.BoundaryCurves(o.PlaneOrder, 201)
	if err != nil {
		return nil, err
	}
	res := &PlaneResult{
		Order:  o.PlaneOrder,
		Length: o.PlaneLength,
		Source: "Rosso et al., Phys. Rev. Lett. 99 (2007) 154102; bounds: Martin, Plastino & Rosso, Physica A 369 (2006) 439 (checked: search.r-project.org/CRAN/refmans/statcomp/html/maxd6.html)",
	}
	for _, p := range lower {
		res.Lower = append(res.Lower, [2]Float{Float(p.Entropy), Float(p.Complexity)})
	}
	for _, p := range upper {
		res.Upper = append(res.Upper, [2]Float{Float(p.Entropy), Float(p.Complexity)})
	}
	systems := classifier.ReferenceSystems()
	points := make([]PlanePoint, len(systems))
	errs := make([]error, len(systems))
	forEach(len(systems), o.Workers, "complexity–entropy plane", o.Progress, func(i int) {
		name := systems[i]
		sys, err := generators.Lookup(name)
		if err != nil {
			errs[i] = err
			return
		}
		x, err := generate(name, nil, o.PlaneLength, seedFor(o.Seed, 5, uint64(i)))
		if err != nil {
			errs[i] = err
			return
		}
		r, err := ordinal.Complexity(x, ordinal.Options{Order: o.PlaneOrder})
		if err != nil {
			errs[i] = err
			return
		}
		points[i] = PlanePoint{System: name, Class: string(sys.DefaultClass), Entropy: Float(r.Entropy), Complexity: Float(r.Complexity),
			MinComplexity: Float(r.MinComplexity), MaxComplexity: Float(r.MaxComplexity)}
	})
	for i, err := range errs {
		if err != nil {
			res.Failures = append(res.Failures, fmt.Sprintf("%s: %v", systems[i], err))
			continue
		}
		res.Points = append(res.Points, points[i])
	}
	return res, nil
}
