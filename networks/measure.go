package networks

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"sync"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

// MeasureOptions selects and tunes the metrics of Measure. The zero value
// computes everything with the defaults.
type MeasureOptions struct {
	Tail     TailOptions
	PowerLaw PowerLawOptions
	// ExactMax and Sources: see PathOptions (zero means the defaults).
	ExactMax int
	Sources  int
	// NoPaths skips the BFS-based metrics (path length, diameter, local
	// dimension), the most expensive part on large graphs.
	NoPaths bool
	// NoCommunities skips Louvain (modularity, communities).
	NoCommunities bool
	// ExactDiameter adds the exact diameter by iFUB (ExactDiameter) beside
	// the sampled estimate, on graphs up to ExactDiameterMax nodes.
	ExactDiameter bool
	// NoIrreversibility skips the in/out-degree irreversibility, which
	// reads node order as time order: right for visibility graphs, without
	// meaning for networks whose nodes are states (recurrence, ordinal
	// partition networks).
	NoIrreversibility bool
	// Resolution of the modularity; zero means 1.
	Resolution float64
	// Seed seeds the sampling of BFS sources. Louvain visits nodes in index
	// order (deterministic, and 2–3× faster than a shuffled order on
	// visibility graphs, whose neighbours are close in time). Same graph and
	// seed ⇒ identical Metrics.
	Seed uint64
}

// measureConcurrentNodes is the largest graph on which Measure always runs
// its costliest metrics concurrently: their scratch then stays below
// ~15 MB. On larger graphs they run concurrently when their scratch,
// about concurrentScratch bytes per node (Louvain's first level and the
// 64-source BFS), is at most half the graph's own arrays. A variable only
// so that tests can force either way.
var measureConcurrentNodes = 1 << 18

const concurrentScratch = 48

// graphBytes returns the size of g's arrays.
func graphBytes(g *Graph) int64 {
	return int64(8*len(g.offsets) + 4*len(g.adj) + 4*len(g.lower))
}

// Metrics holds every metric of a visibility graph: the headline numbers at
// the top (NaN, written as JSON null, when undefined or not computed) and the
// diagnostics of each below.
type Metrics struct {
	Kind  string `json:"kind"`
	Nodes int    `json:"nodes"`
	Edges int64  `json:"edges"`

	MeanDegree float64 `json:"mean_degree"`
	// Lambda is the exponential tail rate of P(k) (the HVG statistic;
	// computed for every kind). See ExponentialTail.
	Lambda float64 `json:"lambda"`
	// Gamma is the power-law exponent of P(k) (the NVG statistic; computed
	// for every kind). See PowerLaw.
	Gamma              float64 `json:"gamma"`
	ClusteringMean     float64 `json:"clustering_mean"`
	Assortativity      float64 `json:"assortativity"`
	Modularity         float64 `json:"modularity"`
	Communities        int     `json:"communities"`
	AvgPathLength      float64 `json:"avg_path_length"`
	Diameter           int     `json:"diameter"`
	LocalDimension     float64 `json:"local_dimension"`
	IrreversibilityKLD float64 `json:"irreversibility_kld"`

	Degree          DegreeStats          `json:"degree"`
	Tail            *TailFit             `json:"tail,omitempty"`
	PowerLaw        *PowerLawFit         `json:"power_law,omitempty"`
	Clustering      ClusteringStats      `json:"clustering"`
	Partition       *Partition           `json:"partition,omitempty"`
	Paths           *PathStats           `json:"paths,omitempty"`
	Dimension       *DimensionStats      `json:"dimension,omitempty"`
	Irreversibility IrreversibilityStats `json:"irreversibility"`
	// TailModels compares a power law, an exponential and a log-normal on
	// the degree tail above the power law's k_min (nil when the tail is too
	// small to fit; see TailModelsOf).
	TailModels *TailModels `json:"tail_models,omitempty"`
	// DiameterExact is the exact diameter (MeasureOptions.ExactDiameter).
	DiameterExact *DiameterStats `json:"diameter_exact,omitempty"`
	// Warnings name the metrics that could not be computed and why.
	Warnings []string `json:"warnings,omitempty"`
}

// MarshalJSON writes the metrics with NaN and ±Inf as null (encoding/json
// would refuse them).
func (m Metrics) MarshalJSON() ([]byte, error) { return jsonsafe.Marshal(m, jsonsafe.Options{}) }

