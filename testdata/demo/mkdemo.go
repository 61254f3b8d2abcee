//go:build ignore

// Command mkdemo regenerates the SYNTHETIC demo data set of tracesift: the
// 36 trace files of the fictional campaign, labels.csv and README.md, in
// the directory of this script (or the one given with -o). From the
// repository root:
//
//	go run testdata/demo/mkdemo.go
//
// The generation logic lives in github.com/tracesift/tracesift/internal/demo, whose test checks
// that the committed files are exactly what this script produces.
package main

import (
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"runtime"

	"github.com/tracesift/tracesift/internal/demo"
)

func main() {
	dir := flag.String("o", "", "output directory (default: the directory of this script)")
	flag.Parse()
	if *dir == "" {
		*dir = filepath.Join("testdata", "demo")
		if _, file, _, ok := runtime.Caller(0); ok && filepath.IsAbs(file) {
			*dir = filepath.Dir(file)
		}
	}
	if err := demo.Write(*dir); err != nil {
		fmt.Fprintln(os.Stderr, "mkdemo:", err)
		os.Exit(1)
	}
	fmt.Fprintf(os.Stderr, "mkdemo: wrote the synthetic demo data set to %s\n", *dir)
}
