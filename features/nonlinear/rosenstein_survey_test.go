package nonlinear

import (
	"errors"
	"flag"
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// The survey behind the thresholds of Lyapunov's credibility criterion
// takes a few minutes, so it runs only on request:
//
//	go test ./features/nonlinear -run TestLyapunovSurvey -v -timeout 30m -lyap.survey
var (
	lyapSurvey     = flag.Bool("lyap.survey", false, "run the Lyapunov credibility survey (minutes)")
	lyapSurveySeed = flag.Uint64("lyap.seed", 101, "first of the five noise seeds of the Lyapunov survey")
)

// lyapFeatureRun runs Lyapunov as the feature vector does
// (features/family_nonlinear.go): Cao's embedding on at most 300 references
// of the first 10^4 samples up to dimension 8, 1000 divergence references.
func lyapFeatureRun(x []float64) (*LyapunovResult, error) {
	emb, err := Embed(x, EmbedOptions{MaxRef: 300, MaxPoints: 10000, MaxDim: 8})
	if err != nil {
		return nil, err
	}
	return Lyapunov(x, LyapunovOptions{Embed: emb.Fixed(), MaxRef: 1000})
}

// surveyFlows lists the flows with a dt parameter and their characteristic
// oscillation period T in time units (Rössler: one loop ≈ 6 (generator
// documentation); the others from the delay the mutual information picks,
// T ≈ 4τ·dt). The survey samples every flow at T/200 … T/10, from 200 to
// 10 samples per oscillation.
var surveyFlows = []struct {
	name   string
	period float64
}{
	{"rossler", 6}, {"hyper-rossler", 7.6}, {"lorenz", 0.75}, {"chua", 1.6},
	{"mackey-glass", 44}, {"duffing", 5.2}, {"lorenz96", 1.2},
}

// TestLyapunovSurvey measures the false "credible" rate on every stochastic
// and regular reference generator (2000, 5000, 20000 samples; clean and
// 20 dB SNR; five seeds from -lyap.seed) and the credible rate and error of
// every chaotic generator, maps at defaults and flows over their sampling
// range, against the λ1 the generator integrates from its equations
// (generators.System.Lyapunov; Benettin et al., Meccanica 15 (1980) 9).
// The thresholds were set on seeds 1–5; random walks passing on seeds
// 101–105 led to the decorrelation criterion; seeds 201–205 were kept
// aside as a final check. It fails when more than 2% of the noise or of
// the regular series get a credible exponent, or when fewer than 90% of
// the clean low-dimensional flows sampled at 25–100 samples per
// oscillation do.
func TestLyapunovSurvey(t *testing.T) {
	if !*lyapSurvey {
		t.Skip("survey runs with -lyap.survey")
	}
	type tally struct{ n, cred int }
	count := func(m map[string]*tally, k string, ok bool) {
		if m[k] == nil {
			m[k] = &tally{}
		}
		m[k].n++
		if ok {
			m[k].cred++
		}
	}
	snrs := []float64{math.Inf(1), 20}
	noise, regular := map[string]*tally{}, map[string]*tally{}
	var falses []string
	for _, sys := range generators.All() {
		if sys.DefaultClass == generators.Chaotic {
			continue
		}
		for _, n := range []int{2000, 5000, 20000} {
			for _, snr := range snrs {
				for seed := *lyapSurveySeed; seed < *lyapSurveySeed+5; seed++ {
					x, err := sys.GenerateNoisy(n, nil, snr, rand.New(rand.NewPCG(seed, 0x5eed)))
					if err != nil {
						t.Fatal(err)
					}
					r, err := lyapFeatureRun(x)
					ok := err == nil && r.Credible
					if sys.DefaultClass == generators.Stochastic {
						count(noise, sys.Name, ok)
					} else {
						count(regular, sys.Name, ok)
					}
					if ok {
						falses = append(falses, fmt.Sprintf("%s n=%d snr=%g seed=%d: λ = %.4g, fit %d..%d", sys.Name, n, snr, seed, r.Lambda, r.FitStart, r.FitEnd))
					}
				}
			}
		}
	}
	rate := func(m map[string]*tally) (int, int) {
		var c, n int
		for _, v := range m {
			c += v.cred
			n += v.n
		}
		return c, n
	}
	nc, nn := rate(noise)
	rc, rn := rate(regular)
	t.Logf("stochastic: %d of %d credible (%.1f%%); regular: %d of %d", nc, nn, 100*float64(nc)/float64(nn), rc, rn)
	for _, f := range falses {
		t.Logf("  credible: %s", f)
	}
	if float64(nc) > 0.02*float64(nn) || float64(rc) > 0.02*float64(rn) {
		t.Errorf("false credible rate above 2%%: noise %d/%d, regular %d/%d", nc, nn, rc, rn)
	}

	type chaosRow struct {
		name      string
		spp       float64 // samples per oscillation (flows), 0 for maps
		snr       float64
		cred      bool
		rel, want float64
		why       string
	}
	var rows []chaosRow
	run := func(sys *generators.System, set map[string]float64, spp float64, label string) {
		sp, err := sys.Lyapunov(set)
		if err != nil {
			t.Fatal(err)
		}
		dt, err := sys.SampleInterval(set)
		if err != nil {
			t.Fatal(err)
		}
		want := sp.Exponents[0] * dt
		for _, n := range []int{5000, 20000} {
			for _, snr := range []float64{math.Inf(1), 30, 20} {
				x, err := sys.GenerateNoisy(n, set, snr, rand.New(rand.NewPCG(7, 0x5eed)))
				if errors.Is(err, generators.ErrDiverged) {
					t.Logf("%s: %v (skipped)", label, err)
					continue
				}
				if err != nil {
					t.Fatal(err)
				}
				r, err := lyapFeatureRun(x)
				row := chaosRow{name: fmt.Sprintf("%s n=%d", label, n), spp: spp, snr: snr, want: want, rel: math.NaN()}
				switch {
				case err != nil:
					row.why = err.Error()
				case r.Credible:
					row.cred, row.rel = true, r.Lambda/want-1
				default:
					row.why = r.Reason
				}
				rows = append(rows, row)
			}
		}
	}
	for _, sys := range generators.All() {
		if sys.DefaultClass != generators.Chaotic {
			continue
		}
		period := 0.0
		for _, f := range surveyFlows {
			if f.name == sys.Name {
				period = f.period
			}
		}
		if period == 0 {
			run(sys, nil, 0, sys.Name)
			continue
		}
		for _, spp := range []float64{200, 100, 50, 25, 10} {
			dt := period / spp
			run(sys, map[string]float64{"dt": dt}, spp, fmt.Sprintf("%s dt=%.3g", sys.Name, dt))
		}
	}
	type agg struct {
		n, cred int
		errs    []float64
	}
	groups := map[string]*agg{}
	for _, r := range rows {
		kind := "maps"
		switch {
		case highDimensional(r.name):
			kind = "high-dimensional flows"
		case r.spp > 0:
			kind = "flows"
		}
		k := fmt.Sprintf("%s snr=%g", kind, r.snr)
		if groups[k] == nil {
			groups[k] = &agg{}
		}
		g := groups[k]
		g.n++
		if r.cred {
			g.cred++
			g.errs = append(g.errs, r.rel)
		}
		t.Logf("%-34s snr=%-4g credible=%-5v λ/λ1 − 1 = %+.2f (λ1 = %.4g per sample) %s", r.name, r.snr, r.cred, r.rel, r.want, r.why)
	}
	var keys []string
	for k := range groups {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		g := groups[k]
		abs := make([]float64, len(g.errs))
		var bias float64
		for i, e := range g.errs {
			abs[i] = math.Abs(e)
			bias += e
		}
		sort.Float64s(abs)
		med := math.NaN()
		if len(abs) > 0 {
			med = abs[len(abs)/2]
			bias /= float64(len(abs))
		}
		t.Logf("%-32s credible %3d of %3d, median |error| %.2f, mean error %+.2f", k, g.cred, g.n, med, bias)
	}
	var mid, midCred int
	for _, r := range rows {
		if r.spp >= 25 && r.spp <= 100 && math.IsInf(r.snr, 1) && !highDimensional(r.name) {
			mid++
			if r.cred {
				midCred++
			}
		}
	}
	t.Logf("clean low-dimensional flows at 25–100 samples per oscillation: %d of %d credible", midCred, mid)
	if float64(midCred) < 0.9*float64(mid) {
		t.Errorf("only %d of %d clean flows credible, want ≥ 90%%", midCred, mid)
	}
}

// highDimensional reports whether a survey row is one of the flows whose
// attractor dimension exceeds what a few thousand samples resolve
// (hyperchaotic Rössler, Lorenz-96 with ten sites).
func highDimensional(name string) bool {
	return strings.HasPrefix(name, "hyper-rossler") || strings.HasPrefix(name, "lorenz96")
}
