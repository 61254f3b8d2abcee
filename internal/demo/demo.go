// Package demo generates the bundled demo data set of tracesift: a small,
// SYNTHETIC measurement campaign in an invented scenario. The Thistlewick
// Microdevices Reliability Lab does not exist; neither do its wafer TW-W07,
// its six transistors D01..D06 or its stress recipe. Every trace is made by
// the generators package from fixed seeds, so the data set is reproducible
// bit for bit and every class label is true by construction.
//
// The campaign: 6 devices, each measured FRESH and after a hot-carrier
// STRESS, at gate biases 0.60, 0.90 and 1.20 V — 36 drain-current traces of
// Samples samples at Interval seconds. Campaign lists them; Synthesize builds
// one trace and its components; Write writes the trace files, labels.csv and
// README.md into a directory. testdata/demo/mkdemo.go calls Write, and the
// package test regenerates the set and compares it with the committed files.
//
// Construction rules (the README written by Write states them with numbers):
//
//   - fresh devices: 1/f-like noise (a superposition of telegraph sources,
//     or power-law spectral synthesis) plus white read-out noise; the
//     relative 1/f amplitude falls with bias. Class stochastic.
//   - stressed devices, stochastic traces: one dominant trap (a random
//     telegraph signal) on top of a stronger 1/f noise, plus read-out noise.
//   - stressed devices at 1.20 V, four of six: a chaotic current
//     oscillation (the first coordinate of a chaotic flow or delay equation,
//     normalised and scaled to a fractional modulation of the mean current)
//     plus noise scaled to an exact signal-to-noise ratio of 20 dB or more
//     over the record. Class chaotic.
//   - one stressed device at 1.20 V: a periodic (limit-cycle) oscillation
//     with noise 30 dB below it. Class regular.
package demo

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"github.com/tracesift/tracesift/generators"
)

// Scenario constants. All names are invented for this demo.
const (
	// Lab is the fictional laboratory.
	Lab = "Thistlewick Microdevices Reliability Lab"
	// Wafer is the fictional wafer all devices come from.
	Wafer = "TW-W07"
	// StressRecipe describes the fictional hot-carrier stress.
	StressRecipe = "TW-HC3 hot-carrier stress: Vd = 2.0 V, Vg = 1.0 V, 2000 s at 25 °C"
	// DrainBias is the drain voltage of every read-out (linear regime), V.
	DrainBias = 0.05

	// Samples is the length of every trace.
	Samples = 4096
	// Interval is the sample interval in seconds (10 kHz).
	Interval = 1e-4
	// Digits is the number of significant digits printed for currents.
	Digits = 7

	// CampaignSeed is the second PCG seed word of every trace; the first is
	// Spec.Seed: rng = rand.New(rand.NewPCG(Spec.Seed, CampaignSeed)).
	CampaignSeed uint64 = 20260707

	// LabelsFile is the name of the label table Write creates.
	LabelsFile = "labels.csv"
	// ReadmeFile is the name of the description Write creates.
	ReadmeFile = "README.md"
)

// Condition is the state of a device when it was measured.
type Condition string

// The two conditions of the campaign.
const (
	Fresh    Condition = "fresh"
	Stressed Condition = "stressed"
)

// Format is the file layout a trace is written in.
type Format string

// File layouts. All carry a two-line "#" comment preamble that says the data
// are synthetic, then a header, then Samples rows of time (s) and Id (A).
const (
	// FormatCSV: comma-delimited, decimal point, header "time (s),Id (A)".
	FormatCSV Format = "csv"
	// FormatEuropean: a European instrument export — semicolon-delimited,
	// decimal commas, upper-case exponent, CRLF line ends, three non-comment
	// preamble lines and the header "Zeit [s];Id [A]".
	FormatEuropean Format = "csv-semicolon-decimal-comma"
	// FormatGzip: FormatCSV compressed with gzip (name ends in .csv.gz).
	FormatGzip Format = "csv.gz"
)

// Flicker is the 1/f-like component of a trace.
type Flicker struct {
	// System is the generators entry: "telegraph-sum" (McWhorter-style sum
	// of telegraph sources) or "powerlaw" (1/f^β spectral synthesis).
	System string
	// Overrides are the generator parameters (nil means defaults).
	Overrides map[string]float64
	// RMS is the root-mean-square of the component over the record,
	// relative to the mean current (0.01 = 1 %).
	RMS float64
}

// Trap is one dominant charge trap: a random telegraph signal that lowers
// the current by Depth·Mean while the trap is occupied.
type Trap struct {
	Depth       float64 // current drop while occupied, relative to the mean current
	TauCapture  float64 // mean time empty before a capture, s
	TauEmission float64 // mean time occupied before an emission, s
}

