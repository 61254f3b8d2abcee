package generators

import (
	"encoding/binary"
	"hash/fnv"
	"math"
	"runtime"
	"testing"
)

// seriesHash is the FNV-1a hash of the IEEE-754 bits of x (little endian).
func seriesHash(x []float64) uint64 {
	h := fnv.New64a()
	var b [8]byte
	for _, v := range x {
		binary.LittleEndian.PutUint64(b[:], math.Float64bits(v))
		h.Write(b[:])
	}
	return h.Sum64()
}

// TestGenerateBitIdentical pins the output of Generate (n = 1000, seed 7)
// for the systems registered before the per-series labels, the observed
// coordinate and the hook that draws the initial condition were added:
// those changes must not alter a single bit of what the systems produced
// (the hashes were recorded from the code before the change). The
// observed coordinate obs = 0 is the default, so it is covered too. Go
// fuses multiply-adds on some architectures (arm64, ppc64le, s390x), which
// changes the last bits of floating-point results, so the pins hold on
// amd64 only.
func TestGenerateBitIdentical(t *testing.T) {
	if runtime.GOARCH != "amd64" {
		t.Skipf("hashes recorded on amd64; %s may fuse multiply-adds", runtime.GOARCH)
	}
	pins := []struct {
		name string
		set  map[string]float64
		hash uint64
	}{
		{"ar1", nil, 0xabf00def8f8d845e},
		{"arma21", nil, 0x1a733aa35dfbb43a},
		{"bilinear", nil, 0x18017043c3ddcc9d},
		{"brownian", nil, 0xdc055e808a08ee2b},
		{"chua", nil, 0x72d4daeb197efec2},
		{"cubic", nil, 0x5e94e8d71cd3f99f},
		{"delayed-logistic", nil, 0x87f8f4a2b2a162bb},
		{"drift-walk", nil, 0x9a3f17399229ea58},
		{"duffing", nil, 0x4e049c2311801e7b},
		{"fbm", nil, 0xabed21ad949805c9},
		{"fgn", nil, 0xd0d7920833c7af1b},
		{"garch", nil, 0xdc9a1d9508fbe13f},
		{"gauss-map", nil, 0xda9a892d09f7607f},
		{"henon", nil, 0x5172d449044e1555},
		{"hyper-rossler", nil, 0x351d6bbac2c2f78a},
		{"ikeda", nil, 0x354e4139ffab3489},
		{"logistic", nil, 0x98d186152d63d406},
		{"logistic-periodic", nil, 0x97a68dc9d9ac5486},
		{"lorenz", nil, 0x2f26bffffc809d05},
		{"lorenz-periodic", nil, 0x4662d7d92f3f5425},
		{"lorenz96", nil, 0x5d1e0aeee5d67ecc},
		{"lozi", nil, 0x5aaaa4e3744c1194},
		{"mackey-glass", nil, 0x22a6ce8b3229ab2b},
		{"nlma", nil, 0x65a1fe03c2446f63},
		{"noisy-sine", nil, 0x866c645716341933},
		{"ou", nil, 0x77dd5a61e9c7f292},
		{"powerlaw", nil, 0x5320930eef16fafa},
		{"rossler", nil, 0x44086157c71d31c8},
		{"rossler-periodic", nil, 0xf2c57a39e699b35b},
		{"sawtooth", nil, 0x93dcbac8fc5ac435},
		{"shot-noise", nil, 0x9a7d7730fadf61a0},
		{"sine", nil, 0x2c0721b00f38b031},
		{"sine-map", nil, 0x65d2b3f3eb09474b},
		{"square", nil, 0xcdd1e3249c180265},
		{"student-t", nil, 0x9f0816b56307fd90},
		{"tar", nil, 0xe86f2f06ee8aa70d},
		{"telegraph", nil, 0x285db692e65ac6d8},
		{"telegraph-sum", nil, 0xb2f6334ff9616347},
		{"tent", nil, 0x84ea4f85f86546ca},
		{"tinkerbell", nil, 0x27d0d17e7d7b7ca2},
		{"two-tone", nil, 0x396d837195c5ace0},
		{"van-der-pol", nil, 0x4a29acf78307d1ef},
		{"white", nil, 0x1dea8c493765ba7b},
		{"lorenz", map[string]float64{"dt": 0.05, "rho": 350}, 0x6eb96b8b2ec8f9b1},
		{"henon", map[string]float64{"a": 1}, 0xc261a3bdaf7a2716},
		{"duffing", map[string]float64{"gamma": 0.3}, 0x3e9f6605b0d60829},
		{"lorenz96", map[string]float64{"n": 20}, 0x8fea7f8806e6f93},
	}
	for _, p := range pins {
		s, err := Lookup(p.name)
		if err != nil {
			t.Fatal(err)
		}
		x, err := s.Generate(1000, p.set, newRand(7))
		if err != nil {
			t.Fatalf("%s %v: %v", p.name, p.set, err)
		}
		if h := seriesHash(x); h != p.hash {
			t.Errorf("%s %v: hash %#x, pinned %#x: the series changed", p.name, p.set, h, p.hash)
		}
	}
}
