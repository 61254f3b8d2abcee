package classifier

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sync"
	"sync/atomic"
)

// learnerID names the split learner in the model file.
const learnerID = "golearn CART (github.com/sjwhitworth/golearn v0.0.0-20221228163002-74ae077eafb2), gini, one depth-1 fit per node"

// Model is a trained forest with everything needed to predict, explain and
// reproduce it. Fields are exported for reporting; treat them as read-only
// except MinProbability and RangeMargin in Config, which Predict reads each
// time, and CV, which callers may fill in before saving.
type Model struct {
	// Features are the feature names in the order Predict expects them.
	Features []string `json:"features"`
	// Classes are the class names, sorted; probabilities follow this order.
	Classes []string `json:"classes"`
	// Config is the resolved configuration the forest was grown with.
	Config Config `json:"config"`
	// Learner names the golearn learner that chose the splits.
	Learner string `json:"learner"`
	// Training describes the training set.
	Training TrainingInfo `json:"training"`
	// Medians are the training medians used to impute missing inputs.
	Medians []float64 `json:"medians"`
	// Min and Max are each feature's training range (after imputation).
	Min []float64 `json:"min"`
	Max []float64 `json:"max"`
	// OOB holds the out-of-bag accuracy estimate.
	OOB OOBInfo `json:"oob"`
	// CV holds cross-validation figures, if the caller stored them.
	CV *CVSummary `json:"cv,omitempty"`
	// Validation holds a held-out evaluation broken down by stratum and
	// calibration (e.g. leave-one-family-out), if the caller stored one.
	Validation *Validation `json:"validation,omitempty"`
	// Source is the path the model was loaded from (not stored).
	Source string `json:"-"`

	trees   []tree
	novelty *noveltyIndex // nil: no novelty measure (format version 1)
}

// TrainingInfo describes a model's training set.
type TrainingInfo struct {
	Description string `json:"description"`
	Rows        int    `json:"rows"`
	// ClassCounts[i] is the number of rows of Classes[i].
	ClassCounts []int `json:"class_counts"`
	// Groups is the number of distinct groups (0 when none were given).
	Groups int `json:"groups"`
	// Imputed is the number of missing (NaN) values replaced by medians.
	Imputed int `json:"imputed"`
	// Dropped names the features missing in every training row: the model
	// leaves them out (Features does not list them) and never asks for them.
	Dropped []string `json:"dropped,omitempty"`
}

// OOBInfo is the out-of-bag estimate: every training row is predicted by
// the trees whose bootstrap sample left it out (Breiman 2001).
type OOBInfo struct {
	// Rows is the number of rows left out by at least one tree.
	Rows int `json:"rows"`
	// Accuracy is the fraction of those rows whose top class is right.
	Accuracy float64 `json:"accuracy"`
}

// node is one node of a tree in pre-order: the left child of an internal
// node is the next node; right holds the index of the right child.
type node struct {
	feature   int32 // −1 for a leaf
	right     int32
	threshold float64 // x[feature] < threshold goes left
}

// tree is one fitted tree. count and value hold K entries per node: the
// number of bootstrap rows of each class that reach the node, and those
// counts divided by their sum.
type tree struct {
	nodes []node
	count []uint32
	value []float64
}

// leaf returns the index of the leaf x reaches.
func (t *tree) leaf(x []float64) int {
	i := 0
	for {
		nd := &t.nodes[i]
		if nd.feature < 0 {
			return i
		}
		if x[nd.feature] < nd.threshold {
			i++
		} else {
			i = int(nd.right)
		}
	}
}

// fillValues computes value from count for every node.
func (t *tree) fillValues(k int) {
	t.value = make([]float64, len(t.count))
	for i := 0; i < len(t.nodes); i++ {
		var sum uint64
		for c := 0; c < k; c++ {
			sum += uint64(t.count[i*k+c])
		}
		for c := 0; c < k; c++ {
			t.value[i*k+c] = float64(t.count[i*k+c]) / float64(sum)
		}
	}
}

// NumTrees returns the number of trees.
func (m *Model) NumTrees() int { return len(m.trees) }

