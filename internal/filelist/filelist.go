// Package filelist gathers the trace files of a batch from command-line
// paths, directories (walked recursively, filtered by glob patterns), file
// lists and campaign descriptions, and splits the result into shards.
//
// The list it returns is sorted by name and holds each file once, whatever
// order or repetition the sources gave; a path that does not exist is kept
// (once), so that the batch reports it like any other bad input. Shard
// assigns each name to one of n shards by a hash of the name alone, so the
// assignment does not depend on the order of the list, on its other
// entries, or on the machine.
package filelist

import (
	"bufio"
	"bytes"
	"crypto/sha256"
	"encoding/binary"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"slices"
	"strings"
)

// Stdin is the name that stands for standard input.
const Stdin = "-"

// Entry is one file of the batch.
type Entry struct {
	// Name is the path the file is opened by and named by in outputs:
	// the command-line path, a list line or a campaign path joined to the
	// campaign's directory, or a walked directory joined with the path
	// below it; cleaned (filepath.Clean), so "./a//b.csv" is "a/b.csv".
	Name string
	// Origin says where a listed name came from ("list.txt line 7"), ""
	// for command-line paths and walked files.
	Origin string
	// Err is set for a directory that could not be walked; the batch
	// reports it as a failed input.
	Err error
}

// ErrBadPattern marks an --include pattern that is not a valid glob.
var ErrBadPattern = errors.New("bad pattern")

// Collector accumulates entries. Its zero value takes every file of a
// walked directory except hidden files (and directories), Markdown files,
// which archives keep beside their traces, and batch journals (.journal).
type Collector struct {
	// Include, when not empty, keeps only the files of walked
	// directories whose base name matches one of these globs (path.Match
	// syntax: *, ?, [a-z]). Files named directly are always kept.
	Include []string

	byAbs map[string]int // absolute path → index in entries
	list  []Entry
}

// CheckPatterns validates glob patterns.
func CheckPatterns(patterns []string) error {
	for _, p := range patterns {
		if _, err := path.Match(p, ""); err != nil || p == "" {
			return fmt.Errorf("%w %q: want a glob such as '*.csv' or 'D??_*.csv.gz'", ErrBadPattern, p)
		}
	}
	return nil
}

// Add adds a path: a file (kept even if it does not exist: the batch
// reports it), "-" (standard input), or a directory, walked recursively.
// origin is recorded on the entry (or entries) it gives.
func (c *Collector) Add(p, origin string) {
	if p == Stdin {
		c.put(Entry{Name: Stdin, Origin: origin})
		return
	}
	p = filepath.Clean(p)
	st, err := os.Stat(p)
	if err != nil || !st.IsDir() {
		c.put(Entry{Name: p, Origin: origin})
		return
	}
	c.walk(p, origin)
}

// walk adds the files below dir: regular files, and symbolic links to
// regular files; symbolic links to directories are not followed (no
// cycles). A directory that cannot be read is one entry with its error.
func (c *Collector) walk(dir, origin string) {
	filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			c.put(Entry{Name: p, Origin: origin, Err: err})
			if d != nil && d.IsDir() && p != dir {
				return filepath.SkipDir
			}
			return nil
		}
		name := d.Name()
		if p != dir && strings.HasPrefix(name, ".") {
			if d.IsDir() {
				return filepath.SkipDir
			}
			return nil
		}
		if d.IsDir() || skipped(name) || !c.included(name) {
			return nil
		}
		if !d.Type().IsRegular() {
			st, err := os.Stat(p) // a symbolic link: keep it if it leads to a file
			if err != nil || !st.Mode().IsRegular() {
				return nil
			}
		}
		c.put(Entry{Name: p})
		return nil
	})
}

// skipped names the files a walk never takes: Markdown (archives keep
// notes beside their traces) and batch journals (FILE.journal, written
// beside an output that may sit in the walked tree).
func skipped(base string) bool {
	ext := filepath.Ext(base)
	return strings.EqualFold(ext, ".md") || ext == ".journal"
}

func (c *Collector) included(base string) bool {
	if len(c.Include) == 0 {
		return true
	}
	for _, pat := range c.Include {
		if ok, _ := path.Match(pat, base); ok {
			return true
		}
	}
	return false
}

