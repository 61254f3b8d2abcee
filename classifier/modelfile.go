package classifier

import (
	"bytes"
	"crypto/sha256"
	"encoding/binary"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"slices"

	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/internal/atomicfile"

	"github.com/tracesift/tracesift/internal/echo"
)

// Model file layout (all integers little-endian or unsigned varints as
// produced by encoding/binary.AppendUvarint):
//
//	magic      8 bytes  "TSFOREST"
//	version    uint16   FormatVersion
//	header     uvarint length, then a JSON document: the Model's exported
//	           fields (features, classes, config with seed and schema,
//	           learner, training description and class counts, medians,
//	           ranges, out-of-bag and cross-validation figures)
//	trees      uvarint tree count; per tree a uvarint node count and the
//	           nodes in pre-order: uvarint tag, 0 for a leaf followed by K
//	           uvarint class counts, or feature index + 1 for a split
//	           followed by its threshold as 8 bytes of IEEE-754 bits; the
//	           left child is the next node, the right child follows the
//	           left subtree, and a split's class counts are the sums of its
//	           children's
//	novelty    (version 2, present when the header's config has a
//	           non-negative novelty_limit) uvarint rows n and features p;
//	           p·65 feature quantile knots as 8-byte IEEE-754 bits; n·p
//	           percentile codes, one byte each (255 = missing); uvarint
//	           group count, then each group name as uvarint length and
//	           bytes; per row a uvarint group index and a class byte; n
//	           sorted reference distances as 4-byte IEEE-754 bits
//	checksum   32 bytes SHA-256 of everything before it
//
// The same model always gives the same bytes: JSON fields come from
// structs and slices (no maps), floats are written in their shortest
// exact form, and nothing depends on time or the machine.
const (
	// FormatVersion is the model file version this build writes; it reads
	// this and every earlier version (version 1 has no novelty section).
	FormatVersion = 2
	magic         = "TSFOREST"
	checksumLen   = sha256.Size
)

// Write writes m in the model file format. The output is identical byte for
// byte for identical models.
func (m *Model) Write(w io.Writer) error {
	if len(m.trees) == 0 || len(m.trees) != m.Config.Trees {
		return fmt.Errorf("write model: %d trees, config says %d: %w", len(m.trees), m.Config.Trees, ErrEmptyModel)
	}
	if err := m.checkFinite(); err != nil {
		return fmt.Errorf("write model: %w", err)
	}
	hdr, err := json.Marshal(m)
	if err != nil {
		return fmt.Errorf("write model: header: %w", err)
	}
	k := len(m.Classes)
	b := make([]byte, 0, len(hdr)+64+m.NumNodes()*10)
	b = append(b, magic...)
	b = binary.LittleEndian.AppendUint16(b, FormatVersion)
	b = binary.AppendUvarint(b, uint64(len(hdr)))
	b = append(b, hdr...)
	b = binary.AppendUvarint(b, uint64(len(m.trees)))
	for ti := range m.trees {
		t := &m.trees[ti]
		b = binary.AppendUvarint(b, uint64(len(t.nodes)))
		for i, nd := range t.nodes {
			if nd.feature < 0 {
				b = append(b, 0)
				for c := 0; c < k; c++ {
					b = binary.AppendUvarint(b, uint64(t.count[i*k+c]))
				}
				continue
			}
			b = binary.AppendUvarint(b, uint64(nd.feature)+1)
			b = binary.LittleEndian.AppendUint64(b, math.Float64bits(nd.threshold))
		}
	}
	if m.novelty != nil {
		b = m.novelty.appendTo(b)
	}
	sum := sha256.Sum256(b)
	b = append(b, sum[:]...)
	if _, err := w.Write(b); err != nil {
		return fmt.Errorf("write model: %w", err)
	}
	return nil
}