// NumNodes returns the total number of nodes over all trees.
func (m *Model) NumNodes() int {
	s := 0
	for i := range m.trees {
		s += len(m.trees[i].nodes)
	}
	return s
}

// splitmix64 is the SplitMix64 output function (Steele, Lea & Flood,
// OOPSLA 2014), used to derive independent seeds.
func splitmix64(x uint64) uint64 {
	x += 0x9e3779b97f4a7c15
	x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9
	x = (x ^ (x >> 27)) * 0x94d049bb133111eb
	return x ^ (x >> 31)
}

// streamRand returns the generator of stream s under seed: a PCG whose two
// state words are SplitMix64 mixes of (seed, s).
func streamRand(seed uint64, s uint64) *rand.Rand {
	a := splitmix64(seed ^ splitmix64(2*s+1))
	b := splitmix64(a ^ splitmix64(2*s+2))
	return rand.New(rand.NewPCG(a, b))
}

// trainer holds the prepared training data shared read-only by all trees.
type trainer struct {
	cfg     Config
	n, p, k int
	mtry    int
	y       []int
	codes   [][]uint16  // [feature][row] bin codes
	edges   [][]float64 // [feature] bin cut points
	cols    [][]float64 // [feature][row] imputed values
}

// Train grows a forest on ds with cfg (see the package documentation for
// the algorithm). The result depends only on ds, cfg and cfg.Seed — not on
// Workers or GOMAXPROCS. ds must hold at least two rows, two classes and no
// ±Inf; NaN values are imputed with the feature's training median.
func Train(ds Dataset, cfg Config) (*Model, error) {
	ds, dropped := ds.withoutEmpty()
	classes, y, err := ds.validate()
	if err != nil {
		return nil, fmt.Errorf("train: %w", err)
	}
	n, p, k := len(ds.X), len(ds.Features), len(classes)
	c, err := cfg.resolve(p)
	if err != nil {
		return nil, fmt.Errorf("train: %w", err)
	}
	med, err := ds.medians()
	if err != nil {
		return nil, fmt.Errorf("train: %w", err)
	}
	m := &Model{
		Features: slices.Clone(ds.Features),
		Classes:  classes,
		Config:   c,
		Learner:  learnerID,
		Medians:  med,
		Min:      make([]float64, p),
		Max:      make([]float64, p),
	}
	m.Config.Workers = 0
	m.Training = TrainingInfo{Description: ds.Description, Rows: n, ClassCounts: make([]int, k), Dropped: dropped}
	for _, yi := range y {
		m.Training.ClassCounts[yi]++
	}
	if len(ds.Groups) > 0 {
		g := slices.Clone(ds.Groups)
		slices.Sort(g)
		m.Training.Groups = len(slices.Compact(g))
	}

	tr := &trainer{cfg: c, n: n, p: p, k: k, mtry: c.featuresPerSplit(p), y: y,
		codes: make([][]uint16, p), edges: make([][]float64, p), cols: make([][]float64, p)}
	sorted := make([]float64, n)
	for j := 0; j < p; j++ {
		col := make([]float64, n)
		for i, row := range ds.X {
			v := row[j]
			if math.IsNaN(v) {
				v = med[j]
				m.Training.Imputed++
			}
			col[i] = v
		}
		copy(sorted, col)
		slices.Sort(sorted)
		m.Min[j], m.Max[j] = sorted[0], sorted[n-1]
		e := quantileEdges(sorted, c.Bins)
		codes := make([]uint16, n)
		for i, v := range col {
			codes[i] = uint16(binOf(e, v))
		}
		tr.cols[j], tr.edges[j], tr.codes[j] = col, e, codes
	}

	forest := make([]tree, c.Trees)
	inbag := make([][]bool, c.Trees)
	errs := make([]error, c.Trees)
	// Trees are claimed from a shared counter; each tree's result depends
	// only on its index and is stored at that index, so the forest is the
	// same whatever the number of workers or the scheduling.
	var next atomic.Int64
	var wg sync.WaitGroup
	workers := min(c.Workers, c.Trees)
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			gr := newGrower(tr)
			for {
				t := int(next.Add(1) - 1)
				if t >= c.Trees {
					return
				}
				forest[t], inbag[t], errs[t] = gr.growTree(t)
			}
		}()
	}
	wg.Wait()
	for t, e := range errs {
		if e != nil {
			return nil, fmt.Errorf("train: tree %d: %w", t, e)
		}
	}
	m.trees = forest
	m.OOB = outOfBag(forest, inbag, tr.cols, y, k, c.Workers)
	if c.NoveltyLimit >= 0 {
		m.novelty = buildNovelty(ds.X, y, ds.Groups, c.NoveltyK, c.Workers)
	}
	return m, nil
}

