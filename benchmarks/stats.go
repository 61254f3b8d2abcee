package benchmarks

import (
	"math"
	"slices"
	"strconv"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

// Float is a float64 that writes NaN and ±Inf as JSON null, so results.json
// stays valid when a value is missing (an estimator that found no scaling
// region, an SNR of +Inf meaning "no noise"); finite values are written in
// the shortest exact decimal form, and null reads back as NaN. It is
// jsonsafe.Float, shared with the other packages that write JSON.
type Float = jsonsafe.Float

// Spread summarises a sample: median, quartiles (linear interpolation
// between order statistics, the default of most statistics packages) and
// extremes over the finite values, with the count of values that were
// missing (NaN).
type Spread struct {
	Median Float `json:"median"`
	Q1     Float `json:"q1"`
	Q3     Float `json:"q3"`
	Min    Float `json:"min"`
	Max    Float `json:"max"`
	// N is the number of finite values; Missing the number of NaN ones.
	N       int `json:"n"`
	Missing int `json:"missing"`
}

// spreadOf computes the Spread of xs (not modified).
func spreadOf(xs []float64) Spread {
	var v []float64
	missing := 0
	for _, x := range xs {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			missing++
			continue
		}
		v = append(v, x)
	}
	nan := Float(math.NaN())
	if len(v) == 0 {
		return Spread{Median: nan, Q1: nan, Q3: nan, Min: nan, Max: nan, Missing: missing}
	}
	slices.Sort(v)
	return Spread{
		Median:  Float(quantile(v, 0.5)),
		Q1:      Float(quantile(v, 0.25)),
		Q3:      Float(quantile(v, 0.75)),
		Min:     Float(v[0]),
		Max:     Float(v[len(v)-1]),
		N:       len(v),
		Missing: missing,
	}
}

// quantile of sorted v by linear interpolation at position p·(n−1).
func quantile(v []float64, p float64) float64 {
	if len(v) == 1 {
		return v[0]
	}
	h := p * float64(len(v)-1)
	i := int(math.Floor(h))
	if i >= len(v)-1 {
		return v[len(v)-1]
	}
	return v[i] + (h-float64(i))*(v[i+1]-v[i])
}

// median of xs (not modified); NaN for an empty slice.
func median(xs []float64) float64 {
	if len(xs) == 0 {
		return math.NaN()
	}
	v := slices.Clone(xs)
	slices.Sort(v)
	return quantile(v, 0.5)
}

// logLogFit returns the least-squares slope p and r² of ln y against ln x
// over the points with x, y > 0 and finite (NaN when fewer than two).
func logLogFit(x, y []float64) (p, r2 float64) {
	var lx, ly []float64
	for i := range x {
		if x[i] > 0 && y[i] > 0 && !math.IsInf(x[i], 0) && !math.IsInf(y[i], 0) {
			lx = append(lx, math.Log(x[i]))
			ly = append(ly, math.Log(y[i]))
		}
	}
	n := float64(len(lx))
	if len(lx) < 2 {
		return math.NaN(), math.NaN()
	}
	var mx, my float64
	for i := range lx {
		mx += lx[i] / n
		my += ly[i] / n
	}
	var sxx, sxy, syy float64
	for i := range lx {
		dx, dy := lx[i]-mx, ly[i]-my
		sxx += dx * dx
		sxy += dx * dy
		syy += dy * dy
	}
	if sxx == 0 {
		return math.NaN(), math.NaN()
	}
	p = sxy / sxx
	if syy == 0 {
		return p, 1
	}
	return p, sxy * sxy / (sxx * syy)
}

// seedFor derives a 64-bit seed from a base seed and a path of indices
// with the SplitMix64 finaliser (Steele, Lea & Flood, OOPSLA 2014), so that
// every series of the suite has its own well-mixed, reproducible seed.
func seedFor(base uint64, path ...uint64) uint64 {
	z := base
	for _, p := range path {
		z = mix64(z ^ mix64(p+0x9e3779b97f4a7c15))
	}
	return mix64(z)
}

func mix64(z uint64) uint64 {
	z += 0x9e3779b97f4a7c15
	z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9
	z = (z ^ (z >> 27)) * 0x94d049bb133111eb
	return z ^ (z >> 31)
}

// strconvG formats a value for people: the shortest exact form, at most
// six significant digits.
func strconvG(v float64) string {
	s := strconv.FormatFloat(v, 'g', -1, 64)
	if t := strconv.FormatFloat(v, 'g', 6, 64); len(t) < len(s) {
		return t
	}
	return s
}
