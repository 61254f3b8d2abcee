package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"runtime/debug"
	"strings"

	"github.com/spf13/cobra"

	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/features/ordinal"
	"github.com/tracesift/tracesift/internal/atomicfile"
	"github.com/tracesift/tracesift/internal/jsonsafe"
	"github.com/tracesift/tracesift/networks"
	opn "github.com/tracesift/tracesift/networks/ordinal"
	"github.com/tracesift/tracesift/networks/recurrence"
	"github.com/tracesift/tracesift/networks/visibility"
)

func init() { addCommand(newGraphCmd) }

type graphOptions struct {
	in        inputOptions
	kind      string
	format    string
	edges     string
	graphml   string
	seed      uint64
	sources   int
	noPaths   bool
	maxEdges  int64
	window    int
	exactDiam bool
	// Recurrence networks (rn) and ordinal partition networks (opn).
	dim     int
	delay   int
	theiler int
	rate    float64
	eps     float64
	knn     int
	euclid  bool
	order   int
}

func newGraphCmd(e *env) *cobra.Command {
	var o graphOptions
	c := &cobra.Command{
		Use:   "graph FILE",
		Short: "Build a network of a trace (visibility, recurrence, ordinal) and print its metrics",
		Long: `Build one of four networks of a trace and print its metrics with their
diagnostics. Every kind gets the same common set: degree statistics and
entropy, the exponential tail rate λ of P(k) (ln 3/2 for the HVG of any
i.i.d. series), the power-law exponent γ (discrete maximum likelihood, k_min
by the KS distance), the degree-tail model comparison (power law against
exponential against log-normal by maximum likelihood and Vuong's test, the
winner and its p-value, and a warning when the distribution peaks well above
k_min), local clustering and transitivity, degree assortativity, Louvain
modularity and communities, mean shortest path and diameter (exact up to
2000 nodes, from sampled sources above, reported as an estimate;
--exact-diameter adds the exact diameter by iFUB up to 10^5 nodes), local
graph dimension, and for visibility graphs the irreversibility of the
directed graph (in/out-degree KL divergence).

  nvg  natural visibility graph: samples a and b are linked when every
       sample between them lies strictly below the straight line joining
       them (Lacasa et al. 2008). One node per sample.
  hvg  horizontal visibility graph: when every sample between is strictly
       lower than both (Luque et al. 2009).
  rn   recurrence network: one node per delay vector (--dim m, --delay τ;
       0 chooses them as the feature extraction does: first minimum of the
       mutual information, Cao's method), linked when closer than ε in the
       maximum norm (--euclidean for Euclidean). ε links a fixed share of
       the pairs (--rate, default 0.05, exact to the pair), or is a fixed
       distance in standard deviations (--eps), or each vector links its
       --knn nearest neighbours. --theiler W leaves out pairs closer than W
       samples in time. Adds edge density, recurrence rate, transitivity and
       clustering dimensions (Donner et al. 2011). Marwan et al. 2009.
  opn  ordinal partition network: one node per ordinal pattern of --order d
       samples spaced --delay τ (default 5 and 1; equal values ranked by
       position, the earlier as the smaller), directed weighted edges for
       the transitions between successive windows. Adds distinct patterns
       against d!, admissible and forbidden transitions, self-loop share,
       global transition entropy and the out-degree distribution; the common
       set is measured on the undirected form. McCullough et al. 2015.

--edges writes the edge list as CSV (source,target, zero-based node
indices; for opn the directed transitions with their weights and patterns);
--graphml writes GraphML (nodes carry the sample value for nvg, hvg and rn,
the pattern and its count for opn), for general graph tools.

Memory: a graph holds about ` + fmt.Sprint(networks.BytesPerEdge) + ` bytes per edge at the peak (built and
measured), besides about 130 bytes per sample, and construction stops with
an error once it passes --max-edges edges (default ` + fmt.Sprint(networks.DefaultMaxEdges) + `, about
` + memory(networks.DefaultMaxEdges) + `). A horizontal graph has fewer than 2 edges per sample; a
natural one has 3 per sample for white noise, 13 for 10^6 samples of a
random walk, and more the longer and smoother the trace: 10^7 samples of
Brownian motion give 1.6·10^8 edges, past the default budget (measured:
1.9 GB with --max-edges 200000000 --no-paths). Raise the budget if the
memory is there, or cut the trace with --window N: one graph per window
of at most N consecutive samples (all windows of equal length, ±1 sample,
covering the trace), measured one after another, printing each metric's
mean, standard deviation, minimum, median and maximum over the windows
(measured: 10 windows of 10^6 samples of that trace, 0.36 GB). Local metrics
(degree distribution, λ, clustering, irreversibility) estimate the same
quantities as the whole graph; metrics that grow with the graph (the mean
degree and path length of a random walk's NVG) describe graphs of N nodes.`,
		Example: `  tracesift graph testdata/demo/stressed/D01_stressed_Vg1.20.csv
  tracesift graph --kind hvg --format json trace.csv
  tracesift graph --kind rn testdata/demo/stressed/D02_stressed_Vg1.20.csv.gz          # 5% recurrence rate
  tracesift graph --kind rn --dim 3 --delay 8 --eps 0.2 --theiler 10 trace.csv
  tracesift graph --kind opn --order 6 testdata/demo/fresh/D01_fresh_Vg0.60.csv --edges opn.csv
  tracesift graph --kind nvg --exact-diameter trace.csv
  tracesift generate white --n 1000000 -o w.csv && tracesift graph w.csv --no-paths
  tracesift graph trace.csv --edges edges.csv --graphml trace.graphml
  tracesift graph long.csv --window 1000000       # NVGs of 10^6 samples, metrics over windows
  tracesift graph long.csv --max-edges 300000000  # one graph, up to ~4.8 GB`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			return runGraph(e, args[0], &o, c.Flags().Changed)
		},
	}
	f := c.Flags()
	o.in.bind(f, 2)
	f.StringVar(&o.kind, "kind", "nvg", "network: nvg (natural visibility), hvg (horizontal visibility), rn (recurrence) or opn (ordinal partition)")
	f.StringVar(&o.format, "format", formatTable, "output format: table or json (one object with key \"metrics\")")
	f.StringVar(&o.edges, "edges", "", "write the edge list as CSV to this file")
	f.StringVar(&o.graphml, "graphml", "", "write the graph as GraphML to this file")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the sampled path-length sources")
	f.IntVar(&o.sources, "sources", 64, "BFS sources sampled for path lengths above 2000 nodes")
	f.BoolVar(&o.noPaths, "no-paths", false, "skip path length, diameter and local dimension (the slowest metrics on huge graphs)")
	f.Int64Var(&o.maxEdges, "max-edges", networks.DefaultMaxEdges, fmt.Sprintf("edge budget: stop with an error past this many edges (about %d bytes each at the peak)", networks.BytesPerEdge))
	f.IntVar(&o.window, "window", 0, "build one graph per window of at most this many samples and print each metric's distribution over the windows (0: one graph of the whole trace)")
	f.BoolVar(&o.exactDiam, "exact-diameter", false, fmt.Sprintf("add the exact diameter (iFUB) beside the sampled estimate, up to %d nodes", networks.ExactDiameterMax))
	f.IntVar(&o.dim, "dim", 0, "rn: embedding dimension m (0: Cao's method)")
	f.IntVar(&o.delay, "delay", 0, "rn: embedding delay τ in samples (0: first minimum of the mutual information); opn: delay between the samples of a pattern (0: 1)")
	f.IntVar(&o.theiler, "theiler", 0, "rn: leave out pairs of vectors closer than this many samples in time (0: only self-loops)")
	f.Float64Var(&o.rate, "rate", 0, fmt.Sprintf("rn: link this share of the pairs (default %g when neither --eps nor --knn is given)", recurrence.DefaultRate))
	f.Float64Var(&o.eps, "eps", 0, "rn: link vectors closer than this distance, in standard deviations of the trace")
	f.IntVar(&o.knn, "knn", 0, "rn: link each vector to its k nearest neighbours")
	f.BoolVar(&o.euclid, "euclidean", false, "rn: Euclidean distances (default: maximum norm)")
	f.IntVar(&o.order, "order", 0, fmt.Sprintf("opn: samples per ordinal pattern, %d–%d (0: %d)", ordinal.MinOrder, ordinal.MaxOrder, opn.DefaultOrder))
	return c
}

