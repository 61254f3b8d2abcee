package classifier

import (
	"fmt"
	"math"
	"slices"
)

// Score summarises predictions on a set of rows.
type Score struct {
	Rows int `json:"rows"`
	// Accuracy is the fraction of rows whose most probable class is right.
	Accuracy float64 `json:"accuracy"`
	// Undetermined counts rows flagged undetermined; DeterminedAccuracy is
	// the accuracy over the others (0 if none).
	Undetermined       int     `json:"undetermined"`
	DeterminedAccuracy float64 `json:"determined_accuracy"`
	// ChaosNoiseRows counts the rows whose true class is chaotic or
	// stochastic; ChaosNoise is the fraction of them whose most probable
	// class is not the other of the two (chaos not taken for noise, noise
	// not taken for chaos). 0 when there are none.
	ChaosNoiseRows int     `json:"chaos_noise_rows"`
	ChaosNoise     float64 `json:"chaos_noise"`
}

// StratumScore is the Score of the rows sharing one label of a
// stratification (a reference family, a length range, an SNR range).
type StratumScore struct {
	Label string `json:"label"`
	// Classes are the true classes present, sorted.
	Classes []string `json:"classes"`
	Score
}

// Stratification assigns every row of a dataset a label, e.g. its length
// range; Order lists the labels in the order to report (labels not in
// Order follow, sorted).
type Stratification struct {
	Name   string   `json:"name"`
	Labels []string `json:"-"`
	Order  []string `json:"-"`
}

// Calibration measures how well the top-class probability matches the
// observed accuracy.
type Calibration struct {
	// Brier is the multi-class Brier score, the mean over rows of
	// Σ_c (p_c − [c is the true class])² (Brier, Mon. Weather Rev. 78
	// (1950) 1); 0 is perfect, 2 the worst.
	Brier float64 `json:"brier"`
	// ECE is the expected calibration error of the top-class probability
	// over equal-width bins: Σ_b (n_b/n)·|accuracy_b − confidence_b|
	// (Naeini, Cooper & Hauskrecht, AAAI 2015; Guo et al., ICML 2017).
	ECE float64 `json:"ece"`
	// Bins are the reliability diagram's bins.
	Bins []ReliabilityBin `json:"bins"`
}

// ReliabilityBin is one bin of a reliability diagram: the rows whose top
// probability lies in [Lo, Hi), their mean top probability and accuracy.
type ReliabilityBin struct {
	Lo         float64 `json:"lo"`
	Hi         float64 `json:"hi"`
	Rows       int     `json:"rows"`
	Confidence float64 `json:"confidence"`
	Accuracy   float64 `json:"accuracy"`
}

// Validation is a held-out evaluation broken down the ways a user needs it:
// overall, by stratum (family, length, SNR) and by calibration.
type Validation struct {
	// Method says how rows were held out, e.g. "leave-one-family-out".
	Method string `json:"method"`
	// Trees is the size of each held-out forest.
	Trees   int        `json:"trees"`
	Overall Score      `json:"overall"`
	Matrix  Evaluation `json:"matrix"`
	// Strata holds one breakdown per stratification, in the order given.
	Strata      []StrataScores `json:"strata"`
	Calibration Calibration    `json:"calibration"`
}

// StrataScores is the breakdown of one stratification.
type StrataScores struct {
	Name   string         `json:"name"`
	Scores []StratumScore `json:"scores"`
}

// CalibrationBins is the number of equal-width bins of the reliability
// diagram and the ECE (common practice: 10).
const CalibrationBins = 10

