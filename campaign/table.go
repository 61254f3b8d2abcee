package campaign

import (
	"cmp"
	"encoding/csv"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"
	"sync"
)

// Row kinds of the per-trace table.
const (
	KindMetric       = "metric"
	KindDistribution = "distribution"
	// KindVerdict rows hold the classifier's verdict on the original trace:
	// one row per class with its probability in Value, N = 1 on the class
	// of the verdict and 0 on the others; an undetermined verdict adds a
	// row named Undetermined (Value empty, N = 1). Their Condition names
	// the model that gave the verdict.
	KindVerdict = "verdict"
)

// Undetermined is the class name of a verdict the classifier does not
// commit to (classifier.UndeterminedLabel).
const Undetermined = "undetermined"

// UnnamedModel is the condition of verdict rows whose model has no name.
const UnnamedModel = "unnamed model"

// Row is one line of the tidy per-trace table: a metric of a trace under a
// condition (the original, or the mean over one method's surrogates), or
// one support point of a per-trace distribution.
type Row struct {
	Kind      string
	File      string // Trace.ID
	Group     string
	Device    string
	Parameter string // name of the control parameter column ("" without one)
	Level     string // the parameter as written
	Samples   int    // trace length
	Seed      uint64 // run seed
	Condition string // Original or a surrogate method
	Name      string // metric or distribution name
	// X is the support point of a distribution row (NaN for metrics).
	X float64
	// Value is the metric of the original, the mean over the surrogates,
	// or the weight (count) of a support point.
	Value float64
	// SD, Lo and Hi describe the surrogate values (standard deviation,
	// 2.5 % and 97.5 % quantiles); N is the number of finite values (1 or
	// 0 for the original); Count the surrogates made; PRank the rank
	// p-value of the original among them. NaN or 0 where they do not
	// apply.
	SD, Lo, Hi float64
	N, Count   int
	PRank      float64
}

// TableColumns is the header of the per-trace table.
var TableColumns = []string{"kind", "file", "group", "device", "parameter", "level", "samples", "seed",
	"condition", "name", "x", "value", "sd", "lo", "hi", "n", "count", "p_rank"}

// Rows turns a Record into table rows: per metric the original, then per
// method and metric the surrogate summary, then the distributions, then
// the verdict.
func Rows(rec Record, parameter string) []Row {
	nan := math.NaN()
	base := Row{File: rec.Trace.ID, Group: rec.Trace.Group, Device: rec.Trace.Device, Parameter: parameter,
		Level: rec.Trace.Level, Samples: rec.Samples, Seed: rec.Seed, X: nan, SD: nan, Lo: nan, Hi: nan, PRank: nan}
	var out []Row
	for i, m := range rec.Metrics {
		r := base
		r.Kind, r.Condition, r.Name, r.Value = KindMetric, Original, m, rec.Original[i]
		if finite(r.Value) {
			r.N = 1
		}
		out = append(out, r)
	}
	for _, s := range rec.Surrogates {
		for i, m := range rec.Metrics {
			r := base
			r.Kind, r.Condition, r.Name = KindMetric, s.Method, m
			r.Value, r.SD, r.Lo, r.Hi = s.Mean[i], s.SD[i], s.Lo[i], s.Hi[i]
			r.N, r.Count, r.PRank = s.Finite[i], s.Count, s.RankP[i]
			out = append(out, r)
		}
	}
	for _, d := range rec.Distributions {
		for i := range d.X {
			r := base
			r.Kind, r.Condition, r.Name, r.X, r.Value = KindDistribution, d.Condition, d.Name, d.X[i], d.W[i]
			out = append(out, r)
		}
	}
	if v := rec.Verdict; v != nil {
		decided := false
		model := v.Model
		if model == "" {
			model = UnnamedModel
		}
		for i, c := range v.Classes {
			r := base
			r.Kind, r.Condition, r.Name, r.Value = KindVerdict, model, c, v.Probabilities[i]
			if c == v.Class {
				r.N, decided = 1, true
			}
			out = append(out, r)
		}
		if !decided {
			r := base
			r.Kind, r.Condition, r.Name, r.Value, r.N = KindVerdict, model, Undetermined, nan, 1
			out = append(out, r)
		}
	}
	return out
}

