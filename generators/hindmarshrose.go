package generators

import "math/rand/v2"

// HindmarshRose is the Hindmarsh–Rose model neuron (Hindmarsh & Rose,
// Proc. R. Soc. B 221 (1984) 87)
//
//	dx/dt = y − a·x³ + b·x² − z + I,
//	dy/dt = c − d·x² − y,
//	dz/dt = r·(s·(x − x_R) − z),
//
// with a = 1, b = 3, c = 1, d = 5, s = 4, x_R = −1.6: a fast spiking
// subsystem (x, y) slowly modulated by the adaptation current z (r ≪ 1),
// which gives bursts of spikes separated by quiescence. As the injected
// current I varies the bursting is periodic or chaotic. Integrated by RK4
// with internal step ≤ 0.02, observed through the membrane potential x
// (Obs = 0; y, z with Obs = 1, 2). The divergence −3a·x² + 2b·x − 1 − r
// is not constant; its time average along the orbit is the sum of the
// exponents (Liouville's formula).
type HindmarshRose struct {
	I, R float64
	Dt   float64 // sample interval in time units, > 0
	Obs  int     // observed coordinate: 0 = x, 1 = y, 2 = z
}

// The fixed coefficients of the model (Hindmarsh & Rose 1984).
const (
	hrA, hrB, hrC, hrD = 1.0, 3.0, 1.0, 5.0
	hrS, hrXR          = 4.0, -1.6
)

const (
	hrStep      = 0.02
	hrTransient = 2000.0
)

func (m HindmarshRose) dim() int { return 3 }

func (m HindmarshRose) eval(dst, v []float64) {
	x, y, z := v[0], v[1], v[2]
	dst[0] = y - hrA*x*x*x + hrB*x*x - z + m.I
	dst[1] = hrC - hrD*x*x - y
	dst[2] = m.R * (hrS*(x-hrXR) - z)
}

func (m HindmarshRose) jacobian(j, v []float64) {
	x := v[0]
	j[0], j[1], j[2] = -3*hrA*x*x+2*hrB*x, 1, -1
	j[3], j[4], j[5] = -2*hrD*x, -1, 0
	j[6], j[7], j[8] = m.R*hrS, 0, -m.R
}

// divergence returns the trace of the Jacobian at v.
func (m HindmarshRose) divergence(v []float64) float64 {
	return -3*hrA*v[0]*v[0] + 2*hrB*v[0] - 1 - m.R
}

// start draws the initial state of Generate: uniform in
// [−2, 2) × [−10, 0) × [2, 4).
func (m HindmarshRose) start(rng *rand.Rand) []float64 {
	return []float64{4*rng.Float64() - 2, -10 * rng.Float64(), 2 + 2*rng.Float64()}
}

// Generate returns n samples of the observed coordinate after a transient
// of 2000 time units (several periods of the slow variable, 1/r ≈ 170).
func (m HindmarshRose) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("hindmarsh-rose", m, m.start(rng), n, m.Dt, hrStep, hrTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "hindmarsh-rose",
		Title: "Hindmarsh–Rose bursting neuron (observed membrane potential x), RK4",
		Doc:   "Slow–fast bursting: dx/dt = y - x³ + 3x² - z + I, dy/dt = 1 - 5x² - y, dz/dt = r (4 (x + 1.6) - z) (Hindmarsh & Rose 1984); chaotic or periodic bursting as the current I varies. Internal RK4 step ≤ 0.02; transient 2000 time units. Label: chaotic when λ1 of the variational equations (orbit from (-1, -5, 3), 4000 time units after 2000; per series from the drawn start) exceeds 0.005 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "i", Default: 3.25, Min: 2.5, Max: 3.5, Doc: "injected current I"},
			{Name: "r", Default: 0.006, Min: 0.004, Max: 0.008, Doc: "slow time scale r (adaptation rate)"},
			{Name: "dt", Default: 0.5, Min: 0.01, Max: 5, Doc: "sample interval (time units); a spike lasts about 1-2 time units, a burst cycle a few hundred"},
			obsParam("x", "y", "z"),
		},
		DefaultClass: Chaotic,
		threshold:    0.005,
	}, func(p map[string]float64) HindmarshRose {
		return HindmarshRose{I: p["i"], R: p["r"], Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(-1, -5, 3), flowRule{h: hrStep, transient: hrTransient, span: 4000, renorm: 1})
}
