package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"github.com/tracesift/tracesift/internal/journal"
)

func init() { addCommand(newCollateCmd) }

type collateOptions struct {
	format string
	out    string
}

func newCollateCmd(e *env) *cobra.Command {
	var o collateOptions
	c := &cobra.Command{
		Use:   "collate JOURNAL... [-o OUT]",
		Short: "Join the journals of sharded runs into the table one run gives",
		Long: `Join the journals that the shards of a batch wrote (features, classify,
or survey --tables-only) into exactly the output one unsharded run writes:
the same traces in the same order, byte for byte, in the format the runs
used (--format to choose another).

A JOURNAL argument may be a journal (OUTPUT.journal), the output file it
sits beside, or the output directory of survey (DIR/traces.journal); a
collated survey journal gives the per-trace table traces.csv, to analyse
with 'tracesift survey --from'.

Checked and reported on stderr, one line each: journals made by another
command, program version, options or model than the first (refused);
shards of the same count that are absent (for example 1/4 when 0/4, 2/4
and 3/4 are given); journals whose last run did not finish (killed: run
that shard again with --resume); traces listed by a shard but without a
record (missing); traces that more than one journal lists (duplicated).
The traces that failed are listed as the runs list them (file, line,
reason). The exit status is 1 when anything was missing, duplicated or
failed; the table is still written with what there is.`,
		Example: `  tracesift collate features.0.csv.journal features.1.csv.journal -o features.csv
  tracesift collate features.*.csv -o features.csv        # the journals beside the shard outputs
  tracesift collate --format json verdicts.*.txt.journal  # JSON Lines instead of the runs' table
  tracesift collate part0 part1 part2 part3 -o traces.csv && tracesift survey --from traces.csv -o stats`,
		Args: cobra.MinimumNArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			return runCollate(e, args, &o)
		},
	}
	f := c.Flags()
	f.StringVar(&o.format, "format", "", "output format (default: the one the runs used): table, csv or json, as the command offers")
	f.StringVarP(&o.out, "output", "o", "-", "output file (- for stdout)")
	return c
}

// renderSpec is the output of a journalled command as its journal's header
// stores it: the format and what else the table needs.
type renderSpec interface {
	formats() []string
	setFormat(string)
	sink(w io.Writer) rawSink
}

// collators give, per command, the render options its journals store.
var collators = map[string]func() renderSpec{
	"features": func() renderSpec { return &featuresRender{} },
	"classify": func() renderSpec { return &classifyRender{} },
	"survey":   func() renderSpec { return &surveyRender{} },
}

// journalPath finds the journal an argument stands for.
func journalPath(arg string) string {
	if st, err := os.Stat(arg); err == nil && st.IsDir() {
		return filepath.Join(arg, surveyJournal)
	}
	if !strings.HasSuffix(arg, ".journal") {
		if _, err := os.Stat(arg + ".journal"); err == nil {
			return arg + ".journal"
		}
	}
	return arg
}

// collated is one journal given to collate.
type collated struct {
	path string
	ix   *journal.Index
	k, n int // shard (0/1 for an unsharded run)
}

