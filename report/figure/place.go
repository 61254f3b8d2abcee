package figure

import "math"

// Point is a position in image coordinates (y grows downwards).
type Point struct{ X, Y float64 }

// Rect is an axis-aligned box with X0 ≤ X1 and Y0 ≤ Y1.
type Rect struct{ X0, Y0, X1, Y1 float64 }

// Overlaps reports whether r and s share interior area (boxes that only
// touch do not overlap).
func (r Rect) Overlaps(s Rect) bool {
	return r.X0 < s.X1 && s.X0 < r.X1 && r.Y0 < s.Y1 && s.Y0 < r.Y1
}

// Inside reports whether r lies within bounds.
func (r Rect) Inside(bounds Rect) bool {
	return r.X0 >= bounds.X0 && r.X1 <= bounds.X1 && r.Y0 >= bounds.Y0 && r.Y1 <= bounds.Y1
}

// Contains reports whether p lies in r (edges included).
func (r Rect) Contains(p Point) bool {
	return p.X >= r.X0 && p.X <= r.X1 && p.Y >= r.Y0 && p.Y <= r.Y1
}

// Grow returns r widened by d on every side.
func (r Rect) Grow(d float64) Rect { return Rect{r.X0 - d, r.Y0 - d, r.X1 + d, r.Y1 + d} }

// Around returns the square of half-side r centred on p (a marker's box).
func Around(p Point, r float64) Rect { return Rect{p.X - r, p.Y - r, p.X + r, p.Y + r} }

// crossesSegment reports whether the segment a–b passes through r
// (Liang–Barsky clipping of the segment against the box).
func (r Rect) crossesSegment(a, b Point) bool {
	t0, t1 := 0.0, 1.0
	dx, dy := b.X-a.X, b.Y-a.Y
	clip := func(p, q float64) bool {
		if p == 0 {
			return q >= 0
		}
		t := q / p
		if p < 0 {
			if t > t1 {
				return false
			}
			t0 = math.Max(t0, t)
		} else {
			if t < t0 {
				return false
			}
			t1 = math.Min(t1, t)
		}
		return true
	}
	return clip(-dx, a.X-r.X0) && clip(dx, r.X1-a.X) && clip(-dy, a.Y-r.Y0) && clip(dy, r.Y1-a.Y) && t0 <= t1
}

// TextBox is a label to place: it is drawn with its baseline starting at
// the origin PlaceLabels chooses, and occupies Width to the right, Ascent
// above the baseline and Descent below it.
type TextBox struct {
	Anchor                 Point // the point the label names
	Width, Ascent, Descent float64
}

// box returns the label's box when its baseline starts at o.
func (t TextBox) box(o Point) Rect {
	return Rect{o.X, o.Y - t.Ascent, o.X + t.Width, o.Y + t.Descent}
}

// Placement is where PlaceLabels put one label.
type Placement struct {
	// Placed is false when no free position was found; the label is then
	// left out.
	Placed bool
	// Origin is the start of the label's baseline and Box the area it
	// covers.
	Origin Point
	Box    Rect
	// Leader is set for a label placed away from its point: a line from
	// the anchor to LeaderEnd, the nearest point of the box, joins them.
	Leader    bool
	LeaderEnd Point
}

// LabelOptions control PlaceLabels.
type LabelOptions struct {
	// Bounds is the area every label box must lie in.
	Bounds Rect
	// Obstacles are boxes no label may overlap (markers, the legend).
	Obstacles []Rect
	// Offsets returns the candidate offsets of a label's baseline origin
	// from its anchor, nearest first; nil means NearOffsets.
	Offsets func(t TextBox) []Point
	// LeaderFrom is the index of the first candidate that is far enough
	// from its anchor to need a leader line; 0 means 8 (the first eight
	// of NearOffsets sit beside the point).
	LeaderFrom int
	// Rings adds candidates after the offsets: the label's box centred on
	// Rings circles around the anchor, RingStep apart starting at
	// 2·RingStep, every 15° (starting to the upper right), all with leader
	// lines. 0 adds none.
	Rings    int
	RingStep float64
	// LeadersBlock makes every leader line drawn so far an obstacle for
	// later labels, so no label is crossed by another's leader.
	LeadersBlock bool
	// Lines are polylines (curves of the plot) no label box may cross.
	Lines [][]Point
}

