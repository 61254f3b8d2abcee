package figure

import (
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
)

// labels returns the String forms of the major ticks.
func labels(ts []Tick) []string {
	var out []string
	for _, t := range ts {
		if !t.Minor {
			out = append(out, t.Label.String())
		}
	}
	return out
}

// TestTickLabels checks tick values and labels on ranges chosen to cross
// the fixed/scientific boundaries. Expected labels follow from the
// definitions: nice steps of 1, 2, 5 × 10^k (about five intervals), fixed
// notation when every value (or the step) lies in [10⁻³, 10⁵), decimals
// of the step, and in scientific notation the digits from the largest
// exponent down to the step's.
func TestTickLabels(t *testing.T) {
	cases := []struct {
		name   string
		ticks  []Tick
		labels string
	}{
		{"linear fractions", Linear(-0.3, 1.7, 5), "0.0 0.5 1.0 1.5"},
		{"linear negative", Linear(-10, 10, 5), "−10 −5 0 5 10"},
		{"linear thousands", Linear(0, 20000, 5), "0 5000 10000 15000 20000"},
		// 0…10⁵ by 2×10⁴: per-tick rules would write 80000 but 1e+05.
		{"linear to 1e5", Linear(0, 100000, 5), "0 2.0×10^4 4.0×10^4 6.0×10^4 8.0×10^4 1.0×10^5"},
		{"linear millions", Linear(0, 4e6, 4), "0 1×10^6 2×10^6 3×10^6 4×10^6"},
		// Step 10⁻⁴: 0.0001 and 0.001 would mix 1e-04 with 0.001.
		{"linear tiny step", Linear(0, 0.0005, 5), "0 1×10^−4 2×10^−4 3×10^−4 4×10^−4 5×10^−4"},
		{"linear small", Linear(0.001, 0.006, 5), "0.001 0.002 0.003 0.004 0.005 0.006"},
		{"linear halves", Linear(2, 3, 4), "2.0 2.5 3.0"},
		// Decades from 10⁻⁵ to 1: 1e-05 beside 0.0001 is the defect.
		{"log probabilities", Log(2e-6, 1), "10^−5 10^−4 10^−3 10^−2 10^−1 10^0"},
		{"log small range", Log(0.01, 1.5), "0.01 0.1 1"},
		{"log with 2 and 5", Log(1e3, 1e5), "10^3 2×10^3 5×10^3 10^4 2×10^4 5×10^4 10^5"},
		{"log fixed with 2 and 5", Log(1, 90), "1 2 5 10 20 50"},
		{"log fixed decades", Log(1, 150), "1 10 100"},
		{"log throughput", Log(1.2e4, 6e7), "10^5 10^6 10^7"},
	}
	for _, c := range cases {
		if got := strings.Join(labels(c.ticks), " "); got != c.labels {
			t.Errorf("%s: labels %q, want %q", c.name, got, c.labels)
		}
	}
	if got := strings.Join(labelStrings(FormatEach([]float64{500, 1000, 2000, 5000, 20000})), " "); got != "500 1000 2000 5000 20000" {
		t.Errorf("lengths: %q", got)
	}
	if got := strings.Join(labelStrings(FormatEach([]float64{1000, 1e5, 1e6})), " "); got != "10^3 10^5 10^6" {
		t.Errorf("decades: %q", got)
	}
	if got := strings.Join(labelStrings(FormatEach([]float64{2.5e-5, 1e-4, 0})), " "); got != "2.5×10^−5 10^−4 0" {
		t.Errorf("mixed mantissas: %q", got)
	}
}

func labelStrings(ls []Label) []string {
	out := make([]string, len(ls))
	for i, l := range ls {
		out[i] = l.String()
	}
	return out
}

// parseLabel reads a label back as a number.
func parseLabel(t *testing.T, l Label) float64 {
	t.Helper()
	m := strings.Replace(l.Mant, "−", "-", 1)
	if l.Sci && l.Mant == "" {
		m = "1"
	}
	v, err := strconv.ParseFloat(m, 64)
	if err != nil {
		t.Fatalf("label %q: %v", l.String(), err)
	}
	if l.Sci && l.Mant != "0" {
		v *= math.Pow(10, float64(l.Exp))
	}
	return v
}

