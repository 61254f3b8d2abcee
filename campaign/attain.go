package campaign

import (
	"fmt"
	"math"
	"strings"

	"github.com/tracesift/tracesift/groups"
)

// warn states, for every family in which no test can reach the adjusted
// level, why and what size would: the smallest p a test can give is fixed
// by its sizes (2/(N+1) for a two-sided rank test against N surrogates,
// Theiler et al., Physica D 58 (1992) 77; 2/2^n for the exact signed-rank
// test on n pairs; 2/C(n+m, n) for exact two-sample rank, KS and
// permutation tests), and Holm's first step needs p ≤ α/m (Holm 1979), BH
// at best p ≤ α.
func (a *analysis) warn() {
	rep := a.rep
	limitFor := func(m int) float64 {
		if a.o.Adjust == groups.AdjustBH {
			return a.o.Alpha
		}
		return a.o.Alpha / float64(m)
	}
	adj := "Holm"
	if a.o.Adjust == groups.AdjustBH {
		adj = "BH"
	}
	// Per-trace families share one statement.
	traceFams, traceBad, worstM, fewest := 0, 0, 0, math.MaxInt
	for _, f := range rep.Families {
		if !strings.HasPrefix(f.Name, QuestionTrace+"/") || f.Tests == 0 {
			continue
		}
		traceFams++
		if !f.Reachable {
			traceBad++
		}
		worstM = max(worstM, f.Tests)
	}
	for _, t := range rep.Tests {
		if t.Question == QuestionTrace && !math.IsNaN(t.P) {
			fewest = min(fewest, t.N)
		}
	}
	if traceBad > 0 {
		limit := limitFor(worstM)
		need := int(math.Ceil(2/limit - 1 - 1e-9))
		rep.Warnings = append(rep.Warnings, fmt.Sprintf(
			"per-trace rank tests (%d of %d traces): with %d surrogates per method the smallest two-sided rank p-value is 2/(%d+1) = %s, "+
				"but %s over the %d tests of a trace (metrics × methods) needs p ≤ %s; no per-trace test can be significant. "+
				"At least %d surrogates per method could reach it (2/(N+1) ≤ %s); the campaign tests across traces do not depend on the count.",
			traceBad, traceFams, fewest, fewest, short(2/float64(fewest+1)), adj, worstM, short(limit), need, short(limit)))
	}
	for _, f := range rep.Families {
		if f.Reachable || f.Tests == 0 || strings.HasPrefix(f.Name, QuestionTrace+"/") {
			continue
		}
		limit := limitFor(f.Tests)
		var advice string
		nmax, mmax, test := 0, 0, ""
		for _, t := range rep.Tests {
			if t.Family == f.Name && !math.IsNaN(t.P) {
				nmax, mmax, test = max(nmax, t.N), max(mmax, t.M), t.Test
			}
		}
		switch test {
		case TestSignedRank, TestGaussFlip:
			k := 1
			for groups.SignedRankMinP(k) > limit {
				k++
			}
			unit := "pairs (devices in both groups)"
			if test == TestGaussFlip || strings.HasPrefix(f.Name, QuestionSurrogate+"/") {
				unit = "traces per group and level"
			}
			advice = fmt.Sprintf("%d %s cannot give p below %s (2/2^%d for the exact test); at least %d %s could",
				nmax, unit, short(f.MinP), nmax, k, unit)
		case TestKS, TestMW, TestPermKS, TestPermChi:
			k := 1
			for 2/binomial(2*k, k) > limit {
				k++
			}
			advice = fmt.Sprintf("%d against %d traces cannot give p below %s (2/C(%d, %d) for an exact test); at least %d traces per group at each level could",
				nmax, mmax, short(f.MinP), nmax+mmax, nmax, k)
		default:
			advice = fmt.Sprintf("the smallest attainable p is %s", short(f.MinP))
		}
		rep.Warnings = append(rep.Warnings, fmt.Sprintf("%s: %s over its %d tests needs p ≤ %s, but %s; nothing in this family can be significant.",
			f.Name, adj, f.Tests, short(limit), advice))
	}
}

// short prints a number with 3 significant digits.
func short(v float64) string {
	return fmt.Sprintf("%.3g", v)
}
