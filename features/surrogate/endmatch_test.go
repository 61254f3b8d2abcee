package surrogate

import (
	"math"
	"strings"
	"testing"
)

// TestMismatch: hand computation on x = (0, 1, 2, 3, 4, 5, 6, 7): jump
// (0 − 7)² = 49, slip (1 − 1)² = 0, variance of 0..7 = (8² − 1)/12 = 5.25,
// so 49/5.25 = 9.333…
func TestMismatch(t *testing.T) {
	x := []float64{0, 1, 2, 3, 4, 5, 6, 7}
	if got, want := Mismatch(x), 49/5.25; math.Abs(got-want) > 1e-12 {
		t.Fatalf("Mismatch = %g, want %g", got, want)
	}
	// Scale and offset invariant (project rule).
	y := make([]float64, len(x))
	for i, v := range x {
		y[i] = -3e-6*v + 7
	}
	if got, want := Mismatch(y), 49/5.25; math.Abs(got-want) > 1e-9 {
		t.Fatalf("Mismatch(−3e−6·x + 7) = %g, want %g", got, want)
	}
}

// TestMatchEnds compares the search with a brute force over every pair of
// ends with a 7-smooth length ≥ 90% (the documented search space), checks
// it keeps ≥ 90%, that the mismatch drops, and that a planted perfect
// match (equal values and slopes) is found. Schreiber & Schmitz, Physica D
// 142 (2000) 346 (the criterion).
func TestMatchEnds(t *testing.T) {
	for _, n := range []int{200, 1000, 1013} {
		x := series(t, "walk", n, uint64(n))
		tr, err := MatchEnds(x, 0)
		if err != nil {
			t.Fatal(err)
		}
		lmin := int(math.Ceil(0.9 * float64(n)))
		best, bs, bl := math.Inf(1), -1, 0
		for l := n; l >= lmin; l-- {
			if !isSmooth(l) {
				continue
			}
			for s := 0; s+l <= n; s++ {
				if c := endCost(x, s, s+l-1); c < best {
					best, bs, bl = c, s, l
				}
			}
		}
		if tr.Start != bs || tr.Len != bl {
			t.Fatalf("n=%d: got [%d, +%d), brute force [%d, +%d)", n, tr.Start, tr.Len, bs, bl)
		}
		if tr.Len < lmin || !isSmooth(tr.Len) || tr.CutStart+tr.CutEnd+tr.Len != n {
			t.Fatalf("n=%d: bad truncation %+v", n, tr)
		}
		if !(tr.Mismatch < tr.MismatchBefore) {
			t.Fatalf("n=%d: mismatch %g not below %g", n, tr.Mismatch, tr.MismatchBefore)
		}
	}
	// Planted: a two-harmonic wave of period 59 over 1000 points. Values
	// repeat every 59 samples and 944 = 16·59, so every sub-series of the
	// 7-smooth length 945 = 3³·5·7 has no jump (analytic); its slip is
	// then the second difference at the start phase, ≈ 0 near an
	// inflection point (measured 3.8e−7 of the variance). The last point
	// is spoiled so that the whole series has a mismatch.
	x := make([]float64, 1000)
	for i := range x {
		ph := 2 * math.Pi * float64(i) / 59
		x[i] = math.Sin(ph) + 0.3*math.Sin(2*ph+1)
	}
	x[999] += 0.5
	tr, err := MatchEnds(x, 0.9)
	if err != nil {
		t.Fatal(err)
	}
	if tr.Len != 945 || tr.Mismatch > 1e-5 || tr.MismatchBefore < 0.1 {
		t.Fatalf("planted: got %+v, want length 945 and mismatch ≈ 0", tr)
	}
}

// TestEndLeakageWarning: a slow wave whose ends differ gets the
// end-mismatch warning for FT-based methods and not after end matching; white noise does not get it (its jump leaks ≈ 0.3·d²/(n·var)
// of the upper-half power, see EndLeakage).
func TestEndLeakageWarning(t *testing.T) {
	// A slow sine (period 457 samples, 4.38 periods in 2000) with a
	// little white noise: the ends are far apart in phase and the upper
	// half of the spectrum holds only the weak noise, so the jump
	// dominates it; a sub-series of ≥ 90% can end in phase.
	wave := series(t, "white", 2000, 3)
	for i := range wave {
		wave[i] = math.Sin(2*math.Pi*float64(i)/457) + 0.02*wave[i]
	}
	set, err := Generate(wave, Options{Method: FT, Count: 1})
	if err != nil {
		t.Fatal(err)
	}
	if !hasWarning(set.Warnings, "end mismatch") {
		t.Fatalf("no end-mismatch warning: %v (leakage %g)", set.Warnings, EndLeakage(wave))
	}
	set, err = Generate(wave, Options{Method: FT, Count: 1, EndMatch: true})
	if err != nil {
		t.Fatal(err)
	}
	if hasWarning(set.Warnings, "end mismatch") || set.Truncation == nil || !hasWarning(set.Warnings, "end matching kept") {
		t.Fatalf("after end matching: %v %+v", set.Warnings, set.Truncation)
	}
	t.Logf("slow sine: leakage %.3g, mismatch %.3g → after end matching leakage %.3g, mismatch %.3g (%+v)",
		EndLeakage(wave), Mismatch(wave), EndLeakage(wave[set.Truncation.Start:set.Truncation.Start+set.Truncation.Len]),
		set.Truncation.Mismatch, *set.Truncation)
	white := series(t, "white", 2000, 3)
	if lk := EndLeakage(white); lk > 0.01 {
		t.Fatalf("white noise leakage %g", lk)
	}
	set, err = Generate(white, Options{Method: IAAFT, Count: 1})
	if err != nil {
		t.Fatal(err)
	}
	if hasWarning(set.Warnings, "end mismatch") {
		t.Fatalf("white noise warned: %v", set.Warnings)
	}
}

func hasWarning(ws []string, sub string) bool {
	for _, w := range ws {
		if strings.Contains(w, sub) {
			return true
		}
	}
	return false
}
