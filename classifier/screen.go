package classifier

import (
	"cmp"
	"fmt"
	"math"
	"slices"

	"github.com/tracesift/tracesift/features"
)

// ScreenOptions configures Screen. The zero value selects the defaults.
type ScreenOptions struct {
	// Interval is the sample interval in seconds, 0 when unknown; it
	// enables the mains-interference warning.
	Interval float64
	// Window is the longest stretch measured at once (default 16384
	// samples, inside the 512–20000 range of the reference set): a longer
	// trace is measured in up to MaxWindows evenly spaced windows of this
	// length, and their class probabilities are averaged.
	Window, MaxWindows int
	// Drivers is the number of features reported as driving the verdict
	// (default 5).
	Drivers int
	// Features configures the feature extraction (its Seed).
	Features features.Options
}

func (o ScreenOptions) withDefaults() ScreenOptions {
	if o.Window <= 0 {
		o.Window = 16384
	}
	if o.MaxWindows <= 0 {
		o.MaxWindows = 8
	}
	if o.Drivers <= 0 {
		o.Drivers = 5
	}
	return o
}

// Verdict is the screening answer for one trace.
type Verdict struct {
	// Class is chaotic, regular, stochastic or undetermined; Top is the
	// most probable class even when Class is undetermined.
	Class string
	Top   string
	// Classes and Probabilities are the model's classes and the class
	// probabilities (averaged over windows).
	Classes       []string
	Probabilities []float64
	// Reasons says why the verdict is undetermined.
	Reasons []string
	// Novelty is the multivariate distance of the trace's features from
	// the training set (see Novelty; the window with the median percentile
	// for long traces); nil for a model without a novelty index. It, not
	// any single feature, decides whether the trace lies outside what the
	// model can place.
	Novelty *Novelty
	// Drivers are the features that moved the top class's probability most
	// (Saabas contributions averaged over windows), largest first.
	Drivers []Driver
	// Warnings are recording-quality warnings (see QualityWarnings) and
	// notes on imputed features.
	Warnings []string
	// Vector is the feature vector (of the whole trace, or the per-feature
	// median over the windows).
	Vector features.Vector
	// Windows and WindowLength say how the trace was measured.
	Windows, WindowLength int
}

