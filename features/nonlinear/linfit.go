package nonlinear

import "math"

// lineFit is an ordinary least-squares straight line y = Intercept + Slope·x
// with its coefficient of determination R2 (1 when y is exactly linear or
// constant along a non-degenerate x).
type lineFit struct {
	Slope, Intercept, R2 float64
}

// fitLine fits y against x by ordinary least squares. It needs len(x) ≥ 2
// with x not all equal; otherwise it returns NaN values.
func fitLine(x, y []float64) lineFit {
	if len(x) < 2 || len(x) != len(y) {
		return lineFit{math.NaN(), math.NaN(), math.NaN()}
	}
	mx, my, sxx, sxy, syy := centredSums(x, y)
	if sxx == 0 {
		return lineFit{math.NaN(), math.NaN(), math.NaN()}
	}
	s := sxy / sxx
	r2 := 1.0
	if syy > 0 {
		r2 = sxy * sxy / (sxx * syy)
	}
	return lineFit{Slope: s, Intercept: my - s*mx, R2: r2}
}

// prefixFitter answers least-squares line fits of y against x = 0, 1, 2, …
// over any index range [a, b] in O(1) from prefix sums of y and i·y.
type prefixFitter struct {
	sy, sxy, syy []float64 // sy[k] = Σ_{i<k} y_i, etc.
}

func newPrefixFitter(y []float64) *prefixFitter {
	p := &prefixFitter{
		sy:  make([]float64, len(y)+1),
		sxy: make([]float64, len(y)+1),
		syy: make([]float64, len(y)+1),
	}
	for i, v := range y {
		p.sy[i+1] = p.sy[i] + v
		p.sxy[i+1] = p.sxy[i] + float64(i)*v
		p.syy[i+1] = p.syy[i] + v*v
	}
	return p
}

// fit returns the least-squares line over indices a..b inclusive (b > a).
func (p *prefixFitter) fit(a, b int) lineFit {
	n := float64(b - a + 1)
	// Σx and Σx² over integer x = a..b.
	sx := (float64(a) + float64(b)) * n / 2
	sxx := sumSq(b) - sumSq(a-1)
	sy := p.sy[b+1] - p.sy[a]
	sxy := p.sxy[b+1] - p.sxy[a]
	syy := p.syy[b+1] - p.syy[a]
	vxx := sxx - sx*sx/n
	vxy := sxy - sx*sy/n
	vyy := syy - sy*sy/n
	if vxx <= 0 {
		return lineFit{math.NaN(), math.NaN(), math.NaN()}
	}
	s := vxy / vxx
	r2 := 1.0
	if vyy > 0 {
		r2 = vxy * vxy / (vxx * vyy)
		if r2 > 1 {
			r2 = 1
		}
	}
	return lineFit{Slope: s, Intercept: (sy - s*sx) / n, R2: r2}
}

// sumSq returns Σ_{i=0..k} i² (0 for k < 0).
func sumSq(k int) float64 {
	if k < 0 {
		return 0
	}
	f := float64(k)
	return f * (f + 1) * (2*f + 1) / 6
}

// pearson returns the Pearson correlation of x and y, NaN when either has
// zero variance or the lengths differ or are below 2.
func pearson(x, y []float64) float64 {
	if len(x) != len(y) || len(x) < 2 {
		return math.NaN()
	}
	_, _, sxx, sxy, syy := centredSums(x, y)
	if sxx == 0 || syy == 0 {
		return math.NaN()
	}
	return sxy / math.Sqrt(sxx*syy)
}

// centredSums returns the means of x and y and the centred sums
// Σ(x−x̄)², Σ(x−x̄)(y−ȳ) and Σ(y−ȳ)² (two passes). x and y must have the same
// length ≥ 1.
func centredSums(x, y []float64) (mx, my, sxx, sxy, syy float64) {
	n := float64(len(x))
	for i := range x {
		mx += x[i]
		my += y[i]
	}
	mx /= n
	my /= n
	for i := range x {
		dx, dy := x[i]-mx, y[i]-my
		sxx += dx * dx
		sxy += dx * dy
		syy += dy * dy
	}
	return mx, my, sxx, sxy, syy
}
