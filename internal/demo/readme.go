package demo

import (
	"bytes"
	"fmt"
	"strings"

	"github.com/tracesift/tracesift/generators"
)

// Readme returns the README.md of the data set: the scenario (fictional
// and synthetic, said prominently), the file naming, columns and units, the
// generation rules with their numbers and seeds, a table of every trace,
// how to regenerate, and a caution on use. It is generated from the same
// tables as the data, so the two cannot drift apart.
func Readme(specs []Spec) ([]byte, error) {
	var b bytes.Buffer
	p := func(format string, a ...any) { fmt.Fprintf(&b, format, a...) }

	count := map[generators.Class]int{}
	for _, s := range specs {
		count[s.Class]++
	}

	p("# tracesift demo data set (SYNTHETIC)\n\n")
	p("> **Synthetic data — not a real measurement.** The %s,\n", Lab)
	p("> wafer %s, its transistors, instruments and stress recipe are **fictional**,\n> invented for", Wafer)
	p(" this demo. Every value in this directory was computed by\n")
	p("> `testdata/demo/mkdemo.go` (package `github.com/tracesift/tracesift/internal/demo`) from fixed\n")
	p("> seeds, and every class label is true by construction.\n\n")

	p("## Scenario\n\n")
	p("The (fictional) %s measures the drain current Id\n", Lab)
	p("of six small-area transistors, D01 to D06, all on wafer %s, at drain bias\n", Wafer)
	p("Vd = %.2f V and gate biases Vg = 0.60, 0.90 and 1.20 V: once FRESH and once\n", DrainBias)
	p("after electrical STRESS with the (equally fictional) recipe\n\"%s\".\n", StressRecipe)
	p("Each trace has %d samples at %g kHz (interval %g s, %.4f s of record).\n\n", Samples, 1e-3/Interval, Interval, float64(Samples-1)*Interval)
	p("%d traces: %d chaotic, %d regular, %d stochastic.\n\n", len(specs), count[generators.Chaotic], count[generators.Regular], count[generators.Stochastic])

	p("## Files\n\n")
	p("- `fresh/<device>_fresh_Vg<bias>.csv` and `stressed/<device>_stressed_Vg<bias>.csv`,\n")
	p("  the bias in volts with two decimals, e.g. `stressed/D03_stressed_Vg0.90.csv`.\n")
	p("  The regular expression `Vg([0-9]+\\.[0-9]+)` extracts the gate bias,\n")
	p("  `^(fresh|stressed)/(D[0-9]+)_` the condition and device.\n")
	p("- `%s`: columns `file,class`, one row per trace; `file` is relative to this\n", LabelsFile)
	p("  directory, `class` is `chaotic`, `stochastic` or `regular`.\n")
	p("- `%s`: the campaign description for `tracesift survey`, columns\n", CampaignFile)
	p("  `file,device,group,bias_V,drain_V`: one row per trace, the group is the\n")
	p("  condition (`fresh` or `stressed`), the same device in both, the biases in volts.\n")
	p("- `mkdemo.go`: the generator script (build tag `ignore`).\n\n")
	p("Every trace file begins with two `#` comment lines that say the data are\n")
	p("synthetic and give the seed, device, condition and biases. Columns: time in\n")
	p("seconds (k·%g s, k = 0..%d) and Id in amperes, printed with %d significant\n", Interval, Samples-1, Digits)
	p("digits. Three layouts show the range of the reader (`github.com/tracesift/tracesift/trace`):\n\n")
	p("- plain CSV: comma-delimited, decimal point, header `time (s),Id (A)`, LF line\n")
	p("  ends (most files);\n")
	p("- European instrument export (all traces of D06, \"bench B\"): semicolon-delimited,\n")
	p("  decimal commas, upper-case exponent (`1,234567E-06`), CRLF line ends, three\n")
	p("  non-comment preamble lines (`Messplatz`, `Abtastrate [Hz]`, `Punkte`) and the\n")
	p("  header `Zeit [s];Id [A]`;\n")
	p("- gzip-compressed plain CSV (`.csv.gz`, all traces of D02 and D04, \"the archive\";\n")
	p("  compression keeps the directory under 2.5 MB).\n\n")
	p("`trace.ReadFile` with default options reads every file as %d samples with an\n", Samples)
	p("interval of %g s (checked by `go test ./internal/demo`).\n\n", Interval)

	p("## Generation rules\n\n")
	p("Each trace draws from its own generator, `rand.New(rand.NewPCG(seed, %d))`\n", CampaignSeed)
	p("(`math/rand/v2`), with seed = 1000·d + 100·c + b for device d = 1..6, condition\n")
	p("c = 1 (fresh) or 2 (stressed) and bias b = 1..3. Components are drawn in the\n")
	p("order oscillation, 1/f, trap, read-out. Id = mean + oscillation + noise, where:\n\n")
	p("- **Mean current.** Nominal fresh means %s µA at Vg = 0.60, 0.90,\n", joinF(scaled(freshMean[:], 1e6), "%.1f"))
	p("  1.20 V, times a device factor (D01..D06: %s);\n", joinF(deviceSpread[:], "%.3f"))
	p("  stress keeps %s of it (threshold-voltage shift, felt most at\n", joinF(scaled(stressLoss[:], 100), "%.0f %%"))
	p("  low overdrive).\n")
	p("- **1/f noise** (every trace). D01, D03, D05: `telegraph-sum` (40 symmetric\n")
	p("  telegraph sources with time constants log-uniform in [0.2 ms, 2 s], so ≈ 1/f\n")
	p("  from about 0.16 Hz to 1.6 kHz); D02, D04, D06: `powerlaw` with β = 1. The\n")
	p("  component is standardised over the record and scaled to an rms of\n")
	p("  %s of the mean current at 0.60, 0.90, 1.20 V on fresh\n", joinF(scaled(freshFlicker[:], 100), "%.2f %%"))
	p("  devices (the normalised noise falls with bias), %.1f times that after stress\n", stressFlickerGain)
	p("  (stress-generated traps).\n")
	p("- **Read-out noise** (every trace): white Gaussian, %.1f nA rms.\n", 1e9*readout)
	p("- **Dominant trap** (stressed traces without an instability): a random\n")
	p("  telegraph signal (`generators.Telegraph`) that lowers Id by %s\n", joinF(scaled(trapDepth[:], 100), "%.1f %%"))
	p("  of the mean current at 0.60, 0.90, 1.20 V while the trap is occupied, centred\n")
	p("  on its stationary occupancy p = τe/(τc + τe). Mean capture and emission\n")
	p("  times depend on the device and the bias: τc = τc0·exp(−(Vg − 0.6 V)/0.35 V),\n")
	p("  τe = τe0·exp((Vg − 0.6 V)/0.6 V). The trap dominates the 1/f noise: its\n")
	p("  variance depth²·p(1 − p) exceeds the 1/f variance in every such trace.\n")
	p("  Class **stochastic**, like every fresh trace.\n")
	p("- **Current instability** (stressed, Vg = 1.20 V, D01..D05; D06 does not\n")
	p("  develop one and stays stochastic): the observed coordinate of a deterministic\n")
	p("  system from `github.com/tracesift/tracesift/generators`, standardised over the record and scaled to\n")
	p("  an rms modulation (depth) of a few per cent of the mean current; each\n")
	p("  generator sample (the system's own dt) becomes one %g ms sample, which puts\n", 1e3*Interval)
	p("  the dominant frequencies between a few tens of Hz (lobe or scroll switching\n")
	p("  of Lorenz and Chua) and about 200 Hz. The 1/f and read-out noise of the\n")
	p("  trace are then rescaled together so that their variance over the\n")
	p("  record is exactly the oscillation's variance divided by 10^(SNR/10). With\n")
	p("  SNR ≥ 20 dB the noise variance is at most 1 %% of the oscillation's, so the\n")
	p("  deterministic part dominates by construction. The class is the generator's own\n")
	p("  label at the settings used (computed from the equations by\n")
	p("  `generators.System.Class`):\n\n")
	p("  | device | system | settings | depth | SNR (dB) | class |\n")
	p("  |---|---|---|---|---|---|\n")
	for _, s := range specs {
		if o := s.Oscillation; o != nil {
			p("  | %s | `%s` | %s | %.1f %% | %g | %s |\n", s.Device, o.System, overridesText(o.Overrides), 100*o.Depth, o.SNRdB, s.Class)
		}
	}
	p("\n")

	p("## All traces\n\n")
	p("| file | class | seed | mean Id (A) | construction |\n")
	p("|---|---|---|---|---|\n")
	for _, s := range specs {
		p("| `%s` | %s | %d | %.3e | %s |\n", s.Path(), s.Class, s.Seed, s.Mean, s.Mechanism())
	}
	p("\n")

	p("## Regenerate and check\n\n")
	p("From the repository root:\n\n")
	p("```\ngo run testdata/demo/mkdemo.go      # rewrites this directory\ngo test ./internal/demo             # regenerates into a temporary directory and compares\n```\n\n")
	p("The test compares every file byte for byte with the committed copies (gzip\n")
	p("files by their decompressed content) on amd64 with GOAMD64 v1 or v2, where\n")
	p("the files were made and the compiler fuses no multiply-adds; elsewhere fused\n")
	p("multiply-adds may change the last bits of a chaotic orbit, which then grow, so\n")
	p("there it checks everything but the trace bytes. It also\n")
	p("reads every file with `trace.ReadFile`, checks `%s` against the\n", LabelsFile)
	p("construction and checks the SNR of every oscillating trace.\n\n")

	p("## Caution\n\n")
	p("This is **not real measurement data** and says nothing about any real device,\n")
	p("process or laboratory. It exists to demonstrate and test tracesift. On real\n")
	p("data, tracesift's verdict (chaotic, stochastic, regular or undetermined) is a\n")
	p("screening aid that points to where heavier analysis is worth the time; it does\n")
	p("not replace, and defers to, the laboratory's own qualification procedures and\n")
	p("the applicable reliability standards.\n")

	return b.Bytes(), nil
}

// scaled returns v times a.
func scaled(v []float64, a float64) []float64 {
	out := make([]float64, len(v))
	for i, x := range v {
		out[i] = a * x
	}
	return out
}

// joinF formats values with format and joins them as "a, b and c".
func joinF(v []float64, format string) string {
	parts := make([]string, len(v))
	for i, x := range v {
		parts[i] = fmt.Sprintf(format, x)
	}
	if len(parts) < 2 {
		return strings.Join(parts, "")
	}
	return strings.Join(parts[:len(parts)-1], ", ") + " and " + parts[len(parts)-1]
}