// put adds e unless the same file is already there; of two names for one
// file (a.csv and ./sub/../a.csv, or a relative and an absolute path) the
// smaller name is kept, so the result does not depend on the order of
// addition.
func (c *Collector) put(e Entry) {
	key := e.Name
	if e.Name != Stdin {
		if abs, err := filepath.Abs(e.Name); err == nil {
			key = abs
		}
	}
	if c.byAbs == nil {
		c.byAbs = map[string]int{}
	}
	if i, ok := c.byAbs[key]; ok {
		if e.Name < c.list[i].Name {
			c.list[i] = e
		}
		return
	}
	c.byAbs[key] = len(c.list)
	c.list = append(c.list, e)
}

// AddList adds the paths of a file list: one path per line (surrounding
// blanks and a carriage return trimmed; empty lines and lines starting
// with # skipped), or NUL-separated when the list holds a NUL byte (as
// `find -print0` writes). Relative paths are taken relative to the
// current directory, as shells and `find` write them. source names the
// list in origins ("list.txt", "stdin").
func (c *Collector) AddList(r io.Reader, source string) error {
	data, err := io.ReadAll(r)
	if err != nil {
		return fmt.Errorf("%s: %w", source, err)
	}
	if bytes.IndexByte(data, 0) >= 0 {
		for i, f := range bytes.Split(data, []byte{0}) {
			if len(f) > 0 {
				c.Add(string(f), fmt.Sprintf("%s entry %d", source, i+1))
			}
		}
		return nil
	}
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(nil, 1<<20)
	for line := 1; sc.Scan(); line++ {
		s := strings.TrimSpace(sc.Text())
		if s == "" || strings.HasPrefix(s, "#") {
			continue
		}
		c.Add(s, fmt.Sprintf("%s line %d", source, line))
	}
	if err := sc.Err(); err != nil {
		return fmt.Errorf("%s: %w", source, err)
	}
	return nil
}

// ErrNoFileColumn: a campaign description without the file column.
var ErrNoFileColumn = errors.New("no file column")

// AddCampaign adds the traces of a campaign description (the CSV table of
// `tracesift survey`): the paths in its "file" column, relative to the
// description's directory base, directories walked. Comment lines (#)
// are skipped; the other columns are not read here.
func (c *Collector) AddCampaign(r io.Reader, source, base string) error {
	cr := csv.NewReader(r)
	cr.FieldsPerRecord = -1
	cr.Comment = '#'
	cr.TrimLeadingSpace = true
	header, err := cr.Read()
	if err != nil {
		if err == io.EOF {
			return fmt.Errorf("%s: empty campaign description", source)
		}
		return fmt.Errorf("%s: %w", source, err)
	}
	col := -1
	for i, h := range header {
		if strings.EqualFold(strings.TrimSpace(strings.TrimPrefix(h, "\ufeff")), "file") {
			col = i
			break
		}
	}
	if col < 0 {
		return fmt.Errorf("%s: %w (columns %s)", source, ErrNoFileColumn, strings.Join(header, ", "))
	}
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			return nil
		}
		line, _ := cr.FieldPos(0)
		if err != nil {
			return fmt.Errorf("%s: %w", source, err)
		}
		if col >= len(rec) || strings.TrimSpace(rec[col]) == "" {
			continue // survey reports such a row; here it names no file
		}
		p := strings.TrimSpace(rec[col])
		if !filepath.IsAbs(p) {
			p = filepath.Join(base, p)
		}
		c.Add(p, fmt.Sprintf("%s line %d", source, line))
	}
}

// Entries returns the entries sorted by name.
func (c *Collector) Entries() []Entry {
	out := slices.Clone(c.list)
	slices.SortFunc(out, func(a, b Entry) int { return strings.Compare(a.Name, b.Name) })
	return out
}

// Shard returns the shard (0 ≤ shard < n) of a name: the first eight bytes
// of the SHA-256 digest of the name, as a big-endian integer, modulo n.
// It depends on the name only. The modulo's bias is below n/2^64.
func Shard(name string, n int) int {
	if n <= 1 {
		return 0
	}
	sum := sha256.Sum256([]byte(name))
	return int(binary.BigEndian.Uint64(sum[:8]) % uint64(n))
}
