// Package journal keeps the record of a batch run as it goes: an
// append-only JSON Lines file holding, for every input, one complete
// record written the moment the input is done, so that a run killed at
// any point leaves every finished result behind and can be resumed.
//
// A journal is a sequence of runs. Each run starts with a header line
// (the command, a key identifying everything that shapes the results,
// the shard and the inputs of the run), then one record line per input
// in the order they finish, and, when the run completes, an end line:
//
//	{"tracesift_journal":1,"command":"features","key":"…","shard":"2/4","inputs":["a.csv",…],…}
//	{"file":"a.csv","sha256":"…","key":"…","result":{…}}
//	{"file":"b.csv","sha256":"…","key":"…","failure":{"line":3,"reason":"b.csv line 3, column 2: not a number"}}
//	{"end":{"records":2,"failed":1}}
//
// Each line is written with one write call and is never rewritten; the
// later record of a file supersedes an earlier one. A line cut short by a
// crash (no final newline) is ignored when reading and cut off when a run
// appends. A writer holds an exclusive lock on the file (flock, where the
// system has it), so two runs never write one journal at once.
package journal

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sync"
)

// Version is the journal format written in headers.
const Version = 1

// Header opens a run.
type Header struct {
	Journal int    `json:"tracesift_journal"`
	Command string `json:"command"`
	// Key identifies everything that shapes a record besides the input's
	// content: program version, options, model. Records carry it too.
	Key     string `json:"key"`
	Program string `json:"program"`
	// Shard is "K/N" (0 ≤ K < N) for a sharded run, "" otherwise.
	Shard string `json:"shard,omitempty"`
	// Options are the result-shaping options for people; Render the
	// options of the output table, so that collating journals writes the
	// table the run wrote.
	Options json.RawMessage `json:"options,omitempty"`
	Render  json.RawMessage `json:"render,omitempty"`
	// Inputs are the names the run was given (its shard's), sorted.
	Inputs []string `json:"inputs"`
}

// Record is the outcome of one input.
type Record struct {
	File string `json:"file"`
	// Sum is the SHA-256 of the input's bytes as read (hex), "" when they
	// could not be read.
	Sum string `json:"sha256,omitempty"`
	Key string `json:"key"`
	// Desc identifies the description of the input beside its content
	// (e.g. its campaign row), "" when there is none.
	Desc    string          `json:"desc,omitempty"`
	Result  json.RawMessage `json:"result,omitempty"`
	Failure *Failure        `json:"failure,omitempty"`
}

// Failure is why an input gave no result.
type Failure struct {
	// Line is the line of the input where reading failed, 0 when the
	// failure is not tied to a line.
	Line int `json:"line,omitempty"`
	// Reason is the one-line message, naming the file.
	Reason string `json:"reason"`
}

// End closes a complete run.
type End struct {
	Records int `json:"records"`
	Failed  int `json:"failed"`
}

type endLine struct {
	End End `json:"end"`
}

// ErrBusy: another process holds the journal.
var ErrBusy = errors.New("in use by another run")

// ErrFormat: a line that is not a journal line.
var ErrFormat = errors.New("not a tracesift journal")

// Writer appends lines to a journal. Its methods are safe for concurrent
// use.
type Writer struct {
	path string
	mu   sync.Mutex
	f    *os.File
}

// Create starts an empty journal at path (an existing one is emptied once
// the lock is held).
func Create(path string) (*Writer, error) {
	w, err := open(path)
	if err != nil {
		return nil, err
	}
	if err := w.f.Truncate(0); err != nil {
		w.f.Close()
		return nil, fmt.Errorf("journal %s: %w", path, err)
	}
	return w, nil
}

// Resume opens the journal at path for appending and reads it; a missing
// journal is created empty (the index is then empty). A line cut short by
// a crash is cut off first.
func Resume(path string) (*Writer, *Index, error) {
	w, err := open(path)
	if err != nil {
		return nil, nil, err
	}
	ix, err := read(w.f, path)
	if err == nil && ix.complete < ix.size {
		err = w.f.Truncate(ix.complete)
	}
	if err != nil {
		w.f.Close()
		return nil, nil, err
	}
	return w, ix, nil
}

func open(path string) (*Writer, error) {
	f, err := os.OpenFile(path, os.O_RDWR|os.O_CREATE|os.O_APPEND, 0o644)
	if err != nil {
		dir := filepath.Dir(path)
		if st, serr := os.Stat(dir); serr != nil {
			return nil, fmt.Errorf("cannot write %s: directory %s does not exist", path, dir)
		} else if !st.IsDir() {
			return nil, fmt.Errorf("cannot write %s: %s is not a directory", path, dir)
		}
		return nil, fmt.Errorf("journal %s: %w", path, err)
	}
	if err := lock(f); err != nil {
		f.Close()
		return nil, fmt.Errorf("journal %s: %w", path, err)
	}
	return &Writer{path: path, f: f}, nil
}

// Path is where the journal is.
func (w *Writer) Path() string { return w.path }

// Write appends v as one JSON line with a single write.
func (w *Writer) Write(v any) error {
	b, err := json.Marshal(v)
	if err != nil {
		return err
	}
	b = append(b, '\n')
	w.mu.Lock()
	defer w.mu.Unlock()
	if _, err := w.f.Write(b); err != nil {
		return fmt.Errorf("journal %s: %w", w.path, err)
	}
	return nil
}