// SortRows puts rows in the canonical order — file, kind (metrics first),
// condition (original first), name, x — in which every run writes its
// table, so tables merged from several runs are written exactly as one
// run writes them. Metric and distribution names sort by their rank in
// the given orders (unknown names after, alphabetically).
func SortRows(rows []Row) {
	slices.SortStableFunc(rows, compareRows)
}

func compareRows(a, b Row) int {
	if c := cmp.Compare(a.File, b.File); c != 0 {
		return c
	}
	if c := cmp.Compare(kindRank(a.Kind), kindRank(b.Kind)); c != 0 {
		return c
	}
	if c := cmp.Compare(conditionRank(a.Condition), conditionRank(b.Condition)); c != 0 {
		return c
	}
	if c := cmp.Compare(a.Condition, b.Condition); c != 0 {
		return c
	}
	if c := cmp.Compare(nameRank(a.Name), nameRank(b.Name)); c != 0 {
		return c
	}
	if c := cmp.Compare(a.Name, b.Name); c != 0 {
		return c
	}
	return cmp.Compare(a.X, b.X)
}

func kindRank(k string) int {
	switch k {
	case KindMetric:
		return 0
	case KindDistribution:
		return 1
	}
	return 2
}

func conditionRank(c string) int {
	if c == Original {
		return -1
	}
	for i, m := range methodOrder() {
		if string(m) == c {
			return i
		}
	}
	return 100
}

// nameRank orders metric names as the feature catalogue and distribution
// names as DistributionNames; unknown names come last.
func nameRank(n string) int {
	rankOnce.Do(func() {
		ranks = map[string]int{}
		for i, m := range DefaultMetricsOrder() {
			ranks[m] = i
		}
		for i, d := range DistributionNames() {
			ranks[d] = 10000 + i
		}
	})
	if r, ok := ranks[n]; ok {
		return r
	}
	return 1 << 30
}

var (
	rankOnce sync.Once
	ranks    map[string]int
)

// DefaultMetricsOrder is the catalogue order of every feature.
func DefaultMetricsOrder() []string {
	out, _ := ResolveMetrics([]string{"all"})
	return out
}

