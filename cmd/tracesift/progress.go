package main

import (
	"fmt"
	"sync"
	"time"

	"github.com/schollz/progressbar/v3"
)

// progress shows on stderr how far a batch (or one long computation) has
// come: on a terminal a bar with the count, the rate and the time left;
// otherwise (a log file, a scheduler's output file) a plain line at most
// every env.plainEvery, with a last line when the work ends if any line
// was written; nothing with --quiet. Its methods are safe for concurrent
// use and do nothing on a nil *progress.
type progress struct {
	mu       sync.Mutex
	e        *env
	what     string // "traces", "measuring"
	unit     string // per-second unit of the rate: "traces", "steps"
	total    int
	bar      *progressbar.ProgressBar
	start    time.Time
	last     time.Time // last plain line
	lines    int       // plain lines written
	done     int
	failed   int
	finished bool
}

// startProgress returns the progress display of total steps, or nil when
// nothing is to be shown (--quiet, one step, or neither a terminal nor a
// plain-line interval).
func startProgress(e *env, total int, what, unit string) *progress {
	if e.quiet || total <= 1 || (!e.terminal && e.plainEvery <= 0) {
		return nil
	}
	p := &progress{e: e, what: what, unit: unit, total: total, start: time.Now()}
	p.last = p.start
	if e.terminal {
		p.bar = progressbar.NewOptions(total,
			progressbar.OptionSetWriter(e.stderr),
			progressbar.OptionSetDescription(what),
			progressbar.OptionShowCount(),
			progressbar.OptionShowIts(),
			progressbar.OptionSetItsString(unit),
			progressbar.OptionSetPredictTime(true),
			progressbar.OptionClearOnFinish(),
			progressbar.OptionThrottle(100*time.Millisecond),
		)
	}
	return p
}

// newProgress is startProgress as a callback taking the count done, for
// the library options that report progress that way (nil when nothing is
// to be shown).
func newProgress(e *env, total int, what string) func(done, total int) {
	p := startProgress(e, total, what, "steps")
	if p == nil {
		return nil
	}
	return func(done, _ int) { p.set(done, 0) }
}

// step counts one more step done (failed: one that failed).
func (p *progress) step(failed bool) {
	if p == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	f := p.failed
	if failed {
		f++
	}
	p.drawLocked(p.done+1, f)
}

// set records done steps of which failed failed, and draws.
func (p *progress) set(done, failed int) {
	if p == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	p.drawLocked(done, failed)
}

func (p *progress) drawLocked(done, failed int) {
	if p.finished {
		return
	}
	p.done, p.failed = done, failed
	if p.bar != nil {
		p.bar.Set(done)
		if done >= p.total {
			p.bar.Finish()
			p.finished = true
		}
		return
	}
	now := time.Now()
	if done >= p.total {
		p.finishLocked(now)
		return
	}
	if now.Sub(p.last) >= p.e.plainEvery {
		p.last = now
		p.lines++
		fmt.Fprintf(p.e.stderr, "tracesift: %s\n", p.line(now))
	}
}

// finish ends the display (a batch that stopped early).
func (p *progress) finish() {
	if p == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.finished {
		return
	}
	if p.bar != nil {
		p.bar.Finish()
		p.finished = true
		return
	}
	p.finishLocked(time.Now())
}

func (p *progress) finishLocked(now time.Time) {
	p.finished = true
	if p.lines == 0 {
		return // a short run: no lines at all
	}
	el := now.Sub(p.start)
	s := fmt.Sprintf("%s: %d of %d done in %s", p.what, p.done, p.total, roundDuration(el))
	if el > 0 && p.done > 0 {
		s += fmt.Sprintf(" (%s %s per second)", perSecond(float64(p.done)/el.Seconds()), p.unit)
	}
	if p.failed > 0 {
		s += fmt.Sprintf("; %d failed", p.failed)
	}
	fmt.Fprintf(p.e.stderr, "tracesift: %s\n", s)
}

// line is the plain progress line: count, share, rate and time left.
func (p *progress) line(now time.Time) string {
	s := fmt.Sprintf("%s: %d of %d done (%.0f%%)", p.what, p.done, p.total, 100*float64(p.done)/float64(p.total))
	el := now.Sub(p.start).Seconds()
	if p.done > 0 && el > 0 {
		r := float64(p.done) / el
		left := time.Duration(float64(p.total-p.done) / r * float64(time.Second))
		s += fmt.Sprintf(", %s %s per second, about %s left", perSecond(r), p.unit, roundDuration(left))
	}
	if p.failed > 0 {
		s += fmt.Sprintf("; %d failed", p.failed)
	}
	return s
}

// perSecond prints a rate with three significant digits.
func perSecond(r float64) string { return fmt.Sprintf("%.3g", r) }

// roundDuration rounds to whole seconds (tenths below ten seconds).
func roundDuration(d time.Duration) string {
	if d < 10*time.Second {
		return d.Round(100 * time.Millisecond).String()
	}
	return d.Round(time.Second).String()
}
