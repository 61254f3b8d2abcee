package classifier

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

func hasWarning(ws []string, prefix string) bool {
	for _, w := range ws {
		if strings.HasPrefix(w, prefix) {
			return true
		}
	}
	return false
}

// TestFewCyclesWarning: a sine holding 5 periods crosses its mean 10 times
// (twice per period, analytic), below MinCrossings; 50 periods and white
// noise (about n/2 crossings for an i.i.d. symmetric series) do not warn.
func TestFewCyclesWarning(t *testing.T) {
	sine := func(n int, periods float64) []float64 {
		x := make([]float64, n)
		for i := range x {
			x[i] = math.Sin(2*math.Pi*periods*float64(i)/float64(n) + 0.3)
		}
		return x
	}
	if w := QualityWarnings(sine(4000, 5), 0); !hasWarning(w, "few cycles: the trace crosses its mean only 10 times") {
		t.Errorf("5 periods: %v", w)
	}
	if w := QualityWarnings(sine(4000, 50), 0); hasWarning(w, "few cycles") {
		t.Errorf("50 periods: %v", w)
	}
	rng := rand.New(rand.NewPCG(1, 2))
	x := make([]float64, 4000)
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	if w := QualityWarnings(x, 0); len(w) != 0 {
		t.Errorf("white noise: %v", w)
	}
	for i := range x { // 8 levels
		x[i] = math.Round(2 * x[i])
	}
	if w := QualityWarnings(x, 0); !hasWarning(w, "quantised: only") {
		t.Errorf("8-level noise: %v", w)
	}
}
