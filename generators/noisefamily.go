package generators

// registerNoise registers a noise family sampled once per time unit: the
// t column is the sample index (AxisIteration, dt = 1) and the label is
// fixed to stochastic (DESIGN.md: noise of any colour or distribution,
// stationary or not). build returns the generator for a full parameter
// set; s must not set TimeAxis, DefaultClass, label or build itself.
func registerNoise(s *System, build func(p map[string]float64) (Generator, error)) {
	s.TimeAxis = AxisIteration
	s.DefaultClass = Stochastic
	s.label = fixed(Stochastic)
	s.build = func(p map[string]float64) (Generator, float64, error) {
		g, err := build(p)
		if err != nil {
			return nil, 0, err
		}
		return g, 1, nil
	}
	register(s)
}
