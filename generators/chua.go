package generators

import (
	"math"
	"math/rand/v2"
)

// Chua is Chua's circuit in dimensionless form, dx/dt = α(y − x − g(x)),
// dy/dt = x − y + z, dz/dt = −β·y, with the piecewise-linear diode
// g(x) = m1·x + ½(m0 − m1)(|x + 1| − |x − 1|) (Matsumoto, Chua & Komuro,
// IEEE Trans. Circuits Syst. 32 (1985) 797). At α = 15.6, β = 28,
// m0 = −8/7, m1 = −5/7 it has the double-scroll attractor. Integrated by
// RK4 with internal step ≤ 0.005, observed through x (Obs = 0; y and z
// with Obs = 1, 2).
type Chua struct {
	Alpha, Beta, M0, M1 float64
	Dt                  float64 // sample interval in time units, > 0
	Obs                 int     // observed coordinate: 0 = x, 1 = y, 2 = z
}

const (
	chuaStep      = 0.005
	chuaTransient = 200.0
)

func (m Chua) dim() int { return 3 }

func (m Chua) eval(dst, v []float64) {
	g := m.M1*v[0] + 0.5*(m.M0-m.M1)*(math.Abs(v[0]+1)-math.Abs(v[0]-1))
	dst[0] = m.Alpha * (v[1] - v[0] - g)
	dst[1] = v[0] - v[1] + v[2]
	dst[2] = -m.Beta * v[1]
}

func (m Chua) jacobian(j, v []float64) {
	gp := m.M1
	if math.Abs(v[0]) < 1 {
		gp = m.M0
	}
	j[0], j[1], j[2] = -m.Alpha*(1+gp), m.Alpha, 0
	j[3], j[4], j[5] = 1, -1, 1
	j[6], j[7], j[8] = 0, -m.Beta, 0
}

// start draws the initial state of Generate: uniform within 0.1 of
// (0.7, 0, 0).
func (m Chua) start(rng *rand.Rand) []float64 {
	return []float64{0.7 + 0.2*(rng.Float64()-0.5), 0.2 * (rng.Float64() - 0.5), 0.2 * (rng.Float64() - 0.5)}
}

// Generate returns n samples of the observed coordinate after a transient
// of 200 time units, started from a random point within 0.1 of (0.7, 0, 0).
func (m Chua) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("chua", m, m.start(rng), n, m.Dt, chuaStep, chuaTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "chua",
		Title: "Chua circuit, double scroll (observed x), RK4",
		Doc:   "Double-scroll chaos at alpha = 15.6, beta = 28, m0 = -8/7, m1 = -5/7; smaller alpha gives single-scroll chaos and periodic orbits. Internal RK4 step ≤ 0.005; transient 200 time units. Label: chaotic when λ1 of the variational equations (orbit from (0.7, 0, 0), 1000 time units after 200) exceeds 0.03 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "alpha", Default: 15.6, Min: 11, Max: 16, Doc: "capacitor ratio α"},
			{Name: "beta", Default: 28, Min: 25, Max: 32, Doc: "inductance parameter β"},
			{Name: "m0", Default: -8.0 / 7.0, Min: -1.25, Max: -1.1, Doc: "inner slope of the diode characteristic"},
			{Name: "m1", Default: -5.0 / 7.0, Min: -0.8, Max: -0.65, Doc: "outer slope of the diode characteristic"},
			{Name: "dt", Default: 0.05, Min: 1e-3, Max: 1, Doc: "sample interval (time units)"},
			obsParam("x", "y", "z"),
		},
		DefaultClass: Chaotic,
		threshold:    0.03,
	}, func(p map[string]float64) Chua {
		return Chua{Alpha: p["alpha"], Beta: p["beta"], M0: p["m0"], M1: p["m1"], Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(0.7, 0, 0), flowRule{h: chuaStep, transient: chuaTransient, span: 1000, renorm: 0.5})
}
