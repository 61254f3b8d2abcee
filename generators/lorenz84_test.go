package generators

import "testing"

// TestLorenz84: the exponents sum to the orbit average of the divergence
// 2x − 2 − a (Liouville's formula; trapezoid average over the RK4 steps,
// tolerance 1e-3); the circulation is chaotic at F = 8, G = 1 and
// periodic at G = 1.2 and F = 6.
func TestLorenz84(t *testing.T) {
	s, _ := Lookup("lorenz84")
	for _, tc := range []struct {
		set   map[string]float64
		class Class
	}{
		{nil, Chaotic},
		{map[string]float64{"g": 1.2}, Regular},
		{map[string]float64{"f": 6}, Regular},
	} {
		p, _ := s.Resolve(tc.set)
		m := Lorenz84{A: p["a"], B: p["b"], F: p["f"], G: p["g"]}
		_, _, _, div := orbitStats(m, []float64{1, 0, 0}, lorenz84Step, lorenz84Transient, 1500, 1,
			func(v []float64) float64 { return 2*v[0] - 2 - m.A })
		checkFlow(t, "lorenz84", tc.set, tc.class, div, 1e-3) // Liouville
	}
}
