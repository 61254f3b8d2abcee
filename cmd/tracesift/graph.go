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
	"github.com/tracesift/tracesift/internal/atomicfile"
	"github.com/tracesift/tracesift/internal/jsonsafe"
	"github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

func init() { addCommand(newGraphCmd) }

type graphOptions struct {
	in       inputOptions
	kind     string
	format   string
	edges    string
	graphml  string
	seed     uint64
	sources  int
	noPaths  bool
	maxEdges int64
	window   int
}

func newGraphCmd(e *env) *cobra.Command {
	var o graphOptions
	c := &cobra.Command{
		Use:   "graph FILE",
		Short: "Build a visibility graph of a trace and print its metrics",
		Long: `Build the natural (nvg) or horizontal (hvg) visibility graph of a trace and
print its metrics with their diagnostics: degree statistics and entropy, the
exponential tail rate λ of P(k) (ln 3/2 for any i.i.d. series), the power-law
exponent γ (discrete maximum likelihood, k_min by the KS distance), local
clustering, degree assortativity, Louvain modularity and communities, mean
shortest path and diameter (exact up to 2000 nodes, from sampled sources
above, reported as an estimate), local graph dimension, and the
irreversibility of the directed graph (in/out-degree KL divergence).

Natural visibility: samples a and b are linked when every sample between
them lies strictly below the straight line joining them. Horizontal
visibility: when every sample between is strictly lower than both.

--edges writes the edge list as CSV (source,target, zero-based sample
indices); --graphml writes GraphML with each node's sample value, for
general graph tools.

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
  tracesift generate white --n 1000000 -o w.csv && tracesift graph w.csv --no-paths
  tracesift graph trace.csv --edges edges.csv --graphml trace.graphml
  tracesift graph long.csv --window 1000000       # NVGs of 10^6 samples, metrics over windows
  tracesift graph long.csv --max-edges 300000000  # one graph, up to ~4.8 GB`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			return runGraph(e, args[0], &o)
		},
	}
	f := c.Flags()
	o.in.bind(f, 2)
	f.StringVar(&o.kind, "kind", "nvg", "graph kind: nvg (natural) or hvg (horizontal)")
	f.StringVar(&o.format, "format", formatTable, "output format: table or json (one object with key \"metrics\")")
	f.StringVar(&o.edges, "edges", "", "write the edge list as CSV to this file")
	f.StringVar(&o.graphml, "graphml", "", "write the graph as GraphML to this file")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the sampled path-length sources")
	f.IntVar(&o.sources, "sources", 64, "BFS sources sampled for path lengths above 2000 nodes")
	f.BoolVar(&o.noPaths, "no-paths", false, "skip path length, diameter and local dimension (the slowest metrics on huge graphs)")
	f.Int64Var(&o.maxEdges, "max-edges", networks.DefaultMaxEdges, fmt.Sprintf("edge budget: stop with an error past this many edges (about %d bytes each at the peak)", networks.BytesPerEdge))
	f.IntVar(&o.window, "window", 0, "build one graph per window of at most this many samples and print each metric's distribution over the windows (0: one graph of the whole trace)")
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

func runGraph(e *env, file string, o *graphOptions) error {
	if err := checkFormat(o.format, formatTable, formatJSON); err != nil {
		return err
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	kind, err := networks.ParseKind(o.kind)
	if err != nil {
		return usagef("--kind %q: want nvg or hvg", o.kind)
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
	if os.Getenv("GOGC") == "" {
		defer debug.SetGCPercent(debug.SetGCPercent(graphGCPercent))
	}
	tr, err := readTrace(e, file, &o.in)
	if err != nil {
		return err
	}
	gopts := visibility.Options{MaxEdges: o.maxEdges}
	mopts := networks.MeasureOptions{Sources: o.sources, NoPaths: o.noPaths, Seed: o.seed}
	if o.window > 0 {
		return runGraphWindows(e, file, tr.Source, tr.Values, kind, gopts, mopts, o)
	}
	// Stages on a terminal: graph built, metrics measured.
	stage := newProgress(e, 2, "graph")
	samples := len(tr.Values)
	g, err := visibility.Build(tr.Values, kind, gopts)
	if err != nil {
		return fmt.Errorf("%s: %w", tr.Source, edgeBudgetError(err))
	}
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
	if o.edges != "" {
		if err := atomicfile.Write(o.edges, func(w io.Writer) error { return networks.WriteEdgeList(w, g) }); err != nil {
			return err
		}
	}
	if o.graphml != "" {
		if err := atomicfile.Write(o.graphml, func(w io.Writer) error { return networks.WriteGraphML(w, g, tr.Values) }); err != nil {
			return err
		}
	}
	if o.format == formatJSON {
		return writeJSONLine(e.stdout, struct {
			File    string           `json:"file"`
			Samples int              `json:"samples"`
			Metrics networks.Metrics `json:"metrics"`
		}{file, samples, m})
	}
	return writeGraphTable(e.stdout, file, m)
}

func writeGraphTable(w io.Writer, file string, m networks.Metrics) error {
	fmt.Fprintf(w, "%s: %s of %d samples, %d edges\n\n", file, strings.ToUpper(m.Kind), m.Nodes, m.Edges)
	t := newTable(w)
	t.row("METRIC", "VALUE", "DIAGNOSTICS")
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
	} else {
		t.row("mean shortest path", "—", "skipped (--no-paths)")
	}
	if dm := m.Dimension; dm != nil {
		t.row("local dimension", human(m.LocalDimension), fmt.Sprintf("std %s over %d nodes", human(dm.Std), dm.Nodes))
	}
	ir := m.Irreversibility
	t.row("irreversibility (KLD)", human(m.IrreversibilityKLD), fmt.Sprintf("out- vs in-degree, %d degrees compared (≈ 0 for reversible series)", ir.Bins))
	if err := t.flush(); err != nil {
		return err
	}
	for _, warn := range m.Warnings {
		fmt.Fprintf(w, "warning: %s\n", warn)
	}
	return nil
}

// runGraphWindows builds and measures one graph per window of the trace and
// prints each metric's distribution over the windows.
func runGraphWindows(e *env, file, source string, x []float64, kind networks.Kind, gopts visibility.Options, mopts networks.MeasureOptions, o *graphOptions) error {
	nw := len(networks.Windows(len(x), o.window))
	w, err := networks.MeasureWindows(x, networks.WindowOptions{
		Kind: kind, Build: visibility.Builder(kind, gopts), Length: o.window, Measure: mopts,
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
