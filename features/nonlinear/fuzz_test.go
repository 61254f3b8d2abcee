package nonlinear

import (
	"encoding/binary"
	"math"
	"testing"
)

// floatsFromBytes decodes little-endian float64s, at most 400.
func floatsFromBytes(b []byte) []float64 {
	n := min(len(b)/8, 400)
	x := make([]float64, n)
	for i := range x {
		x[i] = math.Float64frombits(binary.LittleEndian.Uint64(b[8*i:]))
	}
	return x
}

// FuzzSampleEntropyExact checks on arbitrary inputs that the fast counts
// equal the O(N²) definition (reference: naiveSampEnCounts) and that no
// input panics.
func FuzzSampleEntropyExact(f *testing.F) {
	f.Add([]byte{0, 0, 0, 0, 0, 0, 0xf0, 0x3f, 0, 0, 0, 0, 0, 0, 0, 0x40}, uint8(2), 0.2)
	seed := make([]byte, 8*60)
	for i := 0; i < 60; i++ {
		binary.LittleEndian.PutUint64(seed[8*i:], math.Float64bits(math.Sin(float64(i*i))))
	}
	f.Add(seed, uint8(1), 0.5)
	f.Fuzz(func(t *testing.T, b []byte, m uint8, r float64) {
		x := floatsFromBytes(b)
		mm := int(m%4) + 1
		if !(r > 0 && r < 10) {
			r = 0.2
		}
		res, err := SampleEntropy(x, SampEnOptions{M: mm, R: r})
		if err != nil {
			return
		}
		a, bb := naiveSampEnCounts(x, mm, res.Tolerance)
		if a != res.A || bb != res.B {
			t.Fatalf("fast A=%d B=%d, naive A=%d B=%d", res.A, res.B, a, bb)
		}
	})
}

// FuzzMeasures feeds arbitrary short series to every estimator: errors are
// fine, panics are not.
func FuzzMeasures(f *testing.F) {
	seed := make([]byte, 8*300)
	for i := 0; i < 300; i++ {
		binary.LittleEndian.PutUint64(seed[8*i:], math.Float64bits(float64(i%7)))
	}
	f.Add(seed)
	f.Fuzz(func(t *testing.T, b []byte) {
		x := floatsFromBytes(b)
		Embed(x, EmbedOptions{MaxDim: 4})
		Lyapunov(x, LyapunovOptions{Embed: EmbedOptions{MaxDim: 4}})
		CorrelationDimension(x, CorrDimOptions{Embed: EmbedOptions{MaxDim: 4}})
		ZeroOne(x, ZeroOneOptions{NumC: 5})
		Prediction(x, PredictionOptions{Embed: EmbedOptions{MaxDim: 4}})
		Asymmetry(x, AsymmetryOptions{})
		SampleEntropy(x, SampEnOptions{})
	})
}
