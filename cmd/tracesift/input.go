package main

import (
	"errors"
	"fmt"
	"runtime"
	"slices"
	"strings"
	"sync"

	"github.com/spf13/pflag"

	"github.com/tracesift/tracesift/trace"
)

// inputOptions are the trace-reading flags shared by every command that
// takes trace files.
type inputOptions struct {
	column    string
	format    string
	nan       string
	minLength int
	// floor is the fewest samples the command's analysis can use; a
	// --min-length below it would only move the failure inside.
	floor int
}

// bind adds the reading flags; floor is the fewest samples the command's
// analysis can use (features.MinLength for commands that measure features).
func (o *inputOptions) bind(f *pflag.FlagSet, floor int) {
	o.floor = max(1, floor)
	f.StringVar(&o.column, "column", "", "value column by header name or 1-based index (default: the single value column, or the first non-time column); NPY: column number of a 2-D array; NPZ: array name, or NAME/N for column N; TDMS: GROUP/CHANNEL, CHANNEL or index; WAV: channel number")
	f.StringVar(&o.format, "input-format", "auto", "input format: auto (NPY, NPZ, TDMS and WAV by their magic bytes, else delimited text; gzip recognised), csv, f32le or f64le (raw little-endian samples), npy, npz, tdms, wav")
	f.StringVar(&o.nan, "nan", "reject", "non-finite or missing samples: reject, drop, or interpolate (linear)")
	f.IntVar(&o.minLength, "min-length", trace.DefaultMinLength, "reject traces shorter than this many samples")
}

func (o *inputOptions) traceOptions() trace.Options {
	return trace.Options{
		Column:    o.column,
		Format:    trace.Format(o.format),
		NaN:       trace.NaNPolicy(o.nan),
		MinLength: o.minLength,
	}
}

// validate rejects flag values the reader would refuse for every file, so a
// usage error is reported once instead of once per file.
func (o *inputOptions) validate() error {
	if !slices.Contains(trace.Formats, trace.Format(o.format)) && o.format != "" && o.format != "text" && o.format != "txt" {
		return usagef("--input-format %q: want one of %s", o.format, formatList())
	}
	switch trace.NaNPolicy(o.nan) {
	case trace.NaNReject, trace.NaNDrop, trace.NaNInterpolate, "":
	default:
		return usagef("--nan %q: want reject, drop or interpolate", o.nan)
	}
	if o.minLength < o.floor {
		if o.floor == 1 {
			return usagef("--min-length %d: want at least 1", o.minLength)
		}
		return usagef("--min-length %d: this command's estimators need at least %d samples per trace", o.minLength, o.floor)
	}
	return nil
}

// formatList is trace.Formats for a usage message.
func formatList() string {
	names := make([]string, len(trace.Formats))
	for i, f := range trace.Formats {
		names[i] = string(f)
	}
	return strings.Join(names, ", ")
}

// batchFailure is one input a batch could not process.
type batchFailure struct {
	Name   string
	Reason string // one line
}

// batchError reports that some inputs of a batch failed after the others
// were processed; each failure was already reported on stderr. It matches
// errSomeFailed under errors.Is.
type batchError struct {
	total    int
	failures []batchFailure
}

func (b *batchError) Error() string {
	return fmt.Sprintf("%d of %d inputs failed", len(b.failures), b.total)
}

func (b *batchError) Is(target error) bool { return target == errSomeFailed }

// succeeded is the number of inputs that gave a result.
func (b *batchError) succeeded() int { return b.total - len(b.failures) }

// batch runs work on each input in parallel (at most GOMAXPROCS at once)
// and hands the results to emit in input order, so output is deterministic.
// An input whose work fails is skipped and the others go on; at the end
// each failure is reported on stderr as one line, in input order, with the
// count. batch returns a *batchError (errSomeFailed) when any input failed.
// what names the inputs in the progress display ("traces"). Commands whose
// results should survive a kill go through a batchRun (journalled.go).
func batch[R any](e *env, what string, inputs []string, work func(i int, name string) (R, error), emit func(i int, name string, r R) error) error {
	type slot struct {
		r    R
		err  error
		done chan struct{}
	}
	slots := make([]slot, len(inputs))
	for i := range slots {
		slots[i].done = make(chan struct{})
	}
	progress := startProgress(e, len(inputs), what, what)
	sem := make(chan struct{}, max(1, runtime.GOMAXPROCS(0)))
	var wg sync.WaitGroup
	go func() {
		for i, name := range inputs {
			sem <- struct{}{}
			wg.Add(1)
			go func() {
				defer wg.Done()
				defer func() { <-sem }()
				defer close(slots[i].done)
				slots[i].r, slots[i].err = work(i, name)
			}()
		}
	}()
	var failures []batchFailure
	var emitErr error
	for i, name := range inputs {
		<-slots[i].done
		progress.step(slots[i].err != nil)
		if slots[i].err != nil {
			failures = append(failures, batchFailure{Name: name, Reason: oneLine(slots[i].err.Error())})
			continue
		}
		if emitErr == nil {
			emitErr = emit(i, name, slots[i].r)
		}
		var zero R
		slots[i].r = zero // emitted: memory stays flat in the number of inputs
	}
	wg.Wait()
	progress.finish()
	if emitErr != nil {
		return emitErr
	}
	return reportFailures(e, failures, len(inputs))
}

// readTrace reads one input with the shared options; "-" is stdin. A trace
// too short for --min-length gets the hint to lower it only when that can
// help this command.
func readTrace(e *env, name string, o *inputOptions) (trace.Trace, error) {
	opts := o.traceOptions()
	var tr trace.Trace
	var err error
	if name == "-" {
		opts.Name = "stdin"
		tr, err = trace.Read(e.stdin, opts)
	} else {
		tr, err = trace.ReadFile(name, opts)
	}
	if errors.Is(err, trace.ErrTooShort) && o.minLength > o.floor && !strings.Contains(err.Error(), "--min-length") {
		err = fmt.Errorf("%w (--min-length can go down to %d for this command)", err, o.floor)
	}
	return tr, err
}