// Validate summarises the held-out predictions of cv (made on ds by
// CrossValidate) overall, per stratification, and by calibration.
func Validate(cv CVResult, ds Dataset, method string, strata ...Stratification) (Validation, error) {
	classes, y, err := ds.validate()
	if err != nil {
		return Validation{}, fmt.Errorf("validate: %w", err)
	}
	n := len(y)
	if len(cv.Predicted) != n || len(cv.Probabilities) != n || len(cv.Undetermined) != n {
		return Validation{}, fmt.Errorf("validate: cross-validation covers %d rows, dataset has %d: %w", len(cv.Predicted), n, ErrDataset)
	}
	all := make([]int, n)
	for i := range all {
		all[i] = i
	}
	v := Validation{Method: method, Trees: cv.Config.Trees, Matrix: cv.Evaluation}
	v.Overall = scoreRows(all, y, cv, classes)
	for _, st := range strata {
		if len(st.Labels) != n {
			return Validation{}, fmt.Errorf("validate: stratification %q labels %d rows, want %d: %w", st.Name, len(st.Labels), n, ErrDataset)
		}
		rows := map[string][]int{}
		for i, l := range st.Labels {
			rows[l] = append(rows[l], i)
		}
		var labels []string
		for _, l := range st.Order {
			if _, ok := rows[l]; ok && !slices.Contains(labels, l) {
				labels = append(labels, l)
			}
		}
		var rest []string
		for l := range rows {
			if !slices.Contains(labels, l) {
				rest = append(rest, l)
			}
		}
		slices.Sort(rest)
		labels = append(labels, rest...)
		out := StrataScores{Name: st.Name}
		for _, l := range labels {
			ss := StratumScore{Label: l, Score: scoreRows(rows[l], y, cv, classes)}
			for _, i := range rows[l] {
				if c := classes[y[i]]; !slices.Contains(ss.Classes, c) {
					ss.Classes = append(ss.Classes, c)
				}
			}
			slices.Sort(ss.Classes)
			out.Scores = append(out.Scores, ss)
		}
		v.Strata = append(v.Strata, out)
	}
	v.Calibration = Calibrate(cv.Probabilities, y, CalibrationBins)
	return v, nil
}

// scoreRows scores the held-out predictions of rows.
func scoreRows(rows []int, y []int, cv CVResult, classes []string) Score {
	chaotic := slices.Index(classes, "chaotic")
	stochastic := slices.Index(classes, "stochastic")
	var s Score
	var good, detN, detGood, cn, cnGood int
	for _, i := range rows {
		s.Rows++
		ok := cv.Predicted[i] == y[i]
		if ok {
			good++
		}
		if cv.Undetermined[i] {
			s.Undetermined++
		} else {
			detN++
			if ok {
				detGood++
			}
		}
		if chaotic >= 0 && stochastic >= 0 && (y[i] == chaotic || y[i] == stochastic) {
			cn++
			other := chaotic
			if y[i] == chaotic {
				other = stochastic
			}
			if cv.Predicted[i] != other {
				cnGood++
			}
		}
	}
	frac := func(a, b int) float64 {
		if b == 0 {
			return 0
		}
		return float64(a) / float64(b)
	}
	s.Accuracy, s.DeterminedAccuracy = frac(good, s.Rows), frac(detGood, detN)
	s.ChaosNoiseRows, s.ChaosNoise = cn, frac(cnGood, cn)
	return s
}

// Calibrate computes the Brier score, the expected calibration error and
// the reliability diagram (bins equal-width bins of the top-class
// probability) of the probability rows prob against the true class indices
// truth. A row's top class is its most probable (the first on a tie).
func Calibrate(prob [][]float64, truth []int, bins int) Calibration {
	var c Calibration
	if len(prob) == 0 || bins < 1 {
		return c
	}
	c.Bins = make([]ReliabilityBin, bins)
	for b := range c.Bins {
		c.Bins[b].Lo, c.Bins[b].Hi = float64(b)/float64(bins), float64(b+1)/float64(bins)
	}
	for i, p := range prob {
		top := argmax(p)
		for k, q := range p {
			t := 0.0
			if k == truth[i] {
				t = 1
			}
			c.Brier += (q - t) * (q - t)
		}
		b := min(int(p[top]*float64(bins)), bins-1)
		c.Bins[b].Rows++
		c.Bins[b].Confidence += p[top]
		if top == truth[i] {
			c.Bins[b].Accuracy++
		}
	}
	n := float64(len(prob))
	c.Brier /= n
	for b := range c.Bins {
		bn := &c.Bins[b]
		if bn.Rows == 0 {
			continue
		}
		c.ECE += math.Abs(bn.Accuracy-bn.Confidence) / n
		bn.Confidence /= float64(bn.Rows)
		bn.Accuracy /= float64(bn.Rows)
	}
	return c
}
