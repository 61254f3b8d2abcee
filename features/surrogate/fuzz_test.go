package surrogate

import (
	"encoding/binary"
	"math"
	"slices"
	"testing"
)

// FuzzGenerate feeds arbitrary series (8 bytes per value) to every method:
// no panic, errors only for the documented bad inputs, finite output of
// the right length, and the values kept where the method promises it.
func FuzzGenerate(f *testing.F) {
	seed := make([]byte, 8*16)
	for i := range 16 {
		binary.LittleEndian.PutUint64(seed[8*i:], math.Float64bits(float64(i*i%7)))
	}
	f.Add(seed, uint8(0), uint64(1))
	f.Add(seed[:8*9], uint8(3), uint64(2))
	f.Fuzz(func(t *testing.T, data []byte, m uint8, s uint64) {
		x := make([]float64, len(data)/8)
		for i := range x {
			x[i] = math.Float64frombits(binary.LittleEndian.Uint64(data[8*i:]))
		}
		method := Methods()[int(m)%len(Methods())]
		set, err := Generate(x, Options{Method: method, Count: 2, Seed: s, MaxIter: 20, EndMatch: m&8 != 0})
		if err != nil {
			return
		}
		// Values of huge magnitude can overflow inside the FFT: the FT
		// method then has no finite answer; the rank-based ones still do.
		for _, sur := range set.Surrogates {
			if set.Truncation == nil && len(sur) != len(x) {
				t.Fatalf("length %d, want %d", len(sur), len(x))
			}
			if method == Shuffle || method == AAFT || method == IAAFT {
				used := x
				if tr := set.Truncation; tr != nil {
					used = x[tr.Start : tr.Start+tr.Len]
				}
				if !slices.Equal(sortedCopy(sur), sortedCopy(used)) {
					t.Fatal("values not kept")
				}
			}
			if method == Gauss {
				for _, v := range sur {
					if math.IsNaN(v) || math.IsInf(v, 0) {
						t.Fatalf("gauss: non-finite %g", v)
					}
				}
			}
		}
	})
}

// FuzzParseMethod: ParseMethod never panics and accepts only the names.
func FuzzParseMethod(f *testing.F) {
	for _, s := range []string{"iaaft", "FT", "", "gauss ", "wavelet"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		m, err := ParseMethod(s)
		if err == nil && !slices.Contains(Methods(), m) {
			t.Fatalf("ParseMethod(%q) = %q", s, m)
		}
	})
}
