package classifier

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strconv"
)

// Prediction is the forest's answer for one feature vector.
type Prediction struct {
	// Class is the most probable class (also when Undetermined); Index is
	// its position in Model.Classes.
	Class string
	Index int
	// Probabilities[i] is the mean over trees of the leaf frequency of
	// Model.Classes[i]; they sum to 1.
	Probabilities []float64
	// Undetermined is set when the top probability is below
	// Config.MinProbability, when two classes tie for the top, or when a
	// feature is out of the training range; Reasons says which.
	Undetermined bool
	Reasons      []string
	// OutOfRange names the features outside the widened training range.
	// With a novelty index they are listed in Notes, not in Reasons: one
	// unusual feature does not make an otherwise clear vector undetermined.
	OutOfRange []string
	// Novelty is the vector's distance from the training set (nil for a
	// model without a novelty index); a percentile above its Limit makes
	// the prediction Undetermined.
	Novelty *Novelty
	// Notes are remarks that do not change the verdict (features outside
	// the training range when the novelty measure decides).
	Notes []string
	// Imputed names the features that were missing (NaN) and replaced by
	// their training median.
	Imputed []string
	// Features and Values are the model's feature names (shared with the
	// Model: do not modify) and the values used (after imputation).
	Features []string
	Values   []float64
	// Bias is the forest's prior for Class: the mean over trees of the
	// root frequency of Class. Contributions[j] is the mean over trees of
	// the changes in Class's frequency at the splits on feature j along the
	// path of x (Saabas contributions), so that
	// Bias + Σ_j Contributions[j] = Probabilities[Index].
	Bias          float64
	Contributions []float64
}

// Label returns UndeterminedLabel when p is Undetermined, else p.Class.
func (p Prediction) Label() string {
	if p.Undetermined {
		return UndeterminedLabel
	}
	return p.Class
}

// Driver is one feature's part in a decision.
type Driver struct {
	Feature      string
	Value        float64
	Contribution float64
}

// Drivers returns the k features with the largest absolute contribution to
// the predicted class's probability, largest first (ties by feature order);
// k ≤ 0 or k > p returns all features.
func (p Prediction) Drivers(k int) []Driver {
	idx := make([]int, len(p.Contributions))
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int {
		return cmp.Compare(math.Abs(p.Contributions[b]), math.Abs(p.Contributions[a]))
	})
	if k <= 0 || k > len(idx) {
		k = len(idx)
	}
	out := make([]Driver, k)
	for i := range out {
		j := idx[i]
		out[i] = Driver{Feature: p.Features[j], Value: p.Values[j], Contribution: p.Contributions[j]}
	}
	return out
}

