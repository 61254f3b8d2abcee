package nonlinear

// The row-by-row k-d tree builder: the builder the nonlinear estimators
// used before newDelayTree, kept as the reference that newDelayTree is
// checked against (TestDelayTreeEqualsRowTree) and to build trees over
// arbitrary points in the tests.

// newKDTree builds a tree over the first count points of pts (row-major,
// dimension dim). count must be ≥ 1.
//
// The points are copied and reordered in place (rows swapped), so every
// pass over a node's points is sequential in memory. The split dimension is
// the widest side of the node's outer box (the parent's box cut at the split
// value), the split is at the median; the tight boxes used for pruning are
// computed bottom-up (leaves scan their points, parents take the union).
func newKDTree(pts []float64, dim, count int) *kdTree {
	return newKDTreeLeaf(pts, dim, count, kdLeafSize)
}

// newKDTreeLeaf is newKDTree with a chosen largest leaf size.
func newKDTreeLeaf(pts []float64, dim, count, leaf int) *kdTree {
	t := &kdTree{dim: dim, leaf: max(1, leaf)}
	t.data = make([]float64, count*dim)
	copy(t.data, pts[:count*dim])
	t.ids = make([]int32, count)
	for i := range t.ids {
		t.ids[i] = int32(i)
	}
	t.nodes = make([]kdNode, 0, 4*count/t.leaf+2)
	t.box = make([]float64, 0, cap(t.nodes)*2*dim)
	outer := make([]float64, 2*dim)
	lo, hi := outer[:dim], outer[dim:]
	copy(lo, t.data[:dim])
	copy(hi, t.data[:dim])
	for i := 1; i < count; i++ {
		for c, v := range t.data[i*dim : (i+1)*dim] {
			lo[c] = min(lo[c], v)
			hi[c] = max(hi[c], v)
		}
	}
	t.build(0, count, outer)
	return t
}

// build creates the node for points [start, end) inside the outer box
// (lo then hi; modified and restored) and returns its number.
func (t *kdTree) build(start, end int, outer []float64) int32 {
	d := t.dim
	me := int32(len(t.nodes))
	t.nodes = append(t.nodes, kdNode{start: int32(start), end: int32(end), left: -1, right: -1})
	off := len(t.box)
	for k := 0; k < 2*d; k++ {
		t.box = append(t.box, 0)
	}
	split, spread := 0, -1.0
	for c := 0; c < d; c++ {
		if s := outer[d+c] - outer[c]; s > spread {
			split, spread = c, s
		}
	}
	if end-start > t.leaf && spread > 0 {
		mid := (start + end) / 2
		t.selectNth(start, end, split, mid)
		sv := t.data[mid*d+split]
		keep := outer[d+split]
		outer[d+split] = sv
		l := t.build(start, mid, outer)
		outer[d+split] = keep
		keep = outer[split]
		outer[split] = sv
		r := t.build(mid, end, outer)
		outer[split] = keep
		t.nodes[me].left, t.nodes[me].right = l, r
		lo, hi := t.box[off:off+d], t.box[off+d:off+2*d]
		lb, rb := int(l)*2*d, int(r)*2*d
		for c := 0; c < d; c++ {
			lo[c] = min(t.box[lb+c], t.box[rb+c])
			hi[c] = max(t.box[lb+d+c], t.box[rb+d+c])
		}
		return me
	}
	// Leaf (or a node of identical points): scan its points.
	lo, hi := t.box[off:off+d], t.box[off+d:off+2*d]
	copy(lo, t.data[start*d:start*d+d])
	copy(hi, t.data[start*d:start*d+d])
	for i := start + 1; i < end; i++ {
		for c, v := range t.data[i*d : (i+1)*d] {
			lo[c] = min(lo[c], v)
			hi[c] = max(hi[c], v)
		}
	}
	return me
}

// swapRows exchanges points i and j (coordinates and ids).
func (t *kdTree) swapRows(i, j int) {
	d := t.dim
	a, b := t.data[i*d:(i+1)*d], t.data[j*d:(j+1)*d]
	for c := range a {
		a[c], b[c] = b[c], a[c]
	}
	t.ids[i], t.ids[j] = t.ids[j], t.ids[i]
}

// selectNth reorders points [start, end) so that point k holds the k-th
// smallest coordinate c, smaller-or-equal ones before it and
// greater-or-equal ones after (Hoare's selection, median-of-three pivot).
func (t *kdTree) selectNth(start, end, c, k int) {
	d, data := t.dim, t.data
	lo, hi := start, end-1
	for lo < hi {
		m := lo + (hi-lo)/2
		a, b, e := data[lo*d+c], data[m*d+c], data[hi*d+c]
		pivot := b
		if (a <= b) == (b <= e) {
			pivot = b
		} else if (b <= a) == (a <= e) {
			pivot = a
		} else {
			pivot = e
		}
		i, j := lo, hi
		for i <= j {
			for data[i*d+c] < pivot {
				i++
			}
			for data[j*d+c] > pivot {
				j--
			}
			if i <= j {
				t.swapRows(i, j)
				i++
				j--
			}
		}
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return
		}
	}
}
