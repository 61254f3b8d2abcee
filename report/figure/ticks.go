package figure

import (
	"math"
	"strconv"
	"strings"
)

// Label is a tick label in one of two notations. In fixed notation Mant is
// the whole number ("0.25", "−3", "20000"); in scientific notation the
// label is Mant × 10^Exp, written as the power alone when Mant is empty (an
// exact power of ten). Negative numbers carry a minus sign (U+2212), not a
// hyphen. Zero is written "0" in either notation.
type Label struct {
	Sci  bool
	Mant string
	Exp  int
}

// String writes the label as text, marking the exponent of a scientific
// label with a caret ("2.5×10^−5", "10^3"); Superscript draws such text
// with the exponent raised.
func (l Label) String() string {
	if !l.Sci || l.Mant == "0" {
		return l.Mant
	}
	p := "10^" + minus(strconv.Itoa(l.Exp))
	if l.Mant == "" {
		return p
	}
	return l.Mant + "×" + p
}

// Tick is one axis tick: a value, its label, and whether it is a minor
// tick (drawn short, without label or grid line).
type Tick struct {
	Value float64
	Label Label
	Minor bool
}

// Fixed notation is used when every non-zero value of an axis (or its
// step, whichever is larger) lies in [fixedMin, fixedMax): labels stay at
// most six characters long ("0.001", "20000"). Outside, the whole axis is
// written in scientific notation.
const (
	fixedMin = 1e-3
	fixedMax = 1e5
)

// Linear returns the major ticks of a linear axis [lo, hi]: multiples of a
// "nice" step of 1, 2 or 5 × 10^k near (hi − lo)/n, labelled by
// FormatStep. It returns nil unless hi > lo.
func Linear(lo, hi float64, n int) []Tick {
	if !(hi > lo) || n < 1 {
		return nil
	}
	step := NiceStep((hi - lo) / float64(n))
	var vs []float64
	start := math.Ceil(lo/step - 1e-9)
	for k := start; k*step <= hi*(1+1e-12)+step*1e-9; k++ {
		v := k * step
		if math.Abs(v) < step*1e-9 {
			v = 0
		}
		vs = append(vs, v)
	}
	labels := FormatStep(vs, step)
	out := make([]Tick, len(vs))
	for i, v := range vs {
		out[i] = Tick{Value: v, Label: labels[i]}
	}
	return out
}

// NiceStep rounds raw up to 1, 2 or 5 × 10^k (1 for a raw step that is not
// positive and finite).
func NiceStep(raw float64) float64 {
	if !(raw > 0) || math.IsInf(raw, 0) {
		return 1
	}
	p := math.Pow(10, math.Floor(math.Log10(raw)))
	switch m := raw / p; {
	case m <= 1:
		return p
	case m <= 2:
		return 2 * p
	case m <= 5:
		return 5 * p
	}
	return 10 * p
}

// Log returns the ticks of a log axis [lo, hi] (0 < lo < hi): every
// integer multiple of each decade, labelled at the decades and, when the
// axis spans less than about two and a half decades, also at 2 and 5 ×
// 10^k; the others are minor. Labels are written by FormatEach, so a whole
// axis is either fixed ("0.01", "0.1", "1", "10") or powers of ten.
func Log(lo, hi float64) []Tick {
	if !(lo > 0) || !(hi > lo) || math.IsInf(hi, 0) {
		return nil
	}
	a, b := math.Floor(math.Log10(lo)+1e-9), math.Ceil(math.Log10(hi)-1e-9)
	few := b-a < 2.5
	var out []Tick
	var labelled []int
	for e := a; e <= b; e++ {
		for m := 1; m <= 9; m++ {
			v := float64(m) * math.Pow10(int(e))
			if v < lo*(1-1e-9) || v > hi*(1+1e-9) {
				continue
			}
			major := m == 1 || few && (m == 2 || m == 5)
			if major {
				labelled = append(labelled, len(out))
			}
			out = append(out, Tick{Value: v, Minor: !major})
		}
	}
	vs := make([]float64, len(labelled))
	for i, k := range labelled {
		vs[i] = out[k].Value
	}
	for i, l := range FormatEach(vs) {
		out[labelled[i]].Label = l
	}
	return out
}

// fixedFits reports whether every non-zero value, taken at least as large
// as floor, lies in the fixed-notation range.
func fixedFits(vs []float64, floor float64) bool {
	for _, v := range vs {
		if v == 0 || math.IsNaN(v) {
			continue
		}
		a := math.Max(math.Abs(v), floor)
		if math.IsInf(a, 0) || a >= fixedMax || a < fixedMin {
			return false
		}
	}
	return true
}

