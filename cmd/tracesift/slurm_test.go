package main

import (
	"bytes"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// requireSlurmEnv set to 1 makes a missing Slurm cluster a test failure
// instead of a skip; .ci/run sets it after starting the one-node cluster.
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

// slurm runs a Slurm command and returns its trimmed output.
func slurm(t *testing.T, name string, args ...string) string {
	t.Helper()
	out, err := exec.Command(name, args...).CombinedOutput()
	if err != nil {
		t.Fatalf("%s %s: %v: %s", name, strings.Join(args, " "), err, out)
	}
	return strings.TrimSpace(string(out))
}

// waitJob waits until squeue no longer lists the job (or array task).
func waitJob(t *testing.T, job string, logs func() string) {
	t.Helper()
	deadline := time.Now().Add(8 * time.Minute)
	for {
		out, err := exec.Command("squeue", "-h", "-j", job, "-o", "%i %t").CombinedOutput()
		if err == nil && len(bytes.TrimSpace(out)) == 0 {
			return
		}
		if time.Now().After(deadline) {
			exec.Command("scancel", job).Run()
			t.Fatalf("job %s still queued after 8 minutes: %s\n%s", job, out, logs())
		}
		time.Sleep(200 * time.Millisecond)
	}
}

// TestSlurmJobArray runs the documented job-array example
// (examples/slurm/features-array.sh) on a real Slurm cluster: 400 generated
// traces of 2000 samples in an array of 4 tasks, the shards' journals
// collated and compared byte for byte with a single-process run; then the
// array again with one task's results removed, that task cancelled with
// scancel part way through, submitted alone with --resume, and the
// comparison repeated. The cluster is the one-node cluster of
// scripts/slurm-local.sh (started by .ci/run) or any cluster sbatch
// reaches; without one the test is skipped, or fails when
// TRACESIFT_REQUIRE_SLURM=1.
func TestSlurmJobArray(t *testing.T) {
	if why := slurmAvailable(); why != "" {
		if os.Getenv(requireSlurmEnv) == "1" {
			t.Fatalf("Slurm is required here (%s=1) but not available: %s", requireSlurmEnv, why)
		}
		t.Skipf("Slurm is not available: %s. To run this test: scripts/slurm-local.sh install && scripts/slurm-local.sh start /tmp/slurm && export SLURM_CONF=/tmp/slurm/slurm.conf (as root; CI does this)", why)
	}
	if testing.Short() && os.Getenv(requireSlurmEnv) != "1" {
		t.Skip("the job-array test takes about a minute")
	}
	script, err := filepath.Abs(filepath.Join("..", "..", "examples", "slurm", "features-array.sh"))
	if err != nil {
		t.Fatal(err)
	}
	bin, err := filepath.Abs(os.Args[0]) // this test binary runs as tracesift (TestMain)
	if err != nil {
		t.Fatal(err)
	}
	// The job directory is where the tasks run: traces.txt, out/.
	dir := t.TempDir()
	os.Mkdir(filepath.Join(dir, "out"), 0o755)
	systems := []string{"white", "ar1", "henon", "sine", "logistic"}
	var paths []string
	for i := range 400 {
		sub := filepath.Join(dir, "archive", fmt.Sprintf("dev%02d", i%20))
		os.MkdirAll(sub, 0o755)
		paths = append(paths, writeSeries(t, sub, fmt.Sprintf("trace%03d.csv", i), systems[i%len(systems)], "--n", "2000", "--seed", fmt.Sprint(i+1)))
	}
	writeList(t, filepath.Join(dir, "traces.txt"), paths)
	ref := filepath.Join(dir, "single.csv")
	if _, stderr, code := runCLI(t, "", "features", "--files-from", filepath.Join(dir, "traces.txt"), "--format", "csv", "--all", "--no-journal", "-o", ref); code != exitOK {
		t.Fatalf("single-process run: exit %d: %s", code, stderr)
	}
	want := readFile(t, ref)

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
			"--cpus-per-task=1", "--mem=500M", "--export=ALL,TRACESIFT=" + bin + "," + asMain + "=1", script}, args...)
		job := slurm(t, "sbatch", sb...)
		return strings.SplitN(job, ";", 2)[0] // "jobid[;cluster]"
	}
	collate := func(what string) {
		t.Helper()
		merged := filepath.Join(dir, "merged.csv")
		args := []string{"collate", "-o", merged}
		for k := range 4 {
			args = append(args, out(k))
		}
		if _, stderr, code := runCLI(t, "", args...); code != exitOK {
			t.Fatalf("%s: collate: exit %d: %s\n%s", what, code, stderr, logs())
		}
		if !bytes.Equal(readFile(t, merged), want) {
			t.Fatalf("%s: the collated shards differ from the single-process run\n%s", what, logs())
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

	// 2. Task 2 again from nothing (the others resume and skip all), cancelled
	// once its journal holds some records, then submitted alone.
	os.Remove(out(2))
	os.Remove(out(2) + ".journal")
	job = submit("0-3")
	task := job + "_2"
	deadline := time.Now().Add(5 * time.Minute)
	for {
		b, _ := os.ReadFile(out(2) + ".journal")
		if n := bytes.Count(b, []byte(`{"file":`)); n >= 5 {
			break
		}
		if time.Now().After(deadline) {
			t.Fatalf("task 2 wrote no records in 5 minutes\n%s", logs())
		}
		time.Sleep(20 * time.Millisecond)
	}
	slurm(t, "scancel", task)
	waitJob(t, job, logs)
	b := readFile(t, out(2)+".journal")
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
	if !strings.Contains(l, "shard 2/4 (SLURM_ARRAY_TASK_ID and --shards)") || !strings.Contains(l, fmt.Sprintf("%d of ", done)) {
		t.Errorf("the resubmitted task's log does not show it resuming shard 2/4 with %d traces done:\n%s", done, l)
	}
	collate("after scancel and --resume")
}