// TestLinearTicksNeverMix draws axes over scales from 10⁻⁹ to 10⁹ and
// checks, on every axis: one notation for all non-zero labels, the same
// number of decimals (fixed) or mantissa digits (scientific) on every
// label, and labels that read back as their tick values (so no two ticks
// share a label).
func TestLinearTicksNeverMix(t *testing.T) {
	rng := rand.New(rand.NewPCG(15, 1))
	for k := 0; k < 3000; k++ {
		scale := math.Pow(10, -9+18*rng.Float64())
		lo := (rng.Float64()*2 - 1) * scale * 10 * rng.Float64()
		hi := lo + scale*(0.5+10*rng.Float64())
		n := 5 + rng.IntN(5) // at least two steps fit, so at least two ticks
		ts := Linear(lo, hi, n)
		if len(ts) < 2 {
			t.Fatalf("[%g, %g]/%d: %d ticks", lo, hi, n, len(ts))
		}
		step := ts[1].Value - ts[0].Value
		sci, shape := -1, -1
		for _, tk := range ts {
			l := tk.Label
			if l.Mant == "0" {
				continue
			}
			s := 0
			if l.Sci {
				s = 1
			}
			if sci >= 0 && s != sci {
				t.Fatalf("[%g, %g]: notations mixed: %v", lo, hi, labels(ts))
			}
			sci = s
			// Digits after the decimal point of the fixed label or
			// mantissa.
			d := 0
			if i := strings.IndexByte(l.Mant, '.'); i >= 0 {
				d = len(l.Mant) - i - 1
			}
			if shape >= 0 && d != shape {
				t.Fatalf("[%g, %g]: decimals differ: %v", lo, hi, labels(ts))
			}
			shape = d
			if v := parseLabel(t, l); math.Abs(v-tk.Value) > 1e-6*math.Abs(step) {
				t.Fatalf("[%g, %g]: label %q reads %g, tick at %g", lo, hi, l.String(), v, tk.Value)
			}
		}
	}
}

// TestLogTicksNeverMix checks log axes over 10⁻¹² … 10¹²: one notation
// for all labels, every label reading back as its value, decades always
// labelled.
func TestLogTicksNeverMix(t *testing.T) {
	rng := rand.New(rand.NewPCG(15, 2))
	for k := 0; k < 2000; k++ {
		lo := math.Pow(10, -12+20*rng.Float64())
		hi := lo * math.Pow(10, 0.3+5*rng.Float64())
		ts := Log(lo, hi)
		sci := -1
		for _, tk := range ts {
			if tk.Minor {
				if tk.Label != (Label{}) {
					t.Fatalf("minor tick %g labelled %q", tk.Value, tk.Label.String())
				}
				continue
			}
			s := 0
			if tk.Label.Sci {
				s = 1
			}
			if sci >= 0 && s != sci {
				t.Fatalf("[%g, %g]: notations mixed: %v", lo, hi, labels(ts))
			}
			sci = s
			if v := parseLabel(t, tk.Label); math.Abs(v-tk.Value) > 1e-9*tk.Value {
				t.Fatalf("[%g, %g]: label %q reads %g, tick at %g", lo, hi, tk.Label.String(), v, tk.Value)
			}
		}
		for e := math.Ceil(math.Log10(lo) - 1e-9); math.Pow(10, e) <= hi*(1+1e-9); e++ {
			found := false
			for _, tk := range ts {
				found = found || !tk.Minor && math.Abs(tk.Value/math.Pow(10, e)-1) < 1e-9
			}
			if !found {
				t.Fatalf("[%g, %g]: decade 10^%g unlabelled: %v", lo, hi, e, labels(ts))
			}
		}
	}
}

func TestNiceStep(t *testing.T) {
	// 1, 2, 5 × 10^k at or above the raw step (definition).
	for _, c := range []struct{ raw, want float64 }{{0.3, 0.5}, {1, 1}, {1.01, 2}, {4.9, 5}, {7, 10}, {0.0012, 0.002}, {-1, 1}} {
		if got := NiceStep(c.raw); math.Abs(got-c.want) > 1e-12*c.want {
			t.Errorf("NiceStep(%g) = %g, want %g", c.raw, got, c.want)
		}
	}
}
