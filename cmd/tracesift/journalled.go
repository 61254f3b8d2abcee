package main

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"runtime"
	"slices"
	"sync"

	"github.com/spf13/pflag"

	"github.com/tracesift/tracesift/internal/atomicfile"
	"github.com/tracesift/tracesift/internal/filelist"
	"github.com/tracesift/tracesift/internal/journal"
	"github.com/tracesift/tracesift/trace"
)

// journalOptions are the flags of the batch journal.
type journalOptions struct {
	path      string
	noJournal bool
	resume    bool
}

func (o *journalOptions) bind(f *pflag.FlagSet, def string) {
	f.StringVar(&o.path, "journal", "", "journal of the run, one JSON line per trace written as it finishes (default: "+def+")")
	f.BoolVar(&o.noJournal, "no-journal", false, "keep no journal (results go out only when the batch ends, or stream to stdout)")
	f.BoolVar(&o.resume, "resume", false, "skip the traces the journal already holds with the same content checksum, options and model (none: start afresh)")
}

// journalHelp is the help paragraph of the journal.
const journalHelp = `Journal: with -o FILE every trace's result (or failure: file, line,
reason) is appended to FILE.journal the moment it is done, one JSON line
each, and FILE is assembled from the journal at the end and renamed into
place; a run that is killed keeps every finished trace. --resume skips the
traces whose record is present with the same content checksum (SHA-256 of
the file), options, program version and model, and computes the rest: the
output is byte for byte the one an uninterrupted run writes. A journal
serves one run at a time.`

// resolve returns the journal path ("" for none) for output out.
func (o *journalOptions) resolve(out string) (string, error) {
	switch {
	case o.noJournal && (o.path != "" || o.resume):
		return "", usagef("--no-journal contradicts --journal and --resume")
	case o.noJournal:
		return "", nil
	case o.path != "":
		return o.path, nil
	case out != "" && out != "-" && !atomicfile.IsSpecial(out):
		return out + ".journal", nil
	case o.resume:
		return "", usagef("--resume needs a journal: give -o FILE (journal FILE.journal; not a device or pipe) or --journal FILE")
	}
	return "", nil
}

// batchInput is one input of a journalled batch.
type batchInput struct {
	// name names the input in outputs and in the journal, and decides its
	// shard; path is where it is read ("-": stdin).
	name, path string
	// desc is a digest of the input's description beside its content
	// (its campaign row), "" when there is none.
	desc string
	// err is a failure known before reading; line its line, if any.
	err  error
	line int
}

// entriesToInputs turns collected files into batch inputs.
func entriesToInputs(list []filelist.Entry) []batchInput {
	out := make([]batchInput, len(list))
	for i, en := range list {
		out[i] = batchInput{name: en.Name, path: en.Name}
		if en.Err != nil {
			out[i].err = fmt.Errorf("%s: cannot read the directory: %w", en.Name, unwrapPath(en.Err))
		}
	}
	return out
}

func unwrapPath(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}

// batchRun is one run of a batch command whose outcomes go through a
// journal: the inputs of this run (its shard), in output order, and what
// identifies their results.
type batchRun struct {
	command string
	inputs  []batchInput
	// key identifies everything besides the inputs that shapes a result:
	// program version, options, model (batchKey).
	key string
	// options and render go into the journal's header (options that
	// shape results, for people; options of the output table, for
	// collate).
	options, render any
	shard           shard
	journal         string // "" for none
	resume          bool
}

// batchKey digests the program version and the given values (options, a
// model checksum) into the key stored with every record.
func batchKey(command string, parts ...any) string {
	b, err := json.Marshal(append([]any{command, versionString()}, parts...))
	if err != nil {
		panic(err) // options are plain data
	}
	s := sha256.Sum256(b)
	return hex.EncodeToString(s[:8])
}

// digest is the hex SHA-256 of s, shortened as batchKey's.
func digest(s string) string {
	h := sha256.Sum256([]byte(s))
	return hex.EncodeToString(h[:8])
}

// announce says on stderr which shard this run takes (unless --quiet).
func (r *batchRun) announce(e *env, total int) {
	if r.shard.on() && !e.quiet {
		fmt.Fprintf(e.stderr, "tracesift: shard %s (%s): %d of %d traces\n", r.shard, r.shard.from, len(r.inputs), total)
	}
}

// batchWork computes one input's result: i indexes batchRun.inputs, and e
// is the run's env (its stdin hashes what it reads for "-").
type batchWork func(e *env, i int) (any, error)

