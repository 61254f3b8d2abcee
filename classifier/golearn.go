package classifier

import (
	"fmt"
	"strconv"

	"github.com/sjwhitworth/golearn/base"
	"github.com/sjwhitworth/golearn/trees"
)

// gridBuilder fills golearn DenseInstances grids. golearn's CART learner
// (trees.CARTDecisionTreeClassifier) needs every column, the class included,
// to be a base.FloatAttribute; the class column holds the class index.
// A builder is used by one goroutine only.
type gridBuilder struct {
	labels []int64 // 0 … K−1, golearn's label list
	buf    [8]byte
}

func newGridBuilder(k int) *gridBuilder {
	g := &gridBuilder{labels: make([]int64, k)}
	for i := range g.labels {
		g.labels[i] = int64(i)
	}
	return g
}

// grid returns a golearn grid with columns f0 … f(m−1) holding value(r, c)
// for row r of rows and column c < m, and a class column holding y[rows[r]].
// The columns are added in order, so golearn's feature index c is column c.
func (g *gridBuilder) grid(rows []int32, m int, value func(row int32, c int) float64, y []int) (*base.DenseInstances, error) {
	inst := base.NewDenseInstances()
	specs := make([]base.AttributeSpec, m)
	for c := 0; c < m; c++ {
		specs[c] = inst.AddAttribute(base.NewFloatAttribute("f" + strconv.Itoa(c)))
	}
	classAttr := base.NewFloatAttribute("class")
	classSpec := inst.AddAttribute(classAttr)
	if err := inst.AddClassAttribute(classAttr); err != nil {
		return nil, fmt.Errorf("golearn grid: %w", err)
	}
	if err := inst.Extend(len(rows)); err != nil {
		return nil, fmt.Errorf("golearn grid: %w", err)
	}
	for i, r := range rows {
		for c := 0; c < m; c++ {
			base.PackFloatToBytesInline(value(r, c), g.buf[:])
			inst.Set(specs[c], i, g.buf[:])
		}
		base.PackFloatToBytesInline(float64(y[r]), g.buf[:])
		inst.Set(classSpec, i, g.buf[:])
	}
	return inst, nil
}

// fitCART fits golearn's CART classifier (Gini impurity) with the given
// depth limit (−1 = unlimited) on grid, converting golearn panics into
// errors.
func (g *gridBuilder) fitCART(grid base.FixedDataGrid, maxDepth int64) (t *trees.CARTDecisionTreeClassifier, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("%w: panic: %v", ErrGolearn, r)
		}
	}()
	t = trees.NewDecisionTreeClassifier(trees.GINI, maxDepth, g.labels)
	if err := t.Fit(grid); err != nil {
		return nil, fmt.Errorf("%w: %v", ErrGolearn, err)
	}
	if t.RootNode == nil {
		return nil, fmt.Errorf("%w: no root node", ErrGolearn)
	}
	return t, nil
}

// cartSplit is one golearn CART node in flat form: rows with
// value[Feature] < Threshold go Left, the others Right. A child index ≥ 0
// points into the flat slice; a negative child −1−c is a leaf predicting
// class index c.
type cartSplit struct {
	Feature     int
	Threshold   float64
	Left, Right int
}

// cartFrame is one pending node of the conversion walk. golearn's node type
// is unexported, but its fields are exported, so the walk names it through
// the type parameter N inferred from the RootNode field.
type cartFrame[N any] struct {
	node   N
	parent int
	left   bool
}

func framesOf[N any](root N) []cartFrame[N] {
	return []cartFrame[N]{{node: root, parent: -1}}
}

func pushFrame[N any](s []cartFrame[N], n N, parent int, left bool) []cartFrame[N] {
	return append(s, cartFrame[N]{node: n, parent: parent, left: left})
}

// walkCART converts a fitted golearn CART tree into flat nodes (root first)
// by walking its exported structure: Feature, Threshold, Left, Right,
// LeftLabel, RightLabel. golearn predicts a row by going left when
// value[Feature] < Threshold and, when the chosen child pointer is nil,
// returning LeftLabel or RightLabel; the flat form encodes those leaves as
// negative child indices, so predictCART gives golearn's answer for every
// input.
func walkCART(t *trees.CARTDecisionTreeClassifier) ([]cartSplit, error) {
	if t == nil || t.RootNode == nil {
		return nil, fmt.Errorf("%w: tree not fitted", ErrGolearn)
	}
	var out []cartSplit
	stack := framesOf(t.RootNode)
	for len(stack) > 0 {
		fr := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		n := fr.node
		idx := len(out)
		out = append(out, cartSplit{
			Feature:   int(n.Feature),
			Threshold: n.Threshold,
			Left:      -1 - int(n.LeftLabel),
			Right:     -1 - int(n.RightLabel),
		})
		if fr.parent >= 0 {
			if fr.left {
				out[fr.parent].Left = idx
			} else {
				out[fr.parent].Right = idx
			}
		}
		// Push right first so that the left subtree is emitted next
		// (pre-order); any order would be correct.
		if n.Right != nil {
			stack = pushFrame(stack, n.Right, idx, false)
		}
		if n.Left != nil {
			stack = pushFrame(stack, n.Left, idx, true)
		}
	}
	return out, nil
}

// predictCART returns the class index the flat CART tree assigns to x
// (x in grid-column order).
func predictCART(nodes []cartSplit, x []float64) int {
	i := 0
	for {
		nd := nodes[i]
		next := nd.Right
		if x[nd.Feature] < nd.Threshold {
			next = nd.Left
		}
		if next < 0 {
			return -1 - next
		}
		i = next
	}
}
