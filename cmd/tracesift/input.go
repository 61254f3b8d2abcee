package main

import (
	"fmt"
	"runtime"
	"sync"

	"github.com/spf13/pflag"

	"tracesift/trace"
)

// inputOptions are the trace-reading flags shared by every command that
// takes trace files.
type inputOptions struct {
	column    string
	format    string
	nan       string
	minLength int
}

func (o *inputOptions) bind(f *pflag.FlagSet) {
	f.StringVar(&o.column, "column", "", "value column by header name or 1-based index (default: the single value column, or the first non-time column)")
	f.StringVar(&o.format, "input-format", "auto", "input format: auto (delimited text, optionally gzip), f32le or f64le (raw little-endian samples)")
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
	switch trace.Format(o.format) {
	case trace.FormatAuto, "", trace.FormatCSV, "text", "txt", trace.FormatF32LE, trace.FormatF64LE:
	default:
		return usagef("--input-format %q: want auto, f32le or f64le", o.format)
	}
	switch trace.NaNPolicy(o.nan) {
	case trace.NaNReject, trace.NaNDrop, trace.NaNInterpolate, "":
	default:
		return usagef("--nan %q: want reject, drop or interpolate", o.nan)
	}
	if o.minLength < 1 {
		return usagef("--min-length %d: want at least 1", o.minLength)
	}
	return nil
}

// batch runs work on each input in parallel (at most GOMAXPROCS at once)
// and hands the results to emit in input order, so output is deterministic.
// An input whose work fails is reported on stderr as one line and skipped;
// the others go on. batch returns errSomeFailed when any input failed.
func batch[R any](e *env, inputs []string, work func(i int, name string) (R, error), emit func(i int, name string, r R) error) error {
	type slot struct {
		r    R
		err  error
		done chan struct{}
	}
	slots := make([]slot, len(inputs))
	for i := range slots {
		slots[i].done = make(chan struct{})
	}
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
	failed := 0
	var emitErr error
	for i, name := range inputs {
		<-slots[i].done
		if slots[i].err != nil {
			failed++
			fmt.Fprintf(e.stderr, "tracesift: %s\n", oneLine(slots[i].err.Error()))
			continue
		}
		if emitErr == nil {
			emitErr = emit(i, name, slots[i].r)
		}
	}
	wg.Wait()
	if emitErr != nil {
		return emitErr
	}
	if failed > 0 {
		if failed == len(inputs) && len(inputs) > 1 {
			fmt.Fprintf(e.stderr, "tracesift: all %d inputs failed\n", failed)
		} else if len(inputs) > 1 {
			fmt.Fprintf(e.stderr, "tracesift: %d of %d inputs failed\n", failed, len(inputs))
		}
		return errSomeFailed
	}
	return nil
}

// readTrace reads one input with the shared options; "-" is stdin.
func readTrace(e *env, name string, o *inputOptions) (trace.Trace, error) {
	opts := o.traceOptions()
	if name == "-" {
		opts.Name = "stdin"
		return trace.Read(e.stdin, opts)
	}
	return trace.ReadFile(name, opts)
}
