package report

import (
	"bytes"
	"encoding/xml"
	"errors"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"runtime"
	"slices"
	"strings"
	"sync"
	"testing"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/features/surrogate"
	"github.com/tracesift/tracesift/generators"
	"github.com/tracesift/tracesift/trace"
)

// testModel is a small forest trained once per test binary: 40 series per
// class of at most 3000 samples, 40 trees (the embedded default model is
// trained by the lead later and may be empty in a checkout).
var testModel = sync.OnceValues(func() (*classifier.Model, error) {
	ds, _, err := classifier.BuildReference(classifier.ReferenceOptions{PerClass: 40, MaxLength: 3000, Seed: 5}, features.Options{})
	if err != nil {
		return nil, err
	}
	m, err := classifier.Train(ds, classifier.Config{Trees: 40, Seed: 5,
		Schema: classifier.Schema{Version: features.SchemaVersion, Hash: features.SchemaHash()}})
	if err != nil {
		return nil, err
	}
	m.Source = "test model (40 trees)"
	return m, nil
})

func model(t testing.TB) *classifier.Model {
	t.Helper()
	m, err := testModel()
	if err != nil {
		t.Fatalf("training the test model: %v", err)
	}
	return m
}

// henonTrace is a Hénon x series dressed as a drain-current capture: 3000
// samples at 10 kHz, in amperes around 5 µA.
func henonTrace(t testing.TB, n int, scale, offset float64) trace.Trace {
	t.Helper()
	s, err := generators.Lookup("henon")
	if err != nil {
		t.Fatal(err)
	}
	x, err := s.Generate(n, nil, rand.New(rand.NewPCG(11, 12)))
	if err != nil {
		t.Fatal(err)
	}
	for i := range x {
		x[i] = scale*x[i] + offset
	}
	return trace.Trace{Values: x, Interval: 1e-4, TimeUnit: "s", Column: "Id", Unit: "A", Source: "henon-demo.csv"}
}

func render(t testing.TB, tr trace.Trace, opts Options) ([]byte, *Report) {
	t.Helper()
	r, err := Build(tr, model(t), opts)
	if err != nil {
		t.Fatalf("Build: %v", err)
	}
	var b bytes.Buffer
	if err := r.WriteHTML(&b); err != nil {
		t.Fatalf("WriteHTML: %v", err)
	}
	return b.Bytes(), r
}

// The shared report of the Hénon trace, rendered once for the checks below.
var henonReport struct {
	once sync.Once
	html []byte
	rep  *Report
}

func henonHTML(t *testing.T) ([]byte, *Report) {
	henonReport.once.Do(func() {
		henonReport.html, henonReport.rep = render(t, henonTrace(t, 3000, 1e-6, 5e-6), Options{Seed: 3, Generator: "tracesift test"})
	})
	if henonReport.html == nil {
		t.Fatal("the shared report failed to render")
	}
	return henonReport.html, henonReport.rep
}

// figInfo is one figure of a page: its id, its nested panels, and the
// elements drawn inside the clipped plot areas.
type figInfo struct {
	id            string
	panels, drawn int
}

