// Package features turns a trace into the named, ordered feature vector the
// classifier reads: visibility-graph metrics, classical nonlinear measures,
// scaling exponents, ordinal-pattern measures and the statistics of the
// increments. The estimators live in the sub-packages (visibility,
// nonlinear, scaling, ordinal, increments, surrogate); this package holds the
// catalogue (one entry per feature with its family, meaning and reference),
// the schema version and hash that tie a trained model to the catalogue, and
// Extract.
//
// Every feature is invariant to a change of units (x → a·x + b, a > 0): the
// series is standardised before any estimator sees it, and every estimator
// is itself scale-free. A feature that cannot be computed for a trace (too
// short for its fit, no credible scaling region, ...) is marked missing with
// the reason, never silently zero.
package features
