package generators

import "testing"

// TestHindmarshRose: chaotic bursting at I = 3.25 and periodic bursting
// at I = 2.7 and 3.4; in every case the exponents sum to the time average
// of the divergence −3x² + 6x − 1 − r along the same orbit (Liouville's
// formula; the average is a trapezoid sum over the RK4 steps, accurate to
// about 1e-4 here, tolerance 1e-3).
func TestHindmarshRose(t *testing.T) {
	for _, tc := range []struct {
		i     float64
		class Class
	}{{3.25, Chaotic}, {2.7, Regular}, {3.4, Regular}} {
		m := HindmarshRose{I: tc.i, R: 0.006}
		_, _, _, div := orbitStats(m, []float64{-1, -5, 3}, hrStep, hrTransient, 4000, 1, m.divergence)
		checkFlow(t, "hindmarsh-rose", map[string]float64{"i": tc.i}, tc.class, div, 1e-3) // Liouville
	}
}
