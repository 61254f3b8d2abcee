package groups

import "errors"

// Sentinel errors. Callers tell cases apart with errors.Is; the returned
// errors wrap them with context (file, group, feature).
var (
	// ErrEmpty is returned by a statistic given an empty sample.
	ErrEmpty = errors.New("empty sample")
	// ErrNotFinite is returned by a statistic given a NaN or ±Inf value;
	// Compare drops such values as missing before it calls the statistics.
	ErrNotFinite = errors.New("non-finite value")
	// ErrShape is returned by Compare when a sample's Values do not match
	// the feature list, or the feature list is empty or has duplicates.
	ErrShape = errors.New("feature vector shape mismatch")
	// ErrTooFewGroups is returned by Compare when the samples form fewer
	// than two groups.
	ErrTooFewGroups = errors.New("need at least two groups")
	// ErrUnknownGroup is returned by Compare when Options.Reference or
	// Options.Groups names a group that has no samples, and by the plot
	// functions for an unknown feature or distribution name.
	ErrUnknownGroup = errors.New("unknown group")
	// ErrUnknownName is returned by the plot functions for a feature or
	// distribution name the result does not hold.
	ErrUnknownName = errors.New("unknown feature or distribution")
	// ErrNothingToPlot is returned by a plot function when there is no
	// finite value to draw.
	ErrNothingToPlot = errors.New("nothing to plot")
)
