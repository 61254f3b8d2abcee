// Package classifier is tracesift's reproducible tree-ensemble classifier:
// a random forest whose splits are chosen by golearn's CART learner, with the
// seeds, the votes, the model file and the explanations under the project's
// control.
//
// # Training
//
// Train grows Config.Trees trees. Tree t draws its own random numbers from a
// PCG generator seeded by (Config.Seed, t), so its shape depends only on the
// data, the configuration and t — never on which goroutine grew it or on
// GOMAXPROCS. For each tree it draws a bootstrap sample of the rows (n draws
// with replacement; Breiman, Machine Learning 45 (2001) 5) and grows the tree
// top-down. At every node a fresh random subset of FeatureFraction·p features
// is drawn (features constant on the node's rows are skipped), the node's rows
// restricted to those features are put in a golearn DenseInstances grid and
// golearn's CART classifier (trees.NewDecisionTreeClassifier, Gini impurity,
// depth 1) picks the split. The fitted golearn node is then converted into the
// package's own compact node (feature index, threshold, children, class
// counts), and the recursion continues on the two halves. Growth stops on pure
// nodes, at Config.MaxDepth, when a child would hold fewer than Config.MinLeaf
// rows, or when golearn finds no split that lowers the impurity.
//
// Features are first mapped to at most Config.Bins quantile bins (histogram
// binning, common practice in gradient-boosting libraries): golearn's CART
// re-counts every candidate threshold from scratch, so its cost grows with the
// number of distinct values times the number of rows; with bins it stays
// O(bins · rows) per feature and node. A threshold golearn places between bin
// codes is converted back to the real-valued bin edge, so the stored tree
// sends every training row exactly where golearn sent it.
//
// # Prediction
//
// A tree's vote is the class frequency vector of the bootstrap rows in the
// leaf reached by x; the forest's probabilities are the mean of those vectors
// over the trees ("soft voting"). Missing inputs (NaN) are replaced by the
// training median of the feature. Every prediction also carries per-feature
// contributions in the manner of Saabas (2014, "Interpreting random forests",
// blog post; memory): along each tree's path, the change of the predicted
// class's frequency at a split is credited to the split feature, so that
// Bias + Σ Contributions equals the predicted probability exactly (up to
// floating-point rounding).
//
// A prediction is Undetermined when its top probability is below
// Config.MinProbability (default 0.5) or when a feature lies outside the
// training range widened by Config.RangeMargin (default 5 % of the range) on
// each side; the reasons name the features.
//
// # Model file
//
// Write produces a compact binary file that is identical byte for byte for
// the same model: the 8-byte magic "TSFOREST", a little-endian uint16 format
// version, a length-prefixed JSON header (feature names, schema, classes,
// training description and counts, configuration, medians, ranges,
// out-of-bag and cross-validation figures), the trees as varint-coded
// pre-order node lists, and a SHA-256 of everything before it. Read checks the
// magic, the version, the checksum and the structure and fails with a
// sentinel error (ErrBadMagic, ErrNewerFormat, ErrCorrupt) otherwise.
package classifier
