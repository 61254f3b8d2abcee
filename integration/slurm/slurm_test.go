// Package slurm_test runs the documented Slurm job-array example
// (examples/slurm/features-array.sh) on a real cluster: the one-node
// cluster of scripts/slurm-local.sh, which .ci/run starts, or any cluster
// sbatch reaches. It is a package of its own so that the job array, which
// takes minutes, has its own test timeout and runs beside the other
// packages; it builds the tracesift binary and drives it as a user would.
package slurm_test

import (
	"bytes"
	"fmt"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/tracesift/tracesift/generators"
)

// requireSlurmEnv set to 1 makes a missing Slurm cluster a test failure
// instead of a skip; .ci/run sets it and starts the one-node cluster.
const requireSlurmEnv = "TRACESIFT_REQUIRE_SLURM"

// slurmAvailable says why Slurm cannot be used here ("" when it can):
// sbatch must be installed and sinfo must see a node that takes jobs.
func slurmAvailable() string {
	for _, b := range []string{"sbatch", "squeue", "scancel", "sinfo"} {
		if _, err := exec.LookPath(b); err != nil {
			return b + " is not installed"
		}
	}
	out, err := exec.Command("sinfo", "-h", "-o", "%t").CombinedOutput()
	if err != nil {
		return fmt.Sprintf("sinfo failed (%v): %s", err, bytes.TrimSpace(out))
	}
	for _, st := range strings.Fields(string(out)) {
		switch strings.TrimRight(st, "*~#!%$@^-") {
		case "idle", "mix", "alloc":
			return ""
		}
	}
	return fmt.Sprintf("no node takes jobs (sinfo states %q)", strings.TrimSpace(string(out)))
}

// command runs a program and returns its trimmed output.
func command(t *testing.T, dir, name string, args ...string) string {
	t.Helper()
	c := exec.Command(name, args...)
	c.Dir = dir
	out, err := c.CombinedOutput()
	if err != nil {
		t.Fatalf("%s %s: %v: %s", name, strings.Join(args, " "), err, out)
	}
	return strings.TrimSpace(string(out))
}

// waitJob waits until squeue no longer lists the job (or array task).
func waitJob(t *testing.T, job string, logs func() string) {
	t.Helper()
	deadline := time.Now().Add(10 * time.Minute)
	for {
		out, err := exec.Command("squeue", "-h", "-j", job, "-o", "%i %t").CombinedOutput()
		if err == nil && len(bytes.TrimSpace(out)) == 0 {
			return
		}
		if time.Now().After(deadline) {
			exec.Command("scancel", job).Run()
			t.Fatalf("job %s still queued after 10 minutes: %s\n%s", job, out, logs())
		}
		time.Sleep(200 * time.Millisecond)
	}
}

// writeTrace writes n samples of a reference system as a t,value CSV.
func writeTrace(t *testing.T, path, system string, n int, seed uint64) {
	t.Helper()
	s, err := generators.Lookup(system)
	if err != nil {
		t.Fatal(err)
	}
	x, err := s.Generate(n, nil, rand.New(rand.NewPCG(seed, 1)))
	if err != nil {
		t.Fatal(err)
	}
	b := []byte("t,value\n")
	for i, v := range x {
		b = strconv.AppendInt(b, int64(i), 10)
		b = append(b, ',')
		b = strconv.AppendFloat(b, v, 'g', -1, 64)
		b = append(b, '\n')
	}
	if err := os.WriteFile(path, b, 0o644); err != nil {
		t.Fatal(err)
	}
}

