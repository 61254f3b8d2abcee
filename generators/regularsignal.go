package generators

import "math"

// registerSignal registers s as a synthetic regular signal: samples on the
// iteration axis (sample interval 1), the fixed label regular, and the
// generator mk(p), whose error (a cross-parameter constraint) New
// returns. s supplies the rest (name, docs, parameters, invariants).
func registerSignal(s *System, mk func(p map[string]float64) (Generator, error)) {
	s.TimeAxis = AxisIteration
	s.DefaultClass = Regular
	s.label = fixed(Regular)
	s.build = func(p map[string]float64) (Generator, float64, error) {
		g, err := mk(p)
		if err != nil {
			return nil, 0, err
		}
		return g, 1, nil
	}
	register(s)
}

// turns returns the fraction in [0, 1) of t/period + phase (phase in
// turns), computed from t mod period so that a whole period repeats the
// samples exactly, not just up to rounding.
func turns(t int, period, phase float64) float64 {
	u := math.Mod(float64(t), period)/period + phase
	return u - math.Floor(u)
}