// checkFinite rejects NaN or ±Inf in the header fields (JSON cannot hold
// them, and a model with them is broken).
func (m *Model) checkFinite() error {
	bad := func(name string, v ...float64) error {
		for _, x := range v {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				return fmt.Errorf("%s holds %v", name, x)
			}
		}
		return nil
	}
	for _, e := range []error{
		bad("medians", m.Medians...), bad("min", m.Min...), bad("max", m.Max...),
		bad("config", m.Config.FeatureFraction, m.Config.MinProbability, m.Config.RangeMargin),
		bad("oob", m.OOB.Accuracy), bad("novelty config", m.Config.NoveltyLimit),
	} {
		if e != nil {
			return e
		}
	}
	if v := m.Validation; v != nil {
		vals := []float64{v.Overall.Accuracy, v.Overall.ChaosNoise, v.Overall.DeterminedAccuracy, v.Calibration.Brier, v.Calibration.ECE}
		for _, st := range v.Strata {
			for _, sc := range st.Scores {
				vals = append(vals, sc.Accuracy, sc.ChaosNoise, sc.DeterminedAccuracy)
			}
		}
		for _, b := range v.Calibration.Bins {
			vals = append(vals, b.Lo, b.Hi, b.Confidence, b.Accuracy)
		}
		vals = append(vals, v.Matrix.Accuracy, v.Matrix.DeterminedAccuracy)
		vals = append(vals, v.Matrix.Precision...)
		vals = append(vals, v.Matrix.Recall...)
		vals = append(vals, v.Matrix.F1...)
		if e := bad("validation", vals...); e != nil {
			return e
		}
	}
	if m.CV != nil {
		cv := m.CV
		for _, v := range [][]float64{{cv.Accuracy, cv.DeterminedAccuracy, cv.Config.FeatureFraction,
			cv.Config.MinProbability, cv.Config.RangeMargin}, cv.Precision, cv.Recall, cv.F1, cv.FoldAccuracy} {
			if e := bad("cv", v...); e != nil {
				return e
			}
		}
	}
	return nil
}

// Save writes m to path atomically (a temporary file in the same directory
// renamed into place), so path is never left half-written.
func (m *Model) Save(path string) error {
	if err := atomicfile.Write(path, m.Write); err != nil {
		return fmt.Errorf("model %s: %w", path, err)
	}
	return nil
}

// Load reads the model file at path; errors name the file. The model's
// Source is set to path.
func Load(path string) (*Model, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("model %s: %w", path, err)
	}
	defer f.Close()
	m, err := Read(f)
	if err != nil {
		return nil, fmt.Errorf("model %s: %w", path, err)
	}
	m.Source = path
	return m, nil
}

// Read parses a model file. It fails with ErrBadMagic for a file that is
// not a model, ErrNewerFormat for a version above FormatVersion, and
// ErrCorrupt for a truncated or damaged file (checksum or structure).
func Read(r io.Reader) (*Model, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, fmt.Errorf("read model: %w", err)
	}
	return parse(data)
}

func corrupt(format string, a ...any) error {
	return fmt.Errorf("%s: %w", fmt.Sprintf(format, a...), ErrCorrupt)
}

