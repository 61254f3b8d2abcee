package features

import (
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"fmt"
	"math"
	"strings"
	"testing"
)

// schema2Names are the feature identifiers of schema 2, in catalogue
// order: schema 3 renamed them into the project's own scheme without
// changing a value, and the goldens below were taken under these names.
var schema2Names = []string{
	"hvg_mean_degree",     // hv_deg_mean
	"hvg_lambda",          // hv_tail_exprate
	"hvg_clustering_mean", // hv_clust_mean
	"hvg_degree_entropy",  // hv_deg_ent
	"hvg_irreversibility", // hv_dir_kld
	"nvg_mean_degree",     // nv_deg_mean
	"nvg_gamma",           // nv_tail_powexp
	"nvg_clustering_mean", // nv_clust_mean
	"nvg_modularity",      // nv_comm_q
	"nvg_assortativity",   // nv_deg_assort
	"nvg_degree_entropy",  // nv_deg_ent
	"nvg_path_norm",       // nv_path_lnn
	"nvg_dimension",       // nv_ball_dim
	"lyap_max",            // nl_div_rate
	"lyap_delay",          // nl_div_rate_tau
	"lyap_credible",       // nl_div_ok
	"lyap_jump",           // nl_div_jump
	"corr_dim",            // nl_gp_dim
	"zero_one_k",          // nl_k01
	"pred_rho1",           // nl_fc_rho_1
	"pred_decay",          // nl_fc_drop_10
	"pred_rho_tau",        // nl_fc_rho_tau
	"pred_gain_tau",       // nl_fc_gain_tau
	"perm_entropy_tau",    // nl_ent_d4_tau
	"stat_complexity_tau", // nl_jsc_d4_tau
	"asym_abs",            // nl_trev_1
	"asym_tau",            // nl_trev_tau
	"irrev4_tau",          // nl_trev4_tau
	"sample_entropy",      // nl_sent_m2
	"embed_dim",           // nl_cao_dim
	"cao_e2_dev",          // nl_cao_e2dev
	"dfa_alpha",           // sc_fluct_a1
	"dfa2_alpha",          // sc_fluct_a2
	"dfa_r2",              // sc_fluct_r2
	"hurst_rs",            // sc_range_h
	"spectral_beta",       // sc_psd_beta
	"spectral_r2",         // sc_psd_r2
	"spectral_flatness",   // sc_psd_flat
	"spectral_peak",       // sc_psd_top3
	"spectral_lines",      // sc_psd_lines
	"acf_decay",           // sc_acf_efold
	"perm_entropy",        // op_ent_d4
	"stat_complexity",     // op_jsc_d4
	"perm_entropy_d6",     // op_ent_d6
	"stat_complexity_d6",  // op_jsc_d6
	"complexity_rel",      // op_jsc_rel_d6
	"perm_missing_excess", // op_miss_d5
	"inc_skew_abs",        // dx_skew_abs
	"inc_kurt",            // dx_kurt_ex
	"inc_ks",              // dx_ks_gauss
	"inc_lag1",            // dx_acf_1
}

// vectorDigest is the first 16 hex digits of the SHA-256 of a vector's
// names (as of schema 2), value bits and reasons, in order.
func vectorDigest(t *testing.T, v Vector) string {
	t.Helper()
	if len(v.Names) != len(schema2Names) {
		t.Fatalf("vector has %d features, schema 2 had %d", len(v.Names), len(schema2Names))
	}
	h := sha256.New()
	var b [8]byte
	for i := range v.Names {
		h.Write([]byte(schema2Names[i]))
		binary.LittleEndian.PutUint64(b[:], math.Float64bits(v.Values[i]))
		h.Write(b[:])
		h.Write([]byte(v.Reasons[i]))
		h.Write([]byte{0})
	}
	return hex.EncodeToString(h.Sum(nil))[:16]
}

