package journal

import (
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

func header(inputs ...string) Header {
	return Header{Journal: Version, Command: "features", Key: "k1", Program: "test", Inputs: inputs}
}

func result(v int) json.RawMessage { return json.RawMessage(fmt.Sprintf(`{"v":%d}`, v)) }

// A run written and read back: the header, the latest record of each file
// (a later record supersedes an earlier one), failures, the end line, and
// results read from disk by offset.
func TestWriteRead(t *testing.T) {
	p := filepath.Join(t.TempDir(), "j")
	w, err := Create(p)
	if err != nil {
		t.Fatal(err)
	}
	for _, v := range []any{
		header("a", "b", "c"),
		Record{File: "a", Sum: "s1", Key: "k1", Result: result(1)},
		Record{File: "b", Sum: "s2", Key: "k1", Failure: &Failure{Line: 3, Reason: "b line 3: not a number"}},
		Record{File: "a", Sum: "s3", Key: "k1", Desc: "d", Result: result(2)},
	} {
		if err := w.Write(v); err != nil {
			t.Fatal(err)
		}
	}
	if err := w.End(End{Records: 3, Failed: 1}); err != nil {
		t.Fatal(err)
	}
	if err := w.Close(); err != nil {
		t.Fatal(err)
	}
	ix, err := Open(p)
	if err != nil {
		t.Fatal(err)
	}
	defer ix.Close()
	if ix.Last == nil || !slices.Equal(ix.Last.Inputs, []string{"a", "b", "c"}) || !ix.Ended || ix.EndLine.Failed != 1 || ix.Runs != 1 || ix.Torn {
		t.Fatalf("index %+v", ix)
	}
	a, ok := ix.Lookup("a")
	if !ok || a.Sum != "s3" || a.Desc != "d" || a.Failure != nil {
		t.Fatalf("a: %+v", a)
	}
	if raw, err := ix.Result(a); err != nil || string(raw) != `{"v":2}` {
		t.Errorf("result of a: %s, %v", raw, err)
	}
	if b, _ := ix.Lookup("b"); b.Failure == nil || b.Failure.Line != 3 {
		t.Errorf("b: %+v", b)
	}
	if _, ok := ix.Lookup("c"); ok || ix.Len() != 2 {
		t.Errorf("c has a record, or %d files", ix.Len())
	}
}

// A journal cut at any byte (a kill during a write, a crash) reads back as
// its complete lines; Resume cuts the partial line off, so the next line
// appended starts on a line of its own.
func TestTornTail(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "j")
	w, _ := Create(p)
	w.Write(header("a", "b"))
	w.Write(Record{File: "a", Sum: "s", Key: "k1", Result: result(1)})
	w.Write(Record{File: "b", Sum: "s", Key: "k1", Result: result(2)})
	w.Close()
	full, _ := os.ReadFile(p)
	lines := strings.SplitAfter(string(full), "\n")
	for cut := 0; cut <= len(full); cut++ {
		q := filepath.Join(dir, fmt.Sprintf("cut%d", cut))
		os.WriteFile(q, full[:cut], 0o644)
		ix, err := Open(q)
		if err != nil {
			if cut < len(lines[0]) {
				continue // no complete header yet: an empty index is fine, an error is not
			}
			t.Fatalf("cut %d: %v", cut, err)
		}
		complete := 0
		for _, l := range lines {
			if strings.HasSuffix(l, "\n") && len(strings.Join(lines[:complete+1], "")) <= cut {
				complete++
			}
		}
		wantRecords := max(0, complete-1)
		if ix.Len() != wantRecords {
			t.Errorf("cut %d: %d records, want %d", cut, ix.Len(), wantRecords)
		}
		torn := cut > 0 && full[cut-1] != '\n'
		if ix.Torn != torn {
			t.Errorf("cut %d: torn %v, want %v", cut, ix.Torn, torn)
		}
		ix.Close()

		w, ix, err := Resume(q)
		if err != nil {
			t.Fatalf("resume at cut %d: %v", cut, err)
		}
		if ix.Len() != wantRecords {
			t.Errorf("resume at cut %d: %d records", cut, ix.Len())
		}
		w.Write(header("a", "b"))
		w.Write(Record{File: "b", Sum: "s", Key: "k1", Result: result(3)})
		w.Close()
		ix2, err := Open(q)
		if err != nil {
			t.Fatalf("after resume at cut %d: %v", cut, err)
		}
		if b, ok := ix2.Lookup("b"); !ok || ix2.Torn {
			t.Errorf("after resume at cut %d: b %v, torn %v", cut, ok, ix2.Torn)
		} else if raw, _ := ix2.Result(b); string(raw) != `{"v":3}` {
			t.Errorf("after resume at cut %d: b is %s", cut, raw)
		}
		ix2.Close()
	}
}

// Two writers on one journal: the second is refused while the first
// holds it (flock locks belong to the open file, so this holds within one
// process too), and gets it once the first is closed.
func TestBusy(t *testing.T) {
	p := filepath.Join(t.TempDir(), "j")
	w, err := Create(p)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Create(p); !errors.Is(err, ErrBusy) {
		t.Errorf("second Create: %v, want ErrBusy", err)
	}
	if _, _, err := Resume(p); !errors.Is(err, ErrBusy) {
		t.Errorf("Resume while held: %v, want ErrBusy", err)
	}
	w.Close()
	w2, _, err := Resume(p)
	if err != nil {
		t.Fatalf("after Close: %v", err)
	}
	w2.Close()
}

// Lines that are not journal lines are refused with the line number; a
// header line longer than the read buffer is read whole.
func TestFormat(t *testing.T) {
	dir := t.TempDir()
	for _, c := range []struct{ content, want string }{
		{"not json\n", "line 1"},
		{`{"file":"a","key":"k"}` + "\n", "a record before any header"},
		{`{"tracesift_journal":1,"command":"x","key":"k","program":"p","inputs":[]}` + "\n" + `{"other":1}` + "\n", "line 2"},
		{`{"tracesift_journal":9,"command":"x","key":"k","program":"p","inputs":[]}` + "\n", "format version 9"},
	} {
		p := filepath.Join(dir, "bad")
		os.WriteFile(p, []byte(c.content), 0o644)
		if _, err := Open(p); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: %v, want an error saying %q", c.content, err, c.want)
		}
	}
	many := make([]string, 20000)
	for i := range many {
		many[i] = fmt.Sprintf("archive/trace_%06d.csv", i)
	}
	p := filepath.Join(dir, "long")
	w, _ := Create(p)
	w.Write(header(many...))
	w.Write(Record{File: many[19999], Key: "k1", Result: result(7)})
	w.Close()
	ix, err := Open(p)
	if err != nil || len(ix.Last.Inputs) != len(many) || ix.Len() != 1 {
		t.Fatalf("long header: %v", err)
	}
	en, _ := ix.Lookup(many[19999])
	if raw, err := ix.Result(en); err != nil || string(raw) != `{"v":7}` {
		t.Errorf("record after a long header: %s %v", raw, err)
	}
	ix.Close()
}
