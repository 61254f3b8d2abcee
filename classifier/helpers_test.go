package classifier

import (
	"encoding/csv"
	"fmt"
	"math/rand/v2"
	"os"
	"strconv"
	"testing"
)

// irisPath is Fisher's Iris data (Fisher, Annals of Eugenics 7 (1936) 179;
// UCI Machine Learning Repository), copied from golearn's
// examples/datasets/iris.csv; see testdata/classifier/README.md.
const irisPath = "../testdata/classifier/iris.csv"

// loadIris reads the 150 Iris rows: four measurements (cm) and the species.
func loadIris(t testing.TB) Dataset {
	t.Helper()
	f, err := os.Open(irisPath)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	ds := Dataset{
		Features:    []string{"sepal_length", "sepal_width", "petal_length", "petal_width"},
		Description: "Fisher's Iris data (150 rows)",
	}
	for _, r := range recs {
		if len(r) != 5 {
			t.Fatalf("iris row %v", r)
		}
		x := make([]float64, 4)
		for j := range x {
			if x[j], err = strconv.ParseFloat(r[j], 64); err != nil {
				t.Fatal(err)
			}
		}
		ds.X = append(ds.X, x)
		ds.Y = append(ds.Y, r[4])
	}
	if len(ds.X) != 150 {
		t.Fatalf("iris has %d rows, want 150", len(ds.X))
	}
	return ds
}

// separable returns n rows with p features where only feature 0 carries the
// class: "a" rows have x0 in [0, 1), "b" rows x0 in [2, 3); the other
// features are standard normal noise. Classes alternate, so they are
// balanced.
func separable(n, p int, seed uint64) Dataset {
	rng := rand.New(rand.NewPCG(seed, 11))
	ds := Dataset{}
	for j := 0; j < p; j++ {
		ds.Features = append(ds.Features, fmt.Sprintf("f%d", j))
	}
	for i := 0; i < n; i++ {
		x := make([]float64, p)
		for j := range x {
			x[j] = rng.NormFloat64()
		}
		lab := "a"
		x[0] = rng.Float64()
		if i%2 == 1 {
			lab = "b"
			x[0] += 2
		}
		ds.X = append(ds.X, x)
		ds.Y = append(ds.Y, lab)
	}
	return ds
}

// noisy returns n rows, p features, three overlapping classes: feature j <
// informative is shifted by 0.8·((class + j) mod 3), the rest is N(0, 1).
func noisy(n, p, informative int, seed uint64) Dataset {
	rng := rand.New(rand.NewPCG(seed, 13))
	names := []string{"chaotic", "regular", "stochastic"}
	ds := Dataset{}
	for j := 0; j < p; j++ {
		ds.Features = append(ds.Features, fmt.Sprintf("x%02d", j))
	}
	for i := 0; i < n; i++ {
		c := rng.IntN(3)
		x := make([]float64, p)
		for j := range x {
			x[j] = rng.NormFloat64()
			if j < informative {
				x[j] += 0.8 * float64((c+j)%3)
			}
		}
		ds.X = append(ds.X, x)
		ds.Y = append(ds.Y, names[c])
		ds.Groups = append(ds.Groups, fmt.Sprintf("g%d", i%17))
	}
	return ds
}
