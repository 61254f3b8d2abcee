package generators

import (
	"fmt"
	"math"
	"sort"
)

// Spectrum is a Lyapunov spectrum computed from a system's equations.
type Spectrum struct {
	// Exponents in decreasing order (the first is λ1). Only the leading
	// exponents are computed for high-dimensional systems.
	Exponents []float64
	// Unit is "per iteration" for maps, "per time unit" for flows.
	Unit string
	// Span is the orbit length averaged over (iterations or time units),
	// after a discarded transient; the statistical error of a chaotic
	// exponent shrinks roughly as 1/√Span, the bias of a zero exponent as
	// 1/Span.
	Span float64
}

// mapping is a map v' = G(v) with its Jacobian.
type mapping interface {
	dim() int
	// next stores G(v) in dst (dst and v do not overlap).
	next(dst, v []float64)
	// jacobian stores ∂G_i/∂v_j at v in dst[i*dim()+j].
	jacobian(dst, v []float64)
}

// tangenter is implemented by maps and fields with a sparse Jacobian
// (lattices, rings): tangent stores J(v)·w in dst without forming J,
// O(dim) work instead of O(dim²). mapSpectrum and flowSpectrum use it when
// present; jacobian stays the reference the tests compare it with.
type tangenter interface {
	tangent(dst, v, w []float64)
}

// leader is implemented by high-dimensional systems whose label rule
// follows only the leading exponents (the largest decides the label).
type leader interface {
	leading() int
}

// labelExponents is the number of exponents a label rule computes for a
// system of dimension d: leading() where implemented, otherwise all d.
func labelExponents(m any, d int) int {
	if l, ok := m.(leader); ok {
		return min(l.leading(), d)
	}
	return d
}

// gramSchmidt orthonormalises the k vectors of length d stored one after
// another in w (modified Gram–Schmidt) and adds the logarithm of each
// vector's norm before normalisation to sums. A vector that collapses to
// zero (a singular Jacobian) contributes the log of the smallest positive
// float and is replaced by a unit vector orthogonal to the others where one
// is available.
func gramSchmidt(w []float64, d, k int, sums []float64) {
	for j := 0; j < k; j++ {
		wj := w[j*d : (j+1)*d]
		for i := 0; i < j; i++ {
			wi := w[i*d : (i+1)*d]
			var dot float64
			for l := range wj {
				dot += wj[l] * wi[l]
			}
			for l := range wj {
				wj[l] -= dot * wi[l]
			}
		}
		var nrm float64
		for _, x := range wj {
			nrm += x * x
		}
		nrm = math.Sqrt(nrm)
		if !(nrm > 1e-300) {
			sums[j] += math.Log(1e-300)
			for l := range wj {
				wj[l] = 0
			}
			wj[j%d] = 1
			continue
		}
		sums[j] += math.Log(nrm)
		for l := range wj {
			wj[l] /= nrm
		}
	}
}

