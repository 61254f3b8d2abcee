package groups

import (
	"math"
	"math/rand/v2"
	"testing"
)

func BenchmarkKSExact100x100(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 1))
	x, y := normals(rng, 100, 0, 1), normals(rng, 100, 0.3, 1)
	for b.Loop() {
		if _, err := KS(x, y, KSOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkKSExact1000x1000(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 2))
	x, y := normals(rng, 1000, 0, 1), normals(rng, 1000, 0.1, 1)
	for b.Loop() {
		if _, err := KS(x, y, KSOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkKSAsymptotic5000x5000(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 3))
	x, y := normals(rng, 5000, 0, 1), normals(rng, 5000, 0.03, 1)
	for b.Loop() {
		if _, err := KS(x, y, KSOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkKolmogorovSFMatrix(b *testing.B) {
	// N = 500, d = 0.08: k = 41, an 81 × 81 matrix.
	for b.Loop() {
		KolmogorovSF(500, 0.08)
	}
}

func BenchmarkMWExact50x50(b *testing.B) {
	rng := rand.New(rand.NewPCG(2, 1))
	x, y := normals(rng, 50, 0, 1), normals(rng, 50, 0.1, 1)
	for b.Loop() {
		if _, err := MannWhitney(x, y, MWOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkMWAsymptotic1e5(b *testing.B) {
	rng := rand.New(rand.NewPCG(2, 2))
	x, y := normals(rng, 100000, 0, 1), normals(rng, 100000, 0.01, 1)
	for b.Loop() {
		if _, err := MannWhitney(x, y, MWOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkHodgesLehmann1e5(b *testing.B) {
	rng := rand.New(rand.NewPCG(3, 1))
	x, y := normals(rng, 100000, 0, 1), normals(rng, 100000, 0.01, 1)
	for b.Loop() {
		if math.IsNaN(HodgesLehmann(x, y)) {
			b.Fatal("NaN")
		}
	}
}

// BenchmarkCompare: 4 groups × 100 traces × 40 features, all 6 pairs,
// with a parameter at 5 levels.
func BenchmarkCompare(b *testing.B) {
	rng := rand.New(rand.NewPCG(4, 1))
	const nf = 40
	features := make([]string, nf)
	for f := range features {
		features[f] = "feature_" + itoa(f)
	}
	var samples []Sample
	for g := 0; g < 4; g++ {
		for i := 0; i < 100; i++ {
			v := normals(rng, nf, 0.1*float64(g), 1)
			samples = append(samples, Sample{Group: "g" + itoa(g), Param: float64(i % 5), Values: v})
		}
	}
	for b.Loop() {
		if _, err := Compare(features, samples, Options{}); err != nil {
			b.Fatal(err)
		}
	}
}