// grower grows trees for one goroutine, reusing its buffers.
type grower struct {
	tr      *trainer
	gb      *gridBuilder
	rng     *rand.Rand
	perm    []int
	cand    []int
	scratch []int32
	t       *tree
}

func newGrower(tr *trainer) *grower {
	return &grower{tr: tr, gb: newGridBuilder(tr.k), perm: make([]int, tr.p),
		cand: make([]int, 0, tr.p), scratch: make([]int32, tr.n)}
}

// bootstrap returns the bootstrap rows of tree t (n draws with
// replacement, in draw order) and the generator positioned after them.
func bootstrap(seed uint64, t, n int) ([]int32, *rand.Rand) {
	rng := streamRand(seed, uint64(t))
	rows := make([]int32, n)
	for i := range rows {
		rows[i] = int32(rng.IntN(n))
	}
	return rows, rng
}

// growTree grows tree t and returns it with its in-bag indicator.
func (g *grower) growTree(t int) (tree, []bool, error) {
	rows, rng := bootstrap(g.tr.cfg.Seed, t, g.tr.n)
	inbag := make([]bool, g.tr.n)
	for _, r := range rows {
		inbag[r] = true
	}
	g.rng = rng
	for i := range g.perm {
		g.perm[i] = i
	}
	g.t = &tree{}
	if _, err := g.grow(rows, 0); err != nil {
		return tree{}, nil, err
	}
	g.t.fillValues(g.tr.k)
	return *g.t, inbag, nil
}

// grow builds the subtree on rows (bootstrap row indices, duplicates
// allowed) at the given depth and returns its root index.
func (g *grower) grow(rows []int32, depth int) (int32, error) {
	tr := g.tr
	k := tr.k
	idx := int32(len(g.t.nodes))
	g.t.nodes = append(g.t.nodes, node{feature: -1})
	base := len(g.t.count)
	g.t.count = append(g.t.count, make([]uint32, k)...)
	for _, r := range rows {
		g.t.count[base+tr.y[r]]++
	}
	present := 0
	for c := 0; c < k; c++ {
		if g.t.count[base+c] > 0 {
			present++
		}
	}
	if present < 2 || len(rows) < 2*tr.cfg.MinLeaf || (tr.cfg.MaxDepth > 0 && depth >= tr.cfg.MaxDepth) {
		return idx, nil
	}
	cand := g.drawCandidates(rows)
	if len(cand) == 0 {
		return idx, nil
	}
	grid, err := g.gb.grid(rows, len(cand), func(r int32, c int) float64 {
		return float64(tr.codes[cand[c]][r])
	}, tr.y)
	if err != nil {
		return 0, err
	}
	fit, err := g.gb.fitCART(grid, 1)
	if err != nil {
		return 0, err
	}
	flat, err := walkCART(fit)
	if err != nil {
		return 0, err
	}
	root := flat[0]
	// Bin codes are integers ≥ 0 and golearn places a threshold midway
	// between two distinct codes, so a real split has Threshold ≥ 0.5;
	// golearn leaves the zero node when no split lowers the impurity.
	if !(root.Threshold > 0) {
		return idx, nil
	}
	if root.Feature < 0 || root.Feature >= len(cand) {
		return 0, fmt.Errorf("%w: split on column %d of %d", ErrGolearn, root.Feature, len(cand))
	}
	f := cand[root.Feature]
	// code < Threshold ⇔ code ≤ ceil(Threshold)−1 ⇔ x < edges[ceil(Threshold)−1].
	cut := int(math.Ceil(root.Threshold)) - 1
	if cut < 0 || cut >= len(tr.edges[f]) {
		return 0, fmt.Errorf("%w: threshold %g outside the %d bins of feature %d", ErrGolearn, root.Threshold, len(tr.edges[f])+1, f)
	}
	thr := tr.edges[f][cut]
	nl := g.partition(rows, f, thr)
	if nl < tr.cfg.MinLeaf || len(rows)-nl < tr.cfg.MinLeaf {
		return idx, nil
	}
	g.t.nodes[idx].feature = int32(f)
	g.t.nodes[idx].threshold = thr
	if _, err := g.grow(rows[:nl], depth+1); err != nil {
		return 0, err
	}
	right, err := g.grow(rows[nl:], depth+1)
	if err != nil {
		return 0, err
	}
	g.t.nodes[idx].right = right
	return idx, nil
}