// scanPage reads a page as strict XML (no auto-closing, no HTML entities:
// XHTML syntax only) and checks what every page must hold to: unique
// ids, nothing that would load from outside the file (inline scripts
// allowed only when inlineScript), no external CSS. It returns the ids
// and the figures (top-level <svg class="fig">), and calls start for
// every element with the names of the elements it is in.
func scanPage(t *testing.T, html []byte, inlineScript bool, start func(e xml.StartElement, in []string)) (map[string]bool, []figInfo) {
	t.Helper()
	ids := map[string]bool{}
	var figs []figInfo
	var stack []string
	clipDepth := 0
	d := xml.NewDecoder(bytes.NewReader(html))
	d.Strict = true
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("not well-formed XML: %v", err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			for _, a := range e.Attr {
				if a.Name.Local == "id" {
					if ids[a.Value] {
						t.Errorf("duplicate id %q", a.Value)
					}
					ids[a.Value] = true
				}
			}
			checkNoExternal(t, e, inlineScript)
			if start != nil {
				start(e, stack)
			}
			inSVG := slices.Contains(stack, "svg")
			switch {
			case e.Name.Local == "svg" && !inSVG && hasClass(e, "fig"):
				figs = append(figs, figInfo{id: strings.TrimSuffix(attr(e, "aria-labelledby"), "-t")})
			case e.Name.Local == "svg" && inSVG && len(figs) > 0:
				figs[len(figs)-1].panels++
			case clipDepth > 0:
				clipDepth++
				switch e.Name.Local {
				case "path", "rect", "circle":
					figs[len(figs)-1].drawn++
				}
			case e.Name.Local == "g" && hasAttr(e, "clip-path") && len(figs) > 0:
				clipDepth = 1
			}
			stack = append(stack, e.Name.Local)
		case xml.EndElement:
			stack = stack[:len(stack)-1]
			if clipDepth > 0 {
				clipDepth--
			}
		case xml.CharData:
			if bytes.Contains(e, []byte("@import")) {
				t.Error("style imports an external sheet")
			}
			if bytes.Contains(e, []byte("url(")) && !bytes.Contains(e, []byte("url(#")) {
				t.Error("CSS references an external url()")
			}
		}
	}
	for _, f := range figs {
		if f.drawn == 0 {
			t.Errorf("figure %q draws nothing in its plot area", f.id)
		}
	}
	return ids, figs
}

// attr returns the value of the attribute name ("" when absent).
func attr(e xml.StartElement, name string) string {
	for _, a := range e.Attr {
		if a.Name.Local == name {
			return a.Value
		}
	}
	return ""
}

func TestReportIsWellFormedAndComplete(t *testing.T) {
	html, rep := henonHTML(t)
	// Every figure draws its data inside the group clipped to the plot
	// area (scanPage counts what is drawn there).
	ids, figs := scanPage(t, html, false, nil)
	svgs := len(figs)
	for _, id := range Sections() {
		if !ids[id] {
			t.Errorf("section %q missing", id)
		}
	}
	// Figures: probabilities, trace, increments, HVG, NVG, clustering, C(k),
	// plane, surrogates.
	if svgs != 9 {
		t.Errorf("%d figures, want 9", svgs)
	}
	for _, want := range []string{Caution, "hv_tail_exprate", "nl_trev_1", "Hénon", "fitted Gaussian", "(1/3)(2/3)^(k−2)", "tracesift test",
		"Determinism test", "nl_fc_rho_tau", "nl_trev_tau", "Surrogate test of determinism (section 6):", "Model and test."} {
		if !bytes.Contains(html, []byte(esc(want))) {
			t.Errorf("report does not mention %q", want)
		}
	}
	// The methods list every recording warning with its rule and measured
	// limit (classifier.RecordingWarningLimits), and the verdict's
	// warnings point there.
	if !ids["warning-limits"] || !bytes.Contains(html, []byte(`href="#warning-limits"`)) {
		t.Error("no link to the recording-warning limits")
	}
	for _, l := range classifier.RecordingWarningLimits() {
		for _, s := range []string{"<td class=\"code\">" + esc(l.Warning) + "</td>", esc(l.Rule), esc(l.Limit)} {
			if !bytes.Contains(html, []byte(s)) {
				t.Errorf("report lacks %q", s)
			}
		}
	}
	if len(rep.Failures) != 0 {
		t.Errorf("panels failed on a clean Hénon trace: %v", rep.Failures)
	}
	for _, p := range []string{"http://", "https://", "<script", "<link"} {
		if bytes.Contains(html, []byte(p)) {
			t.Errorf("report contains %q", p)
		}
	}
}

func hasAttr(e xml.StartElement, name string) bool {
	for _, a := range e.Attr {
		if a.Name.Local == name {
			return true
		}
	}
	return false
}

func hasClass(e xml.StartElement, c string) bool {
	for _, a := range e.Attr {
		if a.Name.Local == "class" && strings.Contains(" "+a.Value+" ", " "+c+" ") {
			return true
		}
	}
	return false
}

