package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"github.com/tracesift/tracesift/internal/filelist"
)

// sourceOptions say where the traces of a batch come from beside the
// command-line paths: file lists, a campaign description, and the glob
// that filters walked directories.
type sourceOptions struct {
	filesFrom []string
	campaign  []string
	include   []string
}

func (o *sourceOptions) bind(f *pflag.FlagSet) {
	f.StringArrayVar(&o.filesFrom, "files-from", nil, "read trace paths from this list (one per line, or NUL-separated; - for stdin); repeatable")
	f.StringArrayVar(&o.campaign, "campaign", nil, "take the traces of this campaign description (the CSV of 'tracesift survey': its file column); repeatable")
	f.StringArrayVar(&o.include, "include", nil, "in directories, take only files whose name matches this glob (e.g. '*.csv', '*.csv.gz'); repeatable; default: every file except hidden, Markdown and .journal files")
}

// sourceHelp is the help paragraph of the input sources.
const sourceHelp = `Inputs: FILE arguments may be files, directories (walked recursively:
every file except hidden, Markdown and .journal files, or those matching
--include), or - (stdin). --files-from LIST adds the paths listed in LIST
(relative to the current directory; - reads the list from stdin),
--campaign CSV the traces of a campaign description (relative to its
directory). The batch is sorted by path and holds each file once, however
often it was named; a path that does not exist is reported once, as a
failed input.`

// collect gathers the batch: sorted, each file once.
func (o *sourceOptions) collect(e *env, args []string) ([]filelist.Entry, error) {
	if err := filelist.CheckPatterns(o.include); err != nil {
		return nil, usageError{fmt.Errorf("--include: %w", err)}
	}
	stdinList := false
	for _, l := range o.filesFrom {
		if l == filelist.Stdin {
			stdinList = true
		}
	}
	for _, a := range args {
		if a == filelist.Stdin && stdinList {
			return nil, usagef("stdin cannot be both a trace (-) and the file list (--files-from -)")
		}
	}
	c := filelist.Collector{Include: o.include}
	for _, a := range args {
		c.Add(a, "")
	}
	for _, l := range o.filesFrom {
		var err error
		if l == filelist.Stdin {
			err = c.AddList(e.stdin, "stdin")
		} else {
			var f *os.File
			if f, err = os.Open(l); err == nil {
				err = c.AddList(f, l)
				f.Close()
			}
		}
		if err != nil {
			return nil, fmt.Errorf("--files-from: %w", err)
		}
	}
	for _, cp := range o.campaign {
		f, err := os.Open(cp)
		if err != nil {
			return nil, fmt.Errorf("--campaign: %w", err)
		}
		err = c.AddCampaign(f, cp, filepath.Dir(cp))
		f.Close()
		if errors.Is(err, filelist.ErrNoFileColumn) {
			return nil, usageError{fmt.Errorf("--campaign: %w", err)}
		}
		if err != nil {
			return nil, fmt.Errorf("--campaign: %w", err)
		}
	}
	list := c.Entries()
	if len(list) == 0 {
		if len(args)+len(o.filesFrom)+len(o.campaign) == 0 {
			return nil, usagef("no input files")
		}
		filter := ""
		if len(o.include) > 0 {
			filter = " matching --include " + strings.Join(o.include, ", ")
		}
		if len(args) == 1 && len(o.filesFrom)+len(o.campaign) == 0 {
			return nil, fmt.Errorf("directory %s holds no trace files%s", args[0], filter)
		}
		return nil, fmt.Errorf("no trace files%s in %s", filter, strings.Join(append(append(slices.Clone(args), o.filesFrom...), o.campaign...), ", "))
	}
	return list, nil
}

// shardOptions select a deterministic part of the batch.
type shardOptions struct {
	shard  string
	shards int
}

func (o *shardOptions) bind(f *pflag.FlagSet) {
	f.StringVar(&o.shard, "shard", "", "process only shard K of N (K from 0), e.g. 2/4; default: from SLURM_ARRAY_TASK_ID and SLURM_ARRAY_TASK_COUNT, or JOB_COMPLETION_INDEX with --shards; 0/1 takes everything")
	f.IntVar(&o.shards, "shards", 0, "number of shards when the index comes from the scheduler (SLURM_ARRAY_TASK_ID or JOB_COMPLETION_INDEX)")
}

