package report

import (
	"fmt"
	"math/rand/v2"

	"github.com/tracesift/tracesift/features/ordinal"
	"github.com/tracesift/tracesift/generators"
)

// Reference is a system drawn on the complexity–entropy plane for
// comparison: a generators system with parameter overrides.
type Reference struct {
	Label  string
	System string
	Params map[string]float64
}

// DefaultReferences returns the reference systems of the complexity–entropy
// plane: chaotic maps and flows, noises of several colours and two regular
// signals.
func DefaultReferences() []Reference {
	return []Reference{
		{Label: "logistic r=4", System: "logistic"},
		{Label: "Hénon", System: "henon"},
		{Label: "Lorenz", System: "lorenz"},
		{Label: "Rössler", System: "rossler"},
		{Label: "white", System: "white"},
		{Label: "fGn H=0.3", System: "fgn", Params: map[string]float64{"h": 0.3}},
		{Label: "fGn H=0.7", System: "fgn", Params: map[string]float64{"h": 0.7}},
		{Label: "1/f", System: "powerlaw", Params: map[string]float64{"beta": 1}},
		{Label: "Brownian", System: "brownian"},
		{Label: "AR(1) φ=0.9", System: "ar1"},
		{Label: "sine", System: "sine"},
		{Label: "two-tone", System: "two-tone"},
	}
}

// Reference series lengths: the trace's own length, clamped to this range,
// so that the finite-sample bias of the pattern frequencies (W/d! windows
// per pattern) is the same for the trace and the references it is compared
// with.
const (
	minReferenceLength = 2048
	maxReferenceLength = 1 << 16
	// referenceSeed fixes the reference series: reference i is drawn from
	// PCG(referenceSeed, i).
	referenceSeed = 0x7265666572656e63 // "referenc"
)

// ReferencePoint is one reference system on the plane.
type ReferencePoint struct {
	Label, System, Class string
	Entropy, Complexity  float64
	N                    int
	Error                string // set when the system could not be drawn or measured
}

// PlanePanel places the trace on the complexity–entropy plane of the given
// order.
type PlanePanel struct {
	Order        int
	Trace        ordinal.ComplexityResult
	Lower, Upper []ordinal.PlanePoint
	References   []ReferencePoint
	// ReferenceLength is the length every reference series was drawn with.
	ReferenceLength int
}

// buildPlane measures the trace and the references. The panel is returned
// even when some references fail (their Error says why); err reports a
// failure on the trace itself.
func buildPlane(x []float64, order int, refs []Reference) (*PlanePanel, error) {
	opts := ordinal.Options{Order: order}
	cr, err := ordinal.Complexity(x, opts)
	if err != nil {
		return nil, fmt.Errorf("order-%d complexity of the trace: %w", order, err)
	}
	lower, upper, err := ordinal.BoundaryCurves(order, 201)
	if err != nil {
		return nil, err
	}
	p := &PlanePanel{Order: order, Trace: cr, Lower: lower, Upper: upper,
		ReferenceLength: min(max(len(x), minReferenceLength), maxReferenceLength)}
	p.References = make([]ReferencePoint, len(refs))
	done := make(chan struct{}, len(refs))
	for i, ref := range refs {
		go func() {
			defer func() { done <- struct{}{} }()
			p.References[i] = measureReference(ref, i, p.ReferenceLength, opts)
		}()
	}
	for range refs {
		<-done
	}
	return p, nil
}

func measureReference(ref Reference, i, n int, opts ordinal.Options) ReferencePoint {
	rp := ReferencePoint{Label: ref.Label, System: ref.System, N: n}
	s, err := generators.Lookup(ref.System)
	if err != nil {
		rp.Error = err.Error()
		return rp
	}
	rp.Class = string(s.DefaultClass)
	if ref.Params != nil {
		c, err := s.Class(ref.Params)
		if err != nil {
			rp.Error = err.Error()
			return rp
		}
		rp.Class = string(c)
	}
	y, err := s.Generate(n, ref.Params, rand.New(rand.NewPCG(referenceSeed, uint64(i))))
	if err != nil {
		rp.Error = err.Error()
		return rp
	}
	cr, err := ordinal.Complexity(y, opts)
	if err != nil {
		rp.Error = err.Error()
		return rp
	}
	rp.Entropy, rp.Complexity = cr.Entropy, cr.Complexity
	return rp
}