// outcome runs work on input i and returns its record; sum is the input's
// checksum when already known.
func (r *batchRun) outcome(e *env, i int, sum string, work batchWork) journal.Record {
	in := r.inputs[i]
	rec := journal.Record{File: in.name, Key: r.key, Desc: in.desc}
	if in.err != nil {
		rec.Failure = &journal.Failure{Line: in.line, Reason: oneLine(in.err.Error())}
		return rec
	}
	var res any
	var err error
	if in.path == filelist.Stdin {
		h := sha256.New()
		tee := io.TeeReader(e.stdin, h)
		we := *e
		we.stdin = tee
		res, err = work(&we, i)
		io.Copy(h, tee) // the rest of stdin counts too
		sum = hex.EncodeToString(h.Sum(nil))
	} else {
		if sum == "" {
			sum = fileSum(in.path)
		}
		res, err = work(e, i)
	}
	rec.Sum = sum
	if err == nil {
		rec.Result, err = json.Marshal(res)
	}
	if err != nil {
		f := &journal.Failure{Reason: oneLine(err.Error())}
		var te *trace.Error
		if errors.As(err, &te) {
			f.Line = te.Line
		}
		rec.Result, rec.Failure = nil, f
	}
	return rec
}

// fileSum is the hex SHA-256 of a file's bytes, "" when it cannot be read.
func fileSum(path string) string {
	f, err := os.Open(path)
	if err != nil {
		return ""
	}
	defer f.Close()
	h := sha256.New()
	if _, err := io.Copy(h, f); err != nil {
		return ""
	}
	return hex.EncodeToString(h.Sum(nil))
}

// rawSink receives the results of a batch in input order and writes the
// output table.
type rawSink interface {
	item(name string, result json.RawMessage) error
	// finish writes what needs every result (an aligned table, notes).
	finish() error
}

// run computes the batch and writes the output table to out through the
// sink: with a journal, every outcome is recorded as it finishes and the
// table is assembled from the journal at the end; without one, results
// stream to the sink in input order.
func (r *batchRun) run(e *env, out string, work batchWork, newSink func(w io.Writer) rawSink) error {
	fill := func(feed func(rawSink) error) func(io.Writer) error {
		return func(w io.Writer) error {
			s := newSink(w)
			err := feed(s)
			var be *batchError
			if err != nil && !errors.As(err, &be) {
				return err
			}
			if ferr := s.finish(); ferr != nil {
				return ferr
			}
			return err
		}
	}
	if r.journal == "" {
		return writeOutput(e, out, fill(func(s rawSink) error { return r.stream(e, work, s) }))
	}
	if err := r.compute(e, work); err != nil {
		return err
	}
	return writeOutput(e, out, fill(func(s rawSink) error { return r.assemble(e, s) }))
}

// stream runs the batch without a journal, handing results to the sink in
// input order as they come.
func (r *batchRun) stream(e *env, work batchWork, s rawSink) error {
	names := make([]string, len(r.inputs))
	for i, in := range r.inputs {
		names[i] = in.name
	}
	return batch(e, "traces", names,
		func(i int, _ string) (json.RawMessage, error) {
			rec := r.outcome(e, i, "", work)
			if rec.Failure != nil {
				return nil, errors.New(rec.Failure.Reason)
			}
			return rec.Result, nil
		},
		func(_ int, name string, raw json.RawMessage) error { return s.item(name, raw) })
}