// shardHelp is the help paragraph of sharding.
const shardHelp = `Sharding: --shard K/N processes the traces whose path hashes to shard K
(0 ≤ K < N): the same trace always falls in the same shard, whatever the
order of the list or the other traces in it. Inside a Slurm job array the
shard is SLURM_ARRAY_TASK_ID of SLURM_ARRAY_TASK_COUNT (number the tasks
from 0, --array=0-3) unless --shard is given; in a Kubernetes indexed Job
it is JOB_COMPLETION_INDEX, with the count given by --shards. 'tracesift
collate' joins the shards' journals into the table one run gives.`

// shard is the part of a batch a run takes.
type shard struct {
	K, N int
	from string // where K and N came from, for the log line
}

func (s shard) String() string { return fmt.Sprintf("%d/%d", s.K, s.N) }

// on reports whether the run takes only a part of the batch.
func (s shard) on() bool { return s.N > 1 }

// resolve works out the shard from the flags and the environment.
func (o *shardOptions) resolve(e *env) (shard, error) {
	if o.shards < 0 {
		return shard{}, usagef("--shards %d: want a positive count", o.shards)
	}
	if o.shard != "" {
		ks, ns, ok := strings.Cut(o.shard, "/")
		k, kerr := strconv.Atoi(strings.TrimSpace(ks))
		n, nerr := strconv.Atoi(strings.TrimSpace(ns))
		if !ok || kerr != nil || nerr != nil || n < 1 || k < 0 || k >= n {
			return shard{}, usagef("--shard %q: want K/N with 0 ≤ K < N, e.g. 0/4 … 3/4", o.shard)
		}
		if o.shards != 0 && o.shards != n {
			return shard{}, usagef("--shard %s and --shards %d disagree", o.shard, o.shards)
		}
		return shard{K: k, N: n, from: "--shard"}, nil
	}
	index := func(name string) (int, bool, error) {
		v := strings.TrimSpace(e.lookupEnv(name))
		if v == "" {
			return 0, false, nil
		}
		k, err := strconv.Atoi(v)
		if err != nil || k < 0 {
			return 0, true, usagef("%s=%q is not a task index", name, v)
		}
		return k, true, nil
	}
	if k, ok, err := index("SLURM_ARRAY_TASK_ID"); err != nil || ok {
		if err != nil {
			return shard{}, err
		}
		n, from := o.shards, "SLURM_ARRAY_TASK_ID and --shards"
		if n == 0 {
			c := strings.TrimSpace(e.lookupEnv("SLURM_ARRAY_TASK_COUNT"))
			var cerr error
			if n, cerr = strconv.Atoi(c); cerr != nil || n < 1 {
				return shard{}, usagef("SLURM_ARRAY_TASK_ID is set but SLURM_ARRAY_TASK_COUNT=%q is not a count: give --shards N or --shard K/N", c)
			}
			from = "SLURM_ARRAY_TASK_ID and SLURM_ARRAY_TASK_COUNT"
		}
		if k >= n {
			return shard{}, usagef("SLURM_ARRAY_TASK_ID=%d is not below the shard count %d: number the array tasks from 0 (sbatch --array=0-%d), or give --shard K/N", k, n, n-1)
		}
		return shard{K: k, N: n, from: from}, nil
	}
	if k, ok, err := index("JOB_COMPLETION_INDEX"); err != nil || ok {
		if err != nil {
			return shard{}, err
		}
		if o.shards == 0 {
			return shard{}, usagef("JOB_COMPLETION_INDEX is set (a Kubernetes indexed Job) but not the shard count: give --shards N (the Job's completions)")
		}
		if k >= o.shards {
			return shard{}, usagef("JOB_COMPLETION_INDEX=%d is not below --shards %d", k, o.shards)
		}
		return shard{K: k, N: o.shards, from: "JOB_COMPLETION_INDEX and --shards"}, nil
	}
	if o.shards != 0 {
		return shard{}, usagef("--shards %d: the shard index comes from SLURM_ARRAY_TASK_ID or JOB_COMPLETION_INDEX, and neither is set; give --shard K/N", o.shards)
	}
	return shard{K: 0, N: 1}, nil
}

// take keeps the entries of shard s.
func (s shard) take(list []filelist.Entry) []filelist.Entry {
	if !s.on() {
		return list
	}
	var out []filelist.Entry
	for _, en := range list {
		if filelist.Shard(en.Name, s.N) == s.K {
			out = append(out, en)
		}
	}
	return out
}