func parse(data []byte) (*Model, error) {
	if len(data) == 0 {
		return nil, corrupt("empty file")
	}
	if len(data) < len(magic) {
		if bytes.HasPrefix([]byte(magic), data) {
			return nil, corrupt("truncated after %d bytes", len(data))
		}
		return nil, ErrBadMagic
	}
	if string(data[:len(magic)]) != magic {
		return nil, ErrBadMagic
	}
	if len(data) < len(magic)+2 {
		return nil, corrupt("truncated after %d bytes", len(data))
	}
	version := binary.LittleEndian.Uint16(data[len(magic):])
	if version > FormatVersion {
		return nil, fmt.Errorf("format version %d, this build reads up to %d: %w", version, FormatVersion, ErrNewerFormat)
	}
	if version == 0 {
		return nil, corrupt("format version 0")
	}
	if len(data) < len(magic)+2+checksumLen {
		return nil, corrupt("truncated after %d bytes", len(data))
	}
	body, tail := data[:len(data)-checksumLen], data[len(data)-checksumLen:]
	if sum := sha256.Sum256(body); !bytes.Equal(sum[:], tail) {
		return nil, corrupt("checksum mismatch (%d bytes)", len(data))
	}
	rd := &byteReader{b: body, off: len(magic) + 2}
	hlen, err := rd.uvarint()
	if err != nil {
		return nil, err
	}
	hdr, err := rd.bytes(hlen)
	if err != nil {
		return nil, err
	}
	m := &Model{}
	dec := json.NewDecoder(bytes.NewReader(hdr))
	dec.DisallowUnknownFields()
	if err := dec.Decode(m); err != nil {
		return nil, corrupt("header: %v", err)
	}
	if dec.InputOffset() != int64(len(hdr)) {
		return nil, corrupt("header: trailing data")
	}
	if err := m.checkHeader(); err != nil {
		return nil, err
	}
	nt, err := rd.uvarint()
	if err != nil {
		return nil, err
	}
	if nt == 0 || nt != uint64(m.Config.Trees) || nt > uint64(len(body)-rd.off) {
		return nil, corrupt("%d trees, header says %d", nt, m.Config.Trees)
	}
	m.trees = make([]tree, nt)
	for t := range m.trees {
		if err := rd.tree(&m.trees[t], len(m.Features), len(m.Classes)); err != nil {
			if errors.Is(err, ErrCorrupt) {
				return nil, fmt.Errorf("tree %d: %w", t, err)
			}
			return nil, corrupt("tree %d: %v", t, err)
		}
	}
	if version >= 2 && m.Config.NoveltyLimit >= 0 {
		ix, err := rd.novelty(len(m.Features), len(m.Classes))
		if err != nil {
			return nil, fmt.Errorf("novelty index: %w", err)
		}
		m.novelty = ix
	}
	if rd.off != len(body) {
		return nil, corrupt("%d unexpected bytes after the trees", len(body)-rd.off)
	}
	return m, nil
}

// checkHeader validates the decoded header fields.
func (m *Model) checkHeader() error {
	p, k := len(m.Features), len(m.Classes)
	if p == 0 {
		return corrupt("no features")
	}
	if err := (Dataset{Features: m.Features}).checkShape(); err != nil {
		return corrupt("features: %v", err)
	}
	if k < 2 || !slices.IsSorted(m.Classes) || len(slices.Compact(slices.Clone(m.Classes))) != k {
		return corrupt("class list %q must hold at least 2 sorted distinct names", m.Classes)
	}
	if len(m.Medians) != p || len(m.Min) != p || len(m.Max) != p || len(m.Training.ClassCounts) != k {
		return corrupt("header vectors do not match %d features and %d classes", p, k)
	}
	for j := 0; j < p; j++ {
		if !(m.Min[j] <= m.Max[j]) {
			return corrupt("feature %q range [%g, %g]", m.Features[j], m.Min[j], m.Max[j])
		}
	}
	c, err := m.Config.resolve(p)
	if err != nil || c.Trees != m.Config.Trees || c.MinLeaf != m.Config.MinLeaf || c.Bins != m.Config.Bins {
		return corrupt("configuration is incomplete or invalid")
	}
	return nil
}

// byteReader decodes the binary sections.
type byteReader struct {
	b   []byte
	off int
}

func (r *byteReader) uvarint() (uint64, error) {
	v, n := binary.Uvarint(r.b[r.off:])
	if n <= 0 {
		return 0, corrupt("bad varint at byte %d", r.off)
	}
	r.off += n
	return v, nil
}

func (r *byteReader) bytes(n uint64) ([]byte, error) {
	if n > uint64(len(r.b)-r.off) {
		return nil, corrupt("section of %d bytes at byte %d overruns the file", n, r.off)
	}
	s := r.b[r.off : r.off+int(n)]
	r.off += int(n)
	return s, nil
}

