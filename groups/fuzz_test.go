package groups

import (
	"encoding/binary"
	"math"
	"testing"
)

// decodeSamples turns fuzz bytes into two small samples of bounded,
// finite values (few distinct values, so ties are frequent).
func decodeSamples(data []byte) (a, b []float64) {
	for i := 0; i+1 < len(data) && len(a)+len(b) < 40; i += 2 {
		v := float64(int8(data[i+1])) / 8
		if data[i]%2 == 0 {
			a = append(a, v)
		} else {
			b = append(b, v)
		}
	}
	return a, b
}

// FuzzTwoSample checks, on arbitrary small samples, that the tests never
// fail on finite input, that p-values lie in [0, 1], that D and δ lie in
// their ranges, that the exact KS p-value equals brute-force enumeration
// for tiny samples, and that HodgesLehmann equals the brute-force median.
func FuzzTwoSample(f *testing.F) {
	f.Add([]byte{0, 1, 1, 2, 0, 3, 1, 4, 0, 5, 1, 6})
	f.Add([]byte{0, 9, 0, 9, 1, 9, 1, 9})
	seed := make([]byte, 8)
	binary.LittleEndian.PutUint64(seed, 0x0123456789abcdef)
	f.Add(seed)
	f.Fuzz(func(t *testing.T, data []byte) {
		a, b := decodeSamples(data)
		if len(a) == 0 || len(b) == 0 {
			return
		}
		ks, err := KS(a, b, KSOptions{})
		if err != nil || ks.P < 0 || ks.P > 1 || ks.D < 0 || ks.D > 1 {
			t.Fatalf("KS %+v %v", ks, err)
		}
		if len(a)+len(b) <= 14 {
			h := int(math.Round(ks.D * float64(len(a)*len(b))))
			if want := ksBrute(len(a), len(b), h); h > 0 && math.Abs(ks.P-want) > 1e-13 {
				t.Fatalf("KS p %v, enumeration %v", ks.P, want)
			}
		}
		for _, m := range []Method{MethodAuto, MethodAsymptotic} {
			mw, err := MannWhitney(a, b, MWOptions{Method: m})
			if err != nil || !(mw.P >= 0 && mw.P <= 1) || mw.U < 0 || mw.U > float64(len(a)*len(b)) {
				t.Fatalf("MW %+v %v", mw, err)
			}
		}
		if d := CliffDelta(a, b); d < -1 || d > 1 {
			t.Fatalf("δ = %v", d)
		}
		if got, want := HodgesLehmann(a, b), medianPairwise(a, b); got != want {
			t.Fatalf("HL %v, brute %v", got, want)
		}
	})
}
