package filelist

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

func touch(t *testing.T, p string) {
	t.Helper()
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(p, []byte("t,value\n"), 0o644); err != nil {
		t.Fatal(err)
	}
}

func names(es []Entry) []string {
	out := make([]string, len(es))
	for i, e := range es {
		out[i] = e.Name
	}
	return out
}

// A tree walked recursively gives its files sorted, without hidden files,
// hidden directories, Markdown and journals; --include filters walked files by base
// name but never a file named directly; a symbolic link to a file is
// taken, one to a directory is not followed.
func TestWalk(t *testing.T) {
	dir := t.TempDir()
	for _, p := range []string{"b/2.csv", "a/1.csv", "a/deep/3.csv.gz", "a/notes.md", ".hidden.csv", ".git/x.csv", "a/.h/4.csv", "c/5.txt", "c/out.csv.journal"} {
		touch(t, filepath.Join(dir, p))
	}
	if err := os.Symlink(filepath.Join(dir, "b", "2.csv"), filepath.Join(dir, "c", "link.csv")); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink(filepath.Join(dir, "a"), filepath.Join(dir, "c", "dirlink")); err != nil {
		t.Fatal(err)
	}
	var c Collector
	c.Add(dir, "")
	want := []string{"a/1.csv", "a/deep/3.csv.gz", "b/2.csv", "c/5.txt", "c/link.csv"}
	for i := range want {
		want[i] = filepath.Join(dir, want[i])
	}
	if got := names(c.Entries()); !slices.Equal(got, want) {
		t.Errorf("walk: %q, want %q", got, want)
	}

	c = Collector{Include: []string{"*.csv", "*.gz"}}
	c.Add(dir, "")
	c.Add(filepath.Join(dir, "c", "5.txt"), "") // named: kept despite --include
	want = []string{"a/1.csv", "a/deep/3.csv.gz", "b/2.csv", "c/5.txt", "c/link.csv"}
	for i := range want {
		want[i] = filepath.Join(dir, want[i])
	}
	if got := names(c.Entries()); !slices.Equal(got, want) {
		t.Errorf("include: %q, want %q", got, want)
	}
	c = Collector{Include: []string{"?.csv"}}
	c.Add(dir, "")
	if got := names(c.Entries()); !slices.Equal(got, []string{filepath.Join(dir, "a", "1.csv"), filepath.Join(dir, "b", "2.csv")}) {
		t.Errorf("include ?.csv: %q", got)
	}
}

// The same file named in several ways and several times is one entry,
// under the smallest of its names, whatever the order of addition; a
// missing path is kept (once) for the batch to report; "-" is stdin.
func TestDeduplicateAndSort(t *testing.T) {
	dir := t.TempDir()
	t.Chdir(dir)
	touch(t, "x/a.csv")
	touch(t, "b.csv")
	adds := []string{"x/a.csv", "./x/a.csv", filepath.Join(dir, "x", "a.csv"), "x//a.csv", "b.csv", "missing.csv", "missing.csv", "x/../b.csv", "-", "-"}
	var first []string
	for trial := range 20 {
		rng := rand.New(rand.NewPCG(uint64(trial), 7))
		order := slices.Clone(adds)
		rng.Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
		var c Collector
		for _, a := range order {
			c.Add(a, "")
		}
		got := names(c.Entries())
		if trial == 0 {
			first = got
			// Byte order: "-" (0x2d) before letters and "/" (0x2f).
			want := []string{"-", filepath.Join(dir, "x", "a.csv"), "b.csv", "missing.csv"}
			slices.Sort(want)
			if !slices.Equal(got, want) {
				t.Fatalf("entries %q, want %q", got, want)
			}
		} else if !slices.Equal(got, first) {
			t.Fatalf("order %q gives %q, first order gave %q", order, got, first)
		}
	}
}

