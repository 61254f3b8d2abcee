package features

import (
	"errors"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/networks"
)

// A trace longer than Options.Window is measured window by window: each
// window as a trace of its own with the seed drawn for it, and each feature
// is the median over the windows that measured it (rule documented on
// Options.Window and Vector.Spread). Rebuilt here from per-window Extract
// calls on the stretches networks.Windows gives.
func TestLongTraceIsMeasuredInWindows(t *testing.T) {
	x := series(t, "henon", 5000, 11)
	const window = 2048
	got, err := Extract(x, Options{Seed: 3, Window: window})
	if err != nil {
		t.Fatal(err)
	}
	ws := networks.Windows(len(x), window)
	if len(ws) != 3 || got.Windows != 3 || got.WindowLength != 1667 || got.N != 5000 {
		t.Fatalf("%d windows planned; vector says %d windows of %d, n = %d; want 3 of 1667 (⌈5000/2048⌉ = 3 windows of 1666–1667), n = 5000",
			len(ws), got.Windows, got.WindowLength, got.N)
	}
	seeds := rand.New(rand.NewPCG(3, windowSeedStream))
	per := make([]Vector, len(ws))
	for i, w := range ws {
		per[i], err = Extract(x[w.Start:w.End], Options{Seed: seeds.Uint64(), Window: -1})
		if err != nil {
			t.Fatal(err)
		}
	}
	whole, err := Extract(x, Options{Seed: 3, Window: -1})
	if err != nil {
		t.Fatal(err)
	}
	differs := 0
	for j, name := range got.Names {
		var vals []float64
		for _, v := range per {
			if v.Reasons[j] == "" {
				vals = append(vals, v.Values[j])
			}
		}
		sp := got.Spread[j]
		if sp.Measured != len(vals) {
			t.Errorf("%s: measured in %d windows, spread says %d", name, len(vals), sp.Measured)
		}
		if 2*len(vals) < len(ws) {
			if !math.IsNaN(got.Values[j]) || got.Reasons[j] == "" {
				t.Errorf("%s: measured in %d of 3 windows, got %v (%q), want missing with a reason", name, len(vals), got.Values[j], got.Reasons[j])
			}
			continue
		}
		slices.Sort(vals)
		want := vals[len(vals)/2]
		if len(vals)%2 == 0 {
			want = (vals[len(vals)/2-1] + vals[len(vals)/2]) / 2
		}
		if math.Float64bits(got.Values[j]) != math.Float64bits(want) || got.Reasons[j] != "" {
			t.Errorf("%s = %v (%q), want the median %v of %v", name, got.Values[j], got.Reasons[j], want, vals)
		}
		if sp.Min != vals[0] || sp.Max != vals[len(vals)-1] {
			t.Errorf("%s: spread %v…%v, want %v…%v", name, sp.Min, sp.Max, vals[0], vals[len(vals)-1])
		}
		if whole.Values[j] != got.Values[j] {
			differs++
		}
	}
	if differs < len(got.Names)/2 {
		t.Errorf("only %d of %d features differ from the whole-trace vector: windowing did not take effect", differs, len(got.Names))
	}
	again, _ := Extract(x, Options{Seed: 3, Window: window, Sequential: true})
	if vectorDigest(t, again) != vectorDigest(t, got) {
		t.Error("windowed vector differs between a parallel and a sequential run")
	}
}

// At the default window a trace of 2^20 + 1 samples is measured in two
// windows: the bounded-work path the features command takes on long
// traces. One cheap feature is asked for, so the test stays quick.
func TestDefaultWindowCutsLongTraces(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	x := make([]float64, DefaultWindow+1)
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	v, err := Extract(x, Options{Only: []string{"op_ent_d4"}})
	if err != nil {
		t.Fatal(err)
	}
	if v.Windows != 2 || v.WindowLength != DefaultWindow/2+1 {
		t.Fatalf("%d windows of %d, want 2 of %d", v.Windows, v.WindowLength, DefaultWindow/2+1)
	}
	// Gaussian white noise: every ordinal pattern is equally likely, so the
	// normalised permutation entropy is 1 (Bandt & Pompe, Phys. Rev. Lett.
	// 88 (2002) 174102) up to the plug-in estimator's bias, (K − 1)/(2N)
	// nats for K patterns in N samples (Miller 1955; as in the R entropy package's entropy.MillerMadow, rdrr.io/cran/entropy/src/R/entropy.MillerMadow.R): 23/(2·5·10^5)
	// / ln 24 ≈ 7·10^-6 here.
	if pe, ok := v.Get("op_ent_d4"); !ok || math.Abs(pe-1) > 1e-4 {
		t.Errorf("op_ent_d4 %v (present %v), want 1 within 1e-4", pe, ok)
	}
	if v.Reasons[slices.Index(v.Names, "sc_fluct_a1")] != "not requested" {
		t.Errorf("an unrequested feature's reason is %q, want \"not requested\"", v.Reasons[slices.Index(v.Names, "sc_fluct_a1")])
	}
}

