package visibility

import (
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/networks"
)

// moveSeries returns the series of TestMoveLeftGraphsBitIdentical: white
// noise, a random walk, a logistic-map orbit, integers 0..4 (ties) and a
// noisy sine, each from its own fixed seed.
func moveSeries(kind string, n int) []float64 {
	rng := rand.New(rand.NewPCG(uint64(n), 0x6d6f7665))
	x := make([]float64, n)
	v, l := 0.0, 0.3141
	for i := range x {
		switch kind {
		case "white":
			x[i] = rng.NormFloat64()
		case "walk":
			v += rng.NormFloat64()
			x[i] = v
		case "logistic":
			l = 4 * l * (1 - l)
			x[i] = l
		case "ints":
			x[i] = float64(rng.IntN(5))
		case "sine":
			x[i] = math.Sin(2*math.Pi*float64(i)/37.3) + 0.1*rng.NormFloat64()
		}
	}
	return x
}

// graphDigest hashes a graph's CSR arrays, its in-degrees and the JSON of
// its metrics (JSON writes the shortest decimal that reads back as the
// same float64, so equal JSON means bit-identical values).
func graphDigest(t *testing.T, g *networks.Graph, m networks.Metrics) string {
	t.Helper()
	h := sha256.New()
	off, adj := g.CSR()
	binary.Write(h, binary.LittleEndian, off)
	binary.Write(h, binary.LittleEndian, adj)
	for i := 0; i < g.Len(); i++ {
		binary.Write(h, binary.LittleEndian, int32(g.InDegree(i)))
	}
	// Fields added after the move (degree-tail model comparison, exact
	// diameter) are left out: the pins cover what existed before it.
	m.TailModels, m.DiameterExact = nil, nil
	b, err := json.Marshal(m)
	if err != nil {
		t.Fatal(err)
	}
	h.Write(b)
	return hex.EncodeToString(h.Sum(nil))[:16]
}

// TestMoveLeftGraphsBitIdentical pins the CSR arrays and every metric of
// visibility graphs of five kinds of series at 3000 and 20000 samples. The
// digests were computed at commit ed4cbf8, before the graph code moved out
// of features/visibility (issue 16), so the move is proven to change no
// graph and no metric, bit for bit.
func TestMoveLeftGraphsBitIdentical(t *testing.T) {
	want := map[string]string{
		"ints/20000/hvg":     "ee283ad580e0dc5e",
		"ints/20000/nvg":     "be64355deb1a7c66",
		"ints/3000/hvg":      "d0519b3c5f15f2bc",
		"ints/3000/nvg":      "305f801a8e14b8a6",
		"logistic/20000/hvg": "7b076217b49d9374",
		"logistic/20000/nvg": "a7d8634ad2e3d034",
		"logistic/3000/hvg":  "bd9eb52d60dce79e",
		"logistic/3000/nvg":  "8db3be5462ff4f09",
		"sine/20000/hvg":     "6ef6cdcfc4a553a0",
		"sine/20000/nvg":     "c9722a069ffe7081",
		"sine/3000/hvg":      "29c3dcb8ba69810a",
		"sine/3000/nvg":      "9102eee7947e1e50",
		"walk/20000/hvg":     "e712ef64daa99493",
		"walk/20000/nvg":     "1f5c311aae8ec5e5",
		"walk/3000/hvg":      "a291592edbeb64ef",
		"walk/3000/nvg":      "0e9e1ceefe333446",
		"white/20000/hvg":    "6a2c08aa86cc83fa",
		"white/20000/nvg":    "f964c75542fc6af2",
		"white/3000/hvg":     "a68a1e84d57933f4",
		"white/3000/nvg":     "feb5d0a00d64ca68",
	}
	got := map[string]string{}
	for _, kind := range []string{"white", "walk", "logistic", "ints", "sine"} {
		for _, n := range []int{3000, 20000} {
			x := moveSeries(kind, n)
			for _, k := range []networks.Kind{networks.KindNVG, networks.KindHVG} {
				g, err := Build(x, k, Options{})
				if err != nil {
					t.Fatal(err)
				}
				m, err := networks.Measure(g, networks.MeasureOptions{Seed: 5, Sources: 24})
				if err != nil {
					t.Fatal(err)
				}
				got[fmt.Sprintf("%s/%d/%v", kind, n, k)] = graphDigest(t, g, m)
			}
		}
	}
	for k, v := range got {
		if w := want[k]; w != v {
			t.Errorf("%s: digest %s, want %s", k, v, w)
		}
	}
}
