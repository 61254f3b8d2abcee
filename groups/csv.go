package groups

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
)

// pairCSVHeader is the header of WriteCSV.
var pairCSVHeader = []string{
	"group_a", "group_b", "feature", "tested",
	"n_a", "n_b", "missing_a", "missing_b",
	"median_a", "median_b", "q1_a", "q3_a", "q1_b", "q3_b", "iqr_a", "iqr_b", "mad_a", "mad_b",
	"median_diff", "median_diff_mad", "hodges_lehmann", "cliff_delta", "magnitude",
	"ks_d", "ks_p", "ks_method", "ks_p_adj",
	"mw_u", "mw_z", "mw_p", "mw_method", "mw_p_adj",
	"adjust", "family", "test", "alpha", "significant", "note",
}

// WriteCSV writes one row per pair and feature (pairs in Result order,
// features in list order) with the header
//
//	group_a,group_b,feature,tested,n_a,n_b,missing_a,missing_b,
//	median_a,median_b,q1_a,q3_a,q1_b,q3_b,iqr_a,iqr_b,mad_a,mad_b,
//	median_diff,median_diff_mad,hodges_lehmann,cliff_delta,magnitude,
//	ks_d,ks_p,ks_method,ks_p_adj,mw_u,mw_z,mw_p,mw_method,mw_p_adj,
//	adjust,family,test,alpha,significant,note
//
// Differences are B − A. Numbers are written in full precision (shortest
// round-trip form); an undefined number (NaN) is an empty field.
func WriteCSV(w io.Writer, r Result) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(pairCSVHeader); err != nil {
		return fmt.Errorf("csv: %w", err)
	}
	s := r.Settings
	for _, p := range r.Pairs {
		for _, t := range p.Tests {
			row := []string{
				p.A, p.B, t.Feature, strconv.FormatBool(t.Tested),
				strconv.Itoa(t.A.N), strconv.Itoa(t.B.N), strconv.Itoa(t.A.Missing), strconv.Itoa(t.B.Missing),
				num(t.A.Median), num(t.B.Median), num(t.A.Q1), num(t.A.Q3), num(t.B.Q1), num(t.B.Q3),
				num(t.A.IQR), num(t.B.IQR), num(t.A.MAD), num(t.B.MAD),
				num(t.MedianDiff), num(t.MedianDiffMAD), num(t.HodgesLehmann), num(t.CliffDelta), t.Magnitude,
				num(t.KS.D), num(t.KS.P), string(t.KS.Method), num(t.KSAdj),
				num(t.MW.U), num(t.MW.Z), num(t.MW.P), string(t.MW.Method), num(t.MWAdj),
				string(s.Adjust), string(s.Family), string(s.Test), num(s.Alpha), strconv.FormatBool(t.Significant), t.Note,
			}
			if err := cw.Write(row); err != nil {
				return fmt.Errorf("csv: %w", err)
			}
		}
	}
	cw.Flush()
	if err := cw.Error(); err != nil {
		return fmt.Errorf("csv: %w", err)
	}
	return nil
}

// WriteCurvesCSV writes the feature-versus-parameter curves, one row per
// feature, group and parameter level, with the header
//
//	feature,group,param,n,missing,median,q1,q3,spearman_rho,spearman_p,spearman_p_adj,spearman_n
//
// (the Spearman columns repeat on every row of a feature and group). It
// writes only the header when the result has no parameter. Numbers as in
// WriteCSV.
func WriteCurvesCSV(w io.Writer, r Result) error {
	cw := csv.NewWriter(w)
	if err := cw.Write([]string{"feature", "group", "param", "n", "missing", "median", "q1", "q3",
		"spearman_rho", "spearman_p", "spearman_p_adj", "spearman_n"}); err != nil {
		return fmt.Errorf("csv: %w", err)
	}
	for _, c := range r.Curves {
		for _, l := range c.Levels {
			row := []string{c.Feature, c.Group, num(l.Param), strconv.Itoa(l.N), strconv.Itoa(l.Missing),
				num(l.Median), num(l.Q1), num(l.Q3),
				num(c.Spearman.Rho), num(c.Spearman.P), num(c.PAdj), strconv.Itoa(c.Spearman.N)}
			if err := cw.Write(row); err != nil {
				return fmt.Errorf("csv: %w", err)
			}
		}
	}
	cw.Flush()
	if err := cw.Error(); err != nil {
		return fmt.Errorf("csv: %w", err)
	}
	return nil
}

// num formats v in the shortest form that round-trips; NaN and ±Inf give
// an empty string.
func num(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return ""
	}
	return strconv.FormatFloat(v, 'g', -1, 64)
}
