package main

import (
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"

	"tracesift/features/visibility"
	"tracesift/internal/atomicfile"
)

func init() { addCommand(newGraphCmd) }

type graphOptions struct {
	in      inputOptions
	kind    string
	format  string
	edges   string
	graphml string
	seed    uint64
	sources int
	noPaths bool
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
general graph tools.`,
		Example: `  tracesift graph testdata/demo/stressed/D01_stressed_Vg1.20.csv
  tracesift graph --kind hvg --format json trace.csv
  tracesift generate white --n 1000000 -o w.csv && tracesift graph w.csv --no-paths
  tracesift graph trace.csv --edges edges.csv --graphml trace.graphml`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			return runGraph(e, args[0], &o)
		},
	}
	f := c.Flags()
	o.in.bind(f)
	f.StringVar(&o.kind, "kind", "nvg", "graph kind: nvg (natural) or hvg (horizontal)")
	f.StringVar(&o.format, "format", formatTable, "output format: table or json (one object with key \"metrics\")")
	f.StringVar(&o.edges, "edges", "", "write the edge list as CSV to this file")
	f.StringVar(&o.graphml, "graphml", "", "write the graph as GraphML to this file")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the sampled path-length sources")
	f.IntVar(&o.sources, "sources", 64, "BFS sources sampled for path lengths above 2000 nodes")
	f.BoolVar(&o.noPaths, "no-paths", false, "skip path length, diameter and local dimension (the slowest metrics on huge graphs)")
	return c
}

func runGraph(e *env, file string, o *graphOptions) error {
	if err := checkFormat(o.format, formatTable, formatJSON); err != nil {
		return err
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	kind, err := visibility.ParseKind(o.kind)
	if err != nil {
		return usagef("--kind %q: want nvg or hvg", o.kind)
	}
	if o.sources < 1 {
		return usagef("--sources %d: want at least 1", o.sources)
	}
	tr, err := readTrace(e, file, &o.in)
	if err != nil {
		return err
	}
	g, err := visibility.Build(tr.Values, kind, visibility.Options{})
	if err != nil {
		return fmt.Errorf("%s: %w", tr.Source, err)
	}
	m, err := visibility.Measure(g, visibility.MeasureOptions{Sources: o.sources, NoPaths: o.noPaths, Seed: o.seed})
	if err != nil {
		return fmt.Errorf("%s: %w", tr.Source, err)
	}
	if o.edges != "" {
		if err := atomicfile.Write(o.edges, func(w io.Writer) error { return visibility.WriteEdgeList(w, g) }); err != nil {
			return err
		}
	}
	if o.graphml != "" {
		if err := atomicfile.Write(o.graphml, func(w io.Writer) error { return visibility.WriteGraphML(w, g, tr.Values) }); err != nil {
			return err
		}
	}
	if o.format == formatJSON {
		return writeJSONLine(e.stdout, struct {
			File    string             `json:"file"`
			Samples int                `json:"samples"`
			Metrics visibility.Metrics `json:"metrics"`
		}{file, len(tr.Values), m})
	}
	return writeGraphTable(e.stdout, file, tr.Values, m)
}

func writeGraphTable(w io.Writer, file string, x []float64, m visibility.Metrics) error {
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