// NearOffsets are the default candidate offsets of a label's baseline
// origin from its anchor: right, left, above, below, the four diagonals,
// then further out on the same sides (these need leader lines).
func NearOffsets(t TextBox) []Point {
	w := t.Width
	return []Point{{7, 4}, {-7 - w, 4}, {-w / 2, -8}, {-w / 2, 15}, {7, -7}, {7, 14}, {-7 - w, -7}, {-7 - w, 14},
		{-w / 2, -19}, {-w / 2, 26}, {12, -16}, {-12 - w, -16}, {12, 22}, {-12 - w, 22},
		{-24 - w, -26}, {-24 - w, 30}, {-w / 2, -34}, {-40 - w, -12}, {-40 - w, -40}, {-40 - w, 44}}
}

// PlaceLabels places labels one after another, in the order given, each at
// the first candidate position whose box lies inside o.Bounds and overlaps
// no obstacle and no label placed before it. The result is deterministic
// and no two placed boxes overlap; a label with no free candidate is left
// unplaced. Callers put the labels that matter most first.
func PlaceLabels(labels []TextBox, o LabelOptions) []Placement {
	offsets := o.Offsets
	if offsets == nil {
		offsets = NearOffsets
	}
	leaderFrom := o.LeaderFrom
	if leaderFrom == 0 {
		leaderFrom = 8
	}
	taken := append([]Rect(nil), o.Obstacles...)
	var leaders [][2]Point
	free := func(b Rect, anchor Point, leader bool) bool {
		if !b.Inside(o.Bounds) {
			return false
		}
		for _, t := range taken {
			if b.Overlaps(t) {
				return false
			}
		}
		for _, l := range o.Lines {
			for k := 1; k < len(l); k++ {
				if b.crossesSegment(l[k-1], l[k]) {
					return false
				}
			}
		}
		if o.LeadersBlock {
			for _, l := range leaders {
				if b.crossesSegment(l[0], l[1]) {
					return false
				}
			}
			if leader {
				// The new leader must not cross a label already placed
				// (the obstacles are markers, which it may touch).
				a, e := anchor, nearest(b, anchor)
				for _, t := range taken[len(o.Obstacles):] {
					if t.crossesSegment(a, e) {
						return false
					}
				}
			}
		}
		return true
	}
	out := make([]Placement, len(labels))
	for i, t := range labels {
		cands := offsets(t)
		n := len(cands)
		for r := 1; r <= o.Rings && o.RingStep > 0; r++ {
			rad := float64(r+1) * o.RingStep
			for k := 0; k < 24; k++ {
				a := -math.Pi/4 + float64(k)*math.Pi/12
				cx, cy := rad*math.Cos(a), rad*math.Sin(a)
				cands = append(cands, Point{cx - t.Width/2, cy + (t.Ascent-t.Descent)/2})
			}
		}
		for k, d := range cands {
			org := Point{t.Anchor.X + d.X, t.Anchor.Y + d.Y}
			b := t.box(org)
			leader := k >= leaderFrom || k >= n
			if !free(b, t.Anchor, leader) {
				continue
			}
			p := Placement{Placed: true, Origin: org, Box: b}
			if leader {
				p.Leader, p.LeaderEnd = true, nearest(b, t.Anchor)
				leaders = append(leaders, [2]Point{t.Anchor, p.LeaderEnd})
			}
			taken = append(taken, b)
			out[i] = p
			break
		}
	}
	return out
}

// nearest returns the point of r closest to p.
func nearest(r Rect, p Point) Point {
	return Point{math.Max(r.X0, math.Min(p.X, r.X1)), math.Max(r.Y0, math.Min(p.Y, r.Y1))}
}

// Obstacles are what a legend must not cover: points (markers), polylines
// and boxes (bars), all kept at least Radius away from the legend's box.
type Obstacles struct {
	Points []Point
	Radius float64
	Lines  [][]Point
	Boxes  []Rect
}

