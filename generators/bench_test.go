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