// checkNoExternal fails on any attribute that would make a browser fetch
// something: link elements, scripts (inline ones allowed when
// inlineScript), and src/href-like attributes that are not in-document
// fragments.
func checkNoExternal(t *testing.T, e xml.StartElement, inlineScript bool) {
	t.Helper()
	switch e.Name.Local {
	case "link", "iframe", "object", "embed", "img", "image", "use":
		t.Errorf("element <%s> in a self-contained report", e.Name.Local)
	case "script":
		if !inlineScript {
			t.Errorf("element <%s> in a self-contained report", e.Name.Local)
		}
	}
	for _, a := range e.Attr {
		switch a.Name.Local {
		case "href", "src", "srcset", "data", "action", "poster", "background":
			if !strings.HasPrefix(a.Value, "#") && !strings.HasPrefix(a.Value, "data:") {
				t.Errorf("<%s %s=%q> points outside the document", e.Name.Local, a.Name.Local, a.Value)
			}
		}
		if strings.Contains(a.Value, "url(") && !strings.Contains(a.Value, "url(#") {
			t.Errorf("<%s %s=%q> references an external url()", e.Name.Local, a.Name.Local, a.Value)
		}
	}
}

func TestReportIsDeterministic(t *testing.T) {
	// The determinism test with its default 39 surrogates, plus two feature
	// statistics with 79 surrogates (the least for Holm over two at
	// α = 0.05), keep this fast; the default report is rendered once by
	// the other tests.
	var mu sync.Mutex
	var lastDone, lastTotal int
	opts := Options{Seed: 3, Stats: []string{"nl_trev_1", "hv_tail_exprate"}, Progress: func(done, total int) {
		mu.Lock()
		defer mu.Unlock()
		lastDone, lastTotal = max(lastDone, done), total
	}}
	tr := henonTrace(t, 3000, 1e-6, 5e-6)
	a, ra := render(t, tr, opts)
	if ra.Surrogates.Count != 79 || ra.Determinism.Count != 39 {
		t.Errorf("%d and %d surrogates, want 79 = ⌈2·2/0.05 − 1⌉ and 39 = ⌈2/0.05 − 1⌉", ra.Surrogates.Count, ra.Determinism.Count)
	}
	if lastDone != 118 || lastTotal != 118 {
		t.Errorf("progress reached %d of %d, want 118 of 118 (both tests)", lastDone, lastTotal)
	}
	if !bytes.Contains(a, []byte("Further statistics")) {
		t.Error("the feature tests are not shown")
	}
	// Same input and seed on one thread: the parallel parts must place their
	// results by index, so the bytes cannot depend on the thread count.
	opts.Progress = nil
	prev := runtime.GOMAXPROCS(1)
	b, _ := render(t, tr, opts)
	runtime.GOMAXPROCS(prev)
	if !bytes.Equal(a, b) {
		i := 0
		for i < len(a) && i < len(b) && a[i] == b[i] {
			i++
		}
		lo := max(0, i-80)
		t.Fatalf("two renderings differ at byte %d:\n%q\nvs\n%q", i, a[lo:min(len(a), i+80)], b[lo:min(len(b), i+80)])
	}
	opts.Seed = 4
	if c, _ := render(t, tr, opts); bytes.Equal(a, c) {
		t.Error("another seed gave the same report (the surrogates should differ)")
	}
}

