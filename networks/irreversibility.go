package networks

import (
	"fmt"
	"math"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

// IrreversibilityStats is the in/out-degree Kullback–Leibler divergence of a
// visibility graph with edges pointing forward in time.
type IrreversibilityStats struct {
	// KLD is D(P_out‖P_in) = Σ_k P_out(k)·ln(P_out(k)/P_in(k)) in nats, summed
	// over the degrees k where both distributions are positive (as Lacasa et
	// al. do; the sum is not renormalised, so a tiny negative value can occur
	// when much mass is dropped).
	KLD float64 `json:"kld"`
	// Bins is the number of degrees k in the sum.
	Bins int `json:"bins"`
	// DroppedOut and DroppedIn are the masses of P_out and P_in on degrees
	// where the other distribution is zero (left out of the sum).
	DroppedOut float64 `json:"dropped_out"`
	DroppedIn  float64 `json:"dropped_in"`
}

// MarshalJSON writes the stats with NaN as null.
func (s IrreversibilityStats) MarshalJSON() ([]byte, error) {
	return jsonsafe.Marshal(s, jsonsafe.Options{})
}

// Irreversibility returns the Kullback–Leibler divergence between the out-
// and in-degree distributions of g with every edge {i, j}, i < j, taken as
// the arc i → j (Lacasa, Nuñez, Roldán, Parrondo & Luque, Eur. Phys. J. B 85
// (2012) 217). On a horizontal visibility graph it estimates time
// irreversibility: ≈ 0 (up to O(bins/n) sampling bias) for reversible
// series such as linear Gaussian processes, > 0 for dissipative chaos. The
// first and last samples are kept (their in- or out-degree is truncated,
// an O(1/n) effect). ErrEmpty for an empty graph.
func Irreversibility(g *Graph) (IrreversibilityStats, error) {
	n := g.Len()
	st := IrreversibilityStats{KLD: math.NaN()}
	if n == 0 {
		return st, fmt.Errorf("irreversibility: %w", ErrEmpty)
	}
	maxd := 0
	for i := 0; i < n; i++ {
		maxd = max(maxd, g.Degree(i))
	}
	in := make([]float64, maxd+1)
	out := make([]float64, maxd+1)
	for i := 0; i < n; i++ {
		in[g.InDegree(i)]++
		out[g.OutDegree(i)]++
	}
	var d float64
	for k := range in {
		po, pi := out[k]/float64(n), in[k]/float64(n)
		switch {
		case po > 0 && pi > 0:
			d += po * math.Log(po/pi)
			st.Bins++
		case po > 0:
			st.DroppedOut += po
		case pi > 0:
			st.DroppedIn += pi
		}
	}
	st.KLD = d
	return st, nil
}
