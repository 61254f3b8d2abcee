package benchmarks

import (
	"bytes"
	"encoding/json"
	"math"
	"slices"
	"strings"
	"sync"
	"testing"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/generators"
)

// tinySystems are four reference systems of each class.
var tinySystems = []string{"logistic", "henon", "lorenz", "mackey-glass", "sine", "van-der-pol", "lorenz-periodic", "square", "white", "ar1", "fbm", "telegraph"}

// tinyOptions is a scale far below Quick: one seed per invariant at the
// stated lengths, one plan draw for each of twelve systems at 512 samples
// and two noise levels, throughput at two sizes.
func tinyOptions(seed uint64) Options {
	return Options{
		Seed:              seed,
		Seeds:             1,
		Lengths:           []int{512},
		SNRs:              []float64{math.Inf(1), 10},
		PerClass:          3,
		Systems:           tinySystems,
		ThroughputSizes:   []int{512, 1024},
		ThroughputRepeats: 1,
		SlowCall:          0.05,
		PlaneLength:       4096,
		DegreeLength:      20000,
		HoldoutPerClass:   24,
		HoldoutTrees:      5,
		HoldoutMaxLength:  1500,
	}
}

// tinyRun runs the tiny scale once per test binary.
var tinyRun = sync.OnceValues(func() (*Result, error) {
	m, err := testModel()
	if err != nil {
		return nil, err
	}
	return Run(m, tinyOptions(3))
})

func tiny(t *testing.T) *Result {
	t.Helper()
	r, err := tinyRun()
	if err != nil {
		t.Fatalf("Run: %v", err)
	}
	return r
}

// knownSources are the authors and phrases REFERENCES.md cites for the
// suite's values; every row must name one of them.
var knownSources = []string{
	"analytic", "derived", "standard result", "by construction",
	"Sprott", "Grassberger", "Peng", "Hurst", "Anis", "Luque", "Lacasa", "Núñez",
	"Bandt", "Rosso", "Amigó", "Richman", "Gillespie", "Machlup", "McWhorter",
}

