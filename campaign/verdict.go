package campaign

import (
	"fmt"
	"math"
	"slices"
)

// TraceVerdict is the classifier's verdict on one trace of the campaign.
type TraceVerdict struct {
	File   string  `json:"file"`
	Group  string  `json:"group"`
	Device string  `json:"device"`
	Level  string  `json:"level"`
	Param  float64 `json:"param"`
	// Class is the verdict (one of Classes, or Undetermined); Top the most
	// probable class.
	Class         string    `json:"class"`
	Top           string    `json:"top"`
	Classes       []string  `json:"classes"`
	Probabilities []float64 `json:"probabilities"`
	Model         string    `json:"model"`
}

// addVerdict adds a verdict row to the trace.
func (t *traceData) addVerdict(r Row) {
	if t.verdict == nil {
		t.verdict = &Verdict{}
	}
	v := t.verdict
	if v.Model != "" && v.Model != r.Condition {
		t.mixedModels = true
	}
	v.Model = r.Condition
	if r.N == 1 {
		v.Class = r.Name
	}
	if r.Name != Undetermined {
		v.Classes = append(v.Classes, r.Name)
		v.Probabilities = append(v.Probabilities, r.Value)
	}
}

// checkVerdict puts the classes in alphabetical order (so rows in any
// order give the same verdict) and checks that the rows named exactly one
// verdict class.
func (t *traceData) checkVerdict() error {
	v := t.verdict
	if v == nil {
		return nil
	}
	if v.Class == "" {
		return fmt.Errorf("%s: verdict rows mark no class as the verdict (n = 1): %w", t.id, ErrTable)
	}
	if t.mixedModels {
		return fmt.Errorf("%s: verdict rows name different models: %w", t.id, ErrTable)
	}
	sortByKey(v.Classes, v.Probabilities)
	if v.Class != Undetermined && !slices.Contains(v.Classes, v.Class) {
		return fmt.Errorf("%s: verdict %q is not among the classes %v: %w", t.id, v.Class, v.Classes, ErrTable)
	}
	return nil
}

// verdicts lists the traces' verdicts in the canonical trace order.
func (a *analysis) verdicts() {
	for _, t := range a.traces {
		v := t.verdict
		if v == nil {
			continue
		}
		top, best := "", math.Inf(-1)
		for i, p := range v.Probabilities {
			if p > best {
				top, best = v.Classes[i], p
			}
		}
		a.rep.Verdicts = append(a.rep.Verdicts, TraceVerdict{File: t.id, Group: t.group, Device: t.device,
			Level: a.rep.Levels[a.level(t)].Level, Param: t.param, Class: v.Class, Top: top,
			Classes: v.Classes, Probabilities: v.Probabilities, Model: v.Model})
	}
}

// VerdictModels returns the models that gave the verdicts, sorted.
func (r Report) VerdictModels() []string {
	seen := map[string]bool{}
	for _, v := range r.Verdicts {
		seen[v.Model] = true
	}
	return sortedKeys(seen)
}

// VerdictClasses returns the classes that occur in the verdicts: the
// model's classes in alphabetical order, then Undetermined when some
// verdict is.
func (r Report) VerdictClasses() []string {
	seen := map[string]bool{}
	und := false
	for _, v := range r.Verdicts {
		for _, c := range v.Classes {
			seen[c] = true
		}
		und = und || v.Class == Undetermined
	}
	out := sortedKeys(seen)
	if und {
		out = append(out, Undetermined)
	}
	return out
}
