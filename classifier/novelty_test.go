package classifier

import (
	"bytes"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
)

// blobs returns a grouped two-class data set: each group a Gaussian blob in
// 6 features around its own centre.
func blobs(groups, per int, seed uint64) Dataset {
	rng := rand.New(rand.NewPCG(seed, 9))
	ds := Dataset{Features: []string{"a", "b", "c", "d", "e", "f"}}
	for g := 0; g < groups; g++ {
		centre := make([]float64, 6)
		for j := range centre {
			centre[j] = 4 * rng.Float64()
		}
		label := "regular"
		if g%2 == 1 {
			label = "chaotic"
			centre[0] += 6
		}
		for i := 0; i < per; i++ {
			row := make([]float64, 6)
			for j := range row {
				row[j] = centre[j] + 0.5*rng.NormFloat64()
			}
			ds.X = append(ds.X, row)
			ds.Y = append(ds.Y, label)
			ds.Groups = append(ds.Groups, string(rune('A'+g)))
		}
	}
	return ds
}

// TestNoveltyPercentileIsCalibratedOnHeldOutGroups: the reference
// distances are those of training rows to the OTHER groups, so a row of a
// group the index has not seen has a percentile distributed like the
// training rows' own: about 1 − limit of fresh groups' rows lie beyond the
// limit (a conformal argument: exchangeable groups give a uniform rank;
// Vovk, Gammerman & Shafer, Algorithmic Learning in a Random World (2005)).
// A vector at the far corner of every feature is beyond the limit.
func TestNoveltyPercentileIsCalibratedOnHeldOutGroups(t *testing.T) {
	train := blobs(40, 25, 1)
	m, err := Train(train, Config{Trees: 20, Seed: 2})
	if err != nil {
		t.Fatal(err)
	}
	fresh := blobs(40, 25, 77) // new group centres from the same distribution
	var ps []float64
	for _, row := range fresh.X {
		pr, err := m.Predict(row)
		if err != nil {
			t.Fatal(err)
		}
		ps = append(ps, pr.Novelty.Percentile)
	}
	slices.Sort(ps)
	// The median percentile of fresh groups is near one half, and no more
	// than a few percent exceed 0.95.
	if med := ps[len(ps)/2]; med < 0.3 || med > 0.7 {
		t.Errorf("median novelty percentile of fresh groups %.3f, want ≈ 0.5", med)
	}
	above := 0
	for _, p := range ps {
		if p > 0.95 {
			above++
		}
	}
	if f := float64(above) / float64(len(ps)); f > 0.12 {
		t.Errorf("%.3f of fresh rows above the 0.95 percentile, want ≈ 0.05", f)
	}
	far := []float64{100, -100, 100, -100, 100, -100}
	pr, _ := m.Predict(far)
	if !pr.Undetermined || pr.Novelty.Percentile <= pr.Novelty.Limit {
		t.Fatalf("a vector beyond every feature's range is not undetermined: %+v", pr.Novelty)
	}
	if !strings.Contains(strings.Join(pr.Reasons, ";"), "unlike the training set") {
		t.Errorf("reasons do not name the novelty measure: %v", pr.Reasons)
	}
}

// TestNoveltyIsRankInvariant: the measure uses feature percentiles only, so
// a strictly increasing transform of a feature in training and input alike
// leaves it unchanged.
func TestNoveltyIsRankInvariant(t *testing.T) {
	a := blobs(12, 20, 3)
	b := Dataset{Features: a.Features, Y: a.Y, Groups: a.Groups}
	for _, row := range a.X {
		r := slices.Clone(row)
		r[2] = math.Exp(r[2])
		b.X = append(b.X, r)
	}
	ma, _ := Train(a, Config{Trees: 5, Seed: 1})
	mb, _ := Train(b, Config{Trees: 5, Seed: 1})
	x := []float64{1, 2, 3, 1, 2, 3}
	y := slices.Clone(x)
	y[2] = math.Exp(y[2])
	pa, _ := ma.Predict(x)
	pb, _ := mb.Predict(y)
	if math.Abs(pa.Novelty.Distance-pb.Novelty.Distance) > 1e-12 || pa.Novelty.Percentile != pb.Novelty.Percentile {
		t.Errorf("novelty changed under a monotone transform: %+v vs %+v", pa.Novelty, pb.Novelty)
	}
}

// TestNoveltyMissingAndRoundTrip: missing values are skipped, and the index
// survives the model file byte for byte.
func TestNoveltyMissingAndRoundTrip(t *testing.T) {
	ds := blobs(10, 20, 5)
	ds.X[3][1] = math.NaN()
	m, err := Train(ds, Config{Trees: 5, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	x := []float64{1, math.NaN(), 2, 2, 2, 2}
	pr, _ := m.Predict(x)
	if pr.Novelty.Features != 5 {
		t.Errorf("%d features compared, want 5", pr.Novelty.Features)
	}
	var buf bytes.Buffer
	if err := m.Write(&buf); err != nil {
		t.Fatal(err)
	}
	back, err := Read(bytes.NewReader(buf.Bytes()))
	if err != nil {
		t.Fatal(err)
	}
	pb, _ := back.Predict(x)
	if pb.Novelty.Distance != pr.Novelty.Distance || pb.Novelty.Percentile != pr.Novelty.Percentile || !slices.Equal(pb.Novelty.Nearest, pr.Novelty.Nearest) {
		t.Errorf("novelty differs after a round trip: %+v vs %+v", pb.Novelty, pr.Novelty)
	}
	var again bytes.Buffer
	back.Write(&again)
	if !bytes.Equal(buf.Bytes(), again.Bytes()) {
		t.Error("model file not byte-identical after a round trip")
	}
	if len(pr.Novelty.Nearest) == 0 || pr.Novelty.Nearest[0].Group == "" {
		t.Errorf("nearest groups not named: %+v", pr.Novelty.Nearest)
	}
}

// TestOutOfRangeIsANoteWithNovelty: with the novelty index a single feature
// beyond its training range is reported but does not make an otherwise
// clear prediction undetermined.
func TestOutOfRangeIsANoteWithNovelty(t *testing.T) {
	ds := loadIris(t)
	m, err := Train(ds, Config{Trees: 30, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	x := slices.Clone(ds.X[0])
	j := 2
	x[j] = m.Max[j] + 0.06*(m.Max[j]-m.Min[j])
	pr, _ := m.Predict(x)
	if !slices.Equal(pr.OutOfRange, []string{"petal_length"}) || !strings.Contains(strings.Join(pr.Notes, ";"), "petal_length") {
		t.Fatalf("out-of-range feature not noted: %+v", pr)
	}
	if slices.ContainsFunc(pr.Reasons, func(r string) bool { return strings.Contains(r, "petal_length") }) {
		t.Errorf("one out-of-range feature decided the verdict: %v", pr.Reasons)
	}
}
