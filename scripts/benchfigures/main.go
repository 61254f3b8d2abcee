// Command benchfigures redraws the figures of a bench run from its
// results.json with the current plotting code, without running the suite
// again (a --full run takes about 12 minutes of two cores).
//
//	go run ./scripts/benchfigures [-o DIR] RESULTS.json [FIGURE[=NAME]]...
//
// With no FIGURE it redraws every figure the results support under its own
// name. FIGURE=NAME writes figure FIGURE (a file name as the bench writes
// it) as DIR/NAME. The README's figures come from the --full run:
//
//	go run ./cmd/tracesift bench --full --seed 1 -o bench-full
//	go run ./scripts/benchfigures -o docs bench-full/results.json \
//	    reliability.png=bench-reliability.png accuracy_snr.png=bench-accuracy-snr.png
package main

import (
	"flag"
	"fmt"
	"os"
	"strings"

	"github.com/tracesift/tracesift/benchmarks"
)

func main() {
	dir := flag.String("o", ".", "output `directory`")
	flag.Usage = func() {
		fmt.Fprintln(os.Stderr, "usage: benchfigures [-o DIR] RESULTS.json [FIGURE[=NAME]]...")
		flag.PrintDefaults()
	}
	flag.Parse()
	if flag.NArg() < 1 {
		flag.Usage()
		os.Exit(2)
	}
	var names []string
	rename := map[string]string{}
	for _, a := range flag.Args()[1:] {
		from, to, ok := strings.Cut(a, "=")
		names = append(names, from)
		if ok {
			rename[from] = to
		}
	}
	written, err := benchmarks.RedrawFigures(flag.Arg(0), *dir, names, rename)
	for _, p := range written {
		fmt.Println(p)
	}
	if err != nil {
		fmt.Fprintln(os.Stderr, "benchfigures:", err)
		os.Exit(1)
	}
}
