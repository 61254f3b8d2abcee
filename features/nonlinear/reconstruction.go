package nonlinear

import "fmt"

// Reconstruction is a series prepared once for the estimators that work
// in its delay-embedding space: the standardised samples, the embedding
// chosen by Embed, and the neighbour-search structures, built on first use
// and then shared — the sorted projection of the samples and the search
// tree of Cao's dimension search (which Lyapunov reuses when it covers the
// series), and the delay vectors of the chosen dimension. Its Lyapunov, CorrelationDimension and Prediction methods give
// exactly the results of the package functions called with
// Embedding().Fixed(), without standardising, embedding and sorting the
// series again for each of them. A Reconstruction is not safe for
// concurrent use.
type Reconstruction struct {
	z      []float64 // standardised series
	emb    *Embedding
	maxLag int // lag range of the autocorrelation time (ACFTime)

	proj   *projection // sorted projection of z, on first use
	tree   *kdTree     // search tree over the delay vectors of z, on first use
	tdelay int         // its delay
	// noProj[d] records that Cao's search at dimension d gave up the
	// sorted projection (searchPlan): the estimators in that dimension
	// then go straight to their trees.
	noProj  map[int]bool
	vectors []float64 // delay vectors of emb, row-major, on first use
}

// Reconstruct standardises x and chooses its embedding as Embed does (x
// needs at least 200 samples).
func Reconstruct(x []float64, opts EmbedOptions) (*Reconstruction, error) {
	return reconstruct(x, opts, "nonlinear: embed")
}

// reconstruct is Reconstruct naming who in error messages.
func reconstruct(x []float64, opts EmbedOptions, who string) (*Reconstruction, error) {
	z, err := standardize(x, 200, who)
	if err != nil {
		return nil, err
	}
	r := &Reconstruction{z: z, maxLag: orDefault(opts.AMI.MaxLag, defaultMaxLag(len(z)))}
	if r.emb, err = embedStd(z, opts, r); err != nil {
		return nil, fmt.Errorf("%s: %w", who, err)
	}
	return r, nil
}

// Embedding returns the chosen embedding.
func (r *Reconstruction) Embedding() *Embedding {
	return r.emb
}

// projectionOf returns a sorted projection of z, which is the
// reconstruction's series or a prefix of it, with delay vectors of at least
// dims coordinates at delay: the shared one when it fits, else a new one
// (kept for the next caller when it covers the whole series).
func (r *Reconstruction) projectionOf(z []float64, dims, delay int) *projection {
	if r != nil && r.proj != nil && len(z) == len(r.proj.val) && r.proj.dims >= dims && r.proj.delay == delay {
		return r.proj
	}
	p := newProjection(z, dims, delay)
	if r != nil && len(z) == len(r.z) {
		r.proj = p
	}
	return p
}

// searchTree returns a k-d tree over the delay vectors y_j of z (the
// reconstruction's series or a prefix of it), j < len(z) − delay, with at
// least dims coordinates at delay, coordinates past the end of z read as
// 0: the shared one when it fits, else a new one (kept when it covers the
// whole series). It answers nearestTie for any dimension up to dims —
// those answers do not depend on how the tree was built — and a vector j
// only takes part in searches of dimensions it has, so the padding never
// enters a distance.
func (r *Reconstruction) searchTree(z []float64, dims, delay int) *kdTree {
	whole := r != nil && len(z) == len(r.z)
	if whole && r.tree != nil && r.tree.dim >= dims && r.tdelay == delay {
		return r.tree
	}
	padded := make([]float64, len(z)+(dims-1)*delay)
	copy(padded, z)
	t := newDelayTree(padded, dims, delay, len(z)-delay, kdLeafSize)
	if whole {
		r.tree, r.tdelay = t, delay
	}
	return t
}

// projectionUseless reports whether the dimension search found the sorted
// projection not worth it in dimension d (false when unknown).
func (r *Reconstruction) projectionUseless(d int) bool {
	return r != nil && r.noProj[d]
}

// delayVectors returns the delay vectors of the chosen embedding (all of
// them, row-major).
func (r *Reconstruction) delayVectors() []float64 {
	if r.vectors == nil {
		r.vectors = delayVectors(r.z, r.emb.Dim, r.emb.Delay, 0)
	}
	return r.vectors
}