// compute runs work on every input the journal does not already hold up
// to date (with --resume) and appends each outcome to the journal the
// moment it is done, then the end line. Inputs are processed in parallel
// (GOMAXPROCS at once); records go in the order they finish.
func (r *batchRun) compute(e *env, work batchWork) (err error) {
	var w *journal.Writer
	var prev *journal.Index
	if r.resume {
		w, prev, err = journal.Resume(r.journal)
	} else {
		w, err = journal.Create(r.journal)
	}
	if errors.Is(err, journal.ErrBusy) {
		return fmt.Errorf("%w: every run needs its own journal (give each shard its own -o or --journal)", err)
	}
	if err != nil {
		return err
	}
	defer func() {
		if cerr := w.Close(); err == nil {
			err = cerr
		}
	}()
	if prev != nil && prev.Last != nil && prev.Last.Command != r.command {
		return usagef("--resume: journal %s holds a %s run, not %s; give another --journal", r.journal, prev.Last.Command, r.command)
	}

	sums := make([]string, len(r.inputs))
	pending := r.pending(e, prev, sums)
	if prev != nil && prev.Last != nil && !e.quiet {
		fmt.Fprintf(e.stderr, "tracesift: resuming from %s: %d of %d traces already done, %d to go\n",
			r.journal, len(r.inputs)-len(pending), len(r.inputs), len(pending))
	}

	names := make([]string, len(r.inputs))
	for i, in := range r.inputs {
		names[i] = in.name
	}
	h := journal.Header{Journal: journal.Version, Command: r.command, Key: r.key, Program: versionString(), Inputs: names}
	if r.shard.on() {
		h.Shard = r.shard.String()
	}
	if h.Options, err = json.Marshal(r.options); err != nil {
		return err
	}
	if h.Render, err = json.Marshal(r.render); err != nil {
		return err
	}
	if err := w.Write(h); err != nil {
		return err
	}

	prog := startProgress(e, len(pending), "traces", "traces")
	defer prog.finish()
	jobs := make(chan int)
	var (
		wg       sync.WaitGroup
		mu       sync.Mutex
		writeErr error
		failed   int
	)
	for range max(1, runtime.GOMAXPROCS(0)) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range jobs {
				rec := r.outcome(e, i, sums[i], work)
				werr := w.Write(rec)
				mu.Lock()
				if werr != nil && writeErr == nil {
					writeErr = werr
				}
				if rec.Failure != nil {
					failed++
				}
				mu.Unlock()
				prog.step(rec.Failure != nil)
			}
		}()
	}
	for _, i := range pending {
		mu.Lock()
		stop := writeErr != nil
		mu.Unlock()
		if stop {
			break
		}
		jobs <- i
	}
	close(jobs)
	wg.Wait()
	if writeErr != nil {
		return writeErr
	}
	return w.End(journal.End{Records: len(pending), Failed: failed})
}

// pending returns the indices of the inputs to compute: all of them,
// except with --resume those whose latest record is a result with this
// run's key and description and the file's current checksum (which it
// stores in sums for the inputs it hashed). stdin is never skipped.
func (r *batchRun) pending(e *env, prev *journal.Index, sums []string) []int {
	var out []int
	var candidates []int
	for i, in := range r.inputs {
		if prev == nil || in.path == filelist.Stdin || in.err != nil {
			out = append(out, i)
			continue
		}
		en, ok := prev.Lookup(in.name)
		if !ok || en.Failure != nil || en.Key != r.key || en.Desc != in.desc || en.Sum == "" {
			out = append(out, i)
			continue
		}
		candidates = append(candidates, i)
	}
	if len(candidates) == 0 {
		return out
	}
	// Hash the candidates in parallel; reading dominates.
	var wg sync.WaitGroup
	next := make(chan int)
	for range max(1, runtime.GOMAXPROCS(0)) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				sums[i] = fileSum(r.inputs[i].path)
			}
		}()
	}
	for _, i := range candidates {
		next <- i
	}
	close(next)
	wg.Wait()
	for _, i := range candidates {
		if en, _ := prev.Lookup(r.inputs[i].name); sums[i] == "" || sums[i] != en.Sum {
			out = append(out, i)
		}
	}
	slices.Sort(out)
	return out
}

// assemble reads this run's outcomes from the journal in input order:
// results go to the sink, failures are reported on stderr one line each,
// followed by the count; it returns a *batchError when any input failed.
func (r *batchRun) assemble(e *env, s rawSink) error {
	ix, err := journal.Open(r.journal)
	if err != nil {
		return err
	}
	defer ix.Close()
	var failures []batchFailure
	for _, in := range r.inputs {
		en, ok := ix.Lookup(in.name)
		if !ok {
			// Only a journal changed behind this run's back can lack one.
			failures = append(failures, batchFailure{Name: in.name, Reason: in.name + ": no record in the journal " + r.journal})
			continue
		}
		if en.Failure != nil {
			failures = append(failures, batchFailure{Name: in.name, Reason: en.Failure.Reason})
			continue
		}
		raw, err := ix.Result(en)
		if err != nil {
			return err
		}
		if err := s.item(in.name, raw); err != nil {
			return err
		}
	}
	return reportFailures(e, failures, len(r.inputs))
}

// reportFailures writes one stderr line per failure and the count, as
// batch does, and returns the *batchError (nil without failures).
func reportFailures(e *env, failures []batchFailure, total int) error {
	if len(failures) == 0 {
		return nil
	}
	for _, f := range failures {
		fmt.Fprintf(e.stderr, "tracesift: %s\n", f.Reason)
	}
	if len(failures) == total && total > 1 {
		fmt.Fprintf(e.stderr, "tracesift: all %d inputs failed\n", len(failures))
	} else if total > 1 {
		fmt.Fprintf(e.stderr, "tracesift: %d of %d inputs failed\n", len(failures), total)
	}
	return &batchError{total: total, failures: failures}
}
