package features

import (
	"errors"
	"fmt"
	"math"

	"github.com/tracesift/tracesift/features/scaling"
)

var scalingFamily = family{
	name: FamilyScaling,
	entries: []Entry{
		{"sc_fluct_a1", FamilyScaling, "detrended fluctuation exponent α, order 1 (fGn: α = H; white 0.5; Brownian 1.5)", "Peng et al., Phys. Rev. E 49 (1994) 1685"},
		{"sc_fluct_a2", FamilyScaling, "detrended fluctuation exponent α, order 2 (insensitive to linear trends)", "Peng et al., Phys. Rev. E 49 (1994) 1685"},
		{"sc_fluct_r2", FamilyScaling, "r² of the DFA-1 log–log fit: how well one power law describes F(s)", "Peng et al. (1994); fit quality, common practice"},
		{"sc_range_h", FamilyScaling, "rescaled-range Hurst exponent with the Anis–Lloyd small-sample correction", "Hurst (1951); Anis & Lloyd, Biometrika 63 (1976) 111"},
		{"sc_psd_beta", FamilyScaling, "spectral exponent β of S(f) ~ f^−β from a Welch periodogram (white 0, fGn 2H−1, Brownian 2)", "Welch (1967); standard result for these processes"},
		{"sc_psd_r2", FamilyScaling, "r² of the log–log spectral fit: low for line spectra and humps", "fit quality, common practice"},
		{"sc_psd_flat", FamilyScaling, "Wiener entropy of the Welch spectrum: geometric over arithmetic mean power (1 flat, → 0 for lines)", "Johnston, IEEE J. Sel. Areas Commun. 6 (1988) 314 (checked: uk.mathworks.com/help/audio/ref/spectralflatness.html)"},
		{"sc_psd_top3", FamilyScaling, "fraction of the spectral power in the strongest three bins (near 1 for periodic signals)", "spectral concentration, common practice"},
		{"sc_psd_lines", FamilyScaling, "fraction of the variance in narrow spectral lines (bins ≥ 20× a local power-law floor, Welch spectrum of half-length segments): → 1 for periodic and quasi-periodic motion, ≈ 0 for noise of any colour and for mixing chaos", "point versus continuous spectrum, Bergé, Pomeau & Vidal, Order within Chaos (1984) (memory); estimator documented in features/scaling"},
		{"sc_acf_efold", FamilyScaling, "autocorrelation 1/e decay time in samples, log10 (lower bound when the ACF never decays)", "Box & Jenkins, Time Series Analysis (1970); common practice"},
	},
	compute: computeScaling,
}

func computeScaling(z []float64, _ Options, s *sink) {
	s.measure(func() error {
		r, err := scaling.DFA(z, scaling.DFAOptions{Order: 1})
		if err != nil {
			return err
		}
		s.set("sc_fluct_a1", r.Alpha)
		s.set("sc_fluct_r2", r.R2)
		return nil
	}, "sc_fluct_a1", "sc_fluct_r2")
	s.measure(func() error {
		r, err := scaling.DFA(z, scaling.DFAOptions{Order: 2})
		if err != nil {
			return err
		}
		s.set("sc_fluct_a2", r.Alpha)
		return nil
	}, "sc_fluct_a2")
	s.measure(func() error {
		r, err := scaling.RescaledRange(z, scaling.RSOptions{})
		if err != nil {
			return err
		}
		s.set("sc_range_h", r.H)
		return nil
	}, "sc_range_h")
	// One Welch spectrum serves the spectral slope and shape.
	var spec scaling.Spectrum
	var specErr error
	specDone := false
	spectrum := func() (scaling.Spectrum, error) {
		if !specDone {
			spec, specErr = scaling.Welch(z, scaling.WelchOptions{})
			specDone = true
		}
		return spec, specErr
	}
	s.measure(func() error {
		sp, err := spectrum()
		if err != nil {
			return fmt.Errorf("spectral slope: %w", err)
		}
		r, err := scaling.SpectrumSlope(sp, scaling.SlopeOptions{})
		if err != nil {
			return err
		}
		s.set("sc_psd_beta", r.Beta)
		s.set("sc_psd_r2", r.R2)
		return nil
	}, "sc_psd_beta", "sc_psd_r2")
	s.measure(func() error {
		sp, err := spectrum()
		if err != nil {
			return err
		}
		flat, peak := spectralShape(sp.Power[1:])
		s.set("sc_psd_flat", flat)
		s.set("sc_psd_top3", peak)
		return nil
	}, "sc_psd_flat", "sc_psd_top3")
	s.measure(func() error {
		r, err := scaling.Lines(z, scaling.LinesOptions{})
		if err != nil {
			return err
		}
		s.set("sc_psd_lines", r.Fraction)
		return nil
	}, "sc_psd_lines")
	s.measure(func() error {
		r, err := scaling.DecayTime(z, scaling.DecayOptions{})
		switch {
		case errors.Is(err, scaling.ErrNoDecay):
			// The ACF never fell below 1/e over the lag range (n/4): that
			// range is a lower bound of the decay time, which is what the
			// feature needs.
			s.set("sc_acf_efold", math.Log10(float64(len(z)/4)))
		case err != nil:
			return err
		default:
			s.set("sc_acf_efold", math.Log10(math.Max(r.Time, 1e-3)))
		}
		return nil
	}, "sc_acf_efold")
}

// spectralShape returns the spectral flatness (geometric mean over
// arithmetic mean of the power, DC excluded) and the fraction of the power
// in the three strongest bins.
func spectralShape(p []float64) (flatness, peak float64) {
	var sum, logSum float64
	top := [3]float64{}
	for _, v := range p {
		sum += v
		logSum += math.Log(math.Max(v, 1e-300))
		switch {
		case v > top[0]:
			top[0], top[1], top[2] = v, top[0], top[1]
		case v > top[1]:
			top[1], top[2] = v, top[1]
		case v > top[2]:
			top[2] = v
		}
	}
	n := float64(len(p))
	if sum <= 0 {
		return math.NaN(), math.NaN()
	}
	return math.Exp(logSum/n) / (sum / n), (top[0] + top[1] + top[2]) / sum
}