// TestReportScaleFree checks the project rule that units never change a
// verdict: the report of 10⁶·x + 3 (amperes → microamperes plus an offset)
// has the same verdict, plane point and graph fits as that of x.
func TestReportScaleFree(t *testing.T) {
	opts := Options{Seed: 3, Surrogates: -1}
	_, a := render(t, henonTrace(t, 3000, 1e-6, 5e-6), opts)
	_, b := render(t, henonTrace(t, 3000, 1, 3), opts)
	if a.Verdict.Class != b.Verdict.Class {
		t.Errorf("verdict %s vs %s", a.Verdict.Class, b.Verdict.Class)
	}
	for i := range a.Verdict.Probabilities {
		// Features are standardised first; only rounding of a·x + b differs.
		if d := math.Abs(a.Verdict.Probabilities[i] - b.Verdict.Probabilities[i]); d > 1e-9 {
			t.Errorf("P(%s) differs by %g", a.Verdict.Classes[i], d)
		}
	}
	// Ordinal patterns depend only on order relations (Bandt & Pompe 2002),
	// unchanged by an increasing affine map away from exact ties.
	if a.Plane.Trace.Entropy != b.Plane.Trace.Entropy || a.Plane.Trace.Complexity != b.Plane.Trace.Complexity {
		t.Errorf("plane point (%g, %g) vs (%g, %g)", a.Plane.Trace.Entropy, a.Plane.Trace.Complexity, b.Plane.Trace.Entropy, b.Plane.Trace.Complexity)
	}
	if a.HVG.Tail == nil || b.HVG.Tail == nil || a.HVG.Tail.Lambda != b.HVG.Tail.Lambda {
		t.Errorf("HVG tail fits differ: %+v vs %+v", a.HVG.Tail, b.HVG.Tail)
	}
	if a.Increments.Stats.ExcessKurtosis-b.Increments.Stats.ExcessKurtosis > 1e-9 {
		t.Errorf("increment kurtosis %g vs %g", a.Increments.Stats.ExcessKurtosis, b.Increments.Stats.ExcessKurtosis)
	}
}

// TestReportContent checks the computed panels against known results on
// the Hénon map.
func TestReportContent(t *testing.T) {
	_, r := henonHTML(t)
	// Hénon (a = 1.4, b = 0.3) is chaotic (λ1 = 0.419 > 0; Sprott 2003,
	// confirmed: tkf/LyapunovExponents.jl src/examples/henon_map.jl); a model trained on the reference set must say so.
	if r.Verdict.Class != "chaotic" {
		t.Errorf("verdict %s (probabilities %v), want chaotic", r.Verdict.Class, r.Verdict.Probabilities)
	}
	// The HVG of a chaotic series has λ < ln(3/2) (Luque et al., Phys. Rev.
	// E 80 (2009) 046103; Lacasa & Toral, Phys. Rev. E 82 (2010) 036120).
	if r.HVG.Tail == nil || !(r.HVG.Tail.Lambda < math.Log(1.5)) {
		t.Errorf("HVG tail %+v, want λ < ln(3/2)", r.HVG.Tail)
	}
	// Chaotic maps lie near the upper bound of the complexity–entropy plane
	// (Rosso et al., Phys. Rev. Lett. 99 (2007) 154102): well above white
	// noise, which lies near C = 0, and above the midpoint of the bounds.
	var white ReferencePoint
	for _, p := range r.Plane.References {
		if p.System == "white" {
			white = p
		}
		if p.Error != "" {
			t.Errorf("reference %s failed: %s", p.Label, p.Error)
		}
	}
	tr := r.Plane.Trace
	if !(tr.Complexity > white.Complexity+0.1) || !(tr.Complexity > (tr.MinComplexity+tr.MaxComplexity)/2) {
		t.Errorf("Hénon at C = %.3f (bounds %.3f–%.3f), white at C = %.3f", tr.Complexity, tr.MinComplexity, tr.MaxComplexity, white.Complexity)
	}
	// Dissipative chaos is more predictable one delay ahead and more
	// time-asymmetric than every IAAFT surrogate (Theiler et al., Physica D
	// 58 (1992) 77; Schreiber & Schmitz, Phys. Rev. Lett. 77 (1996) 635;
	// Sugihara & May, Nature 344 (1990) 734): both rank p-values reach
	// their least value 1/40 and the test rejects; with a chaotic verdict
	// the two agree, and the verdict section says so.
	d := r.Determinism
	if d == nil || !d.Rejected || d.Count != 39 || d.Count != surrogate.DeterminismSurrogates(0.05) {
		t.Fatalf("determinism test %+v", d)
	}
	for _, s := range d.Stats {
		if s.P != 1.0/40 || !s.Significant {
			t.Errorf("%s: p = %g, significant %v", s.Name, s.P, s.Significant)
		}
	}
	html, _ := henonHTML(t)
	a := d.Agreement(r.Verdict.Class)
	if a.Kind != surrogate.Agree || bytes.Count(html, []byte(esc(capitalise(a.Text)))) != 2 {
		t.Errorf("agreement %+v not stated in the verdict and surrogate sections", a)
	}
	if r.Surrogates != nil {
		t.Error("feature tests ran without Options.Stats")
	}
	// Feature tests at α = 0.05, two-sided: M = ⌈2m/0.05 − 1⌉, 159 for
	// four statistics (smallest rank p 2/(M+1), times m by Holm; Theiler et
	// al. 1992, Holm 1979), derived.
	if HolmSurrogates(4, 0.05) != 159 || HolmSurrogates(1, 0.05) != 39 {
		t.Errorf("HolmSurrogates(4) = %d, HolmSurrogates(1) = %d", HolmSurrogates(4, 0.05), HolmSurrogates(1, 0.05))
	}
}

