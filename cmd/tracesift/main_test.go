package main

import (
	"os"
	"testing"
)

// asMain is the environment variable that makes the test binary run as
// tracesift itself, so tests (and the Slurm jobs they submit) can start it
// as a separate process and kill it.
const asMain = "TRACESIFT_TEST_AS_MAIN"

func TestMain(m *testing.M) {
	if os.Getenv(asMain) == "1" {
		os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
	}
	os.Exit(m.Run())
}
