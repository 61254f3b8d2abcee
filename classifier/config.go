package classifier

import (
	"fmt"
	"math"
	"runtime"
)

// Defaults used when a Config field is left at its zero value.
const (
	DefaultTrees          = 200
	DefaultMinLeaf        = 1
	DefaultBins           = 64
	DefaultMinProbability = 0.5
	DefaultRangeMargin    = 0.05
	// MaxBins is the largest accepted Config.Bins.
	MaxBins = 4096
)

// Schema identifies the feature catalogue a model was trained on: the
// catalogue's version number and a hash of its ordered feature definitions.
// The classifier stores it and compares it (Model.CheckSchema); it does not
// interpret either field.
type Schema struct {
	Version int    `json:"version"`
	Hash    string `json:"hash"`
}

// Config holds the forest's settings. The zero value of every field means the
// documented default, so Config{Seed: 1} is a complete configuration.
type Config struct {
	// Trees is the number of trees (default 200).
	Trees int `json:"trees"`
	// MaxDepth limits the number of splits on any root-to-leaf path;
	// 0 means unlimited (grow until pure or MinLeaf stops it).
	MaxDepth int `json:"max_depth"`
	// MinLeaf is the smallest number of bootstrap rows a leaf may hold
	// (default 1). A split golearn proposes that leaves fewer rows on either
	// side is refused and the node becomes a leaf.
	MinLeaf int `json:"min_leaf"`
	// FeatureFraction is the fraction of the p features drawn at random at
	// every split; the count is max(1, round(FeatureFraction·p)).
	// Default sqrt(p)/p, i.e. round(√p) features (Breiman 2001).
	FeatureFraction float64 `json:"feature_fraction"`
	// Bins is the largest number of quantile bins per feature handed to
	// golearn (default 64, at most MaxBins). Features with fewer distinct
	// values keep one bin per value, i.e. lose nothing.
	Bins int `json:"bins"`
	// Seed drives every random choice (bootstrap rows, feature subsets).
	Seed uint64 `json:"seed"`
	// Workers is the number of goroutines growing trees (default
	// GOMAXPROCS). It never changes the result and is not stored.
	Workers int `json:"-"`
	// MinProbability: a prediction whose top probability is below it is
	// Undetermined (default 0.5; a negative value disables the rule).
	MinProbability float64 `json:"min_probability"`
	// RangeMargin widens each feature's training range [min, max] by
	// RangeMargin·(max − min) on both sides; inputs outside are out of
	// range. With a novelty index (see NoveltyLimit) that is a note on the
	// prediction; without one (models of format version 1) it makes the
	// prediction Undetermined (default 0.05; a negative value disables the
	// check).
	RangeMargin float64 `json:"range_margin"`
	// Schema is the feature catalogue's identity, stored in the model.
	Schema Schema `json:"schema"`
	// NoveltyK is the number of nearest training series the novelty
	// measure averages (default DefaultNoveltyK); see Novelty.
	NoveltyK int `json:"novelty_k,omitempty"`
	// NoveltyLimit is the novelty percentile above which a prediction is
	// Undetermined as unlike anything in training (default
	// DefaultNoveltyLimit; a negative value builds no novelty index, and
	// the model falls back to the per-feature range check).
	NoveltyLimit float64 `json:"novelty_limit,omitempty"`
}

// resolve returns cfg with defaults filled in for p features, or an error
// naming the first invalid field.
func (cfg Config) resolve(p int) (Config, error) {
	c := cfg
	if c.Trees == 0 {
		c.Trees = DefaultTrees
	}
	if c.Trees < 0 {
		return c, fmt.Errorf("config: Trees = %d, want > 0: %w", c.Trees, ErrConfig)
	}
	if c.MaxDepth < 0 {
		return c, fmt.Errorf("config: MaxDepth = %d, want >= 0 (0 = unlimited): %w", c.MaxDepth, ErrConfig)
	}
	if c.MinLeaf == 0 {
		c.MinLeaf = DefaultMinLeaf
	}
	if c.MinLeaf < 0 {
		return c, fmt.Errorf("config: MinLeaf = %d, want > 0: %w", c.MinLeaf, ErrConfig)
	}
	if c.FeatureFraction == 0 && p > 0 {
		c.FeatureFraction = math.Sqrt(float64(p)) / float64(p)
	}
	if !(c.FeatureFraction > 0 && c.FeatureFraction <= 1) {
		return c, fmt.Errorf("config: FeatureFraction = %g, want in (0, 1]: %w", c.FeatureFraction, ErrConfig)
	}
	if c.Bins == 0 {
		c.Bins = DefaultBins
	}
	if c.Bins < 2 || c.Bins > MaxBins {
		return c, fmt.Errorf("config: Bins = %d, want in [2, %d]: %w", c.Bins, MaxBins, ErrConfig)
	}
	if c.Workers <= 0 {
		c.Workers = runtime.GOMAXPROCS(0)
	}
	if c.MinProbability == 0 {
		c.MinProbability = DefaultMinProbability
	}
	if math.IsNaN(c.MinProbability) || c.MinProbability > 1 {
		return c, fmt.Errorf("config: MinProbability = %g, want <= 1: %w", c.MinProbability, ErrConfig)
	}
	if c.RangeMargin == 0 {
		c.RangeMargin = DefaultRangeMargin
	}
	if math.IsNaN(c.RangeMargin) || math.IsInf(c.RangeMargin, 0) {
		return c, fmt.Errorf("config: RangeMargin = %g, want finite: %w", c.RangeMargin, ErrConfig)
	}
	if c.NoveltyK == 0 {
		c.NoveltyK = DefaultNoveltyK
	}
	if c.NoveltyK < 0 {
		return c, fmt.Errorf("config: NoveltyK = %d, want > 0: %w", c.NoveltyK, ErrConfig)
	}
	if c.NoveltyLimit == 0 {
		c.NoveltyLimit = DefaultNoveltyLimit
	}
	if math.IsNaN(c.NoveltyLimit) || c.NoveltyLimit > 1 {
		return c, fmt.Errorf("config: NoveltyLimit = %g, want <= 1: %w", c.NoveltyLimit, ErrConfig)
	}
	return c, nil
}

// featuresPerSplit is the number of candidate features drawn at each split.
func (cfg Config) featuresPerSplit(p int) int {
	m := int(math.Round(cfg.FeatureFraction * float64(p)))
	if m < 1 {
		m = 1
	}
	if m > p {
		m = p
	}
	return m
}
