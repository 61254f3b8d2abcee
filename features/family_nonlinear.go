package features

import (
	"fmt"
	"math"

	"github.com/tracesift/tracesift/features/nonlinear"
	"github.com/tracesift/tracesift/features/ordinal"
)

var nonlinearFamily = family{
	name: FamilyNonlinear,
	entries: []Entry{
		{"nl_div_rate", FamilyNonlinear, "largest Lyapunov exponent per sample step from the divergence of nearest neighbours within the median neighbour distance; missing when the divergence curve has no credible exponential region (as for noise and random walks)", "Rosenstein, Collins & De Luca, Physica D 65 (1993) 117; Kantz, Phys. Lett. A 185 (1994) 77"},
		{"nl_div_rate_tau", FamilyNonlinear, "largest Lyapunov exponent per embedding delay (λ·τ): comparable across sampling rates", "Rosenstein et al. (1993); Fraser & Swinney, Phys. Rev. A 33 (1986) 1134"},
		{"nl_div_ok", FamilyNonlinear, "1 when the divergence curve shows a credible exponential-growth region, else 0", "Rosenstein et al. (1993); criterion documented in features/nonlinear"},
		{"nl_div_jump", FamilyNonlinear, "jump of the divergence curve over its first point (max(1, τ/4) samples) as a fraction of its total rise (large for noise, small for clean chaos)", "Rosenstein et al. (1993); diagnostic, common practice"},
		{"nl_gp_dim", FamilyNonlinear, "correlation dimension D2 over the flattest decade of the correlation sum; missing without a scaling region", "Grassberger & Procaccia, Physica D 9 (1983) 189"},
		{"nl_k01", FamilyNonlinear, "0–1 test for chaos K (median over random c; ≈1 chaotic or noisy, ≈0 regular), series decimated by the embedding delay", "Gottwald & Melbourne, Proc. R. Soc. A 460 (2004) 603; SIAM J. Appl. Dyn. Syst. 8 (2009) 129"},
		{"nl_fc_rho_1", FamilyNonlinear, "nearest-neighbour (simplex) forecast correlation one sample ahead", "Sugihara & May, Nature 344 (1990) 734"},
		{"nl_fc_drop_10", FamilyNonlinear, "fall of the forecast correlation from 1 to 10 samples ahead (large for chaos, flat for noise)", "Sugihara & May (1990)"},
		{"nl_fc_rho_tau", FamilyNonlinear, "forecast correlation one embedding delay τ ahead (at most 50 samples): skill on the dynamics' own time scale, robust to fine sampling and measurement noise", "Sugihara & May (1990); Fraser & Swinney (1986)"},
		{"nl_fc_gain_tau", FamilyNonlinear, "simplex forecast correlation one embedding delay τ ahead minus that of the best global linear forecast from the same delay vectors: ≥ 0 for nonlinear determinism, clearly negative for linear correlated noise", "Casdagli, J. R. Stat. Soc. B 54 (1992) 303; Sugihara & May (1990)"},
		{"nl_ent_d4_tau", FamilyNonlinear, "normalised permutation entropy, order 4, at the embedding delay τ instead of one sample: ordinal structure on the dynamics' time scale, robust to fine sampling and measurement noise", "Bandt & Pompe (2002); Zunino et al., Phys. Lett. A 376 (2012) 2615 (memory)"},
		{"nl_jsc_d4_tau", FamilyNonlinear, "Jensen–Shannon statistical complexity, order 4, at the embedding delay τ", "Rosso et al., Phys. Rev. Lett. 99 (2007) 154102; Zunino et al. (2012) (memory)"},
		{"nl_trev_1", FamilyNonlinear, "|time-reversal asymmetry| of the increments ⟨Δx³⟩/⟨Δx²⟩^{3/2} (0 for linear Gaussian noise)", "Theiler et al., Physica D 58 (1992) 77"},
		{"nl_trev_tau", FamilyNonlinear, "|time-reversal asymmetry| of the increments over one embedding delay τ, x_{t+τ} − x_t: measurement noise dilutes it far less than at one sample", "Theiler et al., Physica D 58 (1992) 77 (statistic at lag τ)"},
		{"nl_trev4_tau", FamilyNonlinear, "|⟨z_t z_{t+τ}³ − z_t³ z_{t+τ}⟩| / ⟨z_t² z_{t+τ}²⟩ at the embedding delay: time-reversal asymmetry that survives the odd symmetry x → −x (Lorenz, Chua), where the increment skewness vanishes", "fourth-order moment odd under time reversal (common practice; our normalisation)"},
		{"nl_sent_m2", FamilyNonlinear, "sample entropy, m = 2, r = 0.2·sd (2.185 for Gaussian white noise; 2.18–2.20 for white noise recorded with 8–256 levels, after Extract's dither)", "Richman & Moorman, Am. J. Physiol. 278 (2000) H2039"},
		{"nl_cao_dim", FamilyNonlinear, "embedding dimension from the saturation of Cao's E1", "Cao, Physica D 110 (1997) 43"},
		{"nl_cao_e2dev", FamilyNonlinear, "largest |E2(d) − 1| of Cao's method (≈0 for independent noise, clearly positive for determinism)", "Cao, Physica D 110 (1997) 43"},
	},
	compute: computeNonlinear,
}

// Work caps of the nonlinear family, below the estimators' own defaults so
// that a full vector of a 2·10^4-sample trace costs well under a second:
// Cao's method on 300 reference points of the first 10^4 samples up to
// dimension 8 (noise saturates the search; 8 already says "high"), the
// divergence curve from 1000 reference points, the correlation sum from
// 10^6 distances (relative counting error ≤ 1/√500 in the scaling region
// either way), and the 0–1 test over 40 frequencies on at most 5000
// samples (the published examples use a few thousand points; the median
// over 40 values of c is already stable to about 0.01 — measured).
var (
	featEmbed    = nonlinear.EmbedOptions{MaxRef: 300, MaxPoints: 10000, MaxDim: 8}
	featLyapRefs = 1000
	featD2Pairs  = 1_000_000
	featZeroOneC = 40
	featZeroOneN = 5000
)