func TestReportSkipsAndLongTraces(t *testing.T) {
	// A trace longer than the graph and surrogate caps: the panels use the
	// middle stretch and say so; with Surrogates < 0 the test is skipped.
	tr := henonTrace(t, 5000, 1, 0)
	tr.Interval, tr.TimeUnit, tr.Unit = 0, "", ""
	html, r := render(t, tr, Options{Seed: 1, Surrogates: -1, GraphLength: 1000})
	if r.HVG.Nodes != 1000 || r.HVG.Offset != 2000 {
		t.Errorf("graph on %d nodes from %d, want 1000 from 2000", r.HVG.Nodes, r.HVG.Offset)
	}
	if !r.Trace.Reduced || len(r.Trace.Lo) != displayColumns {
		t.Errorf("trace of 5000 samples not reduced to %d columns", displayColumns)
	}
	for _, want := range []string{"Skipped at the caller", "middle 1000 samples", "unknown (no time column)", "sample</text>"} {
		if !bytes.Contains(html, []byte(want)) {
			t.Errorf("report lacks %q", want)
		}
	}
}

func TestOptionErrors(t *testing.T) {
	tr := henonTrace(t, 600, 1, 0)
	m := model(t)
	for _, o := range []Options{{Order: 9}, {Stats: []string{"nosuch"}}, {Alpha: 2}, {Method: "bogus"}, {GraphLength: 10}, {SurrogateLength: 100}, {StatSurrogates: -1}} {
		if _, err := Build(tr, m, o); !errors.Is(err, ErrOption) {
			t.Errorf("%+v: err %v, want ErrOption", o, err)
		}
	}
	if _, err := Build(tr, nil, Options{}); !errors.Is(err, classifier.ErrEmptyModel) {
		t.Errorf("nil model: %v", err)
	}
	short := trace.Trace{Values: tr.Values[:100], Source: "short"}
	if _, err := Build(short, m, Options{}); !errors.Is(err, features.ErrTooShort) {
		t.Errorf("short trace: %v", err)
	}
}

func TestTraceEnvelopeKeepsSpikes(t *testing.T) {
	x := make([]float64, 100000)
	x[31337] = 7
	x[77777] = -5
	p := traceEnvelope(x, 0.5, 640)
	var hi, lo float64
	for i := range p.Lo {
		hi, lo = math.Max(hi, p.Hi[i]), math.Min(lo, p.Lo[i])
	}
	// A min/max envelope keeps the extremes exactly (decimation would lose
	// single-sample spikes).
	if hi != 7 || lo != -5 || len(p.T) != 640 || !p.Reduced {
		t.Errorf("envelope: max %g min %g, %d columns", hi, lo, len(p.T))
	}
	// Column c covers samples [c·n/640, (c+1)·n/640); its time is the
	// centre of that stretch in units of the interval.
	if want := float64(0+156-1) / 2 * 0.5; p.T[0] != want {
		t.Errorf("first column at t = %g, want %g", p.T[0], want)
	}
	short := traceEnvelope([]float64{1, 2, 3}, 0, 640)
	if short.Reduced || len(short.T) != 3 || short.T[2] != 2 {
		t.Errorf("short trace: %+v", short)
	}
}

