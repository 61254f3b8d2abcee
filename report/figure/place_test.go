package figure

import (
	"math"
	"math/rand/v2"
	"reflect"
	"testing"
)

// crowdedPlane returns n label boxes on a synthetic complexity–entropy
// plane of 700 × 500 units: a third in a tight cluster at the lower right
// (where white noises sit), a third along an arc, the rest scattered.
func crowdedPlane(n int, seed uint64) []TextBox {
	rng := rand.New(rand.NewPCG(seed, 7))
	var out []TextBox
	for i := 0; i < n; i++ {
		var p Point
		switch i % 3 {
		case 0:
			p = Point{640 + 8*rng.Float64(), 470 + 8*rng.Float64()}
		case 1:
			a := math.Pi * rng.Float64()
			p = Point{350 - 300*math.Cos(a), 450 - 400*math.Sin(a)}
		default:
			p = Point{40 + 620*rng.Float64(), 40 + 420*rng.Float64()}
		}
		out = append(out, TextBox{Anchor: p, Width: 30 + 40*rng.Float64(), Ascent: 7, Descent: 2})
	}
	return out
}

// TestPlaceLabelsNoOverlap places 84 labels (as many as the reference
// systems) on a crowded plane and checks that no two placed label boxes
// overlap, none overlaps a marker, all lie in bounds, leader lines end on
// their own box (and, with LeadersBlock, cross no other label), and the
// result is deterministic. The ring search must place every label; the
// near offsets alone cannot (the cluster's labels run out of room).
func TestPlaceLabelsNoOverlap(t *testing.T) {
	labels := crowdedPlane(84, 1)
	bounds := Rect{0, 0, 700, 500}
	var markers []Rect
	for _, l := range labels {
		markers = append(markers, Around(l.Anchor, 3.5))
	}
	count := func(ps []Placement) int {
		n := 0
		for _, p := range ps {
			if p.Placed {
				n++
			}
		}
		return n
	}
	for _, block := range []bool{false, true} {
		opts := LabelOptions{Bounds: bounds, Obstacles: markers, Rings: 30, RingStep: 9, LeadersBlock: block}
		got := PlaceLabels(labels, opts)
		for i, a := range got {
			if !a.Placed {
				continue
			}
			if !a.Box.Inside(bounds) {
				t.Errorf("block %v: label %d at %v outside the bounds", block, i, a.Box)
			}
			if w := a.Box.X1 - a.Box.X0; math.Abs(w-labels[i].Width) > 1e-9 {
				t.Errorf("block %v: label %d box width %g, want %g", block, i, w, labels[i].Width)
			}
			for j, m := range markers {
				if a.Box.Overlaps(m) {
					t.Errorf("block %v: label %d overlaps marker %d", block, i, j)
				}
			}
			for j := i + 1; j < len(got); j++ {
				if b := got[j]; b.Placed && a.Box.Overlaps(b.Box) {
					t.Errorf("block %v: labels %d %v and %d %v overlap", block, i, a.Box, j, b.Box)
				}
			}
			if !a.Leader {
				continue
			}
			if e := a.LeaderEnd; !a.Box.Contains(e) {
				t.Errorf("block %v: label %d: leader ends at %v, off its box %v", block, i, e, a.Box)
			}
			for j, b := range got {
				if block && j != i && b.Placed && b.Box.crossesSegment(labels[i].Anchor, a.LeaderEnd) {
					t.Errorf("leader of label %d crosses label %d", i, j)
				}
			}
		}
		if again := PlaceLabels(labels, opts); !reflect.DeepEqual(again, got) {
			t.Errorf("block %v: PlaceLabels is not deterministic", block)
		}
		if n := count(got); !block && n != len(labels) {
			t.Errorf("the ring search placed %d of %d labels", n, len(labels))
		}
	}
	if n := count(PlaceLabels(labels, LabelOptions{Bounds: bounds, Obstacles: markers})); n >= len(labels) {
		t.Errorf("near offsets alone placed all %d labels: the plane is not crowded", n)
	}
}

