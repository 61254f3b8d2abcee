package generators

import "testing"

// Benchmarks generate 10^5 samples per operation at the registry defaults
// (the lengths the feature pipeline sees); run with
// go test -bench . -run ^$ ./generators.

func benchSystem(b *testing.B, name string) {
	s, err := Lookup(name)
	if err != nil {
		b.Fatal(err)
	}
	g, _, err := s.New(nil)
	if err != nil {
		b.Fatal(err)
	}
	rng := newRand(1)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := g.Generate(100000, rng); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkLogistic(b *testing.B)     { benchSystem(b, "logistic") }
func BenchmarkHenon(b *testing.B)        { benchSystem(b, "henon") }
func BenchmarkLorenz(b *testing.B)       { benchSystem(b, "lorenz") }
func BenchmarkRossler(b *testing.B)      { benchSystem(b, "rossler") }
func BenchmarkMackeyGlass(b *testing.B)  { benchSystem(b, "mackey-glass") }
func BenchmarkLorenz96(b *testing.B)     { benchSystem(b, "lorenz96") }
func BenchmarkFGN(b *testing.B)          { benchSystem(b, "fgn") }
func BenchmarkPowerLaw(b *testing.B)     { benchSystem(b, "powerlaw") }
func BenchmarkTelegraphSum(b *testing.B) { benchSystem(b, "telegraph-sum") }
func BenchmarkStudentT(b *testing.B)     { benchSystem(b, "student-t") }

// BenchmarkFGNMillion: fGn of 10^6 samples (Davies–Harte, FFT of 2·10^6).
func BenchmarkFGNMillion(b *testing.B) {
	rng := newRand(1)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := (FGN{H: 0.7}).Generate(1000000, rng); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkLorenzLabel: the Lorenz label rule (variational equations over
// 300 time units), uncached.
func BenchmarkLorenzLabel(b *testing.B) {
	s, _ := Lookup("lorenz")
	p := s.Defaults()
	for b.Loop() {
		if _, err := s.lyap(p); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkClassFrom: one per-series label (ClassFrom) per operation at
// the defaults, for every system with a per-series rule; run with
// go test -bench ClassFrom -run ^$ ./generators. cpu-ms/op is the CPU time
// of the benchmark's thread, which a loaded machine does not inflate.
func BenchmarkClassFrom(b *testing.B) {
	for _, s := range All() {
		if s.initial == nil {
			continue
		}
		b.Run(s.Name, func(b *testing.B) {
			rng := newRand(1)
			benchCPU(b, func() error {
				_, err := s.ClassFrom(nil, rng)
				return err
			})
		})
	}
}

// BenchmarkGenerate10k: 10^4 samples per operation at the defaults, for
// every system; run with go test -bench Generate10k -run ^$ ./generators.
func BenchmarkGenerate10k(b *testing.B) {
	for _, s := range All() {
		b.Run(s.Name, func(b *testing.B) {
			rng := newRand(1)
			benchCPU(b, func() error {
				_, err := s.Generate(10000, nil, rng)
				return err
			})
		})
	}
}

// benchCPU runs op b.N times on one locked thread and reports its CPU time
// per operation in milliseconds beside the wall time.
func benchCPU(b *testing.B, op func() error) {
	lockThread()
	defer unlockThread()
	c0 := threadCPU()
	var ops int
	for b.Loop() {
		if err := op(); err != nil {
			b.Fatal(err)
		}
		ops++
	}
	b.ReportMetric(float64(threadCPU()-c0)/1e6/float64(ops), "cpu-ms/op")
}