func TestRunJSONHasEverySection(t *testing.T) {
	r := tiny(t)
	var buf bytes.Buffer
	if err := WriteJSON(&buf, r); err != nil {
		t.Fatal(err)
	}
	var doc map[string]json.RawMessage
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatalf("results are not valid JSON: %v", err)
	}
	for _, key := range []string{"settings", "model", "invariants", "skipped_invariants", "classification", "hvg_degrees", "complexity_entropy", "throughput", "caution"} {
		if raw, ok := doc[key]; !ok || string(raw) == "null" || string(raw) == "[]" {
			t.Errorf("section %q missing or empty", key)
		}
	}

	// Invariants: every check ran, and every row names its source and the
	// source of its tolerance.
	if len(r.Invariants) != len(InvariantIDs()) {
		t.Errorf("%d invariant rows, want %d", len(r.Invariants), len(InvariantIDs()))
	}
	var rows []map[string]any
	if err := json.Unmarshal(doc["invariants"], &rows); err != nil {
		t.Fatal(err)
	}
	for i, row := range rows {
		id, _ := row["id"].(string)
		src, _ := row["source"].(string)
		if !slices.ContainsFunc(knownSources, func(k string) bool { return strings.Contains(src, k) }) {
			t.Errorf("%s: source %q names no reference of REFERENCES.md", id, src)
		}
		if ts, _ := row["tolerance_source"].(string); ts == "" {
			t.Errorf("%s: no tolerance source", id)
		}
		inv := r.Invariants[i]
		switch inv.Check {
		case CheckValue:
			tol, ok := row["tolerance"].(float64)
			if !ok || tol < 0 {
				t.Errorf("%s: tolerance %v, want a number ≥ 0", id, row["tolerance"])
			}
			if inv.ToleranceKind != "absolute" && inv.ToleranceKind != "relative" {
				t.Errorf("%s: tolerance kind %q", id, inv.ToleranceKind)
			}
			if e := float64(inv.Estimate.Median) - float64(inv.Value); math.Abs(e-float64(inv.Error)) > 1e-12 {
				t.Errorf("%s: error %v, median − value = %v", id, inv.Error, e)
			}
		case CheckAbsent:
			if !math.IsNaN(float64(inv.Tolerance)) {
				t.Errorf("%s: an absent check has no numeric tolerance, got %v", id, inv.Tolerance)
			}
		default:
			t.Errorf("%s: check kind %q", id, inv.Check)
		}
		if len(inv.Runs) != len(inv.Lengths)*inv.Seeds {
			t.Errorf("%s: %d runs, want %d lengths × %d seeds", id, len(inv.Runs), len(inv.Lengths), inv.Seeds)
		}
		if len(inv.Failures) > 0 {
			t.Errorf("%s: failures %v", id, inv.Failures)
		}
	}

	// Classification: the grid is complete and the counts add up.
	c := r.Classification
	if len(c.Cells) != len(c.Lengths)*len(c.SNRs) || len(c.ByLength) != 1 || len(c.BySNR) != 2 {
		t.Fatalf("grid %d cells, %d lengths, %d SNRs", len(c.Cells), len(c.ByLength), len(c.BySNR))
	}
	if c.PlanSeed != PlanSeedOffset+3 || c.PlanSeed == 1 {
		t.Errorf("plan seed %d, want %d (never the training seed 1)", c.PlanSeed, PlanSeedOffset+3)
	}
	if len(c.Failures) > 0 {
		t.Errorf("classification failures: %v", c.Failures)
	}
	total := 0
	for _, cell := range c.Cells {
		n := 0
		for _, row := range cell.Confusion {
			for _, v := range row {
				n += v
			}
		}
		if n != cell.Series {
			t.Errorf("cell %d/%s: confusion holds %d series, score says %d", cell.Length, cell.SNRLabel, n, cell.Series)
		}
		total += n
	}
	if total != c.Overall.Series || total != len(c.Series) {
		t.Errorf("cells hold %d series, overall %d, series list %d", total, c.Overall.Series, len(c.Series))
	}
	// Every selected system is screened at every SNR (one draw each at
	// PerClass 3), less the draws the plan or the generator dropped.
	if want := len(tinySystems) * len(c.SNRs); total+c.Dropped < want {
		t.Errorf("%d series screened + %d dropped, want at least %d", total, c.Dropped, want)
	}
	sysTotal := 0
	for _, s := range c.Systems {
		sysTotal += s.Series
	}
	if sysTotal != total {
		t.Errorf("per-system counts add to %d, want %d", sysTotal, total)
	}

	// Throughput is present, marked machine-dependent, with every
	// operation timed at every size.
	tp := r.Throughput
	if !tp.MachineDependent || !strings.Contains(string(doc["throughput"]), `"machine_dependent": true`) {
		t.Error("throughput not marked machine-dependent")
	}
	for _, op := range tp.Operations {
		if len(op.Points) != len(tp.Sizes) {
			t.Errorf("%s: %d timings, want %d (failures %v)", op.Name, len(op.Points), len(tp.Sizes), op.Failures)
		}
		for _, p := range op.Points {
			if !(p.Seconds > 0) {
				t.Errorf("%s n=%d: %v s", op.Name, p.N, p.Seconds)
			}
		}
	}
	if names := []string{"hvg", "nvg", "features", "classify"}; len(tp.Operations) != len(names) {
		t.Errorf("%d operations timed, want %v", len(tp.Operations), names)
	}
	if len(r.Plane.Points) != len(classifier.ReferenceSystems()) {
		t.Errorf("%d systems in the plane (failures %v), want %d", len(r.Plane.Points), r.Plane.Failures, len(classifier.ReferenceSystems()))
	}
}

