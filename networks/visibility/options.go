package visibility

import (
	"fmt"

	"github.com/tracesift/tracesift/networks"
)

// Options controls graph construction. The zero value means the defaults.
type Options struct {
	// MaxEdges is the edge budget: construction stops with a
	// *networks.EdgeBudgetError (errors.Is networks.ErrTooManyEdges) once
	// the graph has more edges. Zero means networks.DefaultMaxEdges. The
	// NVG of a convex sequence has n(n−1)/2 edges, so without a budget a
	// long convex or strongly accelerating trace could exhaust memory.
	MaxEdges int64
}

// Build builds the visibility graph of the given kind (networks.KindNVG
// or networks.KindHVG) from x.
func Build(x []float64, kind networks.Kind, opts Options) (*networks.Graph, error) {
	switch kind {
	case networks.KindNVG:
		return Natural(x, opts)
	case networks.KindHVG:
		return Horizontal(x, opts)
	}
	return nil, fmt.Errorf("build: kind %v: %w", kind, networks.ErrUnknownKind)
}

// Builder returns Build with kind and opts bound, the construction
// networks.MeasureWindows calls for each window.
func Builder(kind networks.Kind, opts Options) func(x []float64) (*networks.Graph, error) {
	return func(x []float64) (*networks.Graph, error) { return Build(x, kind, opts) }
}