// graphGCPercent is the garbage collector's pacing for graph (the GOGC
// environment variable overrides it). The samples, the graph and the
// metrics' scratch are a few large arrays without pointers, so a collection
// costs little; the default pacing (100) lets the heap grow to twice what
// is live before collecting. On the HVG of 10^7 samples (--no-paths): 0.50
// GB at the peak instead of 0.75, in the same time (measured; 10 gave
// 0.50–0.56 GB, depending on where the collections fell).
const graphGCPercent = 5

// memory states the peak memory of a graph with the given number of edges.
func memory(edges int64) string {
	b := float64(edges) * networks.BytesPerEdge
	switch {
	case b >= 1e9:
		return fmt.Sprintf("%.1f GB", b/1e9)
	case b >= 1e6:
		return fmt.Sprintf("%.0f MB", b/1e6)
	}
	return fmt.Sprintf("%.0f kB", b/1e3)
}

// edgeBudgetError rewrites a graph that passed its edge budget in terms of
// the command line: the flags that raise the budget or cut the trace.
func edgeBudgetError(err error) error {
	var eb *networks.EdgeBudgetError
	if !errors.As(err, &eb) {
		return err
	}
	return fmt.Errorf("%s of %d samples: more than %d edges, the budget set by --max-edges (about %s at the peak); raise --max-edges (%d bytes per edge) or build graphs of windows with --window N (e.g. --window %d)",
		eb.Graph, eb.Nodes, eb.Budget, memory(eb.Budget), networks.BytesPerEdge, min(features.DefaultWindow, max(eb.Nodes/2, 2)))
}

