package features

import (
	"fmt"

	"github.com/tracesift/tracesift/networks"
	opn "github.com/tracesift/tracesift/networks/ordinal"
	"github.com/tracesift/tracesift/networks/recurrence"
)

// The extended families: features reported by 'features --all', the
// report, surrogate tests and the campaign survey, but outside the feature
// schema the classifier reads (Catalogue, Names, SchemaHash leave them
// out), so adding them changed neither the vector of the default model nor
// its schema hash. See DEVELOPERS.md, "Extended families".
var extendedFamilies = []family{recurrenceNetFamily, ordinalNetFamily}

// rnMaxSamples is the longest stretch of a trace the recurrence-network
// features are measured on: its middle rnMaxSamples samples. A recurrence
// network at a 5% rate has 0.025·N² edges: 4·10^5 at 4096 vectors, built
// and measured in about 0.3 s of CPU ('graph --kind rn' on a demo trace,
// BENCHMARKS.md), while N = 10^5 would pass the edge budget.
const rnMaxSamples = 4096

var recurrenceNetFamily = family{
	name: FamilyRecurrenceNet,
	entries: []Entry{
		{"rn_tdim", FamilyRecurrenceNet, "transitivity dimension ln T / ln(3/4) of the recurrence network (automatic embedding, maximum norm, 5% recurrence rate): the dimension of the reconstructed attractor at the scale ε (1 for a periodic orbit; about the number of active coordinates for noise)", "Donner et al., Eur. Phys. J. B 84 (2011) 653; Marwan et al., Phys. Lett. A 373 (2009) 4246"},
		{"rn_cdim", FamilyRecurrenceNet, "clustering dimension ln C / ln(3/4) of the recurrence network, from its mean local clustering C", "Donner et al. (2011)"},
		{"rn_trans", FamilyRecurrenceNet, "transitivity (global clustering coefficient) of the recurrence network at a 5% rate", "Donner et al., New J. Phys. 12 (2010) 033025"},
		{"rn_path_mean", FamilyRecurrenceNet, "mean shortest-path length of the recurrence network at a 5% rate, in hops (32 sampled sources): long for low-dimensional attractors, short for noise", "Donner et al. (2010)"},
		{"rn_deg_assort", FamilyRecurrenceNet, "degree assortativity of the recurrence network (high: dense and sparse regions of the attractor keep apart)", "Newman, Phys. Rev. Lett. 89 (2002) 208701; Donner et al. (2010)"},
	},
	compute: computeRecurrenceNet,
}

var ordinalNetFamily = family{
	name: FamilyOrdinalNet,
	entries: []Entry{
		{"opn_forb_frac", FamilyOrdinalNet, "share of the admissible transitions of the order-5 ordinal partition network (delay 1) never seen: forbidden transitions (near 0 for long noise)", "McCullough et al., Chaos 25 (2015) 053101; Amigó et al., EPL 79 (2007) 50001"},
		{"opn_self", FamilyOrdinalNet, "share of steps whose order-5 pattern repeats (self-loops of the ordinal partition network)", "McCullough et al. (2015)"},
		{"opn_tent", FamilyOrdinalNet, "global transition entropy of the order-5 ordinal partition network over ln 5: the entropy of the next pattern given the current one (1 would be every admissible successor equally likely; i.i.d. noise gives 0.97)", "McCullough et al., Phil. Trans. R. Soc. A 375 (2017) 20160292 (memory)"},
		{"opn_outdeg_mean", FamilyOrdinalNet, "mean out-degree (distinct successors) of the order-5 ordinal partition network, at most 5", "McCullough et al. (2015)"},
		{"opn_clust_mean", FamilyOrdinalNet, "mean local clustering of the undirected order-5 ordinal partition network", "McCullough et al. (2015); Watts & Strogatz, Nature 393 (1998) 440"},
		{"opn_comm_q", FamilyOrdinalNet, "modularity of the Louvain partition of the undirected order-5 ordinal partition network", "Blondel et al., J. Stat. Mech. (2008) P10008"},
	},
	compute: computeOrdinalNet,
}

func computeRecurrenceNet(z []float64, o Options, s *sink) {
	names := []string{"rn_tdim", "rn_cdim", "rn_trans", "rn_path_mean", "rn_deg_assort"}
	if len(z) > rnMaxSamples {
		from := (len(z) - rnMaxSamples) / 2
		z = z[from : from+rnMaxSamples]
	}
	s.measure(func() error {
		nw, err := recurrence.Build(z, recurrence.Options{MaxEdges: o.MaxEdges})
		if err != nil {
			return fmt.Errorf("recurrence network: %w", err)
		}
		m, r, err := nw.Measure(networks.MeasureOptions{
			NoCommunities: true, NoPaths: !s.wants("rn_path_mean"), Sources: graphSources, Seed: o.Seed,
		})
		if err != nil {
			return err
		}
		setOrMiss(s, "rn_tdim", r.TransitivityDim, m.Warnings)
		setOrMiss(s, "rn_cdim", r.ClusteringDim, m.Warnings)
		setOrMiss(s, "rn_trans", r.Transitivity, m.Warnings)
		setOrMiss(s, "rn_path_mean", r.AvgPathLength, m.Warnings)
		setOrMiss(s, "rn_deg_assort", m.Assortativity, m.Warnings)
		return nil
	}, names...)
}

func computeOrdinalNet(z []float64, o Options, s *sink) {
	s.measure(func() error {
		nw, err := opn.Build(z, opn.Options{Order: 5})
		if err != nil {
			return fmt.Errorf("ordinal network: %w", err)
		}
		d := nw.Directed()
		s.set("opn_forb_frac", d.ForbiddenFraction)
		s.set("opn_self", d.SelfLoopFraction)
		s.set("opn_tent", d.TransitionEntropyNorm)
		s.set("opn_outdeg_mean", d.OutDegreeMean)
		if s.wants("opn_clust_mean", "opn_comm_q") {
			m, err := networks.Measure(nw.Graph, networks.MeasureOptions{NoPaths: true, NoIrreversibility: true, NoCommunities: !s.wants("opn_comm_q"), Seed: o.Seed})
			if err != nil {
				return err
			}
			setOrMiss(s, "opn_clust_mean", m.ClusteringMean, m.Warnings)
			setOrMiss(s, "opn_comm_q", m.Modularity, m.Warnings)
		}
		return nil
	}, "opn_forb_frac", "opn_self", "opn_tent", "opn_outdeg_mean", "opn_clust_mean", "opn_comm_q")
}

// IsExtended reports whether a feature belongs to an extended family:
// computed on request (Options.Extended, or named in Options.Only) and
// outside the classifier's schema.
func IsExtended(name string) bool {
	for _, f := range extendedFamilies {
		for _, e := range f.entries {
			if e.Name == name {
				return true
			}
		}
	}
	return false
}

// Extended returns the entries of the extended families in order.
func Extended() []Entry {
	var out []Entry
	for _, f := range extendedFamilies {
		out = append(out, f.entries...)
	}
	return out
}

// AllNames returns the schema's names followed by the extended ones: the
// vector Extract returns with Options.Extended.
func AllNames() []string {
	names := Names()
	for _, e := range Extended() {
		names = append(names, e.Name)
	}
	return names
}

// activeFamilies returns the families Extract computes: the schema's, and
// the extended ones when asked for or when Only names one of their
// features.
func activeFamilies(o Options, only map[string]bool) []family {
	ext := o.Extended
	for n := range only {
		ext = ext || IsExtended(n)
	}
	if !ext {
		return families
	}
	return append(append([]family(nil), families...), extendedFamilies...)
}
