package networks

import (
	"fmt"
	"math"
)

// Assortativity returns Newman's degree assortativity coefficient r, the
// Pearson correlation of the degrees at the two ends of an edge, each edge
// taken in both directions (Newman, Phys. Rev. Lett. 89 (2002) 208701, eq. 4):
//
//	r = [Σ j·k/E − (Σ (j+k)/2E)²] / [Σ (j²+k²)/2E − (Σ (j+k)/2E)²].
//
// It is computed in two passes (mean first, then centred sums) to avoid
// cancellation with large degrees. NetworkX's
// degree_assortativity_coefficient gives the same value. ErrUndefined when
// the graph has no edges or every edge end has the same degree (regular
// graphs: zero variance).
func Assortativity(g *Graph) (float64, error) {
	e := g.Edges()
	if e == 0 {
		return math.NaN(), fmt.Errorf("assortativity: no edges: %w", ErrUndefined)
	}
	// Over the 2E edge ends, each node i appears k_i times with value k_i.
	var s float64
	for i := 0; i < g.Len(); i++ {
		k := float64(g.Degree(i))
		s += k * k
	}
	mean := s / float64(2*e)
	var cov, vr float64
	for i := 0; i < g.Len(); i++ {
		di := float64(g.Degree(i)) - mean
		vr += float64(g.Degree(i)) * di * di
		for _, j := range g.Successors(i) {
			dj := float64(g.Degree(int(j))) - mean
			cov += 2 * di * dj
		}
	}
	if vr == 0 {
		return math.NaN(), fmt.Errorf("assortativity: all edge ends have degree %g: %w", mean, ErrUndefined)
	}
	return cov / vr, nil
}
