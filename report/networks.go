package report

import (
	"fmt"
	"math"
	"strings"
	"sync"

	"github.com/tracesift/tracesift/networks"
	opn "github.com/tracesift/tracesift/networks/ordinal"
	"github.com/tracesift/tracesift/networks/recurrence"
	"github.com/tracesift/tracesift/networks/visibility"
)

// networkSamples is the stretch (the middle of a longer trace) the four
// networks of the comparison table are built on: a recurrence network of
// 4096 vectors at a 5% rate has 4·10^5 edges and takes about 0.3 s of CPU.
const networkSamples = 4096

// NetworksPanel compares the four network constructions on one stretch of
// the trace with the metrics they share, plus each one's own.
type NetworksPanel struct {
	Offset, Samples int
	// Kinds are "hvg", "nvg", "rn", "opn"; Metrics[i] belongs to Kinds[i]
	// (nil when that network failed; Errors says why).
	Kinds   []string
	Metrics []*networks.Metrics
	Errors  []string
	RN      *recurrence.Network
	RNM     recurrence.Metrics
	OPN     *opn.Network
	OPNM    opn.Metrics
}

// buildNetworks builds and measures the HVG, NVG, recurrence network
// (automatic embedding, 5% rate) and ordinal partition network (order 5) of
// the middle networkSamples samples of x, in parallel.
func buildNetworks(x []float64, seed uint64) *NetworksPanel {
	seg, off := middle(x, networkSamples)
	p := &NetworksPanel{Offset: off, Samples: len(seg), Kinds: []string{"hvg", "nvg", "rn", "opn"}}
	p.Metrics = make([]*networks.Metrics, 4)
	p.Errors = make([]string, 4)
	mo := networks.MeasureOptions{Sources: 32, Seed: seed}
	state := mo
	state.NoIrreversibility = true
	var wg sync.WaitGroup
	measure := func(i int, g *networks.Graph, err error, opts networks.MeasureOptions) {
		if err != nil {
			p.Errors[i] = err.Error()
			return
		}
		m, err := networks.Measure(g, opts)
		if err != nil {
			p.Errors[i] = err.Error()
			return
		}
		p.Metrics[i] = &m
	}
	wg.Go(func() { g, err := visibility.Horizontal(seg, visibility.Options{}); measure(0, g, err, mo) })
	wg.Go(func() { g, err := visibility.Natural(seg, visibility.Options{}); measure(1, g, err, mo) })
	wg.Go(func() {
		nw, err := recurrence.Build(seg, recurrence.Options{})
		if err != nil {
			p.Errors[2] = err.Error()
			return
		}
		measure(2, nw.Graph, nil, state)
		if p.Metrics[2] != nil {
			p.RN, p.RNM = nw, nw.Derive(*p.Metrics[2])
		}
	})
	wg.Go(func() {
		nw, err := opn.Build(seg, opn.Options{})
		if err != nil {
			p.Errors[3] = err.Error()
			return
		}
		measure(3, nw.Graph, nil, state)
		p.OPN, p.OPNM = nw, nw.Directed()
	})
	wg.Wait()
	return p
}

// networkTable is the comparison table as the template shows it.
type networkTable struct {
	Note string
	Head []string
	Rows []networkRow
}

type networkRow struct {
	Label string
	Cells []string
}

// table renders the panel: one column per network, one row per metric.
func (p *NetworksPanel) table() *networkTable {
	t := &networkTable{Head: []string{"HVG", "NVG", "recurrence (RN)", "ordinal partition (OPN)"}}
	row := func(label string, f func(m *networks.Metrics) string) {
		r := networkRow{Label: label}
		for _, m := range p.Metrics {
			if m == nil {
				r.Cells = append(r.Cells, "—")
				continue
			}
			r.Cells = append(r.Cells, f(m))
		}
		t.Rows = append(t.Rows, r)
	}
	num := func(v float64) string {
		if math.IsNaN(v) {
			return "—"
		}
		return h3(v)
	}
	row("nodes / edges", func(m *networks.Metrics) string { return fmt.Sprintf("%d / %d", m.Nodes, m.Edges) })
	row("mean degree ⟨k⟩", func(m *networks.Metrics) string { return num(m.MeanDegree) })
	row("mean clustering", func(m *networks.Metrics) string { return num(m.ClusteringMean) })
	row("transitivity", func(m *networks.Metrics) string { return num(m.Clustering.Transitivity) })
	row("assortativity", func(m *networks.Metrics) string { return num(m.Assortativity) })
	row("modularity (Louvain)", func(m *networks.Metrics) string { return num(m.Modularity) })
	row("mean shortest path", func(m *networks.Metrics) string { return num(m.AvgPathLength) })
	row("degree tail model (p)", func(m *networks.Metrics) string {
		if m.TailModels == nil {
			return "—"
		}
		return fmt.Sprintf("%s (%s)", strings.ReplaceAll(m.TailModels.Winner, "_", "-"), h3(m.TailModels.P))
	})
	var own []string
	if p.RN != nil {
		own = append(own, fmt.Sprintf("recurrence network: %d delay vectors (m = %d, τ = %d), ε = %s s.d. for a 5%% recurrence rate, transitivity dimension %s (1 for a periodic orbit; Donner et al. 2011)",
			p.RN.Graph.Len(), p.RN.Dim, p.RN.Delay, h3(p.RN.Epsilon), h3(p.RNM.TransitivityDim)))
	}
	if p.OPN != nil {
		d := p.OPNM
		own = append(own, fmt.Sprintf("ordinal partition network (order 5): %d of %d patterns, %d of %d admissible transitions never seen, self-loop share %s, transition entropy %s of its maximum",
			d.Patterns, d.Possible, d.Forbidden, d.Admissible, h3(d.SelfLoopFraction), h3(d.TransitionEntropyNorm)))
	}
	for i, e := range p.Errors {
		if e != "" {
			own = append(own, fmt.Sprintf("%s not built: %s", t.Head[i], e))
		}
	}
	where := fmt.Sprintf("all %d samples", p.Samples)
	if p.Offset > 0 || p.Samples < networkSamples {
		where = fmt.Sprintf("the middle %d samples (from sample %d)", p.Samples, p.Offset)
	}
	t.Note = fmt.Sprintf("The same stretch, %s, read as four networks: visibility graphs (the shape of the record), a recurrence network (the geometry of the reconstructed attractor; Marwan et al. 2009) and an ordinal partition network (the order of the dynamics; McCullough et al. 2015), measured with one metric set. %s.", where, strings.Join(own, "; "))
	return t
}
