package demo_test

import (
	"fmt"

	"github.com/tracesift/tracesift/internal/demo"
)

// The campaign: which traces hold what, and where their files go.
func ExampleCampaign() {
	count := map[string]int{}
	for _, s := range demo.Campaign() {
		count[string(s.Class)]++
		if s.Oscillation != nil {
			fmt.Printf("%-38s %-9s %s\n", s.Path(), s.Class, s.Oscillation.System)
		}
	}
	fmt.Println(count)
	// Output:
	// stressed/D01_stressed_Vg1.20.csv       chaotic   rossler
	// stressed/D02_stressed_Vg1.20.csv.gz    chaotic   lorenz
	// stressed/D03_stressed_Vg1.20.csv       regular   van-der-pol
	// stressed/D04_stressed_Vg1.20.csv.gz    chaotic   mackey-glass
	// stressed/D05_stressed_Vg1.20.csv       chaotic   chua
	// map[chaotic:4 regular:1 stochastic:31]
}

// Synthesize returns the components of one trace; the oscillation of a
// chaotic trace dominates its variance by the stated SNR.
func ExampleSynthesize() {
	for _, s := range demo.Campaign() {
		if s.Path() != "stressed/D01_stressed_Vg1.20.csv" {
			continue
		}
		c, err := demo.Synthesize(s)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Println(len(c.Current()), s.Class, s.Oscillation.SNRdB, "dB")
	}
	// Output: 4096 chaotic 25 dB
}
