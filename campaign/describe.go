package campaign

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math"
	"os"
	"path"
	"path/filepath"
	"regexp"
	"slices"
	"sort"
	"strconv"
	"strings"
)

// Default column names of a campaign description.
const (
	DefaultFileColumn   = "file"
	DefaultGroupColumn  = "group"
	DefaultDeviceColumn = "device"
	DefaultParamColumn  = "bias_V"
)

// NoColumn given as Roles.Device or Roles.Param switches that role off.
const NoColumn = "none"

// Errors of the campaign description.
var (
	// ErrUnknownColumn: a role names a column the description does not
	// have.
	ErrUnknownColumn = errors.New("unknown column")
	// ErrNoTraces: the description names no usable trace.
	ErrNoTraces = errors.New("no traces in the campaign")
)

// Roles say which columns (or named groups of a file-name pattern) hold
// the group, the device and the control parameter. Empty fields mean the
// defaults: "group" (required), "device" and "bias_V" (both used when
// present, silently absent otherwise). A role named explicitly must exist
// (ErrUnknownColumn); NoColumn switches the device or parameter off.
type Roles struct {
	Group, Device, Param string
}

// Trace is one trace of a campaign.
type Trace struct {
	// ID names the trace in tables and seeds it: the path as written in
	// the description (or below the walked directory), with forward
	// slashes. Runs that split a campaign keep the IDs, so their tables
	// merge into what one run writes.
	ID string `json:"file"`
	// Path is where the file is read from.
	Path string `json:"-"`
	// Line is the line of the description that named the trace (0 for a
	// pattern over file names).
	Line   int    `json:"line,omitempty"`
	Group  string `json:"group"`
	Device string `json:"device,omitempty"`
	// Level is the control parameter as written ("0.60"); Param its value,
	// NaN without a parameter.
	Level string  `json:"level,omitempty"`
	Param float64 `json:"-"`
	// Fields holds every column (or named group) of the trace.
	Fields map[string]string `json:"-"`
}

// Problem is one entry of the description that could not be used, with
// where it was.
type Problem struct {
	Source string // description file or walked directory
	Line   int    // 1-based line of the description, 0 when not from a line
	File   string // the trace named, if any
	Reason string
}

// String renders the problem on one line: "campaign.csv:7: fresh/D09.csv:
// no such file".
func (p Problem) String() string {
	var b strings.Builder
	b.WriteString(p.Source)
	if p.Line > 0 {
		fmt.Fprintf(&b, ":%d", p.Line)
	}
	if p.File != "" {
		fmt.Fprintf(&b, ": %s", p.File)
	}
	fmt.Fprintf(&b, ": %s", p.Reason)
	return b.String()
}

// Plan is a parsed campaign description: the traces in a stable order and
// the problems met, one per unusable entry.
type Plan struct {
	Traces   []Trace
	Problems []Problem
	// Notes are remarks that are not problems (files of a walked
	// directory that the pattern does not describe).
	Notes []string
	// ParamName is the column of the control parameter ("" without one),
	// DeviceName the device column ("" without one).
	ParamName, DeviceName string
}

