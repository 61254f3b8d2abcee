package demo

import (
	"bytes"
	"compress/gzip"
	"encoding/csv"
	"io"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/generators"
	"github.com/tracesift/tracesift/trace"
)

// committed is the directory of the committed data set.
var committed = filepath.Join("..", "..", "testdata", "demo")

// script is the generator script, committed beside the data but not
// written by Write.
const script = "mkdemo.go"

// maxBytes is the size budget of the committed directory (lead's brief:
// "under ~2.5 MB").
const maxBytes = 2_500_000

// generated writes the data set into a fresh temporary directory once per
// test that needs it.
func generated(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	if err := Write(dir); err != nil {
		t.Fatalf("Write: %v", err)
	}
	return dir
}

// files lists the regular files under dir, relative, with forward slashes.
func files(t *testing.T, dir string) []string {
	t.Helper()
	var out []string
	err := filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.Type().IsRegular() {
			rel, err := filepath.Rel(dir, p)
			if err != nil {
				return err
			}
			out = append(out, filepath.ToSlash(rel))
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	slices.Sort(out)
	return out
}

// content returns the bytes of a file, decompressed when its name ends in
// ".gz" (the gzip stream's own bytes depend on the compress/flate version).
func content(t *testing.T, p string) []byte {
	t.Helper()
	raw, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.HasSuffix(p, ".gz") {
		return raw
	}
	zr, err := gzip.NewReader(bytes.NewReader(raw))
	if err != nil {
		t.Fatalf("%s: %v", p, err)
	}
	out, err := io.ReadAll(zr)
	if err != nil {
		t.Fatalf("%s: %v", p, err)
	}
	return out
}

// firstDiff describes the first differing line of a and b.
func firstDiff(a, b []byte) string {
	la, lb := strings.Split(string(a), "\n"), strings.Split(string(b), "\n")
	for i := range min(len(la), len(lb)) {
		if la[i] != lb[i] {
			return "line " + strconv.Itoa(i+1) + ": generated " + strconv.Quote(la[i]) + ", committed " + strconv.Quote(lb[i])
		}
	}
	return "line counts " + strconv.Itoa(len(la)) + " and " + strconv.Itoa(len(lb))
}

// TestCommittedMatchesGenerator regenerates the data set and compares it
// with the committed copy: the same file names (plus the script), and the
// same bytes — always for labels.csv and README.md, and for the trace files
// on platforms that reproduce floating point bit for bit (exactPlatform).
// This is what makes the committed data provably the script's output.
func TestCommittedMatchesGenerator(t *testing.T) {
	dir := generated(t)
	got := files(t, dir)
	want := slices.DeleteFunc(files(t, committed), func(s string) bool { return s == script })
	if !slices.Equal(got, want) {
		t.Fatalf("file sets differ:\ngenerated %q\ncommitted %q", got, want)
	}
	if _, err := os.Stat(filepath.Join(committed, script)); err != nil {
		t.Errorf("generator script: %v", err)
	}
	if !exactPlatform {
		t.Log("trace bytes not compared: this build may fuse multiply-adds (see exact_amd64_test.go)")
	}
	for _, rel := range got {
		isTrace := rel != LabelsFile && rel != ReadmeFile && rel != CampaignFile
		if isTrace && !exactPlatform {
			continue
		}
		a := content(t, filepath.Join(dir, filepath.FromSlash(rel)))
		b := content(t, filepath.Join(committed, filepath.FromSlash(rel)))
		if !bytes.Equal(a, b) {
			t.Errorf("%s differs from the generator's output (%s); run go run testdata/demo/mkdemo.go", rel, firstDiff(a, b))
		}
	}
}

// TestWriteDeterministic: two builds give identical bytes, gzip streams
// included (fixed header, no time stamp). In memory: Write adds only the
// file handling, exercised by TestCommittedMatchesGenerator.
func TestWriteDeterministic(t *testing.T) {
	n1, d1, err := build()
	if err != nil {
		t.Fatal(err)
	}
	n2, d2, err := build()
	if err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(n1, n2) || len(d1) != len(d2) {
		t.Fatalf("two builds name different files")
	}
	for i := range d1 {
		if !bytes.Equal(d1[i], d2[i]) {
			t.Errorf("%s: two builds differ", n1[i])
		}
	}
}

// TestFilesRead reads every committed trace with trace.ReadFile and the
// zero Options: 4096 samples, interval 1e-4 s from the time column, units
// s and A, no warnings (a clean file needs no notes). On exact platforms
// the values also equal the construction to the printed precision.
func TestFilesRead(t *testing.T) {
	for _, s := range Campaign() {
		t.Run(s.Path(), func(t *testing.T) {
			tr, err := trace.ReadFile(filepath.Join(committed, filepath.FromSlash(s.Path())), trace.Options{})
			if err != nil {
				t.Fatal(err)
			}
			if len(tr.Values) != Samples {
				t.Errorf("%d samples, want %d", len(tr.Values), Samples)
			}
			// Interval = (t_last − t_0)/(n − 1) = 0.4095/4095 with both
			// numbers correctly rounded: a few ulps (~1e-16 relative) off
			// 1e-4, so 1e-13 relative is generous yet tight.
			if math.Abs(tr.Interval-Interval) > 1e-13*Interval || tr.Uneven {
				t.Errorf("interval %g (uneven %v), want %g", tr.Interval, tr.Uneven, Interval)
			}
			if tr.TimeColumn != 1 || tr.TimeUnit != "s" || tr.Unit != "A" || tr.ColumnIndex != 2 {
				t.Errorf("time column %d unit %q, value column %d unit %q; want 1 s, 2 A", tr.TimeColumn, tr.TimeUnit, tr.ColumnIndex, tr.Unit)
			}
			if len(tr.Warnings) > 0 {
				t.Errorf("warnings: %q", tr.Warnings)
			}
			if !exactPlatform {
				return
			}
			c, err := Synthesize(s)
			if err != nil {
				t.Fatal(err)
			}
			// Printing to Digits = 7 significant digits rounds to half a
			// unit in the 7th digit: |error| ≤ 5e-7·|value| (decimal
			// rounding, analytic), plus parsing's half ulp.
			for k, want := range c.Current() {
				if d := math.Abs(tr.Values[k] - want); d > 5.000001e-7*math.Abs(want) {
					t.Fatalf("sample %d: read %g, constructed %g", k, tr.Values[k], want)
				}
			}
		})
	}
}

// TestLabels checks labels.csv against the campaign and the classes
// against the construction: a trace with an oscillation has the class that
// generators.System.Class computes for its system and settings (Lyapunov
// label rule from the equations, or the fixed label of a waveform); any
// other trace holds noise only and is stochastic. The gate bias, device
// and condition come back out of the file name with regular expressions.
func TestLabels(t *testing.T) {
	f, err := os.Open(filepath.Join(committed, LabelsFile))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	specs := Campaign()
	if len(rows) != len(specs)+1 || !slices.Equal(rows[0], []string{"file", "class"}) {
		t.Fatalf("labels.csv: %d rows, header %q; want %d rows and file,class", len(rows), rows[0], len(specs)+1)
	}
	vgRe := regexp.MustCompile(`Vg([0-9]+\.[0-9]+)`)
	nameRe := regexp.MustCompile(`^(fresh|stressed)/(D[0-9]+)_(fresh|stressed)_Vg[0-9.]+\.csv(\.gz)?$`)
	for i, s := range specs {
		row := rows[i+1]
		if row[0] != s.Path() || row[1] != string(s.Class) {
			t.Errorf("row %d: %q, want %s,%s", i+2, row, s.Path(), s.Class)
		}
		if _, err := os.Stat(filepath.Join(committed, filepath.FromSlash(row[0]))); err != nil {
			t.Errorf("row %d: %v", i+2, err)
		}
		m := vgRe.FindStringSubmatch(row[0])
		if m == nil {
			t.Errorf("%s: no gate bias in the name", row[0])
		} else if vg, _ := strconv.ParseFloat(m[1], 64); vg != s.Vg {
			t.Errorf("%s: Vg %g from the name, want %g", row[0], vg, s.Vg)
		}
		n := nameRe.FindStringSubmatch(row[0])
		if n == nil || n[1] != string(s.Condition) || n[3] != string(s.Condition) || n[2] != s.Device {
			t.Errorf("%s: name does not encode condition %s and device %s", row[0], s.Condition, s.Device)
		}

		if o := s.Oscillation; o != nil {
			sys, err := generators.Lookup(o.System)
			if err != nil {
				t.Fatal(err)
			}
			c, err := sys.Class(o.Overrides)
			if err != nil {
				t.Fatal(err)
			}
			if c != s.Class {
				t.Errorf("%s: label %s, but %s at %v is %s by its equations", s.Path(), s.Class, o.System, o.Overrides, c)
			}
			continue
		}
		if s.Class != generators.Stochastic {
			t.Errorf("%s: noise only, labelled %s", s.Path(), s.Class)
		}
		for _, name := range []string{s.Flicker.System} {
			sys, err := generators.Lookup(name)
			if err != nil {
				t.Fatal(err)
			}
			if sys.DefaultClass != generators.Stochastic {
				t.Errorf("%s: noise source %s is %s", s.Path(), name, sys.DefaultClass)
			}
		}
	}
}

// TestOscillationDominates checks the construction of every oscillating
// trace: the SNR of the deterministic part over the noise, computed from
// the components, is the stated one (exact by the rescaling, up to
// rounding) and at least 20 dB; the noise is then at most 1 % of the
// deterministic variance, and by Cauchy–Schwarz (|cov| ≤ sd·sd) at most
// 0.01/(1 − 0.1)² ≈ 1.23 % of the total variance. On exact platforms the
// same bound holds for the committed file minus the deterministic part.
// Traces without an oscillation must have no deterministic part.
func TestOscillationDominates(t *testing.T) {
	const worstNoiseShare = 0.01 / ((1 - 0.1) * (1 - 0.1)) // analytic bound at 20 dB
	for _, s := range Campaign() {
		c, err := Synthesize(s)
		if err != nil {
			t.Fatal(err)
		}
		o := s.Oscillation
		if o == nil {
			if c.Deterministic != nil {
				t.Errorf("%s: deterministic part in a noise-only trace", s.Path())
			}
			continue
		}
		snr := 10 * math.Log10(variance(c.Deterministic)/variance(c.Noise))
		// Rescaling makes the ratio exact up to a few roundings (1e-12 dB).
		if math.Abs(snr-o.SNRdB) > 1e-9 || snr < 20 {
			t.Errorf("%s: SNR %.12g dB, want %g dB (≥ 20)", s.Path(), snr, o.SNRdB)
		}
		id := c.Current()
		share := variance(c.Noise) / variance(id)
		if share > worstNoiseShare {
			t.Errorf("%s: noise carries %.4f of the variance, bound %.4f", s.Path(), share, worstNoiseShare)
		}
		t.Logf("%s: %s, SNR %.2f dB, noise share of variance %.4f", s.Path(), o.System, snr, share)
		if !exactPlatform {
			continue
		}
		tr, err := trace.ReadFile(filepath.Join(committed, filepath.FromSlash(s.Path())), trace.Options{})
		if err != nil {
			t.Fatal(err)
		}
		res := make([]float64, len(tr.Values))
		for k, v := range tr.Values {
			res[k] = v - c.Mean - c.Deterministic[k]
		}
		// Printing adds ≤ 5e-7·9e-6 A ≈ 5e-12 A per sample, 10^4 times
		// below the noise rms (≥ 1e-8 A here), so the bound still holds.
		if fs := variance(res) / variance(tr.Values); fs > worstNoiseShare {
			t.Errorf("%s: file minus oscillation carries %.4f of the variance, bound %.4f", s.Path(), fs, worstNoiseShare)
		}
	}
}

// TestTrapDominates checks that the single trap of every stressed
// stochastic trace outweighs its 1/f noise, from the parameters: a
// two-level signal of depth a and occupancy p has variance a²·p(1 − p)
// (Machlup, J. Appl. Phys. 25 (1954) 341), the 1/f component RMS².
func TestTrapDominates(t *testing.T) {
	for _, s := range Campaign() {
		if s.Trap == nil {
			if s.Condition == Stressed && s.Oscillation == nil {
				t.Errorf("%s: stressed noise trace without a trap", s.Path())
			}
			continue
		}
		p := s.Trap.TauEmission / (s.Trap.TauCapture + s.Trap.TauEmission)
		vTrap := s.Trap.Depth * s.Trap.Depth * p * (1 - p)
		if vTrap <= s.Flicker.RMS*s.Flicker.RMS {
			t.Errorf("%s: trap variance %.3g ≤ 1/f variance %.3g (relative units)", s.Path(), vTrap, s.Flicker.RMS*s.Flicker.RMS)
		}
		// Enough switches in the record to show the trap: expected
		// transitions ≈ 2·T/(τc + τe) with T = 0.41 s (renewal count).
		if sw := 2 * float64(Samples) * Interval / (s.Trap.TauCapture + s.Trap.TauEmission); sw < 20 {
			t.Errorf("%s: only %.0f expected trap switches in the record", s.Path(), sw)
		}
	}
}

// TestCampaignShape checks the campaign against the brief: 6 devices × 2
// conditions × 3 biases, unique names and seeds, 4 chaotic, 1 regular and
// 31 stochastic traces, every file layout present, mean currents between
// 1 and 10 µA give or take the device spread and stress.
func TestCampaignShape(t *testing.T) {
	specs := Campaign()
	if len(specs) != 36 {
		t.Fatalf("%d specs, want 36", len(specs))
	}
	paths, seeds := map[string]bool{}, map[uint64]bool{}
	classes := map[generators.Class]int{}
	formats := map[Format]int{}
	for _, s := range specs {
		if paths[s.Path()] || seeds[s.Seed] {
			t.Errorf("%s: duplicate name or seed %d", s.Path(), s.Seed)
		}
		paths[s.Path()], seeds[s.Seed] = true, true
		classes[s.Class]++
		formats[s.Format]++
		if s.Mean < 1e-6 || s.Mean > 1e-5 {
			t.Errorf("%s: mean %g A outside 1–10 µA", s.Path(), s.Mean)
		}
		if s.Class != generators.Stochastic && (s.Condition != Stressed || s.Vg != Biases[2]) {
			t.Errorf("%s: %s trace outside the stressed 1.20 V group", s.Path(), s.Class)
		}
	}
	if classes[generators.Chaotic] != 4 || classes[generators.Regular] != 1 || classes[generators.Stochastic] != 31 {
		t.Errorf("classes %v, want 4 chaotic, 1 regular, 31 stochastic", classes)
	}
	for _, f := range []Format{FormatCSV, FormatEuropean, FormatGzip} {
		if formats[f] == 0 {
			t.Errorf("no trace in format %s", f)
		}
	}
	// Most files are the lab's standard CSV (plain, or gzip-compressed in
	// the archive); the European export is the exception.
	if formats[FormatCSV]+formats[FormatGzip] <= len(specs)/2 || formats[FormatCSV] < formats[FormatGzip] {
		t.Errorf("formats %v: standard CSV should be most files, plain at least as many as compressed", formats)
	}
}

// TestCommittedSize keeps the committed directory within its budget.
func TestCommittedSize(t *testing.T) {
	var total int64
	for _, rel := range files(t, committed) {
		fi, err := os.Stat(filepath.Join(committed, filepath.FromSlash(rel)))
		if err != nil {
			t.Fatal(err)
		}
		total += fi.Size()
	}
	t.Logf("testdata/demo: %d bytes", total)
	if total > maxBytes {
		t.Errorf("testdata/demo holds %d bytes, budget %d", total, maxBytes)
	}
}

// TestSynthesizeErrors: a bad spec is an error naming the trace, not a
// panic.
func TestSynthesizeErrors(t *testing.T) {
	base := Campaign()[0]
	cases := map[string]func(*Spec){
		"zero mean":      func(s *Spec) { s.Mean = 0 },
		"unknown 1/f":    func(s *Spec) { s.Flicker.System = "no-such-noise" },
		"unknown system": func(s *Spec) { s.Oscillation = &Oscillation{System: "no-such-flow", Depth: 0.05, SNRdB: 25} },
		"bad trap":       func(s *Spec) { s.Trap = &Trap{Depth: 0.05, TauCapture: -1, TauEmission: 1e-3} },
	}
	for name, mod := range cases {
		s := base
		mod(&s)
		if _, err := Synthesize(s); err == nil || !strings.Contains(err.Error(), s.Path()) {
			t.Errorf("%s: error %v, want one naming %s", name, err, s.Path())
		}
	}
	if _, err := Render(Spec{Format: "xml", Device: "D01", Condition: Fresh, Vg: 0.6}, []float64{1}); err == nil {
		t.Error("Render accepted an unknown format")
	}
}