// TestJobArray: 400 generated traces of 2000 samples through the example
// script as an array of 4 tasks (the shard from SLURM_ARRAY_TASK_ID and
// SLURM_ARRAY_TASK_COUNT), the shards' journals collated and compared byte
// for byte with one process; then the array again with one task's results
// removed, that task cancelled with scancel part way through, submitted
// alone with --resume (--shards 4), and the comparison repeated.
func TestJobArray(t *testing.T) {
	if why := slurmAvailable(); why != "" {
		if os.Getenv(requireSlurmEnv) == "1" {
			t.Fatalf("Slurm is required here (%s=1) but not available: %s", requireSlurmEnv, why)
		}
		t.Skipf("Slurm is not available: %s. To run this test: scripts/slurm-local.sh install && scripts/slurm-local.sh start /tmp/slurm && export SLURM_CONF=/tmp/slurm/slurm.conf (as root; CI does this)", why)
	}
	if testing.Short() && os.Getenv(requireSlurmEnv) != "1" {
		t.Skip("the job-array test takes minutes")
	}
	root, err := filepath.Abs(filepath.Join("..", ".."))
	if err != nil {
		t.Fatal(err)
	}
	script := filepath.Join(root, "examples", "slurm", "features-array.sh")
	dir := t.TempDir() // where the tasks run: traces.txt, out/
	bin := filepath.Join(dir, "tracesift")
	command(t, root, filepath.Join(runtime.GOROOT(), "bin", "go"), "build", "-o", bin, "./cmd/tracesift")
	os.Mkdir(filepath.Join(dir, "out"), 0o755)

	systems := []string{"white", "ar1", "henon", "sine", "logistic"}
	var list strings.Builder
	for i := range 400 {
		sub := filepath.Join(dir, "archive", fmt.Sprintf("dev%02d", i%20))
		os.MkdirAll(sub, 0o755)
		p := filepath.Join(sub, fmt.Sprintf("trace%03d.csv", i))
		writeTrace(t, p, systems[i%len(systems)], 2000, uint64(i+1))
		fmt.Fprintln(&list, p)
	}
	if err := os.WriteFile(filepath.Join(dir, "traces.txt"), []byte(list.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	ref := filepath.Join(dir, "single.csv")
	command(t, dir, bin, "features", "--quiet", "--files-from", "traces.txt", "--format", "csv", "--no-journal", "-o", ref)
	want, err := os.ReadFile(ref)
	if err != nil {
		t.Fatal(err)
	}

	out := func(k int) string { return filepath.Join(dir, "out", fmt.Sprintf("features.%d.csv", k)) }
	logs := func() string {
		var b strings.Builder
		files, _ := filepath.Glob(filepath.Join(dir, "out", "slurm-*.log"))
		for _, f := range files {
			c, _ := os.ReadFile(f)
			fmt.Fprintf(&b, "== %s\n%s", filepath.Base(f), c)
		}
		return b.String()
	}
	submit := func(array string, args ...string) string {
		t.Helper()
		sb := append([]string{"--parsable", "--array=" + array, "--chdir=" + dir, "--output=" + filepath.Join(dir, "out", "slurm-%A_%a.log"),
			"--cpus-per-task=1", "--mem=500M", "--export=ALL,TRACESIFT=" + bin, script}, args...)
		job := command(t, dir, "sbatch", sb...)
		return strings.SplitN(job, ";", 2)[0] // "jobid[;cluster]"
	}
	collate := func(what string) {
		t.Helper()
		merged := filepath.Join(dir, "merged.csv")
		c := exec.Command(bin, "collate", "-o", merged, out(0), out(1), out(2), out(3))
		if b, err := c.CombinedOutput(); err != nil {
			t.Fatalf("%s: collate: %v: %s\n%s", what, err, b, logs())
		}
		got, err := os.ReadFile(merged)
		if err != nil || !bytes.Equal(got, want) {
			t.Fatalf("%s: the collated shards differ from the single-process run (%v)\n%s", what, err, logs())
		}
	}

	// 1. The array of 4 tasks, shards from SLURM_ARRAY_TASK_ID/COUNT.
	job := submit("0-3")
	waitJob(t, job, logs)
	for k := range 4 {
		if _, err := os.Stat(out(k)); err != nil {
			t.Fatalf("task %d wrote no output\n%s", k, logs())
		}
	}
	if l := logs(); !strings.Contains(l, "shard 2/4 (SLURM_ARRAY_TASK_ID and SLURM_ARRAY_TASK_COUNT)") {
		t.Errorf("the task logs do not show the shard taken from the array:\n%s", l)
	}
	collate("array of 4")

	// 2. Task 2 again from nothing (the others resume and skip all),
	// cancelled once its journal holds some records, then submitted alone.
	os.Remove(out(2))
	os.Remove(out(2) + ".journal")
	job = submit("0-3")
	deadline := time.Now().Add(5 * time.Minute)
	for {
		b, _ := os.ReadFile(out(2) + ".journal")
		if bytes.Count(b, []byte(`{"file":`)) >= 5 {
			break
		}
		if time.Now().After(deadline) {
			t.Fatalf("task 2 wrote no records in 5 minutes\n%s", logs())
		}
		time.Sleep(20 * time.Millisecond)
	}
	command(t, dir, "scancel", job+"_2")
	waitJob(t, job, logs)
	b, err := os.ReadFile(out(2) + ".journal")
	if err != nil {
		t.Fatal(err)
	}
	if bytes.Contains(b, []byte(`{"end":`)) {
		t.Fatalf("task 2 finished before scancel reached it; the batch is too short for this machine\n%s", logs())
	}
	if _, err := os.Stat(out(2)); err == nil {
		t.Fatal("the cancelled task left an output file")
	}
	done := bytes.Count(b, []byte(`{"file":`))
	job = submit("2", "--shards", "4")
	waitJob(t, job, logs)
	l := logs()
	if !strings.Contains(l, "shard 2/4 (SLURM_ARRAY_TASK_ID and --shards)") || !strings.Contains(l, fmt.Sprintf(".journal: %d of ", done)) {
		t.Errorf("the resubmitted task's log does not show it resuming shard 2/4 with %d traces done:\n%s", done, l)
	}
	collate("after scancel and --resume")
}
