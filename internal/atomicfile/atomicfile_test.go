package atomicfile

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"
)

func TestWriteReplacesOnSuccess(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "out.csv")
	if err := os.WriteFile(p, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := Write(p, func(w io.Writer) error {
		_, err := io.WriteString(w, "new")
		return err
	}); err != nil {
		t.Fatal(err)
	}
	got, _ := os.ReadFile(p)
	if string(got) != "new" {
		t.Fatalf("content %q, want %q", got, "new")
	}
	assertOnlyFile(t, dir, "out.csv")
}

func TestWriteKeepsOldOnFailure(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "out.csv")
	if err := os.WriteFile(p, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	boom := errors.New("boom")
	err := Write(p, func(w io.Writer) error {
		io.WriteString(w, "half")
		return boom
	})
	if !errors.Is(err, boom) {
		t.Fatalf("err = %v, want boom", err)
	}
	got, _ := os.ReadFile(p)
	if string(got) != "old" {
		t.Fatalf("content %q after failure, want the old content", got)
	}
	assertOnlyFile(t, dir, "out.csv")
}

func TestWriteMissingDirectory(t *testing.T) {
	p := filepath.Join(t.TempDir(), "no", "such", "dir", "x")
	if err := Write(p, func(io.Writer) error { return nil }); err == nil {
		t.Fatal("no error for a missing directory")
	}
}

func assertOnlyFile(t *testing.T, dir, name string) {
	t.Helper()
	ents, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	if len(ents) != 1 || ents[0].Name() != name {
		var names []string
		for _, e := range ents {
			names = append(names, e.Name())
		}
		t.Fatalf("directory holds %v, want only %s (no temporary leftovers)", names, name)
	}
}

// A destination in a missing directory is reported with the path the caller
// gave, never with the name of the temporary file.
func TestWriteMissingDirectoryNamesPath(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "nope", "out.csv")
	err := Write(p, func(w io.Writer) error { return nil })
	if err == nil {
		t.Fatal("no error for a missing directory")
	}
	want := "cannot write " + p + ": directory " + filepath.Join(dir, "nope") + " does not exist"
	if err.Error() != want {
		t.Fatalf("error %q, want %q", err, want)
	}
}