func runCollate(e *env, args []string, o *collateOptions) error {
	var js []*collated
	defer func() {
		for _, j := range js {
			j.ix.Close()
		}
	}()
	seen := map[string]bool{}
	for _, a := range args {
		p := journalPath(a)
		if seen[p] {
			return usagef("journal %s given twice", p)
		}
		seen[p] = true
		ix, err := journal.Open(p)
		if err != nil {
			return err
		}
		j := &collated{path: p, ix: ix, n: 1}
		js = append(js, j)
		if ix.Last == nil {
			return fmt.Errorf("journal %s holds no run", p)
		}
		if s := ix.Last.Shard; s != "" {
			ks, ns, _ := strings.Cut(s, "/")
			j.k, _ = strconv.Atoi(ks)
			j.n, _ = strconv.Atoi(ns)
		}
	}
	first := js[0].ix.Last
	newSpec, ok := collators[first.Command]
	if !ok {
		return fmt.Errorf("journal %s: collate cannot join %q runs", js[0].path, first.Command)
	}
	for _, j := range js[1:] {
		h := j.ix.Last
		switch {
		case h.Command != first.Command:
			return fmt.Errorf("journal %s holds a %s run, %s a %s run", j.path, h.Command, js[0].path, first.Command)
		case h.Key != first.Key:
			return fmt.Errorf("journal %s was made with other options, program version or model than %s (key %s, not %s); only runs of one batch can be joined", j.path, js[0].path, h.Key, first.Key)
		case !bytes.Equal(h.Render, first.Render) && o.format == "":
			return fmt.Errorf("journal %s asks for another output (%s) than %s (%s); choose one with --format", j.path, h.Render, js[0].path, first.Render)
		case j.n != js[0].n:
			return fmt.Errorf("journal %s is shard %d/%d, %s is of %d shards; only shards of one split can be joined", j.path, j.k, j.n, js[0].path, js[0].n)
		}
	}

	// What each journal was to hold, and which holds each trace.
	var problems int
	report := func(format string, a ...any) {
		problems++
		fmt.Fprintf(e.stderr, "tracesift: "+format+"\n", a...)
	}
	n := js[0].n
	have := make([]int, n)
	for _, j := range js {
		have[j.k]++
	}
	absent, unfinished := 0, 0
	for k, c := range have {
		if c == 0 {
			absent++
			report("shard %d/%d: no journal given (its traces are missing)", k, n)
		}
	}
	for _, j := range js {
		if !j.ix.Ended {
			unfinished++
			report("journal %s: its last run did not finish (killed?); run that shard again with --resume", j.path)
		}
	}
	listedBy := map[string][]*collated{}
	for _, j := range js {
		for _, name := range j.ix.Last.Inputs {
			listedBy[name] = append(listedBy[name], j)
		}
	}
	names := make([]string, 0, len(listedBy))
	for name := range listedBy {
		names = append(names, name)
	}
	sort.Strings(names)
	type pick struct {
		name string
		j    *collated
		en   journal.Entry
	}
	picks := make([]pick, 0, len(names))
	var missing, duplicated int
	for _, name := range names {
		by := listedBy[name]
		if len(by) > 1 {
			duplicated++
			paths := make([]string, len(by))
			for i, j := range by {
				paths[i] = j.path
			}
			report("%s: duplicated: listed by %s", name, strings.Join(paths, ", "))
		}
		var p *pick
		for _, j := range by {
			if en, ok := j.ix.Lookup(name); ok && en.Key == j.ix.Last.Key {
				p = &pick{name, j, en}
				break
			}
		}
		if p == nil {
			missing++
			report("%s: missing: no record in %s", name, by[0].path)
			continue
		}
		picks = append(picks, *p)
	}

	spec := newSpec()
	if err := json.Unmarshal(first.Render, spec); err != nil {
		return fmt.Errorf("journal %s: output options: %w", js[0].path, err)
	}
	if o.format != "" {
		if err := checkFormat(o.format, spec.formats()...); err != nil {
			return err
		}
		spec.setFormat(o.format)
	}
	err := writeOutput(e, o.out, func(w io.Writer) error {
		s := spec.sink(w)
		var failures []batchFailure
		for _, p := range picks {
			if p.en.Failure != nil {
				failures = append(failures, batchFailure{Name: p.name, Reason: p.en.Failure.Reason})
				continue
			}
			raw, err := p.j.ix.Result(p.en)
			if err != nil {
				return err
			}
			if err := s.item(p.name, raw); err != nil {
				return err
			}
		}
		berr := reportFailures(e, failures, len(picks))
		if ferr := s.finish(); ferr != nil {
			return ferr
		}
		return berr
	})
	if err != nil && !errors.Is(err, errSomeFailed) {
		return err
	}
	if problems > 0 {
		fmt.Fprintf(e.stderr, "tracesift: collated %d traces from %d %s of %d %s: %d missing, %d duplicated, %d %s without a journal, %d unfinished %s\n",
			len(picks), len(js), plural(len(js), "journal"), n, plural(n, "shard"), missing, duplicated,
			absent, plural(absent, "shard"), unfinished, plural(unfinished, "run"))
		return errSomeFailed
	}
	return err
}
