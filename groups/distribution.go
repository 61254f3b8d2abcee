package groups

import (
	"math"
	"sort"
)

// poolDistributions pools every named per-trace distribution per group
// (names sorted, groups in order).
func poolDistributions(order []string, members map[string][]int, samples []Sample, points int) []Distribution {
	names := map[string]bool{}
	for _, g := range order {
		for _, i := range members[g] {
			for name := range samples[i].Distributions {
				names[name] = true
			}
		}
	}
	sorted := make([]string, 0, len(names))
	for n := range names {
		sorted = append(sorted, n)
	}
	sort.Strings(sorted)
	var out []Distribution
	for _, name := range sorted {
		for _, g := range order {
			var per [][]float64
			for _, i := range members[g] {
				if v, ok := samples[i].Distributions[name]; ok {
					per = append(per, v)
				}
			}
			d := Pool(per, points)
			d.Name, d.Group = name, g
			out = append(out, d)
		}
	}
	return out
}

// Pool returns the distribution obtained by pooling the per-trace value
// lists with equal weight per trace: a value of a list with k finite
// values has weight 1/(k·T), T the number of non-empty lists, so the
// pooled ECDF is the mean of the traces' ECDFs. NaN and ±Inf values are
// dropped. The ECDF is kept at every distinct value when there are at
// most points of them (points ≤ 0 means 256), otherwise at the inverse
// ECDF of the probabilities i/points, i = 1…points. With no value the
// statistics are NaN. Name and Group are left empty.
func Pool(perTrace [][]float64, points int) Distribution {
	if points <= 0 {
		points = 256
	}
	type wv struct{ x, w float64 }
	var all []wv
	d := Distribution{}
	for _, vals := range perTrace {
		k := 0
		for _, v := range vals {
			if finite(v) {
				k++
			}
		}
		if k == 0 {
			continue
		}
		d.Traces++
		d.Values += k
		w := 1 / float64(k)
		for _, v := range vals {
			if finite(v) {
				all = append(all, wv{v, w})
			}
		}
	}
	nan := math.NaN()
	if len(all) == 0 {
		d.Median, d.Q1, d.Q3, d.Mean, d.Min, d.Max = nan, nan, nan, nan, nan, nan
		return d
	}
	sort.Slice(all, func(i, j int) bool {
		if all[i].x != all[j].x {
			return all[i].x < all[j].x
		}
		return all[i].w < all[j].w
	})
	T := float64(d.Traces)
	// Distinct values and their cumulative probabilities.
	var xs, cdf []float64
	cum, sum := 0.0, 0.0
	for i := 0; i < len(all); {
		j := i
		for j < len(all) && all[j].x == all[i].x {
			cum += all[j].w
			sum += all[j].x * all[j].w
			j++
		}
		xs = append(xs, all[i].x)
		cdf = append(cdf, math.Min(1, cum/T))
		i = j
	}
	cdf[len(cdf)-1] = 1
	d.Mean = sum / T
	d.Min, d.Max = xs[0], xs[len(xs)-1]
	inv := func(p float64) float64 {
		// Smallest x with F(x) ≥ p (with a tolerance for the rounding of
		// the cumulative sums).
		i := sort.Search(len(cdf), func(i int) bool { return cdf[i] >= p-1e-12 })
		return xs[min(i, len(xs)-1)]
	}
	d.Q1, d.Median, d.Q3 = inv(0.25), inv(0.5), inv(0.75)
	if len(xs) <= points {
		d.X, d.CDF = xs, cdf
		return d
	}
	d.X = make([]float64, 0, points+1)
	d.CDF = make([]float64, 0, points+1)
	d.X = append(d.X, xs[0])
	d.CDF = append(d.CDF, cdf[0])
	for i := 1; i <= points; i++ {
		p := float64(i) / float64(points)
		j := sort.Search(len(cdf), func(k int) bool { return cdf[k] >= p-1e-12 })
		j = min(j, len(xs)-1)
		if xs[j] == d.X[len(d.X)-1] {
			continue
		}
		d.X = append(d.X, xs[j])
		d.CDF = append(d.CDF, cdf[j])
	}
	return d
}