// TestRunDeterministic runs a reduced suite twice with the same seed and
// different worker counts: everything but the timings must be identical
// byte for byte; another seed must change the series.
func TestRunDeterministic(t *testing.T) {
	m := model(t)
	base := Options{
		Seed: 7, Seeds: 2, Invariants: []string{"nl_div_rate/henon", "sc_fluct_a1/fgn@h=0.7", "hv_tail_exprate/white", "nv_tail_powexp/fbm@h=0.7"},
		Lengths: []int{512, 700}, SNRs: []float64{math.Inf(1), 20}, PerClass: 3,
		Systems:     []string{"henon", "sine", "telegraph"},
		PlaneLength: 2000, DegreeLength: 5000, SkipThroughput: true,
		HoldoutPerClass: 9, HoldoutTrees: 3, HoldoutMaxLength: 800,
	}
	encode := func(o Options) string {
		r, err := Run(m, o)
		if err != nil {
			t.Fatal(err)
		}
		r.Elapsed = nil // wall time: the only machine-dependent part left
		var buf bytes.Buffer
		if err := WriteJSON(&buf, r); err != nil {
			t.Fatal(err)
		}
		return buf.String()
	}
	a := base
	a.Workers = 1
	b := base
	b.Workers = 3
	ja, jb := encode(a), encode(b)
	if ja != jb {
		t.Fatalf("same seed, different results (1 vs 3 workers):\n%s", firstDiff(ja, jb))
	}
	c := base
	c.Seed = 8
	if jc := encode(c); jc == ja {
		t.Error("seeds 7 and 8 gave identical results")
	}
}

func firstDiff(a, b string) string {
	la, lb := strings.Split(a, "\n"), strings.Split(b, "\n")
	for i := 0; i < min(len(la), len(lb)); i++ {
		if la[i] != lb[i] {
			return "line " + la[i] + "\n  vs " + lb[i]
		}
	}
	return "lengths differ"
}

func TestRunNeedsModel(t *testing.T) {
	if _, err := Run(nil, Options{}); err != ErrNoModel {
		t.Errorf("Run without a model: %v, want ErrNoModel", err)
	}
}

func TestOptionsResolved(t *testing.T) {
	o, err := Options{}.Resolved()
	if err != nil {
		t.Fatal(err)
	}
	if o.Scale != Quick || o.Seeds != 3 || len(o.Lengths) != 2 || o.ThroughputSizes[len(o.ThroughputSizes)-1] != 100000 {
		t.Errorf("zero Options resolve to %+v, want the Quick preset", o)
	}
	f, err := Options{Scale: Full, PerClass: 5}.Resolved()
	if err != nil {
		t.Fatal(err)
	}
	if f.PerClass != 5 || f.Seeds != 8 || f.ThroughputSizes[len(f.ThroughputSizes)-1] != 1000000 || len(f.SNRs) != 4 {
		t.Errorf("Full with PerClass 5 resolves to %+v", f)
	}
	for _, bad := range []Options{
		{Scale: "huge"},
		{Lengths: []int{100}},
		{SNRs: []float64{math.NaN()}},
		{Systems: []string{"no-such-system"}},
		{Invariants: []string{"no/such"}},
		{LengthFactors: []float64{0}},
		{ThroughputSizes: []int{10}},
	} {
		if _, err := bad.Resolved(); err == nil {
			t.Errorf("%+v accepted", bad)
		}
	}
}

// TestInvariantCatalogue: IDs are unique, every spec's registry values are
// found, and every registry invariant the suite leaves out has a stated
// reason, so a new registry invariant cannot be skipped silently.
func TestInvariantCatalogue(t *testing.T) {
	specs, err := invariantSpecs()
	if err != nil {
		t.Fatal(err)
	}
	seen := map[string]bool{}
	for _, s := range specs {
		if seen[s.id] {
			t.Errorf("duplicate check %s", s.id)
		}
		seen[s.id] = true
		if s.source == "" || s.tolSource == "" || s.estimator == "" || s.n < 256 {
			t.Errorf("%s: incomplete spec", s.id)
		}
		if math.IsNaN(s.value) {
			t.Errorf("%s: no value", s.id)
		}
	}
	for _, sk := range skippedInvariants(specs) {
		if _, ok := skipReasons[sk.Invariant]; !ok {
			t.Errorf("registry invariant %s of %s is neither checked nor skipped with a reason", sk.Invariant, sk.System)
		}
	}
	// The per-sample conversion of a flow's exponent: λ·dt with the
	// registry's dt (Lorenz: 0.9056 per time unit, Sprott (2003), confirmed: tkf/LyapunovExponents.jl src/examples/lorenz_63.jl).
	sys, _ := generators.Lookup("lorenz")
	dt, _ := sys.SampleInterval(nil)
	for _, s := range specs {
		if s.id == "nl_div_rate/lorenz" && math.Abs(s.value-0.9056*dt) > 1e-15 {
			t.Errorf("lorenz per-sample value %v, want 0.9056 × %v", s.value, dt)
		}
	}
}
