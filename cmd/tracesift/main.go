// Command tracesift tells whether a measured fluctuation trace carries
// low-dimensional deterministic (chaotic) dynamics, is noise, or is regular,
// and proves the method on reference systems with published invariants.
//
// Run `tracesift --help` for the list of commands.
package main

import "os"

func main() {
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}