// Screen classifies the trace x with model m: quality warnings, feature
// extraction (in windows for long traces), class probabilities, the
// features behind the decision and the undetermined rule of the model.
func Screen(m *Model, x []float64, opts ScreenOptions) (Verdict, error) {
	o := opts.withDefaults()
	v := Verdict{Classes: m.Classes, Warnings: QualityWarnings(x, o.Interval)}
	starts := windowStarts(len(x), o.Window, o.MaxWindows)
	v.Windows, v.WindowLength = len(starts), min(len(x), o.Window)
	probs := make([]float64, len(m.Classes))
	var preds []Prediction
	outCount := map[string]int{}
	imputed := map[string]bool{}
	var vectors []features.Vector
	for _, s := range starts {
		seg := x[s : s+v.WindowLength]
		fv, err := features.Extract(seg, o.Features)
		if err != nil {
			return Verdict{}, err
		}
		vectors = append(vectors, fv)
		xs, _, err := m.Align(fv.Names, fv.Values)
		if err != nil {
			return Verdict{}, err
		}
		p, err := m.Predict(xs)
		if err != nil {
			return Verdict{}, err
		}
		for i, q := range p.Probabilities {
			probs[i] += q / float64(len(starts))
		}
		preds = append(preds, p)
		for _, f := range p.OutOfRange {
			outCount[f]++
		}
		for _, f := range p.Imputed {
			if !features.MissingByNature(f) {
				imputed[f] = true
			}
		}
	}
	v.Probabilities = probs
	top := 0
	for i := range probs {
		if probs[i] > probs[top] {
			top = i
		}
	}
	v.Top = m.Classes[top]
	v.Vector = medianVector(vectors)
	// Saabas contributions explain a window's own top class, so average
	// those of the windows that agree with the pooled verdict.
	contrib := make([]float64, len(m.Features))
	agree := 0
	for _, p := range preds {
		if p.Index == top {
			agree++
			for j, c := range p.Contributions {
				contrib[j] += c
			}
		}
	}
	for j := range contrib {
		contrib[j] /= float64(max(agree, 1))
	}
	for j, name := range m.Features {
		val, _ := v.Vector.Get(name)
		v.Drivers = append(v.Drivers, Driver{Feature: name, Value: val, Contribution: contrib[j]})
	}
	slices.SortStableFunc(v.Drivers, func(a, b Driver) int {
		return compareAbs(b.Contribution, a.Contribution)
	})
	v.Drivers = v.Drivers[:min(o.Drivers, len(v.Drivers))]

	if probs[top] < m.Config.MinProbability {
		v.Reasons = append(v.Reasons, fmt.Sprintf("top probability %.2f is below %.2f", probs[top], m.Config.MinProbability))
	}
	var out []string
	for _, f := range m.Features {
		if 2*outCount[f] > len(starts) {
			out = append(out, f)
		}
	}
	if m.novelty != nil {
		var novs []*Novelty
		for _, p := range preds {
			novs = append(novs, p.Novelty)
		}
		slices.SortStableFunc(novs, func(a, b *Novelty) int { return cmp.Compare(a.Percentile, b.Percentile) })
		v.Novelty = novs[(len(novs)-1)/2]
		if v.Novelty.Percentile > v.Novelty.Limit {
			v.Reasons = append(v.Reasons, fmt.Sprintf("unlike the training set: %s, above the limit %.3g", v.Novelty, v.Novelty.Limit))
		}
		if len(out) > 0 {
			v.Warnings = append(v.Warnings, fmt.Sprintf("outside the training range (noted; the novelty measure decides): %s", joinNames(out)))
		}
	} else if len(out) > 0 {
		v.Reasons = append(v.Reasons, fmt.Sprintf("outside the training range: %s", joinNames(out)))
	}
	if len(imputed) > 0 {
		var names []string
		for _, f := range m.Features {
			if imputed[f] {
				names = append(names, f)
			}
		}
		v.Warnings = append(v.Warnings, fmt.Sprintf("not computable for this trace, replaced by the training median: %s", joinNames(names)))
	}
	v.Class = v.Top
	if len(v.Reasons) > 0 {
		v.Class = UndeterminedLabel
	}
	return v, nil
}

// windowStarts places up to k windows of length w evenly over n samples;
// one window of the whole trace when n ≤ w.
func windowStarts(n, w, k int) []int {
	if n <= w {
		return []int{0}
	}
	count := min(k, (n+w-1)/w)
	if count < 2 {
		return []int{0}
	}
	starts := make([]int, count)
	for i := range starts {
		starts[i] = int(math.Round(float64(i) * float64(n-w) / float64(count-1)))
	}
	return starts
}

// medianVector returns the per-feature median over vectors, ignoring
// missing values; a feature missing everywhere keeps the first reason.
func medianVector(vs []features.Vector) features.Vector {
	if len(vs) == 1 {
		return vs[0]
	}
	out := features.Vector{Names: vs[0].Names, Values: make([]float64, len(vs[0].Names)), Reasons: make([]string, len(vs[0].Names))}
	for j := range out.Names {
		var vals []float64
		for _, v := range vs {
			if !math.IsNaN(v.Values[j]) {
				vals = append(vals, v.Values[j])
			}
		}
		if len(vals) == 0 {
			out.Values[j] = math.NaN()
			out.Reasons[j] = vs[0].Reasons[j]
			continue
		}
		out.Values[j] = median(vals)
	}
	for _, v := range vs {
		out.N += v.N
	}
	return out
}

func compareAbs(a, b float64) int {
	switch x, y := math.Abs(a), math.Abs(b); {
	case x < y:
		return -1
	case x > y:
		return 1
	}
	return 0
}

func joinNames(names []string) string {
	const most = 6
	if len(names) > most {
		return fmt.Sprintf("%s and %d more", joinNames(names[:most]), len(names)-most)
	}
	s := ""
	for i, n := range names {
		if i > 0 {
			s += ", "
		}
		s += n
	}
	return s
}
