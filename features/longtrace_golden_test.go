package features

import (
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"math"
	"testing"
)

// vectorDigest is the first 16 hex digits of the SHA-256 of a vector's
// names, value bits and reasons, in order.
func vectorDigest(v Vector) string {
	h := sha256.New()
	var b [8]byte
	for i, n := range v.Names {
		h.Write([]byte(n))
		binary.LittleEndian.PutUint64(b[:], math.Float64bits(v.Values[i]))
		h.Write(b[:])
		h.Write([]byte(v.Reasons[i]))
		h.Write([]byte{0})
	}
	return hex.EncodeToString(h.Sum(nil))[:16]
}

// The default model was trained on features of series of 512–20000
// samples, and every trace up to DefaultWindow samples must keep its
// vector bit for bit: the schema and the vectors of series from 300 to
// 10^5 samples are those the code gave before long traces were measured in
// windows. Source of the digests: this test's vectors computed at commit
// 8a36f58 (before windowing), on unquantised series, so that the grid
// test leaves them as generated.
func TestShortTraceVectorsUnchanged(t *testing.T) {
	if got, want := SchemaHash(), "7dc314a2608b0621"; got != want {
		t.Errorf("SchemaHash %s, want %s (the default model's schema)", got, want)
	}
	if DefaultWindow < 100_000 {
		t.Errorf("DefaultWindow %d: traces of 10^5 samples would be windowed", DefaultWindow)
	}
	cases := []struct {
		sys    string
		n      int
		seed   uint64
		digest string
	}{
		{"white", 300, 1, "96e7177e7418a63d"},
		{"henon", 20000, 2, "43c19a09df273440"},
		{"lorenz", 20000, 3, "e3167f3e73943c76"},
		{"brownian", 100000, 4, "8ce34eb732ac18fc"},
		{"ar1", 100000, 5, "737c569970015c81"},
	}
	for _, c := range cases {
		if testing.Short() && c.n > 20000 {
			continue
		}
		v, err := Extract(series(t, c.sys, c.n, c.seed), Options{Seed: 7})
		if err != nil {
			t.Fatal(err)
		}
		if v.Windows != 1 || v.WindowLength != c.n || v.Spread != nil {
			t.Errorf("%s n=%d: measured in %d windows of %d (spread %v), want whole", c.sys, c.n, v.Windows, v.WindowLength, v.Spread != nil)
		}
		if got := vectorDigest(v); got != c.digest {
			t.Errorf("%s n=%d seed=%d: vector digest %s, want %s (the vector before windowing)", c.sys, c.n, c.seed, got, c.digest)
		}
	}
}