// rnFlags and opnFlags are the flags that belong to one kind only.
var (
	rnFlags  = []string{"dim", "theiler", "rate", "eps", "knn", "euclidean"}
	opnFlags = []string{"order"}
)

func runGraph(e *env, file string, o *graphOptions, changed func(string) bool) error {
	if err := checkFormat(o.format, formatTable, formatJSON); err != nil {
		return err
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	kind, err := networks.ParseKind(o.kind)
	if err != nil || kind == networks.KindOther {
		return usagef("--kind %q: want nvg, hvg, rn or opn", o.kind)
	}
	for _, f := range rnFlags {
		if changed(f) && kind != networks.KindRN {
			return usagef("--%s is for --kind rn", f)
		}
	}
	for _, f := range opnFlags {
		if changed(f) && kind != networks.KindOPN {
			return usagef("--%s is for --kind opn", f)
		}
	}
	if changed("delay") && kind != networks.KindRN && kind != networks.KindOPN {
		return usagef("--delay is for --kind rn or opn")
	}
	if o.sources < 1 {
		return usagef("--sources %d: want at least 1", o.sources)
	}
	if o.maxEdges < 1 {
		return usagef("--max-edges %d: want at least 1", o.maxEdges)
	}
	if o.window < 0 || o.window == 1 {
		return usagef("--window %d: want 0 (the whole trace) or at least 2 samples", o.window)
	}
	if o.window > 0 && (o.edges != "" || o.graphml != "") {
		return usagef("--edges and --graphml write the graph of the whole trace: drop --window")
	}
	if o.dim < 0 || o.delay < 0 || o.theiler < 0 || o.knn < 0 || o.eps < 0 || o.rate < 0 || o.rate > 1 {
		return usagef("--dim, --delay, --theiler, --knn and --eps want values ≥ 0, --rate one in [0, 1]")
	}
	if o.order != 0 && (o.order < ordinal.MinOrder || o.order > ordinal.MaxOrder) {
		return usagef("--order %d: want %d–%d", o.order, ordinal.MinOrder, ordinal.MaxOrder)
	}
	n := 0
	for _, set := range []bool{o.rate > 0, o.eps > 0, o.knn > 0} {
		if set {
			n++
		}
	}
	if n > 1 {
		return usagef("give one of --rate, --eps and --knn")
	}
	if os.Getenv("GOGC") == "" {
		defer debug.SetGCPercent(debug.SetGCPercent(graphGCPercent))
	}
	tr, err := readTrace(e, file, &o.in)
	if err != nil {
		return err
	}
	mopts := networks.MeasureOptions{Sources: o.sources, NoPaths: o.noPaths, Seed: o.seed, ExactDiameter: o.exactDiam,
		NoIrreversibility: kind == networks.KindRN || kind == networks.KindOPN}
	if o.window > 0 {
		return runGraphWindows(e, file, tr.Source, tr.Values, kind, mopts, o)
	}
	// Stages on a terminal: graph built, metrics measured.
	stage := newProgress(e, 2, "graph")
	samples := len(tr.Values)
	b, err := o.build(tr.Values, kind)
	if err != nil {
		return fmt.Errorf("%s: %w", tr.Source, edgeBudgetError(err))
	}
	g := b.g
	if o.graphml == "" {
		// Only GraphML needs the samples again: let the collector have
		// them (80 MB at 10^7 samples) before the metrics take scratch.
		tr.Values = nil
	}
	if stage != nil {
		stage(1, 2)
	}
	m, err := networks.Measure(g, mopts)
	if err != nil {
		return fmt.Errorf("%s: %w", tr.Source, err)
	}
	if stage != nil {
		stage(2, 2)
	}
	var rnm *rnJSON
	var opm *opnJSON
	if b.rn != nil {
		rnm = &rnJSON{Network: *b.rn, Metrics: b.rn.Derive(m)}
	}
	if b.opn != nil {
		opm = &opnJSON{Order: b.opn.Order, Delay: b.opn.Delay, TieRule: b.opn.TieRule, Metrics: b.opn.Directed()}
	}
	if o.edges != "" {
		if err := atomicfile.Write(o.edges, func(w io.Writer) error {
			if b.opn != nil {
				return opn.WriteEdgeList(w, b.opn)
			}
			return networks.WriteEdgeList(w, g)
		}); err != nil {
			return err
		}
	}
	if o.graphml != "" {
		if err := atomicfile.Write(o.graphml, func(w io.Writer) error {
			if b.opn != nil {
				return opn.WriteGraphML(w, b.opn)
			}
			return networks.WriteGraphML(w, g, tr.Values[:g.Len()])
		}); err != nil {
			return err
		}
	}
	if o.format == formatJSON {
		return writeJSONLine(e.stdout, struct {
			File       string           `json:"file"`
			Samples    int              `json:"samples"`
			Metrics    networks.Metrics `json:"metrics"`
			Recurrence *rnJSON          `json:"recurrence,omitempty"`
			Ordinal    *opnJSON         `json:"ordinal,omitempty"`
		}{file, samples, m, rnm, opm})
	}
	if err := writeGraphTable(e.stdout, file, samples, m, rnm, opm); err != nil {
		return err
	}
	return nil
}

// rnJSON and opnJSON are the kind-specific parts of graph's output.
type rnJSON struct {
	Network recurrence.Network `json:"network"`
	Metrics recurrence.Metrics `json:"metrics"`
}

type opnJSON struct {
	Order   int            `json:"order"`
	Delay   int            `json:"delay"`
	TieRule string         `json:"tie_rule"`
	Metrics ordinalMetrics `json:"metrics"`
}

type ordinalMetrics = opn.Metrics

// builtGraph is a network built for graph: the graph, and the recurrence
// or ordinal network behind it.
type builtGraph struct {
	g   *networks.Graph
	rn  *recurrence.Network
	opn *opn.Network
}

// build builds the network of kind from x with the command's options.
func (o *graphOptions) build(x []float64, kind networks.Kind) (builtGraph, error) {
	switch kind {
	case networks.KindRN:
		nw, err := recurrence.Build(x, recurrence.Options{Dim: o.dim, Delay: o.delay, Theiler: o.theiler,
			Rate: o.rate, Epsilon: o.eps, K: o.knn, Euclidean: o.euclid, MaxEdges: o.maxEdges})
		if err != nil {
			return builtGraph{}, err
		}
		return builtGraph{g: nw.Graph, rn: nw}, nil
	case networks.KindOPN:
		nw, err := opn.Build(x, opn.Options{Order: o.order, Delay: o.delay})
		if err != nil {
			return builtGraph{}, err
		}
		return builtGraph{g: nw.Graph, opn: nw}, nil
	}
	g, err := visibility.Build(x, kind, visibility.Options{MaxEdges: o.maxEdges})
	return builtGraph{g: g}, err
}

func writeGraphTable(w io.Writer, file string, samples int, m networks.Metrics, rn *rnJSON, op *opnJSON) error {
	switch {
	case rn != nil:
		nw := rn.Network
		fmt.Fprintf(w, "%s: RN of %d samples: %d delay vectors (m = %d %s, τ = %d %s, Theiler %d), %d edges\n",
			file, samples, m.Nodes, nw.Dim, nw.DimMethod, nw.Delay, nw.DelayMethod, nw.Theiler, m.Edges)
		fmt.Fprintf(w, "  ε = %s s.d. (%s norm, rule %s), recurrence rate %s of %d pairs\n\n", human(nw.Epsilon), nw.Norm, nw.Rule, human(nw.Rate), nw.Pairs)
	case op != nil:
		fmt.Fprintf(w, "%s: OPN of %d samples: %d patterns of order %d, delay %d (ties: %s), %d undirected edges\n\n",
			file, samples, m.Nodes, op.Order, op.Delay, op.TieRule, m.Edges)
	default:
		fmt.Fprintf(w, "%s: %s of %d samples, %d edges\n\n", file, strings.ToUpper(m.Kind), m.Nodes, m.Edges)
	}
	t := newTable(w)
	t.row("METRIC", "VALUE", "DIAGNOSTICS")
	if rn != nil {
		r := rn.Metrics
		t.row("edge density", human(r.EdgeDensity), "2E / (N(N − 1))")
		t.row("transitivity dimension", human(r.TransitivityDim), fmt.Sprintf("ln T / ln(3/4), T = %s (Donner et al. 2011)", human(r.Transitivity)))
		t.row("clustering dimension", human(r.ClusteringDim), fmt.Sprintf("ln C / ln(3/4), C = %s", human(r.ClusteringMean)))
	}
	if op != nil {
		d := op.Metrics
		t.row("distinct patterns", fmt.Sprint(d.Patterns), fmt.Sprintf("of %d! = %d (%s); %d missing", op.Order, d.Possible, human(d.PatternFraction), d.Possible-d.Patterns))
		t.row("forbidden transitions", fmt.Sprint(d.Forbidden), fmt.Sprintf("of %d admissible (%s); %d distinct seen in %d steps", d.Admissible, human(d.ForbiddenFraction), d.Distinct, d.Transitions))
		t.row("self-loop fraction", human(d.SelfLoopFraction), "share of steps repeating the pattern")
		t.row("transition entropy (nats)", human(d.TransitionEntropy), fmt.Sprintf("normalised %s (1: every allowed successor equally likely)", human(d.TransitionEntropyNorm)))
		var parts []string
		for _, dc := range d.OutDegree {
			parts = append(parts, fmt.Sprintf("%d:%d", dc.K, dc.Count))
		}
		t.row("out-degree (mean)", human(d.OutDegreeMean), "distribution k:nodes "+strings.Join(parts, " "))
	}
	d := m.Degree
	t.row("mean degree", human(m.MeanDegree), fmt.Sprintf("std %s, min %d, max %d", human(d.Std), d.Min, d.Max))
	t.row("degree entropy (nats)", human(d.Entropy), fmt.Sprintf("%d distinct degrees", len(d.Distribution)))
	if tf := m.Tail; tf != nil {
		t.row("exponential tail λ", human(m.Lambda), fmt.Sprintf("± %s, k ≥ %d (%d nodes), KS %s; least squares %s over k ≤ %d, r² %s (i.i.d.: ln 3/2 = 0.4055)",
			human(tf.StdErr), tf.KMin, tf.NTail, human(tf.KS), human(tf.LambdaLS), tf.KMaxLS, human(tf.R2)))
	} else {
		t.row("exponential tail λ", human(m.Lambda), "")
	}
	if pl := m.PowerLaw; pl != nil {
		t.row("power-law γ", human(m.Gamma), fmt.Sprintf("± %s, k ≥ %d (%d nodes), KS %s", human(pl.StdErr), pl.KMin, pl.NTail, human(pl.KS)))
	} else {
		t.row("power-law γ", human(m.Gamma), "")
	}
	if tm := m.TailModels; tm != nil {
		dec := "not decided"
		if tm.Decided {
			dec = "decided"
		}
		var parts []string
		for _, c := range tm.Comparisons {
			parts = append(parts, fmt.Sprintf("%s vs %s R %s p %s", c.A, c.B, human(c.R), human(c.P)))
		}
		t.row("degree tail model", strings.ReplaceAll(tm.Winner, "_", "-"), fmt.Sprintf("p %s (%s at 0.1), k ≥ %d (%d nodes); %s", human(tm.P), dec, tm.KMin, tm.NTail, strings.Join(parts, "; ")))
	}
	c := m.Clustering
	t.row("clustering (mean)", human(m.ClusteringMean), fmt.Sprintf("std %s, transitivity %s, %d triangles", human(c.Std), human(c.Transitivity), c.Triangles))
	t.row("assortativity", human(m.Assortativity), "Newman's degree correlation")
	if p := m.Partition; p != nil {
		t.row("modularity", human(m.Modularity), fmt.Sprintf("Louvain, %d communities, %d levels", p.Communities, p.Levels))
	} else {
		t.row("modularity", human(m.Modularity), "not computed")
	}
	if p := m.Paths; p != nil {
		how := "exact"
		if !p.Exact {
			how = fmt.Sprintf("estimate from %d sampled sources, ± %s; diameter is a lower bound", p.Sources, human(p.StdErr))
		}
		t.row("mean shortest path", human(m.AvgPathLength), how)
		t.row("diameter", fmt.Sprint(m.Diameter), "")
		if d := m.DiameterExact; d != nil {
			t.row("diameter (exact)", fmt.Sprint(d.Diameter), fmt.Sprintf("iFUB, %d breadth-first searches, %d components", d.BFS, d.Components))
		}
	} else {
		t.row("mean shortest path", "—", "skipped (--no-paths)")
	}
	if dm := m.Dimension; dm != nil {
		t.row("local dimension", human(m.LocalDimension), fmt.Sprintf("std %s over %d nodes", human(dm.Std), dm.Nodes))
	}
	if rn == nil && op == nil {
		ir := m.Irreversibility
		t.row("irreversibility (KLD)", human(m.IrreversibilityKLD), fmt.Sprintf("out- vs in-degree, %d degrees compared (≈ 0 for reversible series)", ir.Bins))
	}
	if err := t.flush(); err != nil {
		return err
	}
	for _, warn := range m.Warnings {
		fmt.Fprintf(w, "warning: %s\n", warn)
	}
	if tm := m.TailModels; tm != nil {
		for _, warn := range tm.Warnings {
			fmt.Fprintf(w, "warning: degree tail: %s\n", warn)
		}
	}
	return nil
}

// runGraphWindows builds and measures one graph per window of the trace and
// prints each metric's distribution over the windows.
func runGraphWindows(e *env, file, source string, x []float64, kind networks.Kind, mopts networks.MeasureOptions, o *graphOptions) error {
	nw := len(networks.Windows(len(x), o.window))
	build := func(x []float64) (*networks.Graph, error) {
		b, err := o.build(x, kind)
		return b.g, err
	}
	w, err := networks.MeasureWindows(x, networks.WindowOptions{
		Kind: kind, Build: build, Length: o.window, Measure: mopts,
		Progress: newProgress(e, nw, "windows"),
	})
	if err != nil {
		return fmt.Errorf("%s: %w", source, edgeBudgetError(err))
	}
	if o.format == formatJSON {
		return writeJSONLine(e.stdout, windowedJSON(file, w))
	}
	return writeWindowedTable(e.stdout, file, w)
}

// graphWindowsLine is the JSON object of a windowed graph: "metrics" maps
// each metric to its distribution over the windows, "windows" lists each
// window's stretch and headline metrics.
type graphWindowsLine struct {
	File    string                           `json:"file"`
	Samples int                              `json:"samples"`
	Kind    string                           `json:"kind"`
	Window  int                              `json:"window"`
	Metrics map[string]networks.Distribution `json:"metrics"`
	Windows []graphWindowLine                `json:"windows"`
}

type graphWindowLine struct {
	Start    int                       `json:"start"`
	End      int                       `json:"end"`
	Metrics  map[string]jsonsafe.Float `json:"metrics"`
	Warnings []string                  `json:"warnings,omitempty"`
}

func windowedJSON(file string, w networks.Windowed) graphWindowsLine {
	l := graphWindowsLine{File: file, Samples: w.Samples, Kind: w.Kind, Window: w.Length, Metrics: map[string]networks.Distribution{}}
	for _, d := range w.Summary {
		l.Metrics[d.Metric] = d
	}
	names := networks.SummaryMetrics()
	for _, wm := range w.Windows {
		line := graphWindowLine{Start: wm.Start, End: wm.End, Metrics: map[string]jsonsafe.Float{}, Warnings: wm.Metrics.Warnings}
		for i, v := range wm.Metrics.Headline() {
			line.Metrics[names[i]] = jsonsafe.Float(v)
		}
		l.Windows = append(l.Windows, line)
	}
	return l
}

func writeWindowedTable(out io.Writer, file string, w networks.Windowed) error {
	lo, hi := w.Samples, 0
	for _, wm := range w.Windows {
		lo, hi = min(lo, wm.Len()), max(hi, wm.Len())
	}
	size := fmt.Sprint(hi)
	if lo != hi {
		size = fmt.Sprintf("%d–%d", lo, hi)
	}
	fmt.Fprintf(out, "%s: %s of %d samples in %d %s of %s samples\n\n", file, strings.ToUpper(w.Kind), w.Samples, len(w.Windows), plural(len(w.Windows), "window"), size)
	t := newTable(out)
	t.row("METRIC", "MEAN", "SD", "MIN", "MEDIAN", "MAX", "WINDOWS")
	for _, d := range w.Summary {
		t.row(d.Metric, human(d.Mean), human(d.SD), human(d.Min), human(d.Median), human(d.Max), fmt.Sprintf("%d/%d", d.Defined, len(w.Windows)))
	}
	if err := t.flush(); err != nil {
		return err
	}
	seen := map[string]int{}
	var order []string
	for _, wm := range w.Windows {
		for _, warn := range wm.Metrics.Warnings {
			if seen[warn] == 0 {
				order = append(order, warn)
			}
			seen[warn]++
		}
	}
	for _, warn := range order {
		fmt.Fprintf(out, "warning (%d of %d windows): %s\n", seen[warn], len(w.Windows), warn)
	}
	return nil
}