// FormatStep labels the values of an evenly spaced axis with the given
// step. The notation is fixed when every non-zero value (at least the
// step) lies in [10⁻³, 10⁵), and scientific otherwise; in fixed notation
// every label has the decimals the step needs, in scientific notation
// every mantissa has the significant digits the largest value needs to
// resolve the step.
func FormatStep(vs []float64, step float64) []Label {
	out := make([]Label, len(vs))
	step = math.Abs(step)
	if !(step > 0) || math.IsInf(step, 0) {
		return FormatEach(vs)
	}
	if fixedFits(vs, step) {
		dec := decimals(step)
		for i, v := range vs {
			out[i] = Label{Mant: fixedText(v, dec)}
		}
		return out
	}
	// Significant digits: the largest exponent down to the step's last
	// significant digit.
	stepE, stepDigits := sciParts(step)
	top := stepE
	for _, v := range vs {
		if v != 0 && finiteF(v) {
			e, _ := sciParts(v)
			top = max(top, e)
		}
	}
	d := top - stepE + stepDigits - 1
	for i, v := range vs {
		out[i] = sciLabel(v, d, false)
	}
	return out
}

// FormatEach labels values that are not evenly spaced (the decades of a
// log axis, a list of series lengths), each with the digits it needs, in
// one notation for all: fixed when every non-zero value lies in
// [10⁻³, 10⁵), scientific otherwise, where exact powers of ten are written
// as the power alone and other mantissas share one number of decimals.
func FormatEach(vs []float64) []Label {
	out := make([]Label, len(vs))
	if fixedFits(vs, 0) {
		for i, v := range vs {
			out[i] = Label{Mant: fixedText(v, -1)}
		}
		return out
	}
	d := 0
	for _, v := range vs {
		if v != 0 && finiteF(v) {
			_, digits := sciParts(v)
			d = max(d, digits-1)
		}
	}
	for i, v := range vs {
		out[i] = sciLabel(v, d, true)
	}
	return out
}

// sciLabel writes v as a mantissa with d decimals times a power of ten;
// with bare, an exact power of ten is written as the power alone.
func sciLabel(v float64, d int, bare bool) Label {
	switch {
	case v == 0:
		return Label{Sci: true, Mant: "0"}
	case !finiteF(v):
		return Label{Sci: true, Mant: special(v)}
	}
	s := strconv.FormatFloat(v, 'e', d, 64)
	k := strings.IndexByte(s, 'e')
	e, _ := strconv.Atoi(s[k+1:])
	mant := s[:k]
	if bare {
		if m, err := strconv.ParseFloat(mant, 64); err == nil && m == 1 {
			mant = ""
		}
	}
	return Label{Sci: true, Mant: minus(mant), Exp: e}
}

// sciParts returns the decimal exponent of v and the number of significant
// digits of its shortest representation (after rounding to 12 digits, which
// removes the noise of k·step arithmetic).
func sciParts(v float64) (exp, digits int) {
	s := strconv.FormatFloat(round12(math.Abs(v)), 'e', -1, 64)
	k := strings.IndexByte(s, 'e')
	exp, _ = strconv.Atoi(s[k+1:])
	digits = len(strings.Replace(s[:k], ".", "", 1))
	return exp, digits
}

// decimals returns the number of decimals that write step exactly (to 12
// significant digits), 0 for whole numbers.
func decimals(step float64) int {
	s := strconv.FormatFloat(round12(step), 'f', -1, 64)
	if k := strings.IndexByte(s, '.'); k >= 0 {
		return len(s) - k - 1
	}
	return 0
}

// fixedText writes v with dec decimals (the shortest exact form for dec <
// 0) and a minus sign; negative zero is written as zero.
func fixedText(v float64, dec int) string {
	if !finiteF(v) {
		return special(v)
	}
	if dec < 0 {
		v = round12(v)
	}
	s := strconv.FormatFloat(v, 'f', dec, 64)
	if strings.Trim(s, "-0.") == "" {
		s = strings.TrimPrefix(s, "-")
	}
	return minus(s)
}

// round12 rounds v to 12 significant digits.
func round12(v float64) float64 {
	if v == 0 || !finiteF(v) {
		return v
	}
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 12, 64), 64)
	return r
}

func special(v float64) string {
	switch {
	case math.IsInf(v, 1):
		return "∞"
	case math.IsInf(v, -1):
		return "−∞"
	}
	return "NaN"
}

func finiteF(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// minus replaces the ASCII hyphen of a negative number by a minus sign.
func minus(s string) string { return strings.Replace(s, "-", "−", 1) }
