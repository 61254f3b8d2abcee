package benchmarks

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/generators"
)

// PlanSeedOffset is added to Options.Seed to make the classification plan
// seed: the reference model is trained on plan seed 1, so the benchmark's
// series (plan seed 1000 + S) are fresh draws of parameters, initial
// conditions and noise.
const PlanSeedOffset = 1000

// ClassificationResult is the accuracy of a model on fresh reference
// series versus length and observational noise.
type ClassificationResult struct {
	// PlanSeed seeds classifier.ReferencePlan; FeatureSeed the feature
	// extraction. PerClass is the plan's count per class for each length.
	PlanSeed    uint64 `json:"plan_seed"`
	FeatureSeed uint64 `json:"feature_seed"`
	PerClass    int    `json:"per_class"`
	// Design says how the series were drawn.
	Design string `json:"design"`
	// Lengths and SNRs (dB, null = no added noise) span the grid; SNRLabels
	// name the SNRs for people. Classes orders every per-class array.
	Lengths   []int    `json:"lengths"`
	SNRs      []Float  `json:"snr_db"`
	SNRLabels []string `json:"snr_labels"`
	Classes   []string `json:"classes"`
	// Overall pools every series; Cells holds each (length, SNR) pair,
	// length-major; ByLength pools the SNRs at each length, BySNR the
	// lengths at each SNR.
	Overall  Score          `json:"overall"`
	Cells    []Cell         `json:"cells"`
	ByLength []Score        `json:"by_length"`
	BySNR    []Score        `json:"by_snr"`
	Systems  []SystemScore  `json:"systems"`
	Series   []SeriesResult `json:"series"`
	// Dropped counts series whose orbit escaped or came out constant (as
	// classifier.BuildReference drops them); Failures lists other errors.
	Dropped  int      `json:"dropped"`
	Failures []string `json:"failures,omitempty"`
}

// Score summarises the verdicts on a set of series. Accuracy counts the
// model's most probable class (also for undetermined verdicts, as
// classifier.Evaluation does); DeterminedAccuracy counts only the series
// not flagged undetermined.
type Score struct {
	Series             int   `json:"series"`
	Correct            int   `json:"correct"`
	Accuracy           Float `json:"accuracy"`
	Undetermined       int   `json:"undetermined"`
	UndeterminedRate   Float `json:"undetermined_rate"`
	DeterminedAccuracy Float `json:"determined_accuracy"`
	// ChaosNoise is the chaotic-versus-stochastic accuracy: among the
	// ChaosNoiseSeries series whose true class is chaotic or stochastic,
	// the fraction whose top class is not the other one of the two.
	ChaosNoise       Float `json:"chaos_noise_accuracy"`
	ChaosNoiseSeries int   `json:"chaos_noise_series"`
	// Recall[i] is the accuracy on series of class Classes[i] (null when
	// there are none); Precision[j] the fraction of top-class-j verdicts
	// that are right (null when j is never the top class).
	Recall    []Float `json:"recall"`
	Precision []Float `json:"precision"`
	// Confusion[i][j] counts series of true class i whose top class is j;
	// UndeterminedByClass[i] counts the undetermined ones among class i.
	Confusion           [][]int `json:"confusion"`
	UndeterminedByClass []int   `json:"undetermined_by_class"`
}

// Cell is the Score of one (length, SNR) pair.
type Cell struct {
	Length   int    `json:"length"`
	SNR      Float  `json:"snr_db"`
	SNRLabel string `json:"snr_label"`
	Score
}

// SystemScore is one reference system's record over the whole grid.
type SystemScore struct {
	System string `json:"system"`
	// Labels are the true classes its series carried (a map drawn in a
	// periodic window is labelled regular).
	Labels       []string `json:"labels"`
	Series       int      `json:"series"`
	Accuracy     Float    `json:"accuracy"`
	Undetermined int      `json:"undetermined"`
	// Predicted[j] counts series whose top class was Classes[j].
	Predicted []int `json:"predicted"`
	// ByLength and BySNR are the accuracies at each length (pooled over
	// SNRs) and each SNR (pooled over lengths); null where it had none.
	ByLength []Float `json:"by_length"`
	BySNR    []Float `json:"by_snr"`
}

// SeriesResult is the verdict on one series.
type SeriesResult struct {
	System  string             `json:"system"`
	Params  map[string]float64 `json:"params"`
	N       int                `json:"n"`
	SNR     Float              `json:"snr_db"`
	Seed    uint64             `json:"seed"`
	Class   string             `json:"class"`
	Top     string             `json:"top"`
	Verdict string             `json:"verdict"`
	// Probability is the top class's probability.
	Probability Float `json:"probability"`
	Windows     int   `json:"windows"`
}