// tree decodes one pre-order node list into t, rebuilding right-child
// indices with a stack of splits still waiting for their right child, and
// the splits' class counts as sums of their children's.
func (r *byteReader) tree(t *tree, p, k int) error {
	nn, err := r.uvarint()
	if err != nil {
		return err
	}
	// A tree of nn nodes has (nn+1)/2 leaves of at least 1+k bytes each.
	if nn == 0 || nn > uint64(len(r.b)-r.off) || (nn+1)/2*uint64(1+k) > uint64(len(r.b)-r.off) {
		return fmt.Errorf("node count %d does not fit the file", nn)
	}
	n := int(nn)
	t.nodes = make([]node, n)
	t.count = make([]uint32, n*k)
	var pending []int32
	prevLeaf := false
	for i := 0; i < n; i++ {
		if i > 0 && prevLeaf {
			if len(pending) == 0 {
				return fmt.Errorf("node %d has no parent", i)
			}
			parent := pending[len(pending)-1]
			pending = pending[:len(pending)-1]
			t.nodes[parent].right = int32(i)
		}
		tag, err := r.uvarint()
		if err != nil {
			return err
		}
		if tag == 0 {
			t.nodes[i].feature = -1
			var sum uint64
			for c := 0; c < k; c++ {
				v, err := r.uvarint()
				if err != nil {
					return err
				}
				if v > math.MaxUint32 {
					return fmt.Errorf("node %d: class count %d too large", i, v)
				}
				t.count[i*k+c] = uint32(v)
				sum += v
			}
			if sum == 0 {
				return fmt.Errorf("leaf %d holds no rows", i)
			}
			prevLeaf = true
			continue
		}
		if tag > uint64(p) {
			return fmt.Errorf("node %d splits on feature %d of %d", i, tag-1, p)
		}
		thr, err := r.bytes(8)
		if err != nil {
			return err
		}
		v := math.Float64frombits(binary.LittleEndian.Uint64(thr))
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("node %d threshold %v", i, v)
		}
		t.nodes[i] = node{feature: int32(tag - 1), threshold: v}
		pending = append(pending, int32(i))
		prevLeaf = false
	}
	if len(pending) != 0 || !prevLeaf {
		return fmt.Errorf("node list ends inside the tree")
	}
	for i := n - 1; i >= 0; i-- {
		nd := t.nodes[i]
		if nd.feature < 0 {
			continue
		}
		for c := 0; c < k; c++ {
			s := uint64(t.count[(i+1)*k+c]) + uint64(t.count[int(nd.right)*k+c])
			if s > math.MaxUint32 {
				return fmt.Errorf("node %d: class count overflow", i)
			}
			t.count[i*k+c] = uint32(s)
		}
	}
	t.fillValues(k)
	return nil
}

// CheckSchema returns an error wrapping ErrSchemaMismatch, naming the model
// file, unless the model was trained on the feature schema want. When want
// is the schema of this program's feature catalogue (features.SchemaVersion
// and features.SchemaHash), every feature the model names must also be one
// the catalogue computes: a header can carry the right schema and checksum
// and still name another feature (a model made by another build, or
// edited), and prediction would then replace that feature by its training
// median on every trace. Features the model dropped (Training.Dropped) are
// not asked for and need not be computable.
func (m *Model) CheckSchema(want Schema) error {
	got := m.Config.Schema
	src := m.Source
	if src == "" {
		src = "(in memory)"
	}
	if got != want {
		return fmt.Errorf("model %s: trained on feature schema v%d (hash %q) but this program computes v%d (hash %q); retrain the model: %w",
			src, got.Version, got.Hash, want.Version, want.Hash, ErrSchemaMismatch)
	}
	if want == (Schema{Version: features.SchemaVersion, Hash: features.SchemaHash()}) {
		return m.checkFeatures(src, features.Names())
	}
	return nil
}

// checkFeatures fails with ErrSchemaMismatch when the model names a feature
// that is not among known, naming the first such feature.
func (m *Model) checkFeatures(src string, known []string) error {
	for _, f := range m.Features {
		if !slices.Contains(known, f) {
			return schemaError(fmt.Sprintf("model %s: names feature %s that this tracesift does not compute (model made by a different version?)", src, echo.Quote(f)))
		}
	}
	return nil
}

// schemaError is a schema mismatch whose message says it all; it matches
// ErrSchemaMismatch under errors.Is.
type schemaError string

func (e schemaError) Error() string { return string(e) }
func (e schemaError) Unwrap() error { return ErrSchemaMismatch }