// Measure computes all metrics of g: degree statistics, tail fits (λ and γ),
// clustering, assortativity, and unless switched off, Louvain modularity and
// the BFS metrics (path length, diameter, local dimension), plus the in/out
// irreversibility. A metric that is undefined on g (too few tail points, zero
// degree variance, ...) is NaN with a warning; only an empty graph is an
// error (ErrEmpty). Cost on a 10^6-node NVG: seconds (see BENCHMARKS).
func Measure(g *Graph, opts MeasureOptions) (Metrics, error) {
	nan := math.NaN()
	m := Metrics{
		Kind: g.Kind().String(), Nodes: g.Len(), Edges: g.Edges(),
		MeanDegree: nan, Lambda: nan, Gamma: nan, ClusteringMean: nan,
		Assortativity: nan, Modularity: nan, AvgPathLength: nan,
		LocalDimension: nan, IrreversibilityKLD: nan,
	}
	if g.Len() == 0 {
		return m, fmt.Errorf("measure: %w", ErrEmpty)
	}
	warn := func(what string, err error) {
		m.Warnings = append(m.Warnings, fmt.Sprintf("%s: %v", what, err))
	}
	// Louvain and the BFS metrics, the two costliest, run beside the
	// others when their scratch arrays held at once stay small: on small
	// graphs, and on graphs whose edges outweigh their nodes (dense NVGs);
	// sparse graphs of millions of nodes (HVGs, the NVG of noise) measure
	// one metric at a time, so that the peak memory stays near the graph's
	// own. The results are the same either way.
	var (
		part            Partition
		partErr         error
		ps              PathStats
		ds              DimensionStats
		pathErr         error
		wg              sync.WaitGroup
		louvain, bfsRun func()
	)
	if !opts.NoCommunities {
		louvain = func() { part, partErr = Louvain(g, LouvainOptions{Resolution: opts.Resolution}) }
	}
	if !opts.NoPaths {
		bfsRun = func() {
			rng := rand.New(rand.NewPCG(opts.Seed, 0x50617468)) // BFS-source stream
			ps, ds, pathErr = pathsAndDimension(g, PathOptions{ExactMax: opts.ExactMax, Sources: opts.Sources, Rand: rng}, true, true)
		}
	}
	concurrent := g.Len() <= measureConcurrentNodes || concurrentScratch*int64(g.Len()) <= graphBytes(g)/2
	for _, f := range []func(){louvain, bfsRun} {
		if f != nil && concurrent {
			wg.Go(f)
		}
	}
	m.Degree = Degrees(g)
	m.MeanDegree = m.Degree.Mean
	hist := degreeHistogram(g)

	if t, err := tailFromHist(hist, opts.Tail); err != nil {
		warn("lambda", err)
	} else {
		m.Tail = &t
		m.Lambda = t.Lambda
	}
	if p, err := powerLawFromHist(hist, opts.PowerLaw); err != nil {
		warn("gamma", err)
	} else {
		m.PowerLaw = &p
		m.Gamma = p.Gamma
		if tm, err := tailModelsFromHist(hist, p.KMin, 0); err == nil {
			m.TailModels = &tm
		}
	}
	m.Clustering = clusteringStats(g, nil)
	m.ClusteringMean = m.Clustering.Mean
	if r, err := Assortativity(g); err != nil {
		warn("assortativity", err)
	} else {
		m.Assortativity = r
	}
	var ir IrreversibilityStats
	var irErr error
	if !opts.NoIrreversibility {
		ir, irErr = Irreversibility(g)
	}
	for _, f := range []func(){louvain, bfsRun} {
		if f != nil && !concurrent {
			f()
		}
	}
	wg.Wait()
	if louvain != nil {
		if partErr != nil {
			warn("modularity", partErr)
		} else {
			m.Partition = &part
			m.Modularity = part.Modularity
			m.Communities = part.Communities
		}
	}
	if bfsRun != nil {
		if err := pathErr; err != nil && !errors.Is(err, ErrTooFewPoints) {
			warn("paths", err)
		} else if err != nil {
			warn("local dimension", err)
		}
		if !math.IsNaN(ps.AvgPathLength) {
			m.Paths = &ps
			m.AvgPathLength = ps.AvgPathLength
			m.Diameter = ps.Diameter
		}
		if !math.IsNaN(ds.Mean) {
			m.Dimension = &ds
			m.LocalDimension = ds.Mean
		}
	}
	if opts.ExactDiameter {
		if d, err := ExactDiameter(g); err != nil {
			warn("exact diameter", err)
		} else {
			m.DiameterExact = &d
		}
	}
	if opts.NoIrreversibility {
		nan := math.NaN()
		m.Irreversibility = IrreversibilityStats{KLD: nan, DroppedOut: nan, DroppedIn: nan}
	} else if irErr != nil {
		warn("irreversibility", irErr)
	} else {
		m.Irreversibility = ir
		m.IrreversibilityKLD = ir.KLD
	}
	return m, nil
}