// Oscillation is a deterministic current instability: the observed
// coordinate of a registered deterministic system, normalised to zero mean
// and unit variance over the record, times Depth·Mean. The trace's other
// components (Flicker and read-out) are then rescaled together so that
// their variance over the record is exactly var(oscillation)/10^(SNRdB/10).
type Oscillation struct {
	System    string             // generators entry, e.g. "rossler"
	Overrides map[string]float64 // parameters (nil means defaults)
	Depth     float64            // RMS modulation relative to the mean current
	SNRdB     float64            // oscillation-to-noise variance ratio, dB
}

// Spec describes one trace of the campaign.
type Spec struct {
	Device    string           // "D01".."D06"
	Condition Condition        // Fresh or Stressed
	Vg        float64          // gate bias, V
	Class     generators.Class // true class by construction
	Format    Format           // file layout
	Seed      uint64           // first PCG seed word (CampaignSeed is the second)

	Mean    float64 // mean drain current, A
	Flicker Flicker // 1/f-like component
	// Trap is the dominant single trap (nil: none).
	Trap *Trap
	// Readout is the standard deviation of the white read-out noise, A.
	Readout float64
	// Oscillation is the deterministic instability (nil: none). When set,
	// Flicker.RMS and Readout only fix the mix of the noise, whose total
	// variance is set by Oscillation.SNRdB.
	Oscillation *Oscillation
}

// Path returns the file name of the trace relative to the data set
// directory, with forward slashes: "<condition>/<device>_<condition>_Vg<bias>.csv"
// (".csv.gz" for FormatGzip), the bias with two decimals, e.g.
// "stressed/D03_stressed_Vg0.90.csv". The regular expression
// `Vg([0-9]+\.[0-9]+)` extracts the bias.
func (s Spec) Path() string {
	ext := ".csv"
	if s.Format == FormatGzip {
		ext = ".csv.gz"
	}
	return fmt.Sprintf("%s/%s_%s_Vg%.2f%s", s.Condition, s.Device, s.Condition, s.Vg, ext)
}

// Mechanism returns a one-line description of how the trace is built.
func (s Spec) Mechanism() string {
	var parts []string
	if o := s.Oscillation; o != nil {
		parts = append(parts, fmt.Sprintf("%s oscillation %s, depth %.1f %%, SNR %g dB", o.System, overridesText(o.Overrides), 100*o.Depth, o.SNRdB))
		parts = append(parts, fmt.Sprintf("noise: %s + white read-out", s.Flicker.System))
		return strings.Join(parts, "; ")
	}
	if t := s.Trap; t != nil {
		parts = append(parts, fmt.Sprintf("RTS depth %.1f %%, τc %.2f ms, τe %.2f ms", 100*t.Depth, 1e3*t.TauCapture, 1e3*t.TauEmission))
	}
	parts = append(parts, fmt.Sprintf("%s 1/f %.2f %% rms", s.Flicker.System, 100*s.Flicker.RMS))
	parts = append(parts, fmt.Sprintf("read-out %.1f nA rms", 1e9*s.Readout))
	return strings.Join(parts, "; ")
}