// drawCandidates draws features in random order (a partial Fisher–Yates
// shuffle) until mtry of them vary on rows, and returns them sorted
// ascending so that golearn's tie rule (first column wins) prefers the
// lower feature index.
func (g *grower) drawCandidates(rows []int32) []int {
	tr := g.tr
	g.cand = g.cand[:0]
	for s := 0; s < tr.p && len(g.cand) < tr.mtry; s++ {
		j := s + g.rng.IntN(tr.p-s)
		g.perm[s], g.perm[j] = g.perm[j], g.perm[s]
		f := g.perm[s]
		codes := tr.codes[f]
		first := codes[rows[0]]
		for _, r := range rows[1:] {
			if codes[r] != first {
				g.cand = append(g.cand, f)
				break
			}
		}
	}
	slices.Sort(g.cand)
	return g.cand
}

// partition reorders rows stably so that those with x[f] < thr come first
// and returns their number.
func (g *grower) partition(rows []int32, f int, thr float64) int {
	col := g.tr.cols[f]
	w, s := 0, 0
	for _, r := range rows {
		if col[r] < thr {
			rows[w] = r
			w++
		} else {
			g.scratch[s] = r
			s++
		}
	}
	copy(rows[w:], g.scratch[:s])
	return w
}

// outOfBag predicts every row with the trees that did not draw it and
// returns the accuracy of the top class. Rows are split into fixed chunks,
// one per worker; each row's sum runs over the trees in index order.
func outOfBag(forest []tree, inbag [][]bool, cols [][]float64, y []int, k, workers int) OOBInfo {
	n, p := len(y), len(cols)
	covered := make([]bool, n)
	correct := make([]bool, n)
	chunk := (n + workers - 1) / workers
	var wg sync.WaitGroup
	for lo := 0; lo < n; lo += chunk {
		hi := min(lo+chunk, n)
		wg.Add(1)
		go func(lo, hi int) {
			defer wg.Done()
			x := make([]float64, p)
			sum := make([]float64, k)
			for i := lo; i < hi; i++ {
				for j := range x {
					x[j] = cols[j][i]
				}
				clear(sum)
				used := false
				for t := range forest {
					if inbag[t][i] {
						continue
					}
					used = true
					l := forest[t].leaf(x) * k
					for c := 0; c < k; c++ {
						sum[c] += forest[t].value[l+c]
					}
				}
				covered[i] = used
				correct[i] = used && argmax(sum) == y[i]
			}
		}(lo, hi)
	}
	wg.Wait()
	var info OOBInfo
	good := 0
	for i := range covered {
		if covered[i] {
			info.Rows++
			if correct[i] {
				good++
			}
		}
	}
	if info.Rows > 0 {
		info.Accuracy = float64(good) / float64(info.Rows)
	}
	return info
}

// argmax returns the index of the largest element (the first on ties).
func argmax(v []float64) int {
	best := 0
	for i := 1; i < len(v); i++ {
		if v[i] > v[best] {
			best = i
		}
	}
	return best
}
