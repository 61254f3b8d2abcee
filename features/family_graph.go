package features

import (
	"fmt"
	"math"

	"github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

var graphFamily = family{
	name: FamilyGraph,
	entries: []Entry{
		{"hv_deg_mean", FamilyGraph, "mean degree of the horizontal visibility graph (→ 4 for any i.i.d. series without ties — Extract dithers quantised traces first; 4(1 − 1/2T) for period T)", "Luque et al., Phys. Rev. E 80 (2009) 046103"},
		{"hv_tail_exprate", FamilyGraph, "exponential tail rate λ of the HVG degree distribution P(k) ~ e^{−λk} (ln 3/2 for i.i.d.; below for chaos, above for correlated noise)", "Luque et al. (2009); Lacasa & Toral, Phys. Rev. E 82 (2010) 036120"},
		{"hv_clust_mean", FamilyGraph, "mean local clustering coefficient of the HVG (≈ 0.648 for i.i.d.)", "Luque et al. (2009)"},
		{"hv_deg_ent", FamilyGraph, "Shannon entropy of the HVG degree distribution, nats", "Shannon (1948); Luque et al. (2009)"},
		{"hv_dir_kld", FamilyGraph, "Kullback–Leibler divergence between out- and in-degree distributions of the directed HVG (≈ 0 for reversible linear Gaussian series)", "Lacasa et al., Eur. Phys. J. B 85 (2012) 217"},
		{"nv_deg_mean", FamilyGraph, "mean degree of the natural visibility graph", "Lacasa et al., PNAS 105 (2008) 4972"},
		{"nv_tail_powexp", FamilyGraph, "power-law exponent γ of the NVG degree distribution by discrete maximum likelihood, k_min by the KS distance", "Lacasa et al., EPL 86 (2009) 30001; Clauset, Shalizi & Newman, SIAM Review 51 (2009) 661"},
		{"nv_clust_mean", FamilyGraph, "mean local clustering coefficient of the NVG", "Lacasa et al. (2008); Watts & Strogatz, Nature 393 (1998) 440"},
		{"nv_comm_q", FamilyGraph, "modularity of the Louvain partition of the NVG", "Newman & Girvan, Phys. Rev. E 69 (2004) 026113; Blondel et al., J. Stat. Mech. (2008) P10008"},
		{"nv_deg_assort", FamilyGraph, "degree assortativity of the NVG", "Newman, Phys. Rev. Lett. 89 (2002) 208701"},
		{"nv_deg_ent", FamilyGraph, "Shannon entropy of the NVG degree distribution, nats", "Shannon (1948)"},
		{"nv_path_lnn", FamilyGraph, "average shortest-path length of the NVG divided by ln n (estimated from 32 sampled sources above 2000 nodes)", "Watts & Strogatz (1998); small-world scaling, common practice"},
		{"nv_ball_dim", FamilyGraph, "local graph dimension of the NVG: growth exponent of the number of nodes within graph distance r", "Shanker, Physica D 227 (2007) 153 (memory); method documented in package networks"},
	},
	compute: computeGraph,
}

// graphSources is the number of BFS sources sampled for path lengths and
// the local dimension of graphs above the exact-BFS size.
const graphSources = 32

func computeGraph(z []float64, o Options, s *sink) {
	hvgNames := []string{"hv_deg_mean", "hv_tail_exprate", "hv_clust_mean", "hv_deg_ent", "hv_dir_kld"}
	nvgNames := []string{"nv_deg_mean", "nv_tail_powexp", "nv_clust_mean", "nv_comm_q", "nv_deg_assort", "nv_deg_ent", "nv_path_lnn", "nv_ball_dim"}
	if s.wants(hvgNames...) {
		if g, err := visibility.Horizontal(z, visibility.Options{MaxEdges: o.MaxEdges}); err != nil {
			s.missErr(fmt.Errorf("HVG: %w", err), hvgNames...)
		} else {
			m, err := networks.Measure(g, networks.MeasureOptions{NoPaths: true, NoCommunities: true, Seed: o.Seed})
			if err != nil {
				s.missErr(fmt.Errorf("HVG: %w", err), hvgNames...)
			} else {
				s.set("hv_deg_mean", m.MeanDegree)
				setOrMiss(s, "hv_tail_exprate", m.Lambda, m.Warnings)
				s.set("hv_clust_mean", m.ClusteringMean)
				s.set("hv_deg_ent", m.Degree.Entropy)
				setOrMiss(s, "hv_dir_kld", m.IrreversibilityKLD, m.Warnings)
			}
		}
	}
	if s.wants(nvgNames...) {
		g, err := visibility.Natural(z, visibility.Options{MaxEdges: o.MaxEdges})
		if err != nil {
			s.missErr(fmt.Errorf("NVG: %w", err), nvgNames...)
			return
		}
		m, err := networks.Measure(g, networks.MeasureOptions{
			NoPaths:       !s.wants("nv_path_lnn", "nv_ball_dim"),
			NoCommunities: !s.wants("nv_comm_q"),
			Sources:       graphSources,
			Seed:          o.Seed,
		})
		if err != nil {
			s.missErr(fmt.Errorf("NVG: %w", err), nvgNames...)
			return
		}
		s.set("nv_deg_mean", m.MeanDegree)
		setOrMiss(s, "nv_tail_powexp", m.Gamma, m.Warnings)
		s.set("nv_clust_mean", m.ClusteringMean)
		setOrMiss(s, "nv_comm_q", m.Modularity, m.Warnings)
		setOrMiss(s, "nv_deg_assort", m.Assortativity, m.Warnings)
		s.set("nv_deg_ent", m.Degree.Entropy)
		setOrMiss(s, "nv_path_lnn", m.AvgPathLength/math.Log(float64(len(z))), m.Warnings)
		setOrMiss(s, "nv_ball_dim", m.LocalDimension, m.Warnings)
	}
}

// setOrMiss records v, or marks the feature missing with the graph
// package's warnings as the reason when v is undefined.
func setOrMiss(s *sink, name string, v float64, warnings []string) {
	if !math.IsNaN(v) && !math.IsInf(v, 0) {
		s.set(name, v)
		return
	}
	reason := "undefined for this graph"
	if len(warnings) > 0 {
		reason = fmt.Sprint(warnings)
	}
	s.miss(reason, name)
}