// overridesText renders parameter overrides as "(k=v, ...)" in the order
// of the system's parameter list, or "(defaults)".
func overridesText(o map[string]float64) string {
	if len(o) == 0 {
		return "(defaults)"
	}
	keys := make([]string, 0, len(o))
	for k := range o {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	var b strings.Builder
	b.WriteByte('(')
	for i, k := range keys {
		if i > 0 {
			b.WriteString(", ")
		}
		fmt.Fprintf(&b, "%s=%g", k, o[k])
	}
	b.WriteByte(')')
	return b.String()
}

// Biases are the gate biases of the campaign, V.
var Biases = [3]float64{0.60, 0.90, 1.20}

// Devices are the device names of the campaign.
var Devices = [6]string{"D01", "D02", "D03", "D04", "D05", "D06"}

// Scenario tables. Index order follows Biases and Devices.
var (
	// freshMean is the mean drain current of a nominal fresh device, A.
	freshMean = [3]float64{1.3e-6, 4.2e-6, 9.1e-6}
	// deviceSpread is each device's current relative to nominal
	// (device-to-device variability).
	deviceSpread = [6]float64{1.031, 0.976, 1.012, 0.958, 1.047, 0.989}
	// stressLoss is the current retained after stress (threshold-voltage
	// shift hurts most at low overdrive).
	stressLoss = [3]float64{0.91, 0.94, 0.96}
	// freshFlicker is the relative 1/f rms of a fresh device; stress
	// multiplies it by stressFlickerGain (new traps).
	freshFlicker      = [3]float64{0.012, 0.008, 0.0055}
	stressFlickerGain = 1.4
	// trapDepth is the relative current drop of the dominant trap.
	trapDepth = [3]float64{0.07, 0.045, 0.03}
	// trapTau0 are each device's capture and emission times at 0.60 V, s.
	// Capture speeds up with gate bias, emission slows down:
	// τc(Vg) = τc0·exp(−(Vg − 0.6)/0.35 V), τe(Vg) = τe0·exp((Vg − 0.6)/0.6 V).
	trapTau0 = [6][2]float64{{8e-3, 3e-3}, {5e-3, 6e-3}, {12e-3, 4e-3}, {4e-3, 9e-3}, {7e-3, 2.5e-3}, {10e-3, 5e-3}}
	// readout is the white read-out noise of the (fictional) instrument, A.
	readout = 1.5e-9
)

// flickerSources are the generator settings of the 1/f components. The
// telegraph sum uses 40 sources with time constants log-uniform in
// [0.2 ms, 2 s], so its spectrum is ≈ 1/f from about 0.16 Hz to 1.6 kHz
// (corners 1/(π τ)); the power-law synthesis uses β = 1.
func flickerSource(device int) (string, map[string]float64) {
	if device%2 == 0 { // D01, D03, D05
		return "telegraph-sum", map[string]float64{"k": 40, "tau_min": 2e-4, "tau_max": 2, "dt": Interval}
	}
	return "powerlaw", map[string]float64{"beta": 1}
}

// instabilities are the stressed 1.20 V traces with a deterministic
// oscillation, by device index. D06 (index 5) has none: it stays stochastic.
var instabilities = map[int]Oscillation{
	0: {System: "rossler", Depth: 0.060, SNRdB: 25},
	1: {System: "lorenz", Depth: 0.050, SNRdB: 22},
	2: {System: "van-der-pol", Overrides: map[string]float64{"mu": 1.5}, Depth: 0.040, SNRdB: 30},
	3: {System: "mackey-glass", Depth: 0.070, SNRdB: 28},
	4: {System: "chua", Depth: 0.055, SNRdB: 21},
}

// formatOf returns the file layout of a trace: device D06 was read on the
// lab's second bench, whose software exports European CSV; the traces of
// D02 and D04 come from the lab's archive, gzip-compressed (which also keeps
// the data set under 2.5 MB: 4096 rows of about 20 bytes make 80 kB per
// plain file); the rest are plain CSV.
func formatOf(device int) Format {
	switch device {
	case 5:
		return FormatEuropean
	case 1, 3:
		return FormatGzip
	}
	return FormatCSV
}

// Campaign returns the 36 trace specifications in a fixed order: by
// condition (fresh, stressed), then device, then bias. The seed of device
// d (1..6), condition c (1 fresh, 2 stressed) and bias b (1..3) is
// 1000·d + 100·c + b. The class of a trace is that of its Oscillation's
// system (computed by generators.System.Class) when it has one, and
// stochastic otherwise.
func Campaign() []Spec {
	specs := make([]Spec, 0, 2*len(Devices)*len(Biases))
	for ci, cond := range []Condition{Fresh, Stressed} {
		for d, dev := range Devices {
			for b, vg := range Biases {
				s := Spec{
					Device:    dev,
					Condition: cond,
					Vg:        vg,
					Class:     generators.Stochastic,
					Format:    formatOf(d),
					Seed:      uint64(1000*(d+1) + 100*(ci+1) + b + 1),
					Mean:      freshMean[b] * deviceSpread[d],
					Readout:   readout,
				}
				sys, ov := flickerSource(d)
				s.Flicker = Flicker{System: sys, Overrides: ov, RMS: freshFlicker[b]}
				if cond == Stressed {
					s.Mean *= stressLoss[b]
					s.Flicker.RMS *= stressFlickerGain
					if osc, ok := instabilities[d]; ok && b == len(Biases)-1 {
						o := osc
						s.Oscillation = &o
						s.Class = instabilityClass[o.System]
					} else {
						dv := vg - Biases[0]
						s.Trap = &Trap{
							Depth:       trapDepth[b],
							TauCapture:  trapTau0[d][0] * math.Exp(-dv/0.35),
							TauEmission: trapTau0[d][1] * math.Exp(dv/0.6),
						}
					}
				}
				specs = append(specs, s)
			}
		}
	}
	return specs
}

// instabilityClass is the class of each oscillation system at the settings
// used; the package test checks it against generators.System.Class, which
// computes it from the equations.
var instabilityClass = map[string]generators.Class{
	"rossler":      generators.Chaotic,
	"lorenz":       generators.Chaotic,
	"mackey-glass": generators.Chaotic,
	"chua":         generators.Chaotic,
	"van-der-pol":  generators.Regular,
}