func computeNonlinear(z []float64, o Options, s *sink) {
	embedded := []string{"nl_div_rate", "nl_div_rate_tau", "nl_div_ok", "nl_div_jump", "nl_gp_dim", "nl_k01", "nl_fc_rho_1", "nl_fc_drop_10", "nl_fc_rho_tau", "nl_fc_gain_tau", "nl_ent_d4_tau", "nl_jsc_d4_tau", "nl_trev_tau", "nl_trev4_tau", "nl_cao_dim", "nl_cao_e2dev"}
	s.measure(func() error {
		rec, err := nonlinear.Reconstruct(z, featEmbed)
		if err != nil {
			return fmt.Errorf("embedding: %w", err)
		}
		measureEmbedded(z, rec, o, s)
		return nil
	}, embedded...)
	s.measure(func() error {
		r, err := nonlinear.Asymmetry(z, nonlinear.AsymmetryOptions{})
		if err != nil {
			return err
		}
		s.set("nl_trev_1", r.Abs)
		return nil
	}, "nl_trev_1")
	s.measure(func() error {
		r, err := nonlinear.SampleEntropy(z, nonlinear.SampEnOptions{})
		switch {
		case err != nil:
			return err
		case !r.Defined:
			s.miss("no template matches of length m+1 (sample entropy undefined)", "nl_sent_m2")
		default:
			s.set("nl_sent_m2", r.Value)
		}
		return nil
	}, "nl_sent_m2")
}

// measureEmbedded computes the measures that share one delay embedding
// (and the standardised series and neighbour-search structures of rec).
func measureEmbedded(z []float64, rec *nonlinear.Reconstruction, o Options, s *sink) {
	emb := rec.Embedding()
	s.set("nl_cao_dim", float64(emb.Dim))
	if emb.Cao != nil {
		s.set("nl_cao_e2dev", emb.Cao.E2Deviation)
	} else {
		s.miss("dimension not chosen by Cao's method", "nl_cao_e2dev")
	}
	s.measure(func() error {
		r, err := rec.Lyapunov(nonlinear.LyapunovOptions{MaxRef: featLyapRefs})
		if err != nil {
			return err
		}
		if r.Credible {
			s.set("nl_div_rate", r.Lambda)
			s.set("nl_div_rate_tau", r.Lambda*float64(emb.Delay))
			s.set("nl_div_ok", 1)
		} else {
			s.miss("no credible exponential divergence: "+r.Reason, "nl_div_rate", "nl_div_rate_tau")
			s.set("nl_div_ok", 0)
		}
		if r.Rise > 0 {
			s.set("nl_div_jump", math.Min(1, math.Max(0, r.Jump/r.Rise)))
		} else {
			s.set("nl_div_jump", 1)
		}
		return nil
	}, "nl_div_rate", "nl_div_rate_tau", "nl_div_ok", "nl_div_jump")
	s.measure(func() error {
		r, err := rec.CorrelationDimension(nonlinear.CorrDimOptions{MaxPairs: featD2Pairs})
		switch {
		case err != nil:
			return err
		case math.IsNaN(r.D2):
			s.miss("no scaling region: "+r.Reason, "nl_gp_dim")
		default:
			s.set("nl_gp_dim", r.D2)
		}
		return nil
	}, "nl_gp_dim")
	s.measure(func() error {
		r, err := nonlinear.ZeroOne(z, nonlinear.ZeroOneOptions{Seed: o.Seed, Decimate: emb.Delay, NumC: featZeroOneC, MaxLen: featZeroOneN})
		if err != nil {
			return err
		}
		s.set("nl_k01", r.K)
		return nil
	}, "nl_k01")
	// Forecasts reach at least 10 samples (nl_fc_drop_10) and one delay τ
	// (nl_fc_rho_tau), capped at 50 samples.
	horizon := max(10, min(emb.Delay, 50))
	s.measure(func() error {
		r, err := rec.Prediction(nonlinear.PredictionOptions{MaxHorizon: horizon})
		if err != nil {
			return err
		}
		s.set("nl_fc_rho_1", r.Rho[0])
		s.set("nl_fc_drop_10", r.Rho[0]-r.Rho[9])
		h := min(emb.Delay, 50) - 1
		s.set("nl_fc_rho_tau", r.Rho[h])
		s.set("nl_fc_gain_tau", r.Rho[h]-r.LinearRho[h])
		return nil
	}, "nl_fc_rho_1", "nl_fc_drop_10", "nl_fc_rho_tau", "nl_fc_gain_tau")
	s.measure(func() error {
		r, err := ordinal.Complexity(z, ordinal.Options{Order: 4, Delay: emb.Delay})
		if err != nil {
			return err
		}
		s.set("nl_ent_d4_tau", r.Entropy)
		s.set("nl_jsc_d4_tau", r.Complexity)
		return nil
	}, "nl_ent_d4_tau", "nl_jsc_d4_tau")
	s.measure(func() error {
		r, err := nonlinear.Asymmetry(z, nonlinear.AsymmetryOptions{Lag: emb.Delay})
		if err != nil {
			return err
		}
		s.set("nl_trev_tau", r.Abs)
		s.set("nl_trev4_tau", math.Abs(r.Fourth))
		return nil
	}, "nl_trev_tau", "nl_trev4_tau")
}
