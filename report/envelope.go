package report

import "math"

// displayColumns is the number of columns the trace is reduced to for
// display: about one per device pixel of the figure's plot area.
const displayColumns = 640

// TracePanel is the trace reduced for display: with more than 2·Columns
// samples, Lo and Hi are the minimum and maximum of the samples falling in
// each of Columns equal stretches (a min/max envelope keeps every spike
// visible, unlike plain decimation), T the time of the stretch's centre;
// otherwise every sample is kept and Lo = Hi.
type TracePanel struct {
	T, Lo, Hi []float64
	// Reduced reports whether the min/max envelope was used; PerColumn is
	// the number of samples per column then.
	Reduced   bool
	PerColumn float64
}

// traceEnvelope reduces x to at most cols min/max columns; interval is the
// sample interval (0: time in samples).
func traceEnvelope(x []float64, interval float64, cols int) *TracePanel {
	n := len(x)
	dt := interval
	if dt <= 0 {
		dt = 1
	}
	p := &TracePanel{}
	if n <= 2*cols {
		p.T = make([]float64, n)
		for i := range x {
			p.T[i] = float64(i) * dt
		}
		p.Lo = append([]float64(nil), x...)
		p.Hi = p.Lo
		return p
	}
	p.Reduced = true
	p.PerColumn = float64(n) / float64(cols)
	p.T = make([]float64, cols)
	p.Lo = make([]float64, cols)
	p.Hi = make([]float64, cols)
	for c := 0; c < cols; c++ {
		a, b := c*n/cols, (c+1)*n/cols
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, v := range x[a:b] {
			lo = math.Min(lo, v)
			hi = math.Max(hi, v)
		}
		p.T[c], p.Lo[c], p.Hi[c] = float64(a+b-1)/2*dt, lo, hi
	}
	return p
}
