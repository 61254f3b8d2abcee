package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/tracesift/tracesift/internal/journal"
)

// archive writes n short traces (alternately white noise, AR(1) and the
// Hénon map, 600 samples, seeds 1..n) under dir/archive, spread over two
// subdirectories, and returns their paths sorted.
func archive(t *testing.T, dir string, n int) []string {
	t.Helper()
	systems := []string{"white", "ar1", "henon"}
	var paths []string
	for i := range n {
		sub := filepath.Join(dir, "archive", fmt.Sprintf("dev%d", i%2))
		os.MkdirAll(sub, 0o755)
		paths = append(paths, writeSeries(t, sub, fmt.Sprintf("t%02d.csv", i), systems[i%3], "--n", "600", "--seed", fmt.Sprint(i+1)))
	}
	slices.Sort(paths)
	return paths
}

// writeList writes the paths one per line.
func writeList(t *testing.T, path string, paths []string) string {
	t.Helper()
	if err := os.WriteFile(path, []byte(strings.Join(paths, "\n")+"\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

func readFile(t *testing.T, p string) []byte {
	t.Helper()
	b, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// csvFiles returns the file column of a features CSV.
func csvFiles(out string) []string {
	var files []string
	for i, l := range strings.Split(strings.TrimSpace(out), "\n") {
		if i > 0 {
			files = append(files, strings.SplitN(l, ",", 2)[0])
		}
	}
	return files
}

// Inputs at archive scale: a directory walked recursively (with and
// without --include), a file list with duplicates, comments and a missing
// file, a list on stdin, and a campaign description, together: the batch
// is sorted, holds each file once, and reports the missing file once (one
// record in the journal, one line on stderr); exit status 1.
func TestBatchSources(t *testing.T) {
	dir := t.TempDir()
	paths := archive(t, dir, 5)
	root := filepath.Join(dir, "archive")
	fixture(t, root, "README.md", []byte("# notes\n"))
	os.Mkdir(filepath.Join(root, ".cache"), 0o755)
	fixture(t, filepath.Join(root, ".cache"), "x.csv", []byte("junk\n"))
	gz := writeSeries(t, root, "extra.csv.gz", "white", "--n", "600", "--seed", "9")

	out, stderr, code := runCLI(t, "", "features", "--format", "csv", root)
	want := append(slices.Clone(paths), gz)
	slices.Sort(want)
	if got := csvFiles(out); code != exitOK || !slices.Equal(got, want) {
		t.Fatalf("directory: exit %d, files %q, want %q: %s", code, got, want, stderr)
	}
	out, _, _ = runCLI(t, "", "features", "--format", "csv", "--include", "*.gz", root)
	if got := csvFiles(out); !slices.Equal(got, []string{gz}) {
		t.Errorf("--include '*.gz': %q", got)
	}

	missing := filepath.Join(dir, "gone.csv")
	list := fixture(t, dir, "list.txt", []byte("# the archive\n"+paths[3]+"\n"+missing+"\n\n"+paths[1]+"\n"+missing+"\n"+
		filepath.Join(filepath.Dir(paths[1]), ".", filepath.Base(paths[1]))+"\n"))
	camp := fixture(t, dir, "campaign.csv", []byte("file,group\n"+strings.TrimPrefix(paths[0], dir+"/")+",a\n"+strings.TrimPrefix(paths[3], dir+"/")+",b\n"))
	o := filepath.Join(dir, "f.csv")
	_, stderr, code = runCLI(t, paths[4]+"\n"+paths[2]+"\n", "features", "--format", "csv", "-o", o,
		"--files-from", list, "--files-from", "-", "--campaign", camp, paths[1])
	if code != exitPartial {
		t.Fatalf("exit %d, want %d: %s", code, exitPartial, stderr)
	}
	if got := csvFiles(string(readFile(t, o))); !slices.Equal(got, paths) {
		t.Errorf("files %q, want %q", got, paths)
	}
	lines := strings.Split(strings.TrimSpace(stderr), "\n")
	if len(lines) != 3 || !strings.Contains(lines[0], missing) || !strings.Contains(lines[0], "no such file") ||
		!strings.Contains(lines[1], "1 of 6 inputs failed") || !strings.Contains(lines[2], "wrote the results of 5 of 6 inputs") {
		t.Errorf("stderr %q", stderr)
	}
	ix, err := journal.Open(o + ".journal")
	if err != nil {
		t.Fatal(err)
	}
	defer ix.Close()
	en, ok := ix.Lookup(missing)
	if !ok || en.Failure == nil || !strings.Contains(en.Failure.Reason, "no such file") || ix.Len() != 6 || !ix.Ended {
		t.Errorf("journal: record of the missing file %+v, %d records, ended %v", en, ix.Len(), ix.Ended)
	}
}

// journalLines splits a journal into its lines, newline included.
func journalLines(b []byte) []string { return strings.SplitAfter(string(b), "\n") }

var resumedRe = regexp.MustCompile(`(\d+) of (\d+) traces already done, (\d+) to go`)

// resumed parses the resume note: traces already done and to go.
func resumed(t *testing.T, stderr string) (done, togo int) {
	t.Helper()
	m := resumedRe.FindStringSubmatch(stderr)
	if m == nil {
		t.Fatalf("no resume note in %q", stderr)
	}
	fmt.Sscan(m[1], &done)
	fmt.Sscan(m[3], &togo)
	return done, togo
}

// A run killed at any point — between any two journal lines, or in the
// middle of one — and resumed writes exactly the output of an uninterrupted
// run, computing only the traces the journal lacks. The kill is simulated
// by cutting the complete journal (what a killed run leaves is a prefix of
// it: lines are appended whole, in the order the traces finish); a bad
// file's failure is tried again.
func TestResumeAfterKillAtAnyPoint(t *testing.T) {
	dir := t.TempDir()
	paths := archive(t, dir, 4)
	bad := fixture(t, filepath.Join(dir, "archive"), "bad.csv", []byte("t,value\n0,1\n1,abc\n"))
	list := writeList(t, filepath.Join(dir, "list.txt"), append(slices.Clone(paths), bad))
	for _, c := range []struct {
		name string
		args []string
	}{
		{"features csv", []string{"features", "--format", "csv", "--all"}},
		{"classify table", []string{"classify"}},
	} {
		ref := filepath.Join(dir, "ref.out")
		args := append(slices.Clone(c.args), "--files-from", list)
		if _, stderr, code := runCLI(t, "", append(args, "-o", ref)...); code != exitPartial {
			t.Fatalf("%s: exit %d: %s", c.name, code, stderr)
		}
		want := readFile(t, ref)
		full := readFile(t, ref+".journal")
		lines := journalLines(full)
		// Records of good traces, and the byte offsets to cut at: every
		// line boundary and the middle of every line.
		var cuts []int
		off := 0
		for _, l := range lines {
			cuts = append(cuts, off, off+len(l)/2)
			off += len(l)
		}
		cuts = append(cuts, len(full))
		for _, cut := range cuts {
			prefix := full[:cut]
			good := 0
			for _, l := range journalLines(prefix) {
				if strings.HasSuffix(l, "\n") && strings.HasPrefix(l, `{"file":`) && !strings.Contains(l, `"failure":`) {
					good++
				}
			}
			out := filepath.Join(dir, fmt.Sprintf("cut%d.out", cut))
			if err := os.WriteFile(out+".journal", prefix, 0o644); err != nil {
				t.Fatal(err)
			}
			_, stderr, code := runCLI(t, "", append(args, "--resume", "-o", out)...)
			if code != exitPartial {
				t.Fatalf("%s, cut at byte %d: exit %d: %s", c.name, cut, code, stderr)
			}
			if got := readFile(t, out); !bytes.Equal(got, want) {
				t.Errorf("%s, cut at byte %d: resumed output differs from the uninterrupted run", c.name, cut)
			}
			if cut >= len(lines[0]) { // a header was there: the note counts what it held
				if done, togo := resumed(t, stderr); done != good || done+togo != 5 {
					t.Errorf("%s, cut at byte %d: %d done and %d to go, want %d done of 5", c.name, cut, done, togo, good)
				}
			}
		}
	}
}

// --resume recomputes what is not up to date: a trace whose file changed,
// everything when an option, the model or the command differs.
func TestResumeRecomputesWhatChanged(t *testing.T) {
	dir := t.TempDir()
	paths := archive(t, dir, 3)
	out := filepath.Join(dir, "f.csv")
	base := []string{"features", "--format", "csv", "--resume", "-o", out}
	// --resume without a journal yet starts afresh, silently.
	if _, stderr, code := runCLI(t, "", append(base, paths...)...); code != exitOK || stderr != "" {
		t.Fatalf("first run: exit %d: %q", code, stderr)
	}
	_, stderr, _ := runCLI(t, "", append(base, paths...)...)
	if done, togo := resumed(t, stderr); done != 3 || togo != 0 {
		t.Errorf("unchanged: %d done, %d to go", done, togo)
	}
	// A changed file (another seed) is measured again, the others kept;
	// the output is that of a fresh run.
	writeSeries(t, filepath.Dir(paths[1]), filepath.Base(paths[1]), "white", "--n", "600", "--seed", "77")
	_, stderr, _ = runCLI(t, "", append(base, paths...)...)
	if done, togo := resumed(t, stderr); done != 2 || togo != 1 {
		t.Errorf("one file changed: %d done, %d to go", done, togo)
	}
	fresh := filepath.Join(dir, "fresh.csv")
	runCLI(t, "", append([]string{"features", "--format", "csv", "-o", fresh}, paths...)...)
	if !bytes.Equal(readFile(t, out), readFile(t, fresh)) {
		t.Error("resumed output after a change differs from a fresh run")
	}
	// Another seed: nothing is up to date. The output format is not an
	// option of the records: changing it recomputes nothing.
	_, stderr, _ = runCLI(t, "", append(append(base, "--seed", "2"), paths...)...)
	if done, _ := resumed(t, stderr); done != 0 {
		t.Errorf("--seed 2: %d done", done)
	}
	_, stderr, _ = runCLI(t, "", append(append(base, "--seed", "2", "--format", "json"), paths...)...)
	if done, _ := resumed(t, stderr); done != 3 {
		t.Errorf("--format json after csv: %d done, want 3", done)
	}
	// classify: another model file.
	vout := filepath.Join(dir, "v.txt")
	vbase := []string{"classify", "--resume", "-o", vout}
	runCLI(t, "", append(vbase, paths...)...)
	_, stderr, _ = runCLI(t, "", append(append(vbase, "--model", reportModel(t)), paths...)...)
	if done, _ := resumed(t, stderr); done != 0 {
		t.Errorf("another model: %d done", done)
	}
	// A journal of another command is refused.
	_, stderr, code := runCLI(t, "", append([]string{"classify", "--resume", "--journal", out + ".journal"}, paths...)...)
	if code != exitUsage || !strings.Contains(stderr, "holds a features run, not classify") {
		t.Errorf("another command's journal: exit %d, %q", code, stderr)
	}
}

// Shards partition the batch by path, whatever the order of the list each
// shard is given; collate joins their journals into exactly the unsharded
// output (features CSV and table, classify table), and reports a missing
// shard, a duplicated journal, an unfinished run, and refuses journals of
// other options.
func TestShardsCollateToTheUnshardedOutput(t *testing.T) {
	dir := t.TempDir()
	paths := archive(t, dir, 7)
	for _, c := range []struct {
		name string
		args []string
	}{
		{"features csv", []string{"features", "--format", "csv"}},
		{"features table", []string{"features"}},
		{"classify table", []string{"classify"}},
	} {
		ref := filepath.Join(dir, "ref.out")
		if _, stderr, code := runCLI(t, "", append(append(slices.Clone(c.args), "-o", ref), paths...)...); code != exitOK {
			t.Fatalf("%s: exit %d: %s", c.name, code, stderr)
		}
		want := readFile(t, ref)
		const n = 3
		var journals []string
		seen := map[string]int{}
		for k := range n {
			order := slices.Clone(paths)
			rand.New(rand.NewPCG(uint64(k), 1)).Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
			list := writeList(t, filepath.Join(dir, fmt.Sprintf("list%d.txt", k)), order)
			out := filepath.Join(dir, fmt.Sprintf("part%d.out", k))
			_, stderr, code := runCLI(t, "", append(slices.Clone(c.args), "--files-from", list, "--shard", fmt.Sprintf("%d/%d", k, n), "-o", out)...)
			if code != exitOK || !strings.Contains(stderr, fmt.Sprintf("shard %d/%d (--shard): ", k, n)) {
				t.Fatalf("%s shard %d: exit %d: %s", c.name, k, code, stderr)
			}
			ix, err := journal.Open(out + ".journal")
			if err != nil {
				t.Fatal(err)
			}
			for _, name := range ix.Last.Inputs {
				seen[name]++
			}
			ix.Close()
			journals = append(journals, out+".journal")
		}
		for _, p := range paths {
			if seen[p] != 1 {
				t.Errorf("%s: %s in %d shards", c.name, p, seen[p])
			}
		}
		merged := filepath.Join(dir, "merged.out")
		if _, stderr, code := runCLI(t, "", append([]string{"collate", "-o", merged}, journals...)...); code != exitOK {
			t.Fatalf("%s: collate: exit %d: %s", c.name, code, stderr)
		}
		if !bytes.Equal(readFile(t, merged), want) {
			t.Errorf("%s: collated shards differ from the unsharded run", c.name)
		}
	}

	// Reports, on the classify shards still in place; the scenarios use
	// the shard holding most traces (at least 3 of 7), b, and the two
	// others, a and c (either may be empty: shards go by hash).
	j := func(k int) string { return filepath.Join(dir, fmt.Sprintf("part%d.out.journal", k)) }
	sizes := make([]int, 3)
	for k := range sizes {
		ix, err := journal.Open(j(k))
		if err != nil {
			t.Fatal(err)
		}
		sizes[k] = len(ix.Last.Inputs)
		ix.Close()
	}
	b := slices.Index(sizes, slices.Max(sizes))
	a, c := (b+1)%3, (b+2)%3
	_, stderr, code := runCLI(t, "", "collate", "-o", filepath.Join(dir, "m1"), j(a), j(c))
	if code != exitPartial || !strings.Contains(stderr, fmt.Sprintf("shard %d/3: no journal given", b)) {
		t.Errorf("missing shard: exit %d, %q", code, stderr)
	}
	dup := filepath.Join(dir, "copy.journal")
	os.WriteFile(dup, readFile(t, j(b)), 0o644)
	_, stderr, code = runCLI(t, "", "collate", "-o", filepath.Join(dir, "m2"), j(a), j(b), j(c), dup)
	if code != exitPartial || strings.Count(stderr, ": duplicated: listed by "+j(b)+", "+dup) != sizes[b] {
		t.Errorf("duplicated journal: exit %d, %q", code, stderr)
	}
	// A run killed after its header and one record.
	lines := journalLines(readFile(t, j(b)))
	cut := filepath.Join(dir, "cut.journal")
	os.WriteFile(cut, []byte(lines[0]+lines[1]), 0o644)
	_, stderr, code = runCLI(t, "", "collate", "-o", filepath.Join(dir, "m3"), j(a), cut, j(c))
	nMissing := strings.Count(stderr, ": missing: no record in "+cut)
	if code != exitPartial || !strings.Contains(stderr, "journal "+cut+": its last run did not finish") || nMissing != sizes[b]-1 {
		t.Errorf("unfinished shard: exit %d, %d missing of %d: %q", code, nMissing, sizes[b], stderr)
	}
	// Another seed is another batch.
	other := filepath.Join(dir, "seed2.out")
	runCLI(t, "", append([]string{"classify", "--seed", "2", "--shard", fmt.Sprintf("%d/3", b), "-o", other}, paths...)...)
	_, stderr, code = runCLI(t, "", "collate", j(a), other+".journal", j(c))
	if code != exitPartial || !strings.Contains(stderr, "was made with other options") {
		t.Errorf("other options: exit %d, %q", code, stderr)
	}
	// An output file stands for the journal beside it.
	if _, stderr, code := runCLI(t, "", "collate", "-o", filepath.Join(dir, "m4"), filepath.Join(dir, "part0.out"), filepath.Join(dir, "part1.out"), filepath.Join(dir, "part2.out")); code != exitOK {
		t.Errorf("outputs for journals: exit %d, %q", code, stderr)
	}
}

// The shard comes from the scheduler when --shard is not given: Slurm's
// array task index and count, or a Kubernetes indexed Job's completion
// index with --shards; a task index outside the count, an index without a
// count and a count without an index are usage errors; --shard 0/1 takes
// everything inside an array.
func TestShardFromEnvironment(t *testing.T) {
	dir := t.TempDir()
	paths := archive(t, dir, 5)
	args := append([]string{"features", "--format", "csv"}, paths...)
	byFlag := func(s string) string {
		out, stderr, code := runCLI(t, "", append(slices.Clone(args), "--shard", s)...)
		if code != exitOK {
			t.Fatalf("--shard %s: exit %d: %s", s, code, stderr)
		}
		return out
	}
	for _, c := range []struct {
		vars  map[string]string
		extra []string
		shard string
		from  string
	}{
		{map[string]string{"SLURM_ARRAY_TASK_ID": "1", "SLURM_ARRAY_TASK_COUNT": "3"}, nil, "1/3", "SLURM_ARRAY_TASK_ID and SLURM_ARRAY_TASK_COUNT"},
		{map[string]string{"SLURM_ARRAY_TASK_ID": "2", "SLURM_ARRAY_TASK_COUNT": "1"}, []string{"--shards", "3"}, "2/3", "SLURM_ARRAY_TASK_ID and --shards"},
		{map[string]string{"JOB_COMPLETION_INDEX": "0"}, []string{"--shards", "2"}, "0/2", "JOB_COMPLETION_INDEX and --shards"},
	} {
		out, stderr, code := runCLIEnv(t, c.vars, "", append(slices.Clone(args), c.extra...)...)
		if code != exitOK || out != byFlag(c.shard) || !strings.Contains(stderr, "shard "+c.shard+" ("+c.from+")") {
			t.Errorf("%v %v: exit %d, stderr %q; want the output of --shard %s", c.vars, c.extra, code, stderr, c.shard)
		}
	}
	all, _, _ := runCLI(t, "", args...)
	slurm := map[string]string{"SLURM_ARRAY_TASK_ID": "1", "SLURM_ARRAY_TASK_COUNT": "3"}
	if out, _, _ := runCLIEnv(t, slurm, "", append(slices.Clone(args), "--shard", "0/1")...); out != all {
		t.Error("--shard 0/1 inside an array does not take everything")
	}
	for _, c := range []struct {
		vars  map[string]string
		extra []string
		want  string
	}{
		{map[string]string{"SLURM_ARRAY_TASK_ID": "3", "SLURM_ARRAY_TASK_COUNT": "3"}, nil, "SLURM_ARRAY_TASK_ID=3 is not below the shard count 3: number the array tasks from 0 (sbatch --array=0-2)"},
		{map[string]string{"SLURM_ARRAY_TASK_ID": "x"}, nil, `SLURM_ARRAY_TASK_ID="x" is not a task index`},
		{map[string]string{"SLURM_ARRAY_TASK_ID": "0"}, nil, "SLURM_ARRAY_TASK_COUNT=\"\" is not a count"},
		{map[string]string{"JOB_COMPLETION_INDEX": "1"}, nil, "give --shards N"},
		{nil, []string{"--shards", "4"}, "neither is set"},
		{nil, []string{"--shard", "4/4"}, "want K/N with 0 ≤ K < N"},
		{nil, []string{"--shard", "1/4", "--shards", "3"}, "disagree"},
	} {
		_, stderr, code := runCLIEnv(t, c.vars, "", append(slices.Clone(args), c.extra...)...)
		if code != exitUsage || !strings.Contains(stderr, c.want) || strings.Count(stderr, "\n") != 1 {
			t.Errorf("%v %v: exit %d, stderr %q, want %q", c.vars, c.extra, code, stderr, c.want)
		}
	}
}

// Progress: off a terminal, a plain line at most every interval (here
// every trace) with the count, the rate and the time left, and a last line;
// on a terminal a bar with the rate and the time left; nothing with
// --quiet. The same for the journalled path (-o) and the streaming one.
func TestBatchProgressLines(t *testing.T) {
	dir := t.TempDir()
	paths := archive(t, dir, 3)
	for _, out := range []string{"-", filepath.Join(dir, "f.csv")} {
		args := append([]string{"features", "--format", "csv", "-o", out}, paths...)
		var so, se bytes.Buffer
		code := runEnv(&env{stdin: strings.NewReader(""), stdout: &so, stderr: &se, plainEvery: time.Nanosecond}, args)
		lines := strings.Split(strings.TrimSpace(se.String()), "\n")
		if code != exitOK || len(lines) != 3 {
			t.Fatalf("-o %s: exit %d, stderr %q", out, code, se.String())
		}
		for i, l := range lines[:2] {
			if !strings.HasPrefix(l, fmt.Sprintf("tracesift: traces: %d of 3 done (%d%%), ", i+1, []int{33, 67}[i])) ||
				!strings.Contains(l, " traces per second, about ") || !strings.HasSuffix(l, " left") {
				t.Errorf("-o %s: progress line %q", out, l)
			}
		}
		if !strings.HasPrefix(lines[2], "tracesift: traces: 3 of 3 done in ") {
			t.Errorf("-o %s: last line %q", out, lines[2])
		}
		se.Reset()
		runEnv(&env{stdin: strings.NewReader(""), stdout: &so, stderr: &se, plainEvery: time.Nanosecond}, append([]string{"--quiet"}, args...))
		if se.Len() != 0 {
			t.Errorf("-o %s --quiet: stderr %q", out, se.String())
		}
		se.Reset()
		runEnv(&env{stdin: strings.NewReader(""), stdout: &so, stderr: &se, terminal: true}, args)
		if !regexp.MustCompile(`traces +\d+% .*\(\d/3, \d+ traces/(s|min|hr)\) \[\d+s:\d+s\]`).MatchString(se.String()) {
			t.Errorf("-o %s on a terminal: %q", out, se.String())
		}
	}
}

// A run killed for real (SIGKILL, as a scheduler ends a job past its time)
// leaves no output file, a journal of whole lines without an end line, and
// resumes to the uninterrupted output.
func TestKilledRunResumes(t *testing.T) {
	if testing.Short() {
		t.Skip("runs a batch of 40 traces three times")
	}
	dir := t.TempDir()
	var paths []string
	for i := range 40 {
		paths = append(paths, writeSeries(t, dir, fmt.Sprintf("t%02d.csv", i), "ar1", "--n", "6000", "--seed", fmt.Sprint(i+1)))
	}
	list := writeList(t, filepath.Join(dir, "list.txt"), paths)
	ref := filepath.Join(dir, "ref.jsonl")
	args := []string{"features", "--format", "json", "--files-from", list}
	if _, stderr, code := runCLI(t, "", append(args, "-o", ref)...); code != exitOK {
		t.Fatalf("reference: exit %d: %s", code, stderr)
	}
	out := filepath.Join(dir, "out.jsonl")
	cmd := exec.Command(os.Args[0], append(args, "-o", out)...)
	cmd.Env = append(os.Environ(), asMain+"=1")
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	deadline := time.Now().Add(2 * time.Minute)
	for {
		b, _ := os.ReadFile(out + ".journal")
		if bytes.Count(b, []byte(`{"file":`)) >= 3 {
			break
		}
		if time.Now().After(deadline) {
			cmd.Process.Kill()
			t.Fatal("no records after 2 minutes")
		}
		time.Sleep(5 * time.Millisecond)
	}
	cmd.Process.Signal(syscall.SIGKILL)
	cmd.Wait()
	if _, err := os.Stat(out); err == nil {
		t.Fatal("the killed run left an output file")
	}
	b := readFile(t, out+".journal")
	if bytes.Contains(b, []byte(`{"end":`)) {
		t.Fatal("the run finished before it was killed; make the batch longer")
	}
	sc := bufio.NewScanner(bytes.NewReader(b))
	sc.Buffer(nil, 1<<20)
	for sc.Scan() {
		var v map[string]any
		if err := json.Unmarshal(sc.Bytes(), &v); err != nil {
			t.Fatalf("the killed run left a broken line: %v", err)
		}
	}
	_, stderr, code := runCLI(t, "", append(args, "--resume", "-o", out)...)
	if code != exitOK {
		t.Fatalf("resume: exit %d: %s", code, stderr)
	}
	if done, _ := resumed(t, stderr); done < 3 {
		t.Errorf("resumed with %d traces done, want at least the 3 seen", done)
	}
	if !bytes.Equal(readFile(t, out), readFile(t, ref)) {
		t.Error("killed and resumed output differs from the uninterrupted run")
	}
}

// compare takes the same sources per group: a directory walked
// recursively and filtered by --include, and @LIST.
func TestCompareGroupSources(t *testing.T) {
	dir := t.TempDir()
	a := filepath.Join(dir, "a")
	os.MkdirAll(filepath.Join(a, "sub", "deeper"), 0o755)
	for i, p := range []string{"w1.csv", filepath.Join("sub", "w2.csv"), filepath.Join("sub", "deeper", "w3.csv")} {
		writeSeries(t, a, p, "white", "--n", "600", "--seed", fmt.Sprint(i+1))
	}
	fixture(t, a, "notes.txt", []byte("not a trace\n"))
	var b []string
	for i := range 3 {
		b = append(b, writeSeries(t, dir, fmt.Sprintf("r%d.csv", i), "ar1", "--n", "600", "--seed", fmt.Sprint(i+5)))
	}
	list := writeList(t, filepath.Join(dir, "b.txt"), append(b, b[0]))
	out := filepath.Join(dir, "cmp")
	stdout, stderr, code := runCLI(t, "", "compare", "--group", "a="+a, "--group", "b=@"+list, "--include", "*.csv", "-o", out)
	if code != exitOK || !strings.Contains(stdout, "compared 6 traces in 2 groups") {
		t.Errorf("exit %d, stdout %q, stderr %q", code, stdout, stderr)
	}
	_, stderr, code = runCLI(t, "", "compare", "--group", "a="+a, "--group", "b="+dir+"/none", "--include", "*.csv")
	if code != exitPartial || !strings.Contains(stderr, "none: no such file or directory") {
		t.Errorf("missing group path: exit %d, %q", code, stderr)
	}
}
