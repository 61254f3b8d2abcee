package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"io"
	"strings"

	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/internal/columnar"
)

// formatParquet is --format parquet: every table the command writes as
// CSV is (also) written as Parquet, with the same columns and values.
const formatParquet = "parquet"

// tableOutput is one file a command writes into its output directory.
type tableOutput = struct {
	name string
	fill func(io.Writer) error
}

// Column types of the tables written as CSV, by table file name and column.
var (
	stringCols = []string{"kind", "file", "group", "device", "parameter", "level", "condition", "name",
		"family", "question", "test", "a", "b", "effect_kind", "p_method", "note",
		"group_a", "group_b", "feature", "magnitude", "ks_method", "mw_method", "adjust"}
	intCols  = []string{"samples", "n", "m", "count", "traces", "n_a", "n_b", "missing_a", "missing_b", "missing", "spearman_n"}
	boolCols = []string{"significant", "discrete", "tested"}
)

// tableKinds types the columns of the survey and compare tables: the
// names above, seed as unsigned, every other column of their headers
// (campaign.TableColumns, campaign.TestColumns, the distributions, the
// comparison and curves tables) a float.
func tableKinds(name string) (columnar.Kind, bool) {
	switch {
	case name == "seed":
		return columnar.Uint64, true
	case contains(stringCols, name):
		return columnar.String, true
	case contains(intCols, name):
		return columnar.Int64, true
	case contains(boolCols, name):
		return columnar.Bool, true
	case contains(floatCols, name):
		return columnar.Float64, true
	}
	return 0, false
}

// floatCols are the numeric columns of the survey and compare tables.
var floatCols = []string{"x", "value", "sd", "lo", "hi", "p_rank", "param", "statistic", "p", "p_holm", "p_bh",
	"estimate", "low", "high", "effect", "min_p", "upper",
	"median_a", "median_b", "q1_a", "q3_a", "q1_b", "q3_b", "iqr_a", "iqr_b", "mad_a", "mad_b",
	"median_diff", "median_diff_mad", "hodges_lehmann", "cliff_delta", "ks_d", "ks_p", "ks_p_adj",
	"mw_u", "mw_z", "mw_p", "mw_p_adj", "alpha", "median", "q1", "q3", "spearman_rho", "spearman_p", "spearman_p_adj"}

// featureKinds types the features table: file, samples, then one float
// column per catalogue feature.
func featureKinds(name string) (columnar.Kind, bool) {
	switch name {
	case "file":
		return columnar.String, true
	case "samples":
		return columnar.Int64, true
	}
	_, ok := features.Lookup(name)
	return columnar.Float64, ok
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

// asParquet turns fill, which writes a CSV table, into one that writes
// the same table as Parquet. A partial batch (*batchError) still writes
// the good rows and passes the error on, as writeOutput expects.
func asParquet(kinds columnar.Kinds, fill func(io.Writer) error) func(io.Writer) error {
	return func(w io.Writer) error {
		var buf bytes.Buffer
		err := fill(&buf)
		var partial *batchError
		if err != nil && !(errors.As(err, &partial) && partial.succeeded() > 0) {
			return err
		}
		if cerr := columnar.FromCSV(w, &buf, kinds); cerr != nil {
			return cerr
		}
		return err
	}
}

// parquetTwins adds to outs a Parquet file beside each CSV table, when on.
func parquetTwins(on bool, outs []tableOutput) []tableOutput {
	if !on {
		return outs
	}
	var twins []tableOutput
	for _, o := range outs {
		if base, ok := strings.CutSuffix(o.name, ".csv"); ok {
			twins = append(twins, tableOutput{base + ".parquet", asParquet(tableKinds, o.fill)})
		}
	}
	return append(outs, twins...)
}

// parquetSink writes a journalled command's CSV table as Parquet: the
// records go through the command's CSV sink into a buffer, converted as a
// whole when the batch ends (nothing when no record came).
type parquetSink struct {
	w     io.Writer
	kinds columnar.Kinds
	buf   bytes.Buffer
	csv   rawSink
}

func newParquetSink(w io.Writer, kinds columnar.Kinds, csv func(io.Writer) rawSink) *parquetSink {
	s := &parquetSink{w: w, kinds: kinds}
	s.csv = csv(&s.buf)
	return s
}

func (s *parquetSink) item(name string, raw json.RawMessage) error { return s.csv.item(name, raw) }

func (s *parquetSink) finish() error {
	if err := s.csv.finish(); err != nil {
		return err
	}
	if s.buf.Len() == 0 {
		return nil
	}
	return columnar.FromCSV(s.w, &s.buf, s.kinds)
}
