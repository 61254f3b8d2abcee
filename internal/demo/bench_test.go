package demo

import "testing"

// BenchmarkSynthesize builds every trace of the campaign once per
// iteration (36 × 4096 samples).
func BenchmarkSynthesize(b *testing.B) {
	specs := Campaign()
	for b.Loop() {
		for _, s := range specs {
			if _, err := Synthesize(s); err != nil {
				b.Fatal(err)
			}
		}
	}
}

// BenchmarkRender formats one plain CSV trace.
func BenchmarkRender(b *testing.B) {
	s := Campaign()[0]
	c, err := Synthesize(s)
	if err != nil {
		b.Fatal(err)
	}
	id := c.Current()
	b.ResetTimer()
	for b.Loop() {
		if _, err := Render(s, id); err != nil {
			b.Fatal(err)
		}
	}
}
