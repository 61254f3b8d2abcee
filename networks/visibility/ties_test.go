package visibility

import (
	"slices"
	"testing"

	"github.com/tracesift/tracesift/networks"
)

// TestTieRules pins the documented tie rules on series small enough to read
// the answer off the definitions: HVG, a < b linked iff every c between is
// strictly lower than both (Luque et al., Phys. Rev. E 80 (2009) 046103);
// NVG, iff every c between lies strictly below the line joining them
// (Lacasa et al., PNAS 105 (2008) 4972). Equal heights and collinear points
// therefore block.
func TestTieRules(t *testing.T) {
	tests := []struct {
		name     string
		x        []float64
		hvg, nvg [][2]int32
	}{
		{
			name: "plateau: each sample sees only its neighbours",
			x:    []float64{1, 1, 1, 1},
			hvg:  [][2]int32{{0, 1}, {1, 2}, {2, 3}},
			nvg:  [][2]int32{{0, 1}, {1, 2}, {2, 3}},
		},
		{
			name: "equal peaks over a lower sample see each other",
			x:    []float64{2, 1, 2},
			hvg:  [][2]int32{{0, 1}, {0, 2}, {1, 2}},
			nvg:  [][2]int32{{0, 1}, {0, 2}, {1, 2}},
		},
		{
			name: "a third equal peak between hides the outer two",
			x:    []float64{2, 1, 2, 1, 2},
			hvg:  [][2]int32{{0, 1}, {0, 2}, {1, 2}, {2, 3}, {2, 4}, {3, 4}},
			nvg:  [][2]int32{{0, 1}, {0, 2}, {1, 2}, {2, 3}, {2, 4}, {3, 4}},
		},
		{
			name: "a sample as high as the lower end blocks the HVG; one on the line blocks the NVG",
			x:    []float64{3, 1, 1, 0, 2},
			// HVG: 0–2 and 1–4 are blocked by a 1 as high as their lower
			// end, 0–3 and 1–3 by samples above their lower end; 0–4 (all
			// between below 2) and 2–4 (0 below 1) are linked.
			hvg: [][2]int32{{0, 1}, {0, 4}, {1, 2}, {2, 3}, {2, 4}, {3, 4}},
			// NVG: 0–3 is blocked by x2 = 1 lying exactly on the line from
			// (0, 3) to (3, 0), 1–3 by x2 = 1 above the line (0.5 there);
			// 0–2 (line 2 at c = 1), 0–4 (2.75, 2.5, 2.25), 1–4 (1.33,
			// 1.67) and 2–4 (1.5) pass strictly above the samples between.
			nvg: [][2]int32{{0, 1}, {0, 2}, {0, 4}, {1, 2}, {1, 4}, {2, 3}, {2, 4}, {3, 4}},
		},
		{
			name: "collinear samples block the NVG",
			x:    []float64{0, 1, 2, 3},
			hvg:  [][2]int32{{0, 1}, {1, 2}, {2, 3}},
			nvg:  [][2]int32{{0, 1}, {1, 2}, {2, 3}},
		},
	}
	for _, tc := range tests {
		for _, k := range []struct {
			kind networks.Kind
			want [][2]int32
		}{{networks.KindHVG, tc.hvg}, {networks.KindNVG, tc.nvg}} {
			g, err := Build(tc.x, k.kind, Options{})
			if err != nil {
				t.Fatal(err)
			}
			var got [][2]int32
			for i := range g.Len() {
				for _, j := range g.Neighbors(i) {
					if int(j) > i {
						got = append(got, [2]int32{int32(i), j})
					}
				}
			}
			if !slices.Equal(got, k.want) {
				t.Errorf("%s, %v %v: edges %v, want %v", tc.name, k.kind, tc.x, got, k.want)
			}
		}
	}
}