// A list: lines with blanks, comments and CRLF, or NUL-separated; origins
// name the list's line or entry.
func TestAddList(t *testing.T) {
	var c Collector
	if err := c.AddList(strings.NewReader("# traces\r\n  b.csv  \r\n\r\na.csv\nb.csv\n"), "list.txt"); err != nil {
		t.Fatal(err)
	}
	es := c.Entries()
	if got := names(es); !slices.Equal(got, []string{"a.csv", "b.csv"}) {
		t.Fatalf("lines: %q", got)
	}
	if es[0].Origin != "list.txt line 4" || es[1].Origin != "list.txt line 2" {
		t.Errorf("origins %q, %q", es[0].Origin, es[1].Origin)
	}
	c = Collector{}
	if err := c.AddList(strings.NewReader("with space.csv\x00# not a comment\x00z.csv\x00"), "stdin"); err != nil {
		t.Fatal(err)
	}
	if got := names(c.Entries()); !slices.Equal(got, []string{"# not a comment", "with space.csv", "z.csv"}) {
		t.Errorf("NUL-separated: %q", got)
	}
}

// A campaign description: the file column, relative to its directory,
// whatever its position; a description without one is refused.
func TestAddCampaign(t *testing.T) {
	var c Collector
	err := c.AddCampaign(strings.NewReader("\ufeffdevice,File,group\n# a comment\nD1,fresh/a.csv,fresh\nD2,/abs/b.csv,stressed\nD3,,fresh\n"), "camp.csv", "base")
	if err != nil {
		t.Fatal(err)
	}
	es := c.Entries()
	if got := names(es); !slices.Equal(got, []string{"/abs/b.csv", filepath.Join("base", "fresh", "a.csv")}) {
		t.Fatalf("campaign: %q", got)
	}
	if es[1].Origin != "camp.csv line 3" {
		t.Errorf("origin %q", es[1].Origin)
	}
	err = c.AddCampaign(strings.NewReader("path,group\na.csv,x\n"), "bad.csv", ".")
	if !errors.Is(err, ErrNoFileColumn) || !strings.Contains(err.Error(), "bad.csv") {
		t.Errorf("no file column: %v", err)
	}
}

func TestCheckPatterns(t *testing.T) {
	if err := CheckPatterns([]string{"*.csv", "D??_[a-z]*.gz"}); err != nil {
		t.Error(err)
	}
	for _, bad := range []string{"[", "a[b", ""} {
		if err := CheckPatterns([]string{bad}); !errors.Is(err, ErrBadPattern) {
			t.Errorf("%q: %v", bad, err)
		}
	}
}

// Shard depends on the name alone, so a list split into shards gives a
// partition that does not change when the list is reordered, and adding
// names does not move the others. The shares are those of independent
// uniform draws: each count lies within 5 standard deviations of n/k,
// σ = √(n·(1/k)·(1 − 1/k)) (binomial variance, analytic).
func TestShard(t *testing.T) {
	const n, k = 4000, 4
	list := make([]string, n)
	for i := range list {
		list[i] = fmt.Sprintf("archive/device%03d/run_%04d.csv", i%97, i)
	}
	counts := make([]int, k)
	assign := map[string]int{}
	for _, s := range list {
		sh := Shard(s, k)
		if sh < 0 || sh >= k {
			t.Fatalf("shard %d of %d", sh, k)
		}
		counts[sh]++
		assign[s] = sh
	}
	sd := math.Sqrt(n * (1.0 / k) * (1 - 1.0/k))
	for i, c := range counts {
		if math.Abs(float64(c)-n/k) > 5*sd {
			t.Errorf("shard %d holds %d of %d, want %d ± %.0f", i, c, n, n/k, 5*sd)
		}
	}
	rng := rand.New(rand.NewPCG(3, 4))
	rng.Shuffle(len(list), func(i, j int) { list[i], list[j] = list[j], list[i] })
	for _, s := range list {
		if Shard(s, k) != assign[s] {
			t.Fatalf("%s moved", s)
		}
	}
	if Shard("anything", 1) != 0 || Shard("anything", 0) != 0 {
		t.Error("one shard must be shard 0")
	}
}
