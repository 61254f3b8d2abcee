package networks_test

import (
	"math/rand/v2"
	"reflect"
	"testing"

	"github.com/tracesift/tracesift/networks/internal/testseries"

	. "github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

// TestMeasureMatchesParts: Measure, which runs Louvain and the BFS metrics
// concurrently with the others on small graphs and one after another on
// large ones, reports exactly what each metric's own function gives, with
// the warnings in the documented order, either way.
func TestMeasureMatchesParts(t *testing.T) {
	defer SetMeasureConcurrentNodes(SetMeasureConcurrentNodes(1 << 18))
	g, err := visibility.Natural(testseries.Bench("brown", 5000), visibility.Options{})
	if err != nil {
		t.Fatal(err)
	}
	opts := MeasureOptions{Seed: 3, Sources: 16}
	var runs []Metrics
	for _, c := range []int{1 << 18, 0} {
		SetMeasureConcurrentNodes(c)
		m, err := Measure(g, opts)
		if err != nil {
			t.Fatal(err)
		}
		runs = append(runs, m)
	}
	if !reflect.DeepEqual(runs[0], runs[1]) {
		t.Fatalf("concurrent and sequential Measure differ:\n%+v\n%+v", runs[0], runs[1])
	}
	m := runs[0]
	p, err := Louvain(g, LouvainOptions{})
	if err != nil {
		t.Fatal(err)
	}
	ps, ds, err := PathsAndDimension(g, PathOptions{Sources: 16, Rand: rand.New(rand.NewPCG(3, 0x50617468))}, true, true)
	if err != nil {
		t.Fatal(err)
	}
	_, cs := Clustering(g)
	if m.Modularity != p.Modularity || m.Communities != p.Communities || *m.Paths != ps || *m.Dimension != ds ||
		!reflect.DeepEqual(m.Clustering, cs) {
		t.Errorf("Measure differs from the metrics' own functions")
	}
	// An edgeless graph: every metric that needs edges warns, in order.
	e, err := FromEdges(3, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []int{1 << 18, 0} {
		SetMeasureConcurrentNodes(c)
		me, err := Measure(e, MeasureOptions{})
		if err != nil {
			t.Fatal(err)
		}
		want := []string{"lambda", "gamma", "assortativity", "modularity", "paths"}
		if len(me.Warnings) != len(want) {
			t.Fatalf("warnings %q, want %d in the order %v", me.Warnings, len(want), want)
		}
		for i, w := range want {
			if len(me.Warnings[i]) < len(w) || me.Warnings[i][:len(w)] != w {
				t.Errorf("warning %d is %q, want it to start with %q", i, me.Warnings[i], w)
			}
		}
	}
}