// TestPlaceLabelsFirstFree checks the candidate order: an isolated label
// goes right of its point, baseline 4 below it; with the right side
// blocked, to the left.
func TestPlaceLabelsFirstFree(t *testing.T) {
	l := TextBox{Anchor: Point{100, 100}, Width: 40, Ascent: 10, Descent: 2}
	bounds := Rect{0, 0, 300, 200}
	p := PlaceLabels([]TextBox{l}, LabelOptions{Bounds: bounds})[0]
	if !p.Placed || p.Origin != (Point{107, 104}) || p.Leader {
		t.Errorf("isolated label at %+v, want origin (107, 104) without leader", p)
	}
	block := Rect{105, 80, 160, 120}
	p = PlaceLabels([]TextBox{l}, LabelOptions{Bounds: bounds, Obstacles: []Rect{block}})[0]
	if !p.Placed || p.Origin != (Point{53, 104}) {
		t.Errorf("label beside a block at %+v, want origin (53, 104)", p)
	}
}

// TestPlaceLegend checks that the legend avoids data: clear corner first,
// then a free place down an edge, and no place when data fill the area.
func TestPlaceLegend(t *testing.T) {
	area := Rect{0, 0, 400, 300}
	// Points along the top edge: the top corners are taken, the bottom
	// right is free.
	var ob Obstacles
	ob.Radius = 3
	for x := 0.0; x <= 400; x += 10 {
		ob.Points = append(ob.Points, Point{x, 20})
	}
	r, ok := PlaceLegend(area, 100, 60, 6, ob)
	if !ok || r != (Rect{294, 234, 394, 294}) {
		t.Errorf("legend at %v %v, want the bottom-right corner", r, ok)
	}
	if ob.Clearance(r, 100) <= 0 {
		t.Error("legend covers a point")
	}
	// A line across the middle and points along the bottom: the legend
	// fits between them on the right edge.
	ob.Lines = [][]Point{{{0, 150}, {400, 150}}}
	for x := 0.0; x <= 400; x += 10 {
		ob.Points = append(ob.Points, Point{x, 290})
	}
	r, ok = PlaceLegend(area, 100, 40, 6, ob)
	if !ok || ob.Clearance(r, 100) <= 0 {
		t.Fatalf("legend at %v %v covers data", r, ok)
	}
	if r.X1 != 394 {
		t.Errorf("legend at %v, want it on the right edge", r)
	}
	// Data everywhere: no place inside.
	ob.Points = nil
	for x := 0.0; x <= 400; x += 15 {
		for y := 0.0; y <= 300; y += 15 {
			ob.Points = append(ob.Points, Point{x, y})
		}
	}
	if r, ok := PlaceLegend(area, 100, 40, 6, ob); ok {
		t.Errorf("legend placed at %v over a full area", r)
	}
}

// TestLeftMargin: the margin holds the widest label plus its gaps.
func TestLeftMargin(t *testing.T) {
	widths := []float64{20, 143.5, 60}
	if m := LeftMargin(widths, 10, 0, 4, 30); m < 143.5+10+4 {
		t.Errorf("margin %g narrower than the widest label 143.5 and its gaps", m)
	}
	if m := LeftMargin(widths, 10, 12, 4, 30); m != 143.5+10+4+12+4 {
		t.Errorf("margin with a title %g", m)
	}
	if m := LeftMargin([]float64{5}, 2, 0, 1, 62); m != 62 {
		t.Errorf("margin %g below its floor 62", m)
	}
}

func TestSegmentGeometry(t *testing.T) {
	r := Rect{0, 0, 10, 10}
	// Analytic: a diagonal through the box crosses it; a segment 5 to
	// the right of it is 5 away; a segment past a corner along x+y = 25
	// is (25−20)/√2 from the corner (10, 10).
	if !r.crossesSegment(Point{-5, -5}, Point{15, 15}) || r.crossesSegment(Point{15, -5}, Point{15, 15}) {
		t.Error("crossesSegment")
	}
	if d := r.distSegment(Point{15, -5}, Point{15, 15}); math.Abs(d-5) > 1e-12 {
		t.Errorf("distance %g, want 5", d)
	}
	if d := r.distSegment(Point{25, 0}, Point{0, 25}); math.Abs(d-5/math.Sqrt2) > 1e-12 {
		t.Errorf("distance %g, want 5/√2", d)
	}
}
