package features

import (
	"math"

	"github.com/tracesift/tracesift/features/ordinal"
)

var ordinalFamily = family{
	name: FamilyOrdinal,
	entries: []Entry{
		{"op_ent_d4", FamilyOrdinal, "normalised permutation entropy, order 4, delay 1 (1 for i.i.d. noise)", "Bandt & Pompe, Phys. Rev. Lett. 88 (2002) 174102"},
		{"op_jsc_d4", FamilyOrdinal, "Jensen–Shannon statistical complexity, order 4 (0 for i.i.d.; high for chaos)", "Rosso et al., Phys. Rev. Lett. 99 (2007) 154102"},
		{"op_ent_d6", FamilyOrdinal, "normalised permutation entropy, order 6", "Bandt & Pompe (2002)"},
		{"op_jsc_d6", FamilyOrdinal, "Jensen–Shannon statistical complexity, order 6", "Rosso et al. (2007)"},
		{"op_jsc_rel_d6", FamilyOrdinal, "order-6 complexity as a fraction of the way from the lowest to the highest complexity possible at its entropy", "Martin, Plastino & Rosso, Physica A 369 (2006) 439 (checked: search.r-project.org/CRAN/refmans/statcomp/html/maxd6.html)"},
		{"op_miss_d5", FamilyOrdinal, "order-5 patterns never seen, beyond those an i.i.d. series of this length misses by chance, as a fraction of 5! (forbidden patterns; a quantised trace is read after Extract's dither, as if seen through noise of variance q²/6)", "Amigó, Zambrano & Sanjuán, EPL 79 (2007) 50001"},
	},
	compute: computeOrdinal,
}

func computeOrdinal(z []float64, _ Options, s *sink) {
	s.measure(func() error {
		r, err := ordinal.Complexity(z, ordinal.Options{Order: 4})
		if err != nil {
			return err
		}
		s.set("op_ent_d4", r.Entropy)
		s.set("op_jsc_d4", r.Complexity)
		return nil
	}, "op_ent_d4", "op_jsc_d4")
	s.measure(func() error {
		r, err := ordinal.Complexity(z, ordinal.Options{Order: 6})
		if err != nil {
			return err
		}
		s.set("op_ent_d6", r.Entropy)
		s.set("op_jsc_d6", r.Complexity)
		if span := r.MaxComplexity - r.MinComplexity; span > 1e-12 {
			s.set("op_jsc_rel_d6", math.Min(1, math.Max(0, (r.Complexity-r.MinComplexity)/span)))
		} else {
			s.miss("entropy at an end of the plane: complexity bounds coincide", "op_jsc_rel_d6")
		}
		return nil
	}, "op_ent_d6", "op_jsc_d6", "op_jsc_rel_d6")
	s.measure(func() error {
		r, err := ordinal.Missing(z, ordinal.Options{Order: 5})
		if err != nil {
			return err
		}
		s.set("op_miss_d5", math.Max(0, float64(r.Missing)-r.ExpectedIID)/float64(r.Patterns))
		return nil
	}, "op_miss_d5")
}
