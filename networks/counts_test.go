package networks_test

import (
	"math"
	"math/rand/v2"
	"testing"

	. "github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/internal/testseries"
	"github.com/tracesift/tracesift/networks/visibility"
)

// TestFitsFromCounts: the histogram entry points give exactly the fits of
// the graph entry points on the graph's own histogram, and on the degree
// histograms of several i.i.d. series pooled the HVG tail rate is ln(3/2),
// the exact i.i.d. value (Luque et al., Phys. Rev. E 80 (2009) 046103),
// within 4 standard errors.
func TestFitsFromCounts(t *testing.T) {
	rng := rand.New(rand.NewPCG(91, 92))
	var pooled []int64
	for s := 0; s < 4; s++ {
		x := testseries.IID("gauss", 1<<13, rng)
		h, err := visibility.Horizontal(x, visibility.Options{})
		if err != nil {
			t.Fatal(err)
		}
		n, err := visibility.Natural(x, visibility.Options{})
		if err != nil {
			t.Fatal(err)
		}
		tg, errG := ExponentialTail(h, TailOptions{})
		tc, errC := ExponentialTailCounts(DegreeHistogram(h), TailOptions{})
		if (errG == nil) != (errC == nil) || tg.Lambda != tc.Lambda || tg.KMin != tc.KMin || tg.NTail != tc.NTail {
			t.Errorf("series %d: tail from graph %+v (%v), from counts %+v (%v)", s, tg, errG, tc, errC)
		}
		pg, errG := PowerLaw(n, PowerLawOptions{})
		pc, errC := PowerLawCounts(DegreeHistogram(n), PowerLawOptions{})
		if (errG == nil) != (errC == nil) || pg.Gamma != pc.Gamma || pg.KMin != pc.KMin {
			t.Errorf("series %d: power law from graph %+v (%v), from counts %+v (%v)", s, pg, errG, pc, errC)
		}
		for k, c := range DegreeHistogram(h) {
			for len(pooled) <= k {
				pooled = append(pooled, 0)
			}
			pooled[k] += c
		}
	}
	tf, err := ExponentialTailCounts(pooled, TailOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if ln32 := math.Log(1.5); math.Abs(tf.Lambda-ln32) > 4*tf.StdErr {
		t.Errorf("pooled i.i.d. HVG: λ = %.4f ± %.4f, want ln(3/2) = %.4f", tf.Lambda, tf.StdErr, ln32)
	}
	// Negative counts are read as zero.
	neg := append([]int64{-5}, pooled[1:]...)
	z := append([]int64{0}, pooled[1:]...)
	a, _ := ExponentialTailCounts(neg, TailOptions{})
	b, _ := ExponentialTailCounts(z, TailOptions{})
	if a.Lambda != b.Lambda || neg[0] != -5 {
		t.Errorf("negative count: λ %v vs %v, input changed to %v", a.Lambda, b.Lambda, neg[0])
	}
	if _, err := PowerLawCounts(nil, PowerLawOptions{}); err == nil {
		t.Error("power law of an empty histogram: no error")
	}
}
