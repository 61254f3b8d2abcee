package features

import (
	"errors"
	"math"
	"math/rand/v2"
	"regexp"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// coreNames are the feature names DESIGN.md promises to scripts.
var coreNames = []string{
	"nl_div_rate", "nl_gp_dim", "sc_fluct_a1", "sc_range_h", "sc_psd_beta",
	"op_ent_d4", "op_jsc_d4", "nl_sent_m2", "nl_k01",
	"hv_deg_mean", "hv_tail_exprate", "hv_clust_mean",
	"nv_deg_mean", "nv_tail_powexp", "nv_clust_mean", "nv_comm_q", "nv_deg_assort",
}

func TestCatalogue(t *testing.T) {
	seen := map[string]bool{}
	name := regexp.MustCompile(`^[a-z][a-z0-9_]*$`)
	for _, e := range append(Catalogue(), Extended()...) {
		if seen[e.Name] {
			t.Errorf("duplicate feature %s", e.Name)
		}
		seen[e.Name] = true
		if !name.MatchString(e.Name) {
			t.Errorf("feature name %q is not snake_case", e.Name)
		}
		if p := familyPrefix[e.Family]; !strings.HasPrefix(e.Name, p[0]) && (p[1] == "" || !strings.HasPrefix(e.Name, p[1])) {
			t.Errorf("feature %s of family %s lacks its family prefix %q", e.Name, e.Family, p)
		}
		if e.Description == "" || e.Reference == "" || e.Family == "" {
			t.Errorf("%s: description, reference and family are required: %+v", e.Name, e)
		}
	}
	for n := range seen {
		if foreignNames[n] {
			t.Errorf("feature %s is a function name of another analysis library; use our own scheme", n)
		}
	}
	for _, n := range coreNames {
		if !seen[n] {
			t.Errorf("core feature %s (DESIGN.md) is not in the catalogue", n)
		}
	}
	for n := range missingByNature {
		if !seen[n] {
			t.Errorf("missingByNature names %s, which is not a feature", n)
		}
	}
}

// familyPrefix is the identifier prefix of each family (schema 3): family
// prefix + quantity + parameter, our own scheme (DEVELOPERS.md).
var familyPrefix = map[Family][2]string{
	FamilyGraph:      {"hv_", "nv_"},
	FamilyNonlinear:  {"nl_", ""},
	FamilyScaling:    {"sc_", ""},
	FamilyOrdinal:    {"op_", ""},
	FamilyIncrements: {"dx_", ""},
	// Extended families (outside the schema).
	FamilyRecurrenceNet: {"rn_", ""},
	FamilyOrdinalNet:    {"opn_", ""},
}

// foreignNames are function names of widely used open-source
// nonlinear-analysis libraries (Python's nolds, antropy, neurokit2 and
// ordpy; recalled from memory, not looked up), which our identifiers must
// not equal: the catalogue is our own scheme, not their interfaces merged.
var foreignNames = map[string]bool{
	"sampen": true, "corr_dim": true, "lyap_r": true, "lyap_e": true, "hurst_rs": true, "dfa": true,
	"perm_entropy": true, "spectral_entropy": true, "svd_entropy": true, "app_entropy": true,
	"sample_entropy": true, "lziv_complexity": true, "petrosian_fd": true, "katz_fd": true,
	"higuchi_fd": true, "detrended_fluctuation": true, "hjorth_params": true, "num_zerocross": true,
	"entropy_sample": true, "entropy_permutation": true, "entropy_approximate": true,
	"fractal_dfa": true, "fractal_correlation": true, "complexity_lyapunov": true, "complexity_hurst": true,
	"permutation_entropy": true, "complexity_entropy": true, "ordinal_network": true, "missing_patterns": true,
	"statistical_complexity": true, "weighted_permutation_entropy": true,
}

func TestSchemaHash(t *testing.T) {
	h := SchemaHash()
	if !regexp.MustCompile(`^[0-9a-f]{16}$`).MatchString(h) || h != SchemaHash() {
		t.Fatalf("SchemaHash %q: want 16 stable hex digits", h)
	}
}

func series(t *testing.T, system string, n int, seed uint64) []float64 {
	t.Helper()
	s, err := generators.Lookup(system)
	if err != nil {
		t.Fatal(err)
	}
	x, err := s.Generate(n, nil, rand.New(rand.NewPCG(seed, 99)))
	if err != nil {
		t.Fatal(err)
	}
	return x
}

func TestExtractIsDeterministicAndOrderFree(t *testing.T) {
	x := series(t, "henon", 3000, 1)
	a, err := Extract(x, Options{Seed: 4})
	if err != nil {
		t.Fatal(err)
	}
	b, _ := Extract(x, Options{Seed: 4, Sequential: true})
	if strings.Join(a.Names, ",") != strings.Join(Names(), ",") {
		t.Fatal("vector names differ from the catalogue order")
	}
	for i := range a.Values {
		if math.Float64bits(a.Values[i]) != math.Float64bits(b.Values[i]) || a.Reasons[i] != b.Reasons[i] {
			t.Errorf("%s: parallel %v (%q) vs sequential %v (%q)", a.Names[i], a.Values[i], a.Reasons[i], b.Values[i], b.Reasons[i])
		}
	}
}

// Every feature must be unchanged when the trace changes units
// (x → a·x + b, a > 0): DESIGN.md's "amperes vs microamperes". The series is
// standardised before any estimator sees it, so the only differences left
// are rounding in the standardisation, far below the tolerance here.
func TestExtractIsScaleAndOffsetInvariant(t *testing.T) {
	for _, sys := range []string{"henon", "ar1", "sine", "lorenz", "telegraph"} {
		x := series(t, sys, 2500, 2)
		ref, err := Extract(x, Options{Seed: 1})
		if err != nil {
			t.Fatal(err)
		}
		for _, ab := range [][2]float64{{1e-6, 3e-5}, {2.5e3, -40}, {1, 1e3}} {
			y := make([]float64, len(x))
			for i, v := range x {
				y[i] = ab[0]*v + ab[1]
			}
			got, err := Extract(y, Options{Seed: 1})
			if err != nil {
				t.Fatal(err)
			}
			for i, name := range ref.Names {
				r, g := ref.Values[i], got.Values[i]
				if math.IsNaN(r) != math.IsNaN(g) || (!math.IsNaN(r) && math.Abs(r-g) > 1e-7*math.Max(1, math.Abs(r))) {
					t.Errorf("%s, a=%g b=%g: %s = %v, was %v", sys, ab[0], ab[1], name, g, r)
				}
			}
		}
	}
}

func TestMissingFeaturesCarryReasons(t *testing.T) {
	for _, sys := range []string{"white", "sine", "logistic"} {
		v, err := Extract(series(t, sys, 300, 3), Options{})
		if err != nil {
			t.Fatal(err)
		}
		for i, name := range v.Names {
			missing := math.IsNaN(v.Values[i])
			if missing != (v.Reasons[i] != "") {
				t.Errorf("%s %s: value %v with reason %q; a missing value needs a reason and only it", sys, name, v.Values[i], v.Reasons[i])
			}
		}
	}
	// White noise has no credible Lyapunov exponent (Rosenstein et al. 1993
	// divergence curve saturates at once): missing by nature, with a reason.
	v, _ := Extract(series(t, "white", 3000, 5), Options{})
	if _, ok := v.Get("nl_div_rate"); ok {
		t.Error("white noise got a Lyapunov exponent")
	}
	if c, _ := v.Get("nl_div_ok"); c != 0 {
		t.Errorf("white noise nl_div_ok = %v, want 0", c)
	}
}

func TestValueMatchesExtract(t *testing.T) {
	x := series(t, "henon", 2000, 6)
	full, _ := Extract(x, Options{Seed: 2})
	for _, name := range []string{"nl_trev_1", "hv_tail_exprate", "op_ent_d4", "sc_fluct_a1", "nl_div_rate", "dx_kurt_ex"} {
		got, err := Value(name, x, Options{Seed: 2})
		want, _ := full.Get(name)
		if err != nil || math.Float64bits(got) != math.Float64bits(want) {
			t.Errorf("Value(%s) = %v, %v; Extract gave %v", name, got, err, want)
		}
	}
	if _, err := Value("nosuch", x, Options{}); !errors.Is(err, ErrUnknownFeature) {
		t.Errorf("unknown feature: err %v", err)
	}
	if _, err := Value("nl_div_rate", series(t, "white", 2000, 1), Options{}); err == nil || !strings.Contains(err.Error(), "no credible") {
		t.Errorf("missing feature: err %v, want the reason", err)
	}
}

func TestExtractRejectsUnusableSeries(t *testing.T) {
	long := make([]float64, 1000)
	for i := range long {
		long[i] = float64(i % 7)
	}
	nan := append([]float64{}, long...)
	nan[10] = math.NaN()
	cases := []struct {
		x    []float64
		want error
	}{
		{make([]float64, 100), ErrTooShort},
		{make([]float64, 1000), ErrConstant},
		{nan, ErrNonFinite},
	}
	for _, c := range cases {
		if _, err := Extract(c.x, Options{}); !errors.Is(err, c.want) {
			t.Errorf("err %v, want %v", err, c.want)
		}
	}
}

// TestExtendedOutsideSchema: the extended families (recurrence and ordinal
// partition networks) stay out of the schema — Names, the default vector
// and so SchemaHash are those of the schema's families alone — and
// computing them leaves every schema feature bit-identical. With Extended
// the vector holds AllNames, the network features measured; Value and
// Only reach them by name.
func TestExtendedOutsideSchema(t *testing.T) {
	for _, n := range Names() {
		if IsExtended(n) {
			t.Fatalf("schema name %s is extended", n)
		}
	}
	x := series(t, "lorenz", 3000, 2)
	a, err := Extract(x, Options{Seed: 3})
	if err != nil {
		t.Fatal(err)
	}
	b, err := Extract(x, Options{Seed: 3, Extended: true})
	if err != nil {
		t.Fatal(err)
	}
	if strings.Join(a.Names, ",") != strings.Join(Names(), ",") || strings.Join(b.Names, ",") != strings.Join(AllNames(), ",") {
		t.Fatalf("names: default %d, extended %d", len(a.Names), len(b.Names))
	}
	for i := range a.Names {
		if math.Float64bits(a.Values[i]) != math.Float64bits(b.Values[i]) || a.Reasons[i] != b.Reasons[i] {
			t.Errorf("%s changed when the extended families ran: %v → %v", a.Names[i], a.Values[i], b.Values[i])
		}
	}
	for _, e := range Extended() {
		v, ok := b.Get(e.Name)
		if !ok {
			t.Errorf("%s missing for Lorenz: %s", e.Name, b.Missing()[e.Name])
			continue
		}
		w, err := Value(e.Name, x, Options{Seed: 3})
		if err != nil || math.Float64bits(v) != math.Float64bits(w) {
			t.Errorf("%s: Extract %v, Value %v (%v)", e.Name, v, w, err)
		}
	}
	// A Lorenz attractor is a thin fractal set, dimension 2.06: its
	// transitivity dimension at a 5% rate lies far below that of white noise
	// embedded the same way (Donner et al., Eur. Phys. J. B 84 (2011) 653,
	// compare chaotic and stochastic systems).
	noise := series(t, "white", 3000, 2)
	nv, err := Extract(noise, Options{Seed: 3, Only: []string{"rn_tdim"}})
	if err != nil {
		t.Fatal(err)
	}
	dl, _ := b.Get("rn_tdim")
	dn, _ := nv.Get("rn_tdim")
	t.Logf("rn_tdim: Lorenz %.3f, white noise %.3f", dl, dn)
	if !(dl < dn) {
		t.Errorf("rn_tdim: Lorenz %.3f not below white noise %.3f", dl, dn)
	}
}
