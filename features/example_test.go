package features_test

import (
	"fmt"
	"math/rand/v2"
	"strings"

	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/generators"
)

// Example extracts the feature vector of three reference series and reads
// a few features by name. Chaos shows a credible Lyapunov exponent (the
// Hénon map's λ1 is 0.419 per iteration: Sprott, Chaos and Time-Series
// Analysis (2003), confirmed: tkf/LyapunovExponents.jl src/examples/henon_map.jl, the registry's invariant); white noise has
// permutation entropy near 1 (Bandt & Pompe 2002: 1 for i.i.d.) and no
// credible divergence, so nl_div_rate is missing with the reason; a sine puts
// its variance in a spectral line.
func Example() {
	for _, name := range []string{"henon", "white", "sine"} {
		sys, err := generators.Lookup(name)
		if err != nil {
			fmt.Println(err)
			return
		}
		x, err := sys.Generate(2000, nil, rand.New(rand.NewPCG(1, 2)))
		if err != nil {
			fmt.Println(err)
			return
		}
		v, err := features.Extract(x, features.Options{Seed: 1})
		if err != nil {
			fmt.Println(err)
			return
		}
		pe, _ := v.Get("op_ent_d4")
		lines, _ := v.Get("sc_psd_lines")
		lyap := "missing"
		if l, ok := v.Get("nl_div_rate"); ok {
			lyap = fmt.Sprintf("%.2f", l)
		} else {
			why, _, _ := strings.Cut(v.Missing()["nl_div_rate"], ":")
			lyap += " (" + why + ")"
		}
		fmt.Printf("%-5s op_ent_d4 %.2f  sc_psd_lines %.2f  nl_div_rate %s\n", name, pe, lines, lyap)
	}
	// Output:
	// henon op_ent_d4 0.69  sc_psd_lines 0.00  nl_div_rate 0.40
	// white op_ent_d4 1.00  sc_psd_lines 0.00  nl_div_rate missing (no credible exponential divergence)
	// sine  op_ent_d4 0.41  sc_psd_lines 1.00  nl_div_rate missing (no credible exponential divergence)
}

// ExampleValue computes one feature alone, as a surrogate test does. The
// mean degree of the horizontal visibility graph of any i.i.d. series tends
// to 4 (Luque et al., Phys. Rev. E 80 (2009) 046103).
func ExampleValue() {
	x, err := generators.White{Sigma: 1}.Generate(4096, rand.New(rand.NewPCG(1, 2)))
	if err != nil {
		fmt.Println(err)
		return
	}
	k, err := features.Value("hv_deg_mean", x, features.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("hv_deg_mean = %.2f\n", k)
	_, err = features.Value("hvg_mean_dgree", x, features.Options{})
	fmt.Println(err)
	// Output:
	// hv_deg_mean = 3.99
	// unknown feature "hvg_mean_dgree"
}

// ExampleLookup reads a catalogue entry: the family, meaning and reference
// that 'tracesift features --list' prints.
func ExampleLookup() {
	e, ok := features.Lookup("sc_fluct_a1")
	fmt.Println(ok, e.Family)
	fmt.Println(e.Reference)
	// Output:
	// true scaling
	// Peng et al., Phys. Rev. E 49 (1994) 1685
}