func snrLabel(s float64) string {
	if math.IsInf(s, 1) {
		return "clean"
	}
	return strconvG(s) + " dB"
}

// runClassification screens every planned series at every SNR.
func runClassification(m *classifier.Model, o Options) (*ClassificationResult, error) {
	classes := slices.Clone(classifier.Classes)
	res := &ClassificationResult{
		PlanSeed:    PlanSeedOffset + o.Seed,
		FeatureSeed: o.Seed,
		PerClass:    o.PerClass,
		Lengths:     slices.Clone(o.Lengths),
		Classes:     classes,
		Design: fmt.Sprintf("classifier.ReferencePlan with seed %d, PerClass %d and MinLength = MaxLength = L for each length L (the same parameter draws and series seeds at every length); "+
			"each planned series is recorded clean and with white measurement noise at every SNR (its own noise realisation on the same clean series; none of the reference set's other recording artefacts) and screened with classifier.Screen (feature seed %d)",
			PlanSeedOffset+o.Seed, o.PerClass, o.Seed),
	}
	for _, s := range o.SNRs {
		res.SNRs = append(res.SNRs, Float(s))
		res.SNRLabels = append(res.SNRLabels, snrLabel(s))
	}
	type job struct {
		length, snr int
		series      classifier.ReferenceSeries
	}
	var jobs []job
	for li, l := range o.Lengths {
		p, err := classifier.ReferencePlan(classifier.ReferenceOptions{
			PerClass: o.PerClass, MinLength: l, MaxLength: l, Systems: o.Systems, Seed: PlanSeedOffset + o.Seed,
		})
		if err != nil {
			return nil, fmt.Errorf("classification plan at n=%d: %w", l, err)
		}
		for si, snr := range o.SNRs {
			for _, s := range p {
				// The grid measures one artefact at a time: white
				// measurement noise at the cell's SNR, nothing else.
				s.Recording = generators.Recording{}
				if !math.IsInf(snr, 1) {
					s.Recording = generators.Recording{Noise: generators.NoiseWhite, SNR: snr}
				}
				jobs = append(jobs, job{li, si, s})
			}
		}
	}
	verdicts := make([]classifier.Verdict, len(jobs))
	errs := make([]error, len(jobs))
	sopts := classifier.ScreenOptions{Features: features.Options{Seed: o.Seed, Sequential: true}}
	forEach(len(jobs), o.Workers, "classification", o.Progress, func(k int) {
		s := jobs[k].series
		x, err := s.Generate()
		if err == nil {
			verdicts[k], err = classifier.Screen(m, x, sopts)
		}
		errs[k] = err
	})

	nl, ns, nc := len(o.Lengths), len(o.SNRs), len(classes)
	cells := make([]*tally, nl*ns)
	byLen := make([]*tally, nl)
	bySNR := make([]*tally, ns)
	overall := newTally(nc)
	for i := range cells {
		cells[i] = newTally(nc)
	}
	for i := range byLen {
		byLen[i] = newTally(nc)
	}
	for i := range bySNR {
		bySNR[i] = newTally(nc)
	}
	type sysAcc struct {
		labels         []string
		n, good, undet int
		pred           []int
		lenN, lenGood  []int
		snrN, snrGood  []int
	}
	systems := map[string]*sysAcc{}
	var sysOrder []string
	for k, j := range jobs {
		s := j.series
		if err := errs[k]; err != nil {
			if errors.Is(err, generators.ErrDiverged) || errors.Is(err, generators.ErrConstant) || errors.Is(err, features.ErrConstant) || errors.Is(err, classifier.ErrFewCycles) {
				res.Dropped++
				continue
			}
			res.Failures = append(res.Failures, fmt.Sprintf("%s n=%d %s seed %d: %v", s.System, s.N, snrLabel(s.SNR()), s.Seed, err))
			continue
		}
		v := verdicts[k]
		ti := slices.Index(classes, s.Class)
		pj := slices.Index(classes, v.Top)
		if ti < 0 || pj < 0 {
			res.Failures = append(res.Failures, fmt.Sprintf("%s n=%d: class %q or verdict %q outside %v", s.System, s.N, s.Class, v.Top, classes))
			continue
		}
		undet := v.Class == classifier.UndeterminedLabel
		for _, t := range []*tally{overall, cells[j.length*ns+j.snr], byLen[j.length], bySNR[j.snr]} {
			t.add(ti, pj, undet)
		}
		a := systems[s.System]
		if a == nil {
			a = &sysAcc{pred: make([]int, nc), lenN: make([]int, nl), lenGood: make([]int, nl), snrN: make([]int, ns), snrGood: make([]int, ns)}
			systems[s.System] = a
			sysOrder = append(sysOrder, s.System)
		}
		if !slices.Contains(a.labels, s.Class) {
			a.labels = append(a.labels, s.Class)
		}
		a.n++
		a.pred[pj]++
		a.lenN[j.length]++
		a.snrN[j.snr]++
		if ti == pj {
			a.good++
			a.lenGood[j.length]++
			a.snrGood[j.snr]++
		}
		if undet {
			a.undet++
		}
		top := 0.0
		for i, c := range v.Classes {
			if c == v.Top {
				top = v.Probabilities[i]
			}
		}
		res.Series = append(res.Series, SeriesResult{
			System: s.System, Params: s.Params, N: s.N, SNR: Float(s.SNR()), Seed: s.Seed, Class: s.Class,
			Top: v.Top, Verdict: v.Class, Probability: Float(top), Windows: v.Windows,
		})
	}
	if len(res.Series) == 0 {
		msg := "no series could be screened"
		if len(res.Failures) > 0 {
			msg += ": " + res.Failures[0]
		}
		return nil, errors.New(msg)
	}
	res.Overall = overall.score()
	for li, l := range o.Lengths {
		res.ByLength = append(res.ByLength, byLen[li].score())
		for si, snr := range o.SNRs {
			res.Cells = append(res.Cells, Cell{Length: l, SNR: Float(snr), SNRLabel: snrLabel(snr), Score: cells[li*ns+si].score()})
		}
	}
	for si := range o.SNRs {
		res.BySNR = append(res.BySNR, bySNR[si].score())
	}
	for _, name := range sysOrder {
		a := systems[name]
		ss := SystemScore{System: name, Labels: a.labels, Series: a.n, Accuracy: ratio(a.good, a.n), Undetermined: a.undet, Predicted: a.pred}
		for li := range o.Lengths {
			ss.ByLength = append(ss.ByLength, ratio(a.lenGood[li], a.lenN[li]))
		}
		for si := range o.SNRs {
			ss.BySNR = append(ss.BySNR, ratio(a.snrGood[si], a.snrN[si]))
		}
		res.Systems = append(res.Systems, ss)
	}
	return res, nil
}