// ReadCSV reads a campaign description: a CSV table with a header holding
// a file column ("file") and any other columns. Paths are relative to
// base (normally the directory of the description); a path naming a
// directory stands for every trace file below it (walked recursively,
// hidden files and Markdown skipped), each inheriting the row's columns.
// source names the description in problems. Rows that cannot be used — a
// missing file, a wrong number of fields, an empty group, a parameter that
// is not a number, a file listed twice — become Problems with their line,
// and the other rows go on; a role naming an unknown column is an error
// (ErrUnknownColumn) that names the header's columns.
func ReadCSV(r io.Reader, source, base string, roles Roles) (Plan, error) {
	cr := csv.NewReader(r)
	cr.FieldsPerRecord = -1
	cr.Comment = '#'
	cr.TrimLeadingSpace = true
	header, err := cr.Read()
	if err == io.EOF {
		return Plan{}, fmt.Errorf("%s: empty campaign description: %w", source, ErrNoTraces)
	}
	if err != nil {
		return Plan{}, fmt.Errorf("%s: %w", source, err)
	}
	for i := range header {
		header[i] = strings.TrimSpace(strings.TrimPrefix(header[i], "\ufeff"))
	}
	hline, _ := cr.FieldPos(0)
	col := func(name string) int { return slices.Index(header, name) }
	fileCol := col(DefaultFileColumn)
	if fileCol < 0 {
		return Plan{}, fmt.Errorf("%s:%d: no %q column (columns: %s): %w", source, hline, DefaultFileColumn, strings.Join(header, ", "), ErrUnknownColumn)
	}
	names, err := resolveRoles(roles, header, func(name string) error {
		return fmt.Errorf("%s:%d: column %q not in the header (columns: %s): %w", source, hline, name, strings.Join(header, ", "), ErrUnknownColumn)
	})
	if err != nil {
		return Plan{}, err
	}
	plan := Plan{ParamName: names.Param, DeviceName: names.Device}
	seen := map[string]int{}
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		line, _ := cr.FieldPos(0)
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				line = pe.Line
			}
			plan.Problems = append(plan.Problems, Problem{Source: source, Line: line, Reason: "unreadable row: " + oneLine(err.Error())})
			continue
		}
		if len(rec) == 1 && strings.TrimSpace(rec[0]) == "" {
			continue
		}
		if len(rec) != len(header) {
			reason := fmt.Sprintf("%d fields, the header has %d columns (%s)", len(rec), len(header), strings.Join(header, ", "))
			if len(rec) > len(header) {
				reason = fmt.Sprintf("%d fields: field %d is in no column (the header has %d: %s)", len(rec), len(header)+1, len(header), strings.Join(header, ", "))
			}
			plan.Problems = append(plan.Problems, Problem{Source: source, Line: line, Reason: reason})
			continue
		}
		fields := make(map[string]string, len(header))
		for i, h := range header {
			fields[h] = strings.TrimSpace(rec[i])
		}
		id := path.Clean(filepath.ToSlash(fields[DefaultFileColumn]))
		bad := func(reason string) {
			plan.Problems = append(plan.Problems, Problem{Source: source, Line: line, File: fields[DefaultFileColumn], Reason: reason})
		}
		if fields[DefaultFileColumn] == "" {
			bad("empty file name")
			continue
		}
		t, reason := describe(fields, names)
		if reason != "" {
			bad(reason)
			continue
		}
		p := filepath.FromSlash(id)
		if !filepath.IsAbs(p) {
			p = filepath.Join(base, p)
		}
		st, err := os.Stat(p)
		if err != nil {
			if errors.Is(err, fs.ErrNotExist) {
				bad("no such file")
			} else {
				bad(oneLine(err.Error()))
			}
			continue
		}
		var files []string
		if st.IsDir() {
			files, err = walk(p)
			if err != nil {
				bad(oneLine(err.Error()))
				continue
			}
			if len(files) == 0 {
				bad("directory holds no trace files")
				continue
			}
		} else {
			files = []string{""}
		}
		for _, rel := range files {
			tt := t
			tt.Line = line
			tt.ID, tt.Path = id, p
			if rel != "" {
				tt.ID = path.Join(id, rel)
				tt.Path = filepath.Join(p, filepath.FromSlash(rel))
			}
			if first, dup := seen[tt.ID]; dup {
				plan.Problems = append(plan.Problems, Problem{Source: source, Line: line, File: tt.ID, Reason: fmt.Sprintf("listed twice (first on line %d); this row is left out", first)})
				continue
			}
			seen[tt.ID] = line
			plan.Traces = append(plan.Traces, tt)
		}
	}
	if len(plan.Traces) == 0 && len(plan.Problems) == 0 {
		return plan, fmt.Errorf("%s: %w", source, ErrNoTraces)
	}
	return plan, nil
}

