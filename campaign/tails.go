package campaign

import (
	"fmt"
	"math"

	"github.com/tracesift/tracesift/networks"
)

// Tail laws (Tail.Law).
const (
	LawExponential = "exponential" // P(k) ∝ e^{−λk}, the HVG tail
	LawPowerLaw    = "power-law"   // P(k) ∝ k^{−γ}, the NVG tail
)

// Tail is the pooled degree distribution of one group at one level with
// its fitted tail: the HVG degrees with an exponential tail (rate λ,
// networks.ExponentialTailCounts) and the NVG degrees with a discrete
// power law (exponent γ, networks.PowerLawCounts) — the fits the
// hvg/nvg tail features make on one trace, made here on the nodes of all
// the group's traces at the level.
type Tail struct {
	Name   string  `json:"name"` // DistHVGDegree or DistNVGDegree
	Group  string  `json:"group"`
	Level  string  `json:"level"`
	Param  float64 `json:"param"`
	Traces int     `json:"traces"`
	// Nodes is the pooled number of nodes; K and P the degrees that occur
	// and their share of the nodes, P(k).
	Nodes int64     `json:"nodes"`
	K     []int     `json:"k"`
	P     []float64 `json:"p"`
	// Sketched is true when some trace had more than SketchPoints distinct
	// degrees and is pooled from its SketchPoints quantiles (each standing
	// for an equal share of its nodes).
	Sketched bool   `json:"sketched"`
	Law      string `json:"law"`
	// Exponent is λ (exponential) or γ (power law), StdErr its asymptotic
	// standard error, KMin the first degree of the fitted tail, Share the
	// fraction of nodes with k ≥ KMin, KS the Kolmogorov–Smirnov distance
	// of the fit; NaN (KMin 0) with Note saying why when no fit was made.
	Exponent float64 `json:"exponent"`
	StdErr   float64 `json:"std_err"`
	KMin     int     `json:"k_min"`
	Share    float64 `json:"share"`
	KS       float64 `json:"ks"`
	Note     string  `json:"note"`
}

// tails pools the degree distributions of each group at each level and
// fits their tails. A trace's degrees enter as counts: its stored weights
// scaled to its length (exact when every degree was stored, since the
// weights are then the counts), so every node weighs the same.
func (a *analysis) tails() {
	rep := a.rep
	for _, name := range []string{DistHVGDegree, DistNVGDegree} {
		for li, lv := range rep.Levels {
			for _, g := range rep.Groups {
				var hist []int64
				t := Tail{Name: name, Group: g, Level: lv.Level, Param: lv.Param, Law: LawExponential,
					Exponent: math.NaN(), StdErr: math.NaN(), Share: math.NaN(), KS: math.NaN()}
				if name == DistNVGDegree {
					t.Law = LawPowerLaw
				}
				bad := false
				for _, tr := range a.at(g, li) {
					d := tr.dists[[2]string{name, Original}]
					if d == nil || len(d.X) == 0 {
						continue
					}
					total := 0.0
					for _, w := range d.W {
						total += w
					}
					if total != float64(tr.samples) {
						t.Sketched = true
					}
					t.Traces++
					for i, x := range d.X {
						k := int(x)
						if float64(k) != x || k < 0 || k > 1<<24 {
							bad = true
							continue
						}
						for len(hist) <= k {
							hist = append(hist, 0)
						}
						hist[k] += int64(math.Round(d.W[i] * float64(tr.samples) / total))
					}
				}
				if t.Traces == 0 {
					continue
				}
				for k, c := range hist {
					t.Nodes += c
					if c > 0 {
						t.K = append(t.K, k)
					}
				}
				for _, k := range t.K {
					t.P = append(t.P, float64(hist[k])/float64(t.Nodes))
				}
				if bad {
					t.Note = "degrees that are not whole numbers were left out"
				}
				var err error
				if t.Law == LawExponential {
					var f networks.TailFit
					f, err = networks.ExponentialTailCounts(hist, networks.TailOptions{})
					if err == nil {
						t.Exponent, t.StdErr, t.KMin, t.KS = f.Lambda, f.StdErr, f.KMin, f.KS
						t.Share = float64(f.NTail) / float64(t.Nodes)
					}
				} else {
					var f networks.PowerLawFit
					f, err = networks.PowerLawCounts(hist, networks.PowerLawOptions{})
					if err == nil {
						t.Exponent, t.StdErr, t.KMin, t.KS = f.Gamma, f.StdErr, f.KMin, f.KS
						t.Share = float64(f.NTail) / float64(t.Nodes)
					}
				}
				if err != nil {
					t.Note = joinNote(t.Note, fmt.Sprintf("no fit: %v", err))
				}
				rep.Tails = append(rep.Tails, t)
			}
		}
	}
}

func joinNote(a, b string) string {
	if a == "" {
		return b
	}
	return a + "; " + b
}