// End appends the end line of a complete run.
func (w *Writer) End(e End) error { return w.Write(endLine{e}) }

// Close syncs the journal to disk, releases the lock and closes it.
func (w *Writer) Close() error {
	w.mu.Lock()
	defer w.mu.Unlock()
	serr := w.f.Sync()
	cerr := w.f.Close() // closing releases the lock
	if serr != nil {
		return fmt.Errorf("journal %s: %w", w.path, serr)
	}
	return cerr
}

// Entry is the latest record of one file, without its result (read it
// with Index.Result).
type Entry struct {
	Sum, Key, Desc string
	// Failure is nil for a result.
	Failure *Failure
	// Run is the 0-based run (header) the record was written in.
	Run       int
	off, size int64
}

// Index is what a journal holds: the header of its last run, whether that
// run ended, and the latest record of every file. Results stay on disk
// and are read one at a time, so an index costs memory per file, not per
// result.
type Index struct {
	path string
	r    io.ReaderAt
	// Last is the header of the last run (nil for an empty journal);
	// Runs the number of runs; Ended whether the last run wrote its end
	// line, and EndLine what it said.
	Last    *Header
	Runs    int
	Ended   bool
	EndLine End
	// Torn is true when the journal ends in a line cut short.
	Torn    bool
	entries map[string]Entry
	// complete is the length of the journal up to its last complete line;
	// size its length.
	complete, size int64
}

// Lookup returns the latest record of file.
func (ix *Index) Lookup(file string) (Entry, bool) {
	e, ok := ix.entries[file]
	return e, ok
}

// Len is the number of files with a record.
func (ix *Index) Len() int { return len(ix.entries) }

// Result reads the result of an entry from the journal.
func (ix *Index) Result(e Entry) (json.RawMessage, error) {
	b := make([]byte, e.size)
	if _, err := ix.r.ReadAt(b, e.off); err != nil {
		return nil, fmt.Errorf("journal %s: %w", ix.path, err)
	}
	var rec Record
	if err := json.Unmarshal(b, &rec); err != nil {
		return nil, fmt.Errorf("journal %s at byte %d: %w", ix.path, e.off, err)
	}
	return rec.Result, nil
}

// Open reads the journal at path for reading only (collating); Close the
// index when done.
func Open(path string) (*Index, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	ix, err := read(f, path)
	if err != nil {
		f.Close()
		return nil, err
	}
	return ix, nil
}

// Close closes the file an index from Open reads results from.
func (ix *Index) Close() error {
	if c, ok := ix.r.(io.Closer); ok {
		return c.Close()
	}
	return nil
}

// probe is the union of the fields that tell line kinds apart; results
// are skipped (json.RawMessage is not declared, so they are not kept).
type probe struct {
	Journal *int     `json:"tracesift_journal"`
	File    *string  `json:"file"`
	Sum     string   `json:"sha256"`
	Key     string   `json:"key"`
	Desc    string   `json:"desc"`
	Failure *Failure `json:"failure"`
	End     *End     `json:"end"`
}

// read indexes a journal (read with ReadAt: the file offset does not
// matter).
func read(f *os.File, path string) (*Index, error) {
	ix := &Index{path: path, r: f, entries: map[string]Entry{}}
	br := bufio.NewReaderSize(io.NewSectionReader(f, 0, 1<<62), 1<<16)
	var off int64
	for lineNo := 1; ; lineNo++ {
		b, err := br.ReadSlice('\n')
		for err == bufio.ErrBufferFull { // a long line (a header listing many inputs)
			more := append([]byte(nil), b...)
			b, err = br.ReadSlice('\n')
			b = append(more, b...)
		}
		if err == io.EOF {
			if len(b) > 0 {
				ix.Torn = true
			}
			ix.complete, ix.size = off, off+int64(len(b))
			return ix, nil
		}
		if err != nil {
			return nil, fmt.Errorf("journal %s: %w", path, err)
		}
		n := int64(len(b))
		line := bytes.TrimSpace(b)
		if len(line) == 0 {
			off += n
			continue
		}
		var p probe
		if err := json.Unmarshal(line, &p); err != nil {
			return nil, fmt.Errorf("journal %s line %d: %w (%v)", path, lineNo, ErrFormat, err)
		}
		switch {
		case p.Journal != nil:
			var h Header
			if err := json.Unmarshal(line, &h); err != nil {
				return nil, fmt.Errorf("journal %s line %d: %w (%v)", path, lineNo, ErrFormat, err)
			}
			if h.Journal != Version {
				return nil, fmt.Errorf("journal %s line %d: format version %d, this program reads %d", path, lineNo, h.Journal, Version)
			}
			ix.Last, ix.Runs, ix.Ended = &h, ix.Runs+1, false
		case p.End != nil:
			ix.Ended, ix.EndLine = true, *p.End
		case p.File != nil:
			if ix.Last == nil {
				return nil, fmt.Errorf("journal %s line %d: %w (a record before any header)", path, lineNo, ErrFormat)
			}
			ix.entries[*p.File] = Entry{Sum: p.Sum, Key: p.Key, Desc: p.Desc, Failure: p.Failure, Run: ix.Runs - 1, off: off, size: n}
		default:
			return nil, fmt.Errorf("journal %s line %d: %w", path, lineNo, ErrFormat)
		}
		off += n
	}
}
