package report

import (
	"io"
	"testing"
)

// benchBuild measures Build on a 10^4-sample Hénon trace (the model is
// trained once, outside the timer).
func benchBuild(b *testing.B, opts Options) {
	m := model(b)
	tr := henonTrace(b, 10000, 1e-6, 5e-6)
	b.ResetTimer()
	for b.Loop() {
		if _, err := Build(tr, m, opts); err != nil {
			b.Fatal(err)
		}
	}
	_ = m
}

// BenchmarkBuild10k is the whole report with the default options: the
// determinism test with 39 IAAFT surrogates of the middle 4096 samples.
func BenchmarkBuild10k(b *testing.B) { benchBuild(b, Options{Seed: 1}) }

// BenchmarkBuild10kFeatureTests adds rank tests of four features (time
// asymmetry, forecast decay, permutation entropy, HVG tail rate) with the
// 159 surrogates Holm's adjustment over four needs: the cost of --stat.
func BenchmarkBuild10kFeatureTests(b *testing.B) {
	benchBuild(b, Options{Seed: 1, Stats: []string{"nl_trev_1", "nl_fc_drop_10", "op_ent_d4", "hv_tail_exprate"}})
}

// BenchmarkBuild10kNoSurrogates is everything but the surrogate test.
func BenchmarkBuild10kNoSurrogates(b *testing.B) { benchBuild(b, Options{Seed: 1, Surrogates: -1}) }

// BenchmarkBuild1e6NoSurrogates: a long trace (verdict in 8 windows,
// graphs on the middle 2^16 samples, plane on the whole trace).
func BenchmarkBuild1e6NoSurrogates(b *testing.B) {
	m := model(b)
	tr := henonTrace(b, 1_000_000, 1, 0)
	b.ResetTimer()
	for b.Loop() {
		if _, err := Build(tr, m, Options{Seed: 1, Surrogates: -1}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkWriteHTML is the rendering alone.
func BenchmarkWriteHTML(b *testing.B) {
	r, err := Build(henonTrace(b, 10000, 1e-6, 5e-6), model(b), Options{Seed: 1, Surrogates: 39})
	if err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for b.Loop() {
		if err := r.WriteHTML(io.Discard); err != nil {
			b.Fatal(err)
		}
	}
}