// FromPattern builds a campaign from file names: every trace file below
// each root (walked recursively; hidden files and Markdown skipped) whose
// path relative to its root, with forward slashes, matches re. The named
// groups of re are the columns, e.g.
// (?P<device>D\d+)_(?P<group>fresh|stressed)_Vg(?P<bias_V>[0-9.]+). A file
// the pattern does not match is noted (one line each) and left out. The
// trace ID is the relative path (prefixed by the root's base name when
// several roots are given).
func FromPattern(roots []string, re *regexp.Regexp, roles Roles) (Plan, error) {
	var cols []string
	for _, n := range re.SubexpNames() {
		if n != "" {
			cols = append(cols, n)
		}
	}
	names, err := resolveRoles(roles, cols, func(name string) error {
		return fmt.Errorf("pattern %q has no named group %q (named groups: %s): %w", re, name, strings.Join(cols, ", "), ErrUnknownColumn)
	})
	if err != nil {
		return Plan{}, err
	}
	plan := Plan{ParamName: names.Param, DeviceName: names.Device}
	seen := map[string]bool{}
	for _, root := range roots {
		files, err := walk(root)
		if err != nil {
			return Plan{}, err
		}
		if len(files) == 0 {
			plan.Problems = append(plan.Problems, Problem{Source: root, Reason: "no trace files below this directory"})
		}
		for _, rel := range files {
			id := rel
			if len(roots) > 1 {
				id = path.Join(filepath.ToSlash(filepath.Base(filepath.Clean(root))), rel)
			}
			m := re.FindStringSubmatch(rel)
			if m == nil {
				plan.Notes = append(plan.Notes, fmt.Sprintf("%s: %s: not described by the pattern; left out", root, rel))
				continue
			}
			fields := map[string]string{DefaultFileColumn: id}
			for i, n := range re.SubexpNames() {
				if n != "" {
					fields[n] = m[i]
				}
			}
			t, reason := describe(fields, names)
			if reason != "" {
				plan.Problems = append(plan.Problems, Problem{Source: root, File: rel, Reason: reason})
				continue
			}
			if seen[id] {
				plan.Problems = append(plan.Problems, Problem{Source: root, File: rel, Reason: "the same trace ID twice; left out"})
				continue
			}
			seen[id] = true
			t.ID, t.Path = id, filepath.Join(root, filepath.FromSlash(rel))
			if st, err := os.Stat(root); err == nil && !st.IsDir() {
				t.Path = root
			}
			plan.Traces = append(plan.Traces, t)
		}
	}
	if len(plan.Traces) == 0 {
		return plan, fmt.Errorf("pattern %q matched no trace file: %w", re, ErrNoTraces)
	}
	return plan, nil
}

// resolveRoles fills the default column names and checks explicit ones
// against the available columns; unknown makes the error for a missing
// explicit column.
func resolveRoles(r Roles, cols []string, unknown func(string) error) (Roles, error) {
	has := func(n string) bool { return slices.Contains(cols, n) }
	out := Roles{}
	switch {
	case r.Group == "":
		if !has(DefaultGroupColumn) {
			return out, unknown(DefaultGroupColumn)
		}
		out.Group = DefaultGroupColumn
	case !has(r.Group):
		return out, unknown(r.Group)
	default:
		out.Group = r.Group
	}
	pick := func(given, def string) (string, error) {
		switch {
		case given == NoColumn:
			return "", nil
		case given == "":
			if has(def) {
				return def, nil
			}
			return "", nil
		case !has(given):
			return "", unknown(given)
		}
		return given, nil
	}
	var err error
	if out.Device, err = pick(r.Device, DefaultDeviceColumn); err != nil {
		return out, err
	}
	if out.Param, err = pick(r.Param, DefaultParamColumn); err != nil {
		return out, err
	}
	return out, nil
}

// describe makes a Trace (without ID and Path) from a row's fields, or
// returns why the row cannot be used.
func describe(fields map[string]string, names Roles) (Trace, string) {
	t := Trace{Fields: fields, Param: math.NaN()}
	t.Group = fields[names.Group]
	if t.Group == "" {
		return t, fmt.Sprintf("empty %s", names.Group)
	}
	if names.Device != "" {
		t.Device = fields[names.Device]
	}
	if names.Param != "" {
		// A pattern such as Vg([0-9.]+) also takes the dot before the
		// extension: "0.60." is the level 0.60.
		t.Level = strings.TrimRight(fields[names.Param], ".")
		if t.Level == "" {
			return t, fmt.Sprintf("empty %s", names.Param)
		}
		v, err := strconv.ParseFloat(strings.ReplaceAll(t.Level, ",", "."), 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			return t, fmt.Sprintf("%s %q is not a number", names.Param, t.Level)
		}
		t.Param = v
	}
	return t, ""
}

// walk lists the trace files below dir, relative with forward slashes,
// sorted; hidden files and directories and Markdown files are skipped. A
// plain file gives itself.
func walk(dir string) ([]string, error) {
	st, err := os.Stat(dir)
	if err != nil {
		return nil, err
	}
	if !st.IsDir() {
		return []string{filepath.Base(dir)}, nil
	}
	var out []string
	err = filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		name := d.Name()
		if p != dir && strings.HasPrefix(name, ".") {
			if d.IsDir() {
				return filepath.SkipDir
			}
			return nil
		}
		if d.IsDir() || !d.Type().IsRegular() || strings.EqualFold(filepath.Ext(name), ".md") {
			return nil
		}
		rel, err := filepath.Rel(dir, p)
		if err != nil {
			return err
		}
		out = append(out, filepath.ToSlash(rel))
		return nil
	})
	sort.Strings(out)
	return out, err
}

// oneLine folds a message onto one line.
func oneLine(s string) string {
	return strings.Join(strings.Fields(s), " ")
}
