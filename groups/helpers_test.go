package groups

import (
	"math"
	"math/rand/v2"
	"sort"
)

// medianPairwise is the reference for HodgesLehmann: it stores and sorts
// all n·m differences b_j − a_i and takes their median.
func medianPairwise(a, b []float64) float64 {
	d := make([]float64, 0, len(a)*len(b))
	for _, x := range a {
		for _, y := range b {
			d = append(d, y-x)
		}
	}
	sort.Float64s(d)
	return Quantile(d, 0.5)
}

// cliffBrute is the reference for CliffDelta from its definition,
// (#{b > a} − #{b < a})/(n·m) over all pairs (Cliff 1993).
func cliffBrute(a, b []float64) float64 {
	s := 0
	for _, x := range a {
		for _, y := range b {
			switch {
			case y > x:
				s++
			case y < x:
				s--
			}
		}
	}
	return float64(s) / float64(len(a)*len(b))
}

func normals(rng *rand.Rand, n int, mu, sd float64) []float64 {
	x := make([]float64, n)
	for i := range x {
		x[i] = mu + sd*rng.NormFloat64()
	}
	return x
}

// demoFeatures are the synthetic features of demoSamples.
var demoFeatures = []string{"sc_fluct_a1", "op_ent_d4", "hv_tail_exprate", "nl_sent_m2", "nl_div_rate", "sc_psd_beta"}

// demoSamples makes a synthetic two-group data set: nPerLevel traces per
// group at each gate bias in levels. In "stressed", sc_fluct_a1 and
// hv_tail_exprate are shifted by shift standard deviations, hv_tail_exprate also
// rises with the bias in both groups; the other features have the same
// distribution in both groups. Every trace carries an "hvg_degree"
// distribution (a geometric degree sequence, P(k) ∝ (2/3)^k for fresh,
// slightly heavier for stressed).
func demoSamples(seed uint64, nPerLevel int, levels []float64, shift float64) []Sample {
	rng := rand.New(rand.NewPCG(seed, 77))
	var out []Sample
	for _, g := range []string{"fresh", "stressed"} {
		s := 0.0
		if g == "stressed" {
			s = shift
		}
		for _, v := range levels {
			for k := 0; k < nPerLevel; k++ {
				vals := []float64{
					0.9 + 0.1*s + 0.1*rng.NormFloat64(),           // sc_fluct_a1
					0.95 + 0.02*rng.NormFloat64(),                 // op_ent_d4
					1.2 + 0.05*s + 0.1*v + 0.05*rng.NormFloat64(), // hv_tail_exprate
					math.Exp(0.3 * rng.NormFloat64()),             // nl_sent_m2 (lognormal)
					0.01 * rng.NormFloat64(),                      // nl_div_rate
					1 + 0.2*rng.ExpFloat64(),                      // sc_psd_beta (skewed)
				}
				smp := Sample{File: g + "_" + ftoa(v) + "_" + itoa(k) + ".csv", Group: g, Param: v, Values: vals}
				q := 1.0 / 3
				if g == "stressed" {
					q = 0.3
				}
				deg := make([]float64, 400)
				for i := range deg {
					kk := 2.0
					for rng.Float64() > q {
						kk++
					}
					deg[i] = kk
				}
				smp.AddDistribution("hvg_degree", deg)
				out = append(out, smp)
			}
		}
	}
	return out
}

func ftoa(v float64) string {
	if v < 0 {
		return "m" + itoa(int(math.Round(-v*10)))
	}
	return itoa(int(math.Round(v * 10)))
}

func itoa(i int) string {
	if i == 0 {
		return "0"
	}
	s := ""
	for i > 0 {
		s = string(rune('0'+i%10)) + s
		i /= 10
	}
	return s
}