// The default model was trained on features of series of 512–20000
// samples, and every trace up to DefaultWindow samples must keep its
// vector bit for bit: the schema and the vectors of series from 300 to
// 10^5 samples are those the code gave before long traces were measured in
// windows. Source of the digests: this test's vectors computed at commit
// 8a36f58 (before windowing), on unquantised series, so that the grid
// test leaves them as generated.
func TestShortTraceVectorsUnchanged(t *testing.T) {
	if got, want := SchemaHash(), "96dcd029b5c00241"; got != want {
		t.Errorf("SchemaHash %s, want %s (the default model's schema)", got, want)
	}
	// Schema 3 is schema 2 renamed: the old names in the new order hash,
	// under version 2, to the schema-2 hash the goldens were taken under.
	h := sha256.New()
	fmt.Fprintf(h, "tracesift features v%d\n", 2)
	h.Write([]byte(strings.Join(schema2Names, "\n")))
	if got := hex.EncodeToString(h.Sum(nil))[:16]; got != "7dc314a2608b0621" {
		t.Errorf("schema-2 names hash to %s, want 7dc314a2608b0621", got)
	}
	for i, n := range Names() {
		if e := schema3Of[schema2Names[i]]; e != n {
			t.Errorf("feature %d: %s renamed to %s, catalogue has %s", i, schema2Names[i], e, n)
		}
	}
	if DefaultWindow < 100_000 {
		t.Errorf("DefaultWindow %d: traces of 10^5 samples would be windowed", DefaultWindow)
	}
	cases := []struct {
		sys    string
		n      int
		seed   uint64
		digest string
	}{
		{"white", 300, 1, "96e7177e7418a63d"},
		{"henon", 20000, 2, "43c19a09df273440"},
		{"lorenz", 20000, 3, "e3167f3e73943c76"},
		{"brownian", 100000, 4, "8ce34eb732ac18fc"},
		{"ar1", 100000, 5, "737c569970015c81"},
	}
	for _, c := range cases {
		if testing.Short() && c.n > 20000 {
			continue
		}
		v, err := Extract(series(t, c.sys, c.n, c.seed), Options{Seed: 7})
		if err != nil {
			t.Fatal(err)
		}
		if v.Windows != 1 || v.WindowLength != c.n || v.Spread != nil {
			t.Errorf("%s n=%d: measured in %d windows of %d (spread %v), want whole", c.sys, c.n, v.Windows, v.WindowLength, v.Spread != nil)
		}
		if got := vectorDigest(t, v); got != c.digest {
			t.Errorf("%s n=%d seed=%d: vector digest %s, want %s (the vector before windowing)", c.sys, c.n, c.seed, got, c.digest)
		}
	}
}

// schema3Of maps each schema-2 identifier to its schema-3 name (README,
// "Changes").
var schema3Of = map[string]string{
	"hvg_mean_degree":     "hv_deg_mean",
	"hvg_lambda":          "hv_tail_exprate",
	"hvg_clustering_mean": "hv_clust_mean",
	"hvg_degree_entropy":  "hv_deg_ent",
	"hvg_irreversibility": "hv_dir_kld",
	"nvg_mean_degree":     "nv_deg_mean",
	"nvg_gamma":           "nv_tail_powexp",
	"nvg_clustering_mean": "nv_clust_mean",
	"nvg_modularity":      "nv_comm_q",
	"nvg_assortativity":   "nv_deg_assort",
	"nvg_degree_entropy":  "nv_deg_ent",
	"nvg_path_norm":       "nv_path_lnn",
	"nvg_dimension":       "nv_ball_dim",
	"lyap_max":            "nl_div_rate",
	"lyap_delay":          "nl_div_rate_tau",
	"lyap_credible":       "nl_div_ok",
	"lyap_jump":           "nl_div_jump",
	"corr_dim":            "nl_gp_dim",
	"zero_one_k":          "nl_k01",
	"pred_rho1":           "nl_fc_rho_1",
	"pred_decay":          "nl_fc_drop_10",
	"pred_rho_tau":        "nl_fc_rho_tau",
	"pred_gain_tau":       "nl_fc_gain_tau",
	"perm_entropy_tau":    "nl_ent_d4_tau",
	"stat_complexity_tau": "nl_jsc_d4_tau",
	"asym_abs":            "nl_trev_1",
	"asym_tau":            "nl_trev_tau",
	"irrev4_tau":          "nl_trev4_tau",
	"sample_entropy":      "nl_sent_m2",
	"embed_dim":           "nl_cao_dim",
	"cao_e2_dev":          "nl_cao_e2dev",
	"dfa_alpha":           "sc_fluct_a1",
	"dfa2_alpha":          "sc_fluct_a2",
	"dfa_r2":              "sc_fluct_r2",
	"hurst_rs":            "sc_range_h",
	"spectral_beta":       "sc_psd_beta",
	"spectral_r2":         "sc_psd_r2",
	"spectral_flatness":   "sc_psd_flat",
	"spectral_peak":       "sc_psd_top3",
	"spectral_lines":      "sc_psd_lines",
	"acf_decay":           "sc_acf_efold",
	"perm_entropy":        "op_ent_d4",
	"stat_complexity":     "op_jsc_d4",
	"perm_entropy_d6":     "op_ent_d6",
	"stat_complexity_d6":  "op_jsc_d6",
	"complexity_rel":      "op_jsc_rel_d6",
	"perm_missing_excess": "op_miss_d5",
	"inc_skew_abs":        "dx_skew_abs",
	"inc_kurt":            "dx_kurt_ex",
	"inc_ks":              "dx_ks_gauss",
	"inc_lag1":            "dx_acf_1",
}
