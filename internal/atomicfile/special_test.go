//go:build linux || darwin || freebsd || netbsd || openbsd

package atomicfile

import (
	"io"
	"os"
	"path/filepath"
	"syscall"
	"testing"
)

// A path that is not a regular file — here a named pipe standing in for
// /dev/null or /dev/stdout — is written in place and stays what it was: a
// rename over it would have replaced it with a plain file.
func TestWriteToPipeKeepsIt(t *testing.T) {
	p := filepath.Join(t.TempDir(), "pipe")
	if err := syscall.Mkfifo(p, 0o600); err != nil {
		t.Skip("no named pipes here:", err)
	}
	got := make(chan string)
	go func() {
		f, err := os.Open(p)
		if err != nil {
			got <- "open: " + err.Error()
			return
		}
		b, _ := io.ReadAll(f)
		f.Close()
		got <- string(b)
	}()
	if err := Write(p, func(w io.Writer) error {
		_, err := io.WriteString(w, "through the pipe")
		return err
	}); err != nil {
		t.Fatal(err)
	}
	if s := <-got; s != "through the pipe" {
		t.Errorf("reader got %q", s)
	}
	st, err := os.Lstat(p)
	if err != nil || st.Mode()&os.ModeNamedPipe == 0 {
		t.Errorf("the pipe was replaced: mode %v, %v", st.Mode(), err)
	}
	if !IsSpecial(p) || IsSpecial(filepath.Dir(p)) || IsSpecial(filepath.Join(filepath.Dir(p), "absent")) {
		t.Error("IsSpecial: a pipe is special; a directory and a missing path are not")
	}
	if err := Write(filepath.Dir(p), func(io.Writer) error { return nil }); err == nil {
		t.Error("writing to a directory succeeded")
	}
}
