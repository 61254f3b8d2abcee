package nonlinear

import (
	"fmt"
	"syscall"
	"testing"
	"time"

	"github.com/tracesift/tracesift/generators"
)

// cpuTime returns the process's user+system CPU time. Benchmarks report it
// per operation (cpu-ms/op) beside the wall time, because the machine the
// figures come from is shared and wall time overstates the cost.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// benchLoop runs f b.N times and reports CPU milliseconds per call.
func benchLoop(b *testing.B, f func()) {
	b.ResetTimer()
	c0 := cpuTime()
	for i := 0; i < b.N; i++ {
		f()
	}
	b.StopTimer()
	b.ReportMetric(float64(cpuTime()-c0)/float64(b.N)/1e6, "cpu-ms/op")
}

var benchSystems = []struct {
	name string
	g    generators.Generator
}{
	{"lorenz", lorenz},
	{"white", white},
}

// benchInput returns a series and its (fixed) embedding options.
func benchInput(b *testing.B, g generators.Generator, n int) ([]float64, EmbedOptions) {
	x := series(b, g, n, 1)
	e, err := Embed(x, EmbedOptions{})
	if err != nil {
		b.Fatal(err)
	}
	return x, e.Fixed()
}

func BenchmarkEmbed(b *testing.B) {
	for _, s := range benchSystems {
		x := series(b, s.g, 100000, 1)
		b.Run(fmt.Sprintf("%s/n=1e5", s.name), func(b *testing.B) {
			benchLoop(b, func() { Embed(x, EmbedOptions{}) })
		})
	}
}

func BenchmarkLyapunov(b *testing.B) {
	for _, s := range benchSystems {
		for _, n := range []int{10000, 100000} {
			x, eo := benchInput(b, s.g, n)
			b.Run(fmt.Sprintf("%s/n=%.0e", s.name, float64(n)), func(b *testing.B) {
				benchLoop(b, func() { Lyapunov(x, LyapunovOptions{Embed: eo}) })
			})
		}
	}
}

func BenchmarkSampleEntropy(b *testing.B) {
	for _, s := range benchSystems {
		for _, n := range []int{10000, 100000} {
			x := series(b, s.g, n, 1)
			b.Run(fmt.Sprintf("%s/n=%.0e", s.name, float64(n)), func(b *testing.B) {
				benchLoop(b, func() { SampleEntropy(x, SampEnOptions{}) })
			})
		}
	}
}

func BenchmarkCorrelationDimension(b *testing.B) {
	for _, s := range benchSystems {
		x, eo := benchInput(b, s.g, 100000)
		b.Run(s.name+"/n=1e5", func(b *testing.B) {
			benchLoop(b, func() { CorrelationDimension(x, CorrDimOptions{Embed: eo}) })
		})
	}
}

func BenchmarkZeroOne(b *testing.B) {
	x := series(b, white, 100000, 1)
	b.Run("n=1e5", func(b *testing.B) {
		benchLoop(b, func() { ZeroOne(x, ZeroOneOptions{}) })
	})
}

func BenchmarkPrediction(b *testing.B) {
	for _, s := range benchSystems {
		x, eo := benchInput(b, s.g, 100000)
		b.Run(s.name+"/n=1e5", func(b *testing.B) {
			benchLoop(b, func() { Prediction(x, PredictionOptions{Embed: eo}) })
		})
	}
}

func BenchmarkAsymmetry(b *testing.B) {
	x := series(b, white, 100000, 1)
	b.Run("n=1e5", func(b *testing.B) {
		benchLoop(b, func() { Asymmetry(x, AsymmetryOptions{}) })
	})
}

// BenchmarkAll is the feature-extractor path: one Reconstruct, then every
// measure on that reconstruction, on a 10^5-sample trace.
func BenchmarkAll(b *testing.B) {
	for _, s := range benchSystems {
		x := series(b, s.g, 100000, 1)
		b.Run(s.name+"/n=1e5", func(b *testing.B) {
			benchLoop(b, func() {
				r, err := Reconstruct(x, EmbedOptions{})
				if err != nil {
					b.Fatal(err)
				}
				r.Lyapunov(LyapunovOptions{})
				r.CorrelationDimension(CorrDimOptions{})
				ZeroOne(x, ZeroOneOptions{})
				r.Prediction(PredictionOptions{})
				Asymmetry(x, AsymmetryOptions{})
				SampleEntropy(x, SampEnOptions{})
			})
		})
	}
}