// Clearance returns the distance from r to the nearest obstacle less
// Radius, at most limit; zero or less means r covers an obstacle.
func (ob Obstacles) Clearance(r Rect, limit float64) float64 {
	d := limit + ob.Radius
	for _, b := range ob.Boxes {
		dx := math.Max(0, math.Max(b.X0-r.X1, r.X0-b.X1))
		dy := math.Max(0, math.Max(b.Y0-r.Y1, r.Y0-b.Y1))
		d = math.Min(d, math.Hypot(dx, dy))
	}
	for _, p := range ob.Points {
		d = math.Min(d, r.distPoint(p))
	}
	for _, l := range ob.Lines {
		for i := 1; i < len(l); i++ {
			d = math.Min(d, r.distSegment(l[i-1], l[i]))
		}
		if len(l) == 1 {
			d = math.Min(d, r.distPoint(l[0]))
		}
	}
	return d - ob.Radius
}

// distPoint returns the distance from p to r (0 inside).
func (r Rect) distPoint(p Point) float64 {
	dx := math.Max(0, math.Max(r.X0-p.X, p.X-r.X1))
	dy := math.Max(0, math.Max(r.Y0-p.Y, p.Y-r.Y1))
	return math.Hypot(dx, dy)
}

// distSegment returns the distance from the segment a–b to r: 0 when it
// passes through r, else the least of the distances from its ends to r and
// from r's corners to it (exact for a segment and a box that do not meet).
func (r Rect) distSegment(a, b Point) float64 {
	if r.crossesSegment(a, b) {
		return 0
	}
	d := math.Min(r.distPoint(a), r.distPoint(b))
	for _, c := range []Point{{r.X0, r.Y0}, {r.X1, r.Y0}, {r.X0, r.Y1}, {r.X1, r.Y1}} {
		d = math.Min(d, segmentDist(c, a, b))
	}
	return d
}

// segmentDist returns the distance from p to the segment a–b.
func segmentDist(p, a, b Point) float64 {
	dx, dy := b.X-a.X, b.Y-a.Y
	t := 0.0
	if l2 := dx*dx + dy*dy; l2 > 0 {
		t = math.Max(0, math.Min(1, ((p.X-a.X)*dx+(p.Y-a.Y)*dy)/l2))
	}
	return math.Hypot(p.X-(a.X+t*dx), p.Y-(a.Y+t*dy))
}

// PlaceLegend returns a position for a legend box of w × h inside area, at
// least inset from its edges, that covers no obstacle: the four corners
// first (top right, top left, bottom right, bottom left), then positions
// down the right and left edges, then along the top and bottom middles,
// then the middle of the area. Of the candidates that cover nothing it
// takes the first that keeps 3·inset clear of every obstacle, or else the
// one that keeps furthest from them. ok is false when every candidate
// covers something (or the box does not fit); the caller then sets the
// legend below the plot.
func PlaceLegend(area Rect, w, h, inset float64, ob Obstacles) (r0 Rect, ok bool) {
	clear := 3 * inset
	x0, x1 := area.X0+inset, area.X1-inset-w
	y0, y1 := area.Y0+inset, area.Y1-inset-h
	if x1 < x0 || y1 < y0 {
		return Rect{}, false
	}
	xm, ym := (x0+x1)/2, (y0+y1)/2
	cands := []Point{{x1, y0}, {x0, y0}, {x1, y1}, {x0, y1}}
	const steps = 12
	for k := 1; k < steps; k++ {
		y := y0 + (y1-y0)*float64(k)/steps
		cands = append(cands, Point{x1, y}, Point{x0, y})
	}
	for k := 1; k < steps; k++ {
		x := x0 + (x1-x0)*float64(k)/steps
		cands = append(cands, Point{x, y0}, Point{x, y1})
	}
	cands = append(cands, Point{xm, ym})
	best := 0.0
	for _, c := range cands {
		r := Rect{c.X, c.Y, c.X + w, c.Y + h}
		if cl := ob.Clearance(r, clear); cl > best {
			best, r0, ok = cl, r, true
			if cl >= clear {
				break
			}
		}
	}
	return r0, ok
}

// LeftMargin returns the room left of a plot's y axis for tick labels of
// the given widths set right-aligned against the axis: the widest label,
// the tick length and gap before it, the height of a rotated axis title
// (0 for none) with its gap, and an outer margin to the image edge; never
// less than floor.
func LeftMargin(widths []float64, tickGap, title, outer, floor float64) float64 {
	w := 0.0
	for _, x := range widths {
		w = math.Max(w, x)
	}
	m := w + tickGap + outer
	if title > 0 {
		m += title + 4
	}
	return math.Max(floor, m)
}
