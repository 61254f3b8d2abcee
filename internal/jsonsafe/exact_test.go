package jsonsafe

import (
	"encoding/json"
	"math"
	"math/rand/v2"
	"testing"
)

// Every float64 bit pattern except NaN payloads comes back identical
// through encoding/json: the shortest round-trip decimal is exact by the
// definition of strconv.FormatFloat(f, 'g', -1, 64) (Go documentation:
// "the smallest number of digits necessary to represent the value
// uniquely"); NaN comes back as a NaN; ±Inf and the signed zeros as
// themselves.
func TestExactRoundTrip(t *testing.T) {
	vals := []float64{0, math.Copysign(0, -1), 1, -1, 0.1, 1e-300, 5e-324, math.MaxFloat64, -math.MaxFloat64,
		math.SmallestNonzeroFloat64, math.Inf(1), math.Inf(-1), math.NaN(), 1.0 / 3, 123456789.123456789}
	rng := rand.New(rand.NewPCG(1, 2))
	for range 2000 {
		f := math.Float64frombits(rng.Uint64())
		if !math.IsNaN(f) {
			vals = append(vals, f)
		}
	}
	for _, v := range vals {
		b, err := json.Marshal(Exact(v))
		if err != nil {
			t.Fatalf("%v: %v", v, err)
		}
		var back Exact
		if err := json.Unmarshal(b, &back); err != nil {
			t.Fatalf("%v: %s: %v", v, b, err)
		}
		if math.IsNaN(v) {
			if !math.IsNaN(float64(back)) {
				t.Errorf("NaN came back as %v", back)
			}
			continue
		}
		if math.Float64bits(float64(back)) != math.Float64bits(v) {
			t.Errorf("%v (%s) came back as %v", v, b, back)
		}
	}
	for _, bad := range []string{`"1"`, `"NaN"`, `true`, `"inf"`} {
		var e Exact
		if err := json.Unmarshal([]byte(bad), &e); err == nil {
			t.Errorf("%s accepted as %v", bad, e)
		}
	}
}