// A feature is reported when at least half of the windows measured it
// (rule of Vector.Spread); flat windows measure nothing.
func TestWindowsNeedAMajority(t *testing.T) {
	noise := series(t, "white", 3000, 8)
	oneFlat := slices.Clone(noise)
	clear(oneFlat[1000:2000]) // window 2 of 3 is constant
	v, err := Extract(oneFlat, Options{Window: 1000})
	if err != nil {
		t.Fatal(err)
	}
	i := slices.Index(v.Names, "hv_deg_mean")
	if v.Spread[i].Measured != 2 || math.IsNaN(v.Values[i]) {
		t.Errorf("one flat window of 3: hv_deg_mean %v measured in %d windows, want a value from 2", v.Values[i], v.Spread[i].Measured)
	}
	twoFlat := slices.Clone(oneFlat)
	clear(twoFlat[2000:])
	v, err = Extract(twoFlat, Options{Window: 1000})
	if err != nil {
		t.Fatal(err)
	}
	if !math.IsNaN(v.Values[i]) || !strings.Contains(v.Reasons[i], "missing in 2 of 3 windows") || !errors.Is(v.Causes[i], ErrConstant) {
		t.Errorf("two flat windows of 3: hv_deg_mean %v, reason %q, cause %v; want missing, naming 2 of 3 windows, ErrConstant",
			v.Values[i], v.Reasons[i], v.Causes[i])
	}
}

// A visibility graph past the edge budget leaves its features missing with
// the budget error as the cause, so the command line can name its flag.
func TestEdgeBudgetIsTheCause(t *testing.T) {
	x := series(t, "brownian", 2000, 9)
	// The HVG has fewer than 2n = 4000 edges (Luque et al. 2009: mean
	// degree < 4); the NVG of a random walk has several times more.
	v, err := Extract(x, Options{MaxEdges: 5000})
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := v.Get("hv_deg_mean"); !ok {
		t.Error("hv_deg_mean missing under a budget above 2n edges")
	}
	i := slices.Index(v.Names, "nv_deg_mean")
	var eb *networks.EdgeBudgetError
	if !math.IsNaN(v.Values[i]) || !errors.As(v.Causes[i], &eb) || eb.Budget != 5000 || eb.Nodes != 2000 || !errors.Is(v.Causes[i], networks.ErrTooManyEdges) {
		t.Fatalf("nv_deg_mean %v, cause %v; want missing because of the 5000-edge budget on 2000 nodes", v.Values[i], v.Causes[i])
	}
	if j := slices.Index(v.Names, "sc_fluct_a1"); v.Causes[j] != nil || v.Reasons[j] != "" {
		t.Errorf("sc_fluct_a1: cause %v, reason %q; want none", v.Causes[j], v.Reasons[j])
	}
}

// Progress counts one step per feature family per window.
func TestProgressCountsFamiliesPerWindow(t *testing.T) {
	x := series(t, "ar1", 3000, 2)
	for _, c := range []struct{ window, steps int }{{-1, len(families)}, {1024, 3 * len(families)}} {
		var calls [][2]int
		_, err := Extract(x, Options{Window: c.window, Progress: func(done, total int) { calls = append(calls, [2]int{done, total}) }})
		if err != nil {
			t.Fatal(err)
		}
		if len(calls) != c.steps {
			t.Fatalf("window %d: %d progress calls, want %d", c.window, len(calls), c.steps)
		}
		for k, cl := range calls {
			if cl != [2]int{k + 1, c.steps} {
				t.Fatalf("window %d: call %d is %v, want [%d %d]", c.window, k, cl, k+1, c.steps)
			}
		}
	}
}

func TestWindowTooShort(t *testing.T) {
	x := series(t, "white", 2000, 1)
	if _, err := Extract(x, Options{Window: 2*MinLength - 1}); !errors.Is(err, ErrWindow) {
		t.Errorf("window %d: err %v, want ErrWindow", 2*MinLength-1, err)
	}
	if _, err := Extract(x, Options{Window: 2 * MinLength, Only: []string{"op_ent_d4"}}); err != nil {
		t.Errorf("window %d: %v", 2*MinLength, err)
	}
}