// WriteTableCSV writes rows as CSV with the header TableColumns; numbers
// at full precision (shortest text that reads back to the same float64),
// missing numbers as empty fields.
func WriteTableCSV(w io.Writer, rows []Row) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(TableColumns); err != nil {
		return err
	}
	for _, r := range rows {
		if err := cw.Write([]string{r.Kind, r.File, r.Group, r.Device, r.Parameter, r.Level,
			strconv.Itoa(r.Samples), strconv.FormatUint(r.Seed, 10), r.Condition, r.Name,
			num(r.X), num(r.Value), num(r.SD), num(r.Lo), num(r.Hi),
			strconv.Itoa(r.N), strconv.Itoa(r.Count), num(r.PRank)}); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// rowJSON is the JSON Lines form of a Row; missing numbers are null.
type rowJSON struct {
	Kind      string   `json:"kind"`
	File      string   `json:"file"`
	Group     string   `json:"group"`
	Device    string   `json:"device"`
	Parameter string   `json:"parameter"`
	Level     string   `json:"level"`
	Samples   int      `json:"samples"`
	Seed      uint64   `json:"seed"`
	Condition string   `json:"condition"`
	Name      string   `json:"name"`
	X         *float64 `json:"x"`
	Value     *float64 `json:"value"`
	SD        *float64 `json:"sd"`
	Lo        *float64 `json:"lo"`
	Hi        *float64 `json:"hi"`
	N         int      `json:"n"`
	Count     int      `json:"count"`
	PRank     *float64 `json:"p_rank"`
}

// WriteTableJSONL writes rows as JSON Lines, one object per row with the
// keys of TableColumns.
func WriteTableJSONL(w io.Writer, rows []Row) error {
	for _, r := range rows {
		b, err := json.Marshal(rowJSON{r.Kind, r.File, r.Group, r.Device, r.Parameter, r.Level, r.Samples, r.Seed,
			r.Condition, r.Name, jnum(r.X), jnum(r.Value), jnum(r.SD), jnum(r.Lo), jnum(r.Hi), r.N, r.Count, jnum(r.PRank)})
		if err != nil {
			return err
		}
		if _, err := w.Write(append(b, '\n')); err != nil {
			return err
		}
	}
	return nil
}

// ErrTable marks a per-trace table that cannot be read.
var ErrTable = errors.New("bad per-trace table")

// ReadTableCSV reads a table written by WriteTableCSV (or several
// concatenated, each with its header, or with repeated headers removed).
// name labels errors, which give the line.
func ReadTableCSV(r io.Reader, name string) ([]Row, error) {
	cr := csv.NewReader(r)
	cr.FieldsPerRecord = -1
	header, err := cr.Read()
	if err != nil {
		return nil, fmt.Errorf("%s: %w: %v", name, ErrTable, err)
	}
	if !slices.Equal(header, TableColumns) {
		return nil, fmt.Errorf("%s:1: %w: header %q, want %q", name, ErrTable, strings.Join(header, ","), strings.Join(TableColumns, ","))
	}
	var rows []Row
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		line, _ := cr.FieldPos(0)
		if err != nil {
			return nil, fmt.Errorf("%s: %w: %v", name, ErrTable, err)
		}
		if slices.Equal(rec, TableColumns) {
			continue // a concatenated table's header
		}
		if len(rec) != len(TableColumns) {
			return nil, fmt.Errorf("%s:%d: %w: %d fields, want %d", name, line, ErrTable, len(rec), len(TableColumns))
		}
		var row Row
		var perr error
		f := func(s, what string) float64 {
			if s == "" {
				return math.NaN()
			}
			v, err := strconv.ParseFloat(s, 64)
			if err != nil && perr == nil {
				perr = fmt.Errorf("%s %q is not a number", what, s)
			}
			return v
		}
		i := func(s, what string) int {
			v, err := strconv.Atoi(s)
			if err != nil && perr == nil {
				perr = fmt.Errorf("%s %q is not an integer", what, s)
			}
			return v
		}
		seed, err := strconv.ParseUint(rec[7], 10, 64)
		if err != nil {
			perr = fmt.Errorf("seed %q is not an unsigned integer", rec[7])
		}
		row = Row{Kind: rec[0], File: rec[1], Group: rec[2], Device: rec[3], Parameter: rec[4], Level: rec[5],
			Samples: i(rec[6], "samples"), Seed: seed, Condition: rec[8], Name: rec[9],
			X: f(rec[10], "x"), Value: f(rec[11], "value"), SD: f(rec[12], "sd"), Lo: f(rec[13], "lo"), Hi: f(rec[14], "hi"),
			N: i(rec[15], "n"), Count: i(rec[16], "count"), PRank: f(rec[17], "p_rank")}
		if perr == nil && row.Kind != KindMetric && row.Kind != KindDistribution && row.Kind != KindVerdict {
			perr = fmt.Errorf("kind %q (want %s, %s or %s)", row.Kind, KindMetric, KindDistribution, KindVerdict)
		}
		if perr == nil && (row.File == "" || row.Group == "" || row.Condition == "" || row.Name == "") {
			perr = errors.New("empty file, group, condition or name")
		}
		if perr != nil {
			return nil, fmt.Errorf("%s:%d: %w: %v", name, line, ErrTable, perr)
		}
		rows = append(rows, row)
	}
	return rows, nil
}

// num formats a number for CSV: shortest round-trip text, "" for NaN.
func num(v float64) string {
	if math.IsNaN(v) {
		return ""
	}
	return strconv.FormatFloat(v, 'g', -1, 64)
}

// jnum is a JSON number, nil (null) for NaN and ±Inf.
func jnum(v float64) *float64 {
	if !finite(v) {
		return nil
	}
	return &v
}