func TestLatticeBins(t *testing.T) {
	// Increments of an integer-valued trace, standardised: the levels lie
	// on a lattice of spacing 1/sd; every level gets its own bin, centred.
	z := []float64{-1.5, 0, 0, 1.5, 3, -1.5, 0}
	o := latticeBins(z)
	if o.Bins != 4 || o.Min != -2.25 || o.Max != 3.75 {
		t.Errorf("lattice bins %+v, want 4 bins on [-2.25, 3.75]", o)
	}
	// Continuous values: no lattice.
	if o := latticeBins([]float64{0.1, 0.37, 1.2, -0.4, 2.9}); o.Bins != 0 {
		t.Errorf("continuous values got lattice bins %+v", o)
	}
}

func TestHurwitzZeta(t *testing.T) {
	cases := []struct {
		s, q, want float64
		src        string
	}{
		{2, 1, math.Pi * math.Pi / 6, "Euler: ζ(2) = π²/6"},
		{3, 1, 1.2020569031595942, "Apéry's constant ζ(3) = 1.20205690315959428540, numerics.net Constants.Apery docs"},
		{4, 1, math.Pow(math.Pi, 4) / 90, "Euler: ζ(4) = π⁴/90"},
		{2, 5, math.Pi*math.Pi/6 - 1 - 0.25 - 1.0/9 - 1.0/16, "ζ(s, q+1) = ζ(s, q) − q^{−s}, derived"},
		{2.5, 3, 0, "direct sum, see below"},
	}
	for _, c := range cases {
		want := c.want
		if want == 0 {
			// Reference by brute force: Σ_{k<10^6} (k+q)^{−s} plus the
			// integral tail ∫ from 10^6 − ½ (midpoint rule, error O(N^{−s−2})).
			for k := 1e6 - 1; k >= 0; k-- {
				want += math.Pow(k+c.q, -c.s)
			}
			want += math.Pow(1e6+c.q-0.5, 1-c.s) / (c.s - 1)
		}
		if got := hurwitzZeta(c.s, c.q); math.Abs(got-want) > 1e-10*want {
			t.Errorf("ζ(%g, %g) = %.15g, want %.15g (%s)", c.s, c.q, got, want, c.src)
		}
	}
}

func TestIIDLawSumsToOne(t *testing.T) {
	// Σ_{k≥2} (1/3)(2/3)^{k−2} = (1/3)/(1 − 2/3) = 1 and ⟨k⟩ = 4 (Luque et
	// al., Phys. Rev. E 80 (2009) 046103).
	var s, m float64
	for k := 0; k < 200; k++ {
		s += iidHVG(k)
		m += float64(k) * iidHVG(k)
	}
	if math.Abs(s-1) > 1e-12 || math.Abs(m-4) > 1e-9 {
		t.Errorf("Σ P(k) = %g, ⟨k⟩ = %g, want 1 and 4", s, m)
	}
}

func TestTicksAndNumbers(t *testing.T) {
	cases := []struct {
		in   float64
		want string
	}{{0.04, "0"}, {-0.04, "0"}, {12.34, "12.3"}, {-3.96, "-4"}, {100, "100"}}
	for _, c := range cases {
		if got := num(c.in); got != c.want {
			t.Errorf("num(%g) = %q, want %q", c.in, got, c.want)
		}
	}
	var got []string
	for _, tk := range ticks(scale{-0.3, 1.7, false}) {
		got = append(got, tk.label)
	}
	if strings.Join(got, " ") != "0.0 0.5 1.0 1.5" {
		t.Errorf("linear ticks %v", got)
	}
	got = nil
	for _, tk := range ticks(scale{1e-4, 1, true}) {
		if !tk.minor {
			got = append(got, tk.label)
		}
	}
	// One notation per axis: the decade 1 is written as a power like the
	// others (10⁰), not in fixed notation.
	if len(got) != 5 || got[4] != `10<tspan dy="-5" font-size="8">0</tspan>` || !strings.Contains(got[0], "−4") {
		t.Errorf("log ticks %v", got)
	}
	// A log axis within 10⁻³…10⁵ is written in fixed notation throughout.
	got = nil
	for _, tk := range ticks(scale{1, 150, true}) {
		if !tk.minor {
			got = append(got, tk.label)
		}
	}
	if strings.Join(got, " ") != "1 10 100" {
		t.Errorf("log ticks 1…150: %v", got)
	}
	// A linear axis reaching 10⁵ is scientific throughout (per-tick rules
	// wrote 80000 beside 1e+05).
	got = nil
	for _, tk := range ticks(scale{0, 1e5, false}) {
		got = append(got, tk.label)
	}
	if got[4] != `8.0×10<tspan dy="-5" font-size="8">4</tspan>` || got[5] != `1.0×10<tspan dy="-5" font-size="8">5</tspan>` {
		t.Errorf("linear ticks 0…1e5: %v", got)
	}
	if f, l := valueAxis(Summary{Column: "Id", Unit: "A"}, 8.9e-6); math.Abs(f-1e6) > 1e-6 || l != "Id (µA)" {
		t.Errorf("value axis %g %q", f, l)
	}
	if f, l := timeAxis(Summary{Interval: 1e-4, TimeUnit: "s"}, 0.4); math.Abs(f-1e3) > 1e-9 || l != "time (ms)" {
		t.Errorf("time axis %g %q", f, l)
	}
}