// ratio returns a/b, NaN when b is 0.
func ratio(a, b int) Float {
	if b == 0 {
		return Float(math.NaN())
	}
	return Float(float64(a) / float64(b))
}

// tally accumulates verdicts into a Score.
type tally struct {
	conf          [][]int
	undet         []int
	detN, detGood int
}

func newTally(k int) *tally {
	t := &tally{conf: make([][]int, k), undet: make([]int, k)}
	for i := range t.conf {
		t.conf[i] = make([]int, k)
	}
	return t
}

func (t *tally) add(truth, top int, undetermined bool) {
	t.conf[truth][top]++
	if undetermined {
		t.undet[truth]++
		return
	}
	t.detN++
	if truth == top {
		t.detGood++
	}
}

// Index of the chaotic and stochastic classes in classifier.Classes.
var (
	chaoticIdx    = slices.Index(classifier.Classes, string(generators.Chaotic))
	stochasticIdx = slices.Index(classifier.Classes, string(generators.Stochastic))
)

func (t *tally) score() Score {
	k := len(t.conf)
	s := Score{Confusion: t.conf, UndeterminedByClass: t.undet}
	for i := 0; i < k; i++ {
		row := 0
		for j := 0; j < k; j++ {
			row += t.conf[i][j]
		}
		s.Series += row
		s.Correct += t.conf[i][i]
		s.Recall = append(s.Recall, ratio(t.conf[i][i], row))
		s.Undetermined += t.undet[i]
	}
	for j := 0; j < k; j++ {
		col := 0
		for i := 0; i < k; i++ {
			col += t.conf[i][j]
		}
		s.Precision = append(s.Precision, ratio(t.conf[j][j], col))
	}
	s.Accuracy = ratio(s.Correct, s.Series)
	s.UndeterminedRate = ratio(s.Undetermined, s.Series)
	s.DeterminedAccuracy = ratio(t.detGood, t.detN)
	if chaoticIdx >= 0 && stochasticIdx >= 0 {
		c, st := chaoticIdx, stochasticIdx
		total := 0
		for j := 0; j < k; j++ {
			total += t.conf[c][j] + t.conf[st][j]
		}
		s.ChaosNoiseSeries = total
		s.ChaosNoise = ratio(total-t.conf[c][st]-t.conf[st][c], total)
	}
	return s
}
