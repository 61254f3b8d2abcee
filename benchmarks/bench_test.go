package benchmarks

import "testing"

// BenchmarkInvariants times the whole invariant section at one seed per
// check (every estimator at its stated length).
func BenchmarkInvariants(b *testing.B) {
	o := Options{Seeds: 1, SkipClassification: true, SkipHoldout: true, SkipPictures: true, SkipThroughput: true}
	for b.Loop() {
		if _, err := Run(nil, o); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPictures times the HVG degree distributions and the
// complexity–entropy plane at the Quick sizes.
func BenchmarkPictures(b *testing.B) {
	o := Options{SkipInvariants: true, SkipClassification: true, SkipHoldout: true, SkipThroughput: true}
	for b.Loop() {
		if _, err := Run(nil, o); err != nil {
			b.Fatal(err)
		}
	}
}