// Predict classifies the feature vector x, given in the order of
// m.Features. NaN entries are imputed with the training medians. The
// probabilities are the mean of the trees' leaf class frequencies; see
// Prediction for the contributions and the Undetermined rules. Predict is
// safe for concurrent use.
func (m *Model) Predict(x []float64) (Prediction, error) {
	p, k := len(m.Features), len(m.Classes)
	if len(m.trees) == 0 {
		return Prediction{}, fmt.Errorf("predict: %w", ErrEmptyModel)
	}
	if len(x) != p {
		return Prediction{}, fmt.Errorf("predict: %d values for %d features: %w", len(x), p, ErrDimension)
	}
	pr := Prediction{Features: m.Features, Values: make([]float64, p), Probabilities: make([]float64, k)}
	for j, v := range x {
		if math.IsNaN(v) {
			v = m.Medians[j]
			pr.Imputed = append(pr.Imputed, m.Features[j])
		}
		pr.Values[j] = v
	}
	xv := pr.Values
	contrib := make([]float64, p*k) // [feature][class]
	bias := make([]float64, k)
	for ti := range m.trees {
		t := &m.trees[ti]
		for c := 0; c < k; c++ {
			bias[c] += t.value[c]
		}
		i := 0
		for t.nodes[i].feature >= 0 {
			nd := &t.nodes[i]
			next := int(nd.right)
			if xv[nd.feature] < nd.threshold {
				next = i + 1
			}
			f := int(nd.feature)
			for c := 0; c < k; c++ {
				contrib[f*k+c] += t.value[next*k+c] - t.value[i*k+c]
			}
			i = next
		}
		for c := 0; c < k; c++ {
			pr.Probabilities[c] += t.value[i*k+c]
		}
	}
	nt := float64(len(m.trees))
	for c := range pr.Probabilities {
		pr.Probabilities[c] /= nt
		bias[c] /= nt
	}
	top := argmax(pr.Probabilities)
	pr.Index, pr.Class, pr.Bias = top, m.Classes[top], bias[top]
	pr.Contributions = make([]float64, p)
	for j := range pr.Contributions {
		pr.Contributions[j] = contrib[j*k+top] / nt
	}

	if m.Config.MinProbability >= 0 && pr.Probabilities[top] < m.Config.MinProbability {
		pr.Undetermined = true
		pr.Reasons = append(pr.Reasons, fmt.Sprintf("top probability %.3g for %s is below %.3g",
			pr.Probabilities[top], pr.Class, m.Config.MinProbability))
	}
	for c, q := range pr.Probabilities {
		if c != top && q == pr.Probabilities[top] {
			pr.Undetermined = true
			pr.Reasons = append(pr.Reasons, fmt.Sprintf("%s and %s tie at probability %.3g", pr.Class, m.Classes[c], q))
			break
		}
	}
	if m.Config.RangeMargin >= 0 {
		for j, v := range xv {
			lo, hi, ok := m.allowedRange(j)
			if ok && !(v >= lo && v <= hi) {
				pr.OutOfRange = append(pr.OutOfRange, m.Features[j])
				msg := fmt.Sprintf("%s = %s is outside the training range [%s, %s]",
					m.Features[j], fmtNum(v), fmtNum(m.Min[j]), fmtNum(m.Max[j]))
				if m.novelty != nil {
					pr.Notes = append(pr.Notes, msg)
				} else {
					pr.Undetermined = true
					pr.Reasons = append(pr.Reasons, msg)
				}
			}
		}
	}
	if m.novelty != nil {
		nv := m.novelty.novelty(x, m.Classes, m.Config.NoveltyK, m.Config.NoveltyLimit, nil)
		pr.Novelty = &nv
		if nv.Percentile > nv.Limit {
			pr.Undetermined = true
			pr.Reasons = append(pr.Reasons, fmt.Sprintf("unlike the training set: %s, above the limit %.3g", nv, nv.Limit))
		}
	}
	return pr, nil
}

// allowedRange returns feature j's training range widened by
// RangeMargin·(max − min) on each side; ok is false for a feature that was
// constant in training (no split can use it, so it is not checked).
func (m *Model) allowedRange(j int) (lo, hi float64, ok bool) {
	span := m.Max[j] - m.Min[j]
	if !(span > 0) {
		return 0, 0, false
	}
	tol := m.Config.RangeMargin * span
	return m.Min[j] - tol, m.Max[j] + tol, true
}

func fmtNum(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }

// classify returns the top class index for the complete (imputed) vector x,
// using sum (length K) as scratch. It skips contributions and range checks.
func (m *Model) classify(x, sum []float64) int {
	k := len(m.Classes)
	clear(sum)
	for ti := range m.trees {
		t := &m.trees[ti]
		l := t.leaf(x) * k
		for c := 0; c < k; c++ {
			sum[c] += t.value[l+c]
		}
	}
	return argmax(sum)
}

// impute copies x into dst replacing NaN by the training medians.
func (m *Model) impute(dst, x []float64) {
	for j, v := range x {
		if math.IsNaN(v) {
			v = m.Medians[j]
		}
		dst[j] = v
	}
}

// Align reorders a feature vector given with its own names into the
// model's feature order. Model features absent from names are set to NaN
// (Predict imputes them) and listed in missing; names the model does not
// use are ignored. Duplicate names or mismatched lengths are an error.
func (m *Model) Align(names []string, values []float64) (x []float64, missing []string, err error) {
	if len(names) != len(values) {
		return nil, nil, fmt.Errorf("align: %d names for %d values: %w", len(names), len(values), ErrDimension)
	}
	pos := make(map[string]int, len(names))
	for i, name := range names {
		if _, dup := pos[name]; dup {
			return nil, nil, fmt.Errorf("align: feature %q given twice: %w", name, ErrDataset)
		}
		pos[name] = i
	}
	x = make([]float64, len(m.Features))
	for j, name := range m.Features {
		if i, ok := pos[name]; ok {
			x[j] = values[i]
		} else {
			x[j] = math.NaN()
			missing = append(missing, name)
		}
	}
	return x, missing, nil
}