// mapSpectrum returns the k largest Lyapunov exponents of m along the orbit
// of x0 (copied): transient iterations are discarded, then the tangent
// vectors are pushed through the Jacobian and re-orthonormalised every
// iteration for iters iterations (Benettin et al. 1980).
func mapSpectrum(m mapping, x0 []float64, transient, iters, k int) (Spectrum, error) {
	d := m.dim()
	x := append([]float64(nil), x0...)
	y := make([]float64, d)
	for i := 0; i < transient; i++ {
		m.next(y, x)
		x, y = y, x
		if !finite(x) {
			return Spectrum{}, fmt.Errorf("%w during the transient of the Lyapunov orbit", ErrDiverged)
		}
	}
	w := make([]float64, k*d)
	for j := 0; j < k; j++ {
		w[j*d+j] = 1
	}
	nw := make([]float64, k*d)
	tm, sparse := m.(tangenter)
	var jac []float64
	if !sparse {
		jac = make([]float64, d*d)
	}
	sums := make([]float64, k)
	for it := 0; it < iters; it++ {
		if sparse {
			for j := 0; j < k; j++ {
				tm.tangent(nw[j*d:(j+1)*d], x, w[j*d:(j+1)*d])
			}
		} else {
			m.jacobian(jac, x)
			for j := 0; j < k; j++ {
				for r := 0; r < d; r++ {
					var s float64
					for c := 0; c < d; c++ {
						s += jac[r*d+c] * w[j*d+c]
					}
					nw[j*d+r] = s
				}
			}
		}
		w, nw = nw, w
		gramSchmidt(w, d, k, sums)
		m.next(y, x)
		x, y = y, x
		if !finite(x) {
			return Spectrum{}, fmt.Errorf("%w after %d iterations of the Lyapunov orbit", ErrDiverged, it+1)
		}
	}
	for j := range sums {
		sums[j] /= float64(iters)
	}
	sort.Sort(sort.Reverse(sort.Float64Slice(sums)))
	return Spectrum{Exponents: sums, Unit: "per iteration", Span: float64(iters)}, nil
}

// flowSpectrum returns the k largest Lyapunov exponents of the flow f along
// the orbit of x0 (copied): the state is integrated alone for transient time
// units, then together with k tangent vectors under the variational
// equations dW/dt = J(x)·W, all by RK4 with step h, re-orthonormalising
// every renorm time units for a span of total time units (Benettin et al.
// 1980). Angle coordinates are wrapped as in sampleFlow.
func flowSpectrum(f field, x0 []float64, h, transient, total, renorm float64, k int) (Spectrum, error) {
	d := f.dim()
	wr, _ := f.(wrapper)
	x := append([]float64(nil), x0...)
	ig := newRK4(d)
	warm := int(math.Ceil(transient / h))
	for i := 0; i < warm; i++ {
		ig.step(f.eval, x, h)
		if wr != nil {
			wr.wrap(x)
		}
	}
	if !finite(x) {
		return Spectrum{}, fmt.Errorf("%w during the transient of the Lyapunov orbit", ErrDiverged)
	}
	u := make([]float64, d+k*d)
	copy(u, x)
	for j := 0; j < k; j++ {
		u[d+j*d+j] = 1
	}
	tg, sparse := f.(tangenter)
	var jac []float64
	if !sparse {
		jac = make([]float64, d*d)
	}
	aug := func(dst, v []float64) {
		f.eval(dst[:d], v[:d])
		if sparse {
			for j := 0; j < k; j++ {
				tg.tangent(dst[d+j*d:d+(j+1)*d], v[:d], v[d+j*d:d+(j+1)*d])
			}
			return
		}
		f.jacobian(jac, v[:d])
		for j := 0; j < k; j++ {
			wj := v[d+j*d : d+(j+1)*d]
			dj := dst[d+j*d : d+(j+1)*d]
			for r := 0; r < d; r++ {
				var s float64
				row := jac[r*d : (r+1)*d]
				for c, jv := range row {
					s += jv * wj[c]
				}
				dj[r] = s
			}
		}
	}
	iga := newRK4(len(u))
	per := int(math.Max(1, math.Round(renorm/h)))
	blocks := int(math.Ceil(total / (float64(per) * h)))
	sums := make([]float64, k)
	for b := 0; b < blocks; b++ {
		for i := 0; i < per; i++ {
			iga.step(aug, u, h)
		}
		if wr != nil {
			wr.wrap(u[:d])
		}
		if !finite(u[:d]) {
			return Spectrum{}, fmt.Errorf("%w after %g time units of the Lyapunov orbit", ErrDiverged, float64(b*per)*h)
		}
		gramSchmidt(u[d:], d, k, sums)
	}
	span := float64(blocks*per) * h
	for j := range sums {
		sums[j] /= span
	}
	sort.Sort(sort.Reverse(sort.Float64Slice(sums)))
	return Spectrum{Exponents: sums, Unit: "per time unit", Span: span}, nil
}