// TestRenderDemo writes the report of a demo trace for a look in a browser
// (scripts/render-report.sh); it runs only when REPORT_OUT names the file.
func TestRenderDemo(t *testing.T) {
	out := os.Getenv("REPORT_OUT")
	if out == "" {
		t.Skip("set REPORT_OUT=path.html (and optionally REPORT_IN=trace.csv) to render a report")
	}
	in := os.Getenv("REPORT_IN")
	if in == "" {
		in = filepath.Join("..", "testdata", "demo", "stressed", "D01_stressed_Vg1.20.csv")
	}
	tr, err := trace.ReadFile(in, trace.Options{})
	if err != nil {
		t.Fatal(err)
	}
	// Name the file relative to the repository root when it lies inside.
	if root, err := filepath.Abs(".."); err == nil {
		if abs, err := filepath.Abs(in); err == nil {
			if rel, err := filepath.Rel(root, abs); err == nil && !strings.HasPrefix(rel, "..") {
				tr.Source = filepath.ToSlash(rel)
			}
		}
	}
	html, _ := render(t, tr, Options{Seed: 1, Generator: "tracesift (report test, small in-process model)"})
	if err := os.WriteFile(out, html, 0o644); err != nil {
		t.Fatal(err)
	}
	t.Logf("wrote %s (%d bytes)", out, len(html))
}

// TestLegendMovesOffData: a legend asked for at the top right moves when
// bars reach into that corner, and stays when the corner is free.
func TestLegendMovesOffData(t *testing.T) {
	draw := func(top float64) *chart {
		c := newChart("fig-t", 420, 300, scale{0, 10, false}, scale{0, 1, false})
		c.bars([]float64{0, 8}, []float64{2, 10}, []float64{0.3, top}, 0, "#cccccc", "#333333")
		c.legend = []legendEntry{{label: "bars", fill: "#cccccc", stroke: "#333333"}}
		c.svg()
		return c
	}
	legendX := func(c *chart) string {
		s := c.legendSVG()
		i := strings.Index(s, `<rect x="`)
		return s[i+9 : i+9+strings.Index(s[i+9:], `"`)]
	}
	free, covered := draw(0.2), draw(0.95)
	if got := legendX(free); got != num(free.left+free.plotW()-(textWidth("bars", 10.5)+34)-6) {
		t.Errorf("legend over free corner at x = %s, want the top right", got)
	}
	if got := legendX(covered); got != num(covered.left+6) {
		t.Errorf("legend beside a tall bar at x = %s, want the top left", got)
	}
}

// TestFitLeft: the left margin of the bar figures holds the widest label.
func TestFitLeft(t *testing.T) {
	long := "a_rather_long_statistic_name_tau"
	if m := fitLeft([]string{"x", long}, 104); m < textWidth(long, 11)+6 {
		t.Errorf("margin %g narrower than the label %g", m, textWidth(long, 11))
	}
	if m := fitLeft([]string{"chaotic"}, 86); m != 86 {
		t.Errorf("margin %g, want the floor 86", m)
	}
}
